//! Colour corrections (camera RGB → XYZ) and the methods that fit them.
//!
//! A [`ColorCorrection`] is either a 3×3 matrix or a 3×6 degree-2
//! root-polynomial matrix. [`fit_color_correction`] fits one on [`FitData`]
//! (camera signals, target XYZ and the white both are relative to) with a
//! chosen [`FitMethod`]; [`delta_e_per_sample`] reports the CIEDE2000 left over.
//!
//! # References
//! - See [`crate::fit_linear`], [`crate::fit_de2000`] and [`crate::root_poly`] for each method.
//! - CIE 15:2018 §8.2.1 (CIELAB), CIE 142-2001 (CIEDE2000).

use crate::error::{CameraError, Result};
use crate::fit_de2000::fit_de2000;
use crate::fit_linear::{fit_linear_ls, fit_white_preserving, mat3_mul_vec};
use crate::root_poly::{ROOT_POLY2_TERMS, apply_root_polynomial, fit_root_polynomial};
use lampwright_color::Xyz;
use lampwright_color::delta_e::delta_e_ciede2000;
use lampwright_color::spaces::Lab;

/// How a colour correction is fitted.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
#[serde(rename_all = "kebab-case")]
pub enum FitMethod {
    /// Plain least squares in XYZ.
    Linear,
    /// Least squares in XYZ with the neutral mapped exactly to the output white.
    #[default]
    WhitePreserving,
    /// Levenberg–Marquardt minimisation of Σ ΔE00² from the least-squares start;
    /// `preserve_white` keeps the white-preserving constraint during the search.
    De2000 {
        /// Keep `M·white_rgb = white_xyz` exactly (start from the white-preserving fit).
        preserve_white: bool,
    },
    /// Degree-2 root-polynomial regression (3×6), exposure-invariant.
    RootPolynomial,
}

impl FitMethod {
    /// Short name for reports: `linear`, `white-preserving`, `de2000`,
    /// `de2000-free-white`, `root-poly`.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            FitMethod::Linear => "linear",
            FitMethod::WhitePreserving => "white-preserving",
            FitMethod::De2000 {
                preserve_white: true,
            } => "de2000",
            FitMethod::De2000 {
                preserve_white: false,
            } => "de2000-free-white",
            FitMethod::RootPolynomial => "root-poly",
        }
    }

    /// Parse a short name (see [`FitMethod::name`]).
    pub fn from_name(name: &str) -> Result<FitMethod> {
        Ok(match name.trim().to_ascii_lowercase().as_str() {
            "linear" => FitMethod::Linear,
            "white-preserving" => FitMethod::WhitePreserving,
            "de2000" => FitMethod::De2000 {
                preserve_white: true,
            },
            "de2000-free-white" => FitMethod::De2000 {
                preserve_white: false,
            },
            "root-poly" => FitMethod::RootPolynomial,
            other => {
                return Err(CameraError::InvalidInput(format!(
                    "unknown fit method '{other}'; use linear, white-preserving, de2000, de2000-free-white or root-poly"
                )));
            }
        })
    }
}

/// A fitted colour correction from (white-balanced) camera RGB to XYZ.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum ColorCorrection {
    /// `xyz = M·rgb`; rows map RGB to X, Y, Z.
    Matrix {
        /// The 3×3 matrix, row-major.
        xyz_from_camera_rgb: [[f64; 3]; 3],
    },
    /// `xyz = M·[r, g, b, √(rg), √(gb), √(rb)]`; rows map the six terms to X, Y, Z.
    RootPolynomial {
        /// The 3×6 matrix, row-major.
        xyz_from_terms: [[f64; ROOT_POLY2_TERMS]; 3],
    },
}

impl ColorCorrection {
    /// XYZ from camera RGB.
    #[must_use]
    pub fn apply(&self, rgb: [f64; 3]) -> [f64; 3] {
        match self {
            ColorCorrection::Matrix {
                xyz_from_camera_rgb,
            } => mat3_mul_vec(xyz_from_camera_rgb, rgb),
            ColorCorrection::RootPolynomial { xyz_from_terms } => {
                apply_root_polynomial(xyz_from_terms, rgb)
            }
        }
    }

    /// The matrix rows (3 rows of 3 or of 6 numbers).
    #[must_use]
    pub fn rows(&self) -> Vec<Vec<f64>> {
        match self {
            ColorCorrection::Matrix {
                xyz_from_camera_rgb,
            } => xyz_from_camera_rgb.iter().map(|r| r.to_vec()).collect(),
            ColorCorrection::RootPolynomial { xyz_from_terms } => {
                xyz_from_terms.iter().map(|r| r.to_vec()).collect()
            }
        }
    }

    /// Element-wise blend `(1 − t)·a + t·b` of two corrections of the same kind
    /// (dual-illuminant interpolation); `t` is clamped to [0, 1].
    pub fn blend(a: &ColorCorrection, b: &ColorCorrection, t: f64) -> Result<ColorCorrection> {
        let t = if t.is_finite() {
            t.clamp(0.0, 1.0)
        } else {
            0.0
        };
        let mix = |x: f64, y: f64| (1.0 - t) * x + t * y;
        match (a, b) {
            (
                ColorCorrection::Matrix {
                    xyz_from_camera_rgb: ma,
                },
                ColorCorrection::Matrix {
                    xyz_from_camera_rgb: mb,
                },
            ) => Ok(ColorCorrection::Matrix {
                xyz_from_camera_rgb: std::array::from_fn(|k| {
                    std::array::from_fn(|j| mix(ma[k][j], mb[k][j]))
                }),
            }),
            (
                ColorCorrection::RootPolynomial { xyz_from_terms: ma },
                ColorCorrection::RootPolynomial { xyz_from_terms: mb },
            ) => Ok(ColorCorrection::RootPolynomial {
                xyz_from_terms: std::array::from_fn(|k| {
                    std::array::from_fn(|j| mix(ma[k][j], mb[k][j]))
                }),
            }),
            _ => Err(CameraError::InvalidInput(
                "cannot blend a 3×3 matrix with a root-polynomial correction".into(),
            )),
        }
    }
}

