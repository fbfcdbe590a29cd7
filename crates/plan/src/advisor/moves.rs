//! The moves the advisor may propose, the options each source offers within
//! the kit's limits, and how a set of moves is applied to a plan.
//!
//! Moves: add, remove or change the strength of a gel on an unlocked source;
//! change a source's level in thirds of a stop; switch a source off; change
//! the white balance; switch to a scene profile (a matrix fitted under the
//! plan's own light).
//!
//! Limits (the plan's [`Kit`](crate::model::Kit)):
//! - locked sources and sources that do not light the scene are left alone;
//! - new gels come from the built-in library (only `kit.gels` when that list is
//!   not empty) at strengths of 1/8 to full in eighths; gels already on a
//!   source may be kept, changed (when the kit has them) or taken off;
//! - at most `kit.max_stack` gels on a changed source (and never more than
//!   [`MAX_LAYERS_SEARCHED`]);
//! - a source that stays on may lose at most `kit.max_stops_lost` stops of
//!   light at the subject to its new gels and level together, measured from
//!   the plan as it stands (switching a source off is its own move and not
//!   bound by this limit);
//! - levels move in thirds of a stop, never above the plan's level unless the
//!   options allow a raise.
//!
//! Neutral filters (ND, neutral diffusion: flat transmittance) are not added
//! as colour moves: they only change the level, which the level moves cover.

use super::AdvisorOptions;
use crate::error::Result;
use crate::library;
use crate::model::{GelLayer, GelRef, MatrixMode, Plan, SourceId, WhiteBalanceSetting, ZoneLevel};
use lampwright_color::Transmittance;
use lampwright_color::spectrum::{GRID_LEN, grid_wavelength_nm};
use serde::Serialize;

/// Most gels the advisor stacks on one source, whatever the kit allows
/// (the search grows with the power of this number).
pub const MAX_LAYERS_SEARCHED: usize = 3;

/// Gel strengths are searched in eighths of the full gel.
pub const STRENGTH_STEPS: u8 = 8;

/// A transmittance whose largest and smallest values over 380–780 nm differ by
/// less than this ratio counts as neutral (ND, neutral diffusion).
const NEUTRAL_RATIO: f64 = 1.02;

/// One change on set.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub enum Move {
    /// Put a gel on a source.
    AddGel {
        /// The source.
        source: SourceId,
        /// The gel.
        gel: GelRef,
        /// Fraction of the full gel.
        strength: f64,
    },
    /// Take a gel off a source.
    RemoveGel {
        /// The source.
        source: SourceId,
        /// The gel.
        gel: GelRef,
        /// Its strength now.
        strength: f64,
    },
    /// Swap a gel for another strength of the same gel.
    ChangeGel {
        /// The source.
        source: SourceId,
        /// The gel.
        gel: GelRef,
        /// Strength now.
        from: f64,
        /// Strength to use.
        to: f64,
    },
    /// Change a source's level (negative = less light), in thirds of a stop.
    Level {
        /// The source.
        source: SourceId,
        /// Change in stops.
        stops: f64,
    },
    /// Switch a source off.
    SwitchOff {
        /// The source.
        source: SourceId,
    },
    /// Change the camera's white balance.
    WhiteBalance {
        /// The new setting.
        to: WhiteBalanceSetting,
    },
    /// Change which colour-correction matrix the camera uses.
    Matrix {
        /// The new mode.
        to: MatrixMode,
    },
}

impl Move {
    /// The source the move acts on, if any.
    #[must_use]
    pub fn source(&self) -> Option<SourceId> {
        match self {
            Move::AddGel { source, .. }
            | Move::RemoveGel { source, .. }
            | Move::ChangeGel { source, .. }
            | Move::Level { source, .. }
            | Move::SwitchOff { source } => Some(*source),
            Move::WhiteBalance { .. } | Move::Matrix { .. } => None,
        }
    }
}

/// Apply moves to a copy of the plan. Moves that name a source no longer in
/// the plan are skipped; the result is one edit (one undo step in the window).
#[must_use]
pub fn apply_moves(plan: &Plan, moves: &[Move]) -> Plan {
    let mut out = plan.clone();
    for m in moves {
        match m {
            Move::AddGel {
                source,
                gel,
                strength,
            } => {
                if let Some(s) = out.source_mut(*source) {
                    s.gels.push(GelLayer {
                        gel: gel.clone(),
                        strength: *strength,
                    });
                }
            }
            Move::RemoveGel {
                source,
                gel,
                strength,
            } => {
                if let Some(s) = out.source_mut(*source)
                    && let Some(i) = find_layer(&s.gels, gel, *strength)
                {
                    s.gels.remove(i);
                }
            }
            Move::ChangeGel {
                source,
                gel,
                from,
                to,
            } => {
                if let Some(s) = out.source_mut(*source)
                    && let Some(i) = find_layer(&s.gels, gel, *from)
                {
                    s.gels[i].strength = *to;
                }
            }
            Move::Level { source, stops } => scale_source(&mut out, *source, stops.exp2()),
            Move::SwitchOff { source } => {
                if let Some(s) = out.source_mut(*source) {
                    s.enabled = false;
                }
            }
            Move::WhiteBalance { to } => out.camera.white_balance = to.clone(),
            Move::Matrix { to } => out.camera.matrix = *to,
        }
    }
    out
}

