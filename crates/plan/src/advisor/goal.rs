//! What the advisor is asked to improve, and how a result is scored against it.
//!
//! One goal at a time:
//! - **camera fidelity**: make the camera render the included subjects as the
//!   eye sees them — minimise the weighted mean (or the worst) CIEDE2000
//!   between eye and camera;
//! - **match a white**: bring the light of the scene, or of one zone, to a
//!   target white (a CCT and Duv, or another zone's white), within a tolerance
//!   in mired and Duv;
//! - **rendering quality**: maximise the TM-30 fidelity index Rf while the
//!   gamut index Rg stays inside a band and CIE 13.3 R9 stays above a floor.
//!
//! Every goal reduces to one number to minimise ([`Goal::cost`]), computed
//! the same way from the fast search model and from a full evaluation.
//!
//! # References
//! - CIE 142-2001 / ISO/CIE 11664-6:2014, CIEDE2000 colour difference.
//! - Ohno, Y. (2014), *Practical use and calculation of CCT and Duv*, LEUKOS
//!   10(1), 47–55, doi:10.1080/15502724.2014.839020 (CCT, Duv).
//! - ANSI/IES TM-30-20, *Method for evaluating light source colour rendition*
//!   (Rf, Rg); CIE 13.3-1995 (R9).

use crate::error::{PlanError, Result};
use serde::Serialize;

/// Default tolerance of the match-a-white goal, mired (about a sixteenth of
/// full CTO; the project's choice, finer than a crew can gel by eye).
pub const DEFAULT_TOLERANCE_MIRED: f64 = 5.0;
/// Default tolerance of the match-a-white goal in Duv (the project's choice;
/// 0.001 is about the smallest green–magenta shift viewers notice side by side).
pub const DEFAULT_TOLERANCE_DUV: f64 = 0.001;
/// Default lower end of the TM-30 Rg band (ANSI/IES TM-30-20 Annex E
/// "preference" designs sit at Rg ≥ 95 at most Rf; the band is the project's choice).
pub const DEFAULT_RG_MIN: f64 = 95.0;
/// Default upper end of the TM-30 Rg band.
pub const DEFAULT_RG_MAX: f64 = 110.0;
/// Default floor for CIE 13.3 R9 (deep red), the project's choice: a positive R9.
pub const DEFAULT_R9_FLOOR: f64 = 0.0;

/// How the fidelity goal combines the subjects' colour differences.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize)]
pub enum FidelityAggregate {
    /// Weighted mean of CIEDE2000 over the included subjects (weights from the plan).
    #[default]
    WeightedMean,
    /// Largest CIEDE2000 over the included subjects.
    Worst,
}

/// The white a zone is brought to.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub enum WhiteTarget {
    /// A correlated colour temperature and Duv.
    Chromaticity {
        /// Target CCT, K.
        cct_k: f64,
        /// Target Duv (positive = green of the Planckian locus).
        duv: f64,
    },
    /// The white of another zone (by name), as it is after the changes.
    Zone(String),
}

/// The match-a-white goal.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WhiteGoal {
    /// The zone to change, by name; `None` for the main zone (the whole scene
    /// when the plan has no zones).
    pub zone: Option<String>,
    /// Where its white should go.
    pub target: WhiteTarget,
    /// Tolerance in mired: a miss of this size counts one unit of cost.
    pub tolerance_mired: f64,
    /// Tolerance in Duv: a miss of this size counts one unit of cost.
    pub tolerance_duv: f64,
}

/// The rendering-quality goal.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct QualityGoal {
    /// Lowest acceptable TM-30 Rg.
    pub rg_min: f64,
    /// Highest acceptable TM-30 Rg.
    pub rg_max: f64,
    /// Lowest acceptable CIE 13.3 R9.
    pub r9_floor: f64,
}

