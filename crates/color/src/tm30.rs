//! ANSI/IES TM-30-20 colour fidelity and gamut (fidelity index identical to
//! CIE 224:2017 Rf): Rf, Rg, the 99 per-sample fidelities, and per hue bin
//! Rf,hj, Rcs,hj (chroma shift), Rhs,hj (hue shift) plus the bin averages the
//! colour-vector graphic is drawn from.
//!
//! Method (CIE 224:2017 §4–5; TM-30-20 §4):
//! 1. CCT of the test light (Lampwright's lamp CCT: Ohno 2014, 1931 2°).
//! 2. Reference: Planckian below 4000 K, CIE daylight above 5000 K, and in
//!    between a mix of both normalised to equal Y (1931 ȳ), with daylight weight
//!    `(T − 4000)/1000`.
//! 3. XYZ of the 99 colour evaluation samples (CES) under test and reference,
//!    CIE 1964 10° observer, 380–780 nm at 1 nm (CIE 224's range; Lampwright's
//!    grid extends to 360–830 nm but the samples are only defined on 380–780 nm),
//!    each light scaled to Y = 100.
//! 4. CAM02-UCS J′a′b′ (`L_A` = 100 cd/m², Yb = 20, average surround, D = 1).
//! 5. ΔE′ᵢ per sample; `Rf = 10·ln(exp((100 − 6.73·mean ΔE′)/10) + 1)`.
//! 6. Samples sorted into 16 bins of 22.5° by their hue under the reference;
//!    per bin average a′, b′ under test and reference; Rg = 100 × ratio of the
//!    areas of the two 16-gons; Rcs,hj and Rhs,hj are the components of the bin
//!    shift along and across the bin's centre hue, over the reference chroma.
//!
//! Speed: the 99 reflectances are kept on the 380–780 nm window; per call the
//! light-weighted colour-matching functions S(λ)·x̄₁₀(λ) etc. of test and
//! reference are formed once and each sample is read once for both lights (see
//! `spectral_weights.rs` for why this beats a precomputed CES × CMF matrix).
//!
//! The lamp CCT used to pick the reference sums 360–830 nm; colour-science 0.4.7
//! (`colour_fidelity_index_ANSIIESTM3018`) trims the test light to 380–780 nm
//! first. The CCTs differ by a fraction of a kelvin (see the fixture test).
//!
//! # References
//! - ANSI/IES TM-30-20, *IES Method for Evaluating Light Source Color Rendition*.
//! - CIE 224:2017, *CIE 2017 Colour Fidelity Index for accurate scientific use*,
//!   doi:10.25039/TR.224.2017.
//! - Luo, M. R., Cui, G., Li, C. (2006). Uniform colour spaces based on CIECAM02.
//!   *Color Res. Appl.* 31(4), 320–330. doi:10.1002/col.20227

use crate::batch_math::{atan2_in_place, exp_in_place, ln_in_place};
use crate::cam02::{Cam02Ucs, delta_e_cam02ucs};
use crate::cct::{CctDuv, CctMethod, cct_duv, uv1960_of_spd};
use crate::cri::ReferenceKind;
use crate::error::{ColorError, Result};
use crate::illuminant::{
    daylight, daylight_basis, daylight_m1_m2, daylight_m1_m2_unrounded, planckian,
};
use crate::mired_table::MiredTable;
use crate::observer::Observer;
use crate::spectral_weights::{SampleSet, SampleXyz, dot};
use crate::spectrum::{GRID_START_NM, Reflectance, RelativeSpd};
use crate::table::AssetTable;
use crate::tristimulus::Xyz;
use std::sync::LazyLock;

/// Below the first bound the reference is Planckian, above the second CIE daylight, K.
pub const TM30_BLEND_RANGE_K: (f64, f64) = (4000.0, 5000.0);
/// Scaling factor `c_f` of the fidelity index (CIE 224:2017 eq. 5).
pub const TM30_CF: f64 = 6.73;
/// Number of hue bins.
pub const TM30_BINS: usize = 16;
/// Number of colour evaluation samples.
pub const TM30_CES_COUNT: usize = 99;

