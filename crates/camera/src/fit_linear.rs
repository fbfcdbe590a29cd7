//! Least-squares colour-correction matrices: plain and white-preserving.
//!
//! Given camera signals `rgbᵢ` and target tristimulus values `xyzᵢ`, find the
//! 3×3 matrix `M` (rows map RGB to X, Y, Z) minimising `Σᵢ ‖M·rgbᵢ − xyzᵢ‖²`.
//!
//! - **Plain** least squares is solved by singular value decomposition of the
//!   n×3 design matrix (as `numpy.linalg.lstsq` does).
//! - **White-preserving** least squares adds the three linear constraints
//!   `M·rgb_w = xyz_w` (the neutral maps exactly to the output white) and is
//!   solved through the Karush–Kuhn–Tucker system of the Lagrangian: for each
//!   row `m` of `M`, `[AᵀA w; wᵀ 0]·[m; λ] = [Aᵀb; x_w]`.
//!
//! # References
//! - Finlayson, G. D. & Drew, M. S. (1997), *Constrained least-squares
//!   regression in color spaces*, J. Electron. Imaging 6(4), 484–493,
//!   doi:10.1117/12.278080 (white-point preserving regression).
//! - Golub, G. H. & Van Loan, C. F. (2013), *Matrix Computations*, 4th ed.,
//!   §6.2 (least squares with linear equality constraints).

use crate::error::{CameraError, Result};
use nalgebra::{DMatrix, Matrix3, Matrix4, Matrix4x3, Vector3};

/// Smallest ratio of singular values (or eigenvalues of `AᵀA`) accepted before
/// a training set is called degenerate.
const CONDITION_LIMIT: f64 = 1e-12;

/// Whether `x` is a finite number greater than zero (false for NaN).
pub(crate) fn is_positive(x: f64) -> bool {
    x.is_finite() && x > 0.0
}

pub(crate) fn check_inputs(rgb: &[[f64; 3]], xyz: &[[f64; 3]], terms: usize) -> Result<()> {
    if rgb.len() != xyz.len() {
        return Err(CameraError::InvalidInput(format!(
            "{} camera signals but {} targets",
            rgb.len(),
            xyz.len()
        )));
    }
    if rgb.len() < terms {
        return Err(CameraError::InvalidInput(format!(
            "fitting {terms} terms needs at least {terms} samples, got {}",
            rgb.len()
        )));
    }
    if rgb.iter().chain(xyz).flatten().any(|v| !v.is_finite()) {
        return Err(CameraError::InvalidInput(
            "a camera signal or target is not finite".into(),
        ));
    }
    Ok(())
}

/// Solve `A·X ≈ B` in the least-squares sense by SVD; refuses rank-deficient `A`.
pub(crate) fn lstsq(a: DMatrix<f64>, b: &DMatrix<f64>) -> Result<DMatrix<f64>> {
    let svd = a.svd(true, true);
    let s = &svd.singular_values;
    let s_max = s.max();
    let s_min = s.min();
    if !is_positive(s_max) || s_min < CONDITION_LIMIT * s_max {
        return Err(CameraError::Numerical(
            "the training signals do not span every fitted term (singular system)".into(),
        ));
    }
    svd.solve(b, 0.0)
        .map_err(|e| CameraError::Numerical(e.to_string()))
}

/// Plain least-squares matrix `M` (rows map camera RGB to X, Y, Z).
///
/// Input: at least three samples whose signals span three dimensions.
pub fn fit_linear_ls(rgb: &[[f64; 3]], xyz: &[[f64; 3]]) -> Result<[[f64; 3]; 3]> {
    check_inputs(rgb, xyz, 3)?;
    let n = rgb.len();
    let a = DMatrix::from_fn(n, 3, |i, j| rgb[i][j]);
    let b = DMatrix::from_fn(n, 3, |i, j| xyz[i][j]);
    let x = lstsq(a, &b)?;
    // x is 3×3 with columns per output; M = xᵀ.
    Ok(std::array::from_fn(|k| std::array::from_fn(|j| x[(j, k)])))
}

