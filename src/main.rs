//! Lampwright: plan lighting and see how subjects render to the eye and to the camera.
//!
//! With no arguments the window opens on a built-in demo plan; subcommands give
//! the same figures on the command line for scripts and crews.

mod cli;

use clap::Parser;
use std::process::ExitCode;

fn main() -> ExitCode {
    let args = cli::Cli::parse();
    match cli::run(args) {
        Ok(code) => code,
        Err(err) => {
            eprintln!("lampwright: {err:#}");
            ExitCode::FAILURE
        }
    }
}
