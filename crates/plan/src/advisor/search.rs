//! The search over moves: exhaustive where the space is small, coordinate
//! descent with restarts where it is not.
//!
//! A candidate ([`State`]) gives every source a gel stack and a level step (or
//! switches it off) and picks one camera option. Its ranking cost is the
//! goal's cost from the search model plus charges for light lost and for each
//! move ([`Goal::ranking_total`](super::goal::Goal::ranking_total)), so that
//! of two nearly equal answers the simpler ranks first.
//!
//! **Exhaustive** when the product of every source's options and the camera
//! options is at most `AdvisorOptions::exhaustive_limit`: every candidate is
//! scored.
//!
//! **Coordinate descent with restarts** otherwise. From a start, it sweeps the
//! coordinates in turn and moves to the best candidate of each when it lowers
//! the cost:
//! - for each free source, its gel stack by single-layer edits: take one gel
//!   off; set one gel to any strength; swap one gel for another gel; add a gel
//!   (new gels are tried at 1/8, 1/4, 1/2, 3/4 and full — the finer eighths
//!   are reached by the strength edit on the next sweep);
//! - its level, every 1/3-stop step; switching it off;
//! - the camera: every white-balance option.
//!
//! With the quality goal, whose full score is costly, each source's sweep is
//! first ranked with a cheap proxy and only the best few
//! (`SearchSettings::confirm`) are scored in full.
//!
//! Sweeps repeat until none improves. Starts: the plan as it stands, the plan
//! with every free source's gels taken off, and seeded random stacks (a fixed
//! seed, so the same plan always gets the same advice). Scene profiles (a
//! matrix fitted under the candidate's light, the one costly camera option)
//! are tried last, on the best distinct lights found. Every scored candidate
//! goes into a pool, from which the best distinct answers are taken.

use super::candidate::SplitMix;
pub(crate) use super::candidate::{
    FastMap, SourceState, StackTable, State, current_state, move_count,
};
use super::moves::{SourceSpace, Stack};

/// Scores candidates with the search model.
pub(crate) trait Scorer {
    /// Ranking cost of a candidate without the charge for moves; `None` when
    /// it cannot be scored (dark, off the locus, ...).
    fn cost(&mut self, state: &State, stacks: &StackTable) -> Option<f64>;
    /// Fraction of the lamp's light that stack `id` passes on source `s`.
    fn transmission(&mut self, s: usize, id: u32, stacks: &StackTable) -> f64;
    /// Whether [`Scorer::screen`] offers a cheaper proxy of the cost.
    fn screening(&self) -> bool {
        false
    }
    /// A cheap proxy of [`Scorer::cost`], used to choose which candidates of a
    /// sweep to score in full.
    fn screen(&mut self, state: &State, stacks: &StackTable) -> Option<f64> {
        self.cost(state, stacks)
    }
}

/// How the search ran.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum SearchMethod {
    /// Every candidate scored.
    Exhaustive,
    /// Coordinate descent with restarts.
    CoordinateDescent,
}

/// Search settings.
#[derive(Debug, Clone)]
pub(crate) struct SearchSettings {
    pub exhaustive_limit: usize,
    pub restarts: usize,
    pub max_sweeps: usize,
    pub seed: u64,
    pub cost_per_move: f64,
    pub max_stops_lost: f64,
    /// Camera options swept in the descent (0, the plan's own, first).
    pub camera_sweep: Vec<usize>,
    /// Costly camera options tried last on the best lights.
    pub camera_last: Vec<usize>,
    /// Distinct lights the last camera options are tried on.
    pub last_lights: usize,
    /// With a screening scorer, candidates of each sweep scored in full.
    pub confirm: usize,
}

/// What the search found: every scored candidate with its ranking cost.
#[derive(Debug)]
pub(crate) struct SearchOutcome {
    pub pool: FastMap<State, f64>,
    pub stacks: StackTable,
    pub method: SearchMethod,
    pub scored: usize,
}

/// Strengths (in eighths) at which a gel new to a stack is first tried.
const COARSE_EIGHTHS: [u8; 5] = [1, 2, 4, 6, 8];

struct Runner<'a> {
    scorer: &'a mut dyn Scorer,
    spaces: &'a [SourceSpace],
    settings: &'a SearchSettings,
    /// Moves each camera option makes (0 for the plan's own).
    camera_moves: &'a [usize],
    stacks: StackTable,
    pool: FastMap<State, f64>,
    scored: usize,
}