/// CIE 224 wavelength range, nm.
const START_NM: u32 = 380;
const END_NM: u32 = 780;
const WINDOW_START: usize = (START_NM - GRID_START_NM) as usize;
const WINDOW_LEN: usize = (END_NM - START_NM + 1) as usize;

/// TM-30 figures of one light.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Tm30 {
    /// Fidelity index Rf (= CIE 224 Rf), 0–100, unrounded.
    pub rf: f64,
    /// Gamut index Rg, 100 for the reference.
    pub rg: f64,
    /// Fidelity of each of the 99 samples, Rf,CES1…99.
    pub rf_ces: Vec<f64>,
    /// Hue angle h′ of each sample under the reference, degrees 0–360 (its bin
    /// is `floor(h′ / 22.5)`).
    pub ces_reference_hue_deg: Vec<f64>,
    /// Local fidelity per hue bin, Rf,h1…h16.
    pub rf_hj: [f64; TM30_BINS],
    /// Local chroma shift per hue bin, Rcs,h1…h16, in percent.
    pub rcs_hj: [f64; TM30_BINS],
    /// Local hue shift per hue bin, Rhs,h1…h16 (radians-like fraction of the reference chroma).
    pub rhs_hj: [f64; TM30_BINS],
    /// Average (a′, b′) per bin under the test light (colour-vector graphic).
    pub bin_test_ab: [[f64; 2]; TM30_BINS],
    /// Average (a′, b′) per bin under the reference (colour-vector graphic).
    pub bin_reference_ab: [[f64; 2]; TM30_BINS],
    /// CCT and Duv of the test light that chose the reference.
    pub cct: CctDuv,
    /// Reference used.
    pub reference: ReferenceKind,
    /// Weight of daylight in the reference (0 Planckian, 1 daylight).
    pub daylight_fraction: f64,
}

static CES_SET: LazyLock<Result<SampleSet>> = LazyLock::new(|| {
    let t = AssetTable::parse(
        "cie224_ces99.csv",
        include_str!("../../../assets/standard/cie224_ces99.csv"),
    )?;
    if t.columns.len() != TM30_CES_COUNT {
        return Err(ColorError::Numerical(format!(
            "cie224_ces99.csv has {} samples, expected {TM30_CES_COUNT}",
            t.columns.len()
        )));
    }
    let samples = t
        .columns
        .iter()
        .map(|c| Reflectance::from_samples(&t.wavelengths_nm, c))
        .collect::<Result<Vec<_>>>()?;
    Ok(SampleSet::new(
        &samples,
        Observer::cie1964_10deg(),
        WINDOW_START,
        WINDOW_LEN,
    ))
});

/// Y (1931 ȳ) of a spectrum over 380–780 nm, for the reference blend.
fn y_380_780(spd: &RelativeSpd) -> f64 {
    let w = WINDOW_START..WINDOW_START + WINDOW_LEN;
    dot(&spd.values()[w.clone()], &Observer::cie1931_2deg().y_bar[w])
}

/// The TM-30 / CIE 224 reference spectrum at `cct_k` (1000–25 000 K), with
/// its kind and daylight fraction.
pub fn tm30_reference(cct_k: f64) -> Result<(RelativeSpd, ReferenceKind, f64)> {
    let (lo, hi) = TM30_BLEND_RANGE_K;
    if cct_k < lo {
        return Ok((planckian(cct_k)?, ReferenceKind::Planckian, 0.0));
    }
    if cct_k > hi {
        return Ok((daylight(cct_k)?, ReferenceKind::Daylight, 1.0));
    }
    let p = planckian(cct_k)?;
    let d = daylight(cct_k)?;
    let (yp, yd) = (y_380_780(&p), y_380_780(&d));
    if !(yp > 0.0 && yd > 0.0) {
        return Err(ColorError::Numerical(format!(
            "reference spectra at {cct_k} K have no luminance"
        )));
    }
    let m = (cct_k - lo) / (hi - lo);
    let mix = RelativeSpd::weighted_sum([((1.0 - m) / yp, &p), (m / yd, &d)]);
    Ok((mix, ReferenceKind::Blend, m))
}

