//! Spectral Similarity Index (SSI) of the Academy of Motion Picture Arts and
//! Sciences: how closely a light's spectrum follows a reference spectrum over
//! 375–675 nm, the range that matters to camera sensors, on a 0–100 scale.
//!
//! Steps (ST 2122:2020 / Holm et al. 2016):
//! 1. Both spectra at 1 nm over 375–675 nm (Lampwright's grid already is).
//! 2. Integration into 30 bins of 10 nm centred on 380, 390, …, 670 nm
//!    (trapezoidal weights ½, 1, …, 1, ½ over the 11 samples of each bin).
//! 3. Each spectrum normalised so its bins sum to 1.
//! 4. Relative difference per bin: `(t − r) / (r + 1/30)`.
//! 5. Weighting: 4/15, 22/45, 32/45, 40/45, 44/45 for the first five bins,
//!    11/15 and 3/15 for the last two, 1 in between.
//! 6. Smoothing with the kernel (0.22, 0.56, 0.22), zero beyond the ends.
//! 7. `SSI = 100 − 32·√(Σ smoothed²)`, rounded to an integer.
//!
//! Lampwright returns the integer clamped at 0 (very different spectra would
//! otherwise give negative scores) together with the unrounded, unclamped
//! value. colour-science 0.4.7 (`spectral_similarity_index`) rounds by default
//! (`NumPy`'s round-half-to-even) and does not clamp.
//!
//! Default reference (ST 2122): Planckian radiator below 4000 K, CIE daylight
//! at and above, at the test light's CCT.
//!
//! # References
//! - SMPTE ST 2122:2020, *Spectral Similarity Index (SSI)*.
//! - Holm, J., Maier, T., Debevec, P., `LeGendre`, C., Pines, J., Erland, J.,
//!   Joblove, G., Dyer, S., Sloan, B., di Gennaro, J., Sherlock, D. (2016).
//!   A cinematographic spectral similarity index. *SMPTE 2016 Annual Technical
//!   Conference and Exhibition*.
//! - Academy of Motion Picture Arts and Sciences (2020), *Academy Spectral
//!   Similarity Index (SSI): Overview*.

use crate::cct::{CctMethod, cct_duv, uv1960_of_spd};
use crate::cri::ReferenceKind;
use crate::error::{ColorError, Result};
use crate::illuminant::{daylight, daylight_basis, daylight_m1_m2, planckian};
use crate::mired_table::MiredTable;
use crate::spectrum::{GRID_LEN, GRID_START_NM, RelativeSpd};
use std::sync::LazyLock;

/// First wavelength SSI uses, nm.
pub const SSI_START_NM: u32 = 375;
/// Number of 10 nm bins (centres 380–670 nm).
const BINS: usize = 30;

/// CCT at and above which the SSI default reference is CIE daylight, K.
pub const SSI_DAYLIGHT_FROM_K: f64 = 4000.0;

/// Per-bin weights of ST 2122 (step 5).
const WEIGHTS: [f64; BINS] = {
    let mut w = [1.0; BINS];
    w[0] = 4.0 / 15.0;
    w[1] = 22.0 / 45.0;
    w[2] = 32.0 / 45.0;
    w[3] = 40.0 / 45.0;
    w[4] = 44.0 / 45.0;
    w[BINS - 2] = 11.0 / 15.0;
    w[BINS - 1] = 3.0 / 15.0;
    w
};

/// An SSI score.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Ssi {
    /// The index as published: rounded to an integer (half away from zero), clamped at 0.
    pub value: i32,
    /// `100 − 32·√Σ…` before rounding and clamping (may be negative).
    pub unrounded: f64,
}

/// The ten-nanometre bins of spectral values on the grid, unnormalised.
fn raw_bins(v: &[f64; GRID_LEN]) -> [f64; BINS] {
    let start = (SSI_START_NM - GRID_START_NM) as usize;
    let mut bins = [0.0; BINS];
    for (b, out) in bins.iter_mut().enumerate() {
        let i0 = start + 10 * b;
        *out = 0.5 * v[i0] + v[i0 + 1..i0 + 10].iter().sum::<f64>() + 0.5 * v[i0 + 10];
    }
    bins
}

