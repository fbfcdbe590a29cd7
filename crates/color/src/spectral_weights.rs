//! Tristimulus values of many reflecting samples under a light, for the
//! light-source quality metrics (CRI: 14 samples, TM-30: 99 samples).
//!
//! `XYZ_i = Σ_λ R_i(λ) · [S(λ)·x̄(λ)]` etc.: the three light-weighted
//! colour-matching functions are formed once per call (they are small and
//! stay in the fastest cache), then every sample's reflectance is read once
//! and dotted with the three vectors. Reading the 99 × 401
//! reflectances once is cheaper than streaming a precomputed 99 × 3 × 401
//! matrix of reflectance × CMF products, which does not fit in cache. The sums
//! equal the direct ones up to floating-point rounding.

use crate::observer::Observer;
use crate::spectrum::{GRID_LEN, Reflectance};
use crate::tristimulus::Xyz;
use crate::weighted_sums::weighted_sums_3;

/// Reflectances of a sample set over a window of the grid, with an observer.
pub(crate) struct SampleSet {
    /// First grid index of the window.
    start: usize,
    /// Window length (number of 1 nm samples).
    len: usize,
    /// Row-major reflectances, `samples × len`.
    reflectance: Vec<f64>,
    /// x̄, ȳ, z̄ over the window.
    cmf: [Vec<f64>; 3],
}

/// Unnormalised tristimulus sums of every sample and of the light itself.
#[derive(Debug, Clone)]
pub(crate) struct SampleXyz {
    /// One entry per sample.
    pub(crate) samples: Vec<Xyz>,
    /// The light (perfect white).
    pub(crate) white: Xyz,
}

impl SampleXyz {
    /// White, then each sample, as X, Y, Z in a row, each divided by `divisor`.
    pub(crate) fn write_flat(&self, divisor: f64, out: &mut [f64]) {
        let all = std::iter::once(&self.white).chain(&self.samples);
        for (o, x) in out.chunks_exact_mut(3).zip(all) {
            o.copy_from_slice(&[x.x / divisor, x.y / divisor, x.z / divisor]);
        }
    }

    /// The inverse of [`SampleXyz::write_flat`] (divisor 1).
    pub(crate) fn from_flat(v: &[f64]) -> SampleXyz {
        let mut it = v.chunks_exact(3).map(|c| Xyz::new(c[0], c[1], c[2]));
        let white = it.next().unwrap_or(Xyz::new(0.0, 0.0, 0.0));
        SampleXyz {
            white,
            samples: it.collect(),
        }
    }

    /// `Σ wᵢ · partᵢ`, white and sample by sample (all parts of one sample set).
    pub(crate) fn combine(parts: &[(f64, &SampleXyz)]) -> SampleXyz {
        let n = parts.first().map_or(0, |(_, p)| p.samples.len());
        let mut out = SampleXyz {
            white: Xyz::new(0.0, 0.0, 0.0),
            samples: vec![Xyz::new(0.0, 0.0, 0.0); n],
        };
        let add = |acc: &mut Xyz, w: f64, x: &Xyz| {
            acc.x += w * x.x;
            acc.y += w * x.y;
            acc.z += w * x.z;
        };
        for (w, p) in parts {
            add(&mut out.white, *w, &p.white);
            for (acc, x) in out.samples.iter_mut().zip(&p.samples) {
                add(acc, *w, x);
            }
        }
        out
    }
}

impl SampleSet {
    /// The samples over grid indices `start..start + len` with `observer`.
    pub(crate) fn new(
        samples: &[Reflectance],
        observer: &Observer,
        start: usize,
        len: usize,
    ) -> SampleSet {
        let len = len.min(GRID_LEN.saturating_sub(start));
        let w = start..start + len;
        let reflectance = samples
            .iter()
            .flat_map(|s| s.values()[w.clone()].iter().copied())
            .collect();
        let cmf =
            [&observer.x_bar, &observer.y_bar, &observer.z_bar].map(|c| c[w.clone()].to_vec());
        SampleSet {
            start,
            len,
            reflectance,
            cmf,
        }
    }

    /// Number of samples.
    #[cfg(test)]
    pub(crate) fn sample_count(&self) -> usize {
        self.reflectance.len() / self.len.max(1)
    }

