//! Root-polynomial colour correction, degree 2.
//!
//! Each camera signal is expanded into six terms of degree one,
//! `[r, g, b, √(rg), √(gb), √(rb)]`, and a 3×6 matrix is fitted by least
//! squares to map them to X, Y, Z. Every term scales linearly with exposure,
//! so unlike an ordinary polynomial the correction is exposure-invariant:
//! `f(k·rgb) = k·f(rgb)` for every `k ≥ 0`.
//!
//! Products are clamped at zero before the root: physical signals are never
//! negative, and a clamped term keeps the correction finite on odd input.
//!
//! # References
//! - Finlayson, G. D., Mackiewicz, M. & Hurlbert, A. (2015), *Color correction
//!   using root-polynomial regression*, IEEE Trans. Image Process. 24(5),
//!   1460–1470, doi:10.1109/TIP.2015.2405336.

use crate::error::Result;
use crate::fit_linear::{check_inputs, lstsq};
use nalgebra::DMatrix;

/// Number of degree-2 root-polynomial terms.
pub const ROOT_POLY2_TERMS: usize = 6;

/// The six degree-2 root-polynomial terms `[r, g, b, √(rg), √(gb), √(rb)]`.
#[must_use]
pub fn root_polynomial_terms(rgb: [f64; 3]) -> [f64; ROOT_POLY2_TERMS] {
    let [r, g, b] = rgb;
    [
        r,
        g,
        b,
        (r * g).max(0.0).sqrt(),
        (g * b).max(0.0).sqrt(),
        (r * b).max(0.0).sqrt(),
    ]
}

/// Least-squares 3×6 root-polynomial matrix (rows map the six terms to X, Y, Z).
///
/// Needs at least six samples whose terms span six dimensions.
pub fn fit_root_polynomial(
    rgb: &[[f64; 3]],
    xyz: &[[f64; 3]],
) -> Result<[[f64; ROOT_POLY2_TERMS]; 3]> {
    check_inputs(rgb, xyz, ROOT_POLY2_TERMS)?;
    let n = rgb.len();
    let terms: Vec<[f64; ROOT_POLY2_TERMS]> =
        rgb.iter().map(|c| root_polynomial_terms(*c)).collect();
    let a = DMatrix::from_fn(n, ROOT_POLY2_TERMS, |i, j| terms[i][j]);
    let b = DMatrix::from_fn(n, 3, |i, j| xyz[i][j]);
    let x = lstsq(a, &b)?;
    Ok(std::array::from_fn(|k| std::array::from_fn(|j| x[(j, k)])))
}

/// Apply a 3×6 root-polynomial matrix to a camera signal.
#[must_use]
pub fn apply_root_polynomial(m: &[[f64; ROOT_POLY2_TERMS]; 3], rgb: [f64; 3]) -> [f64; 3] {
    let t = root_polynomial_terms(rgb);
    m.map(|row| row.iter().zip(&t).map(|(a, b)| a * b).sum())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn terms_scale_with_exposure() {
        let t1 = root_polynomial_terms([0.2, 0.5, 0.8]);
        let t2 = root_polynomial_terms([0.4, 1.0, 1.6]);
        for k in 0..ROOT_POLY2_TERMS {
            assert!((t2[k] - 2.0 * t1[k]).abs() < 1e-15);
        }
        assert!((t1[3] - (0.1f64).sqrt()).abs() < 1e-15);
        // Negative products are clamped, never NaN.
        assert!(
            root_polynomial_terms([-1.0, 1.0, 1.0])
                .iter()
                .all(|v| v.is_finite())
        );
    }

    #[test]
    fn fits_data_that_is_exactly_root_polynomial() {
        let m = [
            [0.5, 0.2, 0.1, 0.05, -0.02, 0.03],
            [0.2, 0.7, 0.05, 0.0, 0.04, -0.01],
            [0.0, 0.1, 0.9, -0.03, 0.02, 0.0],
        ];
        let rgb: Vec<[f64; 3]> = (0..30)
            .map(|i| {
                let t = f64::from(i);
                [
                    0.05 + (t * 0.37).sin().abs(),
                    0.1 + (t * 0.91).cos().abs(),
                    0.02 + (t * 0.23).sin().abs(),
                ]
            })
            .collect();
        let xyz: Vec<[f64; 3]> = rgb.iter().map(|c| apply_root_polynomial(&m, *c)).collect();
        let fit = fit_root_polynomial(&rgb, &xyz).unwrap();
        for k in 0..3 {
            for j in 0..ROOT_POLY2_TERMS {
                assert!((fit[k][j] - m[k][j]).abs() < 1e-9, "{k} {j}");
            }
        }
        assert!(fit_root_polynomial(&rgb[..5], &xyz[..5]).is_err());
    }
}
