//! The camera stage of the evaluation: one white balance and one matrix for
//! the whole frame (matrix and eye adaptation from the main zone's light,
//! automatic white balance metered over every zone), then every subject in
//! every zone rendered eye versus camera.
//!
//! A zone other than the main one is rendered at its own exposure relative to
//! the main zone (its raw signal and its XYZ scaled by its light relative to
//! the main light), with the camera's white balance and matrix and the eye's
//! adaptation unchanged — as one frame is shot and seen.

use crate::error::Result;
use crate::evaluation::{CameraFigures, MetamerPair, SubjectResult};
use crate::model::{
    Adaptation, CameraRef, Display, FitMethod, MatrixMode, Plan, WbPreset, WhiteBalanceSetting,
};
use crate::resolve::ResolvedSubject;
use lampwright_camera::display::DisplaySpace;
use lampwright_camera::pipeline::{
    CameraPipeline, CameraSettings, SubjectComparison, camera_metamers,
};
use lampwright_camera::quality::luther_and_mu;
use lampwright_camera::raw::{SignalSums, SubjectSignal};
use lampwright_camera::{CameraSensitivities, SharedCamera, TrainingSet, WhiteBalance};
use lampwright_color::rgb::rgb8_clamped_many;
use lampwright_color::spectrum::SpectralIrradiance;
use std::sync::Arc;

/// Below this (relative) a light counts as dark for the camera.
const DARK: f64 = 1e-12;

/// The camera set up for the frame.
pub struct CameraStage {
    /// Per zone, the subjects compared eye versus camera at that zone's
    /// exposure (all zones converted together, then split), with one white
    /// balance and one correction for the frame; empty when the main zone is
    /// dark (every subject renders black). Zone z holds
    /// `compared[z·n .. (z + 1)·n]` for the plan's n subjects.
    compared: Vec<SubjectComparison>,
    figures: CameraFigures,
}

/// The camera's quality figures, which depend on its sensitivities alone.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CameraQuality {
    /// Luther residual.
    pub luther_residual: f64,
    /// Vora–Trussell µ-factor.
    pub mu_factor: f64,
}

impl CameraQuality {
    /// Compute them for `camera`.
    pub fn of(camera: &CameraSensitivities) -> Result<CameraQuality> {
        let (luther_residual, mu_factor) = luther_and_mu(camera)?;
        Ok(CameraQuality {
            luther_residual,
            mu_factor,
        })
    }
}

/// A camera pipeline set up under one main light, kept for reuse while the
/// camera, its settings and that light stay the same.
pub struct PipelineEntry {
    camera: CameraRef,
    settings: CameraSettings,
    light: Vec<f64>,
    pipeline: Arc<CameraPipeline>,
}

/// Pipelines kept at most.
const PIPELINES_KEPT: usize = 8;

/// What the camera stage keeps between evaluations of a plan being edited:
/// pipelines by camera, settings and main light, and the camera's curves as
/// shown. A plan whose embedded library changes needs a new cache (the keys
/// name library entries).
#[derive(Default)]
pub struct CameraCache {
    pipelines: Vec<PipelineEntry>,
    shown_curves: Option<(CameraRef, Arc<[Vec<f64>; 3]>)>,
}

/// A zone's light as the camera stage needs it.
pub struct ZoneLight<'a> {
    /// The mixed spectrum at the subject.
    pub spectrum: &'a SpectralIrradiance,
    /// The subjects' camera and eye sums under it (plan order); `None` when
    /// no source is lit in the zone.
    pub subjects: Option<&'a SignalSums>,
}

/// One zone rendered.
pub struct Rendered {
    /// Per subject, plan order.
    pub subjects: Vec<SubjectResult>,
    /// Camera metamers among them.
    pub metamers: Vec<MetamerPair>,
}