    /// Tristimulus sums of every sample under `light`.
    pub(crate) fn xyz_one(&self, light: &[f64; GRID_LEN]) -> SampleXyz {
        // The three products of the light with x̄, ȳ, z̄ over the window, on
        // the stack (they are re-read once per sample).
        let s = &light[self.start..self.start + self.len];
        let mut w = [[0.0; GRID_LEN]; 3];
        for (wk, c) in w.iter_mut().zip(&self.cmf) {
            for ((o, s), c) in wk.iter_mut().zip(s).zip(c) {
                *o = s * c;
            }
        }
        let w = w.each_ref().map(|c| &c[..self.len]);
        let white = w.map(sum);
        let rows: Vec<&[f64]> = self.reflectance.chunks_exact(self.len.max(1)).collect();
        let sums = weighted_sums_3(&rows, w);
        SampleXyz {
            samples: sums
                .into_iter()
                .map(|[x, y, z]| Xyz::new(x, y, z))
                .collect(),
            white: Xyz::new(white[0], white[1], white[2]),
        }
    }
}

/// Sum with four independent accumulators (vectorisable; a plain
/// left-to-right sum waits on every addition in turn).
pub(crate) fn sum(a: &[f64]) -> f64 {
    let mut acc = [0.0f64; 4];
    let mut chunks = a.chunks_exact(4);
    for x in &mut chunks {
        acc[0] += x[0];
        acc[1] += x[1];
        acc[2] += x[2];
        acc[3] += x[3];
    }
    (acc[0] + acc[1]) + (acc[2] + acc[3]) + chunks.remainder().iter().sum::<f64>()
}

/// Dot product with four independent accumulators (vectorisable).
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
    fn pair_matches_direct_sums() {
        let obs = Observer::cie1931_2deg();
        // Four samples: one pass of three and one left over.
        let r = [
            Reflectance::from_fn(|wl| 0.2 + 0.6 * ((wl - 360.0) / 470.0)),
            Reflectance::from_fn(|wl| 0.5 + 0.4 * (wl / 50.0).cos()),
            Reflectance::from_fn(|wl| 0.1 + 0.8 * (-((wl - 600.0) / 30.0).powi(2)).exp()),
            Reflectance::from_fn(|wl| 0.9 - 0.7 * ((wl - 360.0) / 470.0).powi(2)),
        ];
        let a = RelativeSpd::from_fn(|wl| 1.0 + (wl / 100.0).sin());
        let b = RelativeSpd::from_fn(|wl| wl / 500.0);
        let set = SampleSet::new(&r, obs, 0, GRID_LEN);
        assert_eq!(set.sample_count(), 4);
        let (xa, xb) = (set.xyz_one(a.values()), set.xyz_one(b.values()));
        for (light, got) in [(&a, &xa), (&b, &xb)] {
            for (refl, g) in r.iter().zip(&got.samples) {
                let want = xyz_sums((light * refl).values(), obs);
                for (u, w) in [(g.x, want.x), (g.y, want.y), (g.z, want.z)] {
                    assert!((u - w).abs() < 1e-9 * w.abs().max(1.0), "{u} {w}");
                }
            }
            let w = xyz_sums(light.values(), obs);
            assert!((got.white.y - w.y).abs() < 1e-9 * w.y);
        }
        assert!((dot(&[1.0, 2.0, 3.0, 4.0, 5.0], &[1.0; 5]) - 15.0).abs() < 1e-12);
        assert!((sum(&[1.0, 2.0, 3.0, 4.0, 5.0, 6.0]) - 21.0).abs() < 1e-12);
        // A window whose length is no multiple of any vector width.
        let win = SampleSet::new(&r, obs, 20, 401);
        let got = win.xyz_one(a.values());
        for (refl, g) in r.iter().zip(&got.samples) {
            let want: f64 = (20..421)
                .map(|i| a.values()[i] * refl.values()[i] * obs.z_bar[i])
                .sum();
            assert!(
                (g.z - want).abs() < 1e-9 * want.abs().max(1.0),
                "{} {want}",
                g.z
            );
        }
        // Linear combinations and the flat layout.
        let c = SampleXyz::combine(&[(2.0, &xa), (-0.5, &xb)]);
        assert!((c.samples[1].x - (2.0 * xa.samples[1].x - 0.5 * xb.samples[1].x)).abs() < 1e-9);
        let mut flat = vec![0.0; 12];
        xa.write_flat(2.0, &mut flat);
        let back = SampleXyz::from_flat(&flat);
        assert!((back.white.y - xa.white.y / 2.0).abs() < 1e-12);
        assert!((back.samples[2].z - xa.samples[2].z / 2.0).abs() < 1e-12);
    }
}
