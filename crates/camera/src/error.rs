//! The camera crate's error type.

use lampwright_color::ColorError;
use thiserror::Error;

/// Result with [`CameraError`].
pub type Result<T, E = CameraError> = std::result::Result<T, E>;

/// Everything that can go wrong in camera simulation.
///
/// Messages are one line and meant to be shown to the user as they are.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum CameraError {
    /// A colour computation underneath failed (spectra, import, colour spaces).
    #[error(transparent)]
    Color(#[from] ColorError),
    /// Input that is structurally wrong (counts, indices, non-finite numbers).
    #[error("invalid input: {0}")]
    InvalidInput(String),
    /// A camera channel cannot see anything, so no signal can be formed.
    #[error("camera '{camera}': {reason}")]
    BlindCamera {
        /// Camera name.
        camera: String,
        /// What is wrong with its curves.
        reason: String,
    },
    /// A fit or solve met a singular or ill-conditioned system, or did not converge.
    #[error("numerical failure: {0}")]
    Numerical(String),
}
