//! The camera's side of the fidelity goal, from the search model's sums.
//!
//! The evaluation renders each subject as: raw signal (perfect white under
//! the main zone's light at G = 1) → white-balance gains → colour correction
//! → XYZ (D65 white) → CIELAB; the eye's colour is the subject's XYZ (white at
//! Y = 1) carried to D65 by CAT16, or left as lit; the difference is CIEDE2000.
//! Both raw signal and XYZ are linear in the sources' levels, so the search
//! model ([`super::linear`]) supplies them as sums; this module applies the
//! same steps with the camera crate's own pieces (white-balance resolution,
//! cached factory and dual-illuminant corrections, the camera's white locus,
//! scene-profile fitting), so that with exact (1 nm) sums the figures equal
//! the evaluation's.
//!
//! Camera options are the plan's own settings first, then every other
//! white-balance mode and Kelvin setting (2000–10 000 K in 100 K steps, the
//! steps cameras offer — common practice) with the plan's matrix, then a
//! scene profile (with the plan's white balance and with a grey card).
//!
//! # References
//! - See `lampwright_camera::pipeline`, `calibration` and `white_balance`.
//! - CIE 142-2001 (CIEDE2000); Li, C. et al. (2017), doi:10.1002/col.22131 (CAT16).

use crate::error::{PlanError, Result};
use crate::model::{Adaptation, FitMethod, MatrixMode, Plan, WbPreset, WhiteBalanceSetting};
use lampwright_camera::calibration::{
    CalibrationLight, calibrated_correction, cat16_to_d65, d65_white, dual_illuminant_weight,
    fit_under_light,
};
use lampwright_camera::locus::CameraLocus;
use lampwright_camera::white_balance::{WbGains, resolve_white_balance};
use lampwright_camera::{
    CameraSensitivities, ColorCorrection, SubjectSignal, TrainingSet, WhiteBalance,
};
use lampwright_color::adaptation::apply_matrix;
use lampwright_color::delta_e::delta_e_ciede2000;
use lampwright_color::spaces::Lab;
use lampwright_color::{RelativeSpd, Xyz};
use std::collections::HashMap;
use std::sync::Arc;

/// Lowest Kelvin white balance the advisor proposes, K.
pub const KELVIN_MIN_K: f64 = 2000.0;
/// Highest Kelvin white balance the advisor proposes, K.
pub const KELVIN_MAX_K: f64 = 10_000.0;
/// Kelvin step, K.
pub const KELVIN_STEP_K: f64 = 100.0;

/// One camera setting the search may choose.
#[derive(Debug, Clone, PartialEq)]
pub struct CameraOption {
    /// White balance.
    pub white_balance: WhiteBalanceSetting,
    /// Matrix.
    pub matrix: MatrixMode,
}

/// The camera crate's white balance for a plan setting (as the evaluation maps it).
fn camera_white_balance(wb: &WhiteBalanceSetting) -> WhiteBalance {
    use lampwright_camera::WbPreset as C;
    match wb {
        WhiteBalanceSetting::Kelvin(k) => WhiteBalance::Kelvin { cct_k: *k },
        WhiteBalanceSetting::Preset(p) => WhiteBalance::Preset {
            preset: match p {
                WbPreset::Daylight => C::Daylight,
                WbPreset::Cloudy => C::Cloudy,
                WbPreset::Shade => C::Shade,
                WbPreset::Tungsten => C::Tungsten,
                WbPreset::Fluorescent => C::Fluorescent,
            },
        },
        WhiteBalanceSetting::GreyCard => WhiteBalance::GreyCard { subject: None },
        WhiteBalanceSetting::AutoGreyWorld => WhiteBalance::GreyWorld,
        WhiteBalanceSetting::AutoBrightestNeutral => WhiteBalance::BrightestNeutral,
    }
}

fn camera_fit(fit: FitMethod) -> lampwright_camera::FitMethod {
    match fit {
        FitMethod::Linear => lampwright_camera::FitMethod::Linear,
        FitMethod::WhitePreserving => lampwright_camera::FitMethod::WhitePreserving,
        FitMethod::De2000 => lampwright_camera::FitMethod::De2000 {
            preserve_white: true,
        },
        FitMethod::RootPoly => lampwright_camera::FitMethod::RootPolynomial,
    }
}

