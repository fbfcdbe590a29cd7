//! The colour crate's error type.

use thiserror::Error;

/// Result with [`ColorError`].
pub type Result<T, E = ColorError> = std::result::Result<T, E>;

/// Everything that can go wrong in colour computation or spectral import.
///
/// Messages are one line, say what is wrong and where, and are meant to be
/// shown to the user as they are.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum ColorError {
    /// A spectral table could not be read.
    #[error("{source_name}: {}{message}", at_line(*line))]
    Import {
        /// File name or other label of the input.
        source_name: String,
        /// 1-based line number (0 when the problem is the whole file, and
        /// then the message names no line).
        line: usize,
        /// What is wrong, in one line.
        message: String,
    },
    /// A spectrum cannot support colorimetry (all zero, or not covering the visible range).
    #[error("{what} cannot be used for colour computation: {reason}")]
    NotColorimetric {
        /// What the spectrum is (e.g. "lamp 'Key'").
        what: String,
        /// Why it was refused.
        reason: String,
    },
    /// A number is outside the range a method is defined for.
    #[error("{what} = {value} is outside the valid range {range}")]
    OutOfRange {
        /// The quantity, with its unit.
        what: &'static str,
        /// The offending value.
        value: f64,
        /// The valid range, written for people.
        range: &'static str,
    },
    /// Input that is structurally wrong (lengths, ordering, non-finite numbers).
    #[error("invalid input: {0}")]
    InvalidInput(String),
    /// A numerical method did not converge or met a singular system.
    #[error("numerical failure: {0}")]
    Numerical(String),
}

/// `line N: ` for a line of the input, nothing for the whole file (line 0).
fn at_line(line: usize) -> String {
    if line == 0 {
        String::new()
    } else {
        format!("line {line}: ")
    }
}
