//! Candidates of the search: what each source becomes, the table of gel
//! stacks met so far, how many moves a candidate makes, and the small hasher
//! and random generator the search uses.

use super::moves::{SourceSpace, Stack};
use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};

/// A small, fast hasher for the search's integer keys (the multiply-rotate of `FxHash`).
#[derive(Default, Clone, Copy)]
pub(crate) struct FastHasher(u64);

impl Hasher for FastHasher {
    fn finish(&self) -> u64 {
        self.0
    }
    fn write(&mut self, bytes: &[u8]) {
        for b in bytes {
            self.write_u64(u64::from(*b));
        }
    }
    fn write_u8(&mut self, i: u8) {
        self.write_u64(u64::from(i));
    }
    fn write_u16(&mut self, i: u16) {
        self.write_u64(u64::from(i));
    }
    fn write_u32(&mut self, i: u32) {
        self.write_u64(u64::from(i));
    }
    fn write_usize(&mut self, i: usize) {
        self.write_u64(i as u64);
    }
    fn write_u64(&mut self, i: u64) {
        self.0 = (self.0.rotate_left(5) ^ i).wrapping_mul(0x51_7c_c1_b7_27_22_0a_95);
    }
}

/// Hash maps keyed by the search's small integer keys.
pub(crate) type FastMap<K, V> = HashMap<K, V, BuildHasherDefault<FastHasher>>;

/// One source in a candidate.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub(crate) enum SourceState {
    /// Lit, with a gel stack (an id in the [`StackTable`]) and a level change
    /// in thirds of a stop (negative = less light).
    On {
        /// Stack id.
        stack: u32,
        /// Level change, thirds of a stop.
        thirds: i16,
    },
    /// Switched off.
    Off,
}

/// A candidate: every source's state and a camera option (0 = as it stands).
#[derive(Debug, Clone, PartialEq, Eq, Hash)]
pub(crate) struct State {
    /// Per source, plan order.
    pub sources: Vec<SourceState>,
    /// Index into the camera options.
    pub camera: usize,
}

/// Every gel stack the search has met, per source, with a small id each.
#[derive(Debug, Default)]
pub(crate) struct StackTable {
    stacks: Vec<Vec<Stack>>,
    ids: Vec<FastMap<Stack, u32>>,
}

impl StackTable {
    /// A table for `sources` sources, each holding its current stack as id 0.
    pub fn new(spaces: &[SourceSpace]) -> StackTable {
        let mut t = StackTable {
            stacks: vec![Vec::new(); spaces.len()],
            ids: vec![FastMap::default(); spaces.len()],
        };
        for (s, space) in spaces.iter().enumerate() {
            t.id(s, space.current.clone());
        }
        t
    }

    /// The id of `stack` on source `s` (sorted item indices), added if new.
    pub fn id(&mut self, s: usize, stack: Stack) -> u32 {
        if let Some(id) = self.ids[s].get(&stack) {
            return *id;
        }
        let id = self.stacks[s].len() as u32;
        self.stacks[s].push(stack.clone());
        self.ids[s].insert(stack, id);
        id
    }

    /// The stack with id `id` on source `s`.
    pub fn get(&self, s: usize, id: u32) -> &[u16] {
        &self.stacks[s][id as usize]
    }
}

/// The plan as it stands (every current stack has id 0).
pub(crate) fn current_state(spaces: &[SourceSpace]) -> State {
    State {
        sources: vec![
            SourceState::On {
                stack: 0,
                thirds: 0
            };
            spaces.len()
        ],
        camera: 0,
    }
}

/// Number of moves a candidate makes (gel edits, level, off, camera).
pub(crate) fn move_count(
    spaces: &[SourceSpace],
    stacks: &StackTable,
    state: &State,
    camera_moves: usize,
) -> usize {
    let mut n = camera_moves;
    for (s, (space, st)) in spaces.iter().zip(&state.sources).enumerate() {
        match st {
            SourceState::Off => n += 1,
            SourceState::On { stack, thirds } => {
                n += usize::from(*thirds != 0);
                if *stack != 0 {
                    n += gel_edit_count(space, &space.current, stacks.get(s, *stack));
                }
            }
        }
    }
    n
}

/// Gel moves between two stacks: each gel kept at another strength counts one,
/// each added or removed gel one.
fn gel_edit_count(space: &SourceSpace, old: &[u16], new: &[u16]) -> usize {
    let key = |i: &u16| space.items[usize::from(*i)].gel_key;
    let removed: Vec<&u16> = old.iter().filter(|i| !new.contains(i)).collect();
    let added: Vec<&u16> = new.iter().filter(|i| !old.contains(i)).collect();
    let mut used = vec![false; added.len()];
    let mut changes = 0;
    for r in &removed {
        if let Some(j) = (0..added.len()).find(|j| !used[*j] && key(added[*j]) == key(r)) {
            used[j] = true;
            changes += 1;
        }
    }
    removed.len() + added.len() - changes
}

/// A small deterministic generator (`SplitMix64`), so advice is reproducible.
pub(crate) struct SplitMix(pub u64);

impl SplitMix {
    pub fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    pub fn below(&mut self, n: usize) -> usize {
        if n == 0 {
            0
        } else {
            (self.next() % n as u64) as usize
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splitmix_is_deterministic_and_bounded() {
        let mut a = SplitMix(7);
        let mut b = SplitMix(7);
        for _ in 0..100 {
            let (x, y) = (a.below(13), b.below(13));
            assert_eq!(x, y);
            assert!(x < 13);
        }
        assert_eq!(SplitMix(1).below(0), 0);
    }

    #[test]
    fn fast_hasher_separates_small_keys() {
        let mut seen = std::collections::HashSet::new();
        for i in 0..10_000u64 {
            let mut h = FastHasher::default();
            h.write_u64(i);
            seen.insert(h.finish());
        }
        assert_eq!(seen.len(), 10_000);
    }
}