/// White-preserving least-squares matrix: minimises `Σ‖M·rgbᵢ − xyzᵢ‖²`
/// subject to `M·white_rgb = white_xyz` exactly.
pub fn fit_white_preserving(
    rgb: &[[f64; 3]],
    xyz: &[[f64; 3]],
    white_rgb: [f64; 3],
    white_xyz: [f64; 3],
) -> Result<[[f64; 3]; 3]> {
    check_inputs(rgb, xyz, 3)?;
    if white_rgb.iter().chain(&white_xyz).any(|v| !v.is_finite())
        || white_rgb.iter().all(|v| *v == 0.0)
    {
        return Err(CameraError::InvalidInput(
            "the white's camera signal must be finite and not zero".into(),
        ));
    }
    let mut ata = Matrix3::<f64>::zeros();
    let mut atb = Matrix3::<f64>::zeros();
    for (r, x) in rgb.iter().zip(xyz) {
        let rv = Vector3::from(*r);
        ata += rv * rv.transpose();
        atb += rv * Vector3::from(*x).transpose();
    }
    let eig = ata.symmetric_eigenvalues();
    if !is_positive(eig.max()) || eig.min() < CONDITION_LIMIT * eig.max() {
        return Err(CameraError::Numerical(
            "the training signals do not span three dimensions (singular system)".into(),
        ));
    }
    let w = Vector3::from(white_rgb);
    let mut kkt = Matrix4::<f64>::zeros();
    kkt.fixed_view_mut::<3, 3>(0, 0).copy_from(&ata);
    kkt.fixed_view_mut::<3, 1>(0, 3).copy_from(&w);
    kkt.fixed_view_mut::<1, 3>(3, 0).copy_from(&w.transpose());
    let mut rhs = Matrix4x3::<f64>::zeros();
    rhs.fixed_view_mut::<3, 3>(0, 0).copy_from(&atb);
    rhs.fixed_view_mut::<1, 3>(3, 0)
        .copy_from(&Vector3::from(white_xyz).transpose());
    let sol = kkt
        .lu()
        .solve(&rhs)
        .ok_or_else(|| CameraError::Numerical("white-preserving system is singular".into()))?;
    let m: [[f64; 3]; 3] = std::array::from_fn(|k| std::array::from_fn(|j| sol[(j, k)]));
    if m.iter().flatten().any(|v| !v.is_finite()) {
        return Err(CameraError::Numerical(
            "white-preserving solve gave non-finite values".into(),
        ));
    }
    Ok(m)
}

/// `M·v` for a 3×3 matrix given as rows.
#[must_use]
pub fn mat3_mul_vec(m: &[[f64; 3]; 3], v: [f64; 3]) -> [f64; 3] {
    m.map(|row| row[0] * v[0] + row[1] * v[1] + row[2] * v[2])
}

#[cfg(test)]
mod tests {
    use super::*;

    fn samples() -> (Vec<[f64; 3]>, [[f64; 3]; 3]) {
        let m = [[0.6, 0.3, 0.1], [0.25, 0.7, 0.05], [0.02, 0.1, 0.9]];
        let rgb: Vec<[f64; 3]> = (0..20)
            .map(|i| {
                let t = f64::from(i);
                [
                    0.1 + (t * 0.37).sin().abs(),
                    0.2 + (t * 0.71).cos().abs(),
                    0.05 + (t * 0.13).sin().abs(),
                ]
            })
            .collect();
        (rgb, m)
    }

    #[test]
    fn exact_data_recovers_matrix() {
        let (rgb, m) = samples();
        let xyz: Vec<[f64; 3]> = rgb.iter().map(|r| mat3_mul_vec(&m, *r)).collect();
        let fit = fit_linear_ls(&rgb, &xyz).unwrap();
        let wp = fit_white_preserving(
            &rgb,
            &xyz,
            [1.0, 1.0, 1.0],
            mat3_mul_vec(&m, [1.0, 1.0, 1.0]),
        )
        .unwrap();
        for k in 0..3 {
            for j in 0..3 {
                assert!((fit[k][j] - m[k][j]).abs() < 1e-12);
                assert!((wp[k][j] - m[k][j]).abs() < 1e-12);
            }
        }
    }

    #[test]
    fn white_preserving_meets_constraint_and_costs_more() {
        let (rgb, m) = samples();
        // Perturb the targets so the plain fit does not preserve white.
        let xyz: Vec<[f64; 3]> = rgb
            .iter()
            .enumerate()
            .map(|(i, r)| {
                let x = mat3_mul_vec(&m, *r);
                [
                    x[0] + 0.01 * (i as f64).sin(),
                    x[1],
                    x[2] - 0.02 * (i as f64).cos(),
                ]
            })
            .collect();
        let white_xyz = [0.95047, 1.0, 1.08883];
        let wp = fit_white_preserving(&rgb, &xyz, [1.0, 1.0, 1.0], white_xyz).unwrap();
        let got = mat3_mul_vec(&wp, [1.0, 1.0, 1.0]);
        for k in 0..3 {
            assert!((got[k] - white_xyz[k]).abs() < 1e-12);
        }
        let cost = |m: &[[f64; 3]; 3]| -> f64 {
            rgb.iter()
                .zip(&xyz)
                .map(|(r, x)| {
                    let p = mat3_mul_vec(m, *r);
                    (0..3).map(|k| (p[k] - x[k]).powi(2)).sum::<f64>()
                })
                .sum()
        };
        let ls = fit_linear_ls(&rgb, &xyz).unwrap();
        assert!(cost(&wp) >= cost(&ls));
    }

    #[test]
    fn degenerate_sets_are_errors() {
        let rgb = vec![[1.0, 1.0, 1.0]; 10];
        let xyz = vec![[1.0, 1.0, 1.0]; 10];
        assert!(fit_linear_ls(&rgb, &xyz).is_err());
        assert!(fit_white_preserving(&rgb, &xyz, [1.0; 3], [1.0; 3]).is_err());
        assert!(fit_linear_ls(&rgb[..2], &xyz[..2]).is_err());
        assert!(fit_linear_ls(&rgb, &xyz[..3]).is_err());
        let mut bad = rgb.clone();
        bad[0][0] = f64::NAN;
        assert!(fit_linear_ls(&bad, &xyz).is_err());
    }
}
