//! CIEDE2000-minimising colour-correction matrix.
//!
//! Least squares in XYZ weighs errors as the eye does not: a small XYZ error
//! in a dark blue is a large visible difference, the same error in a bright
//! yellow is not. This refinement minimises `Σᵢ ΔE00ᵢ²` (CIELAB against the
//! fitting white) over the matrix entries, starting from the least-squares
//! solution, with the Levenberg–Marquardt method (Marquardt's scaling by the
//! diagonal of `JᵀJ`; Jacobian by central differences).
//!
//! With `preserve_white` the search starts from the white-preserving fit and
//! moves only in the six-dimensional set of matrices that still map the neutral
//! to the white: each row `m` is `m₀ + c₁u₁ + c₂u₂` with `u₁, u₂` orthonormal
//! and orthogonal to the neutral's signal. Without it, all nine entries move
//! from the plain least-squares start. Lampwright's pipelines use the
//! white-preserving form, so grey stays grey after correction.
//!
//! Every accepted step lowers the cost, so the result is never worse (in
//! Σ ΔE00²) than its starting matrix. CIEDE2000 saturates for colours far off
//! target (its weights `S_L`, `S_C`, `S_H` grow with L* and C*), so a free search
//! could push badly fitted samples towards infinity to gain on the others; the
//! search is therefore kept within a Frobenius distance of ‖M₀‖ of the start
//! M₀ (steps leaving that region are rejected like steps that raise the cost).
//!
//! # References
//! - Marquardt, D. W. (1963), *An algorithm for least-squares estimation of
//!   nonlinear parameters*, J. SIAM 11(2), 431–441, doi:10.1137/0111030.
//! - Sharma, G., Wu, W. & Dalal, E. N. (2005), *The CIEDE2000 color-difference
//!   formula*, Color Res. Appl. 30(1), 21–30, doi:10.1002/col.20070.
//! - Finlayson, G. D. & Drew, M. S. (1997), doi:10.1117/12.278080 (white-point preserving regression).

use crate::correction::FitData;
use crate::error::{CameraError, Result};
use crate::fit_linear::{fit_linear_ls, fit_white_preserving, is_positive, mat3_mul_vec};
use lampwright_color::Xyz;
use lampwright_color::delta_e::delta_e_ciede2000;
use lampwright_color::spaces::Lab;
use nalgebra::{DMatrix, DVector, Vector3};

/// Most Levenberg–Marquardt iterations.
const MAX_ITERATIONS: usize = 100;
/// Stop when an accepted step lowers the cost by less than this fraction.
const RELATIVE_TOLERANCE: f64 = 1e-10;

/// The matrix as a function of the free parameters.
struct Parametrisation {
    start: [[f64; 3]; 3],
    /// Per row, the directions each parameter moves that row in.
    directions: Vec<(usize, [f64; 3])>,
}

impl Parametrisation {
    fn full(start: [[f64; 3]; 3]) -> Self {
        let mut directions = Vec::with_capacity(9);
        for row in 0..3 {
            for col in 0..3 {
                let mut e = [0.0; 3];
                e[col] = 1.0;
                directions.push((row, e));
            }
        }
        Parametrisation { start, directions }
    }

    fn white_preserving(start: [[f64; 3]; 3], white_rgb: [f64; 3]) -> Result<Self> {
        let w = Vector3::from(white_rgb);
        let norm = w.norm();
        if !is_positive(norm) {
            return Err(CameraError::InvalidInput(
                "the white's camera signal must be finite and not zero".into(),
            ));
        }
        let w = w / norm;
        // Start from the axis least aligned with the white for a well-conditioned basis.
        let axis = (0..3)
            .min_by(|a, b| w[*a].abs().total_cmp(&w[*b].abs()))
            .unwrap_or(0);
        let mut e = Vector3::zeros();
        e[axis] = 1.0;
        let u1 = (e - w * w.dot(&e)).normalize();
        let u2 = w.cross(&u1);
        let mut directions = Vec::with_capacity(6);
        for row in 0..3 {
            directions.push((row, [u1[0], u1[1], u1[2]]));
            directions.push((row, [u2[0], u2[1], u2[2]]));
        }
        Ok(Parametrisation { start, directions })
    }

    fn matrix(&self, p: &[f64]) -> [[f64; 3]; 3] {
        let mut m = self.start;
        for ((row, d), c) in self.directions.iter().zip(p) {
            for k in 0..3 {
                m[*row][k] += c * d[k];
            }
        }
        m
    }
}

