//! Eye versus camera, per subject, under one light.
//!
//! For each subject (a reflectance) under the scene light:
//! - **eye, as lit**: XYZ with the perfect white at Y = 1, no adaptation — the
//!   colour cast a viewer adapted to D65 would see;
//! - **eye**: that XYZ adapted to D65 with CAT16 from the scene white
//!   (complete adaptation, D = 1) — what the subject looks like to someone in
//!   the scene;
//! - **camera**: raw signal → white-balance gains → colour correction → XYZ
//!   with the D65 white at Y = 1;
//! - CIELAB of each against the D65 white, display RGB (sRGB or Display P3)
//!   with a gamut flag, and CIEDE2000 between eye and camera.
//!
//! [`CameraPipeline::new`] does everything that does not depend on the
//! subjects once (light × curves, adaptation matrix, cached or fitted
//! corrections, fixed white-balance gains); [`CameraPipeline::compare`] then
//! costs one pass over the grid per subject plus a few hundred flops.
//!
//! # References
//! - CIE 15:2018 §7.1 and §8.2.1 (XYZ, CIELAB); CIE 142-2001 (CIEDE2000).
//! - Li, C. et al. (2017), doi:10.1002/col.22131 (CAT16).
//! - See [`crate::calibration`], [`crate::white_balance`] for the camera steps.

use crate::calibration::{
    CalibrationLight, MatrixMode, calibrated_correction_shared, calibration_data_from_signals,
    cat16_to_d65, d65_white, dual_illuminant_weight, fit_under_light,
};
use crate::correction::{ColorCorrection, DeltaEStats, FitMethod, fit_color_correction};
use crate::display::{DisplayColor, DisplaySpace, DisplayTransform};
use crate::error::{CameraError, Result};
use crate::locus::CameraLocus;
use crate::raw::{SceneResponse, SubjectSignal};
use crate::sensitivities::{CameraSensitivities, SharedCamera};
use crate::training::TrainingSet;
use crate::white_balance::{ResolvedWhiteBalance, WhiteBalance, resolve_white_balance};
use lampwright_color::adaptation::apply_matrix;
use lampwright_color::delta_e::{ciede2000_surely_at_least, delta_e_ciede2000_many};
use lampwright_color::observer::Observer;
use lampwright_color::spaces::Lab;
use lampwright_color::{Reflectance, RelativeSpd, Xyz};
use nalgebra::Matrix3;
use std::sync::Arc;

/// Two subjects match to the eye (or to the camera) below this CIEDE2000.
pub const METAMER_MATCH_DE: f64 = 1.0;
/// ... and differ to the other above this CIEDE2000.
pub const METAMER_DIFFER_DE: f64 = 3.0;

/// How the simulated camera is set up.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, serde::Deserialize)]
#[serde(default)]
pub struct CameraSettings {
    /// White balance.
    pub white_balance: WhiteBalance,
    /// Which colour correction is used.
    pub matrix_mode: MatrixMode,
    /// How corrections are fitted.
    pub fit_method: FitMethod,
    /// Display for the swatches.
    pub display: DisplaySpace,
}

/// One subject seen by the eye and by the camera.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SubjectComparison {
    /// Camera raw `[R, G, B]`, perfect white at G = 1.
    pub raw_rgb: [f64; 3],
    /// After white-balance gains.
    pub balanced_rgb: [f64; 3],
    /// Eye: XYZ as lit, perfect white at Y = 1, no adaptation.
    pub eye_xyz_as_lit: Xyz,
    /// Eye: XYZ adapted to D65 (CAT16 from the scene white).
    pub eye_xyz: Xyz,
    /// Camera: XYZ after white balance and colour correction (D65 white, Y = 1).
    pub camera_xyz: Xyz,
    /// CIELAB of `eye_xyz_as_lit` against D65.
    pub eye_lab_as_lit: Lab,
    /// CIELAB of `eye_xyz` against D65.
    pub eye_lab: Lab,
    /// CIELAB of `camera_xyz` against D65.
    pub camera_lab: Lab,
    /// Display colour of the eye's adapted colour.
    pub eye_display: DisplayColor,
    /// Display colour of the eye's as-lit colour.
    pub eye_display_as_lit: DisplayColor,
    /// Display colour of the camera's rendering.
    pub camera_display: DisplayColor,
    /// CIEDE2000 between `eye_lab` and `camera_lab`.
    pub delta_e_ciede2000: f64,
}

