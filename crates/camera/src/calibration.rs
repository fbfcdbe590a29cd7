//! Fitting a camera's colour correction under a light, and choosing which
//! correction a scene uses ([`MatrixMode`]).
//!
//! **Training data under a light L** ([`calibration_data`]): each training
//! reflectance gives a raw signal (perfect white at G = 1), white-balanced with
//! the gains that neutralise the perfect white under L, so the white's signal
//! is `[1, 1, 1]`. Its target is the sample's XYZ under L (perfect white at
//! Y = 1) carried to D65 by CAT16 with complete adaptation (the eye adapted to
//! L, D = 1): the colour the sample should have on a D65 display. The
//! correction therefore maps white-balanced camera RGB to XYZ with a D65 white
//! of Y = 1, which must be met exactly by the white-preserving fits.
//!
//! **Matrix modes**:
//! - *factory*: one correction fitted under D65, cached per camera, training set
//!   and method for the whole run;
//! - *dual illuminant*: corrections fitted under CIE A and D65 (both cached),
//!   blended element-wise with weight linear in inverse CCT (mired) between
//!   the two calibration CCTs and clamped outside them — the CCT being the one
//!   the camera infers from its white balance;
//! - *scene profile*: a correction fitted under the scene's own light.
//!
//! # References
//! - Li, C. et al. (2017), *Comprehensive color solutions: CAM16, CAT16, and
//!   CAM16-UCS*, Color Res. Appl. 42(6), 703–718, doi:10.1002/col.22131.
//! - ISO 17321-1:2012 (camera characterisation from spectral sensitivities and
//!   training reflectances).
//! - Adobe Systems (2012), *Digital Negative (DNG) Specification* 1.4.0.0,
//!   ch. 6 "Mapping Camera Color Space to CIE XYZ Space" (two calibration
//!   illuminants, interpolation in inverse CCT).

use crate::correction::{ColorCorrection, FitData, FitMethod, fit_color_correction};
use crate::error::Result;
use crate::raw::{SceneResponse, SubjectSignal};
use crate::sensitivities::{CameraSensitivities, SharedCamera};
use crate::training::TrainingSet;
use crate::white_balance::WbGains;
use lampwright_color::adaptation::{Cat, apply_matrix, chromatic_adaptation_matrix};
use lampwright_color::illuminant::StandardIlluminant;
use lampwright_color::observer::Observer;
use lampwright_color::tristimulus::xyz_of_light;
use lampwright_color::{RelativeSpd, Xyz};
use std::collections::HashMap;
use std::sync::{Arc, LazyLock, Mutex, PoisonError};

/// Nominal CCT of CIE illuminant A, K (CIE 15:2018 §4.1).
pub const CALIBRATION_A_CCT_K: f64 = 2856.0;
/// Nominal CCT of CIE D65, K (6500 K on the 1948 c2; CIE 15:2018 §4.1.2).
pub const CALIBRATION_D65_CCT_K: f64 = 6504.0;

/// Which colour correction a scene uses.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
#[serde(rename_all = "kebab-case")]
pub enum MatrixMode {
    /// One correction fitted under D65 (as a camera maker would ship).
    #[default]
    Factory,
    /// Corrections for A and D65, blended by the camera's estimated CCT.
    DualIlluminant,
    /// A correction fitted under the scene's own light.
    SceneProfile,
}

/// The calibration lights.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum CalibrationLight {
    /// CIE D65.
    D65,
    /// CIE illuminant A.
    A,
}

impl CalibrationLight {
    fn spd(self) -> Result<RelativeSpd> {
        Ok(match self {
            CalibrationLight::D65 => StandardIlluminant::D65.spd()?,
            CalibrationLight::A => StandardIlluminant::A.spd()?,
        })
    }
}

/// XYZ of CIE D65 (Lampwright's 1 nm summation over 360–830 nm, 1931 2°), Y = 1:
/// the output white of every colour correction.
pub fn d65_white() -> Result<Xyz> {
    static WHITE: LazyLock<Result<Xyz>> = LazyLock::new(|| {
        Ok(xyz_of_light(
            &StandardIlluminant::D65.spd()?,
            Observer::cie1931_2deg(),
            "D65",
        )?
        .scaled(0.01))
    });
    WHITE.as_ref().copied().map_err(Clone::clone)
}