impl Default for QualityGoal {
    fn default() -> Self {
        QualityGoal {
            rg_min: DEFAULT_RG_MIN,
            rg_max: DEFAULT_RG_MAX,
            r9_floor: DEFAULT_R9_FLOOR,
        }
    }
}

/// What the advisor improves.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub enum Goal {
    /// Eye-versus-camera colour difference over the included subjects.
    Fidelity(FidelityAggregate),
    /// Bring a zone's white to a target.
    White(WhiteGoal),
    /// TM-30 Rf with Rg in a band and R9 above a floor.
    Quality(QualityGoal),
}

/// The figures a goal is scored on, from either the search model or a full evaluation.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct GoalInputs {
    /// Weighted mean CIEDE2000 over included subjects.
    pub weighted_mean_de2000: Option<f64>,
    /// Largest CIEDE2000 over included subjects.
    pub max_de2000: Option<f64>,
    /// Miss of the goal zone's white from its target, mired (signed, zone − target).
    pub white_mired_miss: Option<f64>,
    /// Miss of the goal zone's white from its target, Duv (signed, zone − target).
    pub white_duv_miss: Option<f64>,
    /// TM-30 Rf of the main zone.
    pub rf: Option<f64>,
    /// TM-30 Rg of the main zone.
    pub rg: Option<f64>,
    /// CIE 13.3 R9 of the main zone.
    pub r9: Option<f64>,
}

/// Rf points charged per unit of Rg outside the band and per point of R9 below
/// the floor (the project's choice: a constraint violation costs as much as
/// the fidelity it would take to be worth it).
const QUALITY_PENALTY_PER_POINT: f64 = 1.0;

impl Goal {
    /// Check that the goal's numbers make sense (positive tolerances, a band
    /// with min ≤ max, finite targets).
    pub fn validate(&self) -> Result<()> {
        let bad = |field: &str, message: String| {
            Err(PlanError::Invalid {
                field: format!("advisor goal: {field}"),
                message,
            })
        };
        match self {
            Goal::Fidelity(_) => Ok(()),
            Goal::White(w) => {
                if !(w.tolerance_mired.is_finite() && w.tolerance_mired > 0.0) {
                    return bad(
                        "tolerance",
                        format!(
                            "{} mired is not a tolerance (use a positive number)",
                            w.tolerance_mired
                        ),
                    );
                }
                if !(w.tolerance_duv.is_finite() && w.tolerance_duv > 0.0) {
                    return bad(
                        "tolerance",
                        format!(
                            "{} Duv is not a tolerance (use a positive number)",
                            w.tolerance_duv
                        ),
                    );
                }
                if let WhiteTarget::Chromaticity { cct_k, duv } = w.target {
                    let (lo, hi) = lampwright_color::cct::CCT_RANGE_K;
                    if !(cct_k.is_finite() && (lo..=hi).contains(&cct_k)) {
                        return bad(
                            "target",
                            format!("{cct_k} K is not a target CCT (use {lo:.0}–{hi:.0} K)"),
                        );
                    }
                    if !(duv.is_finite() && duv.abs() <= lampwright_color::cct::DUV_LIMIT) {
                        return bad(
                            "target",
                            format!("Duv {duv} is not a target (use −0.05 to 0.05)"),
                        );
                    }
                }
                Ok(())
            }
            Goal::Quality(q) => {
                if !(q.rg_min.is_finite() && q.rg_max.is_finite() && q.rg_min <= q.rg_max) {
                    return bad(
                        "Rg band",
                        format!("{}–{} is not a band", q.rg_min, q.rg_max),
                    );
                }
                if !q.r9_floor.is_finite() {
                    return bad("R9 floor", format!("{} is not a floor", q.r9_floor));
                }
                Ok(())
            }
        }
    }