/// `10·ln(exp((100 − c_f·ΔE′)/10) + 1)` (CIE 224:2017 eq. 5), without overflow.
#[must_use]
pub fn rf_from_delta_e(delta_e: f64) -> f64 {
    let x = (100.0 - TM30_CF * delta_e) / 10.0;
    // softplus: ln(1 + eˣ) = max(x, 0) + ln(1 + e^−|x|)
    10.0 * (x.max(0.0) + (-x.abs()).exp().ln_1p())
}

/// [`rf_from_delta_e`] of many differences at once (vectorised `exp` and
/// `ln`; `ln(1 + e)` for e ∈ (0, 1] loses nothing that shows in Rf).
fn rf_from_delta_e_many(delta_e: &[f64]) -> Vec<f64> {
    let x: Vec<f64> = delta_e
        .iter()
        .map(|d| (100.0 - TM30_CF * d) / 10.0)
        .collect();
    // e^−|x| underflows to 0 below −708; so does the term it feeds.
    let mut e: Vec<f64> = x.iter().map(|x| -x.abs().min(700.0)).collect();
    exp_in_place(&mut e);
    for v in &mut e {
        *v += 1.0;
    }
    ln_in_place(&mut e);
    x.iter()
        .zip(e)
        .map(|(x, l)| 10.0 * (x.max(0.0) + l))
        .collect()
}

/// CAM02-UCS J′a′b′ of the 99 samples under a light.
fn ces_jab(sums: &SampleXyz) -> Result<Vec<[f64; 3]>> {
    let white = sums.white;
    if !(white.y > 0.0 && white.is_finite()) {
        return Err(ColorError::NotColorimetric {
            what: "light".into(),
            reason: "it has no visible power between 380 and 780 nm".into(),
        });
    }
    let k = 100.0 / white.y;
    let ucs = Cam02Ucs::tm30(white.scaled(k))?;
    let scaled: Vec<Xyz> = sums.samples.iter().map(|x| x.scaled(k)).collect();
    Ok(ucs.jab_many(&scaled))
}

/// Twice the signed area of the polygon through `pts` in order (shoelace).
fn polygon_area(pts: &[[f64; 2]; TM30_BINS]) -> f64 {
    (0..TM30_BINS)
        .map(|i| {
            let (a, b) = (pts[i], pts[(i + 1) % TM30_BINS]);
            a[0] * b[1] - a[1] * b[0]
        })
        .sum::<f64>()
        / 2.0
}

/// CCT range over which the Planckian reference side is tabulated, K: every
/// CCT the lamp metrics accept up to the end of the blend.
const PLANCK_TABLE_K: (f64, f64) = (1000.0, TM30_BLEND_RANGE_K.1);
/// Nodes of that table: 2 mired apart (see the table-against-direct test).
const PLANCK_TABLE_NODES: usize = 401;
/// Values per node before the J′a′b′: white and samples, XYZ each.
const FLAT_XYZ: usize = 3 * (TM30_CES_COUNT + 1);

/// The Planckian reference side per node: white and CES XYZ (10°) divided by
/// the light's Y over 380–780 nm (the blend's normalisation), then the CES
/// J′a′b′ under the Planckian itself.
static PLANCK_TABLE: LazyLock<Result<MiredTable>> = LazyLock::new(|| {
    let set = CES_SET.as_ref().map_err(Clone::clone)?;
    MiredTable::build(
        PLANCK_TABLE_K,
        PLANCK_TABLE_NODES,
        FLAT_XYZ + 3 * TM30_CES_COUNT,
        |t, out| {
            let p = planckian(t)?;
            let sums = set.xyz_one(p.values());
            sums.write_flat(y_380_780(&p), &mut out[..FLAT_XYZ]);
            for (o, jab) in out[FLAT_XYZ..].chunks_exact_mut(3).zip(ces_jab(&sums)?) {
                o.copy_from_slice(&jab);
            }
            Ok(())
        },
    )
});

