//! Everything the trade asks of a lamp spectrum, computed at once: chromaticity,
//! CCT and Duv, CIE 13.3 CRI, ANSI/IES TM-30 (CIE 224) fidelity and gamut, the
//! Academy SSI and the luminous efficacy of radiation, with warnings in words.
//!
//! The CCT is found once and shared by CRI, TM-30 and SSI; their references
//! at that CCT come from Planckian tables over mired and the CIE daylight
//! basis, not from reference spectra built per call.
//!
//! # References
//! See the modules: [`crate::cct`], [`crate::cri`], [`crate::tm30`],
//! [`crate::ssi`], [`crate::photometry`].

use crate::cct::CctDuv;
use crate::cri::Cri;
use crate::error::{ColorError, Result};
use crate::light_sums::LightSums;
use crate::observer::ObserverKind;
use crate::photometry::luminous_efficacy_of_radiation_lm_per_w;
use crate::spaces::{Uv1960, UvPrime};
use crate::spectrum::RelativeSpd;
use crate::ssi::Ssi;
use crate::tm30::Tm30;
use crate::tristimulus::{Xyz, xyz_sums};

/// The figures of one lamp spectrum.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct LampReport {
    /// Observer of `xyz`, `xy`, `uv1960`, `uv_prime` (CCT is always on the 1931 2° observer).
    pub observer: ObserverKind,
    /// Tristimulus values of the light, Y = 100.
    pub xyz: Xyz,
    /// Chromaticity (x, y).
    pub xy: (f64, f64),
    /// CIE 1960 (u, v).
    pub uv1960: Uv1960,
    /// CIE 1976 (u′, v′).
    pub uv_prime: UvPrime,
    /// CCT and Duv (Ohno 2014, 1931 2° observer); `None` when the light is too far
    /// from the Planckian locus or outside 1000–20 000 K (see `warnings`).
    pub cct: Option<CctDuv>,
    /// CIE 13.3 colour rendering; `None` without a CCT.
    pub cri: Option<Cri>,
    /// ANSI/IES TM-30-20 / CIE 224 figures; `None` without a CCT.
    pub tm30: Option<Tm30>,
    /// Academy SSI against the default reference at the lamp's CCT; `None` without a CCT.
    pub ssi: Option<Ssi>,
    /// Luminous efficacy of radiation, lm/W (360–830 nm).
    pub ler_lm_per_w: f64,
    /// Things to know, one line each, in words for people.
    pub warnings: Vec<String>,
}

/// [`lamp_report_with_observer`] with the CIE 1931 2° observer.
pub fn lamp_report(spd: &RelativeSpd) -> Result<LampReport> {
    lamp_report_with_observer(spd, ObserverKind::Cie1931TwoDegree)
}