/// The result of comparing a set of subjects.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Comparison {
    /// Per subject, in input order.
    pub subjects: Vec<SubjectComparison>,
    /// The white balance used.
    pub white_balance: ResolvedWhiteBalance,
    /// The CCT the camera infers from its white balance (its own white locus), K.
    pub estimated_cct_k: Option<f64>,
    /// The colour correction used.
    pub correction: ColorCorrection,
    /// Mean / 90th percentile / max of the subjects' CIEDE2000 (`None` without subjects).
    pub delta_e_stats: Option<DeltaEStats>,
}

#[derive(Debug, Clone)]
enum Corrections {
    Single(Arc<ColorCorrection>),
    Dual {
        a: Arc<ColorCorrection>,
        d65: Arc<ColorCorrection>,
    },
}

/// A camera set up under one scene light, ready to compare subjects.
#[derive(Debug, Clone)]
pub struct CameraPipeline {
    camera: SharedCamera,
    settings: CameraSettings,
    /// Light × curves, when set up from the light's spectrum.
    scene: Option<SceneResponse>,
    /// The perfect white under the scene light (G = 1, Y = 1).
    scene_white: SubjectSignal,
    locus: Arc<CameraLocus>,
    fixed_white_balance: Option<ResolvedWhiteBalance>,
    corrections: Corrections,
    eye_to_d65: Matrix3<f64>,
    white: Xyz,
    display: DisplayTransform,
}

impl CameraPipeline {
    /// Set up `camera` with `settings` under `scene_light` (the relative SPD
    /// reaching the subjects, lamps mixed and gels applied). Corrections are
    /// fitted on `training`; factory and dual-illuminant ones are cached for
    /// the run, a scene profile is fitted here.
    pub fn new(
        camera: &CameraSensitivities,
        settings: &CameraSettings,
        scene_light: &RelativeSpd,
        training: &TrainingSet,
    ) -> Result<CameraPipeline> {
        let scene = SceneResponse::new(camera, scene_light, Observer::cie1931_2deg())?;
        let profile = if settings.matrix_mode == MatrixMode::SceneProfile {
            Some(Arc::new(fit_under_light(
                camera,
                scene_light,
                settings.fit_method,
                training,
            )?))
        } else {
            None
        };
        let white = scene.white();
        let shared = SharedCamera::from(camera.clone());
        CameraPipeline::set_up(&shared, settings, Some(scene), white, profile, training)
    }

    /// Set up `camera` from signals already integrated under the scene light
    /// (for instance mixed from each lamp's [`crate::raw::SignalSums`]): the
    /// light's perfect white `scene_white` (G = 1, Y = 1) and, for a scene
    /// profile, the training samples at the same exposure (`training_signals`,
    /// in the order of `training`). Equal to [`CameraPipeline::new`] under
    /// that light up to rounding. A pipeline set up this way compares
    /// signals only ([`CameraPipeline::compare`] refuses reflectances).
    pub fn from_signals(
        camera: &SharedCamera,
        settings: &CameraSettings,
        scene_white: SubjectSignal,
        training_signals: Option<&[SubjectSignal]>,
        training: &TrainingSet,
    ) -> Result<CameraPipeline> {
        let profile = if settings.matrix_mode == MatrixMode::SceneProfile {
            let signals = training_signals.ok_or_else(|| {
                CameraError::InvalidInput(
                    "a scene profile needs the training samples' signals under the scene light"
                        .into(),
                )
            })?;
            if signals.len() != training.len() {
                return Err(CameraError::InvalidInput(format!(
                    "{} training signals for a training set of {}",
                    signals.len(),
                    training.len()
                )));
            }
            let data = calibration_data_from_signals(scene_white, signals)?;
            Some(Arc::new(fit_color_correction(settings.fit_method, &data)?))
        } else {
            None
        };
        CameraPipeline::set_up(camera, settings, None, scene_white, profile, training)
    }