/// The layer holding `gel` at `strength` (or, failing that, the first layer of `gel`).
fn find_layer(layers: &[GelLayer], gel: &GelRef, strength: f64) -> Option<usize> {
    layers
        .iter()
        .position(|l| &l.gel == gel && (l.strength - strength).abs() < 1e-9)
        .or_else(|| layers.iter().position(|l| &l.gel == gel))
}

/// Scale a source's output by `factor`: its own level and every zone level
/// given in lux or by rated output (a dimmed fixture is dimmer everywhere;
/// levels given as the source's own or in stops from it follow by themselves).
fn scale_source(plan: &mut Plan, id: SourceId, factor: f64) {
    if let Some(s) = plan.source_mut(id) {
        s.level_lux *= factor;
    }
    for zone in &mut plan.zones {
        for reach in zone.reach.iter_mut().filter(|r| r.source == id) {
            match &mut reach.level {
                ZoneLevel::Lux(l) => *l *= factor,
                ZoneLevel::Distance {
                    rated_lux_at_1m, ..
                } => *rated_lux_at_1m *= factor,
                ZoneLevel::AsSource | ZoneLevel::Stops(_) => {}
            }
        }
    }
}

/// Moves that turn the gel stack `old` into `new` on one source: layers kept
/// as they are produce no move; a gel whose strength changes is one "change";
/// the rest are added or taken off.
#[must_use]
pub fn gel_moves(source: SourceId, old: &[GelLayer], new: &[GelLayer]) -> Vec<Move> {
    let same = |a: f64, b: f64| (a - b).abs() < 1e-9;
    let mut old_left: Vec<&GelLayer> = old.iter().collect();
    let mut new_left: Vec<&GelLayer> = Vec::new();
    for layer in new {
        if let Some(i) = old_left
            .iter()
            .position(|o| o.gel == layer.gel && same(o.strength, layer.strength))
        {
            old_left.remove(i);
        } else {
            new_left.push(layer);
        }
    }
    let mut moves = Vec::new();
    let mut added = Vec::new();
    for layer in new_left {
        if let Some(i) = old_left.iter().position(|o| o.gel == layer.gel) {
            let o = old_left.remove(i);
            moves.push(Move::ChangeGel {
                source,
                gel: layer.gel.clone(),
                from: o.strength,
                to: layer.strength,
            });
        } else {
            added.push(Move::AddGel {
                source,
                gel: layer.gel.clone(),
                strength: layer.strength,
            });
        }
    }
    let removed = old_left.into_iter().map(|o| Move::RemoveGel {
        source,
        gel: o.gel.clone(),
        strength: o.strength,
    });
    // Off first, then changes, then on: the order a crew works in.
    let mut out: Vec<Move> = removed.collect();
    out.append(&mut moves);
    out.append(&mut added);
    out
}

/// One gel at one strength that a source may carry.
#[derive(Debug, Clone)]
pub(crate) struct LayerItem {
    /// The gel.
    pub gel: GelRef,
    /// Fraction of the full gel.
    pub strength: f64,
    /// Items with the same key are the same gel (at most one per stack unless
    /// both are already on the source).
    pub gel_key: usize,
    /// Already on the source (kept as it is); otherwise from the kit.
    pub existing: bool,
    /// Transmittance at this strength on the grid.
    pub transmittance: Box<[f64; GRID_LEN]>,
}

/// A gel stack: sorted indices into [`SourceSpace::items`].
pub(crate) type Stack = Vec<u16>;

/// What one source may become.
#[derive(Debug, Clone)]
pub(crate) struct SourceSpace {
    /// Index of the source in `plan.sources`.
    pub plan_index: usize,
    /// Its id.
    pub id: SourceId,
    /// Gels it may carry.
    pub items: Vec<LayerItem>,
    /// Its gels now, as items.
    pub current: Stack,
    /// Most layers a changed stack may have.
    pub max_layers: usize,
    /// The advisor may change it (unlocked and lighting the scene).
    pub free: bool,
    /// It may be switched off.
    pub can_switch_off: bool,
    /// Lowest level step, thirds of a stop (negative).
    pub min_thirds: i32,
    /// Highest level step, thirds of a stop.
    pub max_thirds: i32,
}

