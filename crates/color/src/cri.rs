//! CIE 13.3-1995 colour rendering index: general index Ra and special indices R1–R14.
//!
//! Method (CIE 13.3-1995 §5):
//! 1. CCT of the test lamp (here Ohno 2014, CIE 1931 2° observer).
//! 2. Reference: Planckian radiator below 5000 K, CIE daylight at and above
//!    5000 K, at the test lamp's CCT.
//! 3. Tristimulus values of the 14 test colour samples (TCS) under both lights,
//!    CIE 1931 2° observer, 360–830 nm at 1 nm, Y = 100 for the perfect white.
//! 4. Von Kries adaptation of the test-lamp colours to the reference in the
//!    CIE 1960 (u, v) diagram with the c, d functions of §5.5 (eqs. 5–7).
//! 5. CIE 1964 `U*V*W*` of each sample, `ΔEᵢ`, `Rᵢ = 100 − 4.6·ΔEᵢ`; Ra is the mean
//!    of R1–R8.
//!
//! The standard says the index is not meaningful when the test lamp's
//! chromaticity lies farther than DC = 5.4 × 10⁻³ from the reference in (u, v);
//! such lamps are computed anyway and flagged ([`Cri::meaningful`], warning text).
//!
//! Conventions against colour-science 0.4.7 (`colour_rendering_index`): it
//! interpolates everything to 1 nm over 360–780 nm and takes the CCT by
//! Robertson (1968); Lampwright sums 360–830 nm and uses Ohno (2014). Both
//! differences move Ra by well under 0.05 on the CIE lamps (see the fixture test).
//!
//! # References
//! - CIE 13.3-1995, *Method of measuring and specifying colour rendering
//!   properties of light sources*, §5 and Table 1 (TCS reflectances).
//! - CIE 15:2018, *Colorimetry*, 4th ed., §4.1.2 (CIE daylight), §8.1 (CIE 1960 UCS).

use crate::cct::{CctDuv, CctMethod, cct_duv, uv1960_of_spd};
use crate::error::{ColorError, Result};
use crate::illuminant::{daylight, daylight_basis, daylight_m1_m2, planckian};
use crate::mired_table::MiredTable;
use crate::observer::Observer;
use crate::spaces::Uv1960;
use crate::spectral_weights::{SampleSet, SampleXyz};
use crate::spectrum::{GRID_LEN, Reflectance, RelativeSpd};
use crate::table::AssetTable;
use std::sync::LazyLock;

/// CIE 13.3-1995 §5.3: largest chromaticity difference DC between test lamp
/// and reference for which the index is meaningful.
pub const CRI_DC_LIMIT: f64 = 5.4e-3;

/// CCT at and above which the CIE 13.3 reference is CIE daylight, K.
pub const CRI_DAYLIGHT_FROM_K: f64 = 5000.0;

/// Which reference illuminant a rendering index used.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
pub enum ReferenceKind {
    /// Planckian radiator at the test CCT.
    Planckian,
    /// CIE daylight at the test CCT.
    Daylight,
    /// CIE 224 blend of Planckian and daylight (TM-30 between 4000 and 5000 K).
    Blend,
}

/// CIE 13.3-1995 colour rendering figures of one light.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Cri {
    /// General colour rendering index Ra (mean of R1–R8), unrounded.
    pub ra: f64,
    /// Special colour rendering indices R1–R14, unrounded.
    pub r: [f64; 14],
    /// CCT and Duv of the test light (Ohno 2014).
    pub cct: CctDuv,
    /// Reference illuminant used.
    pub reference: ReferenceKind,
    /// Chromaticity difference DC between test and reference in CIE 1960 (u, v).
    pub dc: f64,
    /// False when DC exceeds [`CRI_DC_LIMIT`] (the standard's validity limit).
    pub meaningful: bool,
}

impl Cri {
    /// A warning for people when the index is outside its validity range.
    #[must_use]
    pub fn warning(&self) -> Option<String> {
        (!self.meaningful).then(|| {
            format!(
                "CRI is not meaningful: the light is {:.4} from its reference in (u, v), beyond the 0.0054 limit of CIE 13.3",
                self.dc
            )
        })
    }
}

static TCS: LazyLock<Result<Vec<Reflectance>>> = LazyLock::new(|| {
    let t = AssetTable::parse(
        "cie133_tcs.csv",
        include_str!("../../../assets/standard/cie133_tcs.csv"),
    )?;
    if t.columns.len() != 14 {
        return Err(ColorError::Numerical(format!(
            "cie133_tcs.csv has {} samples, expected 14",
            t.columns.len()
        )));
    }
    t.columns
        .iter()
        .map(|c| Reflectance::from_samples(&t.wavelengths_nm, c))
        .collect()
});

