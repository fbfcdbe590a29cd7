//! Lighting plans for Lampwright: the plan document, the built-in libraries,
//! the evaluation engine, plan files and reports.
//!
//! The app edits a [`Plan`] and shows the [`Evaluation`] this crate computes
//! from it; the command line does the same.

pub mod advisor;
pub mod custom;
pub mod demo;
pub mod engine;
mod error;
pub mod evaluation;
pub mod files;
pub mod library;
pub mod limits;
pub mod migrate;
pub mod model;
mod render;
pub mod report;
pub mod resolve;
pub mod validate;

pub use model::*;

pub use engine::evaluate;
pub use evaluation::*;

pub use error::{LibraryKind, PlanError, Result};

pub use demo::{default_demo, demo_plans};
pub use files::{load_plan, save_plan_atomic};

pub use validate::{Issue, Severity, validate};