struct Problem<'a> {
    rgb: &'a [[f64; 3]],
    target_lab: Vec<Lab>,
    white: Xyz,
}

impl Problem<'_> {
    fn residuals(&self, m: &[[f64; 3]; 3], out: &mut [f64]) {
        for ((o, rgb), want) in out.iter_mut().zip(self.rgb).zip(&self.target_lab) {
            let got = Lab::from_xyz(Xyz::from_array(mat3_mul_vec(m, *rgb)), self.white);
            *o = delta_e_ciede2000(*want, got);
        }
    }
}

fn cost(r: &[f64]) -> f64 {
    r.iter().map(|v| v * v).sum()
}

/// Minimise Σ rᵢ² over the parameters of `para` from zero; returns the parameters.
fn levenberg_marquardt(problem: &Problem, para: &Parametrisation) -> Vec<f64> {
    let n = problem.rgb.len();
    let np = para.directions.len();
    let mut p = vec![0.0; np];
    let mut r = vec![0.0; n];
    problem.residuals(&para.matrix(&p), &mut r);
    let mut current = cost(&r);
    let mut lambda = 1e-3;
    let (mut r_plus, mut r_minus) = (vec![0.0; n], vec![0.0; n]);
    let mut jac = DMatrix::<f64>::zeros(n, np);
    let start_norm = para
        .start
        .iter()
        .flatten()
        .map(|v| v * v)
        .sum::<f64>()
        .sqrt();
    let within_region = |q: &[f64]| {
        let m = para.matrix(q);
        let d2: f64 = m
            .iter()
            .flatten()
            .zip(para.start.iter().flatten())
            .map(|(a, b)| (a - b) * (a - b))
            .sum();
        d2.sqrt() <= start_norm
    };
    for _ in 0..MAX_ITERATIONS {
        if current == 0.0 {
            break;
        }
        for j in 0..np {
            let h = 1e-7 * (1.0 + p[j].abs());
            let mut q = p.clone();
            q[j] = p[j] + h;
            problem.residuals(&para.matrix(&q), &mut r_plus);
            q[j] = p[j] - h;
            problem.residuals(&para.matrix(&q), &mut r_minus);
            for i in 0..n {
                jac[(i, j)] = (r_plus[i] - r_minus[i]) / (2.0 * h);
            }
        }
        let jt = jac.transpose();
        let jtj = &jt * &jac;
        let g = &jt * DVector::from_column_slice(&r);
        let mut improved = false;
        while lambda < 1e12 {
            let mut a = jtj.clone();
            for j in 0..np {
                a[(j, j)] += lambda * jtj[(j, j)].max(1e-12);
            }
            let Some(step) = a.lu().solve(&(-&g)) else {
                lambda *= 10.0;
                continue;
            };
            let trial: Vec<f64> = p.iter().zip(step.iter()).map(|(a, b)| a + b).collect();
            if !within_region(&trial) {
                lambda *= 10.0;
                continue;
            }
            problem.residuals(&para.matrix(&trial), &mut r_plus);
            let c = cost(&r_plus);
            if c.is_finite() && c < current {
                let decrease = (current - c) / current;
                p = trial;
                r.copy_from_slice(&r_plus);
                current = c;
                lambda = (lambda / 10.0).max(1e-12);
                improved = decrease > RELATIVE_TOLERANCE;
                break;
            }
            lambda *= 10.0;
        }
        if !improved {
            break;
        }
    }
    p
}

