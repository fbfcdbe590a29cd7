//! Spectra on Lampwright's one internal grid: 360–830 nm at 1 nm (CIE 15 range).
//!
//! Each kind of curve has its own type so that the compiler keeps a reflectance
//! from being used as a light source: [`RelativeSpd`] (relative spectral power
//! of a light), [`SpectralIrradiance`] (absolute, W·m⁻²·nm⁻¹), [`Reflectance`]
//! (reflectance factor, 0–1 for ordinary surfaces), [`Transmittance`] (0–1) and
//! [`Sensitivity`] (relative spectral responsivity of a detector channel).
//!
//! Every curve remembers the wavelength range that was actually measured
//! ([`Coverage`]); outside it, values are the end values repeated (CIE 15 rule),
//! and callers can warn or refuse when the data stop short of the visible range.

use crate::error::{ColorError, Result};
use crate::resample;
use std::ops::{Add, Mul};

/// First wavelength of the internal grid, in nm.
pub const GRID_START_NM: u32 = 360;
/// Last wavelength of the internal grid, in nm.
pub const GRID_END_NM: u32 = 830;
/// Number of samples on the internal grid (1 nm step).
pub const GRID_LEN: usize = (GRID_END_NM - GRID_START_NM + 1) as usize;

/// Wavelength in nm of grid sample `index`.
#[must_use]
pub fn grid_wavelength_nm(index: usize) -> f64 {
    f64::from(GRID_START_NM) + index as f64
}

/// Iterator over the grid wavelengths in nm.
pub fn grid_wavelengths_nm() -> impl Iterator<Item = f64> {
    (0..GRID_LEN).map(grid_wavelength_nm)
}

/// Shortest start and longest end of the measured range that still counts as
/// covering the visible range for colorimetry (roughly 380–780 nm, with 10 nm grace).
pub const VISIBLE_START_LIMIT_NM: f64 = 390.0;
/// See [`VISIBLE_START_LIMIT_NM`].
pub const VISIBLE_END_LIMIT_NM: f64 = 770.0;

/// The wavelength range that was measured, in nm.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Coverage {
    /// First measured wavelength, nm.
    pub start_nm: f64,
    /// Last measured wavelength, nm.
    pub end_nm: f64,
}

impl Coverage {
    /// The whole internal grid.
    pub const FULL: Coverage = Coverage {
        start_nm: GRID_START_NM as f64,
        end_nm: GRID_END_NM as f64,
    };

    /// Whether the range covers roughly 380–780 nm (see [`VISIBLE_START_LIMIT_NM`]).
    #[must_use]
    pub fn covers_visible(&self) -> bool {
        self.start_nm <= VISIBLE_START_LIMIT_NM && self.end_nm >= VISIBLE_END_LIMIT_NM
    }

    /// The range both curves were measured over (for products of curves).
    #[must_use]
    pub fn intersect(&self, other: &Coverage) -> Coverage {
        Coverage {
            start_nm: self.start_nm.max(other.start_nm),
            end_nm: self.end_nm.min(other.end_nm),
        }
    }
}

/// Values on the internal grid plus the measured range. The typed curves wrap it.
#[derive(Debug, Clone, PartialEq)]
pub struct Curve {
    values: Box<[f64; GRID_LEN]>,
    coverage: Coverage,
}

impl Curve {
    fn from_fn(mut f: impl FnMut(f64) -> f64) -> Self {
        let mut values = Box::new([0.0; GRID_LEN]);
        for (i, v) in values.iter_mut().enumerate() {
            *v = f(grid_wavelength_nm(i));
        }
        Curve {
            values,
            coverage: Coverage::FULL,
        }
    }

    fn from_grid(values: &[f64; GRID_LEN], coverage: Coverage) -> Result<Self> {
        if let Some(i) = values.iter().position(|v| !v.is_finite()) {
            return Err(ColorError::InvalidInput(format!(
                "value at {} nm is not a finite number",
                grid_wavelength_nm(i)
            )));
        }
        Ok(Curve {
            values: Box::new(*values),
            coverage,
        })
    }

    fn from_samples(wavelengths_nm: &[f64], values: &[f64]) -> Result<Self> {
        let (grid, coverage) = resample::to_grid(wavelengths_nm, values)?;
        Self::from_grid(&grid, coverage)
    }

    /// The values on the grid, 360–830 nm at 1 nm.
    #[must_use]
    pub fn values(&self) -> &[f64; GRID_LEN] {
        &self.values
    }

    /// The measured wavelength range.
    #[must_use]
    pub fn coverage(&self) -> Coverage {
        self.coverage
    }

