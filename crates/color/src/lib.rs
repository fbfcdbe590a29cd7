//! Spectral colour computation for Lampwright.
//!
//! Everything here works on one internal wavelength grid (360–830 nm at 1 nm,
//! the CIE 15 range): spectra of light sources, reflectances, transmittances and
//! sensitivities; the CIE standard observers and illuminants; colour spaces,
//! chromatic adaptation, colour appearance, colour difference; and the
//! light-source quality figures of the trade (CCT/Duv, CRI, TM-30, SSI).
//!
//! No user interface lives here. Every public function documents its units,
//! its valid input range and the published reference it implements.

pub mod adaptation;
pub mod batch_math;
pub mod cam02;
pub mod cct;
pub mod cri;
pub mod delta_e;
mod error;
pub mod illuminant;
pub mod import;
pub mod lamp_report;
pub mod light_sums;
mod mired_table;
pub mod observer;
pub mod photometry;
pub mod resample;
pub mod rgb;
pub mod spaces;
mod spectral_weights;
pub mod spectrum;
pub mod ssi;
pub mod table;
pub mod tm30;
pub mod tristimulus;
pub mod weighted_sums;

pub use error::{ColorError, Result};
pub use spectrum::{
    Coverage, GRID_END_NM, GRID_LEN, GRID_START_NM, Reflectance, RelativeSpd, Sensitivity,
    SpectralIrradiance, Transmittance,
};
pub use tristimulus::Xyz;
