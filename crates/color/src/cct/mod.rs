//! Correlated colour temperature (CCT), Duv and the Planckian locus in the
//! CIE 1960 UCS (u, v) diagram.
//!
//! Two methods, chosen with [`CctMethod`]:
//! - [`cct_ohno2014`]: Ohno's combined triangular / parabolic search on a
//!   precomputed Planckian table (the default; < 1 K over 1000–20 000 K for
//!   |Duv| ≤ 0.05 against an exhaustive search).
//! - [`cct_robertson1968`]: interpolation between isotemperature lines.
//!
//! CCT is defined on the CIE 1931 2° observer (CIE 15:2018 §9.5), whatever
//! observer the rest of a computation uses. Duv is the signed distance from
//! the Planckian locus in (u, v): positive above the locus (greenish),
//! negative below (magenta-ish), as in ANSI C78.377.
//!
//! **Valid range.** Results are returned only for 1000 K ≤ CCT ≤ 20 000 K and
//! |Duv| ≤ 0.05 ([`CCT_RANGE_K`], [`DUV_LIMIT`]); outside, the concept of a
//! correlated colour temperature is not meaningful (CIE 15:2018 §9.5 notes it
//! should not be used far from the locus) and [`ColorError::OutOfRange`] is
//! returned instead of a number.
//!
//! # References
//! - Ohno, Y. (2014). Practical use and calculation of CCT and Duv.
//!   *LEUKOS* 10(1), 47–55. doi:10.1080/15502724.2014.839020
//! - Robertson, A. R. (1968). Computation of correlated color temperature and
//!   distribution temperature. *JOSA* 58(11), 1528–1535. doi:10.1364/JOSA.58.001528
//! - CIE 15:2018, *Colorimetry*, 4th ed., §9.5 (CCT), eq. 8.1 (CIE 1960 UCS).
//! - ANSI C78.377-2017, *Specifications for the chromaticity of solid-state
//!   lighting products* (sign convention of Duv).

mod locus;
mod ohno2014;
mod robertson1968;

pub use locus::{isotemperature_line_uv, planckian_uv, uv_from_cct_duv};
pub use ohno2014::{OHNO2014_PARABOLIC_CORRECTION, cct_ohno2014};
pub use robertson1968::cct_robertson1968;

use crate::error::{ColorError, Result};
use crate::observer::Observer;
use crate::spaces::Uv1960;
use crate::spectrum::RelativeSpd;
use crate::tristimulus::{Xyz, xyz_sums};

/// Range of CCT for which [`cct_ohno2014`] and [`cct_robertson1968`] return a value, K.
pub const CCT_RANGE_K: (f64, f64) = (1000.0, 20_000.0);

/// Largest |Duv| for which a CCT is returned.
pub const DUV_LIMIT: f64 = 0.05;

/// Which CCT method to use.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
pub enum CctMethod {
    /// Ohno (2014) combined triangular / parabolic method (default).
    #[default]
    Ohno2014,
    /// Robertson (1968) isotemperature lines.
    Robertson1968,
}

/// A correlated colour temperature with its Duv.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct CctDuv {
    /// Correlated colour temperature, K.
    pub cct_k: f64,
    /// Signed distance from the Planckian locus in CIE 1960 (u, v); positive above (greenish).
    pub duv: f64,
}

/// Micro-reciprocal degrees: `1e6 / T`.
///
/// Gels and filters shift mired roughly additively (common practice).
pub fn mired(t_k: f64) -> Result<f64> {
    if !(t_k.is_finite() && t_k > 0.0) {
        return Err(ColorError::OutOfRange {
            what: "temperature (K)",
            value: t_k,
            range: "> 0 K",
        });
    }
    Ok(1e6 / t_k)
}

/// Temperature in K from mired (`1e6 / mired`), the inverse of [`mired`].
pub fn kelvin_from_mired(mired: f64) -> Result<f64> {
    if !(mired.is_finite() && mired > 0.0) {
        return Err(ColorError::OutOfRange {
            what: "mired value",
            value: mired,
            range: "> 0 mired",
        });
    }
    Ok(1e6 / mired)
}
pub(crate) fn check_uv(uv: Uv1960) -> Result<(f64, f64)> {
    let Uv1960 { u, v } = uv;
    if u.is_finite() && v.is_finite() && u > 0.0 && v > 0.0 {
        Ok((u, v))
    } else {
        Err(ColorError::InvalidInput(format!(
            "({u}, {v}) is not a chromaticity in the (u, v) diagram"
        )))
    }
}

pub(crate) fn check_result(r: CctDuv) -> Result<CctDuv> {
    if !(r.cct_k.is_finite() && r.duv.is_finite()) {
        return Err(ColorError::Numerical(
            "CCT search gave a non-finite result".into(),
        ));
    }
    if r.duv.abs() > DUV_LIMIT {
        return Err(ColorError::OutOfRange {
            what: "Duv",
            value: r.duv,
            range: "−0.05 to +0.05 (CCT is not meaningful further from the Planckian locus)",
        });
    }
    // Half a kelvin of grace at the ends, the accuracy of the search: the
    // locus point at exactly 20 000 K must not be refused for rounding.
    if !((CCT_RANGE_K.0 - 0.5)..=(CCT_RANGE_K.1 + 0.5)).contains(&r.cct_k) {
        return Err(ColorError::OutOfRange {
            what: "CCT (K)",
            value: r.cct_k,
            range: "1000–20 000 K",
        });
    }
    Ok(r)
}
/// CCT and Duv from CIE 1960 (u, v) by the chosen method.
pub fn cct_duv(uv: Uv1960, method: CctMethod) -> Result<CctDuv> {
    match method {
        CctMethod::Ohno2014 => cct_ohno2014(uv),
        CctMethod::Robertson1968 => cct_robertson1968(uv),
    }
}