    fn set_up(
        camera: &SharedCamera,
        settings: &CameraSettings,
        scene: Option<SceneResponse>,
        scene_white: SubjectSignal,
        profile: Option<Arc<ColorCorrection>>,
        training: &TrainingSet,
    ) -> Result<CameraPipeline> {
        let locus = CameraLocus::for_shared(camera)?;
        let fixed_white_balance = if settings.white_balance.depends_on_subjects() {
            None
        } else {
            Some(resolve_white_balance(
                &settings.white_balance,
                camera.curves(),
                scene_white.raw_rgb,
                &[],
            )?)
        };
        let method = settings.fit_method;
        let corrections = match (settings.matrix_mode, profile) {
            (MatrixMode::SceneProfile, Some(p)) => Corrections::Single(p),
            (MatrixMode::DualIlluminant, _) => Corrections::Dual {
                a: calibrated_correction_shared(camera, CalibrationLight::A, method, training)?,
                d65: calibrated_correction_shared(camera, CalibrationLight::D65, method, training)?,
            },
            _ => Corrections::Single(calibrated_correction_shared(
                camera,
                CalibrationLight::D65,
                method,
                training,
            )?),
        };
        Ok(CameraPipeline {
            camera: camera.clone(),
            settings: *settings,
            eye_to_d65: cat16_to_d65(scene_white.xyz)?,
            scene,
            scene_white,
            locus,
            fixed_white_balance,
            corrections,
            white: d65_white()?,
            display: DisplayTransform::new(settings.display)?,
        })
    }

    /// The settings this pipeline was built with.
    #[must_use]
    pub fn settings(&self) -> &CameraSettings {
        &self.settings
    }

    /// The scene response (raw and XYZ integration) this pipeline uses;
    /// `None` when it was set up from signals.
    #[must_use]
    pub fn scene(&self) -> Option<&SceneResponse> {
        self.scene.as_ref()
    }

    /// Compare subjects given as reflectances.
    pub fn compare(&self, reflectances: &[Reflectance]) -> Result<Comparison> {
        let scene = self.scene.as_ref().ok_or_else(|| {
            CameraError::InvalidInput(
                "this camera was set up from signals: compare signals, not reflectances".into(),
            )
        })?;
        self.compare_signals(&scene.subjects(reflectances))
    }

    /// Compare subjects whose signals were already integrated under the
    /// scene light (perfect white at G = 1, Y = 1), with the white balance
    /// estimated from these subjects (for automatic modes).
    pub fn compare_signals(&self, signals: &[SubjectSignal]) -> Result<Comparison> {
        self.compare_signals_balanced(signals, self.white_balance_for(signals)?)
    }

    /// The white balance the camera sets for a frame whose subjects give
    /// `frame` (every subject the camera sees, each at its own exposure).
    /// Fixed modes ignore `frame`; grey world and brightest neutral estimate
    /// from all of it; a grey card is looked for in it.
    pub fn white_balance_for(&self, frame: &[SubjectSignal]) -> Result<ResolvedWhiteBalance> {
        match self.fixed_white_balance {
            Some(wb) => Ok(wb),
            None => resolve_white_balance(
                &self.settings.white_balance,
                self.camera.curves(),
                self.scene_white.raw_rgb,
                frame,
            ),
        }
    }