/// The CAT16 matrix (complete adaptation) from the scene white to D65.
pub fn cat16_to_d65(scene_white: Xyz) -> Result<nalgebra::Matrix3<f64>> {
    Ok(chromatic_adaptation_matrix(
        Cat::Cat16,
        scene_white,
        d65_white()?,
    )?)
}

/// Training data under `light`: white-balanced camera RGB (white = `[1, 1, 1]`)
/// and CAT16-to-D65 target XYZ (white = D65, Y = 1); see the module docs.
pub fn calibration_data(
    camera: &CameraSensitivities,
    light: &RelativeSpd,
    training: &TrainingSet,
) -> Result<FitData> {
    let scene = SceneResponse::new(camera, light, Observer::cie1931_2deg())?;
    calibration_data_from_signals(scene.white(), &scene.subjects(training.reflectances()))
}

/// [`calibration_data`] from signals already integrated under the light:
/// its perfect white `white` and the training samples at the same exposure.
pub fn calibration_data_from_signals(
    white: SubjectSignal,
    signals: &[SubjectSignal],
) -> Result<FitData> {
    let gains = WbGains::from_neutral_raw(white.raw_rgb)?;
    let cat = cat16_to_d65(white.xyz)?;
    Ok(FitData {
        rgb: signals.iter().map(|s| gains.apply(s.raw_rgb)).collect(),
        xyz: signals
            .iter()
            .map(|s| apply_matrix(&cat, s.xyz).to_array())
            .collect(),
        white_rgb: gains.apply(white.raw_rgb),
        white_xyz: d65_white()?.to_array(),
    })
}

