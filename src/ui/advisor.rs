//! The advisor in the window: the goal the user picked, a search running on
//! a background thread (it can take seconds; the window keeps drawing), and
//! the suggestions it returned for the plan as it was then.

use lampwright_plan::Plan;
use lampwright_plan::advisor::{
    Advice, AdvisorOptions, DEFAULT_TOLERANCE_DUV, DEFAULT_TOLERANCE_MIRED, FidelityAggregate,
    Goal, QualityGoal, WhiteGoal, WhiteTarget, advise, default_white_target,
};
use std::sync::mpsc::{Receiver, TryRecvError, channel};
use std::time::Instant;

/// Which goal the user picked.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum GoalKind {
    /// Lower the weighted mean eye-versus-camera ΔE00.
    #[default]
    FidelityMean,
    /// Lower the worst subject's ΔE00.
    FidelityWorst,
    /// Bring a zone's white to a target.
    White,
    /// Raise TM-30 Rf with Rg in a band and R9 above a floor.
    Quality,
}

impl GoalKind {
    /// All goals, for the picker.
    pub const ALL: [GoalKind; 4] = [
        GoalKind::FidelityMean,
        GoalKind::FidelityWorst,
        GoalKind::White,
        GoalKind::Quality,
    ];

    /// The goal named "fidelity", "worst", "white" or "quality".
    #[must_use]
    pub fn from_name(name: &str) -> Option<GoalKind> {
        match name.trim() {
            "fidelity" => Some(GoalKind::FidelityMean),
            "worst" => Some(GoalKind::FidelityWorst),
            "white" => Some(GoalKind::White),
            "quality" => Some(GoalKind::Quality),
            _ => None,
        }
    }

    /// Label in the picker.
    #[must_use]
    pub fn label(self) -> &'static str {
        match self {
            GoalKind::FidelityMean => "Camera fidelity: mean ΔE00",
            GoalKind::FidelityWorst => "Camera fidelity: worst subject",
            GoalKind::White => "Match a white",
            GoalKind::Quality => "Rendering quality (TM-30)",
        }
    }
}

/// The goal settings and the search.
#[derive(Debug, Default)]
pub struct AdvisorState {
    /// The goal.
    pub goal: GoalKind,
    /// Zone of a white goal (`None` = the main zone).
    pub zone: Option<String>,
    /// Custom white target (CCT, Duv); `None` = the default target.
    pub target: Option<(f64, f64)>,
    running: Option<Running>,
    /// The latest answer and the plan it was for.
    result: Option<(Plan, Result<Advice, String>)>,
}

#[derive(Debug)]
struct Running {
    plan: Plan,
    started: Instant,
    receiver: Receiver<Result<Advice, String>>,
}

impl AdvisorState {
    /// The goal as the plan crate takes it.
    pub fn goal_for(&self, plan: &Plan) -> Result<Goal, String> {
        Ok(match self.goal {
            GoalKind::FidelityMean => Goal::Fidelity(FidelityAggregate::WeightedMean),
            GoalKind::FidelityWorst => Goal::Fidelity(FidelityAggregate::Worst),
            GoalKind::Quality => Goal::Quality(QualityGoal::default()),
            GoalKind::White => {
                let target = match self.target {
                    Some((cct_k, duv)) => WhiteTarget::Chromaticity { cct_k, duv },
                    None => default_white_target(plan, self.zone.as_deref())
                        .map_err(|e| e.to_string())?,
                };
                Goal::White(WhiteGoal {
                    zone: self.zone.clone(),
                    target,
                    tolerance_mired: DEFAULT_TOLERANCE_MIRED,
                    tolerance_duv: DEFAULT_TOLERANCE_DUV,
                })
            }
        })
    }

    /// Start a search for this plan on a background thread.
    pub fn start(&mut self, plan: &Plan) {
        let goal = match self.goal_for(plan) {
            Ok(goal) => goal,
            Err(err) => {
                self.result = Some((plan.clone(), Err(err)));
                return;
            }
        };
        let (sender, receiver) = channel();
        let snapshot = plan.clone();
        let spawned = std::thread::Builder::new()
            .name("lampwright-advisor".into())
            .spawn(move || {
                let outcome = std::panic::catch_unwind(|| {
                    advise(&snapshot, &goal, &AdvisorOptions::default()).map_err(|e| e.to_string())
                })
                .unwrap_or_else(|_| {
                    Err(
                        "internal error in the advisor (please report it with the plan file)"
                            .into(),
                    )
                });
                // The window may have closed; nothing to do then.
                let _ = sender.send(outcome);
            });
        match spawned {
            Ok(_) => {
                self.running = Some(Running {
                    plan: plan.clone(),
                    started: Instant::now(),
                    receiver,
                });
            }
            Err(err) => {
                self.result = Some((
                    plan.clone(),
                    Err(format!("could not start the advisor: {err}")),
                ));
            }
        }
    }

    /// Collect a finished search. Returns true when one finished this call.
    pub fn poll(&mut self) -> bool {
        let Some(running) = &self.running else {
            return false;
        };
        let outcome = match running.receiver.try_recv() {
            Ok(outcome) => outcome,
            Err(TryRecvError::Empty) => return false,
            Err(TryRecvError::Disconnected) => Err("the advisor stopped without an answer".into()),
        };
        if let Some(running) = self.running.take() {
            self.result = Some((running.plan, outcome));
        }
        true
    }

    /// Seconds since the running search started, if one is running.
    #[must_use]
    pub fn running_for_s(&self) -> Option<f64> {
        self.running
            .as_ref()
            .map(|r| r.started.elapsed().as_secs_f64())
    }

    /// The latest answer and the plan it was computed for.
    #[must_use]
    pub fn result(&self) -> Option<(&Plan, &Result<Advice, String>)> {
        self.result.as_ref().map(|(p, r)| (p, r))
    }
}
