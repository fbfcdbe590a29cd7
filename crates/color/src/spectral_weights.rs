//! Precomputed spectral weight rows for the light-source quality metrics.
//!
//! CRI and TM-30 evaluate many samples under one light. Instead of forming the
//! stimulus `S(λ)·R(λ)` and then summing with each colour-matching function,
//! the products `R(λ)·x̄(λ)` etc. are computed once, so the tristimulus values
//! of every sample under a light are one matrix–vector product:
//! `XYZ_i = Σ_λ S(λ) · W_i(λ)`. The sums are identical to the direct ones up
//! to floating-point rounding.

use crate::observer::Observer;
use crate::spectrum::{GRID_LEN, Reflectance};

/// Rows of weights over a window of the grid.
pub(crate) struct WeightRows {
    /// First grid index of the window.
    start: usize,
    /// Window length (number of 1 nm samples).
    len: usize,
    /// Row-major weights, `rows × len`.
    weights: Vec<f64>,
}

impl WeightRows {
    /// For each sample, three rows `R·x̄`, `R·ȳ`, `R·z̄` (in that order), and at
    /// the end three rows `x̄`, `ȳ`, `z̄` (the light itself, perfect white),
    /// over the grid indices `start..start + len`.
    pub(crate) fn for_samples(
        samples: &[Reflectance],
        observer: &Observer,
        start: usize,
        len: usize,
    ) -> WeightRows {
        let len = len.min(GRID_LEN.saturating_sub(start));
        let mut weights = Vec::with_capacity((samples.len() + 1) * 3 * len);
        let cmfs = [&observer.x_bar, &observer.y_bar, &observer.z_bar];
        for s in samples {
            for cmf in cmfs {
                weights.extend((start..start + len).map(|i| s.values()[i] * cmf[i]));
            }
        }
        for cmf in cmfs {
            weights.extend((start..start + len).map(|i| cmf[i]));
        }
        WeightRows {
            start,
            len,
            weights,
        }
    }

    /// Number of samples (not counting the white rows).
    pub(crate) fn sample_count(&self) -> usize {
        (self.weights.len() / (3 * self.len.max(1))).saturating_sub(1)
    }

    /// Tristimulus sums of every sample and, last, of the light itself.
    /// `out` gets `3 × (sample_count + 1)` values: X, Y, Z per sample.
    pub(crate) fn apply(&self, spd: &[f64; GRID_LEN], out: &mut Vec<f64>) {
        out.clear();
        let window = &spd[self.start..self.start + self.len];
        out.extend(
            self.weights
                .chunks_exact(self.len)
                .map(|row| dot(row, window)),
        );
    }
}

/// Dot product with four independent accumulators, so the compiler can keep
/// them in one SIMD register (a strict left-to-right sum cannot be vectorised).
pub(crate) fn dot(a: &[f64], b: &[f64]) -> f64 {
    let n = a.len().min(b.len());
    let (a, b) = (&a[..n], &b[..n]);
    let mut acc = [0.0f64; 4];
    let mut ca = a.chunks_exact(4);
    let mut cb = b.chunks_exact(4);
    for (x, y) in (&mut ca).zip(&mut cb) {
        acc[0] += x[0] * y[0];
        acc[1] += x[1] * y[1];
        acc[2] += x[2] * y[2];
        acc[3] += x[3] * y[3];
    }
    let tail: f64 = ca
        .remainder()
        .iter()
        .zip(cb.remainder())
        .map(|(x, y)| x * y)
        .sum();
    (acc[0] + acc[1]) + (acc[2] + acc[3]) + tail
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::spectrum::RelativeSpd;
    use crate::tristimulus::xyz_sums;

    #[test]
    fn rows_match_direct_sums() {
        let obs = Observer::cie1931_2deg();
        let r = Reflectance::from_fn(|wl| 0.2 + 0.6 * ((wl - 360.0) / 470.0));
        let spd = RelativeSpd::from_fn(|wl| 1.0 + (wl / 100.0).sin());
        let w = WeightRows::for_samples(std::slice::from_ref(&r), obs, 0, GRID_LEN);
        assert_eq!(w.sample_count(), 1);
        let mut out = Vec::new();
        w.apply(spd.values(), &mut out);
        let direct = xyz_sums((&spd * &r).values(), obs);
        let white = xyz_sums(spd.values(), obs);
        for (got, want) in out
            .iter()
            .zip([direct.x, direct.y, direct.z, white.x, white.y, white.z])
        {
            assert!(
                (got - want).abs() < 1e-9 * want.abs().max(1.0),
                "{got} {want}"
            );
        }
        assert!((dot(&[1.0, 2.0, 3.0, 4.0, 5.0], &[1.0; 5]) - 15.0).abs() < 1e-12);
    }
}