static TCS_SET: LazyLock<Result<SampleSet>> = LazyLock::new(|| {
    let tcs = TCS.as_ref().map_err(Clone::clone)?;
    Ok(SampleSet::new(tcs, Observer::cie1931_2deg(), 0, GRID_LEN))
});

/// The 14 CIE 13.3 test colour samples on the grid (Sprague-interpolated from 5 nm).
pub fn test_colour_samples() -> Result<&'static [Reflectance]> {
    TCS.as_ref().map(Vec::as_slice).map_err(Clone::clone)
}

/// The CIE 13.3 reference illuminant at `cct_k`: Planckian below 5000 K, CIE
/// daylight at and above (daylight is defined from 4000 K, so this covers
/// 1000–25 000 K).
pub fn cri_reference(cct_k: f64) -> Result<(RelativeSpd, ReferenceKind)> {
    if cct_k < CRI_DAYLIGHT_FROM_K {
        Ok((planckian(cct_k)?, ReferenceKind::Planckian))
    } else {
        Ok((daylight(cct_k)?, ReferenceKind::Daylight))
    }
}

/// CIE 13.3-1995 Ra and R1–R14 of a light.
///
/// Refuses lights that are not colorimetric (all zero, measured over less than
/// the visible range) and lights without a CCT (farther than |Duv| 0.05 from
/// the Planckian locus, or outside 1000–20 000 K).
///
/// # References
/// - CIE 13.3-1995, §5 (eqs. 1–9).
pub fn cri_cie133(test: &RelativeSpd) -> Result<Cri> {
    let uv = uv1960_of_spd(test, "light")?;
    let cct = cct_duv(uv, CctMethod::Ohno2014)?;
    cri_with_cct(test, cct)
}

/// CIE 13.3 adaptation functions of §5.5: c = (4 − u − 10v)/v, d = (1.708v + 0.404 − 1.481u)/v.
fn c_d(uv: Uv1960) -> (f64, f64) {
    (
        (4.0 - uv.u - 10.0 * uv.v) / uv.v,
        (1.708 * uv.v + 0.404 - 1.481 * uv.u) / uv.v,
    )
}

/// CIE 1964 U*V*W* of a colour with luminance factor `y` and chromaticity `uv`
/// relative to the white `white` (CIE 13.3 eqs. 8–9).
fn uvw_1964(y: f64, uv: Uv1960, white: Uv1960) -> [f64; 3] {
    let w = 25.0 * y.cbrt() - 17.0;
    [13.0 * w * (uv.u - white.u), 13.0 * w * (uv.v - white.v), w]
}

/// What the reference contributes to CRI: its white in (u, v) and each
/// sample's `U*V*W*`.
#[derive(Debug, Clone, Copy)]
struct ReferenceSide {
    white: Uv1960,
    uvw: [[f64; 3]; 14],
}

/// Values per node of the Planckian table: white (u, v), then U*V*W* of 14 samples.
const TABLE_WIDTH: usize = 2 + 3 * 14;

impl ReferenceSide {
    /// From the sample sums under the reference.
    fn from_sums(xr: &SampleXyz) -> Result<ReferenceSide> {
        let wr = xr.white;
        if wr.y.is_nan() || wr.y <= 0.0 {
            return Err(ColorError::NotColorimetric {
                what: "CRI reference".into(),
                reason: "it has no visible power".into(),
            });
        }
        let white = Uv1960::from_xyz(wr);
        let mut uvw = [[0.0; 3]; 14];
        for (e, sr) in uvw.iter_mut().zip(&xr.samples) {
            let sr = sr.scaled(100.0 / wr.y);
            *e = uvw_1964(sr.y, Uv1960::from_xyz(sr), white);
        }
        Ok(ReferenceSide { white, uvw })
    }

    fn write(&self, out: &mut [f64]) {
        out[0] = self.white.u;
        out[1] = self.white.v;
        for (o, e) in out[2..].chunks_exact_mut(3).zip(&self.uvw) {
            o.copy_from_slice(e);
        }
    }

    fn read(v: &[f64]) -> ReferenceSide {
        let mut uvw = [[0.0; 3]; 14];
        for (e, c) in uvw.iter_mut().zip(v[2..].chunks_exact(3)) {
            *e = [c[0], c[1], c[2]];
        }
        ReferenceSide {
            white: Uv1960 { u: v[0], v: v[1] },
            uvw,
        }
    }
}