/// CIE daylight is `S0 + M1·S1 + M2·S2`: the CES sums and Y (380–780 nm) of
/// each basis function, so daylight references need no spectrum.
static DAYLIGHT_SUMS: LazyLock<Result<[(SampleXyz, f64); 3]>> = LazyLock::new(|| {
    let set = CES_SET.as_ref().map_err(Clone::clone)?;
    let w = WINDOW_START..WINDOW_START + WINDOW_LEN;
    let y_bar = &Observer::cie1931_2deg().y_bar[w.clone()];
    Ok(daylight_basis()?
        .each_ref()
        .map(|s| (set.xyz_one(s), dot(&s[w.clone()], y_bar))))
});

/// CES sums of CIE daylight with weights `m1`, `m2` and its Y over 380–780 nm.
fn daylight_sums_m(m1: f64, m2: f64) -> Result<(SampleXyz, f64)> {
    let [(s0, y0), (s1, y1), (s2, y2)] = DAYLIGHT_SUMS.as_ref().map_err(Clone::clone)?;
    Ok((
        SampleXyz::combine(&[(1.0, s0), (m1, s1), (m2, s2)]),
        y0 + m1 * y1 + m2 * y2,
    ))
}

/// CES sums of the reference at `cct_k` whose daylight part has weights
/// `m1`, `m2`: daylight alone above the blend, the CIE 224 mix of Planckian
/// (from `planck`, normalised as in [`PLANCK_TABLE`]) and daylight inside it.
fn mixed_sums(cct_k: f64, m1: f64, m2: f64, planck: Option<&SampleXyz>) -> Result<SampleXyz> {
    let (lo, hi) = TM30_BLEND_RANGE_K;
    let (day, yd) = daylight_sums_m(m1, m2)?;
    if cct_k > hi {
        return Ok(day);
    }
    let planck = planck.ok_or_else(|| {
        ColorError::Numerical(format!("no Planckian reference prepared at {cct_k} K"))
    })?;
    if !(yd > 0.0 && planck.white.y > 0.0) {
        return Err(ColorError::Numerical(format!(
            "reference spectra at {cct_k} K have no luminance"
        )));
    }
    let m = (cct_k - lo) / (hi - lo);
    Ok(SampleXyz::combine(&[(1.0 - m, planck), (m / yd, &day)]))
}

/// Step in M1 and M2 of the central differences in [`DAYLIGHT_TABLES`].
const M_STEP: f64 = 1e-3;
const JAB: usize = 3 * TM30_CES_COUNT;

