//! Undo and redo as stacks of whole plans.
//!
//! A plan is small (a few kilobytes, embedded spectra included), so keeping
//! full snapshots is simpler and exacter than inverse commands: undo gives back
//! precisely the plan that was there before.

use super::command::CoalesceKey;
use lampwright_plan::Plan;

/// How many steps undo keeps.
pub const UNDO_LIMIT: usize = 200;

/// Undo and redo stacks.
#[derive(Debug, Default)]
pub struct History {
    undo: Vec<Plan>,
    redo: Vec<Plan>,
    /// While set, further edits with the same key join the last undo step.
    open: Option<CoalesceKey>,
}

impl History {
    /// Record the plan as it was just before an edit with this key.
    pub fn record(&mut self, before: &Plan, key: Option<CoalesceKey>) {
        if key.is_some() && key == self.open {
            return;
        }
        self.undo.push(before.clone());
        if self.undo.len() > UNDO_LIMIT {
            self.undo.remove(0);
        }
        self.redo.clear();
        self.open = key;
    }

    /// End the current drag or typing burst: the next edit starts a new step.
    pub fn seal(&mut self) {
        self.open = None;
    }

    /// Step back. Returns false when there is nothing to undo.
    pub fn undo(&mut self, current: &mut Plan) -> bool {
        self.open = None;
        match self.undo.pop() {
            Some(previous) => {
                self.redo.push(std::mem::replace(current, previous));
                true
            }
            None => false,
        }
    }

    /// Step forward again. Returns false when there is nothing to redo.
    pub fn redo(&mut self, current: &mut Plan) -> bool {
        self.open = None;
        match self.redo.pop() {
            Some(next) => {
                self.undo.push(std::mem::replace(current, next));
                true
            }
            None => false,
        }
    }

    /// Forget everything (a new plan was opened).
    pub fn clear(&mut self) {
        *self = History::default();
    }

    /// Number of undo steps available.
    #[must_use]
    pub fn undo_len(&self) -> usize {
        self.undo.len()
    }

    /// Number of redo steps available.
    #[must_use]
    pub fn redo_len(&self) -> usize {
        self.redo.len()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn named(name: &str) -> Plan {
        Plan {
            name: name.into(),
            ..Plan::default()
        }
    }

    #[test]
    fn undo_and_redo_walk_the_snapshots() {
        let mut history = History::default();
        let mut plan = named("a");
        history.record(&plan, None);
        plan = named("b");
        history.record(&plan, None);
        plan = named("c");
        assert!(history.undo(&mut plan));
        assert_eq!(plan.name, "b");
        assert!(history.undo(&mut plan));
        assert_eq!(plan.name, "a");
        assert!(!history.undo(&mut plan));
        assert!(history.redo(&mut plan));
        assert!(history.redo(&mut plan));
        assert_eq!(plan.name, "c");
        assert!(!history.redo(&mut plan));
    }

    #[test]
    fn a_drag_is_one_step_until_sealed() {
        let mut history = History::default();
        let key = Some(CoalesceKey::SourceLevel(1));
        let mut plan = named("start");
        for i in 0..10 {
            history.record(&plan, key);
            plan = named(&format!("drag {i}"));
        }
        assert_eq!(history.undo_len(), 1);
        history.seal();
        history.record(&plan, key);
        assert_eq!(history.undo_len(), 2);
        plan = named("end");
        assert!(history.undo(&mut plan));
        assert!(history.undo(&mut plan));
        assert_eq!(plan.name, "start");
    }

    #[test]
    fn a_new_edit_clears_redo() {
        let mut history = History::default();
        let mut plan = named("a");
        history.record(&plan, None);
        plan = named("b");
        history.undo(&mut plan);
        assert_eq!(history.redo_len(), 1);
        history.record(&plan, None);
        assert_eq!(history.redo_len(), 0);
    }
}