/// The camera options for a plan: its own settings first.
pub(crate) fn camera_options(plan: &Plan, with_alternatives: bool) -> Vec<CameraOption> {
    let here = CameraOption {
        white_balance: plan.camera.white_balance.clone(),
        matrix: plan.camera.matrix,
    };
    let mut out = vec![here.clone()];
    if !with_alternatives {
        return out;
    }
    let mut push = |o: CameraOption| {
        if !out.contains(&o) {
            out.push(o);
        }
    };
    let matrix = plan.camera.matrix;
    for wb in [
        WhiteBalanceSetting::GreyCard,
        WhiteBalanceSetting::AutoGreyWorld,
        WhiteBalanceSetting::AutoBrightestNeutral,
        WhiteBalanceSetting::Preset(WbPreset::Daylight),
        WhiteBalanceSetting::Preset(WbPreset::Cloudy),
        WhiteBalanceSetting::Preset(WbPreset::Shade),
        WhiteBalanceSetting::Preset(WbPreset::Tungsten),
        WhiteBalanceSetting::Preset(WbPreset::Fluorescent),
    ] {
        push(CameraOption {
            white_balance: wb,
            matrix,
        });
    }
    let steps = ((KELVIN_MAX_K - KELVIN_MIN_K) / KELVIN_STEP_K).round() as u32;
    for i in 0..=steps {
        push(CameraOption {
            white_balance: WhiteBalanceSetting::Kelvin(KELVIN_MIN_K + f64::from(i) * KELVIN_STEP_K),
            matrix,
        });
    }
    if matrix != MatrixMode::SceneProfile {
        push(CameraOption {
            white_balance: plan.camera.white_balance.clone(),
            matrix: MatrixMode::SceneProfile,
        });
        push(CameraOption {
            white_balance: WhiteBalanceSetting::GreyCard,
            matrix: MatrixMode::SceneProfile,
        });
    }
    out
}

#[derive(Debug, Clone)]
enum Correction {
    Fixed(Arc<ColorCorrection>),
    Dual {
        a: Arc<ColorCorrection>,
        d65: Arc<ColorCorrection>,
    },
    Scene,
}

/// The camera ready to score candidates.
pub(crate) struct FastCamera {
    camera: CameraSensitivities,
    locus: Arc<CameraLocus>,
    wb: Vec<WhiteBalance>,
    fixed_gains: Vec<Option<WbGains>>,
    corrections: Vec<Correction>,
    fit: lampwright_camera::FitMethod,
    training: &'static TrainingSet,
    d65: Xyz,
    as_lit: bool,
    scene_fits: HashMap<u64, Option<ColorCorrection>>,
    signals: Vec<SubjectSignal>,
}

fn color(e: lampwright_camera::CameraError) -> PlanError {
    PlanError::Camera(e)
}

impl FastCamera {
    /// Prepare `camera` for the plan's options.
    pub fn new(
        plan: &Plan,
        camera: CameraSensitivities,
        options: &[CameraOption],
    ) -> Result<FastCamera> {
        let training = TrainingSet::standard().map_err(color)?;
        let fit = camera_fit(plan.camera.fit);
        let locus = CameraLocus::for_camera(&camera).map_err(color)?;
        let mut wb = Vec::with_capacity(options.len());
        let mut fixed_gains = Vec::with_capacity(options.len());
        let mut corrections = Vec::with_capacity(options.len());
        for o in options {
            let w = camera_white_balance(&o.white_balance);
            let gains = match w {
                WhiteBalance::Kelvin { .. } | WhiteBalance::Preset { .. } => Some(
                    resolve_white_balance(&w, &camera, [1.0; 3], &[])
                        .map_err(color)?
                        .gains,
                ),
                _ => None,
            };
            wb.push(w);
            fixed_gains.push(gains);
            // Factory and dual-illuminant fits are cached by the camera crate.
            let c = match o.matrix {
                MatrixMode::Factory => Correction::Fixed(
                    calibrated_correction(&camera, CalibrationLight::D65, fit, training)
                        .map_err(color)?,
                ),
                MatrixMode::DualIlluminant => Correction::Dual {
                    a: calibrated_correction(&camera, CalibrationLight::A, fit, training)
                        .map_err(color)?,
                    d65: calibrated_correction(&camera, CalibrationLight::D65, fit, training)
                        .map_err(color)?,
                },
                MatrixMode::SceneProfile => Correction::Scene,
            };
            corrections.push(c);
        }
        Ok(FastCamera {
            camera,
            locus,
            wb,
            fixed_gains,
            corrections,
            fit,
            training,
            d65: d65_white().map_err(color)?,
            as_lit: plan.viewing.adaptation == Adaptation::AsLit,
            scene_fits: HashMap::new(),
            signals: Vec::new(),
        })
    }