/// The reference J′a′b′ wherever daylight enters (blend and daylight).
///
/// CIE daylight rounds M1 and M2 to three decimals, so its J′a′b′ jump as T
/// moves and cannot be interpolated in T directly. Per node these tables hold
/// F = J′a′b′ at the unrounded M1(T), M2(T) and its partial derivatives in M1
/// and M2 (central differences); a lookup adds the first-order correction for
/// the rounding (|ΔM| ≤ 0.0005). The table-against-direct test bounds the
/// remaining second-order term.
static DAYLIGHT_TABLES: LazyLock<Result<[MiredTable; 3]>> = LazyLock::new(|| {
    let planck_table = PLANCK_TABLE.as_ref().map_err(Clone::clone)?;
    let node = |t: f64, out: &mut [f64]| -> Result<()> {
        let planck = if t <= TM30_BLEND_RANGE_K.1 {
            let mut v = vec![0.0; planck_table.width()];
            if !planck_table.eval(t, &mut v) {
                return Err(ColorError::Numerical(format!(
                    "no Planckian table value at {t} K"
                )));
            }
            Some(SampleXyz::from_flat(&v[..FLAT_XYZ]))
        } else {
            None
        };
        let (m1, m2) = daylight_m1_m2_unrounded(t)?;
        let jab = |m1: f64, m2: f64| ces_jab(&mixed_sums(t, m1, m2, planck.as_ref())?);
        let f = jab(m1, m2)?;
        let (d1p, d1m) = (jab(m1 + M_STEP, m2)?, jab(m1 - M_STEP, m2)?);
        let (d2p, d2m) = (jab(m1, m2 + M_STEP)?, jab(m1, m2 - M_STEP)?);
        let (value, rest) = out.split_at_mut(JAB);
        let (dm1, dm2) = rest.split_at_mut(JAB);
        for i in 0..TM30_CES_COUNT {
            for k in 0..3 {
                value[3 * i + k] = f[i][k];
                dm1[3 * i + k] = (d1p[i][k] - d1m[i][k]) / (2.0 * M_STEP);
                dm2[3 * i + k] = (d2p[i][k] - d2m[i][k]) / (2.0 * M_STEP);
            }
        }
        Ok(())
    };
    // About 1 mired between nodes; the daylight locus changes formula at
    // 7000 K (CIE 15:2018 eq. 4.7), so no table straddles it.
    Ok([
        MiredTable::build(TM30_BLEND_RANGE_K, 51, 3 * JAB, node)?,
        MiredTable::build((TM30_BLEND_RANGE_K.1, DAYLIGHT_SWITCH_K), 58, 3 * JAB, node)?,
        // Its first node must use the formula above the switch, as every
        // temperature it serves does (the two formulas differ by ~1e-6 in x there).
        MiredTable::build((DAYLIGHT_SWITCH_K + 1e-6, 25_000.0), 104, 3 * JAB, node)?,
    ])
});

/// Where the CIE daylight chromaticity formula changes (CIE 15:2018 eq. 4.7), K.
const DAYLIGHT_SWITCH_K: f64 = 7000.0;

/// J′a′b′ of the samples from a daylight table at `cct_k`, corrected for the
/// rounding of M1 and M2; `None` outside the table.
fn daylight_table_jab(table: &MiredTable, cct_k: f64) -> Result<Option<Vec<[f64; 3]>>> {
    let mut v = vec![0.0; table.width()];
    if !table.eval(cct_k, &mut v) {
        return Ok(None);
    }
    let (m1, m2) = daylight_m1_m2_unrounded(cct_k)?;
    let (r1, r2) = daylight_m1_m2(cct_k)?;
    let (e1, e2) = (r1 - m1, r2 - m2);
    let (value, rest) = v.split_at(JAB);
    let (dm1, dm2) = rest.split_at(JAB);
    Ok(Some(
        (0..TM30_CES_COUNT)
            .map(|i| {
                let at = |k: usize| value[3 * i + k] + dm1[3 * i + k] * e1 + dm2[3 * i + k] * e2;
                [at(0), at(1), at(2)]
            })
            .collect(),
    ))
}

