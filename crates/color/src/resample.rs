//! Resampling measured data onto the internal 1 nm grid.
//!
//! - **Uniform data** (every step equal within 10⁻⁶ nm relative), six points or
//!   more: Sprague (1880) fifth-order interpolation with the CIE boundary
//!   extension coefficients, as CIE 167:2005 recommends for spectral data.
//! - **Irregular data**, or uniform data with fewer than six points:
//!   piecewise-cubic Hermite interpolation with Fritsch–Carlson monotone slopes
//!   (PCHIP). It passes through every measured point and never overshoots
//!   between them, so a narrow emission line cannot ring into negative power.
//! - **Outside the measured range**: the end values are repeated (CIE 15:2018,
//!   §7.2.2), and the measured range is returned so callers can warn or refuse.
//!
//! # References
//! - CIE 167:2005, *Recommended practice for tabulating spectral data for use in
//!   colour computations*.
//! - Westland, Ripamonti & Cheung (2012), *Computational Colour Technology*, 2nd ed., §5.2 (Sprague coefficients).
//! - Fritsch & Carlson (1980), *Monotone piecewise cubic interpolation*, SIAM J. Numer. Anal. 17(2), 238–246, doi:10.1137/0717021.

use crate::error::{ColorError, Result};
use crate::spectrum::{Coverage, GRID_LEN, grid_wavelength_nm};

/// Most samples accepted for one curve.
pub const MAX_SAMPLES: usize = 100_000;

/// Resample `(wavelength nm, value)` data onto the grid (360–830 nm at 1 nm).
///
/// Wavelengths must be finite and strictly increasing; values finite. Returns
/// the grid values and the measured range.
pub fn to_grid(wavelengths_nm: &[f64], values: &[f64]) -> Result<([f64; GRID_LEN], Coverage)> {
    validate(wavelengths_nm, values)?;
    let n = wavelengths_nm.len();
    let first = wavelengths_nm[0];
    let last = wavelengths_nm[n - 1];
    let coverage = Coverage {
        start_nm: first,
        end_nm: last,
    };
    let mut out = [0.0; GRID_LEN];
    if n == 1 {
        out.fill(values[0]);
        return Ok((out, coverage));
    }
    let interp: Box<dyn Fn(f64) -> f64> = if n >= 6 && is_uniform(wavelengths_nm) {
        let sprague = Sprague::new(first, (last - first) / (n - 1) as f64, values);
        Box::new(move |wl| sprague.at(wl))
    } else {
        let pchip = Pchip::new(wavelengths_nm, values);
        Box::new(move |wl| pchip.at(wl))
    };
    for (i, o) in out.iter_mut().enumerate() {
        let wl = grid_wavelength_nm(i);
        *o = if wl <= first {
            values[0]
        } else if wl >= last {
            values[n - 1]
        } else {
            interp(wl)
        };
    }
    Ok((out, coverage))
}

fn validate(wavelengths_nm: &[f64], values: &[f64]) -> Result<()> {
    if wavelengths_nm.len() != values.len() {
        return Err(ColorError::InvalidInput(format!(
            "{} wavelengths but {} values",
            wavelengths_nm.len(),
            values.len()
        )));
    }
    if wavelengths_nm.is_empty() {
        return Err(ColorError::InvalidInput("no spectral samples".into()));
    }
    if wavelengths_nm.len() > MAX_SAMPLES {
        return Err(ColorError::InvalidInput(format!(
            "{} spectral samples is more than the limit of {MAX_SAMPLES}",
            wavelengths_nm.len()
        )));
    }
    for (i, (wl, v)) in wavelengths_nm.iter().zip(values).enumerate() {
        if !wl.is_finite() {
            return Err(ColorError::InvalidInput(format!(
                "wavelength #{} is not a finite number",
                i + 1
            )));
        }
        if !v.is_finite() {
            return Err(ColorError::InvalidInput(format!(
                "value at {wl} nm is not a finite number"
            )));
        }
        if i > 0 && *wl <= wavelengths_nm[i - 1] {
            return Err(ColorError::InvalidInput(format!(
                "wavelengths must increase: {wl} nm follows {} nm",
                wavelengths_nm[i - 1]
            )));
        }
    }
    Ok(())
}

