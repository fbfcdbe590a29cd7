//! Scoring candidates with the search model, and the same figures from a full
//! evaluation.
//!
//! For a candidate, each zone's mix is `Σ coefficient × 2^(thirds/3) ×
//! projection` over the sources (0 for a source switched off). Then:
//! - **white**: the goal zone's XYZ → CIE 1960 (u, v) → CCT and Duv by Ohno
//!   (2014), as the evaluation computes them; the target is fixed or another
//!   zone's white computed the same way;
//! - **fidelity**: the main zone's sums go through the camera path
//!   ([`super::camera_path`]);
//! - **quality**: the main zone's sums go through the quality path
//!   ([`super::quality_path`]).
//!
//! The cost returned for ranking adds the goal's charge for light lost in the
//! main zone ([`Goal::ranking_total`]); the search adds the charge per move.

use super::camera_path::FastCamera;
use super::candidate::{FastHasher, SourceState, StackTable, State, current_state};
use super::goal::{Goal, GoalInputs, WhiteTarget, white_miss};
use super::linear::{LinearModel, Projected, is_dark, mix, mix_lux, spectrum_of};
use super::moves::SourceSpace;
use super::quality_path::{FastQuality, positive};
use super::search::Scorer;
use crate::engine::DARK_LUX;
use crate::error::{PlanError, Result};
use crate::evaluation::Evaluation;
use crate::model::Plan;
use lampwright_color::RelativeSpd;
use lampwright_color::cct::{CctDuv, cct_ohno2014};
use lampwright_color::spaces::Uv1960;
use lampwright_color::spectrum::GRID_LEN;
use lampwright_color::tristimulus::Xyz;
use std::cell::RefCell;
use std::hash::{Hash, Hasher};
use std::rc::Rc;

/// Where the white goal's target comes from, resolved to zone indices.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum TargetWhite {
    /// Fixed CCT and Duv.
    Fixed(f64, f64),
    /// The white of zone `i`.
    Zone(usize),
}

/// Index of the zone named `name` (case-insensitive, trimmed) among `names`.
pub(crate) fn zone_index(names: &[String], name: &str) -> Result<usize> {
    let want = name.trim().to_lowercase();
    names
        .iter()
        .position(|n| n.trim().to_lowercase() == want)
        .ok_or_else(|| PlanError::Invalid {
            field: "advisor goal: zone".into(),
            message: format!(
                "there is no zone called '{}' (zones: {})",
                name.trim(),
                names.join(", ")
            ),
        })
}

/// The white goal's zone and target as indices into the plan's zones (one
/// implicit zone "Scene" when there are none).
pub(crate) fn white_zones(
    goal: &Goal,
    zone_names: &[String],
) -> Result<Option<(usize, TargetWhite)>> {
    let Goal::White(w) = goal else {
        return Ok(None);
    };
    let zone = match &w.zone {
        Some(name) => zone_index(zone_names, name)?,
        None => 0,
    };
    let target = match &w.target {
        WhiteTarget::Chromaticity { cct_k, duv } => TargetWhite::Fixed(*cct_k, *duv),
        WhiteTarget::Zone(name) => {
            let t = zone_index(zone_names, name)?;
            if t == zone {
                return Err(PlanError::Invalid {
                    field: "advisor goal: zone".into(),
                    message: format!("the zone '{name}' cannot be its own target"),
                });
            }
            TargetWhite::Zone(t)
        }
    };
    Ok(Some((zone, target)))
}

fn cct_of_xyz(x: f64, y: f64, z: f64) -> Option<CctDuv> {
    if !positive(y) {
        return None;
    }
    cct_ohno2014(Uv1960::from_xyz(Xyz::new(x, y, z))).ok()
}

/// Subject weights in the fidelity goal: the plan's weight for included
/// subjects (negative or non-finite weights count as 0), 0 for the others.
pub(crate) fn subject_weights(plan: &Plan) -> Vec<f64> {
    plan.subjects
        .iter()
        .map(|s| {
            if s.included && s.weight.is_finite() && s.weight > 0.0 {
                s.weight
            } else {
                0.0
            }
        })
        .collect()
}

/// Zone weights in the fidelity goal: the plan's zone weights (negative or
/// non-finite ones count as 0); one zone of weight 1 when the plan has no
/// zones; the main zone alone when no zone has a positive weight.
pub(crate) fn zone_weights(plan: &Plan) -> Vec<f64> {
    let mut w: Vec<f64> = plan
        .zones
        .iter()
        .map(|z| {
            if z.weight.is_finite() && z.weight > 0.0 {
                z.weight
            } else {
                0.0
            }
        })
        .collect();
    if w.is_empty() {
        w.push(1.0);
    }
    if w.iter().all(|x| *x == 0.0) {
        w[0] = 1.0;
    }
    w
}

