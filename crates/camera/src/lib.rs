//! Camera simulation for Lampwright: how a camera, rather than an eye, records
//! subjects under a lighting plan.
//!
//! The chain, each step in its own module:
//! 1. [`sensitivities`]: the camera's three spectral sensitivity curves;
//! 2. [`raw`]: the raw signal `Σ light × reflectance × sensitivity`, exposed so
//!    the perfect white gives G = 1;
//! 3. [`white_balance`]: channel gains from a preset, a Kelvin setting, a grey
//!    card or an automatic estimate;
//! 4. [`correction`]: the colour-correction matrix (camera RGB → XYZ, D65 white),
//!    fitted by [`fit_linear`], [`fit_de2000`] or [`root_poly`] on a [`training`] set;
//! 5. [`calibration`]: training data under a light (CAT16 targets), factory,
//!    dual-illuminant and scene-profile corrections;
//! 6. [`pipeline`]: eye versus camera per subject ([`CameraPipeline`]), camera metamers;
//! 7. [`quality`]: Luther residual, Vora–Trussell µ-factor, ΔE00 over the training set.
//!
//! No user interface lives here; the crate depends on `lampwright-color` only.

#![warn(missing_docs)]

mod error;

pub mod calibration;
pub mod correction;
pub mod display;
pub mod fit_de2000;
pub mod fit_linear;
pub mod locus;
pub mod pipeline;
pub mod quality;
pub mod raw;
pub mod root_poly;
pub mod sensitivities;
pub mod training;
pub mod white_balance;

pub use calibration::MatrixMode;
pub use correction::{ColorCorrection, DeltaEStats, FitData, FitMethod, fit_color_correction};
pub use display::{DisplayColor, DisplaySpace};
pub use error::{CameraError, Result};
pub use pipeline::{
    CameraPipeline, CameraSettings, Comparison, SubjectComparison, camera_metamers,
};
pub use raw::{SceneResponse, SignalSums, SubjectSignal, raw_signal};
pub use sensitivities::{CameraSensitivities, SharedCamera};
pub use training::TrainingSet;
pub use white_balance::{WbGains, WbPreset, WhiteBalance};
