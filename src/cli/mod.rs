//! Command-line interface: argument parsing and the subcommands.
//!
//! Each subcommand lives in its own module with a clap `Args` struct and a
//! `run(args) -> anyhow::Result<ExitCode>` function.

pub mod advise;
pub mod camera_fit;
pub mod check;
pub mod delta_e;
pub mod lamp;
pub mod report;

use clap::{Parser, Subcommand};
use std::process::ExitCode;

/// Plan lighting and see how subjects render to the eye and to your camera.
#[derive(Debug, Parser)]
#[command(name = "lampwright", version, about, long_about = None)]
pub struct Cli {
    #[command(subcommand)]
    pub command: Option<Command>,
}

/// The subcommands. With none, the window opens.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Open a plan file in the window.
    Open {
        /// The plan file (.ron).
        plan: std::path::PathBuf,
    },
    /// Lamp figures of measured spectra: chromaticity, CCT, Duv, CRI, TM-30, SSI.
    Lamp(lamp::LampArgs),
    /// Colour differences ΔE76, ΔE94 and ΔE2000 of CIELAB pairs in a CSV file.
    DeltaE(delta_e::DeltaEArgs),
    /// Fit a camera colour-correction matrix under a light and report each sample's ΔE2000.
    CameraFit(camera_fit::CameraFitArgs),
    /// Check a plan file and list every problem in it (exit status 1 on errors).
    Check(check::CheckArgs),
    /// Evaluate a plan and write its report as text, JSON, CSV or HTML.
    Report(report::ReportArgs),
    /// Suggest gels, levels and camera settings for one goal (fidelity, a white, quality).
    Advise(advise::AdviseArgs),
}

/// Run the parsed command line.
pub fn run(cli: Cli) -> anyhow::Result<ExitCode> {
    match cli.command {
        None => open_window(None),
        Some(Command::Open { plan }) => open_window(Some(plan)),
        Some(Command::Lamp(args)) => lamp::run(&args),
        Some(Command::DeltaE(args)) => delta_e::run(&args),
        Some(Command::CameraFit(args)) => camera_fit::run(&args),
        Some(Command::Check(args)) => check::run(&args),
        Some(Command::Report(args)) => report::run(&args),
        Some(Command::Advise(args)) => advise::run(&args),
    }
}

/// Open the window, on a plan file or on the built-in demo plan.
fn open_window(plan: Option<std::path::PathBuf>) -> anyhow::Result<ExitCode> {
    lampwright::ui::run(lampwright::ui::StartOptions::from_env(plan))?;
    Ok(ExitCode::SUCCESS)
}
