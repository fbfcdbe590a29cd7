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
    /// The drag or typing burst under way, if any.
    open: Option<Burst>,
}

/// A drag or typing burst: further edits with its key join its undo step.
/// Starting it took away the redo steps (and, at the limit, the oldest undo
/// step); they come back if it ends where it began.
#[derive(Debug)]
struct Burst {
    key: CoalesceKey,
    redo: Vec<Plan>,
    oldest: Option<Plan>,
}

impl History {
    /// Record the plan as it was just before an edit with this key.
    pub fn record(&mut self, before: &Plan, key: Option<CoalesceKey>) {
        if key.is_some() && key == self.open.as_ref().map(|b| b.key) {
            return;
        }
        self.end_burst(before);
        self.undo.push(before.clone());
        let oldest = (self.undo.len() > UNDO_LIMIT).then(|| self.undo.remove(0));
        let redo = std::mem::take(&mut self.redo);
        self.open = key.map(|key| Burst { key, redo, oldest });
    }

    /// End the current drag or typing burst: the next edit starts a new step.
    pub fn seal(&mut self, current: &Plan) {
        self.end_burst(current);
    }

    /// A burst that ended where it began (a slider dragged away and back, a
    /// name typed and erased) leaves no step, and gives back what starting
    /// it took: undoing it would change nothing.
    fn end_burst(&mut self, current: &Plan) {
        if let Some(burst) = self.open.take()
            && self.undo.last() == Some(current)
        {
            self.undo.pop();
            if let Some(oldest) = burst.oldest {
                self.undo.insert(0, oldest);
            }
            self.redo = burst.redo;
        }
    }

    /// Step back. Returns false when there is nothing to undo.
    pub fn undo(&mut self, current: &mut Plan) -> bool {
        self.end_burst(current);
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
        self.end_burst(current);
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
        history.seal(&plan);
        history.record(&plan, key);
        assert_eq!(history.undo_len(), 2);
        plan = named("end");
        assert!(history.undo(&mut plan));
        assert!(history.undo(&mut plan));
        assert_eq!(plan.name, "start");
    }

    #[test]
    fn a_burst_that_ends_where_it_began_leaves_no_step() {
        let mut history = History::default();
        let key = Some(CoalesceKey::WhiteBalance);
        let start = named("start");
        history.record(&start, None);
        let mut plan = named("one step");
        history.record(&plan, key);
        plan = named("dragged");
        history.record(&plan, key);
        plan = named("one step"); // dragged back
        history.seal(&plan);
        assert_eq!(history.undo_len(), 1, "only the step before the drag");
        // Nor does it take away the redo steps.
        assert!(history.undo(&mut plan));
        history.record(&plan, key);
        plan = named("dragged");
        history.record(&plan, key);
        assert_eq!(history.redo_len(), 0, "redo is away while the drag goes on");
        plan = named("start");
        history.seal(&plan);
        assert_eq!((history.undo_len(), history.redo_len()), (0, 1));
        assert!(history.redo(&mut plan));
        assert_eq!(plan.name, "one step");
        // A sealed step is never dropped later, even when it matches.
        history.record(&plan, None);
        history.seal(&plan);
        assert_eq!(history.undo_len(), 2);
    }

    #[test]
    fn an_empty_burst_at_the_limit_keeps_the_oldest_step() {
        let mut history = History::default();
        for i in 0..UNDO_LIMIT {
            history.record(&named(&format!("{i}")), None);
        }
        let plan = named("last");
        history.record(&plan, Some(CoalesceKey::PlanName));
        history.seal(&plan);
        assert_eq!(history.undo_len(), UNDO_LIMIT);
        let mut current = plan;
        for _ in 0..UNDO_LIMIT {
            assert!(history.undo(&mut current));
        }
        assert_eq!(current.name, "0", "the oldest step is back");
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
