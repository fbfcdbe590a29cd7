//! From search results to suggestions: the moves of a candidate, the
//! figures shown before and after (from full evaluations), the choice of
//! distinct finalists, and the final ranking.

use super::camera_path::CameraOption;
use super::candidate::{SourceState, StackTable, State, current_state, move_count};
use super::goal::Goal;
use super::moves::{Move, SourceSpace, apply_moves, gel_moves};
use super::scoring::{TargetWhite, inputs_from_evaluation};
use super::search::SearchOutcome;
use super::{Figures, SourceLoss, Suggestion, WhiteFigures, wording};
use crate::engine::{DARK_LUX, evaluate, source_light};
use crate::error::Result;
use crate::evaluation::Evaluation;
use crate::model::{Plan, SourceId, WhiteBalanceSetting};
use std::collections::HashSet;
use std::fmt::Write as _;

/// The figures of an evaluated plan for `goal`; `base_lux` is the main zone's
/// illuminance in the plan as it stands.
pub(crate) fn figures(
    plan: &Plan,
    goal: &Goal,
    white: Option<(usize, TargetWhite)>,
    eval: &Evaluation,
    base_lux: f64,
) -> Figures {
    let inputs = inputs_from_evaluation(plan, goal, white, eval);
    let lux = eval.light.illuminance_lux;
    let white_figures = match (goal, white) {
        (Goal::White(w), Some((z, target))) => {
            let zone = eval.zones.get(z);
            let (tc, td) = match target {
                TargetWhite::Fixed(c, d) => (Some(c), Some(d)),
                TargetWhite::Zone(t) => eval
                    .zones
                    .get(t)
                    .map_or((None, None), |tz| (tz.light.cct_k, tz.light.duv)),
            };
            Some(WhiteFigures {
                zone: zone.map_or_else(String::new, |z| z.name.clone()),
                cct_k: zone.and_then(|z| z.light.cct_k),
                duv: zone.and_then(|z| z.light.duv),
                target_cct_k: tc,
                target_duv: td,
                mired_miss: inputs.white_mired_miss,
                duv_miss: inputs.white_duv_miss,
                within_tolerance: goal.cost(&inputs).is_some_and(|c| c <= 1.0)
                    && w.tolerance_mired > 0.0,
            })
        }
        _ => None,
    };
    Figures {
        goal_cost: goal.cost(&inputs),
        mean_de2000: eval.summary.mean_de2000,
        weighted_mean_de2000: inputs.weighted_mean_de2000,
        max_de2000: eval.summary.max_de2000,
        worst_subject: eval.summary.worst_subject.as_deref().map(String::from),
        cct_k: eval.light.cct_k,
        duv: eval.light.duv,
        rf: eval.light.tm30_rf,
        rg: eval.light.tm30_rg,
        r9: inputs.r9,
        illuminance_lux: lux,
        stops_lost: (lux > DARK_LUX && base_lux > DARK_LUX).then(|| (base_lux / lux).log2()),
        white: white_figures,
    }
}

/// The moves of a candidate, sources in plan order, camera last.
pub(crate) fn state_moves(
    plan: &Plan,
    spaces: &[SourceSpace],
    stacks: &StackTable,
    options: &[CameraOption],
    state: &State,
) -> Vec<Move> {
    let mut out = Vec::new();
    for (s, (space, st)) in spaces.iter().zip(&state.sources).enumerate() {
        match *st {
            SourceState::Off => out.push(Move::SwitchOff { source: space.id }),
            SourceState::On { stack, thirds } => {
                if stack != 0 {
                    let old = &plan.sources[space.plan_index].gels;
                    out.extend(gel_moves(
                        space.id,
                        old,
                        &space.layers(stacks.get(s, stack)),
                    ));
                }
                if thirds != 0 {
                    out.push(Move::Level {
                        source: space.id,
                        stops: f64::from(thirds) / 3.0,
                    });
                }
            }
        }
    }
    out.extend(camera_moves(options, state.camera));
    out
}

/// The camera moves of option `i` against the plan's own settings (option 0).
pub(crate) fn camera_moves(options: &[CameraOption], i: usize) -> Vec<Move> {
    let mut out = Vec::new();
    if let (Some(now), Some(new)) = (options.first(), options.get(i)) {
        if new.white_balance != now.white_balance {
            out.push(Move::WhiteBalance {
                to: new.white_balance.clone(),
            });
        }
        if new.matrix != now.matrix {
            out.push(Move::Matrix { to: new.matrix });
        }
    }
    out
}

/// What makes two candidates "the same idea": which gels (not their
/// strengths) on which sources, whether levels change, which camera mode.
fn signature(
    spaces: &[SourceSpace],
    stacks: &StackTable,
    options: &[CameraOption],
    state: &State,
) -> String {
    let mut sig = String::new();
    for (s, (space, st)) in spaces.iter().zip(&state.sources).enumerate() {
        match *st {
            SourceState::Off => sig.push_str("off|"),
            SourceState::On { stack, thirds } => {
                let mut keys: Vec<usize> = stacks
                    .get(s, stack)
                    .iter()
                    .map(|i| space.items[usize::from(*i)].gel_key)
                    .collect();
                keys.sort_unstable();
                keys.dedup();
                let _ = write!(sig, "{keys:?}{}|", if thirds == 0 { "" } else { "L" });
            }
        }
    }
    if let Some(o) = options.get(state.camera) {
        let wb = match &o.white_balance {
            WhiteBalanceSetting::Kelvin(_) => "kelvin".to_string(),
            other => format!("{other:?}"),
        };
        let _ = write!(sig, "{wb}/{:?}", o.matrix);
    }
    sig
}