impl Runner<'_> {
    /// Ranking cost of a candidate (memoised); `None` when unscorable.
    fn total(&mut self, state: &State) -> Option<f64> {
        if let Some(c) = self.pool.get(state) {
            return Some(*c);
        }
        let c = self.scorer.cost(state, &self.stacks)?;
        self.scored += 1;
        let moves = move_count(
            self.spaces,
            &self.stacks,
            state,
            self.camera_moves[state.camera],
        );
        let total = c + self.settings.cost_per_move * moves as f64;
        self.pool.insert(state.clone(), total);
        Some(total)
    }

    /// Whether a source state keeps within the kit's light-loss limit and level range.
    fn feasible(&mut self, s: usize, st: SourceState) -> bool {
        let space = &self.spaces[s];
        match st {
            SourceState::Off => space.can_switch_off,
            SourceState::On { stack, thirds } => {
                if !space.free {
                    return stack == 0 && thirds == 0;
                }
                let thirds = i32::from(thirds);
                if thirds < space.min_thirds || thirds > space.max_thirds {
                    return false;
                }
                if stack != 0 && !space.stack_ok(self.stacks.get(s, stack)) {
                    return false;
                }
                let now = self.scorer.transmission(s, 0, &self.stacks);
                let new = self.scorer.transmission(s, stack, &self.stacks);
                let lost_to_gels = if stack == 0 {
                    0.0
                } else if new > 0.0 && now > 0.0 {
                    (now / new).log2()
                } else {
                    return false;
                };
                lost_to_gels - f64::from(thirds) / 3.0 <= self.settings.max_stops_lost + 1e-9
            }
        }
    }

    fn item_eighths(&self, s: usize, i: u16) -> u8 {
        let it = &self.spaces[s].items[usize::from(i)];
        (it.strength * 8.0).round() as u8
    }

    /// Items of the same gel as `i` (kit items only), with their eighths.
    fn siblings(&self, s: usize, i: u16) -> Vec<u16> {
        let items = &self.spaces[s].items;
        let it = &items[usize::from(i)];
        (0..items.len() as u16)
            .filter(|j| {
                *j != i
                    && !items[usize::from(*j)].existing
                    && items[usize::from(*j)].gel_key == it.gel_key
            })
            .collect()
    }

    /// Single-layer edits and level steps of source `s`.
    fn neighbours(&mut self, s: usize, st: SourceState) -> Vec<SourceState> {
        let SourceState::On { stack, thirds } = st else {
            return vec![SourceState::On {
                stack: 0,
                thirds: 0,
            }];
        };
        let space = &self.spaces[s];
        let current: Stack = self.stacks.get(s, stack).to_vec();
        let n_items = space.items.len() as u16;
        let in_stack_keys: Vec<usize> = current
            .iter()
            .map(|i| space.items[usize::from(*i)].gel_key)
            .collect();
        let coarse = |this: &Self, i: u16| {
            let it = &this.spaces[s].items[usize::from(i)];
            it.existing || COARSE_EIGHTHS.contains(&this.item_eighths(s, i))
        };
        let mut stacks: Vec<Stack> = Vec::new();
        for p in 0..current.len() {
            let mut removed = current.clone();
            removed.remove(p);
            stacks.push(removed.clone());
            // Same gel at every other strength.
            for j in self.siblings(s, current[p]) {
                let mut v = removed.clone();
                v.push(j);
                stacks.push(v);
            }
            // Another gel, at the coarse strengths.
            for i in 0..n_items {
                let key = space.items[usize::from(i)].gel_key;
                if in_stack_keys.contains(&key) || !coarse(self, i) {
                    continue;
                }
                let mut v = removed.clone();
                v.push(i);
                stacks.push(v);
            }
        }
        if current.len() < space.max_layers {
            for i in 0..n_items {
                let key = space.items[usize::from(i)].gel_key;
                if in_stack_keys.contains(&key) || !coarse(self, i) {
                    continue;
                }
                let mut v = current.clone();
                v.push(i);
                stacks.push(v);
            }
        }
        let mut out = Vec::with_capacity(stacks.len() + 8);
        for mut v in stacks {
            v.sort_unstable();
            if self.spaces[s].stack_ok(&v) {
                let id = self.stacks.id(s, v);
                out.push(SourceState::On { stack: id, thirds });
            }
        }
        let (lo, hi) = (self.spaces[s].min_thirds, self.spaces[s].max_thirds);
        for t in lo..=hi {
            let t = t as i16;
            if t != thirds {
                out.push(SourceState::On { stack, thirds: t });
            }
        }
        if self.spaces[s].can_switch_off {
            out.push(SourceState::Off);
        }
        out
    }

    /// Coordinate descent from `start`.
    fn descend(&mut self, start: State) {
        let Some(mut best) = self.total(&start) else {
            return;
        };
        let mut state = start;
        for _ in 0..self.settings.max_sweeps {
            let mut improved = false;
            for s in 0..self.spaces.len() {
                if self.spaces[s].free {
                    improved |= self.sweep_source(&mut state, s, &mut best);
                }
            }
            improved |= self.sweep_camera(&mut state, &mut best);
            if !improved {
                break;
            }
        }
    }

    /// Move source `s` to its best neighbour when that lowers the cost.
    fn sweep_source(&mut self, state: &mut State, s: usize, best: &mut f64) -> bool {
        let mut alts: Vec<SourceState> = Vec::new();
        for alt in self.neighbours(s, state.sources[s]) {
            if self.feasible(s, alt) {
                alts.push(alt);
            }
        }
        if self.scorer.screening() && alts.len() > self.settings.confirm {
            alts = self.screened(state, s, alts);
        }
        let mut pick: Option<(SourceState, f64)> = None;
        for alt in alts {
            let mut cand = state.clone();
            cand.sources[s] = alt;
            if let Some(c) = self.total(&cand)
                && c < *best - 1e-12
                && pick.is_none_or(|(_, pc)| c < pc)
            {
                pick = Some((alt, c));
            }
        }
        let Some((alt, c)) = pick else { return false };
        state.sources[s] = alt;
        *best = c;
        true
    }

    /// The `confirm` alternatives for source `s` the cheap proxy ranks best.
    fn screened(&mut self, state: &State, s: usize, alts: Vec<SourceState>) -> Vec<SourceState> {
        let mut ranked: Vec<(SourceState, f64)> = Vec::with_capacity(alts.len());
        for alt in alts {
            let mut cand = state.clone();
            cand.sources[s] = alt;
            if let Some(c) = self.scorer.screen(&cand, &self.stacks) {
                let moves = move_count(
                    self.spaces,
                    &self.stacks,
                    &cand,
                    self.camera_moves[cand.camera],
                );
                ranked.push((alt, c + self.settings.cost_per_move * moves as f64));
            }
        }
        ranked.sort_by(|a, b| a.1.total_cmp(&b.1));
        ranked
            .into_iter()
            .take(self.settings.confirm)
            .map(|(a, _)| a)
            .collect()
    }

    /// Move to the best camera option when that lowers the cost.
    fn sweep_camera(&mut self, state: &mut State, best: &mut f64) -> bool {
        let mut pick = None;
        for i in 0..self.settings.camera_sweep.len() {
            let cam = self.settings.camera_sweep[i];
            if cam == state.camera {
                continue;
            }
            let cand = State {
                camera: cam,
                ..state.clone()
            };
            if let Some(c) = self.total(&cand)
                && c < *best - 1e-12
                && pick.is_none_or(|(_, pc)| c < pc)
            {
                pick = Some((cam, c));
            }
        }
        let Some((cam, c)) = pick else { return false };
        state.camera = cam;
        *best = c;
        true
    }

    /// Every candidate of a small space, for every camera option.
    fn exhaust(&mut self, per_source: &[Vec<SourceState>]) {
        let cameras: Vec<usize> = self
            .settings
            .camera_sweep
            .iter()
            .chain(&self.settings.camera_last)
            .copied()
            .collect();
        let mut idx = vec![0usize; per_source.len()];
        loop {
            let sources: Vec<SourceState> =
                idx.iter().zip(per_source).map(|(i, o)| o[*i]).collect();
            for &camera in &cameras {
                self.total(&State {
                    sources: sources.clone(),
                    camera,
                });
            }
            // Odometer increment.
            let mut k = 0;
            loop {
                if k == idx.len() {
                    return;
                }
                idx[k] += 1;
                if idx[k] < per_source[k].len() {
                    break;
                }
                idx[k] = 0;
                k += 1;
            }
        }
    }

    /// A seeded random start: random stacks on the free sources, a random camera option.
    fn random_start(&mut self, start: &State, rng: &mut SplitMix) -> State {
        let mut st = start.clone();
        for (s, space) in self.spaces.iter().enumerate() {
            if !space.free || space.items.is_empty() {
                continue;
            }
            let layers = rng.below(space.max_layers + 1);
            let mut stack: Stack = Vec::new();
            for _ in 0..layers {
                let i = rng.below(space.items.len()) as u16;
                let mut v = stack.clone();
                if !v.contains(&i) {
                    v.push(i);
                    v.sort_unstable();
                    if space.stack_ok(&v) {
                        stack = v;
                    }
                }
            }
            let id = self.stacks.id(s, stack);
            let cand = SourceState::On {
                stack: id,
                thirds: 0,
            };
            if self.feasible(s, cand) {
                st.sources[s] = cand;
            }
        }
        if !self.settings.camera_sweep.is_empty() {
            st.camera = self.settings.camera_sweep[rng.below(self.settings.camera_sweep.len())];
        }
        st
    }

    /// Descents from the plan, from the plan with its gels off, and from random starts.
    fn descents(&mut self, start: &State) {
        self.descend(start.clone());
        let mut bare = start.clone();
        for (s, space) in self.spaces.iter().enumerate() {
            if space.free {
                let id = self.stacks.id(s, Vec::new());
                bare.sources[s] = SourceState::On {
                    stack: id,
                    thirds: 0,
                };
            }
        }
        if &bare != start && (0..self.spaces.len()).all(|s| self.feasible(s, bare.sources[s])) {
            self.descend(bare);
        }
        let mut rng = SplitMix(self.settings.seed);
        for _ in 0..self.settings.restarts {
            let st = self.random_start(start, &mut rng);
            self.descend(st);
        }
        self.try_last_camera_options();
    }

    /// Every valid stack of a source, or `None` when there are more than `limit`.
    fn all_stacks(&mut self, s: usize, limit: usize) -> Option<Vec<u32>> {
        let space = &self.spaces[s];
        let n = space.items.len();
        let mut found: Vec<Stack> = vec![Vec::new()];
        let mut frontier: Vec<Stack> = vec![Vec::new()];
        for _ in 0..space.max_layers {
            let mut next = Vec::new();
            for st in &frontier {
                let from = st.last().map_or(0, |l| usize::from(*l) + 1);
                for i in from..n {
                    let mut v = st.clone();
                    v.push(i as u16);
                    if space.stack_ok(&v) {
                        next.push(v);
                        if found.len() + next.len() > limit {
                            return None;
                        }
                    }
                }
            }
            found.extend(next.iter().cloned());
            frontier = next;
        }
        let mut ids: Vec<u32> = found.into_iter().map(|v| self.stacks.id(s, v)).collect();
        if !ids.contains(&0) {
            ids.push(0);
        }
        Some(ids)
    }

    /// Per-source option lists when the whole space is at most `limit` candidates.
    fn small_space(&mut self, limit: usize) -> Option<Vec<Vec<SourceState>>> {
        let mut per_source = Vec::with_capacity(self.spaces.len());
        let mut product = self.settings.camera_sweep.len().max(1) + self.settings.camera_last.len();
        for s in 0..self.spaces.len() {
            if !self.spaces[s].free {
                per_source.push(vec![SourceState::On {
                    stack: 0,
                    thirds: 0,
                }]);
                continue;
            }
            let stacks = self.all_stacks(s, limit)?;
            let (lo, hi) = (self.spaces[s].min_thirds, self.spaces[s].max_thirds);
            let mut opts = Vec::new();
            for stack in stacks {
                for t in lo..=hi {
                    let st = SourceState::On {
                        stack,
                        thirds: t as i16,
                    };
                    if self.feasible(s, st) {
                        opts.push(st);
                    }
                }
            }
            if self.spaces[s].can_switch_off {
                opts.push(SourceState::Off);
            }
            product = product.saturating_mul(opts.len().max(1));
            if product > limit {
                return None;
            }
            per_source.push(opts);
        }
        Some(per_source)
    }

    /// The costly camera options on the best distinct lights in the pool.
    fn try_last_camera_options(&mut self) {
        if self.settings.camera_last.is_empty() {
            return;
        }
        let mut ranked: Vec<(State, f64)> =
            self.pool.iter().map(|(s, c)| (s.clone(), *c)).collect();
        ranked.sort_by(|a, b| a.1.total_cmp(&b.1));
        let mut lights: Vec<Vec<SourceState>> = Vec::new();
        for (state, _) in ranked {
            if !lights.contains(&state.sources) {
                lights.push(state.sources);
                if lights.len() >= self.settings.last_lights {
                    break;
                }
            }
        }
        let current = current_state(self.spaces).sources;
        if !lights.contains(&current) {
            lights.push(current);
        }
        let last = self.settings.camera_last.clone();
        for sources in lights {
            for &camera in &last {
                self.total(&State {
                    sources: sources.clone(),
                    camera,
                });
            }
        }
    }
}

/// Run the search. `camera_moves[i]` is the number of moves camera option `i` makes.
pub(crate) fn search(
    scorer: &mut dyn Scorer,
    spaces: &[SourceSpace],
    settings: &SearchSettings,
    camera_moves: &[usize],
) -> SearchOutcome {
    let mut runner = Runner {
        scorer,
        spaces,
        settings,
        camera_moves,
        stacks: StackTable::new(spaces),
        pool: FastMap::default(),
        scored: 0,
    };
    let start = current_state(spaces);
    runner.total(&start);
    let method = if let Some(per_source) = runner.small_space(settings.exhaustive_limit.max(1)) {
        runner.exhaust(&per_source);
        SearchMethod::Exhaustive
    } else {
        runner.descents(&start);
        SearchMethod::CoordinateDescent
    };
    SearchOutcome {
        pool: runner.pool,
        stacks: runner.stacks,
        method,
        scored: runner.scored,
    }
}