/// Weighted mean and largest of `de` over included subjects in zones of
/// positive weight. `de` holds one row of subjects (plan order) per zone; a
/// subject in a zone counts with its weight times the zone's.
pub(crate) fn fidelity_stats(
    plan: &Plan,
    weights: &[f64],
    zone_weights: &[f64],
    de: &[f64],
) -> (Option<f64>, Option<f64>) {
    let n = plan.subjects.len();
    let mut sum = 0.0;
    let mut wsum = 0.0;
    let mut max: Option<f64> = None;
    if n == 0 {
        return (None, None);
    }
    for (row, zw) in de.chunks_exact(n).zip(zone_weights) {
        if *zw <= 0.0 {
            continue;
        }
        for ((d, w), entry) in row.iter().zip(weights).zip(&plan.subjects) {
            if entry.included {
                max = Some(max.map_or(*d, |m| m.max(*d)));
            }
            sum += zw * w * d;
            wsum += zw * w;
        }
    }
    let mean = (wsum > 0.0).then(|| sum / wsum);
    (mean, max)
}

/// The goal's inputs from a full evaluation.
pub(crate) fn inputs_from_evaluation(
    plan: &Plan,
    goal: &Goal,
    white: Option<(usize, TargetWhite)>,
    eval: &Evaluation,
) -> GoalInputs {
    let weights = subject_weights(plan);
    let de: Vec<f64> = eval
        .zones
        .iter()
        .flat_map(|z| z.subjects.iter().map(|s| s.de2000))
        .collect();
    let (weighted_mean_de2000, max_de2000) =
        fidelity_stats(plan, &weights, &zone_weights(plan), &de);
    let mut inputs = GoalInputs {
        weighted_mean_de2000,
        max_de2000,
        rf: eval.light.tm30_rf,
        rg: eval.light.tm30_rg,
        r9: eval.light.cri_r.map(|r| r[8]),
        ..GoalInputs::default()
    };
    if let (Goal::White(_), Some((z, target))) = (goal, white) {
        let zone_white = |i: usize| {
            let l = &eval.zones.get(i)?.light;
            Some((l.cct_k?, l.duv?))
        };
        let t = match target {
            TargetWhite::Fixed(c, d) => Some((c, d)),
            TargetWhite::Zone(i) => zone_white(i),
        };
        let miss = match (zone_white(z), t) {
            (Some((c, d)), Some((tc, td))) => white_miss(c, d, tc, td),
            _ => None,
        };
        if let Some((m, dd)) = miss {
            inputs.white_mired_miss = Some(m);
            inputs.white_duv_miss = Some(dd);
        }
    }
    inputs
}

/// A source's 1 nm spectrum per lux through one stack, shared between candidates.
type FilteredSpectrum = Rc<[f64; GRID_LEN]>;

/// Scores candidates for one goal with the search model.
pub(crate) struct ModelScorer<'a> {
    model: &'a LinearModel,
    spaces: &'a [SourceSpace],
    goal: &'a Goal,
    plan: &'a Plan,
    white: Option<(usize, TargetWhite)>,
    camera: Option<FastCamera>,
    quality: Option<FastQuality>,
    base_lux: f64,
    weights: Vec<f64>,
    zone_weights: Vec<f64>,
    /// Every zone's mix of the candidate, for the camera (frame white balance).
    zone_bufs: Vec<Vec<f64>>,
    projections: Vec<Vec<Option<Rc<Projected>>>>,
    prefixes: Vec<Vec<Option<Rc<Projected>>>>,
    transmissions: Vec<Vec<Option<f64>>>,
    screen_width: Option<usize>,
    spectra: RefCell<Vec<Vec<Option<FilteredSpectrum>>>>,
    buf: Vec<f64>,
    de: Vec<f64>,
}

