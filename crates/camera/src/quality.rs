//! How well a camera's spectral sensitivities can reproduce colorimetry.
//!
//! - **Luther residual**: the relative residual of the best least-squares fit
//!   of the CIE 1931 colour-matching functions by linear combinations of the
//!   camera channels, `‖S·X − C‖_F / ‖C‖_F` over 360–830 nm at 1 nm (equal
//!   weight per nanometre, no illuminant). Zero when the Luther condition holds.
//! - **Vora–Trussell µ-factor** (their "measure of goodness"):
//!   `µ = trace(P_S · O_C O_Cᵀ) / 3`, with `O_C` an orthonormal basis of the
//!   colour-matching functions' span and `P_S` the orthogonal projector onto
//!   the span of the camera's curves. 1 when the camera spans the CMFs, less
//!   otherwise. Computed here without illuminant weighting (the "ν" of
//!   Vora & Trussell for an equal-energy spectrum).
//!
//! - **ΔE00 over the training set under a light** ([`training_delta_e_under_light`]):
//!   the camera white-balanced on the perfect white (an ideal grey card) and
//!   corrected per its matrix mode, against the eye adapted with CAT16; mean,
//!   90th percentile and maximum CIEDE2000.
//!
//! # References
//! - Luther, R. (1927), Z. techn. Phys. 8, 540–558.
//! - Vora, P. L. & Trussell, H. J. (1993), *Measure of goodness of a set of
//!   color-scanning filters*, J. Opt. Soc. Am. A 10(7), 1499–1508,
//!   doi:10.1364/JOSAA.10.001499.

use crate::calibration::MatrixMode;
use crate::correction::{DeltaEStats, FitMethod};
use crate::error::{CameraError, Result};
use crate::fit_linear::is_positive;
use crate::pipeline::{CameraPipeline, CameraSettings};
use crate::sensitivities::CameraSensitivities;
use crate::training::TrainingSet;
use crate::white_balance::WhiteBalance;
use lampwright_color::GRID_LEN;
use lampwright_color::RelativeSpd;
use lampwright_color::observer::Observer;
use nalgebra::DMatrix;
use std::collections::HashMap;
use std::sync::{LazyLock, Mutex, PoisonError};

fn sensitivity_matrix(camera: &CameraSensitivities) -> DMatrix<f64> {
    let ch = camera.channels();
    DMatrix::from_fn(GRID_LEN, 3, |i, k| ch[k].values()[i])
}

fn cmf_matrix(observer: &Observer) -> DMatrix<f64> {
    DMatrix::from_fn(GRID_LEN, 3, |i, k| match k {
        0 => observer.x_bar[i],
        1 => observer.y_bar[i],
        _ => observer.z_bar[i],
    })
}

/// Orthonormal basis of the column space of `m` (thin QR), refusing rank < 3.
fn orthonormal_basis(m: DMatrix<f64>, what: &str) -> Result<DMatrix<f64>> {
    let svd = m.svd(true, false);
    let s = &svd.singular_values;
    if !is_positive(s.max()) || s.min() < 1e-12 * s.max() {
        return Err(CameraError::Numerical(format!(
            "{what}: the three curves are not linearly independent"
        )));
    }
    svd.u
        .ok_or_else(|| CameraError::Numerical(format!("{what}: SVD did not return a basis")))
}

/// The CIE 1931 2° CMFs as a matrix and an orthonormal basis of their span
/// (fixed data: computed once).
static CMF: LazyLock<Result<(DMatrix<f64>, DMatrix<f64>)>> = LazyLock::new(|| {
    let c = cmf_matrix(Observer::cie1931_2deg());
    let basis = orthonormal_basis(c.clone(), "CIE 1931 observer")?;
    Ok((c, basis))
});

/// Luther residual and Vora–Trussell µ-factor together: one orthonormal
/// basis of the camera's curves serves both.
pub fn luther_and_mu(camera: &CameraSensitivities) -> Result<(f64, f64)> {
    // They depend on the curves alone: kept for the run, per camera curves.
    static KEPT: LazyLock<Mutex<HashMap<u64, (f64, f64)>>> =
        LazyLock::new(|| Mutex::new(HashMap::new()));
    let key = camera.fingerprint();
    if let Some(hit) = KEPT
        .lock()
        .unwrap_or_else(PoisonError::into_inner)
        .get(&key)
    {
        return Ok(*hit);
    }
    let figures = luther_and_mu_uncached(camera)?;
    KEPT.lock()
        .unwrap_or_else(PoisonError::into_inner)
        .insert(key, figures);
    Ok(figures)
}

