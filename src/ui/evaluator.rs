//! The cached evaluation of the plan on screen.
//!
//! The plan is evaluated once after each change (never while drawing). When an
//! evaluation fails, the error is kept for the banner and the last good
//! evaluation stays on screen, greyed, so the user keeps their bearings.

use lampwright_plan::{Evaluation, Plan};
use std::time::Instant;

/// The evaluation on screen and how it was obtained.
#[derive(Debug, Default)]
pub struct Evaluator {
    shown: Option<Evaluation>,
    error: Option<String>,
    last_duration_ms: f64,
    evaluations: u64,
    engine: lampwright_plan::engine::Evaluator,
}

impl Evaluator {
    /// Evaluate the plan and keep the result (or the error, keeping the last good result).
    pub fn refresh(&mut self, plan: &Plan) {
        let started = Instant::now();
        // The engine reports bad plans as errors; catching a panic as well
        // keeps a bug in a formula from closing the window with unsaved work.
        let engine = &mut self.engine;
        let outcome = std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
            super::upstream::evaluate(engine, plan)
        }));
        self.last_duration_ms = started.elapsed().as_secs_f64() * 1000.0;
        self.evaluations += 1;
        match outcome {
            Ok(Ok(evaluation)) => {
                self.shown = Some(evaluation);
                self.error = None;
            }
            Ok(Err(err)) => self.error = Some(err),
            Err(_) => {
                // The caches may hold half-made entries after a panic: start afresh.
                self.engine = lampwright_plan::engine::Evaluator::default();
                self.error = Some(
                    "internal error while evaluating the plan (please report it with the plan file)"
                        .into(),
                );
            }
        }
    }

    /// The evaluation on screen: the current one, or the last good one when
    /// [`Self::is_stale`].
    #[must_use]
    pub fn evaluation(&self) -> Option<&Evaluation> {
        self.shown.as_ref()
    }

    /// The error of the latest evaluation, if it failed.
    #[must_use]
    pub fn error(&self) -> Option<&str> {
        self.error.as_deref()
    }

    /// The evaluation shown belongs to an earlier plan (the latest failed).
    #[must_use]
    pub fn is_stale(&self) -> bool {
        self.error.is_some() && self.shown.is_some()
    }

    /// How long the latest evaluation took, ms.
    #[must_use]
    pub fn last_duration_ms(&self) -> f64 {
        self.last_duration_ms
    }

    /// How many evaluations ran since the window opened.
    #[must_use]
    pub fn count(&self) -> u64 {
        self.evaluations
    }
}
