//! The advisor: what to change on set — gels, levels, camera settings — to
//! reach one goal.
//!
//! [`advise`] searches the moves the kit allows ([`moves`]) for a [`Goal`]
//! ([`goal`]) with a fast linear model of the plan, then evaluates the best
//! distinct answers in full with [`crate::evaluate`], so every figure a
//! [`Suggestion`] shows ("after") is exactly what the plan gives once the
//! suggestion is applied with [`apply`]. Moves are worded as a crew says them
//! ([`wording`]). When nothing beats the plan as it stands by a worthwhile
//! margin, the advice says so.
//!
//! How the search works, and where it is exhaustive, is described in
//! `docs/methods.md` ("Advisor") and in the [`search`] module.

mod camera_path;
mod candidate;
pub mod goal;
mod linear;
pub mod moves;
mod quality_path;
mod report;
mod scoring;
mod search;
pub mod wording;

pub use camera_path::{KELVIN_MAX_K, KELVIN_MIN_K, KELVIN_STEP_K};
pub use goal::{
    DEFAULT_R9_FLOOR, DEFAULT_RG_MAX, DEFAULT_RG_MIN, DEFAULT_TOLERANCE_DUV,
    DEFAULT_TOLERANCE_MIRED, FidelityAggregate, Goal, QualityGoal, WhiteGoal, WhiteTarget,
};
pub use moves::{MAX_LAYERS_SEARCHED, Move, STRENGTH_STEPS, apply_moves, gel_moves};
pub use search::SearchMethod;

use crate::engine::evaluate;
use crate::error::{PlanError, Result};
use crate::model::{MatrixMode, Plan, SourceId, WhiteBalanceSetting};
use camera_path::{FastCamera, camera_options};
use linear::{Columns, LinearModel};
use quality_path::{FastQuality, QUALITY_WIDTH, QualitySamples};
use report::{Finalise, camera_moves, figures, pick_finalists};
use scoring::{ModelScorer, white_zones};
use search::SearchSettings;
use serde::Serialize;

/// With a screened sweep, how many of its best candidates by the proxy are
/// scored in full (the project's choice, checked against unscreened searches
/// in the tests).
const SCREEN_CONFIRM: usize = 8;

/// How the advisor searches.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AdvisorOptions {
    /// Most suggestions returned.
    pub max_suggestions: usize,
    /// How far a source's level may be raised above the plan's, stops (0: levels
    /// only go down — a plan does not say how much more a fixture can give).
    pub max_raise_stops: f64,
    /// Search every candidate when there are at most this many.
    pub exhaustive_limit: usize,
    /// Random restarts of the coordinate descent.
    pub restarts: usize,
    /// Most sweeps per descent.
    pub max_sweeps: usize,
    /// Seed of the restarts (the same seed gives the same advice).
    pub seed: u64,
    /// Knot spacing of the search model, nm (1 = exact 1 nm sums).
    pub knot_step_nm: usize,
    /// Let the advisor change the white balance and the matrix (fidelity goal).
    pub camera_moves: bool,
    /// Distinct candidates evaluated in full at the end.
    pub finalists: usize,
}

impl Default for AdvisorOptions {
    fn default() -> Self {
        AdvisorOptions {
            max_suggestions: 5,
            max_raise_stops: 0.0,
            exhaustive_limit: 20_000,
            restarts: 4,
            max_sweeps: 8,
            seed: 0x5EED_1A3B,
            knot_step_nm: 5,
            camera_moves: true,
            finalists: 8,
        }
    }
}

/// The goal zone's white against its target.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WhiteFigures {
    /// The zone's name.
    pub zone: String,
    /// Its CCT, K.
    pub cct_k: Option<f64>,
    /// Its Duv.
    pub duv: Option<f64>,
    /// Target CCT, K.
    pub target_cct_k: Option<f64>,
    /// Target Duv.
    pub target_duv: Option<f64>,
    /// Miss, mired (zone − target).
    pub mired_miss: Option<f64>,
    /// Miss, Duv (zone − target).
    pub duv_miss: Option<f64>,
    /// Within the goal's tolerance.
    pub within_tolerance: bool,
}