/// CIEDE2000-minimising 3×3 matrix (rows map RGB to X, Y, Z); see the module docs.
pub fn fit_de2000(data: &FitData, preserve_white: bool) -> Result<[[f64; 3]; 3]> {
    let para = if preserve_white {
        let start = fit_white_preserving(&data.rgb, &data.xyz, data.white_rgb, data.white_xyz)?;
        Parametrisation::white_preserving(start, data.white_rgb)?
    } else {
        Parametrisation::full(fit_linear_ls(&data.rgb, &data.xyz)?)
    };
    let white = Xyz::from_array(data.white_xyz);
    if !is_positive(white.y) {
        return Err(CameraError::InvalidInput(
            "the reference white must have Y > 0".into(),
        ));
    }
    let problem = Problem {
        rgb: &data.rgb,
        target_lab: data
            .xyz
            .iter()
            .map(|x| Lab::from_xyz(Xyz::from_array(*x), white))
            .collect(),
        white,
    };
    let p = levenberg_marquardt(&problem, &para);
    let mut m = para.matrix(&p);
    if preserve_white {
        // The search directions are orthogonal to the white only up to rounding;
        // project each row back onto its constraint so the white is exact.
        let w = data.white_rgb;
        let w2 = w[0] * w[0] + w[1] * w[1] + w[2] * w[2];
        for (row, target) in m.iter_mut().zip(data.white_xyz) {
            let excess = (row[0] * w[0] + row[1] * w[1] + row[2] * w[2] - target) / w2;
            for (v, wk) in row.iter_mut().zip(w) {
                *v -= excess * wk;
            }
        }
    }
    if m.iter().flatten().any(|v| !v.is_finite()) {
        return Err(CameraError::Numerical(
            "CIEDE2000 fit produced non-finite values".into(),
        ));
    }
    Ok(m)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::correction::{ColorCorrection, delta_e_per_sample};

    fn data() -> FitData {
        // A nonlinear "camera": the targets are not a linear function of the signals.
        let rgb: Vec<[f64; 3]> = (0..40)
            .map(|i| {
                let t = f64::from(i);
                [
                    0.05 + 0.8 * (t * 0.37).sin().abs(),
                    0.05 + 0.8 * (t * 0.71).cos().abs(),
                    0.05 + 0.8 * (t * 0.13).sin().abs(),
                ]
            })
            .collect();
        let xyz: Vec<[f64; 3]> = rgb
            .iter()
            .map(|c| {
                [
                    0.4 * c[0] + 0.35 * c[1] + 0.15 * c[2] + 0.05 * c[0] * c[0],
                    0.2 * c[0] + 0.7 * c[1] + 0.1 * c[2],
                    0.02 * c[0] + 0.1 * c[1] + 0.95 * c[2] - 0.04 * c[1] * c[2],
                ]
            })
            .collect();
        FitData {
            rgb,
            xyz,
            white_rgb: [1.0; 3],
            white_xyz: [0.95047, 1.0, 1.08883],
        }
    }

    fn sum_sq(m: [[f64; 3]; 3], d: &FitData) -> f64 {
        delta_e_per_sample(
            &ColorCorrection::Matrix {
                xyz_from_camera_rgb: m,
            },
            d,
        )
        .iter()
        .map(|v| v * v)
        .sum()
    }

    #[test]
    fn lowers_delta_e_below_least_squares() {
        let d = data();
        let ls = fit_linear_ls(&d.rgb, &d.xyz).unwrap();
        let wp = fit_white_preserving(&d.rgb, &d.xyz, d.white_rgb, d.white_xyz).unwrap();
        let free = fit_de2000(&d, false).unwrap();
        let kept = fit_de2000(&d, true).unwrap();
        assert!(
            sum_sq(free, &d) < sum_sq(ls, &d),
            "{} vs {}",
            sum_sq(free, &d),
            sum_sq(ls, &d)
        );
        assert!(sum_sq(kept, &d) < sum_sq(wp, &d));
        // A local minimum: no single-entry nudge lowers Σ ΔE00² by more than rounding.
        let best = sum_sq(free, &d);
        for k in 0..3 {
            for j in 0..3 {
                for h in [-1e-4, 1e-4] {
                    let mut m = free;
                    m[k][j] += h;
                    assert!(
                        sum_sq(m, &d) > best - 1e-9 * best,
                        "nudge {k},{j},{h} improves"
                    );
                }
            }
        }
        let w = mat3_mul_vec(&kept, d.white_rgb);
        for (got, want) in w.iter().zip(d.white_xyz) {
            assert!((got - want).abs() < 1e-9);
        }
    }

    #[test]
    fn exact_data_stays_exact() {
        let mut d = data();
        let m = [[0.4, 0.35, 0.2], [0.2, 0.7, 0.1], [0.02, 0.1, 0.95]];
        d.xyz = d.rgb.iter().map(|c| mat3_mul_vec(&m, *c)).collect();
        d.white_xyz = mat3_mul_vec(&m, d.white_rgb);
        for keep in [false, true] {
            let fit = fit_de2000(&d, keep).unwrap();
            assert!(sum_sq(fit, &d) < 1e-16);
        }
    }
}
