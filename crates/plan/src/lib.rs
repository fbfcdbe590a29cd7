//! Lighting plans for Lampwright: the plan document, the built-in libraries,
//! the evaluation engine, plan files and reports.
//!
//! The app edits a [`Plan`] and shows the [`Evaluation`] this crate computes
//! from it; the command line does the same.

mod error;
pub mod evaluation;
pub mod library;
pub mod limits;
pub mod model;
pub mod resolve;

pub use model::*;

pub use evaluation::*;

pub use error::{LibraryKind, PlanError, Result};