fn camera_settings(plan: &Plan) -> CameraSettings {
    let c = &plan.camera;
    let white_balance = match &c.white_balance {
        WhiteBalanceSetting::Kelvin(k) => WhiteBalance::Kelvin { cct_k: *k },
        WhiteBalanceSetting::Preset(p) => WhiteBalance::Preset {
            preset: match p {
                WbPreset::Daylight => lampwright_camera::WbPreset::Daylight,
                WbPreset::Cloudy => lampwright_camera::WbPreset::Cloudy,
                WbPreset::Shade => lampwright_camera::WbPreset::Shade,
                WbPreset::Tungsten => lampwright_camera::WbPreset::Tungsten,
                WbPreset::Fluorescent => lampwright_camera::WbPreset::Fluorescent,
            },
        },
        WhiteBalanceSetting::GreyCard => WhiteBalance::GreyCard { subject: None },
        WhiteBalanceSetting::AutoGreyWorld => WhiteBalance::GreyWorld,
        WhiteBalanceSetting::AutoBrightestNeutral => WhiteBalance::BrightestNeutral,
    };
    CameraSettings {
        white_balance,
        matrix_mode: match c.matrix {
            MatrixMode::Factory => lampwright_camera::MatrixMode::Factory,
            MatrixMode::DualIlluminant => lampwright_camera::MatrixMode::DualIlluminant,
            MatrixMode::SceneProfile => lampwright_camera::MatrixMode::SceneProfile,
        },
        fit_method: match c.fit {
            FitMethod::Linear => lampwright_camera::FitMethod::Linear,
            FitMethod::WhitePreserving => lampwright_camera::FitMethod::WhitePreserving,
            FitMethod::De2000 => lampwright_camera::FitMethod::De2000 {
                preserve_white: true,
            },
            FitMethod::RootPoly => lampwright_camera::FitMethod::RootPolynomial,
        },
        display: match plan.viewing.display {
            Display::Srgb => DisplaySpace::Srgb,
            Display::DisplayP3 => DisplaySpace::DisplayP3,
        },
    }
}

fn peak_normalised(values: &[f64]) -> Vec<f64> {
    let peak = values.iter().copied().fold(0.0, f64::max);
    if peak > 0.0 {
        values.iter().map(|v| v / peak).collect()
    } else {
        values.to_vec()
    }
}

/// Raw G and Y of a zone's light when the camera and the eye both see it
/// (lit, colorimetric); `None` for a dark zone.
fn zone_scale(zone: &ZoneLight<'_>, what: &str) -> Option<(f64, f64)> {
    let (raw_g, y) = zone.subjects?.scale();
    (raw_g > DARK && y > DARK && zone.spectrum.check_colorimetric(what).is_ok())
        .then_some((raw_g, y))
}