fn luther_and_mu_uncached(camera: &CameraSensitivities) -> Result<(f64, f64)> {
    let (c, o_c) = CMF.as_ref().map_err(Clone::clone)?;
    let u = orthonormal_basis(sensitivity_matrix(camera), &camera.name)?;
    let projected = &u * (u.transpose() * c);
    let luther = (c - projected).norm() / c.norm();
    // trace(O_Cᵀ P_S O_C) = ‖U_Sᵀ O_C‖_F².
    let mu = (u.transpose() * o_c).norm_squared() / 3.0;
    Ok((luther, mu))
}

/// Relative residual of the least-squares fit of the CIE 1931 2° CMFs from the
/// camera's curves (0 = Luther condition met); see the module docs.
pub fn luther_residual(camera: &CameraSensitivities) -> Result<f64> {
    Ok(luther_and_mu(camera)?.0)
}

/// Vora–Trussell µ-factor of the camera against the CIE 1931 2° CMFs (1 = ideal);
/// see the module docs.
pub fn vora_trussell_mu(camera: &CameraSensitivities) -> Result<f64> {
    Ok(luther_and_mu(camera)?.1)
}

/// CIEDE2000 statistics of `camera` over `training` under `light`, white
/// balance from an ideal grey card, correction per `matrix_mode` and `fit_method`.
pub fn training_delta_e_under_light(
    camera: &CameraSensitivities,
    matrix_mode: MatrixMode,
    fit_method: FitMethod,
    light: &RelativeSpd,
    training: &TrainingSet,
) -> Result<DeltaEStats> {
    let settings = CameraSettings {
        white_balance: WhiteBalance::GreyCard { subject: None },
        matrix_mode,
        fit_method,
        ..CameraSettings::default()
    };
    let comparison = CameraPipeline::new(camera, &settings, light, training)?
        .compare(training.reflectances())?;
    comparison
        .delta_e_stats
        .ok_or_else(|| CameraError::InvalidInput("the training set is empty".into()))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn colorimetric_camera_is_ideal() {
        let c = CameraSensitivities::colorimetric().unwrap();
        assert!((vora_trussell_mu(&c).unwrap() - 1.0).abs() < 1e-12);
        assert!(luther_residual(&c).unwrap() < 1e-12);
    }

    #[test]
    fn demo_cameras_fall_short_but_are_plausible() {
        for c in CameraSensitivities::demo_cameras().unwrap() {
            let mu = vora_trussell_mu(c).unwrap();
            let res = luther_residual(c).unwrap();
            // Real consumer cameras are usually reported at µ ≈ 0.85–0.97 (from memory);
            // the invented ones should be in that neighbourhood and clearly below 1.
            assert!(mu < 0.99 && mu > 0.8, "{}: µ = {mu}", c.name);
            assert!(res > 0.05 && res < 0.6, "{}: residual = {res}", c.name);
        }
    }

    #[test]
    fn training_delta_e_grows_away_from_the_calibration_light() {
        use lampwright_color::illuminant::StandardIlluminant;
        let t = TrainingSet::standard().unwrap();
        let cam = &CameraSensitivities::demo_cameras().unwrap()[0];
        let stats = |ill: StandardIlluminant, mode| {
            training_delta_e_under_light(
                cam,
                mode,
                FitMethod::WhitePreserving,
                &ill.spd().unwrap(),
                t,
            )
            .unwrap()
        };
        let d65 = stats(StandardIlluminant::D65, MatrixMode::Factory);
        let f11_factory = stats(StandardIlluminant::F(11), MatrixMode::Factory);
        let f11_profile = stats(StandardIlluminant::F(11), MatrixMode::SceneProfile);
        assert!(d65.mean > 0.2 && d65.mean < 3.0, "{d65:?}");
        assert!(d65.mean <= d65.p90 && d65.p90 <= d65.max);
        // A profile fitted under the light itself does at least as well on its own training set.
        assert!(
            f11_profile.mean < f11_factory.mean,
            "{f11_profile:?} vs {f11_factory:?}"
        );
    }

    #[test]
    fn mu_is_invariant_to_mixing_channels() {
        // µ depends only on the span of the curves: mixing the channels leaves it unchanged.
        let c = &CameraSensitivities::demo_cameras().unwrap()[1];
        let mixed = CameraSensitivities::new(
            "mixed",
            lampwright_color::Sensitivity::from_fn(|wl| c.r.at_nm(wl) + 0.3 * c.g.at_nm(wl)),
            c.g.clone(),
            lampwright_color::Sensitivity::from_fn(|wl| c.b.at_nm(wl) - 0.1 * c.r.at_nm(wl)),
        )
        .unwrap();
        assert!((vora_trussell_mu(c).unwrap() - vora_trussell_mu(&mixed).unwrap()).abs() < 1e-10);
    }
}
