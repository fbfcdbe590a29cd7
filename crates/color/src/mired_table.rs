//! Vectors that depend smoothly on colour temperature, tabulated once at
//! equal steps of mired (10⁶/T) and read back by four-point cubic
//! (Lagrange) interpolation.
//!
//! The rendering metrics use it for everything their Planckian reference
//! contributes (sample colours under the reference, reference white, SSI
//! bins): those depend on T only through Planck's law, are smooth in mired,
//! and cost a reference spectrum and hundreds of thousands of multiply–adds to
//! compute directly. The tables are built on first use from the direct
//! computation itself, and each metric's tests compare table and direct
//! values between the nodes.
//!
//! Interpolation error of four-point Lagrange on step h is bounded by
//! `h⁴·max|f⁗|/24` (e.g. Press et al., *Numerical Recipes*, 3rd ed., §3.2);
//! the metric modules choose h so that it stays orders of magnitude below the
//! precision their figures are published to.

use crate::error::{ColorError, Result};

/// A vector-valued function of colour temperature on a uniform mired grid.
#[derive(Debug, Clone)]
pub(crate) struct MiredTable {
    /// Mired of node 0 (the hottest end).
    mired_lo: f64,
    /// Mired step between nodes.
    step: f64,
    /// Number of nodes (≥ 4).
    nodes: usize,
    /// Values per node.
    width: usize,
    /// `nodes × width`, node-major.
    values: Vec<f64>,
}

impl MiredTable {
    /// Tabulate `f` on `nodes` equally spaced mired values covering the CCT
    /// range `t_lo_k..=t_hi_k` (both ends are nodes). `f(t, out)` fills the
    /// `width` values at temperature `t`.
    pub(crate) fn build(
        (t_lo_k, t_hi_k): (f64, f64),
        nodes: usize,
        width: usize,
        mut f: impl FnMut(f64, &mut [f64]) -> Result<()>,
    ) -> Result<MiredTable> {
        if !(t_lo_k > 0.0 && t_hi_k > t_lo_k && nodes >= 4 && width > 0) {
            return Err(ColorError::Numerical(format!(
                "mired table over {t_lo_k}–{t_hi_k} K with {nodes} nodes is not buildable"
            )));
        }
        let mired_lo = 1e6 / t_hi_k;
        let mired_hi = 1e6 / t_lo_k;
        let step = (mired_hi - mired_lo) / (nodes - 1) as f64;
        let mut values = vec![0.0; nodes * width];
        for (i, row) in values.chunks_exact_mut(width).enumerate() {
            // The end nodes are the given temperatures exactly.
            let t = match i {
                0 => t_hi_k,
                i if i == nodes - 1 => t_lo_k,
                i => 1e6 / (mired_lo + step * i as f64),
            };
            f(t, row)?;
            if let Some(bad) = row.iter().position(|v| !v.is_finite()) {
                return Err(ColorError::Numerical(format!(
                    "mired table value {bad} at {t} K is not finite"
                )));
            }
        }
        Ok(MiredTable {
            mired_lo,
            step,
            nodes,
            width,
            values,
        })
    }

    /// Number of values per node.
    pub(crate) fn width(&self) -> usize {
        self.width
    }

    /// The interpolated values at `t_k`, written to `out` (length `width`);
    /// false, with `out` untouched, when `t_k` lies outside the table.
    pub(crate) fn eval(&self, t_k: f64, out: &mut [f64]) -> bool {
        if out.len() != self.width || !(t_k.is_finite() && t_k > 0.0) {
            return false;
        }
        let s = (1e6 / t_k - self.mired_lo) / self.step;
        let last = (self.nodes - 1) as f64;
        // Tolerate rounding at the ends, nothing more.
        if !(-1e-9..=last + 1e-9).contains(&s) {
            return false;
        }
        // Stencil i−1 … i+2, kept inside the table (one-sided at the ends).
        let i = (s.floor() as usize).clamp(1, self.nodes - 3);
        let x = s - i as f64;
        let w = [
            -x * (x - 1.0) * (x - 2.0) / 6.0,
            (x + 1.0) * (x - 1.0) * (x - 2.0) / 2.0,
            -(x + 1.0) * x * (x - 2.0) / 2.0,
            (x + 1.0) * x * (x - 1.0) / 6.0,
        ];
        let rows = &self.values[(i - 1) * self.width..(i + 3) * self.width];
        let (r0, rest) = rows.split_at(self.width);
        let (r1, rest) = rest.split_at(self.width);
        let (r2, r3) = rest.split_at(self.width);
        for ((((o, a), b), c), d) in out.iter_mut().zip(r0).zip(r1).zip(r2).zip(r3) {
            *o = w[0] * a + w[1] * b + w[2] * c + w[3] * d;
        }
        true
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cubics_in_mired_are_reproduced_exactly() {
        // Four-point Lagrange interpolation is exact for polynomials of degree ≤ 3.
        let f = |t: f64| {
            let m = 1e6 / t;
            [1.0 + 0.5 * m - 1e-3 * m * m + 2e-6 * m * m * m, m]
        };
        let table = MiredTable::build((1000.0, 5000.0), 9, 2, |t, out| {
            out.copy_from_slice(&f(t));
            Ok(())
        })
        .unwrap();
        let mut out = [0.0; 2];
        for t in [1000.0, 1003.7, 1500.0, 2222.2, 3999.0, 4999.9, 5000.0] {
            assert!(table.eval(t, &mut out), "{t}");
            let want = f(t);
            for (o, w) in out.iter().zip(want) {
                assert!((o - w).abs() < 1e-9 * w.abs().max(1.0), "{t}: {o} vs {w}");
            }
        }
    }

    #[test]
    fn outside_the_table_nothing_is_written() {
        let table = MiredTable::build((2000.0, 4000.0), 5, 1, |t, out| {
            out[0] = t;
            Ok(())
        })
        .unwrap();
        let mut out = [-1.0];
        for t in [1999.0, 4001.0, f64::NAN, 0.0, -3000.0, f64::INFINITY] {
            assert!(!table.eval(t, &mut out), "{t}");
            assert!((out[0] + 1.0).abs() < 1e-12);
        }
        assert!(!table.eval(3000.0, &mut [0.0; 2]));
        assert!(MiredTable::build((4000.0, 2000.0), 5, 1, |_, _| Ok(())).is_err());
        assert!(
            MiredTable::build((2000.0, 4000.0), 5, 1, |_, o| {
                o[0] = f64::NAN;
                Ok(())
            })
            .is_err()
        );
    }
}