    /// The CCT the camera infers from `white_balance` (its locus) and the
    /// colour correction it then applies.
    pub fn correction_for(
        &self,
        white_balance: ResolvedWhiteBalance,
    ) -> Result<(Option<f64>, ColorCorrection)> {
        let estimated_cct_k = self
            .locus
            .nearest(white_balance.gains.neutral_raw())
            .map(|m| m.cct_k);
        let correction = match &self.corrections {
            Corrections::Single(c) => **c,
            Corrections::Dual { a, d65 } => {
                ColorCorrection::blend(a, d65, estimated_cct_k.map_or(1.0, dual_illuminant_weight))?
            }
        };
        Ok((estimated_cct_k, correction))
    }

    /// Compare subjects with a white balance already chosen for the frame
    /// (see [`CameraPipeline::white_balance_for`]), as one frame is shot:
    /// every part of it through the same gains and matrix.
    pub fn compare_signals_balanced(
        &self,
        signals: &[SubjectSignal],
        white_balance: ResolvedWhiteBalance,
    ) -> Result<Comparison> {
        self.compare_signals_corrected(signals, white_balance, self.correction_for(white_balance)?)
    }

    /// [`CameraPipeline::compare_signals_balanced`] with the inferred CCT and
    /// correction already found by [`CameraPipeline::correction_for`] for
    /// `white_balance` (one frame shot in parts: find them once).
    pub fn compare_signals_corrected(
        &self,
        signals: &[SubjectSignal],
        white_balance: ResolvedWhiteBalance,
        (estimated_cct_k, correction): (Option<f64>, ColorCorrection),
    ) -> Result<Comparison> {
        // Per subject: balance and matrix (camera), adaptation (eye); then the
        // CIELAB conversions and CIEDE2000 of all subjects at once.
        let balanced: Vec<[f64; 3]> = signals
            .iter()
            .map(|s| white_balance.gains.apply(s.raw_rgb))
            .collect();
        let camera_xyz: Vec<Xyz> = balanced
            .iter()
            .map(|rgb| Xyz::from_array(correction.apply(*rgb)))
            .collect();
        let eye_xyz: Vec<Xyz> = signals
            .iter()
            .map(|s| apply_matrix(&self.eye_to_d65, s.xyz))
            .collect();
        let as_lit: Vec<Xyz> = signals.iter().map(|s| s.xyz).collect();
        let n = signals.len();
        let all: Vec<Xyz> = [&camera_xyz, &eye_xyz, &as_lit]
            .into_iter()
            .flatten()
            .copied()
            .collect();
        let labs = Lab::many_from_xyz(&all, self.white);
        let (camera_lab, rest) = labs.split_at(n);
        let (eye_lab, eye_lab_as_lit) = rest.split_at(n);
        let pairs: Vec<(Lab, Lab)> = eye_lab
            .iter()
            .copied()
            .zip(camera_lab.iter().copied())
            .collect();
        let delta_e = delta_e_ciede2000_many(&pairs);
        let subjects: Vec<SubjectComparison> = (0..signals.len())
            .map(|i| SubjectComparison {
                raw_rgb: signals[i].raw_rgb,
                balanced_rgb: balanced[i],
                eye_xyz_as_lit: as_lit[i],
                eye_xyz: eye_xyz[i],
                camera_xyz: camera_xyz[i],
                eye_lab_as_lit: eye_lab_as_lit[i],
                eye_lab: eye_lab[i],
                camera_lab: camera_lab[i],
                eye_display: self.display.color(eye_xyz[i]),
                eye_display_as_lit: self.display.color(as_lit[i]),
                camera_display: self.display.color(camera_xyz[i]),
                delta_e_ciede2000: delta_e[i],
            })
            .collect();
        let des: Vec<f64> = subjects.iter().map(|s| s.delta_e_ciede2000).collect();
        Ok(Comparison {
            subjects,
            white_balance,
            estimated_cct_k,
            correction,
            delta_e_stats: DeltaEStats::of(&des),
        })
    }
}