    /// The goal's cost: lower is better; `None` when the figures it needs
    /// could not be computed (for example a CCT off the locus).
    ///
    /// - fidelity: the weighted mean (or the largest) CIEDE2000;
    /// - white: `√((Δmired / tol_mired)² + (ΔDuv / tol_duv)²)`, so 1 is the
    ///   edge of the tolerance;
    /// - quality: `−Rf` plus one point per unit of Rg outside the band and per
    ///   point of R9 below the floor.
    #[must_use]
    pub fn cost(&self, inputs: &GoalInputs) -> Option<f64> {
        let c = match self {
            Goal::Fidelity(FidelityAggregate::WeightedMean) => inputs.weighted_mean_de2000?,
            Goal::Fidelity(FidelityAggregate::Worst) => inputs.max_de2000?,
            Goal::White(w) => {
                let m = inputs.white_mired_miss? / w.tolerance_mired;
                let d = inputs.white_duv_miss? / w.tolerance_duv;
                m.hypot(d)
            }
            Goal::Quality(q) => {
                let rf = inputs.rf?;
                let rg = inputs.rg?;
                let r9 = inputs.r9?;
                let outside = (q.rg_min - rg).max(0.0) + (rg - q.rg_max).max(0.0);
                let short = (q.r9_floor - r9).max(0.0);
                -rf + QUALITY_PENALTY_PER_POINT * (outside + short)
            }
        };
        c.is_finite().then_some(c)
    }

    /// Smallest improvement in cost worth a suggestion (the project's choice:
    /// 0.2 ΔE00 — about a fifth of a just-noticeable difference; a tenth of
    /// the white tolerance; one Rf point).
    #[must_use]
    pub fn worthwhile_improvement(&self) -> f64 {
        match self {
            Goal::Fidelity(_) => 0.2,
            Goal::White(_) => 0.1,
            Goal::Quality(_) => 1.0,
        }
    }

    /// Cost charged per move when ranking, so that a move must pay for itself
    /// (the project's choice: half the worthwhile improvement; a tenth of the
    /// white tolerance).
    #[must_use]
    pub fn cost_per_move(&self) -> f64 {
        match self {
            Goal::Fidelity(_) | Goal::Quality(_) => 0.5 * self.worthwhile_improvement(),
            Goal::White(_) => 0.1,
        }
    }

    /// Cost charged per stop of light lost in the main zone when ranking (gains
    /// are not rewarded). The project's choice of what a stop is worth to a
    /// crew: 0.2 ΔE00, a quarter of the white tolerance, one Rf point — so
    /// switching the key off to match a white costs more than gelling it.
    #[must_use]
    pub fn cost_per_stop_lost(&self) -> f64 {
        match self {
            Goal::Fidelity(_) => 0.2,
            Goal::White(_) => 0.25,
            Goal::Quality(_) => 1.0,
        }
    }

    /// The cost used to rank answers: the goal's cost, except that a white
    /// already within tolerance gains little from being closer still (slope
    /// 1/4 inside the tolerance), so fewer moves and less light lost win there.
    #[must_use]
    pub fn ranking_cost(&self, cost: f64) -> f64 {
        match self {
            Goal::White(_) if cost < 1.0 => 0.75 + 0.25 * cost,
            _ => cost,
        }
    }

    /// The ranking cost of a result: [`Goal::ranking_cost`] plus the charges
    /// for light lost (stops, main zone) and moves.
    #[must_use]
    pub fn ranking_total(&self, cost: f64, stops_lost: f64, moves: usize) -> f64 {
        self.ranking_cost(cost)
            + self.cost_per_stop_lost() * stops_lost.max(0.0)
            + self.cost_per_move() * moves as f64
    }

    /// Whether camera settings (white balance, matrix) can change the goal.
    #[must_use]
    pub fn uses_camera(&self) -> bool {
        matches!(self, Goal::Fidelity(_))
    }

    /// A short name for reports: "camera fidelity", "match a white", "rendering quality".
    #[must_use]
    pub fn label(&self) -> &'static str {
        match self {
            Goal::Fidelity(FidelityAggregate::WeightedMean) => {
                "camera fidelity (weighted mean ΔE00)"
            }
            Goal::Fidelity(FidelityAggregate::Worst) => "camera fidelity (worst ΔE00)",
            Goal::White(_) => "match a white",
            Goal::Quality(_) => "rendering quality (TM-30 Rf)",
        }
    }
}