/// The figures shown before and after a suggestion (all from a full evaluation).
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct Figures {
    /// The goal's cost (lower is better): weighted or worst ΔE00, the white's
    /// miss in tolerance units, or −Rf plus penalties.
    pub goal_cost: Option<f64>,
    /// Mean CIEDE2000 eye vs camera over included subjects (main zone).
    pub mean_de2000: Option<f64>,
    /// Weighted mean CIEDE2000 (the plan's subject weights).
    pub weighted_mean_de2000: Option<f64>,
    /// Largest CIEDE2000.
    pub max_de2000: Option<f64>,
    /// The subject with the largest difference.
    pub worst_subject: Option<String>,
    /// CCT of the main zone, K.
    pub cct_k: Option<f64>,
    /// Duv of the main zone.
    pub duv: Option<f64>,
    /// TM-30 Rf of the main zone.
    pub rf: Option<f64>,
    /// TM-30 Rg of the main zone.
    pub rg: Option<f64>,
    /// CIE 13.3 R9 of the main zone.
    pub r9: Option<f64>,
    /// Illuminance of the main zone, lux.
    pub illuminance_lux: f64,
    /// Light lost in the main zone against the plan as it stands, stops
    /// (0 before; `None` when either is dark).
    pub stops_lost: Option<f64>,
    /// The white goal's zone against its target.
    pub white: Option<WhiteFigures>,
}

/// Light one changed source loses (to gels and level together).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SourceLoss {
    /// The source.
    pub source: SourceId,
    /// Its name.
    pub name: String,
    /// Stops lost at its own level (negative = gained); `None` when switched off.
    pub stops_lost: Option<f64>,
}

/// One suggestion: moves, and what they do.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Suggestion {
    /// The moves.
    pub moves: Vec<Move>,
    /// Each move as a crew says it.
    pub words: Vec<String>,
    /// Figures of the plan as it stands.
    pub before: Figures,
    /// Figures once the moves are made (full evaluation of the changed plan).
    pub after: Figures,
    /// The ranking total the search model predicted (goal cost plus charges
    /// for moves and light lost; for comparing suggestions only).
    pub predicted_ranking: f64,
    /// Light each changed source loses.
    pub source_losses: Vec<SourceLoss>,
}

impl Suggestion {
    /// The moves in one line: "add 1/4 minus green to Key; drop Fill 2/3 stop".
    #[must_use]
    pub fn sentence(&self) -> String {
        self.words.join("; ")
    }
}

/// The advisor's answer.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Advice {
    /// The goal.
    pub goal: Goal,
    /// Figures of the plan as it stands.
    pub before: Figures,
    /// Suggestions, best first (empty when nothing better was found).
    pub suggestions: Vec<Suggestion>,
    /// How the search ran.
    pub method: SearchMethod,
    /// Candidates scored with the search model.
    pub candidates_scored: usize,
    /// Plain-language notes ("nothing better found", "already within tolerance").
    pub notes: Vec<String>,
}

/// Apply a suggestion to a copy of the plan (one edit: one undo step).
#[must_use]
pub fn apply(plan: &Plan, suggestion: &Suggestion) -> Plan {
    apply_moves(plan, &suggestion.moves)
}

/// The target a match-a-white goal uses when none is given: the camera's Kelvin
/// white balance when it has one, otherwise the zone's own CCT (to 10 K) on
/// the Planckian locus — "take the cast out".
pub fn default_white_target(plan: &Plan, zone: Option<&str>) -> Result<WhiteTarget> {
    if let WhiteBalanceSetting::Kelvin(k) = plan.camera.white_balance {
        let (lo, hi) = lampwright_color::cct::CCT_RANGE_K;
        if k.is_finite() && (lo..=hi).contains(&k) {
            return Ok(WhiteTarget::Chromaticity { cct_k: k, duv: 0.0 });
        }
    }
    let eval = evaluate(plan)?;
    let names: Vec<String> = eval.zones.iter().map(|z| z.name.clone()).collect();
    let i = match zone {
        Some(name) => scoring::zone_index(&names, name)?,
        None => 0,
    };
    let cct = eval
        .zones
        .get(i)
        .and_then(|z| z.light.cct_k)
        .ok_or_else(|| PlanError::Invalid {
            field: "advisor goal: target".into(),
            message: format!(
                "the zone '{}' has no CCT to aim at; give a target CCT",
                names.get(i).map_or("", String::as_str)
            ),
        })?;
    Ok(WhiteTarget::Chromaticity {
        cct_k: (cct / 10.0).round() * 10.0,
        duv: 0.0,
    })
}