    /// CIEDE2000 eye versus camera of each subject in each zone, one row of
    /// subjects per zone (main zone first), as the evaluation renders them:
    /// one white balance and one matrix for the frame.
    ///
    /// Each entry of `zones` holds the zone mix's `[X, Y, Z, R, G, B]` for the
    /// perfect white, then six such numbers per subject, all on one common
    /// scale. Signals are normalised by the main zone's white, so other zones
    /// keep their exposure relative to it. Automatic white balance meters the
    /// subjects of every zone; a grey card is read in the main zone. For a
    /// scene profile, `light` gives the main mix's spectrum and `light_key`
    /// identifies it for the cache of fits. `None` when the main light is dark
    /// or a step fails.
    pub fn delta_e(
        &mut self,
        option: usize,
        zones: &[Vec<f64>],
        light_key: u64,
        light: &dyn Fn() -> Option<RelativeSpd>,
        out: &mut Vec<f64>,
    ) -> Option<()> {
        out.clear();
        let main = zones.first()?;
        let (wy, wg) = (*main.get(1)?, *main.get(4)?);
        if !(wy > 0.0 && wg > 0.0 && wy.is_finite() && wg.is_finite()) {
            return None;
        }
        let white_xyz = Xyz::new(main[0] / wy, 1.0, main[2] / wy);
        let white_raw = [main[3] / wg, 1.0, main[5] / wg];
        self.signals.clear();
        for zone in zones {
            for s in zone.get(6..)?.chunks_exact(6) {
                self.signals.push(SubjectSignal {
                    raw_rgb: [s[3] / wg, s[4] / wg, s[5] / wg],
                    xyz: Xyz::new(s[0] / wy, s[1] / wy, s[2] / wy),
                });
            }
        }
        let per_zone = main.len().saturating_sub(6) / 6;
        let metered = if matches!(self.wb[option], WhiteBalance::GreyCard { .. }) {
            &self.signals[..per_zone.min(self.signals.len())]
        } else {
            &self.signals[..]
        };
        let gains = match self.fixed_gains[option] {
            Some(g) => g,
            None => {
                resolve_white_balance(&self.wb[option], &self.camera, white_raw, metered)
                    .ok()?
                    .gains
            }
        };
        let correction = match &self.corrections[option] {
            Correction::Fixed(c) => **c,
            Correction::Dual { a, d65 } => {
                let cct = self.locus.nearest(gains.neutral_raw()).map(|m| m.cct_k);
                ColorCorrection::blend(a, d65, cct.map_or(1.0, dual_illuminant_weight)).ok()?
            }
            Correction::Scene => {
                if !self.scene_fits.contains_key(&light_key) {
                    let fitted = light().and_then(|spd| {
                        fit_under_light(&self.camera, &spd, self.fit, self.training).ok()
                    });
                    self.scene_fits.insert(light_key, fitted);
                }
                self.scene_fits.get(&light_key).copied().flatten()?
            }
        };
        let eye_to_d65 = if self.as_lit {
            None
        } else {
            Some(cat16_to_d65(white_xyz).ok()?)
        };
        for s in &self.signals {
            let camera_xyz = Xyz::from_array(correction.apply(gains.apply(s.raw_rgb)));
            let eye_xyz = eye_to_d65
                .as_ref()
                .map_or(s.xyz, |m| apply_matrix(m, s.xyz));
            let de = delta_e_ciede2000(
                Lab::from_xyz(eye_xyz, self.d65),
                Lab::from_xyz(camera_xyz, self.d65),
            );
            if !de.is_finite() {
                return None;
            }
            out.push(de);
        }
        Some(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::Plan;

    #[test]
    fn options_start_with_the_plan_and_hold_no_duplicates() {
        let mut plan = Plan::default();
        plan.camera.white_balance = WhiteBalanceSetting::Kelvin(3200.0);
        let opts = camera_options(&plan, true);
        assert_eq!(opts[0].white_balance, WhiteBalanceSetting::Kelvin(3200.0));
        for (i, a) in opts.iter().enumerate() {
            assert!(opts[i + 1..].iter().all(|b| b != a));
        }
        // 81 Kelvin settings, 3 modes, 5 presets, 2 scene profiles, less the plan's own Kelvin.
        assert_eq!(opts.len(), 1 + 80 + 3 + 5 + 2);
        assert_eq!(camera_options(&plan, false).len(), 1);
    }
}