/// Signed miss in mired and Duv of a white (CCT, Duv) from a target (CCT, Duv).
#[must_use]
pub fn white_miss(cct_k: f64, duv: f64, target_cct_k: f64, target_duv: f64) -> Option<(f64, f64)> {
    if !(cct_k > 0.0 && target_cct_k > 0.0) {
        return None;
    }
    let m = 1e6 / cct_k - 1e6 / target_cct_k;
    let d = duv - target_duv;
    (m.is_finite() && d.is_finite()).then_some((m, d))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn white(tm: f64, td: f64) -> Goal {
        Goal::White(WhiteGoal {
            zone: None,
            target: WhiteTarget::Chromaticity {
                cct_k: 3200.0,
                duv: 0.0,
            },
            tolerance_mired: tm,
            tolerance_duv: td,
        })
    }

    #[test]
    fn white_cost_is_distance_in_tolerance_units() {
        let g = white(5.0, 0.001);
        let inputs = GoalInputs {
            white_mired_miss: Some(15.0),
            white_duv_miss: Some(-0.004),
            ..GoalInputs::default()
        };
        // 3-4-5 triangle in tolerance units.
        assert!((g.cost(&inputs).unwrap() - 5.0).abs() < 1e-12);
        assert!(g.cost(&GoalInputs::default()).is_none());
    }

    #[test]
    fn quality_cost_charges_band_and_floor() {
        let g = Goal::Quality(QualityGoal::default());
        let inside = GoalInputs {
            rf: Some(90.0),
            rg: Some(100.0),
            r9: Some(20.0),
            ..GoalInputs::default()
        };
        assert_eq!(g.cost(&inside), Some(-90.0));
        let outside = GoalInputs {
            rg: Some(112.0),
            r9: Some(-5.0),
            ..inside
        };
        assert_eq!(g.cost(&outside), Some(-90.0 + 2.0 + 5.0));
    }

    #[test]
    fn fidelity_cost_picks_mean_or_worst() {
        let inputs = GoalInputs {
            weighted_mean_de2000: Some(1.5),
            max_de2000: Some(4.0),
            ..GoalInputs::default()
        };
        assert_eq!(
            Goal::Fidelity(FidelityAggregate::WeightedMean).cost(&inputs),
            Some(1.5)
        );
        assert_eq!(
            Goal::Fidelity(FidelityAggregate::Worst).cost(&inputs),
            Some(4.0)
        );
    }

    #[test]
    fn bad_goals_are_refused() {
        assert!(white(0.0, 0.001).validate().is_err());
        assert!(white(5.0, f64::NAN).validate().is_err());
        assert!(white(5.0, 0.001).validate().is_ok());
        let band = Goal::Quality(QualityGoal {
            rg_min: 110.0,
            rg_max: 95.0,
            r9_floor: 0.0,
        });
        assert!(band.validate().is_err());
        let far = Goal::White(WhiteGoal {
            zone: None,
            target: WhiteTarget::Chromaticity {
                cct_k: 500.0,
                duv: 0.0,
            },
            tolerance_mired: 5.0,
            tolerance_duv: 0.001,
        });
        assert!(far.validate().is_err());
    }

    #[test]
    fn white_miss_is_in_mired() {
        // 1e6/3200 − 1e6/5500 = 130.68 mired: the full CTO conversion (common practice).
        let (m, d) = white_miss(3200.0, 0.002, 5500.0, 0.0).unwrap();
        assert!((m - 130.681_818).abs() < 1e-5);
        assert!((d - 0.002).abs() < 1e-15);
        assert!(white_miss(0.0, 0.0, 5500.0, 0.0).is_none());
    }
}