/// The search model and scoring helpers for `goal`.
fn build_model(
    plan: &Plan,
    goal: &Goal,
    options: &AdvisorOptions,
    cam_options: &[camera_path::CameraOption],
) -> Result<(LinearModel, Option<FastCamera>, Option<FastQuality>)> {
    let subjects = plan
        .subjects
        .iter()
        .map(|s| crate::resolve::subject_reflectance(plan, &s.subject).map(|r| r.reflectance))
        .collect::<Result<Vec<_>>>()?;
    Ok(match goal {
        Goal::Fidelity(_) => {
            let camera = crate::resolve::camera_sensitivities(plan, &plan.camera.camera)?;
            let fill =
                |i: usize, row: &mut [f64]| linear::fidelity_columns(&camera, &subjects, i, row);
            let columns = Columns {
                width: 6 + 6 * subjects.len(),
                fill: &fill,
            };
            let model = LinearModel::new(plan, &columns, options.knot_step_nm)?;
            (
                model,
                Some(FastCamera::new(plan, camera.clone(), cam_options)?),
                None,
            )
        }
        Goal::White(_) => {
            let columns = Columns {
                width: 3,
                fill: &linear::white_columns,
            };
            (
                LinearModel::new(plan, &columns, options.knot_step_nm)?,
                None,
                None,
            )
        }
        Goal::Quality(_) => {
            let fast = FastQuality::new(QualitySamples::load()?);
            let fill = |i: usize, row: &mut [f64]| fast.samples().columns(i, row);
            let columns = Columns {
                width: QUALITY_WIDTH,
                fill: &fill,
            };
            let model = LinearModel::new(plan, &columns, options.knot_step_nm)?;
            (model, None, Some(fast))
        }
    })
}

/// Search for the best changes to `plan` for `goal`.
///
/// Returns up to `options.max_suggestions` suggestions, best first, each with
/// figures from a full evaluation of the changed plan; an empty list (with a
/// note) when nothing beats the plan as it stands by a worthwhile margin.
pub fn advise(plan: &Plan, goal: &Goal, options: &AdvisorOptions) -> Result<Advice> {
    goal.validate()?;
    let before_eval = evaluate(plan)?;
    let zone_names: Vec<String> = before_eval.zones.iter().map(|z| z.name.clone()).collect();
    let white = white_zones(goal, &zone_names)?;
    let base_lux = before_eval.light.illuminance_lux;
    let before = figures(plan, goal, white, &before_eval, base_lux);
    if matches!(goal, Goal::Fidelity(_)) && before.weighted_mean_de2000.is_none() {
        return Err(PlanError::Invalid {
            field: "advisor goal".into(),
            message: "camera fidelity needs at least one included subject with a positive weight"
                .into(),
        });
    }

    let spaces = moves::source_spaces(plan, options)?;
    let cam_options = camera_options(plan, goal.uses_camera() && options.camera_moves);
    let (model, fast_camera, fast_quality) = build_model(plan, goal, options, &cam_options)?;
    let mut scorer = ModelScorer::new(
        plan,
        &model,
        &spaces,
        goal,
        white,
        fast_camera,
        fast_quality,
    );
    // Scene profiles need a fit per light: tried last, on the best lights.
    let (camera_sweep, camera_last): (Vec<usize>, Vec<usize>) = (0..cam_options.len())
        .partition(|i| *i == 0 || cam_options[*i].matrix != MatrixMode::SceneProfile);
    let n_camera_moves: Vec<usize> = (0..cam_options.len())
        .map(|i| camera_moves(&cam_options, i).len())
        .collect();
    let n_finalists = options.finalists.max(options.max_suggestions);
    let settings = SearchSettings {
        exhaustive_limit: options.exhaustive_limit,
        restarts: options.restarts,
        max_sweeps: options.max_sweeps.max(1),
        seed: options.seed,
        cost_per_move: goal.cost_per_move(),
        max_stops_lost: plan.kit.max_stops_lost.max(0.0),
        camera_sweep,
        camera_last,
        last_lights: n_finalists,
        confirm: SCREEN_CONFIRM,
    };
    let outcome = search::search(&mut scorer, &spaces, &settings, &n_camera_moves);
    let finalists = pick_finalists(&outcome, &spaces, &cam_options, n_finalists);
    let finalise = Finalise {
        plan,
        goal,
        white,
        spaces: &spaces,
        stacks: &outcome.stacks,
        options: &cam_options,
        camera_moves: &n_camera_moves,
        before: &before,
        base_lux,
    };
    let suggestions = finalise.suggestions(finalists, options.max_suggestions)?;

    let mut notes = Vec::new();
    if suggestions.is_empty() {
        notes.push(format!(
            "nothing better found: no change the kit allows improves {} by a worthwhile margin",
            goal.label()
        ));
    }
    if let Some(w) = before.white.as_ref().filter(|w| w.within_tolerance) {
        notes.push(format!(
            "{} is already within tolerance of its target",
            w.zone
        ));
    }
    Ok(Advice {
        goal: goal.clone(),
        before,
        suggestions,
        method: outcome.method,
        candidates_scored: outcome.scored,
        notes,
    })
}