impl<'a> ModelScorer<'a> {
    /// A scorer for `goal`.
    pub fn new(
        plan: &'a Plan,
        model: &'a LinearModel,
        spaces: &'a [SourceSpace],
        goal: &'a Goal,
        white: Option<(usize, TargetWhite)>,
        camera: Option<FastCamera>,
        quality: Option<FastQuality>,
    ) -> ModelScorer<'a> {
        let screen_width = quality.as_ref().map(|q| q.samples().screen_width());
        let mut scorer = ModelScorer {
            model,
            spaces,
            goal,
            plan,
            white,
            camera,
            quality,
            base_lux: 0.0,
            weights: subject_weights(plan),
            zone_weights: zone_weights(plan),
            zone_bufs: Vec::new(),
            projections: vec![Vec::new(); spaces.len()],
            prefixes: vec![Vec::new(); spaces.len()],
            transmissions: vec![Vec::new(); spaces.len()],
            screen_width,
            spectra: RefCell::new(vec![Vec::new(); spaces.len()]),
            buf: Vec::new(),
            de: Vec::new(),
        };
        scorer.zone_mix(0, &current_state(spaces), &StackTable::new(spaces));
        scorer.base_lux = mix_lux(&scorer.buf);
        scorer
    }

    fn multiplier(st: SourceState) -> f64 {
        match st {
            SourceState::Off => 0.0,
            SourceState::On { thirds, .. } => (f64::from(thirds) / 3.0).exp2(),
        }
    }

    /// Projection of stack `id` on source `s` (cached), in full or only the
    /// screening prefix.
    fn projection(
        &mut self,
        s: usize,
        id: u32,
        stacks: &StackTable,
        prefix: bool,
    ) -> Rc<Projected> {
        let k = id as usize;
        let columns = if prefix {
            self.screen_width.unwrap_or(usize::MAX)
        } else {
            usize::MAX
        };
        let cache = if prefix {
            &mut self.prefixes[s]
        } else {
            &mut self.projections[s]
        };
        if cache.len() <= k {
            cache.resize(k + 1, None);
        }
        if let Some(p) = &cache[k] {
            return Rc::clone(p);
        }
        let t = self.spaces[s].stack_transmittance(stacks.get(s, id));
        let p = Rc::new(self.model.project_prefix(s, &t, columns));
        let cache = if prefix {
            &mut self.prefixes[s]
        } else {
            &mut self.projections[s]
        };
        cache[k] = Some(Rc::clone(&p));
        p
    }

    /// Zone `z`'s mix of the candidate into `self.buf`.
    fn zone_mix(&mut self, z: usize, state: &State, stacks: &StackTable) {
        self.zone_mix_prefix(z, state, stacks, false);
    }

    /// Zone `z`'s mix into `self.buf`, in full or only the screening prefix.
    fn zone_mix_prefix(&mut self, z: usize, state: &State, stacks: &StackTable, prefix: bool) {
        let mut parts = Vec::with_capacity(state.sources.len());
        for (s, st) in state.sources.iter().enumerate() {
            let w = self.model.zone_coefficients[z][s] * Self::multiplier(*st);
            if let (SourceState::On { stack, .. }, true) = (st, w != 0.0) {
                parts.push((w, self.projection(s, *stack, stacks, prefix)));
            }
        }
        let refs: Vec<(f64, &Projected)> = parts.iter().map(|(w, p)| (*w, p.as_ref())).collect();
        let width = if prefix {
            self.screen_width
                .unwrap_or(usize::MAX)
                .min(self.model.width())
        } else {
            self.model.width()
        };
        mix(width, &refs, &mut self.buf);
    }

    /// The 1 nm spectrum per lux of stack `id` on source `s` (cached).
    fn filtered(&self, s: usize, id: u32, stacks: &StackTable) -> Rc<[f64; GRID_LEN]> {
        let k = id as usize;
        if let Some(Some(hit)) = self.spectra.borrow()[s].get(k) {
            return Rc::clone(hit);
        }
        let t = self.spaces[s].stack_transmittance(stacks.get(s, id));
        let spd = Rc::new(self.model.filtered_per_lux(s, &t));
        let mut cache = self.spectra.borrow_mut();
        if cache[s].len() <= k {
            cache[s].resize(k + 1, None);
        }
        cache[s][k] = Some(Rc::clone(&spd));
        spd
    }

    /// Zone `z`'s exact 1 nm spectrum of the candidate.
    pub fn spectrum(&self, z: usize, state: &State, stacks: &StackTable) -> Option<RelativeSpd> {
        let mut parts = Vec::new();
        for (s, st) in state.sources.iter().enumerate() {
            let w = self.model.zone_coefficients[z][s] * Self::multiplier(*st);
            if let (SourceState::On { stack, .. }, true) = (st, w != 0.0) {
                parts.push((w, self.filtered(s, *stack, stacks)));
            }
        }
        let refs: Vec<(f64, &[f64; GRID_LEN])> =
            parts.iter().map(|(w, p)| (*w, p.as_ref())).collect();
        let spd = spectrum_of(&refs).ok()?;
        spd.check_colorimetric("mix").ok()?;
        Some(spd)
    }

    fn zone_white(&mut self, z: usize, state: &State, stacks: &StackTable) -> Option<CctDuv> {
        self.zone_mix(z, state, stacks);
        if is_dark(&self.buf) {
            return None;
        }
        cct_of_xyz(self.buf[0], self.buf[1], self.buf[2])
    }

    /// The goal's inputs for a candidate and the main zone's illuminance, lux.
    pub fn inputs(&mut self, state: &State, stacks: &StackTable) -> Option<(GoalInputs, f64)> {
        let mut inputs = GoalInputs::default();
        if let Goal::White(_) = self.goal {
            let (z, target) = self.white?;
            let here = self.zone_white(z, state, stacks)?;
            let (tc, td) = match target {
                TargetWhite::Fixed(c, d) => (c, d),
                TargetWhite::Zone(t) => {
                    let w = self.zone_white(t, state, stacks)?;
                    (w.cct_k, w.duv)
                }
            };
            let (m, d) = white_miss(here.cct_k, here.duv, tc, td)?;
            inputs.white_mired_miss = Some(m);
            inputs.white_duv_miss = Some(d);
        }
        self.zone_mix(0, state, stacks);
        if is_dark(&self.buf) {
            return None;
        }
        let main_lux = mix_lux(&self.buf);
        match self.goal {
            Goal::White(_) => {}
            Goal::Fidelity(_) => {
                // The camera meters the whole frame: every zone's mix, main first.
                let zones = self.model.zone_coefficients.len();
                let mut bufs = std::mem::take(&mut self.zone_bufs);
                bufs.resize_with(zones, Vec::new);
                for (z, b) in bufs.iter_mut().enumerate() {
                    if z == 0 {
                        b.clone_from(&self.buf);
                    } else {
                        self.zone_mix(z, state, stacks);
                        b.clone_from(&self.buf);
                    }
                }
                let mut de = std::mem::take(&mut self.de);
                let mut camera = self.camera.take()?;
                let key = light_key(&state.sources);
                let light = || self.spectrum(0, state, stacks);
                let ok = camera.delta_e(state.camera, &bufs, key, &light, &mut de);
                self.camera = Some(camera);
                self.zone_bufs = bufs;
                let stats =
                    ok.map(|()| fidelity_stats(self.plan, &self.weights, &self.zone_weights, &de));
                self.de = de;
                let (mean, max) = stats?;
                inputs.weighted_mean_de2000 = mean;
                inputs.max_de2000 = max;
            }
            Goal::Quality(_) => {
                let (rf, rg, r9) = self.quality.as_mut()?.figures(&self.buf)?;
                inputs.rf = Some(rf);
                inputs.rg = Some(rg);
                inputs.r9 = Some(r9);
            }
        }
        Some((inputs, main_lux))
    }
}