fn is_uniform(wavelengths_nm: &[f64]) -> bool {
    let n = wavelengths_nm.len();
    let step = (wavelengths_nm[n - 1] - wavelengths_nm[0]) / (n - 1) as f64;
    wavelengths_nm
        .windows(2)
        .all(|w| ((w[1] - w[0]) - step).abs() <= 1e-6 * step.max(1.0))
}

/// Sprague interpolator over uniformly spaced data, with the CIE 167 boundary
/// extension (two extra points at each end from fifth-degree extrapolation).
struct Sprague {
    start: f64,
    step: f64,
    /// Data padded with two extrapolated points at each end.
    padded: Vec<f64>,
}

impl Sprague {
    // Boundary coefficients, CIE 167:2005 Table 1 (÷209).
    const LEFT: [[f64; 6]; 2] = [
        [884.0, -1960.0, 3033.0, -2648.0, 1080.0, -180.0],
        [508.0, -540.0, 488.0, -367.0, 144.0, -24.0],
    ];
    const RIGHT: [[f64; 6]; 2] = [
        [-24.0, 144.0, -367.0, 488.0, -540.0, 508.0],
        [-180.0, 1080.0, -2648.0, 3033.0, -1960.0, 884.0],
    ];

    fn new(start: f64, step: f64, y: &[f64]) -> Self {
        let n = y.len();
        let dot =
            |c: &[f64; 6], s: &[f64]| c.iter().zip(s).map(|(a, b)| a * b).sum::<f64>() / 209.0;
        let mut padded = Vec::with_capacity(n + 4);
        padded.push(dot(&Self::LEFT[0], &y[..6]));
        padded.push(dot(&Self::LEFT[1], &y[..6]));
        padded.extend_from_slice(y);
        padded.push(dot(&Self::RIGHT[0], &y[n - 6..]));
        padded.push(dot(&Self::RIGHT[1], &y[n - 6..]));
        Sprague {
            start,
            step,
            padded,
        }
    }

    fn at(&self, wl: f64) -> f64 {
        let n = self.padded.len() - 4;
        let pos = (wl - self.start) / self.step;
        let i = (pos.floor() as usize).min(n - 2);
        let x = pos - i as f64;
        if x.abs() < 1e-12 {
            return self.padded[i + 2];
        }
        // p[k] = y[i + k - 2], k = 0..6
        let p = &self.padded[i..i + 6];
        let a0 = p[2];
        let a1 = (2.0 * p[0] - 16.0 * p[1] + 16.0 * p[3] - 2.0 * p[4]) / 24.0;
        let a2 = (-p[0] + 16.0 * p[1] - 30.0 * p[2] + 16.0 * p[3] - p[4]) / 24.0;
        let a3 = (-9.0 * p[0] + 39.0 * p[1] - 70.0 * p[2] + 66.0 * p[3] - 33.0 * p[4] + 7.0 * p[5])
            / 24.0;
        let a4 = (13.0 * p[0] - 64.0 * p[1] + 126.0 * p[2] - 124.0 * p[3] + 61.0 * p[4]
            - 12.0 * p[5])
            / 24.0;
        let a5 = (-5.0 * p[0] + 25.0 * p[1] - 50.0 * p[2] + 50.0 * p[3] - 25.0 * p[4] + 5.0 * p[5])
            / 24.0;
        a0 + x * (a1 + x * (a2 + x * (a3 + x * (a4 + x * a5))))
    }
}

/// Monotone piecewise-cubic Hermite interpolator (Fritsch–Carlson slopes).
struct Pchip {
    x: Vec<f64>,
    y: Vec<f64>,
    slopes: Vec<f64>,
}

impl Pchip {
    fn new(x: &[f64], y: &[f64]) -> Self {
        let n = x.len();
        let h: Vec<f64> = x.windows(2).map(|w| w[1] - w[0]).collect();
        let delta: Vec<f64> = (0..n - 1).map(|k| (y[k + 1] - y[k]) / h[k]).collect();
        let mut slopes = vec![0.0; n];
        if n == 2 {
            slopes[0] = delta[0];
            slopes[1] = delta[0];
        } else {
            for k in 1..n - 1 {
                if delta[k - 1] * delta[k] > 0.0 {
                    let w1 = 2.0 * h[k] + h[k - 1];
                    let w2 = h[k] + 2.0 * h[k - 1];
                    slopes[k] = (w1 + w2) / (w1 / delta[k - 1] + w2 / delta[k]);
                }
            }
            slopes[0] = Self::end_slope(h[0], h[1], delta[0], delta[1]);
            slopes[n - 1] = Self::end_slope(h[n - 2], h[n - 3], delta[n - 2], delta[n - 3]);
        }
        Pchip {
            x: x.to_vec(),
            y: y.to_vec(),
            slopes,
        }
    }

