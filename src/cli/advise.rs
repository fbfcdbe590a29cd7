//! `lampwright advise PLAN.ron [--goal fidelity|white|quality] [--target-cct K
//! --target-duv D] [--zone NAME] [--json] [--apply N -o NEW.ron]`: what to
//! change on set — gels, levels, white balance, matrix — for one goal.
//!
//! Text output lists the suggestions as a crew says them, each with its
//! figures before → after (all from a full evaluation of the changed plan)
//! and the light it costs. `--json` prints a list of suggestions, each with
//! `moves` (strings) and `before`/`after` objects (`mean_de2000`,
//! `max_de2000`, `cct_k`, `duv`, `rf`, `rg`, `stops_lost`, and more); an empty
//! list when nothing better was found (the reason goes to standard error).
//! `--apply N -o NEW.ron` writes the plan with suggestion N made.

use anyhow::{Context, bail};
use clap::{Args, ValueEnum};
use lampwright_plan::advisor::{
    Advice, AdvisorOptions, DEFAULT_R9_FLOOR, DEFAULT_RG_MAX, DEFAULT_RG_MIN,
    DEFAULT_TOLERANCE_DUV, DEFAULT_TOLERANCE_MIRED, FidelityAggregate, Figures, Goal, QualityGoal,
    Suggestion, WhiteGoal, WhiteTarget, advise, apply, default_white_target,
};
use lampwright_plan::{Plan, load_plan, save_plan_atomic};
use serde::Serialize;
use std::fmt::Write as _;
use std::io::Write as _;
use std::path::PathBuf;
use std::process::ExitCode;

/// Which goal to advise for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, ValueEnum)]
pub enum GoalArg {
    /// Camera fidelity: lower the eye-versus-camera CIEDE2000 of the included subjects.
    #[default]
    Fidelity,
    /// Match a white: bring a zone to a target CCT and Duv, or to another zone's white.
    White,
    /// Rendering quality: raise TM-30 Rf with Rg in a band and R9 above a floor.
    Quality,
}

/// Arguments of `lampwright advise`.
#[derive(Debug, Args)]
#[allow(clippy::struct_excessive_bools)] // independent on/off switches of a command line
pub struct AdviseArgs {
    /// The plan file (.ron).
    pub plan: PathBuf,
    /// The goal.
    #[arg(long, value_enum, default_value_t = GoalArg::Fidelity)]
    pub goal: GoalArg,
    /// Fidelity: minimise the worst subject instead of the weighted mean.
    #[arg(long)]
    pub worst: bool,
    /// White: target CCT, K (default: the camera's Kelvin white balance, else the zone's own CCT).
    #[arg(long, value_name = "K")]
    pub target_cct: Option<f64>,
    /// White: target Duv (default 0, on the Planckian locus).
    #[arg(long, value_name = "D", allow_negative_numbers = true)]
    pub target_duv: Option<f64>,
    /// White: the zone to change (default: the main zone).
    #[arg(long, value_name = "NAME")]
    pub zone: Option<String>,
    /// White: match this zone's white instead of a CCT and Duv.
    #[arg(long, value_name = "NAME", conflicts_with_all = ["target_cct", "target_duv"])]
    pub to_zone: Option<String>,
    /// White: tolerance in mired.
    #[arg(long, default_value_t = DEFAULT_TOLERANCE_MIRED)]
    pub tolerance_mired: f64,
    /// White: tolerance in Duv.
    #[arg(long, default_value_t = DEFAULT_TOLERANCE_DUV)]
    pub tolerance_duv: f64,
    /// Quality: lowest acceptable TM-30 Rg.
    #[arg(long, default_value_t = DEFAULT_RG_MIN)]
    pub rg_min: f64,
    /// Quality: highest acceptable TM-30 Rg.
    #[arg(long, default_value_t = DEFAULT_RG_MAX)]
    pub rg_max: f64,
    /// Quality: lowest acceptable CIE 13.3 R9.
    #[arg(long, default_value_t = DEFAULT_R9_FLOOR, allow_negative_numbers = true)]
    pub r9_floor: f64,
    /// Most suggestions to show.
    #[arg(long, default_value_t = 5)]
    pub max: usize,
    /// Leave the white balance and the matrix alone.
    #[arg(long)]
    pub no_camera_moves: bool,
    /// Print the suggestions as JSON.
    #[arg(long)]
    pub json: bool,
    /// Apply suggestion N (1 = the best) and write the changed plan to `-o`.
    #[arg(long, value_name = "N", requires = "output")]
    pub apply: Option<usize>,
    /// Where `--apply` writes the changed plan.
    #[arg(long, short = 'o', value_name = "NEW.ron", requires = "apply")]
    pub output: Option<PathBuf>,
}