/// A key for the light of a candidate (its sources' states), for caching fits.
fn light_key(sources: &[SourceState]) -> u64 {
    let mut h = FastHasher::default();
    sources.hash(&mut h);
    h.finish()
}

impl Scorer for ModelScorer<'_> {
    fn cost(&mut self, state: &State, stacks: &StackTable) -> Option<f64> {
        let (inputs, lux) = self.inputs(state, stacks)?;
        let cost = self.goal.cost(&inputs)?;
        if lux <= DARK_LUX || self.base_lux <= DARK_LUX {
            return None;
        }
        Some(
            self.goal
                .ranking_total(cost, (self.base_lux / lux).log2(), 0),
        )
    }

    fn transmission(&mut self, s: usize, id: u32, stacks: &StackTable) -> f64 {
        let k = id as usize;
        let cache = &mut self.transmissions[s];
        if cache.len() <= k {
            cache.resize(k + 1, None);
        }
        if let Some(t) = cache[k] {
            return t;
        }
        let t = self
            .model
            .transmission(s, &self.spaces[s].stack_transmittance(stacks.get(s, id)));
        self.transmissions[s][k] = Some(t);
        t
    }

    fn screening(&self) -> bool {
        self.screen_width.is_some()
    }

    fn screen(&mut self, state: &State, stacks: &StackTable) -> Option<f64> {
        self.zone_mix_prefix(0, state, stacks, true);
        if is_dark(&self.buf) || self.base_lux <= DARK_LUX {
            return None;
        }
        let lux = mix_lux(&self.buf);
        let (rf, rg, r9) = self.quality.as_mut()?.screen(&self.buf)?;
        let inputs = GoalInputs {
            rf: Some(rf),
            rg: Some(rg),
            r9: Some(r9),
            ..GoalInputs::default()
        };
        let cost = self.goal.cost(&inputs)?;
        Some(
            self.goal
                .ranking_total(cost, (self.base_lux / lux).log2(), 0),
        )
    }
}