impl SourceSpace {
    /// Whether `stack` is allowed: the current stack always is; any other must
    /// fit the layer limit and carry each kit gel once.
    pub fn stack_ok(&self, stack: &[u16]) -> bool {
        if stack == self.current.as_slice() {
            return true;
        }
        if stack.len() > self.max_layers {
            return false;
        }
        for (i, a) in stack.iter().enumerate() {
            let ia = &self.items[usize::from(*a)];
            for b in &stack[i + 1..] {
                let ib = &self.items[usize::from(*b)];
                if ia.gel_key == ib.gel_key && !(ia.existing && ib.existing) {
                    return false;
                }
            }
        }
        true
    }

    /// The gel layers of a stack, in item order.
    pub fn layers(&self, stack: &[u16]) -> Vec<GelLayer> {
        stack
            .iter()
            .map(|i| {
                let it = &self.items[usize::from(*i)];
                GelLayer {
                    gel: it.gel.clone(),
                    strength: it.strength,
                }
            })
            .collect()
    }

    /// Transmittance of a stack on the grid.
    pub fn stack_transmittance(&self, stack: &[u16]) -> [f64; GRID_LEN] {
        let mut t = [1.0; GRID_LEN];
        for i in stack {
            for (v, g) in t
                .iter_mut()
                .zip(self.items[usize::from(*i)].transmittance.iter())
            {
                *v *= g;
            }
        }
        t
    }
}

/// The transmittance of a gel reference at full strength.
fn gel_transmittance(plan: &Plan, gel: &GelRef) -> Result<Transmittance> {
    crate::resolve::gel_transmittance(plan, gel)
}

/// Whether a transmittance is neutral (flat over 380–780 nm within 2 %).
fn is_neutral(t: &[f64; GRID_LEN]) -> bool {
    let visible = t
        .iter()
        .enumerate()
        .filter(|(i, _)| (380.0..=780.0).contains(&grid_wavelength_nm(*i)))
        .map(|(_, v)| *v);
    let (lo, hi) = visible.fold((f64::INFINITY, 0.0_f64), |(lo, hi), v| {
        (lo.min(v), hi.max(v))
    });
    lo > 0.0 && hi / lo < NEUTRAL_RATIO
}

fn powered(t: &Transmittance, strength: f64) -> Box<[f64; GRID_LEN]> {
    let mut out = Box::new([0.0; GRID_LEN]);
    for (o, v) in out.iter_mut().zip(t.values()) {
        *o = if strength == 0.0 {
            1.0
        } else {
            v.powf(strength)
        };
    }
    out
}

/// The library gels the kit offers as colour moves (not neutral), with their
/// full-strength transmittance.
pub(crate) fn kit_colour_gels(plan: &Plan) -> Result<Vec<(GelRef, Transmittance)>> {
    let mut out = Vec::new();
    for entry in library::gels() {
        if !plan.kit.gels.is_empty() && !plan.kit.gels.iter().any(|g| g == entry.id) {
            continue;
        }
        let t = entry.transmittance()?;
        if is_neutral(t.values()) {
            continue;
        }
        out.push((GelRef::Library(entry.id.to_string()), t.clone()));
    }
    Ok(out)
}