/// A pair of subjects that one viewer sees as matching and the other does not.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct MetamerPair {
    /// Index of the first subject.
    pub first: usize,
    /// Index of the second subject (greater than `first`).
    pub second: usize,
    /// CIEDE2000 between them for the eye (adapted).
    pub delta_e_eye: f64,
    /// CIEDE2000 between them for the camera.
    pub delta_e_camera: f64,
}

/// Camera metamers of a comparison.
#[derive(Debug, Clone, PartialEq, Default, serde::Serialize, serde::Deserialize)]
pub struct CameraMetamers {
    /// Match to the eye (ΔE00 < 1) but differ to the camera (ΔE00 > 3).
    pub eye_matches_camera_splits: Vec<MetamerPair>,
    /// Match to the camera (ΔE00 < 1) but differ to the eye (ΔE00 > 3).
    pub camera_matches_eye_splits: Vec<MetamerPair>,
}

/// Find camera metamers among the compared subjects (all pairs; thresholds
/// [`METAMER_MATCH_DE`] and [`METAMER_DIFFER_DE`]).
#[must_use]
pub fn camera_metamers(subjects: &[SubjectComparison]) -> CameraMetamers {
    // A pair matters only when one viewer sees a match (ΔE00 below the match
    // threshold); pairs whose lightness alone puts both differences at or
    // above it are screened out, and the rest are measured together.
    let eye: Vec<Lab> = subjects.iter().map(|s| s.eye_lab).collect();
    let camera: Vec<Lab> = subjects.iter().map(|s| s.camera_lab).collect();
    let mut candidates = Vec::new();
    for labs in [&eye, &camera] {
        for (i, j) in lightness_neighbours(labs, METAMER_MATCH_DE) {
            if !ciede2000_surely_at_least(labs[i], labs[j], METAMER_MATCH_DE) {
                candidates.push((i, j));
            }
        }
    }
    candidates.sort_unstable();
    candidates.dedup();
    let pairs: Vec<(Lab, Lab)> = candidates
        .iter()
        .flat_map(|&(i, j)| {
            let (a, b) = (&subjects[i], &subjects[j]);
            [(a.eye_lab, b.eye_lab), (a.camera_lab, b.camera_lab)]
        })
        .collect();
    let delta_e = delta_e_ciede2000_many(&pairs);
    let mut out = CameraMetamers::default();
    for (&(first, second), de) in candidates.iter().zip(delta_e.chunks_exact(2)) {
        let pair = MetamerPair {
            first,
            second,
            delta_e_eye: de[0],
            delta_e_camera: de[1],
        };
        if pair.delta_e_eye < METAMER_MATCH_DE && pair.delta_e_camera > METAMER_DIFFER_DE {
            out.eye_matches_camera_splits.push(pair);
        } else if pair.delta_e_camera < METAMER_MATCH_DE && pair.delta_e_eye > METAMER_DIFFER_DE {
            out.camera_matches_eye_splits.push(pair);
        }
    }
    out
}

