//! CIE XYZ tristimulus values from spectra.
//!
//! Summation over 360–830 nm at 1 nm (CIE 15:2018 §7: the full range of the
//! observer tables; the reference package's default stops at 780 nm, see
//! `docs/methods.md`).
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., §7.1 (eqs. 7.1–7.3): relative XYZ with
//!   k chosen so Y = 100 for the perfect reflecting diffuser; absolute XYZ with
//!   Km = 683 lm/W, giving Y in lux for spectral irradiance in W·m⁻²·nm⁻¹.

use crate::error::{ColorError, Result};
use crate::observer::Observer;
use crate::spectrum::{GRID_LEN, Reflectance, RelativeSpd, SpectralIrradiance};

/// Maximum luminous efficacy for photopic vision, lm/W (CIE 018:2019).
pub const KM_LM_PER_W: f64 = 683.0;

/// CIE XYZ tristimulus values.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct Xyz {
    /// X.
    pub x: f64,
    /// Y (luminance factor or luminance-like quantity).
    pub y: f64,
    /// Z.
    pub z: f64,
}

impl Xyz {
    /// From components.
    #[must_use]
    pub const fn new(x: f64, y: f64, z: f64) -> Xyz {
        Xyz { x, y, z }
    }

    /// As an array `[X, Y, Z]`.
    #[must_use]
    pub const fn to_array(self) -> [f64; 3] {
        [self.x, self.y, self.z]
    }

    /// From an array `[X, Y, Z]`.
    #[must_use]
    pub const fn from_array(a: [f64; 3]) -> Xyz {
        Xyz {
            x: a[0],
            y: a[1],
            z: a[2],
        }
    }

    /// Every component multiplied by `k`.
    #[must_use]
    pub fn scaled(self, k: f64) -> Xyz {
        Xyz::new(self.x * k, self.y * k, self.z * k)
    }

    /// Scaled so that Y = `y`. A zero Y gives zero.
    #[must_use]
    pub fn with_y(self, y: f64) -> Xyz {
        if self.y == 0.0 {
            Xyz::default()
        } else {
            self.scaled(y / self.y)
        }
    }

    /// Whether all components are finite.
    #[must_use]
    pub fn is_finite(self) -> bool {
        self.x.is_finite() && self.y.is_finite() && self.z.is_finite()
    }

    /// Chromaticity (x, y); `None` when X + Y + Z is not positive.
    #[must_use]
    pub fn chromaticity(self) -> Option<(f64, f64)> {
        let s = self.x + self.y + self.z;
        (s > 0.0 && s.is_finite()).then(|| (self.x / s, self.y / s))
    }
}

/// Unnormalised sums `Σ S(λ) x̄(λ) Δλ` etc. with Δλ = 1 nm.
#[must_use]
pub fn xyz_sums(values: &[f64; GRID_LEN], observer: &Observer) -> Xyz {
    use crate::spectral_weights::dot;
    Xyz::new(
        dot(values, &observer.x_bar),
        dot(values, &observer.y_bar),
        dot(values, &observer.z_bar),
    )
}

/// XYZ of a light source normalised to Y = 100 (its white point).
///
/// Refuses spectra that cannot support colorimetry (see
/// [`crate::spectrum::Curve::check_colorimetric`]).
pub fn xyz_of_light(spd: &RelativeSpd, observer: &Observer, what: &str) -> Result<Xyz> {
    spd.check_colorimetric(what)?;
    let xyz = xyz_sums(spd.values(), observer);
    if xyz.y <= 0.0 {
        return Err(ColorError::NotColorimetric {
            what: what.to_string(),
            reason: "it has no visible power".into(),
        });
    }
    Ok(xyz.with_y(100.0))
}

/// XYZ of a surface under a light, relative: Y = 100 for the perfect reflecting diffuser.
pub fn xyz_of_object(
    light: &RelativeSpd,
    reflectance: &Reflectance,
    observer: &Observer,
    what: &str,
) -> Result<Xyz> {
    light.check_colorimetric(what)?;
    let white_y = xyz_sums(light.values(), observer).y;
    if white_y <= 0.0 {
        return Err(ColorError::NotColorimetric {
            what: what.to_string(),
            reason: "it has no visible power".into(),
        });
    }
    let stim = light * reflectance;
    Ok(xyz_sums(stim.values(), observer).scaled(100.0 / white_y))
}

/// Absolute XYZ of a spectral irradiance (W·m⁻²·nm⁻¹): Y is the illuminance in lux
/// (Km = 683 lm/W; 1931 observer for photometry proper).
#[must_use]
pub fn xyz_absolute(irradiance: &SpectralIrradiance, observer: &Observer) -> Xyz {
    xyz_sums(irradiance.values(), observer).scaled(KM_LM_PER_W)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::illuminant::StandardIlluminant;

    fn xy(ill: StandardIlluminant) -> (f64, f64) {
        xyz_of_light(&ill.spd().unwrap(), Observer::cie1931_2deg(), "t")
            .unwrap()
            .chromaticity()
            .unwrap()
    }

    #[test]
    fn cie15_white_points() {
        // CIE 15:2018 Table 3 chromaticities (2°): A (0.44757, 0.40745), D65 (0.31271, 0.32902),
        // D50 (0.34567, 0.35851). The CIE computed them at 5 nm to 780 nm; our 1 nm sum to
        // 830 nm agrees to 5e-5.
        for (ill, x0, y0) in [
            (StandardIlluminant::A, 0.44757, 0.40745),
            (StandardIlluminant::D65, 0.31271, 0.32902),
            (StandardIlluminant::D50, 0.34567, 0.35851),
        ] {
            let (x, y) = xy(ill);
            assert!(
                (x - x0).abs() < 5e-5 && (y - y0).abs() < 5e-5,
                "{}: {x} {y}",
                ill.name()
            );
        }
    }

    #[test]
    fn perfect_white_has_y_100() {
        let d65 = StandardIlluminant::D65.spd().unwrap();
        let w = xyz_of_object(
            &d65,
            &Reflectance::perfect_white(),
            Observer::cie1931_2deg(),
            "t",
        )
        .unwrap();
        assert!((w.y - 100.0).abs() < 1e-9);
    }

    #[test]
    fn absolute_y_is_lux() {
        // 1 W·m⁻²·nm⁻¹ only at 555 nm → 683 lx (definition of Km; V(555) = 1).
        let mut g = [0.0; GRID_LEN];
        g[555 - 360] = 1.0;
        let e = SpectralIrradiance::from_grid(g, crate::Coverage::FULL).unwrap();
        assert!((xyz_absolute(&e, Observer::cie1931_2deg()).y - 683.0).abs() < 1e-9);
    }

    #[test]
    fn dark_light_is_refused() {
        let dark = RelativeSpd::from_fn(|_| 0.0);
        assert!(xyz_of_light(&dark, Observer::cie1931_2deg(), "lamp").is_err());
    }
}