/// Every source's options under the plan's kit.
pub(crate) fn source_spaces(plan: &Plan, options: &AdvisorOptions) -> Result<Vec<SourceSpace>> {
    let kit = kit_colour_gels(plan)?;
    let any_solo = plan.sources.iter().any(|s| s.solo && s.enabled);
    let max_layers = usize::from(plan.kit.max_stack).min(MAX_LAYERS_SEARCHED);
    let max_loss_thirds = (plan.kit.max_stops_lost.max(0.0) * 3.0 + 1e-9).floor() as i32;
    let max_raise_thirds = (options.max_raise_stops.max(0.0) * 3.0 + 1e-9).floor() as i32;
    let mut spaces = Vec::with_capacity(plan.sources.len());
    for (plan_index, source) in plan.sources.iter().enumerate() {
        let free = !source.locked && plan.is_lit(source);
        let mut keys: Vec<GelRef> = Vec::new();
        let mut key_of = |g: &GelRef| {
            keys.iter().position(|k| k == g).unwrap_or_else(|| {
                keys.push(g.clone());
                keys.len() - 1
            })
        };
        let mut items = Vec::new();
        if free {
            for (gel, t) in &kit {
                let key = key_of(gel);
                for k in 1..=STRENGTH_STEPS {
                    let strength = f64::from(k) / f64::from(STRENGTH_STEPS);
                    items.push(LayerItem {
                        gel: gel.clone(),
                        strength,
                        gel_key: key,
                        existing: false,
                        transmittance: powered(t, strength),
                    });
                }
            }
        }
        let mut current = Vec::new();
        for layer in &source.gels {
            let key = key_of(&layer.gel);
            let kit_item = items.iter().position(|it| {
                !it.existing && it.gel == layer.gel && (it.strength - layer.strength).abs() < 1e-9
            });
            let taken = |i: usize| current.contains(&(i as u16));
            let index = match kit_item {
                Some(i) if !taken(i) => i,
                _ => {
                    let t = gel_transmittance(plan, &layer.gel)?;
                    items.push(LayerItem {
                        gel: layer.gel.clone(),
                        strength: layer.strength,
                        gel_key: key,
                        existing: true,
                        transmittance: powered(&t, layer.strength.max(0.0)),
                    });
                    items.len() - 1
                }
            };
            current.push(index as u16);
        }
        current.sort_unstable();
        spaces.push(SourceSpace {
            plan_index,
            id: source.id,
            items,
            current,
            max_layers,
            free,
            can_switch_off: free && !any_solo,
            min_thirds: if free { -max_loss_thirds } else { 0 },
            max_thirds: if free { max_raise_thirds } else { 0 },
        });
    }
    Ok(spaces)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{Source, Zone, ZoneReach};

    fn layer(id: &str, s: f64) -> GelLayer {
        GelLayer {
            gel: GelRef::Library(id.into()),
            strength: s,
        }
    }

    #[test]
    fn gel_diff_names_adds_changes_and_removals() {
        let old = [layer("cto-full", 0.25), layer("plus-green-full", 0.5)];
        let new = [layer("cto-full", 0.5), layer("minus-green-full", 0.125)];
        let moves = gel_moves(7, &old, &new);
        assert_eq!(
            moves,
            vec![
                Move::RemoveGel {
                    source: 7,
                    gel: GelRef::Library("plus-green-full".into()),
                    strength: 0.5
                },
                Move::ChangeGel {
                    source: 7,
                    gel: GelRef::Library("cto-full".into()),
                    from: 0.25,
                    to: 0.5
                },
                Move::AddGel {
                    source: 7,
                    gel: GelRef::Library("minus-green-full".into()),
                    strength: 0.125
                },
            ]
        );
        assert!(gel_moves(7, &old, &old).is_empty());
    }

    #[test]
    fn applying_the_diff_gives_the_new_stack() {
        let old = vec![layer("cto-full", 0.25), layer("plus-green-full", 0.5)];
        let new = vec![layer("minus-green-full", 0.125), layer("cto-full", 0.5)];
        let plan = Plan {
            sources: vec![Source {
                id: 3,
                gels: old.clone(),
                ..Source::default()
            }],
            ..Plan::default()
        };
        let out = apply_moves(&plan, &gel_moves(3, &old, &new));
        let mut got = out.sources[0].gels.clone();
        let mut want = new;
        let key = |l: &GelLayer| format!("{:?}{}", l.gel, l.strength);
        got.sort_by_key(key);
        want.sort_by_key(key);
        assert_eq!(got, want);
    }

    #[test]
    fn level_moves_scale_every_zone_level_of_the_fixture() {
        let plan = Plan {
            sources: vec![Source {
                id: 1,
                level_lux: 800.0,
                ..Source::default()
            }],
            zones: vec![Zone {
                id: 1,
                name: "Far".into(),
                reach: vec![
                    ZoneReach {
                        source: 1,
                        level: ZoneLevel::Lux(100.0),
                    },
                    ZoneReach {
                        source: 1,
                        level: ZoneLevel::Stops(-1.0),
                    },
                ],
                weight: 1.0,
            }],
            ..Plan::default()
        };
        let out = apply_moves(
            &plan,
            &[Move::Level {
                source: 1,
                stops: -1.0,
            }],
        );
        assert!((out.sources[0].level_lux - 400.0).abs() < 1e-9);
        assert_eq!(out.zones[0].reach[0].level, ZoneLevel::Lux(50.0));
        assert_eq!(out.zones[0].reach[1].level, ZoneLevel::Stops(-1.0));
        // Unknown sources are skipped, not a panic.
        let same = apply_moves(&plan, &[Move::SwitchOff { source: 99 }]);
        assert_eq!(same, plan);
    }

    #[test]
    fn neutral_filters_are_recognised() {
        assert!(is_neutral(&[0.5; GRID_LEN]));
        let mut ramp = [0.5; GRID_LEN];
        ramp[200] = 0.3;
        assert!(!is_neutral(&ramp));
    }
}