/// Fit a correction for `camera` under `light` with `method`.
pub fn fit_under_light(
    camera: &CameraSensitivities,
    light: &RelativeSpd,
    method: FitMethod,
    training: &TrainingSet,
) -> Result<ColorCorrection> {
    fit_color_correction(method, &calibration_data(camera, light, training)?)
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
struct CacheKey {
    camera: u64,
    training: u64,
    method: FitMethod,
    light: CalibrationLight,
}

static CALIBRATION_CACHE: LazyLock<Mutex<HashMap<CacheKey, Arc<ColorCorrection>>>> =
    LazyLock::new(|| Mutex::new(HashMap::new()));

/// The correction fitted under a calibration light, computed once per camera
/// curves, training set and method, then kept for the run.
pub fn calibrated_correction(
    camera: &CameraSensitivities,
    light: CalibrationLight,
    method: FitMethod,
    training: &TrainingSet,
) -> Result<Arc<ColorCorrection>> {
    calibrated_correction_of(camera, camera.fingerprint(), light, method, training)
}

/// [`calibrated_correction`] of a camera already fingerprinted.
pub(crate) fn calibrated_correction_shared(
    camera: &SharedCamera,
    light: CalibrationLight,
    method: FitMethod,
    training: &TrainingSet,
) -> Result<Arc<ColorCorrection>> {
    calibrated_correction_of(
        camera.curves(),
        camera.fingerprint(),
        light,
        method,
        training,
    )
}

fn calibrated_correction_of(
    camera: &CameraSensitivities,
    fingerprint: u64,
    light: CalibrationLight,
    method: FitMethod,
    training: &TrainingSet,
) -> Result<Arc<ColorCorrection>> {
    let key = CacheKey {
        camera: fingerprint,
        training: training.fingerprint(),
        method,
        light,
    };
    if let Some(hit) = CALIBRATION_CACHE
        .lock()
        .unwrap_or_else(PoisonError::into_inner)
        .get(&key)
    {
        return Ok(Arc::clone(hit));
    }
    // Fitted outside the lock: two threads may both fit once, which is harmless.
    let fitted = Arc::new(fit_under_light(camera, &light.spd()?, method, training)?);
    CALIBRATION_CACHE
        .lock()
        .unwrap_or_else(PoisonError::into_inner)
        .insert(key, Arc::clone(&fitted));
    Ok(fitted)
}

/// The factory correction: fitted under D65, cached.
pub fn factory_correction(
    camera: &CameraSensitivities,
    method: FitMethod,
    training: &TrainingSet,
) -> Result<Arc<ColorCorrection>> {
    calibrated_correction(camera, CalibrationLight::D65, method, training)
}

/// Weight of the D65 correction in a dual-illuminant blend at `cct_k`:
/// linear in mired between A (0) and D65 (1), clamped outside.
#[must_use]
pub fn dual_illuminant_weight(cct_k: f64) -> f64 {
    if !(cct_k.is_finite() && cct_k > 0.0) {
        return 1.0;
    }
    let (m, m_a, m_d) = (
        1e6 / cct_k,
        1e6 / CALIBRATION_A_CCT_K,
        1e6 / CALIBRATION_D65_CCT_K,
    );
    ((m_a - m) / (m_a - m_d)).clamp(0.0, 1.0)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fit_linear::mat3_mul_vec;

    #[test]
    fn d65_white_is_cie15_value() {
        // CIE 15:2018 Table 3: D65 (2°) x = 0.31271, y = 0.32902; our 1 nm sum agrees to 5e-5.
        let w = d65_white().unwrap();
        let (x, y) = w.chromaticity().unwrap();
        assert!((w.y - 1.0).abs() < 1e-12);
        assert!((x - 0.31271).abs() < 5e-5 && (y - 0.32902).abs() < 5e-5);
    }

    #[test]
    fn training_white_is_unit_and_targets_adapted() {
        let cam = &CameraSensitivities::demo_cameras().unwrap()[0];
        let a = StandardIlluminant::A.spd().unwrap();
        let data = calibration_data(cam, &a, TrainingSet::standard().unwrap()).unwrap();
        assert_eq!(data.rgb.len(), 113);
        for k in 0..3 {
            assert!((data.white_rgb[k] - 1.0).abs() < 1e-12);
        }
        // The mean target chromaticity moves from near A towards D65 (x ≈ 0.31).
        let (sx, sy, sz) = data
            .xyz
            .iter()
            .fold((0.0, 0.0, 0.0), |a, v| (a.0 + v[0], a.1 + v[1], a.2 + v[2]));
        let x = sx / (sx + sy + sz);
        assert!(x < 0.36, "{x}");
    }

    #[test]
    fn factory_cache_returns_same_fit() {
        let cam = &CameraSensitivities::demo_cameras().unwrap()[3];
        let t = TrainingSet::standard().unwrap();
        let a = factory_correction(cam, FitMethod::WhitePreserving, t).unwrap();
        let b = factory_correction(cam, FitMethod::WhitePreserving, t).unwrap();
        assert!(Arc::ptr_eq(&a, &b));
        let ColorCorrection::Matrix {
            xyz_from_camera_rgb,
        } = *a
        else {
            panic!("kind")
        };
        let w = mat3_mul_vec(&xyz_from_camera_rgb, [1.0; 3]);
        let d = d65_white().unwrap().to_array();
        for k in 0..3 {
            assert!((w[k] - d[k]).abs() < 1e-9);
        }
    }

    #[test]
    fn dual_weight_is_linear_in_mired() {
        assert!((dual_illuminant_weight(CALIBRATION_A_CCT_K) - 0.0).abs() < 1e-12);
        assert!((dual_illuminant_weight(CALIBRATION_D65_CCT_K) - 1.0).abs() < 1e-12);
        assert!((dual_illuminant_weight(1500.0)).abs() < 1e-12);
        assert!((dual_illuminant_weight(20000.0) - 1.0).abs() < 1e-12);
        let mid = 2.0 / (1.0 / CALIBRATION_A_CCT_K + 1.0 / CALIBRATION_D65_CCT_K);
        assert!((dual_illuminant_weight(mid) - 0.5).abs() < 1e-12);
    }
}