/// The goal the arguments ask for.
fn goal(args: &AdviseArgs, plan: &Plan) -> anyhow::Result<Goal> {
    Ok(match args.goal {
        GoalArg::Fidelity => Goal::Fidelity(if args.worst {
            FidelityAggregate::Worst
        } else {
            FidelityAggregate::WeightedMean
        }),
        GoalArg::White => {
            let target = if let Some(zone) = &args.to_zone {
                WhiteTarget::Zone(zone.clone())
            } else {
                let default = || default_white_target(plan, args.zone.as_deref());
                match (args.target_cct, args.target_duv) {
                    (Some(cct_k), duv) => WhiteTarget::Chromaticity {
                        cct_k,
                        duv: duv.unwrap_or(0.0),
                    },
                    (None, Some(duv)) => match default()? {
                        WhiteTarget::Chromaticity { cct_k, .. } => {
                            WhiteTarget::Chromaticity { cct_k, duv }
                        }
                        zone @ WhiteTarget::Zone(_) => zone,
                    },
                    (None, None) => default()?,
                }
            };
            Goal::White(WhiteGoal {
                zone: args.zone.clone(),
                target,
                tolerance_mired: args.tolerance_mired,
                tolerance_duv: args.tolerance_duv,
            })
        }
        GoalArg::Quality => Goal::Quality(QualityGoal {
            rg_min: args.rg_min,
            rg_max: args.rg_max,
            r9_floor: args.r9_floor,
        }),
    })
}

/// The figures of one side of a suggestion, as the JSON shows them.
#[derive(Debug, Serialize)]
struct FiguresJson<'a> {
    mean_de2000: Option<f64>,
    weighted_mean_de2000: Option<f64>,
    max_de2000: Option<f64>,
    worst_subject: Option<&'a str>,
    cct_k: Option<f64>,
    duv: Option<f64>,
    rf: Option<f64>,
    rg: Option<f64>,
    r9: Option<f64>,
    illuminance_lux: f64,
    stops_lost: Option<f64>,
    goal_cost: Option<f64>,
    zone_cct_k: Option<f64>,
    zone_duv: Option<f64>,
    within_tolerance: Option<bool>,
}

impl<'a> From<&'a Figures> for FiguresJson<'a> {
    fn from(f: &'a Figures) -> Self {
        FiguresJson {
            mean_de2000: f.mean_de2000,
            weighted_mean_de2000: f.weighted_mean_de2000,
            max_de2000: f.max_de2000,
            worst_subject: f.worst_subject.as_deref(),
            cct_k: f.cct_k,
            duv: f.duv,
            rf: f.rf,
            rg: f.rg,
            r9: f.r9,
            illuminance_lux: f.illuminance_lux,
            stops_lost: f.stops_lost,
            goal_cost: f.goal_cost,
            zone_cct_k: f.white.as_ref().and_then(|w| w.cct_k),
            zone_duv: f.white.as_ref().and_then(|w| w.duv),
            within_tolerance: f.white.as_ref().map(|w| w.within_tolerance),
        }
    }
}

/// One suggestion as the JSON shows it.
#[derive(Debug, Serialize)]
struct SuggestionJson<'a> {
    moves: &'a [String],
    before: FiguresJson<'a>,
    after: FiguresJson<'a>,
    source_stops_lost: Vec<SourceLossJson<'a>>,
}

/// Light one changed source loses (`null` when switched off).
#[derive(Debug, Serialize)]
struct SourceLossJson<'a> {
    source: &'a str,
    stops_lost: Option<f64>,
}

fn suggestion_json(s: &Suggestion) -> SuggestionJson<'_> {
    SuggestionJson {
        moves: &s.words,
        before: (&s.before).into(),
        after: (&s.after).into(),
        source_stops_lost: s
            .source_losses
            .iter()
            .map(|l| SourceLossJson {
                source: &l.name,
                stops_lost: l.stops_lost,
            })
            .collect(),
    }
}

fn opt(v: Option<f64>, digits: usize, unit: &str) -> String {
    v.map_or_else(|| "—".to_string(), |x| format!("{x:.digits$}{unit}"))
}

fn cct(v: Option<f64>) -> String {
    v.map_or_else(
        || "—".to_string(),
        |k| format!("{:.0} K", (k / 10.0).round() * 10.0),
    )
}