/// CAM02-UCS J′a′b′ of the 99 samples under the TM-30 reference at `cct_k`,
/// with the reference's kind and daylight fraction, from the tables where
/// they reach and from the reference spectrum otherwise.
fn reference_jab(cct_k: f64) -> Result<(Vec<[f64; 3]>, ReferenceKind, f64)> {
    let (lo, hi) = TM30_BLEND_RANGE_K;
    let (kind, m) = if cct_k < lo {
        (ReferenceKind::Planckian, 0.0)
    } else if cct_k > hi {
        (ReferenceKind::Daylight, 1.0)
    } else {
        (ReferenceKind::Blend, (cct_k - lo) / (hi - lo))
    };
    if kind == ReferenceKind::Planckian {
        if let Ok(table) = PLANCK_TABLE.as_ref() {
            let mut v = vec![0.0; table.width()];
            if table.eval(cct_k, &mut v) {
                let jab = v[FLAT_XYZ..]
                    .chunks_exact(3)
                    .map(|c| [c[0], c[1], c[2]])
                    .collect();
                return Ok((jab, kind, m));
            }
        }
    } else if let Ok([blend, below_switch, above_switch]) = DAYLIGHT_TABLES.as_ref() {
        let table = match kind {
            ReferenceKind::Blend => blend,
            _ if cct_k <= DAYLIGHT_SWITCH_K => below_switch,
            _ => above_switch,
        };
        if let Some(jab) = daylight_table_jab(table, cct_k)? {
            return Ok((jab, kind, m));
        }
    }
    reference_jab_direct(cct_k)
}

/// [`reference_jab`] from the reference spectrum itself.
fn reference_jab_direct(cct_k: f64) -> Result<(Vec<[f64; 3]>, ReferenceKind, f64)> {
    let set = CES_SET.as_ref().map_err(Clone::clone)?;
    let (reference, kind, m) = tm30_reference(cct_k)?;
    Ok((ces_jab(&set.xyz_one(reference.values()))?, kind, m))
}

/// TM-30-20 of a light, reference chosen at its CCT (Ohno 2014).
///
/// Refuses lights that are not colorimetric or have no CCT (|Duv| > 0.05 or
/// outside 1000–20 000 K).
///
/// # References
/// - ANSI/IES TM-30-20; CIE 224:2017, doi:10.25039/TR.224.2017.
pub fn tm30(test: &RelativeSpd) -> Result<Tm30> {
    let cct = cct_duv(uv1960_of_spd(test, "light")?, CctMethod::Ohno2014)?;
    tm30_with_cct(test, cct)
}

/// TM-30-20 of `test` whose CCT is already known (`cct`, Ohno 2014).
pub fn tm30_with_cct(test: &RelativeSpd, cct: CctDuv) -> Result<Tm30> {
    test.check_colorimetric("light")?;
    tm30_of_sums(&ces_set()?.xyz_one(test.values()), cct)
}

/// The 99 colour evaluation samples ready for summing under a light.
pub(crate) fn ces_set() -> Result<&'static SampleSet> {
    CES_SET.as_ref().map_err(Clone::clone)
}

/// Sine and cosine of each hue bin's middle angle, 22.5°·j + 11.25°.
static BIN_MID_SIN_COS: LazyLock<[[f64; 2]; TM30_BINS]> = LazyLock::new(|| {
    std::array::from_fn(|j| {
        let (s, c) = (22.5 * j as f64 + 11.25).to_radians().sin_cos();
        [s, c]
    })
});

/// TM-30 from the test light's CES sums (a light already checked as
/// colorimetric) whose CCT is `cct`.
pub(crate) fn tm30_of_sums(test: &SampleXyz, cct: CctDuv) -> Result<Tm30> {
    let (jab_r, kind, daylight_fraction) = reference_jab(cct.cct_k)?;
    let jab_t = ces_jab(test)?;
    tm30_from_jab(&jab_t, &jab_r, cct, kind, daylight_fraction)
}