/// The Planckian reference side, 1000–5000 K, 2 mired between nodes (see the
/// table-against-direct test).
static PLANCK_TABLE: LazyLock<Result<MiredTable>> = LazyLock::new(|| {
    let set = TCS_SET.as_ref().map_err(Clone::clone)?;
    MiredTable::build((1000.0, CRI_DAYLIGHT_FROM_K), 401, TABLE_WIDTH, |t, out| {
        ReferenceSide::from_sums(&set.xyz_one(planckian(t)?.values()))?.write(out);
        Ok(())
    })
});

/// TCS sums of the daylight basis S0, S1, S2 (daylight is linear in them).
static DAYLIGHT_SUMS: LazyLock<Result<[SampleXyz; 3]>> = LazyLock::new(|| {
    let set = TCS_SET.as_ref().map_err(Clone::clone)?;
    Ok(daylight_basis()?.each_ref().map(|s| set.xyz_one(s)))
});

/// The reference side at `cct_k` with its kind: table or basis sums where
/// they reach, the reference spectrum otherwise.
fn reference_side(cct_k: f64) -> Result<(ReferenceSide, ReferenceKind)> {
    if cct_k >= CRI_DAYLIGHT_FROM_K {
        let (m1, m2) = daylight_m1_m2(cct_k)?;
        let [s0, s1, s2] = DAYLIGHT_SUMS.as_ref().map_err(Clone::clone)?;
        let sums = SampleXyz::combine(&[(1.0, s0), (m1, s1), (m2, s2)]);
        return Ok((ReferenceSide::from_sums(&sums)?, ReferenceKind::Daylight));
    }
    if let Ok(table) = PLANCK_TABLE.as_ref() {
        let mut v = [0.0; TABLE_WIDTH];
        if table.eval(cct_k, &mut v) {
            return Ok((ReferenceSide::read(&v), ReferenceKind::Planckian));
        }
    }
    let (reference, kind) = cri_reference(cct_k)?;
    let set = TCS_SET.as_ref().map_err(Clone::clone)?;
    Ok((
        ReferenceSide::from_sums(&set.xyz_one(reference.values()))?,
        kind,
    ))
}

/// Ra and Ri of `test` whose CCT is already known (`cct`, Ohno 2014), against
/// the CIE 13.3 reference at that CCT.
pub fn cri_with_cct(test: &RelativeSpd, cct: CctDuv) -> Result<Cri> {
    test.check_colorimetric("light")?;
    cri_of_sums(&tcs_set()?.xyz_one(test.values()), cct)
}

/// The 14 test colour samples ready for summing under a light.
pub(crate) fn tcs_set() -> Result<&'static SampleSet> {
    TCS_SET.as_ref().map_err(Clone::clone)
}

/// Ra and Ri from the test light's TCS sums (a light already checked as
/// colorimetric) whose CCT is `cct`.
pub(crate) fn cri_of_sums(test: &SampleXyz, cct: CctDuv) -> Result<Cri> {
    let (reference, kind) = reference_side(cct.cct_k)?;
    cri_from_sums(test, &reference, cct, kind)
}

/// Ra and Ri of `test` against a given reference spectrum (already chosen for
/// the test CCT `cct`).
pub fn cri_cie133_with_reference(
    test: &RelativeSpd,
    cct: CctDuv,
    reference: &RelativeSpd,
    kind: ReferenceKind,
) -> Result<Cri> {
    reference.check_colorimetric("CRI reference")?;
    let set = TCS_SET.as_ref().map_err(Clone::clone)?;
    let side = ReferenceSide::from_sums(&set.xyz_one(reference.values()))?;
    cri_from_sums(&set.xyz_one(test.values()), &side, cct, kind)
}