/// The figures that matter for the goal, before → after, one per line.
fn figure_lines(goal: &Goal, b: &Figures, a: &Figures) -> Vec<String> {
    let pair = |name: &str, f: &dyn Fn(&Figures) -> String| format!("{name}: {} → {}", f(b), f(a));
    let mut lines = Vec::new();
    match goal {
        Goal::Fidelity(_) => {
            lines.push(pair("mean ΔE00", &|f| opt(f.mean_de2000, 2, "")));
            lines.push(pair("weighted mean ΔE00", &|f| {
                opt(f.weighted_mean_de2000, 2, "")
            }));
            lines.push(pair("worst ΔE00", &|f| {
                format!(
                    "{} ({})",
                    opt(f.max_de2000, 2, ""),
                    f.worst_subject.as_deref().unwrap_or("—")
                )
            }));
        }
        Goal::White(_) => {
            lines.push(pair("zone white", &|f| {
                f.white.as_ref().map_or_else(
                    || "—".into(),
                    |w| format!("{} Duv {} ({})", cct(w.cct_k), opt(w.duv, 4, ""), w.zone),
                )
            }));
            lines.push(pair("target", &|f| {
                f.white.as_ref().map_or_else(
                    || "—".into(),
                    |w| format!("{} Duv {}", cct(w.target_cct_k), opt(w.target_duv, 4, "")),
                )
            }));
            lines.push(pair("miss", &|f| {
                f.white.as_ref().map_or_else(
                    || "—".into(),
                    |w| {
                        format!(
                            "{} mired, {} Duv{}",
                            opt(w.mired_miss, 1, ""),
                            opt(w.duv_miss, 4, ""),
                            if w.within_tolerance {
                                " (within tolerance)"
                            } else {
                                ""
                            }
                        )
                    },
                )
            }));
        }
        Goal::Quality(_) => {
            lines.push(pair("TM-30 Rf", &|f| opt(f.rf, 0, "")));
            lines.push(pair("TM-30 Rg", &|f| opt(f.rg, 0, "")));
            lines.push(pair("R9", &|f| opt(f.r9, 0, "")));
        }
    }
    lines.push(pair("scene white", &|f| {
        format!("{} Duv {}", cct(f.cct_k), opt(f.duv, 3, ""))
    }));
    if !matches!(goal, Goal::Quality(_)) {
        lines.push(pair("Rf / Rg", &|f| {
            format!("{} / {}", opt(f.rf, 0, ""), opt(f.rg, 0, ""))
        }));
    }
    if !matches!(goal, Goal::Fidelity(_)) {
        lines.push(pair("mean ΔE00", &|f| opt(f.mean_de2000, 1, "")));
    }
    lines.push(format!("light lost: {}", opt(a.stops_lost, 2, " stops")));
    lines
}

fn text(advice: &Advice, plan: &Plan) -> String {
    let mut out = format!(
        "{}: {} — {} candidates scored ({})\n",
        plan.name,
        advice.goal.label(),
        advice.candidates_scored,
        match advice.method {
            lampwright_plan::advisor::SearchMethod::Exhaustive => "every candidate",
            lampwright_plan::advisor::SearchMethod::CoordinateDescent =>
                "coordinate descent with restarts",
        }
    );
    for (i, s) in advice.suggestions.iter().enumerate() {
        let _ = write!(out, "\n{}. {}\n", i + 1, s.sentence());
        for line in figure_lines(&advice.goal, &s.before, &s.after) {
            let _ = writeln!(out, "   {line}");
        }
        for l in &s.source_losses {
            let _ = match l.stops_lost {
                Some(v) if v > 0.005 => writeln!(out, "   {} loses {v:.2} stops", l.name),
                Some(v) if v < -0.005 => writeln!(out, "   {} gains {:.2} stops", l.name, -v),
                Some(_) => Ok(()),
                None => writeln!(out, "   {} is off", l.name),
            };
        }
    }
    for note in &advice.notes {
        let _ = write!(out, "\n{note}\n");
    }
    out
}

/// Run `lampwright advise`.
pub fn run(args: &AdviseArgs) -> anyhow::Result<ExitCode> {
    let plan = load_plan(&args.plan)?;
    let goal = goal(args, &plan)?;
    let options = AdvisorOptions {
        max_suggestions: args.max.max(1),
        camera_moves: !args.no_camera_moves,
        ..AdvisorOptions::default()
    };
    let advice = advise(&plan, &goal, &options)
        .with_context(|| format!("{}: no advice", args.plan.display()))?;
    let stdout = std::io::stdout();
    let mut out = stdout.lock();
    if let (Some(n), Some(path)) = (args.apply, &args.output) {
        let Some(s) = n.checked_sub(1).and_then(|i| advice.suggestions.get(i)) else {
            bail!(
                "there is no suggestion {n} to apply ({} found{})",
                advice.suggestions.len(),
                advice
                    .notes
                    .first()
                    .map_or_else(String::new, |note| format!("; {note}"))
            );
        };
        save_plan_atomic(path, &apply(&plan, s))?;
        writeln!(out, "applied: {}\nwrote {}", s.sentence(), path.display())
            .context("writing to standard output")?;
        return Ok(ExitCode::SUCCESS);
    }
    if args.json {
        let list: Vec<SuggestionJson> = advice.suggestions.iter().map(suggestion_json).collect();
        let json = serde_json::to_string_pretty(&list)?;
        writeln!(out, "{json}").context("writing to standard output")?;
        for note in &advice.notes {
            eprintln!("lampwright: {note}");
        }
    } else {
        out.write_all(text(&advice, &plan).as_bytes())
            .context("writing to standard output")?;
    }
    out.flush().context("writing to standard output")?;
    Ok(ExitCode::SUCCESS)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn optional_figures_print_a_dash() {
        assert_eq!(opt(None, 2, ""), "—");
        assert_eq!(opt(Some(1.234), 2, " stops"), "1.23 stops");
        assert_eq!(cct(Some(3212.0)), "3210 K");
    }
}