/// The pairs `(i, j)`, `i < j`, that [`ciede2000_surely_at_least`] might not
/// rule out at `threshold`: those whose lightness differs by less than the
/// screen's widest bound over these colours, found by sorting on L* instead
/// of trying every pair. All pairs when some lightness is not finite.
fn lightness_neighbours(labs: &[Lab], threshold: f64) -> Vec<(usize, usize)> {
    let n = labs.len();
    let farthest = labs.iter().map(|c| (c.l - 50.0).abs()).fold(0.0, f64::max);
    let window = threshold * (1.0 + 0.015 * farthest) * (1.0 + 1e-12);
    if !(window.is_finite() && labs.iter().all(|c| c.l.is_finite())) {
        return (0..n)
            .flat_map(|i| (i + 1..n).map(move |j| (i, j)))
            .collect();
    }
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_unstable_by(|&a, &b| labs[a].l.total_cmp(&labs[b].l));
    let mut out = Vec::new();
    for (k, &a) in order.iter().enumerate() {
        for &b in &order[k + 1..] {
            if labs[b].l - labs[a].l >= window {
                break;
            }
            out.push((a.min(b), a.max(b)));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::white_balance::WbPreset;
    use lampwright_color::illuminant::StandardIlluminant;

    fn demo(i: usize) -> CameraSensitivities {
        CameraSensitivities::demo_cameras().unwrap()[i].clone()
    }

    #[test]
    fn set_up_from_mixed_signals_equals_set_up_from_the_light() {
        use crate::raw::SignalSums;
        let t = TrainingSet::standard().unwrap();
        let cam = demo(1);
        let obs = Observer::cie1931_2deg();
        let a = StandardIlluminant::A.spd().unwrap();
        let f11 = StandardIlluminant::F(11).spd().unwrap();
        let light = RelativeSpd::weighted_sum([(0.6, &a), (1.7, &f11)]);
        let subjects = [
            Reflectance::from_fn(|_| 0.18),
            Reflectance::from_fn(|wl| 0.1 + 0.7 * (-((wl - 610.0) / 40.0).powi(2)).exp()),
            Reflectance::from_fn(|wl| 0.05 + 0.5 * (-((wl - 470.0) / 30.0).powi(2)).exp()),
        ];
        let mix = |set: &[Reflectance]| {
            let [pa, pf] = [&a, &f11].map(|l| SignalSums::of(&cam, l.values(), obs, set));
            SignalSums::mix(&[(0.6, &pa), (1.7, &pf)]).unwrap()
        };
        let subject_sums = mix(&subjects);
        let training_sums = mix(t.reflectances());
        let scale = subject_sums.scale();
        for matrix_mode in [MatrixMode::Factory, MatrixMode::SceneProfile] {
            let settings = CameraSettings {
                white_balance: WhiteBalance::GreyCard { subject: Some(0) },
                matrix_mode,
                ..CameraSettings::default()
            };
            let direct = CameraPipeline::new(&cam, &settings, &light, t)
                .unwrap()
                .compare(&subjects)
                .unwrap();
            let p = CameraPipeline::from_signals(
                &SharedCamera::from(cam.clone()),
                &settings,
                subject_sums.white_signal(),
                Some(&training_sums.signals(scale)),
                t,
            )
            .unwrap();
            assert!(p.compare(&subjects).is_err(), "reflectances are refused");
            let via = p.compare_signals(&subject_sums.signals(scale)).unwrap();
            for (d, v) in direct.subjects.iter().zip(&via.subjects) {
                assert!(
                    (d.delta_e_ciede2000 - v.delta_e_ciede2000).abs() < 1e-9,
                    "{matrix_mode:?}: {} {}",
                    d.delta_e_ciede2000,
                    v.delta_e_ciede2000
                );
                assert!((d.camera_lab.a - v.camera_lab.a).abs() < 1e-9);
            }
        }
        let profile = CameraSettings {
            matrix_mode: MatrixMode::SceneProfile,
            ..CameraSettings::default()
        };
        let white = subject_sums.white_signal();
        let shared = SharedCamera::from(cam.clone());
        assert!(CameraPipeline::from_signals(&shared, &profile, white, None, t).is_err());
        assert!(CameraPipeline::from_signals(&shared, &profile, white, Some(&[white]), t).is_err());
    }

    #[test]
    fn perfect_white_renders_white_for_both() {
        let t = TrainingSet::standard().unwrap();
        for mode in [
            MatrixMode::Factory,
            MatrixMode::DualIlluminant,
            MatrixMode::SceneProfile,
        ] {
            let settings = CameraSettings {
                matrix_mode: mode,
                ..CameraSettings::default()
            };
            let p = CameraPipeline::new(
                &demo(0),
                &settings,
                &StandardIlluminant::F(11).spd().unwrap(),
                t,
            )
            .unwrap();
            let c = p.compare(&[Reflectance::perfect_white()]).unwrap();
            let s = &c.subjects[0];
            assert!(
                (s.eye_lab.l - 100.0).abs() < 1e-9
                    && s.eye_lab.a.abs() < 1e-9
                    && s.eye_lab.b.abs() < 1e-9
            );
            assert!(
                s.delta_e_ciede2000 < 1e-6,
                "{mode:?}: {}",
                s.delta_e_ciede2000
            );
            // As lit under F11 (about 4000 K), the white is yellowish against D65.
            assert!(s.eye_lab_as_lit.b > 5.0);
        }
    }

    #[test]
    fn wrong_preset_gives_a_cast_and_dual_follows_estimate() {
        let t = TrainingSet::standard().unwrap();
        let a = StandardIlluminant::A.spd().unwrap();
        let settings = CameraSettings {
            white_balance: WhiteBalance::Preset {
                preset: WbPreset::Daylight,
            },
            matrix_mode: MatrixMode::DualIlluminant,
            ..CameraSettings::default()
        };
        let p = CameraPipeline::new(&demo(1), &settings, &a, t).unwrap();
        let c = p.compare(&[Reflectance::from_fn(|_| 0.5)]).unwrap();
        // Daylight balance under tungsten: warm (b* > 0, clearly visible).
        assert!(c.subjects[0].camera_lab.b > 20.0 && c.subjects[0].delta_e_ciede2000 > 10.0);
        // The camera believes the light is D55: its estimate is near 5500 K.
        let cct = c.estimated_cct_k.unwrap();
        assert!((cct - 5503.0).abs() < 150.0, "{cct}");
    }

    #[test]
    fn subject_dependent_white_balance_is_resolved_per_call() {
        let t = TrainingSet::standard().unwrap();
        let settings = CameraSettings {
            white_balance: WhiteBalance::GreyCard { subject: Some(1) },
            ..CameraSettings::default()
        };
        let p = CameraPipeline::new(
            &demo(2),
            &settings,
            &StandardIlluminant::D50.spd().unwrap(),
            t,
        )
        .unwrap();
        assert!(p.compare(&[Reflectance::perfect_white()]).is_err());
        let c = p
            .compare(&[Reflectance::perfect_white(), Reflectance::from_fn(|_| 0.18)])
            .unwrap();
        assert_eq!(c.white_balance.reference_subject, Some(1));
        assert!(c.delta_e_stats.is_some());
    }

    /// A comparison that carries only the two CIELAB colours metamers use.
    fn mk(eye: Lab, cam: Lab) -> SubjectComparison {
        let dc = DisplayTransform::new(DisplaySpace::Srgb)
            .unwrap()
            .color(Xyz::default());
        SubjectComparison {
            raw_rgb: [0.0; 3],
            balanced_rgb: [0.0; 3],
            eye_xyz_as_lit: Xyz::default(),
            eye_xyz: Xyz::default(),
            camera_xyz: Xyz::default(),
            eye_lab_as_lit: eye,
            eye_lab: eye,
            camera_lab: cam,
            eye_display: dc,
            eye_display_as_lit: dc,
            camera_display: dc,
            delta_e_ciede2000: 0.0,
        }
    }

    /// A reproducible stream of numbers in [0, 1) (xorshift64).
    fn uniform(mut seed: u64) -> impl FnMut() -> f64 {
        move || {
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed >> 11) as f64 / (1u64 << 53) as f64
        }
    }

    #[test]
    fn screened_metamer_search_finds_what_checking_every_pair_finds() {
        // Colours in tight clusters (near matches for one viewer or both) and
        // spread over lightness, so that screening skips most pairs.
        let mut next = uniform(0x2545_F491_4F6C_DD1Du64);
        let subjects: Vec<SubjectComparison> = (0..60)
            .map(|i| {
                let l = 20.0 + 6.0 * f64::from(i % 12);
                let tight = Lab::new(l + next(), 10.0 + 2.0 * next(), -5.0 + 2.0 * next());
                let loose = Lab::new(l + 4.0 * next(), 10.0 + 8.0 * next(), -5.0 + 8.0 * next());
                // Half the subjects tight to the eye, half tight to the camera.
                if i % 2 == 0 {
                    mk(tight, loose)
                } else {
                    mk(loose, tight)
                }
            })
            .collect();
        let got = camera_metamers(&subjects);
        let mut want = CameraMetamers::default();
        for (i, a) in subjects.iter().enumerate() {
            for (j, b) in subjects.iter().enumerate().skip(i + 1) {
                let eye = lampwright_color::delta_e::delta_e_ciede2000(a.eye_lab, b.eye_lab);
                let cam = lampwright_color::delta_e::delta_e_ciede2000(a.camera_lab, b.camera_lab);
                let pair = MetamerPair {
                    first: i,
                    second: j,
                    delta_e_eye: eye,
                    delta_e_camera: cam,
                };
                if eye < METAMER_MATCH_DE && cam > METAMER_DIFFER_DE {
                    want.eye_matches_camera_splits.push(pair);
                } else if cam < METAMER_MATCH_DE && eye > METAMER_DIFFER_DE {
                    want.camera_matches_eye_splits.push(pair);
                }
            }
        }
        assert!(!want.eye_matches_camera_splits.is_empty());
        assert!(!want.camera_matches_eye_splits.is_empty());
        for (g, w) in [
            (
                &got.eye_matches_camera_splits,
                &want.eye_matches_camera_splits,
            ),
            (
                &got.camera_matches_eye_splits,
                &want.camera_matches_eye_splits,
            ),
        ] {
            assert_eq!(g.len(), w.len());
            for (g, w) in g.iter().zip(w.iter()) {
                assert_eq!((g.first, g.second), (w.first, w.second));
                assert!((g.delta_e_eye - w.delta_e_eye).abs() < 1e-12);
                assert!((g.delta_e_camera - w.delta_e_camera).abs() < 1e-12);
            }
        }
    }

    #[test]
    fn lightness_window_keeps_every_pair_the_screen_might_pass() {
        let mut next = uniform(0x9E37_79B9_7F4A_7C15u64);
        // Lightness beyond 0–100 too (bright camera renderings), in clusters.
        let labs: Vec<Lab> = (0..80)
            .map(|i| Lab::new(-10.0 + 14.0 * f64::from(i % 10) + 2.0 * next(), 0.0, 0.0))
            .collect();
        let kept = lightness_neighbours(&labs, METAMER_MATCH_DE);
        let mut might = 0;
        for i in 0..labs.len() {
            for j in i + 1..labs.len() {
                if !ciede2000_surely_at_least(labs[i], labs[j], METAMER_MATCH_DE) {
                    might += 1;
                    assert!(kept.contains(&(i, j)), "pair ({i}, {j}) dropped");
                }
            }
        }
        assert!(might > 0 && kept.len() < labs.len() * (labs.len() - 1) / 2);
        let mut bad = labs[..4].to_vec();
        bad[2].l = f64::NAN;
        assert_eq!(lightness_neighbours(&bad, METAMER_MATCH_DE).len(), 6);
    }

    #[test]
    fn metamers_are_found_both_ways() {
        let s = [
            mk(Lab::new(50.0, 10.0, 10.0), Lab::new(50.0, 10.0, 10.0)),
            mk(Lab::new(50.2, 10.0, 10.0), Lab::new(50.0, 20.0, 10.0)), // eye match, camera split
            mk(Lab::new(70.0, -20.0, 0.0), Lab::new(50.1, 10.0, 10.0)), // camera matches 0, eye splits
        ];
        let m = camera_metamers(&s);
        assert_eq!(m.eye_matches_camera_splits.len(), 1);
        assert_eq!(
            (
                m.eye_matches_camera_splits[0].first,
                m.eye_matches_camera_splits[0].second
            ),
            (0, 1)
        );
        assert_eq!(m.camera_matches_eye_splits.len(), 1);
        assert_eq!(
            (
                m.camera_matches_eye_splits[0].first,
                m.camera_matches_eye_splits[0].second
            ),
            (0, 2)
        );
    }
}