/// CIE 13.3 from the test light's sample sums and the reference side.
fn cri_from_sums(
    xt: &SampleXyz,
    reference: &ReferenceSide,
    cct: CctDuv,
    kind: ReferenceKind,
) -> Result<Cri> {
    let wt = xt.white;
    if wt.y.is_nan() || wt.y <= 0.0 {
        return Err(ColorError::NotColorimetric {
            what: "light".into(),
            reason: "it has no visible power".into(),
        });
    }
    let uv_t = Uv1960::from_xyz(wt);
    let uv_r = reference.white;
    let dc = uv_t.distance(uv_r);
    let (ct, dt) = c_d(uv_t);
    let (cr, dr) = c_d(uv_r);
    let mut r = [0.0; 14];
    for ((ri, st), e_r) in r.iter_mut().zip(&xt.samples).zip(&reference.uvw) {
        let st = st.scaled(100.0 / wt.y);
        let uv_ti = Uv1960::from_xyz(st);
        // Von Kries in (u, v), CIE 13.3 eq. 7: test colours adapted to the reference.
        let (cti, dti) = c_d(uv_ti);
        let (kc, kd) = (cr / ct * cti, dr / dt * dti);
        let den = 16.518 + 1.481 * kc - kd;
        let adapted = Uv1960 {
            u: (10.872 + 0.404 * kc - 4.0 * kd) / den,
            v: 5.520 / den,
        };
        // The adapted test white coincides with the reference white.
        let e_t = uvw_1964(st.y, adapted, uv_r);
        let de =
            ((e_t[0] - e_r[0]).powi(2) + (e_t[1] - e_r[1]).powi(2) + (e_t[2] - e_r[2]).powi(2))
                .sqrt();
        *ri = 100.0 - 4.6 * de;
    }
    let ra = r[..8].iter().sum::<f64>() / 8.0;
    if !(ra.is_finite() && r.iter().all(|v| v.is_finite())) {
        return Err(ColorError::Numerical(
            "CRI computation gave a non-finite result".into(),
        ));
    }
    Ok(Cri {
        ra,
        r,
        cct,
        reference: kind,
        dc,
        meaningful: dc <= CRI_DC_LIMIT,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::illuminant::StandardIlluminant;

    #[test]
    fn tabulated_reference_matches_the_direct_one() {
        // Between the Planckian nodes (2 mired apart) and on the daylight basis.
        let set = TCS_SET.as_ref().unwrap();
        let mut worst = 0.0f64;
        for t in [
            1000.0, 1001.3, 1777.7, 2856.0, 3201.9, 4999.9, 5000.0, 6504.0, 19_500.0,
        ] {
            let (fast, kind) = reference_side(t).unwrap();
            let (spd, kind_d) = cri_reference(t).unwrap();
            let direct = ReferenceSide::from_sums(&set.xyz_one(spd.values())).unwrap();
            assert_eq!(kind, kind_d, "{t}");
            worst = worst
                .max((fast.white.u - direct.white.u).abs())
                .max((fast.white.v - direct.white.v).abs());
            for (a, b) in fast.uvw.iter().zip(&direct.uvw) {
                for k in 0..3 {
                    worst = worst.max((a[k] - b[k]).abs());
                }
            }
        }
        eprintln!("largest CRI reference difference {worst:e}");
        assert!(worst < 1e-8, "largest U*V*W* difference {worst}");
    }

    #[test]
    fn references_render_perfectly() {
        // CIE 13.3 §5: the reference itself has Ra = Ri = 100.
        for t in [2700.0, 4000.0, 4999.0, 5500.0, 6500.0, 10_000.0] {
            let (spd, _) = cri_reference(t).unwrap();
            let c = cri_cie133(&spd).unwrap();
            // CIE daylight at nominal T has a CCT a fraction of a kelvin off T, and the
            // standard's rounding of M1, M2 makes the reference at that CCT differ
            // slightly from the spectrum tested: 0.05 allows for it.
            assert!((c.ra - 100.0).abs() < 0.05, "{t}: {c:?}");
            assert!(c.r.iter().all(|r| (r - 100.0).abs() < 0.05), "{t}: {c:?}");
            assert!(c.meaningful);
        }
    }

    #[test]
    fn reference_switches_at_5000_k() {
        assert_eq!(cri_reference(4999.0).unwrap().1, ReferenceKind::Planckian);
        assert_eq!(cri_reference(5000.0).unwrap().1, ReferenceKind::Daylight);
    }

    #[test]
    fn f2_matches_published_ra() {
        // CIE 15:2018 Table 10 / CIE 13.3 give Ra = 64 for F2 (published integer).
        let f2 = StandardIlluminant::F(2).spd().unwrap();
        let c = cri_cie133(&f2).unwrap();
        assert!((c.ra.round() - 64.0).abs() < 0.5, "{c:?}");
    }

    #[test]
    fn refuses_dark_and_partial_spectra_and_flags_off_locus() {
        assert!(cri_cie133(&RelativeSpd::from_fn(|_| 0.0)).is_err());
        let short = RelativeSpd::from_samples(&[500.0, 600.0], &[1.0, 1.0]).unwrap();
        assert!(matches!(
            cri_cie133(&short),
            Err(ColorError::NotColorimetric { .. })
        ));
        // Tungsten with a green cast: Duv ≈ +0.01, beyond DC 5.4e-3.
        let p = planckian(3000.0).unwrap();
        let green = RelativeSpd::from_fn(|wl| {
            p.at_nm(wl) * (1.0 + 0.35 * (-((wl - 540.0) / 40.0).powi(2)).exp())
        });
        let c = cri_cie133(&green).unwrap();
        assert!(!c.meaningful && c.dc > CRI_DC_LIMIT, "{c:?}");
        assert!(c.warning().unwrap().contains("not meaningful"));
    }
}