/// The best distinct candidates by the model's ranking (not the plan as it
/// stands), at most `n`.
pub(crate) fn pick_finalists(
    outcome: &SearchOutcome,
    spaces: &[SourceSpace],
    options: &[CameraOption],
    n: usize,
) -> Vec<(State, f64)> {
    let start = current_state(spaces);
    let mut ranked: Vec<(&State, f64)> = outcome.pool.iter().map(|(s, c)| (s, *c)).collect();
    ranked.sort_by(|a, b| a.1.total_cmp(&b.1));
    let mut seen = HashSet::new();
    let mut finalists = Vec::new();
    for (state, total) in ranked {
        if state == &start || !seen.insert(signature(spaces, &outcome.stacks, options, state)) {
            continue;
        }
        finalists.push((state.clone(), total));
        if finalists.len() >= n {
            break;
        }
    }
    finalists
}

/// What the final stage needs to know about the search.
pub(crate) struct Finalise<'a> {
    pub plan: &'a Plan,
    pub goal: &'a Goal,
    pub white: Option<(usize, TargetWhite)>,
    pub spaces: &'a [SourceSpace],
    pub stacks: &'a StackTable,
    pub options: &'a [CameraOption],
    pub camera_moves: &'a [usize],
    pub before: &'a Figures,
    pub base_lux: f64,
}

impl Finalise<'_> {
    /// Evaluate the finalists in full, keep those that beat the plan by a
    /// worthwhile margin, best first, at most `max`.
    pub fn suggestions(&self, finalists: Vec<(State, f64)>, max: usize) -> Result<Vec<Suggestion>> {
        let goal = self.goal;
        let before_cost = self.before.goal_cost;
        let mut ranked: Vec<(f64, Suggestion)> = Vec::new();
        for (state, predicted_ranking) in finalists {
            let moves = state_moves(self.plan, self.spaces, self.stacks, self.options, &state);
            if moves.is_empty() {
                continue;
            }
            let changed = apply_moves(self.plan, &moves);
            let Ok(eval) = evaluate(&changed) else {
                continue;
            };
            let after = figures(&changed, goal, self.white, &eval, self.base_lux);
            let (Some(cost), Some(lost)) = (after.goal_cost, after.stops_lost) else {
                continue;
            };
            let better = before_cost.is_none_or(|b| cost < b - goal.worthwhile_improvement());
            // Never trade the plain mean for the weighted subjects.
            let mean_ok = !matches!(goal, Goal::Fidelity(_))
                || matches!((self.before.mean_de2000, after.mean_de2000), (Some(b), Some(a)) if a <= b);
            if !(better && mean_ok) {
                continue;
            }
            let n_moves = move_count(
                self.spaces,
                self.stacks,
                &state,
                self.camera_moves[state.camera],
            );
            let source_losses = losses(self.plan, &changed, &moves)?;
            let words = moves
                .iter()
                .map(|m| wording::move_words(self.plan, m))
                .collect();
            ranked.push((
                goal.ranking_total(cost, lost, n_moves),
                Suggestion {
                    moves,
                    words,
                    before: self.before.clone(),
                    after,
                    predicted_ranking,
                    source_losses,
                },
            ));
        }
        ranked.sort_by(|a, b| a.0.total_cmp(&b.0));
        Ok(drop_padded(goal, ranked, max))
    }
}

/// Keep the best `max` suggestions (ranked, best first), leaving out any that
/// only adds moves to a better-ranked one without improving the goal by a
/// worthwhile margin ("add 1/4 minus green" and "add 1/4 minus green; drop
/// Key 1/3 stop" are one idea).
fn drop_padded(goal: &Goal, ranked: Vec<(f64, Suggestion)>, max: usize) -> Vec<Suggestion> {
    let mut kept: Vec<Suggestion> = Vec::new();
    for (_, s) in ranked {
        let cost = s.after.goal_cost.unwrap_or(f64::INFINITY);
        let padded = kept.iter().any(|k| {
            k.moves.iter().all(|m| s.moves.contains(m))
                && cost
                    >= k.after.goal_cost.unwrap_or(f64::INFINITY) - goal.worthwhile_improvement()
        });
        if !padded {
            kept.push(s);
            if kept.len() == max {
                break;
            }
        }
    }
    kept
}

/// Stops each source named by the moves loses at its own level.
fn losses(plan: &Plan, changed: &Plan, moves: &[Move]) -> Result<Vec<SourceLoss>> {
    let mut ids: Vec<SourceId> = Vec::new();
    for id in moves.iter().filter_map(Move::source) {
        if !ids.contains(&id) {
            ids.push(id);
        }
    }
    let mut out = Vec::new();
    for id in ids {
        let (Some(a), Some(b)) = (plan.source(id), changed.source(id)) else {
            continue;
        };
        let stops_lost = if b.enabled {
            let (la, lb) = (
                source_light(plan, a)?.illuminance_lux(),
                source_light(changed, b)?.illuminance_lux(),
            );
            (la > 0.0 && lb > 0.0).then(|| (la / lb).log2())
        } else {
            None
        };
        out.push(SourceLoss {
            source: id,
            name: a.name.clone(),
            stops_lost,
        });
    }
    Ok(out)
}
