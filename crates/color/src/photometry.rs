//! Photometry of light sources: luminous efficacy of radiation, illuminance,
//! and exposure value from incident illuminance.
//!
//! Sums run over Lampwright's grid, 360–830 nm at 1 nm (the range of the CIE
//! tables of V(λ)); radiant power outside it is not counted.
//!
//! # References
//! - CIE 018:2019, *The basis of physical photometry*, 3rd ed.: V(λ),
//!   Km = 683 lm/W, luminous efficacy of radiation K = Km·∫S·V dλ / ∫S dλ.
//! - ISO 2720:1974, *General purpose photographic exposure meters* (incident-light
//!   calibration constant C); the value 250 for a flat receptor is common practice.

use crate::error::{ColorError, Result};
use crate::observer::v_lambda;
use crate::spectrum::{RelativeSpd, SpectralIrradiance};
use crate::tristimulus::KM_LM_PER_W;

/// Incident-light meter calibration constant C for a flat receptor, lx·s.
///
/// Common practice for flat (cosine) receptors; no published source is followed
/// here: ISO 2720 gives a range (240–400 for a hemispherical receptor), and
/// meters of the trade use about 250 for flat and 320–340 for dome receptors.
pub const INCIDENT_C_FLAT_LX_S: f64 = 250.0;

/// Speed S of the exposure values Lampwright reports (ISO 100).
pub const ISO_SPEED_100: f64 = 100.0;

/// Luminous efficacy of radiation of a spectrum, lm/W:
/// `K = 683 · Σ S(λ) V(λ) / Σ S(λ)` over 360–830 nm at 1 nm.
///
/// The denominator counts all radiant power on the grid, so a source with
/// infrared or ultraviolet beyond 830 / below 360 nm is overstated; lamp data
/// rarely extend that far. Refuses spectra that are not colorimetric
/// (all zero, or not covering the visible range).
///
/// # References
/// - CIE 018:2019, §4 (luminous efficacy of radiation, Km = 683 lm/W).
pub fn luminous_efficacy_of_radiation_lm_per_w(spd: &RelativeSpd) -> Result<f64> {
    spd.check_colorimetric("light")?;
    if spd.values().iter().any(|v| *v < 0.0) {
        return Err(ColorError::NotColorimetric {
            what: "light".into(),
            reason: "it has negative spectral power, so its efficacy is undefined".into(),
        });
    }
    let radiant = crate::spectral_weights::sum(spd.values());
    let luminous = spd.dot(v_lambda());
    if radiant <= 0.0 {
        return Err(ColorError::NotColorimetric {
            what: "light".into(),
            reason: "it carries no radiant power".into(),
        });
    }
    Ok(KM_LM_PER_W * luminous / radiant)
}

/// Illuminance in lux of a spectral irradiance in W·m⁻²·nm⁻¹:
/// `E_v = 683 · Σ E(λ) V(λ) Δλ` with Δλ = 1 nm over 360–830 nm.
///
/// # References
/// - CIE 018:2019, eq. (1) (photometric quantity from a spectral radiometric one).
#[must_use]
pub fn illuminance_lux(irradiance: &SpectralIrradiance) -> f64 {
    KM_LM_PER_W * irradiance.dot(v_lambda())
}

/// Exposure value at ISO 100 for an incident illuminance in lux:
/// `EV = log₂(E · S / C)` with S = 100 and C = 250 (flat receptor).
///
/// Common practice (incident-meter relation with the flat-receptor constant);
/// no published source fixes C = 250. Refuses non-positive or non-finite lux.
pub fn ev100_from_illuminance_lux(illuminance_lux: f64) -> Result<f64> {
    if !(illuminance_lux.is_finite() && illuminance_lux > 0.0) {
        return Err(ColorError::OutOfRange {
            what: "illuminance (lx)",
            value: illuminance_lux,
            range: "> 0 lx (EV is undefined in darkness)",
        });
    }
    // In log space, so that no finite illuminance overflows on the way.
    Ok(illuminance_lux.log2() + (ISO_SPEED_100 / INCIDENT_C_FLAT_LX_S).log2())
}

/// Incident illuminance in lux for an exposure value at ISO 100, the inverse of
/// [`ev100_from_illuminance_lux`]: `E = 2^EV · C / S`. Common practice, as there.
pub fn illuminance_lux_from_ev100(ev100: f64) -> Result<f64> {
    if !(ev100.is_finite() && (-60.0..=60.0).contains(&ev100)) {
        return Err(ColorError::OutOfRange {
            what: "exposure value (EV at ISO 100)",
            value: ev100,
            range: "−60 to +60",
        });
    }
    Ok(ev100.exp2() * INCIDENT_C_FLAT_LX_S / ISO_SPEED_100)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::spectrum::{Coverage, GRID_LEN};

    #[test]
    fn monochromatic_555_has_683_lm_per_w() {
        // Definition of Km (CIE 018:2019): 1 W at 555 nm (V = 1) is 683 lm.
        let mut g = [0.0; GRID_LEN];
        g[555 - 360] = 1.0;
        // A single line is not colorimetric (coverage), so test the irradiance path.
        let e = SpectralIrradiance::from_grid(g, Coverage::FULL).unwrap();
        assert!((illuminance_lux(&e) - 683.0).abs() < 1e-9);
    }

    #[test]
    fn equal_energy_efficacy() {
        // Equal-energy spectrum over 360–830 nm: K = 683·ΣV/471. ΣV over the grid is
        // 106.857 (CIE 1931 ȳ sum at 1 nm, from memory), so K ≈ 155.0 lm/W.
        let e = RelativeSpd::from_fn(|_| 1.0);
        let k = luminous_efficacy_of_radiation_lm_per_w(&e).unwrap();
        assert!((k - 683.0 * 106.857 / 471.0).abs() < 0.05, "{k}");
        assert!(luminous_efficacy_of_radiation_lm_per_w(&RelativeSpd::from_fn(|_| 0.0)).is_err());
        let neg = RelativeSpd::from_fn(|wl| if wl < 500.0 { -1.0 } else { 1.0 });
        assert!(luminous_efficacy_of_radiation_lm_per_w(&neg).is_err());
    }

    #[test]
    fn ev_round_trip_and_anchor() {
        // Common practice anchor: 2.5 lx at ISO 100 with C = 250 is EV 0; doubling adds 1 EV.
        assert!(ev100_from_illuminance_lux(2.5).unwrap().abs() < 1e-12);
        assert!((ev100_from_illuminance_lux(5.0).unwrap() - 1.0).abs() < 1e-12);
        for ev in [-3.0, 0.0, 7.5, 15.0] {
            let lux = illuminance_lux_from_ev100(ev).unwrap();
            assert!((ev100_from_illuminance_lux(lux).unwrap() - ev).abs() < 1e-12);
        }
        assert!(ev100_from_illuminance_lux(0.0).is_err());
        assert!(ev100_from_illuminance_lux(f64::NAN).is_err());
        // The largest finite illuminance still has a finite EV.
        let top = ev100_from_illuminance_lux(f64::MAX).unwrap();
        assert!(top.is_finite() && (top - (f64::MAX.log2() - 2.5_f64.log2())).abs() < 1e-9);
        assert!(illuminance_lux_from_ev100(f64::INFINITY).is_err());
    }
}