/// `bins` normalised to sum 1; refused when they carry no power.
fn normalised(mut bins: [f64; BINS], what: &str) -> Result<[f64; BINS]> {
    let total: f64 = bins.iter().sum();
    if !(total > 0.0 && total.is_finite()) {
        return Err(ColorError::NotColorimetric {
            what: what.to_string(),
            reason: "it has no power between 375 and 675 nm".into(),
        });
    }
    for b in &mut bins {
        *b /= total;
    }
    Ok(bins)
}

/// The ten-nanometre bins of a spectrum, normalised to sum 1.
fn binned(spd: &RelativeSpd, what: &str) -> Result<[f64; BINS]> {
    normalised(raw_bins(spd.values()), what)
}

/// Normalised bins of the Planckian radiator, 1000–4000 K, 1 mired between
/// nodes (see the table-against-direct test).
static PLANCK_TABLE: LazyLock<Result<MiredTable>> = LazyLock::new(|| {
    MiredTable::build((1000.0, SSI_DAYLIGHT_FROM_K), 751, BINS, |t, out| {
        out.copy_from_slice(&binned(&planckian(t)?, "Planckian")?);
        Ok(())
    })
});

/// Raw bins of the daylight basis S0, S1, S2 (daylight is linear in them).
static DAYLIGHT_BINS: LazyLock<Result<[[f64; BINS]; 3]>> =
    LazyLock::new(|| Ok(daylight_basis()?.each_ref().map(raw_bins)));

/// The default reference's normalised bins at `cct_k`, from the table or the
/// daylight basis where they reach, from the reference spectrum otherwise.
fn reference_bins(cct_k: f64) -> Result<[f64; BINS]> {
    if cct_k >= SSI_DAYLIGHT_FROM_K {
        let (m1, m2) = daylight_m1_m2(cct_k)?;
        let [b0, b1, b2] = DAYLIGHT_BINS.as_ref().map_err(Clone::clone)?;
        let mut bins = [0.0; BINS];
        for (i, b) in bins.iter_mut().enumerate() {
            *b = b0[i] + m1 * b1[i] + m2 * b2[i];
        }
        return normalised(bins, "SSI reference");
    }
    if let Ok(table) = PLANCK_TABLE.as_ref() {
        let mut bins = [0.0; BINS];
        if table.eval(cct_k, &mut bins) {
            return Ok(bins);
        }
    }
    binned(&ssi_reference(cct_k)?.0, "SSI reference")
}

/// SSI of `test` against `reference` (both relative; scale does not matter).
///
/// Refuses spectra that are not colorimetric or carry no power in 375–675 nm.
///
/// # References
/// - SMPTE ST 2122:2020; Holm et al. (2016), SMPTE Annual Technical Conference.
pub fn ssi(test: &RelativeSpd, reference: &RelativeSpd) -> Result<Ssi> {
    test.check_colorimetric("light")?;
    reference.check_colorimetric("SSI reference")?;
    ssi_of_bins(
        &binned(test, "light")?,
        &binned(reference, "SSI reference")?,
    )
}

/// SSI of `test` against the default reference at a CCT already known (`cct_k`).
pub fn ssi_at_cct(test: &RelativeSpd, cct_k: f64) -> Result<Ssi> {
    test.check_colorimetric("light")?;
    ssi_of_bins(&binned(test, "light")?, &reference_bins(cct_k)?)
}

/// The unnormalised ten-nanometre bins SSI starts from (linear in the light).
pub(crate) type RawBins = [f64; BINS];

/// [`RawBins`] of a spectrum.
pub(crate) fn raw_bins_of(spd: &RelativeSpd) -> RawBins {
    raw_bins(spd.values())
}

/// SSI from the test light's raw bins (a light already checked as
/// colorimetric) against the default reference at `cct_k`.
pub(crate) fn ssi_of_raw_bins(test: &RawBins, cct_k: f64) -> Result<Ssi> {
    ssi_of_bins(&normalised(*test, "light")?, &reference_bins(cct_k)?)
}