/// Every lamp figure of `spd`; chromaticities on `observer`.
///
/// Errors only when the spectrum cannot support colorimetry at all (all zero,
/// negative visible power, measured over less than the visible range). A light
/// without a CCT still gets its chromaticity and efficacy; the metrics that need
/// a reference at its CCT are `None`, with a warning saying why.
pub fn lamp_report_with_observer(spd: &RelativeSpd, observer: ObserverKind) -> Result<LampReport> {
    let what = "lamp spectrum";
    spd.check_colorimetric(what)?;
    // The weighted sums every figure needs, taken once.
    let sums = LightSums::of(spd)?;
    let raw = match observer {
        ObserverKind::Cie1931TwoDegree => sums.xyz(),
        ObserverKind::Cie1964TenDegree => xyz_sums(spd.values(), observer.observer()),
    };
    if raw.y.is_nan() || raw.y <= 0.0 {
        return Err(ColorError::NotColorimetric {
            what: what.into(),
            reason: "it has no visible power".into(),
        });
    }
    let xyz = raw.with_y(100.0);
    let xy = xyz
        .chromaticity()
        .ok_or_else(|| ColorError::NotColorimetric {
            what: what.into(),
            reason: "its tristimulus values do not sum to a positive number".into(),
        })?;
    let mut warnings = Vec::new();
    let ler_lm_per_w = match luminous_efficacy_of_radiation_lm_per_w(spd) {
        Ok(v) => v,
        Err(e) => {
            warnings.push(format!("no luminous efficacy: {e}"));
            0.0
        }
    };
    let mut report = LampReport {
        observer,
        xyz,
        xy,
        uv1960: Uv1960::from_xyz(xyz),
        uv_prime: UvPrime::from_xyz(xyz),
        cct: None,
        cri: None,
        tm30: None,
        ssi: None,
        ler_lm_per_w,
        warnings,
    };
    // CCT from the sums, then each metric's reference side at that CCT from
    // tables (Planckian) or basis sums (daylight): no reference spectrum is
    // built here.
    let cct = match sums.cct() {
        Ok(c) => c,
        Err(e) => {
            report
                .warnings
                .push(format!("no CCT, so no CRI, TM-30 or SSI: {e}"));
            return Ok(report);
        }
    };
    report.cct = Some(cct);
    let quality = sums.quality(cct);
    match quality.cri {
        Ok(c) => {
            if let Some(w) = c.warning() {
                report.warnings.push(w);
            }
            report.cri = Some(c);
        }
        Err(e) => report.warnings.push(format!("no CRI: {e}")),
    }
    match quality.tm30 {
        Ok(tm) => report.tm30 = Some(tm),
        Err(e) => report.warnings.push(format!("no TM-30: {e}")),
    }
    match quality.ssi {
        Ok(s) => report.ssi = Some(s),
        Err(e) => report.warnings.push(format!("no SSI: {e}")),
    }
    Ok(report)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::illuminant::{StandardIlluminant, planckian};

    #[test]
    fn report_of_a_reference_is_perfect() {
        let p = planckian(3200.0).unwrap();
        let r = lamp_report(&p).unwrap();
        let cct = r.cct.unwrap();
        assert!((cct.cct_k - 3200.0).abs() < 0.5);
        // The reference is taken at the found CCT, a fraction of a kelvin off 3200 K.
        assert!((r.cri.as_ref().unwrap().ra - 100.0).abs() < 0.01);
        assert!((r.tm30.as_ref().unwrap().rf - 100.0).abs() < 0.01);
        assert!((r.tm30.as_ref().unwrap().rg - 100.0).abs() < 0.01);
        assert_eq!(r.ssi.unwrap().value, 100);
        assert!(r.warnings.is_empty(), "{:?}", r.warnings);
        assert!(r.ler_lm_per_w > 0.0);
    }

    #[test]
    fn report_matches_the_single_metrics() {
        let f2 = StandardIlluminant::F(2).spd().unwrap();
        let r = lamp_report(&f2).unwrap();
        let cri = crate::cri::cri_cie133(&f2).unwrap();
        assert!((r.cri.unwrap().ra - cri.ra).abs() < 1e-12);
        let tm = crate::tm30::tm30(&f2).unwrap();
        assert!((r.tm30.unwrap().rf - tm.rf).abs() < 1e-12);
        assert_eq!(r.ssi.unwrap(), crate::ssi::ssi_default(&f2).unwrap());
    }

    #[test]
    fn off_locus_light_keeps_chromaticity_and_warns() {
        let green = RelativeSpd::from_fn(|wl| 0.001 + (-((wl - 530.0) / 10.0).powi(2)).exp());
        let r = lamp_report(&green).unwrap();
        assert!(r.cct.is_none() && r.cri.is_none() && r.tm30.is_none() && r.ssi.is_none());
        assert!(
            r.warnings.iter().any(|w| w.contains("no CCT")),
            "{:?}",
            r.warnings
        );
        assert!(r.xy.1 > 0.6);
        assert!(lamp_report(&RelativeSpd::from_fn(|_| 0.0)).is_err());
    }

    #[test]
    fn ten_degree_observer_changes_chromaticity_not_cct() {
        let f2 = StandardIlluminant::F(2).spd().unwrap();
        let r2 = lamp_report(&f2).unwrap();
        let r10 = lamp_report_with_observer(&f2, ObserverKind::Cie1964TenDegree).unwrap();
        assert!((r2.xy.0 - r10.xy.0).abs() > 1e-4);
        assert_eq!(r2.cct, r10.cct);
    }
}
