//! `lampwright check PLAN.ron [--strict]`: read a plan file and list every
//! problem in it.
//!
//! The file is read as the app reads it (size, encoding, syntax, format
//! version, structural limits), then validated field by field, then evaluated
//! once so that anything the engine would refuse is caught too. Each problem
//! is one line, `error: <field>: <what is wrong>` or `warning: …`. Exit status
//! 0 when there are no errors (warnings alone do not fail unless `--strict`),
//! 1 otherwise.

use anyhow::Context;
use clap::Args;
use lampwright_plan::validate::{Issue, Severity, has_errors};
use lampwright_plan::{evaluate, load_plan, validate};
use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `lampwright check`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// The plan file (.ron).
    pub plan: PathBuf,
    /// Treat warnings as problems too (exit status 1 when there are any).
    #[arg(long)]
    pub strict: bool,
}

fn count(n: usize, word: &str) -> String {
    format!("{n} {word}{}", if n == 1 { "" } else { "s" })
}

/// Run `lampwright check`.
pub fn run(args: &CheckArgs) -> anyhow::Result<ExitCode> {
    let file = args.plan.display().to_string();
    let stdout = std::io::stdout();
    let mut out = stdout.lock();
    let plan = match load_plan(&args.plan) {
        Ok(plan) => plan,
        Err(e) => {
            // The error already names the file and the line or field.
            writeln!(out, "error: {e}").context("writing to standard output")?;
            writeln!(out, "{file}: the plan cannot be read")
                .context("writing to standard output")?;
            return Ok(ExitCode::from(1));
        }
    };
    let mut issues = validate(&plan);
    if !has_errors(&issues)
        && let Err(e) = evaluate(&plan)
    {
        issues.insert(
            0,
            Issue {
                severity: Severity::Error,
                field: "evaluation".into(),
                message: e.to_string(),
            },
        );
    }
    let errors = issues
        .iter()
        .filter(|i| i.severity == Severity::Error)
        .count();
    let warnings = issues.len() - errors;
    for issue in &issues {
        writeln!(out, "{issue}").context("writing to standard output")?;
    }
    if issues.is_empty() {
        writeln!(
            out,
            "{file}: no problems ({}, {}, {})",
            count(plan.sources.len(), "source"),
            count(plan.zones.len(), "zone"),
            count(plan.subjects.len(), "subject")
        )
        .context("writing to standard output")?;
    } else {
        writeln!(
            out,
            "{file}: {}, {}",
            count(errors, "error"),
            count(warnings, "warning")
        )
        .context("writing to standard output")?;
    }
    let failed = errors > 0 || (args.strict && warnings > 0);
    Ok(if failed {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    })
}