    /// Value at a wavelength in nm (linear between grid samples, end values outside).
    #[must_use]
    pub fn at_nm(&self, wavelength_nm: f64) -> f64 {
        let pos = (wavelength_nm - f64::from(GRID_START_NM)).clamp(0.0, (GRID_LEN - 1) as f64);
        let i = pos.floor() as usize;
        if i >= GRID_LEN - 1 {
            return self.values[GRID_LEN - 1];
        }
        let t = pos - i as f64;
        self.values[i] * (1.0 - t) + self.values[i + 1] * t
    }

    /// Largest value on the grid.
    #[must_use]
    pub fn max_value(&self) -> f64 {
        self.values
            .iter()
            .copied()
            .fold(f64::NEG_INFINITY, f64::max)
    }

    /// Sum over the grid of `self × other` (Δλ = 1 nm).
    #[must_use]
    pub fn dot(&self, other: &[f64; GRID_LEN]) -> f64 {
        crate::spectral_weights::dot(self.values.as_slice(), other)
    }

    /// Whether every value is zero (or negative): nothing to measure.
    #[must_use]
    pub fn is_dark(&self) -> bool {
        self.values.iter().all(|v| *v <= 0.0)
    }

    fn zip_with(&self, other: &Curve, f: impl Fn(f64, f64) -> f64) -> Curve {
        let mut values = Box::new([0.0; GRID_LEN]);
        for ((o, a), b) in values
            .iter_mut()
            .zip(self.values.iter())
            .zip(other.values.iter())
        {
            *o = f(*a, *b);
        }
        Curve {
            values,
            coverage: self.coverage.intersect(&other.coverage),
        }
    }

    fn map(&self, f: impl Fn(f64) -> f64) -> Curve {
        let mut values = self.values.clone();
        for v in values.iter_mut() {
            *v = f(*v);
        }
        Curve {
            values,
            coverage: self.coverage,
        }
    }

    /// Refuse a curve that cannot support colorimetry: non-finite, all zero,
    /// or measured over less than the visible range.
    pub fn check_colorimetric(&self, what: &str) -> Result<()> {
        let refuse = |reason: String| ColorError::NotColorimetric {
            what: what.to_string(),
            reason,
        };
        if self.values.iter().any(|v| !v.is_finite()) {
            return Err(refuse(
                "it holds a value that is not a finite number".into(),
            ));
        }
        if self.is_dark() {
            return Err(refuse("it is zero at every wavelength".into()));
        }
        if !self.coverage.covers_visible() {
            return Err(refuse(format!(
                "it was measured only over {:.0}–{:.0} nm; colorimetry needs roughly 380–780 nm",
                self.coverage.start_nm, self.coverage.end_nm
            )));
        }
        Ok(())
    }
}

macro_rules! curve_type {
    ($(#[$doc:meta])* $name:ident) => {
        $(#[$doc])*
        #[derive(Debug, Clone, PartialEq)]
        pub struct $name(Curve);

        impl $name {
            /// Build from a function of wavelength in nm, evaluated on the grid.
            pub fn from_fn(f: impl FnMut(f64) -> f64) -> Self {
                Self(Curve::from_fn(f))
            }

            /// Build from values already on the grid (360–830 nm, 1 nm).
            pub fn from_grid(values: [f64; GRID_LEN], coverage: Coverage) -> Result<Self> {
                Curve::from_grid(&values, coverage).map(Self)
            }

            /// Resample measured data (strictly increasing wavelengths in nm) onto
            /// the grid; see [`crate::resample::to_grid`] for the method.
            pub fn from_samples(wavelengths_nm: &[f64], values: &[f64]) -> Result<Self> {
                Curve::from_samples(wavelengths_nm, values).map(Self)
            }

            /// Every value multiplied by `factor`.
            #[must_use]
            pub fn scaled(&self, factor: f64) -> Self {
                Self(self.0.map(|v| v * factor))
            }

            /// The underlying grid values and coverage.
            #[must_use]
            pub fn curve(&self) -> &Curve {
                &self.0
            }
        }

        impl std::ops::Deref for $name {
            type Target = Curve;
            fn deref(&self) -> &Curve {
                &self.0
            }
        }
    };
}

curve_type!(
    /// Relative spectral power distribution of a light (arbitrary scale).
    RelativeSpd
);
curve_type!(
    /// Absolute spectral irradiance at the subject, W·m⁻²·nm⁻¹.
    SpectralIrradiance
);
curve_type!(
    /// Spectral reflectance factor of a surface (1 = perfect reflecting diffuser).
    Reflectance
);
curve_type!(
    /// Spectral transmittance of a filter, 0–1.
    Transmittance
);
curve_type!(
    /// Relative spectral sensitivity of a detector channel (camera channel, observer function).
    Sensitivity
);

/// `Σ wᵢ · curveᵢ`, covering where every part is measured (full coverage
/// and all zero for no parts).
fn weighted_sum_of<'a>(parts: impl Iterator<Item = (f64, &'a Curve)>) -> Curve {
    let mut values = Box::new([0.0; GRID_LEN]);
    let mut coverage: Option<Coverage> = None;
    for (w, c) in parts {
        for (o, v) in values.iter_mut().zip(c.values.iter()) {
            *o += w * v;
        }
        coverage = Some(coverage.map_or(c.coverage, |k| k.intersect(&c.coverage)));
    }
    Curve {
        values,
        coverage: coverage.unwrap_or(Coverage::FULL),
    }
}