/// Steps 4–7 from the normalised bins of test and reference.
fn ssi_of_bins(t: &[f64; BINS], r: &[f64; BINS]) -> Result<Ssi> {
    let mut wd = [0.0; BINS];
    for i in 0..BINS {
        wd[i] = WEIGHTS[i] * (t[i] - r[i]) / (r[i] + 1.0 / 30.0);
    }
    let mut sum_sq = 0.0;
    for i in 0..BINS {
        let prev = if i > 0 { wd[i - 1] } else { 0.0 };
        let next = if i + 1 < BINS { wd[i + 1] } else { 0.0 };
        let s = 0.22 * prev + 0.56 * wd[i] + 0.22 * next;
        sum_sq += s * s;
    }
    let unrounded = 100.0 - 32.0 * sum_sq.sqrt();
    if !unrounded.is_finite() {
        return Err(ColorError::Numerical(
            "SSI computation gave a non-finite result".into(),
        ));
    }
    Ok(Ssi {
        value: unrounded.round().max(0.0) as i32,
        unrounded,
    })
}

/// The SSI default reference at `cct_k`: Planckian below 4000 K, CIE daylight at and above.
pub fn ssi_reference(cct_k: f64) -> Result<(RelativeSpd, ReferenceKind)> {
    if cct_k < SSI_DAYLIGHT_FROM_K {
        Ok((planckian(cct_k)?, ReferenceKind::Planckian))
    } else {
        Ok((daylight(cct_k)?, ReferenceKind::Daylight))
    }
}

/// SSI of a light against its default reference at its own CCT (Ohno 2014).
pub fn ssi_default(test: &RelativeSpd) -> Result<Ssi> {
    let cct = cct_duv(uv1960_of_spd(test, "light")?, CctMethod::Ohno2014)?;
    ssi_at_cct(test, cct.cct_k)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tabulated_reference_matches_the_direct_one() {
        let mut worst = 0.0f64;
        for t in [
            1000.0, 1001.3, 1777.7, 2856.0, 3201.9, 3999.9, 4000.0, 6504.0, 19_500.0,
        ] {
            let fast = reference_bins(t).unwrap();
            let direct = binned(&ssi_reference(t).unwrap().0, "reference").unwrap();
            for (a, b) in fast.iter().zip(&direct) {
                worst = worst.max((a - b).abs());
            }
        }
        eprintln!("largest SSI reference difference {worst:e}");
        // Bins are fractions of 1; SSI is published as an integer.
        assert!(worst < 1e-10, "largest bin difference {worst}");
    }

    #[test]
    fn identical_spectra_score_100_and_scale_does_not_matter() {
        let p = planckian(3200.0).unwrap();
        let s = ssi(&p.scaled(7.0), &p).unwrap();
        assert_eq!(s.value, 100);
        assert!((s.unrounded - 100.0).abs() < 1e-12);
        assert_eq!(ssi_default(&p).unwrap().value, 100);
    }

    #[test]
    fn weights_follow_the_specification() {
        // ST 2122 ramps: the weights rise 4/15 … 44/45 and fall 11/15, 3/15.
        assert!((WEIGHTS[0] - 4.0 / 15.0).abs() < 1e-15);
        assert!((WEIGHTS[5] - 1.0).abs() < 1e-15);
        assert!((WEIGHTS[29] - 0.2).abs() < 1e-15);
        assert_eq!(
            WEIGHTS.iter().filter(|w| (**w - 1.0).abs() < 1e-15).count(),
            23
        );
    }

    #[test]
    fn very_different_spectra_clamp_at_zero() {
        // A narrow green line against tungsten: far below zero before clamping.
        let line = RelativeSpd::from_fn(|wl| 1e-6 + (-((wl - 530.0) / 5.0).powi(2)).exp());
        let s = ssi(&line, &planckian(3000.0).unwrap()).unwrap();
        assert!(s.unrounded < 0.0, "{s:?}");
        assert_eq!(s.value, 0);
    }

    #[test]
    fn refuses_dark_spectra() {
        let dark = RelativeSpd::from_fn(|_| 0.0);
        assert!(ssi(&dark, &planckian(3000.0).unwrap()).is_err());
        let ir_only = RelativeSpd::from_fn(|wl| if wl > 700.0 { 1.0 } else { 0.0 });
        assert!(ssi(&ir_only, &planckian(3000.0).unwrap()).is_err());
    }
}