    /// Three-point end slope, shape-preserving (as in Moler, *Numerical Computing with MATLAB*, §3.4).
    fn end_slope(h0: f64, h1: f64, d0: f64, d1: f64) -> f64 {
        let d = ((2.0 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
        if d.signum() != d0.signum() {
            0.0
        } else if d0.signum() != d1.signum() && d.abs() > (3.0 * d0).abs() {
            3.0 * d0
        } else {
            d
        }
    }

    fn at(&self, wl: f64) -> f64 {
        let k = match self.x.binary_search_by(|v| v.total_cmp(&wl)) {
            Ok(k) => return self.y[k],
            Err(k) => k.saturating_sub(1).min(self.x.len() - 2),
        };
        let h = self.x[k + 1] - self.x[k];
        let t = (wl - self.x[k]) / h;
        let t2 = t * t;
        let t3 = t2 * t;
        let h00 = 2.0 * t3 - 3.0 * t2 + 1.0;
        let h10 = t3 - 2.0 * t2 + t;
        let h01 = -2.0 * t3 + 3.0 * t2;
        let h11 = t3 - t2;
        h00 * self.y[k]
            + h10 * h * self.slopes[k]
            + h01 * self.y[k + 1]
            + h11 * h * self.slopes[k + 1]
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn at(grid: &[f64; GRID_LEN], wl: f64) -> f64 {
        grid[(wl - 360.0) as usize]
    }

    #[test]
    fn sprague_reproduces_quintic_exactly() {
        // Sprague interpolation is exact for polynomials up to degree 5 inside the data
        // (a property of the method, Westland et al. 2012 §5.2).
        let f = |x: f64| {
            1.0 + 0.3 * (x / 100.0) - 0.02 * (x / 100.0).powi(3) + 0.001 * (x / 100.0).powi(5)
        };
        let wl: Vec<f64> = (0..=80).map(|i| 380.0 + 5.0 * f64::from(i)).collect();
        let v: Vec<f64> = wl.iter().map(|w| f(*w)).collect();
        let (grid, cov) = to_grid(&wl, &v).unwrap();
        assert_eq!(
            cov,
            Coverage {
                start_nm: 380.0,
                end_nm: 780.0
            }
        );
        // Near the ends the CIE 167 boundary extension is a smoothing fit, not exact.
        for w in 391..770 {
            let w = f64::from(w);
            assert!((at(&grid, w) - f(w)).abs() < 1e-9, "at {w}");
        }
        // CIE 15 rule: end values repeated outside the data.
        assert!((at(&grid, 360.0) - f(380.0)).abs() < 1e-12);
        assert!((at(&grid, 830.0) - f(780.0)).abs() < 1e-12);
    }

    #[test]
    fn pchip_passes_through_points_and_never_overshoots() {
        let wl = [380.0, 432.5, 435.8, 440.0, 546.1, 550.0, 611.7, 780.0];
        let v = [0.0, 0.0, 10.0, 0.0, 8.0, 0.0, 5.0, 0.0];
        let (grid, _) = to_grid(&wl, &v).unwrap();
        assert!(grid.iter().all(|x| (0.0..=10.0).contains(x)));
        assert!((at(&grid, 380.0)).abs() < 1e-12);
    }

    #[test]
    fn refuses_bad_input() {
        assert!(to_grid(&[], &[]).is_err());
        assert!(to_grid(&[400.0, 400.0], &[1.0, 1.0]).is_err());
        assert!(to_grid(&[500.0, 400.0], &[1.0, 1.0]).is_err());
        assert!(to_grid(&[400.0, 500.0], &[1.0, f64::NAN]).is_err());
        assert!(to_grid(&[400.0, 500.0], &[1.0]).is_err());
    }
}
