//! Training sets: the reflectances a colour-correction matrix is fitted on.
//!
//! The standard set is the 99 colour evaluation samples of CIE 224:2017 /
//! ANSI/IES TM-30 (CES01–CES99) followed by the 14 test colour samples of
//! CIE 13.3-1995 (TCS01–TCS14): 113 spectra covering natural and man-made
//! surfaces, skin, foliage and saturated colours.
//!
//! # References
//! - CIE 224:2017, *CIE 2017 Colour Fidelity Index for accurate scientific use* (CES data).
//! - CIE 13.3-1995, *Method of measuring and specifying colour rendering properties of light sources*, Table 1.

use crate::error::{CameraError, Result};
use lampwright_color::Reflectance;
use lampwright_color::table::AssetTable;
use std::hash::{Hash, Hasher};
use std::sync::LazyLock;

/// Named reflectances to fit a colour correction on.
#[derive(Debug, Clone, PartialEq)]
pub struct TrainingSet {
    names: Vec<String>,
    reflectances: Vec<Reflectance>,
    fingerprint: u64,
}

static STANDARD: LazyLock<Result<TrainingSet>> = LazyLock::new(|| {
    let mut names = Vec::new();
    let mut reflectances = Vec::new();
    for (file, text) in [
        (
            "cie224_ces99.csv",
            include_str!("../../../assets/standard/cie224_ces99.csv"),
        ),
        (
            "cie133_tcs.csv",
            include_str!("../../../assets/standard/cie133_tcs.csv"),
        ),
    ] {
        let t = AssetTable::parse(file, text)?;
        for (name, col) in t.names.iter().zip(&t.columns) {
            names.push(name.clone());
            reflectances.push(Reflectance::from_samples(&t.wavelengths_nm, col)?);
        }
    }
    TrainingSet::new(names, reflectances)
});

impl TrainingSet {
    /// A training set from names and reflectances (same length, at least 3 samples).
    pub fn new(names: Vec<String>, reflectances: Vec<Reflectance>) -> Result<TrainingSet> {
        if names.len() != reflectances.len() {
            return Err(CameraError::InvalidInput(format!(
                "{} names but {} reflectances",
                names.len(),
                reflectances.len()
            )));
        }
        if reflectances.len() < 3 {
            return Err(CameraError::InvalidInput(format!(
                "a colour correction needs at least 3 training samples, got {}",
                reflectances.len()
            )));
        }
        let mut h = std::collections::hash_map::DefaultHasher::new();
        for r in &reflectances {
            for v in r.values() {
                v.to_bits().hash(&mut h);
            }
        }
        Ok(TrainingSet {
            names,
            reflectances,
            fingerprint: h.finish(),
        })
    }

    /// The standard set: CES01–CES99 (CIE 224:2017) then TCS01–TCS14 (CIE 13.3).
    pub fn standard() -> Result<&'static TrainingSet> {
        STANDARD.as_ref().map_err(Clone::clone)
    }

    /// Sample names, in order.
    #[must_use]
    pub fn names(&self) -> &[String] {
        &self.names
    }

    /// Sample reflectances, in order.
    #[must_use]
    pub fn reflectances(&self) -> &[Reflectance] {
        &self.reflectances
    }

    /// Number of samples.
    #[must_use]
    pub fn len(&self) -> usize {
        self.reflectances.len()
    }

    /// Whether the set is empty (never true for a constructed set).
    #[must_use]
    pub fn is_empty(&self) -> bool {
        self.reflectances.is_empty()
    }

    /// A 64-bit fingerprint of the reflectances, for caching within one run.
    #[must_use]
    pub fn fingerprint(&self) -> u64 {
        self.fingerprint
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn standard_set_has_ces_then_tcs() {
        let t = TrainingSet::standard().unwrap();
        assert_eq!(t.len(), 113);
        assert_eq!(t.names()[0], "CES01");
        assert_eq!(t.names()[98], "CES99");
        assert_eq!(t.names()[99], "TCS01");
        assert_eq!(t.names()[112], "TCS14");
        // CIE 224 CES01 at 380 nm is 0.6359 (the committed table, colour-science 0.4.7).
        assert!((t.reflectances()[0].at_nm(380.0) - 0.6359).abs() < 1e-12);
        // TCS01 at 360 nm is 0.116 (CIE 13.3 Table 1).
        assert!((t.reflectances()[99].at_nm(360.0) - 0.116).abs() < 1e-12);
    }

    #[test]
    fn rejects_too_few_or_mismatched() {
        let r = Reflectance::from_fn(|_| 0.5);
        assert!(TrainingSet::new(vec!["a".into()], vec![r.clone()]).is_err());
        assert!(TrainingSet::new(vec!["a".into()], vec![r.clone(), r.clone(), r]).is_err());
    }
}