impl RelativeSpd {
    /// Weighted sum of lights, `Σ wᵢ·Sᵢ` (mixing sources at levels `wᵢ`).
    /// An empty list gives a dark spectrum.
    #[must_use]
    pub fn weighted_sum<'a>(
        parts: impl IntoIterator<Item = (f64, &'a RelativeSpd)>,
    ) -> RelativeSpd {
        RelativeSpd(weighted_sum_of(parts.into_iter().map(|(w, s)| (w, &s.0))))
    }

    /// This relative spectrum scaled to an absolute spectral irradiance.
    #[must_use]
    pub fn to_irradiance(&self, watts_per_m2_nm_per_unit: f64) -> SpectralIrradiance {
        SpectralIrradiance(self.0.map(|v| v * watts_per_m2_nm_per_unit))
    }
}

impl SpectralIrradiance {
    /// `Σ wᵢ · irradianceᵢ`, covering where every part is measured.
    #[must_use]
    pub fn weighted_sum<'a>(
        parts: impl IntoIterator<Item = (f64, &'a SpectralIrradiance)>,
    ) -> SpectralIrradiance {
        SpectralIrradiance(weighted_sum_of(parts.into_iter().map(|(w, e)| (w, &e.0))))
    }

    /// Drop the absolute scale.
    #[must_use]
    pub fn to_relative(&self) -> RelativeSpd {
        RelativeSpd(self.0.clone())
    }
}

impl Transmittance {
    /// A fraction `f` of this filter: transmittance `T^f`, as dye density scales
    /// linearly with the amount of dye (Beer–Lambert). `f = 0` is clear glass.
    #[must_use]
    pub fn strength(&self, fraction: f64) -> Transmittance {
        let f = if fraction.is_finite() {
            fraction.max(0.0)
        } else {
            0.0
        };
        // T^f over the whole grid at once (vectorised exp and ln, to a few
        // units in the last place of `powf`); opaque points stay opaque
        // unless f = 0.
        let mut values = self.0.values.clone();
        let sqrt_all = |v: &mut [f64; GRID_LEN]| v.iter_mut().for_each(|t| *t = t.max(0.0).sqrt());
        // The trade's fractions (exactly 1/2, 1/4, 1/8, 3/4) by square
        // roots: exact to rounding, and fast.
        let is = |v: f64| f.to_bits() == v.to_bits();
        if f == 0.0 {
            values.fill(1.0);
        } else if let Some(times) = [(0.5, 1), (0.25, 2), (0.125, 3)]
            .iter()
            .find(|(v, _)| is(*v))
            .map(|(_, n)| *n)
        {
            for _ in 0..times {
                sqrt_all(&mut values);
            }
        } else if is(0.75) {
            let mut quarter = values.clone();
            sqrt_all(&mut values);
            sqrt_all(&mut quarter);
            sqrt_all(&mut quarter);
            for (v, q) in values.iter_mut().zip(quarter.iter()) {
                *v *= q;
            }
        } else {
            crate::batch_math::pow_nonnegative_in_place(&mut values[..], f);
        }
        Transmittance(Curve {
            values,
            coverage: self.0.coverage,
        })
    }

    /// A perfectly clear filter (T = 1 everywhere).
    #[must_use]
    pub fn clear() -> Transmittance {
        Transmittance::from_fn(|_| 1.0)
    }
}

impl Reflectance {
    /// The perfect reflecting diffuser (reflectance 1 everywhere).
    #[must_use]
    pub fn perfect_white() -> Reflectance {
        Reflectance::from_fn(|_| 1.0)
    }
}

impl Mul<&Transmittance> for &RelativeSpd {
    type Output = RelativeSpd;
    /// Light through a filter.
    fn mul(self, rhs: &Transmittance) -> RelativeSpd {
        RelativeSpd(self.0.zip_with(&rhs.0, |a, b| a * b))
    }
}