/// What a colour correction is fitted on: camera signals, their target XYZ,
/// and the white both are relative to (its camera signal and its XYZ; CIELAB
/// for the ΔE00 method and for reporting is taken against `white_xyz`).
#[derive(Debug, Clone, PartialEq)]
pub struct FitData {
    /// Camera signals of the training samples.
    pub rgb: Vec<[f64; 3]>,
    /// Target XYZ of the training samples (same order).
    pub xyz: Vec<[f64; 3]>,
    /// Camera signal of the neutral that must map to the white.
    pub white_rgb: [f64; 3],
    /// Target white XYZ (also the CIELAB reference white).
    pub white_xyz: [f64; 3],
}

/// Fit a colour correction with `method`.
pub fn fit_color_correction(method: FitMethod, data: &FitData) -> Result<ColorCorrection> {
    let matrix = |m| {
        Ok(ColorCorrection::Matrix {
            xyz_from_camera_rgb: m,
        })
    };
    match method {
        FitMethod::Linear => matrix(fit_linear_ls(&data.rgb, &data.xyz)?),
        FitMethod::WhitePreserving => matrix(fit_white_preserving(
            &data.rgb,
            &data.xyz,
            data.white_rgb,
            data.white_xyz,
        )?),
        FitMethod::De2000 { preserve_white } => matrix(fit_de2000(data, preserve_white)?),
        FitMethod::RootPolynomial => Ok(ColorCorrection::RootPolynomial {
            xyz_from_terms: fit_root_polynomial(&data.rgb, &data.xyz)?,
        }),
    }
}

/// CIEDE2000 between the corrected signal and the target of each sample, in
/// order, with CIELAB against `data.white_xyz`.
#[must_use]
pub fn delta_e_per_sample(correction: &ColorCorrection, data: &FitData) -> Vec<f64> {
    let white = Xyz::from_array(data.white_xyz);
    data.rgb
        .iter()
        .zip(&data.xyz)
        .map(|(rgb, xyz)| {
            let got = Lab::from_xyz(Xyz::from_array(correction.apply(*rgb)), white);
            let want = Lab::from_xyz(Xyz::from_array(*xyz), white);
            delta_e_ciede2000(want, got)
        })
        .collect()
}

/// Summary of a list of colour differences.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct DeltaEStats {
    /// Arithmetic mean.
    pub mean: f64,
    /// 90th percentile (linear interpolation between order statistics, as
    /// `numpy.percentile` does by default).
    pub p90: f64,
    /// Largest value.
    pub max: f64,
}

impl DeltaEStats {
    /// Statistics of `values`; an empty list gives `None`.
    #[must_use]
    pub fn of(values: &[f64]) -> Option<DeltaEStats> {
        if values.is_empty() {
            return None;
        }
        let mut sorted = values.to_vec();
        sorted.sort_by(f64::total_cmp);
        let n = sorted.len();
        let pos = 0.9 * (n - 1) as f64;
        let i = pos.floor() as usize;
        let frac = pos - i as f64;
        let p90 = if i + 1 < n {
            sorted[i] * (1.0 - frac) + sorted[i + 1] * frac
        } else {
            sorted[i]
        };
        Some(DeltaEStats {
            mean: sorted.iter().sum::<f64>() / n as f64,
            p90,
            max: sorted[n - 1],
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn method_names_round_trip() {
        for m in [
            FitMethod::Linear,
            FitMethod::WhitePreserving,
            FitMethod::De2000 {
                preserve_white: true,
            },
            FitMethod::De2000 {
                preserve_white: false,
            },
            FitMethod::RootPolynomial,
        ] {
            assert_eq!(FitMethod::from_name(m.name()).unwrap(), m);
        }
        assert!(FitMethod::from_name("cubic").is_err());
    }

    #[test]
    fn stats_match_numpy_percentile() {
        // numpy.percentile([1..10], 90) = 9.1 (linear method), mean 5.5.
        let v: Vec<f64> = (1..=10).map(f64::from).collect();
        let s = DeltaEStats::of(&v).unwrap();
        assert!(
            (s.p90 - 9.1).abs() < 1e-12
                && (s.mean - 5.5).abs() < 1e-12
                && (s.max - 10.0).abs() < 1e-12
        );
        assert!(DeltaEStats::of(&[]).is_none());
        assert!((DeltaEStats::of(&[2.0]).unwrap().p90 - 2.0).abs() < 1e-12);
    }

    #[test]
    fn blend_is_elementwise_and_kind_checked() {
        let a = ColorCorrection::Matrix {
            xyz_from_camera_rgb: [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]],
        };
        let b = ColorCorrection::Matrix {
            xyz_from_camera_rgb: [[3.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]],
        };
        let ColorCorrection::Matrix {
            xyz_from_camera_rgb: m,
        } = ColorCorrection::blend(&a, &b, 0.25).unwrap()
        else {
            panic!("kind changed")
        };
        assert!((m[0][0] - 1.5).abs() < 1e-15);
        let r = ColorCorrection::RootPolynomial {
            xyz_from_terms: [[0.0; 6]; 3],
        };
        assert!(ColorCorrection::blend(&a, &r, 0.5).is_err());
    }
}