impl CameraStage {
    /// Set the camera up for the frame: pipeline (matrix, eye adaptation)
    /// under the main zone's light (`zones[0]`), and one white balance for
    /// the whole frame. Automatic white balance (grey world, brightest
    /// neutral) is estimated from every subject in every zone, each at its
    /// zone's exposure, as a camera meters the whole frame; a grey card is
    /// read where the key light is, in the main zone.
    ///
    /// `shared` and `quality` are the plan's camera and its quality figures;
    /// `main_training` the training samples' sums under the main light
    /// (needed for a scene profile); `cache` keeps pipelines between
    /// evaluations (pass a new one to set up afresh).
    pub fn new(
        plan: &Plan,
        shared: &SharedCamera,
        quality: CameraQuality,
        zones: &[ZoneLight<'_>],
        main_training: Option<&SignalSums>,
        cache: &mut CameraCache,
    ) -> Result<CameraStage> {
        let settings = camera_settings(plan);
        let camera = shared.curves();
        let shown = match &cache.shown_curves {
            Some((r, curves)) if *r == plan.camera.camera => Arc::clone(curves),
            _ => {
                let channels = camera.channels();
                let curves = Arc::new([0, 1, 2].map(|i| peak_normalised(channels[i].values())));
                cache.shown_curves = Some((plan.camera.camera.clone(), Arc::clone(&curves)));
                curves
            }
        };
        let mut figures = CameraFigures {
            name: camera.name.clone(),
            sensitivities: shown,
            luther_residual: quality.luther_residual,
            mu_factor: quality.mu_factor,
            wb_gains: [1.0; 3],
            wb_cct_k: None,
            matrix: [[0.0; 3]; 3],
        };
        let dark = |figures| CameraStage {
            compared: Vec::new(),
            figures,
        };
        let Some(main_zone) = zones.first() else {
            return Ok(dark(figures));
        };
        let (Some(main_scale), Some(main_sums)) =
            (zone_scale(main_zone, "the main zone"), main_zone.subjects)
        else {
            return Ok(dark(figures));
        };
        let pipelines = &mut cache.pipelines;
        let light = main_zone.spectrum.values();
        let cached = pipelines.iter().position(|e| {
            e.camera == plan.camera.camera
                && e.settings == settings
                && e.light.as_slice() == light.as_slice()
        });
        let pipeline = if let Some(i) = cached {
            Arc::clone(&pipelines[i].pipeline)
        } else {
            let training = main_training.map(|t| t.signals(main_scale));
            let p = Arc::new(CameraPipeline::from_signals(
                shared,
                &settings,
                main_sums.white_signal(),
                training.as_deref(),
                TrainingSet::standard()?,
            )?);
            if pipelines.len() >= PIPELINES_KEPT {
                pipelines.remove(0);
            }
            pipelines.push(PipelineEntry {
                camera: plan.camera.camera.clone(),
                settings,
                light: light.to_vec(),
                pipeline: Arc::clone(&p),
            });
            p
        };
        let n = plan.subjects.len();
        let zone_signals: Vec<Vec<SubjectSignal>> = zones
            .iter()
            .map(|z| match (zone_scale(z, "zone"), z.subjects) {
                (Some(_), Some(sums)) => sums.signals(main_scale),
                _ => vec![SubjectSignal::default(); n],
            })
            .collect();
        let frame: Vec<SubjectSignal> = zone_signals.iter().flatten().copied().collect();
        let white_balance = if matches!(settings.white_balance, WhiteBalance::GreyCard { .. }) {
            pipeline.white_balance_for(&zone_signals[0])?
        } else {
            pipeline.white_balance_for(&frame)?
        };
        let found = pipeline.correction_for(white_balance)?;
        // Every zone's subjects in one batch (one pass of the vectorised
        // CIELAB and CIEDE2000 instead of one per zone), then split by zone.
        let compared = pipeline
            .compare_signals_corrected(&frame, white_balance, found)?
            .subjects;
        let (estimated_cct_k, correction) = found;
        let g = white_balance.gains;
        figures.wb_gains = [g.red, g.green, g.blue];
        figures.wb_cct_k = match settings.white_balance {
            WhiteBalance::Kelvin { cct_k } => Some(cct_k),
            _ => estimated_cct_k,
        };
        let rows = correction.rows();
        if rows.len() == 3 && rows.iter().all(|r| r.len() == 3) {
            figures.matrix = [0, 1, 2].map(|i| [rows[i][0], rows[i][1], rows[i][2]]);
        }
        Ok(CameraStage { compared, figures })
    }

    /// The camera's figures for the frame.
    #[must_use]
    pub fn figures(&self) -> &CameraFigures {
        &self.figures
    }

    /// Render every subject in zone `zone` (index into the lights the stage
    /// was set up with); look for camera metamers among them when `metamers`.
    pub fn render(
        &self,
        plan: &Plan,
        zone: usize,
        subjects: &[Arc<ResolvedSubject>],
        metamers: bool,
        warnings: &mut Vec<String>,
    ) -> Rendered {
        let n = subjects.len();
        let Some(compared) = self.compared.get(zone * n..(zone + 1) * n) else {
            return Rendered {
                subjects: subjects
                    .iter()
                    .enumerate()
                    .map(|(i, s)| black(plan, i, s))
                    .collect(),
                metamers: Vec::new(),
            };
        };
        let as_lit = plan.viewing.adaptation == Adaptation::AsLit;
        // 8-bit swatches of eye and camera for every subject at once.
        let linear: Vec<[f64; 3]> = compared
            .iter()
            .flat_map(|c| {
                let eye = if as_lit {
                    c.eye_display_as_lit
                } else {
                    c.eye_display
                };
                [
                    eye.linear_rgb_unclamped,
                    c.camera_display.linear_rgb_unclamped,
                ]
            })
            .collect();
        let rgb8 = rgb8_clamped_many(&linear);
        let results: Vec<SubjectResult> = compared
            .iter()
            .zip(subjects)
            .zip(rgb8.chunks_exact(2))
            .enumerate()
            .map(|(i, ((c, s), swatch))| result(plan, i, s, c, as_lit, [swatch[0], swatch[1]]))
            .collect();
        if results.iter().any(|r| !r.de2000.is_finite()) {
            warnings.push("a subject's colour difference could not be computed".into());
        }
        if !metamers {
            return Rendered {
                subjects: results,
                metamers: Vec::new(),
            };
        }
        let m = camera_metamers(compared);
        let name = |i: usize| {
            subjects
                .get(i)
                .map_or_else(|| Arc::from(""), |s| Arc::clone(&s.name))
        };
        let metamers = m
            .eye_matches_camera_splits
            .iter()
            .map(|p| (p, true))
            .chain(m.camera_matches_eye_splits.iter().map(|p| (p, false)))
            .map(|(p, eye_matches)| MetamerPair {
                a: name(p.first),
                b: name(p.second),
                eye_de2000: p.delta_e_eye,
                camera_de2000: p.delta_e_camera,
                eye_matches,
            })
            .collect();
        Rendered {
            subjects: results,
            metamers,
        }
    }
}

fn finite3(v: [f64; 3]) -> [f64; 3] {
    v.map(|x| if x.is_finite() { x } else { 0.0 })
}

fn result(
    plan: &Plan,
    index: usize,
    s: &ResolvedSubject,
    c: &SubjectComparison,
    as_lit: bool,
    [eye_rgb8, camera_rgb8]: [[u8; 3]; 2],
) -> SubjectResult {
    let (eye_lab, eye_display) = if as_lit {
        (c.eye_lab_as_lit, c.eye_display_as_lit)
    } else {
        (c.eye_lab, c.eye_display)
    };
    let de = if as_lit {
        lampwright_color::delta_e::delta_e_ciede2000(eye_lab, c.camera_lab)
    } else {
        c.delta_e_ciede2000
    };
    SubjectResult {
        index,
        name: Arc::clone(&s.name),
        group: Arc::clone(&s.group),
        included: plan.subjects.get(index).is_some_and(|e| e.included),
        eye_lab: finite3([eye_lab.l, eye_lab.a, eye_lab.b]),
        camera_lab: finite3([c.camera_lab.l, c.camera_lab.a, c.camera_lab.b]),
        eye_rgb8,
        camera_rgb8,
        eye_in_gamut: eye_display.in_gamut,
        camera_in_gamut: c.camera_display.in_gamut,
        de2000: if de.is_finite() { de } else { 0.0 },
    }
}

fn black(plan: &Plan, index: usize, s: &ResolvedSubject) -> SubjectResult {
    SubjectResult {
        index,
        name: Arc::clone(&s.name),
        group: Arc::clone(&s.group),
        included: plan.subjects.get(index).is_some_and(|e| e.included),
        eye_in_gamut: true,
        camera_in_gamut: true,
        ..SubjectResult::default()
    }
}