/// The TM-30 figures from the samples' J′a′b′ under test and reference.
fn tm30_from_jab(
    jab_t: &[[f64; 3]],
    jab_r: &[[f64; 3]],
    cct: CctDuv,
    kind: ReferenceKind,
    daylight_fraction: f64,
) -> Result<Tm30> {
    let de: Vec<f64> = jab_t
        .iter()
        .zip(jab_r)
        .map(|(t, r)| delta_e_cam02ucs(*t, *r))
        .collect();
    let mean_de = de.iter().sum::<f64>() / de.len() as f64;
    let rf = rf_from_delta_e(mean_de);

    let mut hues: Vec<f64> = jab_r.iter().map(|r| r[2]).collect();
    let a: Vec<f64> = jab_r.iter().map(|r| r[1]).collect();
    atan2_in_place(&mut hues, &a);
    for h in &mut hues {
        *h = h.to_degrees().rem_euclid(360.0);
    }
    let mut count = [0usize; TM30_BINS];
    let mut sum_t = [[0.0; 2]; TM30_BINS];
    let mut sum_r = [[0.0; 2]; TM30_BINS];
    let mut sum_de = [0.0; TM30_BINS];
    for (((t, r), d), hue_deg) in jab_t.iter().zip(jab_r).zip(&de).zip(&hues) {
        let j = ((hue_deg / 22.5).floor() as usize).min(TM30_BINS - 1);
        count[j] += 1;
        sum_t[j][0] += t[1];
        sum_t[j][1] += t[2];
        sum_r[j][0] += r[1];
        sum_r[j][1] += r[2];
        sum_de[j] += d;
    }
    if let Some(j) = count.iter().position(|c| *c == 0) {
        return Err(ColorError::Numerical(format!(
            "TM-30 hue bin {} holds no sample",
            j + 1
        )));
    }
    // Rf of every sample and of every bin in one vectorised pass.
    let mut de_all = de;
    de_all.extend((0..TM30_BINS).map(|j| sum_de[j] / count[j] as f64));
    let mut rf_all = rf_from_delta_e_many(&de_all);
    let rf_bins = rf_all.split_off(jab_t.len());
    let mut out = Tm30 {
        rf,
        rg: 0.0,
        rf_ces: rf_all,
        ces_reference_hue_deg: hues,
        rf_hj: [0.0; TM30_BINS],
        rcs_hj: [0.0; TM30_BINS],
        rhs_hj: [0.0; TM30_BINS],
        bin_test_ab: [[0.0; 2]; TM30_BINS],
        bin_reference_ab: [[0.0; 2]; TM30_BINS],
        cct,
        reference: kind,
        daylight_fraction,
    };
    for j in 0..TM30_BINS {
        let n = count[j] as f64;
        let at = [sum_t[j][0] / n, sum_t[j][1] / n];
        let ar = [sum_r[j][0] / n, sum_r[j][1] / n];
        out.bin_test_ab[j] = at;
        out.bin_reference_ab[j] = ar;
        out.rf_hj[j] = rf_bins[j];
        let [s, c] = BIN_MID_SIN_COS[j];
        let norm = ar[0].hypot(ar[1]);
        let (da, db) = (at[0] - ar[0], at[1] - ar[1]);
        out.rcs_hj[j] = 100.0 * (da * c + db * s) / norm;
        out.rhs_hj[j] = (-da * s + db * c) / norm;
    }
    let area_r = polygon_area(&out.bin_reference_ab);
    out.rg = 100.0 * polygon_area(&out.bin_test_ab) / area_r;
    let finite = |v: &[f64]| v.iter().all(|x| x.is_finite());
    if !(out.rf.is_finite()
        && out.rg.is_finite()
        && finite(&out.rf_hj)
        && finite(&out.rcs_hj)
        && finite(&out.rhs_hj))
    {
        return Err(ColorError::Numerical(
            "TM-30 computation gave a non-finite result".into(),
        ));
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rf_formula_matches_cie224() {
        // CIE 224:2017 eq. 5: ΔE′ = 0 gives 10·ln(e¹⁰ + 1) ≈ 100.000454.
        assert!((rf_from_delta_e(0.0) - 10.0 * (10.0f64.exp() + 1.0).ln()).abs() < 1e-12);
        assert!(
            (rf_from_delta_e(5.0) - 10.0 * ((100.0f64 - 33.65) / 10.0).exp().ln_1p()).abs() < 1e-9
        );
        // Very large differences stay finite and tend to 0.
        let big = rf_from_delta_e(1e6);
        assert!(big.is_finite() && (0.0..1e-9).contains(&big));
        // The vectorised form agrees with the one-at-a-time one.
        let des = [0.0, 0.3, 1.0, 5.0, 14.86, 20.0, 60.0, 1e3, 1e6];
        for (d, many) in des.iter().zip(rf_from_delta_e_many(&des)) {
            assert!((many - rf_from_delta_e(*d)).abs() < 1e-12, "{d}: {many}");
        }
    }

    #[test]
    fn references_have_rf_100_rg_100() {
        // CIE 224 / TM-30: the reference itself scores Rf = Rg = 100 (Rf's formula
        // gives 100.0005 for ΔE′ = 0).
        for t in [2700.0, 4500.0, 6500.0] {
            let (spd, kind, m) = tm30_reference(t).unwrap();
            let cct = cct_duv(uv1960_of_spd(&spd, "ref").unwrap(), CctMethod::Ohno2014).unwrap();
            let r = tm30_with_cct(&spd, CctDuv { cct_k: t, ..cct }).unwrap();
            assert!((r.rf - 100.0).abs() < 1e-3, "{t}: {}", r.rf);
            // The reference side is interpolated (Planckian) or summed from the
            // daylight basis: equal to the test side to far below print precision.
            assert!((r.rg - 100.0).abs() < 1e-6, "{t}: {}", r.rg);
            assert!(
                r.rcs_hj.iter().all(|v| v.abs() < 1e-6),
                "{t}: {:?}",
                r.rcs_hj
            );
            assert_eq!(
                kind == ReferenceKind::Blend,
                (0.0..=1.0).contains(&m) && (t - 4500.0).abs() < 1e-9
            );
        }
    }

    #[test]
    fn tabulated_reference_matches_the_direct_one() {
        // Between the nodes (2 mired apart), across the blend and in daylight.
        let mut worst = 0.0f64;
        for t in [
            1000.0, 1001.3, 1234.5, 1777.7, 2856.0, 3201.9, 3999.99, 4000.0, 4000.7, 4321.0,
            4999.5, 5000.0, 5003.0, 5500.7, 6504.0, 6999.9, 7000.0, 7000.001, 7000.1, 9999.0,
            12_345.6, 19_500.0, 24_999.0,
        ] {
            let (fast, kind, m) = reference_jab(t).unwrap();
            let (direct, kind_d, m_d) = reference_jab_direct(t).unwrap();
            assert_eq!(kind, kind_d, "{t}");
            assert!((m - m_d).abs() < 1e-12, "{t}");
            let mut here = 0.0f64;
            for (a, b) in fast.iter().zip(&direct) {
                for k in 0..3 {
                    here = here.max((a[k] - b[k]).abs());
                }
            }
            worst = worst.max(here);
        }
        eprintln!("largest TM-30 reference difference {worst:e}");
        // Planckian nodes interpolate to ~1e-8; where daylight enters, the
        // first-order correction for the rounding of M1, M2 leaves ~1e-7
        // (Rf moves by less than 1e-6).
        assert!(worst < 5e-7, "largest J′a′b′ difference {worst}");
    }

    #[test]
    fn blend_weights_by_cct() {
        let (_, kind, m) = tm30_reference(4250.0).unwrap();
        assert_eq!(kind, ReferenceKind::Blend);
        assert!((m - 0.25).abs() < 1e-12);
        assert_eq!(tm30_reference(3999.0).unwrap().1, ReferenceKind::Planckian);
        assert_eq!(tm30_reference(5001.0).unwrap().1, ReferenceKind::Daylight);
    }

    #[test]
    fn refuses_lights_without_cct() {
        let green = RelativeSpd::from_fn(|wl| 0.001 + (-((wl - 530.0) / 10.0).powi(2)).exp());
        assert!(tm30(&green).is_err());
        assert!(tm30(&RelativeSpd::from_fn(|_| 0.0)).is_err());
    }
}