/// CIE 1960 (u, v) of a light on the CIE 1931 2° observer (the observer CCT is defined on).
pub fn uv1960_of_spd(spd: &RelativeSpd, what: &str) -> Result<Uv1960> {
    spd.check_colorimetric(what)?;
    let xyz: Xyz = xyz_sums(spd.values(), Observer::cie1931_2deg());
    if xyz.y <= 0.0 {
        return Err(ColorError::NotColorimetric {
            what: what.to_string(),
            reason: "it has no visible power".into(),
        });
    }
    Ok(Uv1960::from_xyz(xyz))
}

/// CCT and Duv of a light spectrum (CIE 1931 2° observer, 360–830 nm at 1 nm).
pub fn cct_duv_of_spd(spd: &RelativeSpd, method: CctMethod) -> Result<CctDuv> {
    cct_duv(uv1960_of_spd(spd, "light")?, method)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::illuminant::{daylight, planckian};

    #[test]
    fn mired_round_trip() {
        assert!((mired(3200.0).unwrap() - 312.5).abs() < 1e-12);
        assert!((kelvin_from_mired(312.5).unwrap() - 3200.0).abs() < 1e-9);
        assert!(mired(0.0).is_err());
        assert!(mired(f64::NAN).is_err());
        assert!(kelvin_from_mired(-1.0).is_err());
    }

    #[test]
    fn out_of_range_is_an_error_not_a_number() {
        let uv = uv_from_cct_duv(5000.0, 0.06).unwrap();
        assert!(matches!(
            cct_ohno2014(uv),
            Err(ColorError::OutOfRange { what: "Duv", .. })
        ));
        assert!(matches!(
            cct_robertson1968(uv),
            Err(ColorError::OutOfRange { what: "Duv", .. })
        ));
        let uv = planckian_uv(900.0).unwrap();
        assert!(cct_ohno2014(uv).is_err());
        assert!(cct_robertson1968(uv).is_err());
        let uv = planckian_uv(30_000.0).unwrap();
        assert!(cct_ohno2014(uv).is_err());
        assert!(
            cct_ohno2014(Uv1960 {
                u: f64::NAN,
                v: 0.3
            })
            .is_err()
        );
        assert!(cct_ohno2014(Uv1960::default()).is_err());
        // Monochromatic green: far off the locus.
        assert!(cct_ohno2014(Uv1960 { u: 0.07, v: 0.45 }).is_err());
    }

    #[test]
    fn duv_is_positive_above_the_locus() {
        let p = planckian_uv(4000.0).unwrap();
        assert!(cct_ohno2014(Uv1960 { v: p.v + 0.01, ..p }).unwrap().duv > 0.0);
        assert!(cct_ohno2014(Uv1960 { v: p.v - 0.01, ..p }).unwrap().duv < 0.0);
        let [lo, hi] = isotemperature_line_uv(4000.0, 0.02).unwrap();
        assert!(hi.v > lo.v);
        assert!((cct_ohno2014(hi).unwrap().cct_k - 4000.0).abs() < 1.0);
        assert!(isotemperature_line_uv(4000.0, f64::NAN).is_err());
    }

    #[test]
    fn spectra_of_the_references() {
        // Planckian spectrum at T: CCT = T (the spectrum is the locus definition).
        let p = planckian(2700.0).unwrap();
        let r = cct_duv_of_spd(&p, CctMethod::Ohno2014).unwrap();
        assert!(
            (r.cct_k - 2700.0).abs() < 0.5 && r.duv.abs() < 1e-5,
            "{r:?}"
        );
        // CIE daylight lies above the locus: Duv ≈ +0.003 at 6500 K (CIE 15:2018 §4.1.2,
        // D65 at 6504 K has Duv ≈ 0.0032 — common knowledge of the trade).
        let d = daylight(6504.0).unwrap();
        let r = cct_duv_of_spd(&d, CctMethod::Ohno2014).unwrap();
        assert!((r.cct_k - 6504.0).abs() < 3.0, "{r:?}");
        assert!((r.duv - 0.0032).abs() < 3e-4, "{r:?}");
        assert!(cct_duv_of_spd(&RelativeSpd::from_fn(|_| 0.0), CctMethod::Ohno2014).is_err());
        // CIE daylight along its locus (CIE 15:2018 eqs. 4.7–4.9): CCT within 0.05 % of the
        // nominal T, always above the Planckian locus (Duv ≈ +0.003, the trade's "daylight
        // is slightly green of tungsten").
        for t in [4000.0, 5000.0, 5500.0, 7500.0, 10_000.0, 15_000.0, 20_000.0] {
            let r = cct_duv_of_spd(&daylight(t).unwrap(), CctMethod::Ohno2014).unwrap();
            assert!((r.cct_k - t).abs() < 5e-4 * t, "{t}: {r:?}");
            assert!((0.0025..0.0035).contains(&r.duv), "{t}: {r:?}");
        }
    }

    proptest::proptest! {
        #[test]
        fn any_uv_gives_a_finite_result_or_an_error(u in -1.0f64..2.0, v in -1.0f64..2.0) {
            for method in [CctMethod::Ohno2014, CctMethod::Robertson1968] {
                if let Ok(r) = cct_duv(Uv1960 { u, v }, method) {
                    proptest::prop_assert!(r.cct_k.is_finite() && r.duv.is_finite());
                    proptest::prop_assert!(r.duv.abs() <= DUV_LIMIT);
                    proptest::prop_assert!((999.5..=20_000.5).contains(&r.cct_k));
                }
            }
        }
    }
}