impl Mul<&Reflectance> for &RelativeSpd {
    type Output = RelativeSpd;
    /// Light reflected by a surface (the colour stimulus).
    fn mul(self, rhs: &Reflectance) -> RelativeSpd {
        RelativeSpd(self.0.zip_with(&rhs.0, |a, b| a * b))
    }
}

impl Mul<&Transmittance> for &SpectralIrradiance {
    type Output = SpectralIrradiance;
    /// Irradiance through a filter.
    fn mul(self, rhs: &Transmittance) -> SpectralIrradiance {
        SpectralIrradiance(self.0.zip_with(&rhs.0, |a, b| a * b))
    }
}

impl Mul<&Transmittance> for &Transmittance {
    type Output = Transmittance;
    /// Two filters stacked.
    fn mul(self, rhs: &Transmittance) -> Transmittance {
        Transmittance(self.0.zip_with(&rhs.0, |a, b| a * b))
    }
}

impl Add<&RelativeSpd> for &RelativeSpd {
    type Output = RelativeSpd;
    /// Two lights together.
    fn add(self, rhs: &RelativeSpd) -> RelativeSpd {
        RelativeSpd(self.0.zip_with(&rhs.0, |a, b| a + b))
    }
}

impl Add<&SpectralIrradiance> for &SpectralIrradiance {
    type Output = SpectralIrradiance;
    /// Two lights together.
    fn add(self, rhs: &SpectralIrradiance) -> SpectralIrradiance {
        SpectralIrradiance(self.0.zip_with(&rhs.0, |a, b| a + b))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn grid_spans_cie15_range() {
        assert_eq!(GRID_LEN, 471);
        assert!((grid_wavelength_nm(0) - 360.0).abs() < 1e-12);
        assert!((grid_wavelength_nm(GRID_LEN - 1) - 830.0).abs() < 1e-12);
    }

    #[test]
    fn products_intersect_coverage() {
        let spd = RelativeSpd::from_samples(&[380.0, 780.0], &[1.0, 1.0]).unwrap();
        let t = Transmittance::from_samples(&[400.0, 700.0], &[0.5, 0.5]).unwrap();
        let out = &spd * &t;
        assert_eq!(
            out.coverage(),
            Coverage {
                start_nm: 400.0,
                end_nm: 700.0
            }
        );
        assert!((out.at_nm(550.0) - 0.5).abs() < 1e-12);
        assert!(!out.coverage().covers_visible());
    }

    #[test]
    fn gel_strength_scales_density() {
        let t = Transmittance::from_fn(|_| 0.25);
        assert!((t.strength(0.5).at_nm(500.0) - 0.5).abs() < 1e-12);
        assert!((t.strength(0.0).at_nm(500.0) - 1.0).abs() < 1e-12);
        let opaque = Transmittance::from_fn(|_| 0.0);
        assert!(opaque.strength(0.5).at_nm(500.0).abs() < 1e-12);
        assert!((opaque.strength(0.0).at_nm(500.0) - 1.0).abs() < 1e-12);
        // Every fraction, the square-root ones included, agrees with `powf`.
        let gel = Transmittance::from_fn(|wl| 0.02 + 0.9 * ((wl - 360.0) / 470.0).powi(2));
        for f in [0.125, 0.25, 0.5, 0.75, 0.3, 1.0, 2.0] {
            let got = gel.strength(f);
            for (g, t) in got.values().iter().zip(gel.values().iter()) {
                let want = t.powf(f);
                assert!((g - want).abs() <= 1e-14 * want, "f = {f}: {g} vs {want}");
            }
        }
    }

    #[test]
    fn weighted_sum_mixes_linearly() {
        let a = RelativeSpd::from_fn(|_| 1.0);
        let b = RelativeSpd::from_fn(|wl| wl);
        let m = RelativeSpd::weighted_sum([(2.0, &a), (0.5, &b)]);
        assert!((m.at_nm(500.0) - 252.0).abs() < 1e-9);
        assert!(RelativeSpd::weighted_sum([]).is_dark());
    }

    #[test]
    fn colorimetric_check_refuses_dark_and_short_data() {
        let dark = RelativeSpd::from_fn(|_| 0.0);
        assert!(dark.check_colorimetric("lamp").is_err());
        let short = RelativeSpd::from_samples(&[500.0, 600.0], &[1.0, 1.0]).unwrap();
        let err = short
            .check_colorimetric("lamp 'x'")
            .unwrap_err()
            .to_string();
        assert!(err.contains("500–600 nm"), "{err}");
        assert!(
            RelativeSpd::from_fn(|_| 1.0)
                .check_colorimetric("lamp")
                .is_ok()
        );
    }
}
