//! CIE standard colorimetric observers, 360–830 nm at 1 nm.
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., Tables 1 and 2 (data as carried by
//!   colour-science 0.4.7; see `assets/standard/` and `scripts/extract_standard_data.py`).
//! - CIE 018:2019, *The basis of physical photometry*: V(λ) equals ȳ(λ) of the 1931 observer.

use crate::spectrum::{Coverage, GRID_LEN, Sensitivity};
use crate::table::AssetTable;
use std::sync::LazyLock;

/// Which standard observer.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
pub enum ObserverKind {
    /// CIE 1931 2° standard observer (the default for colorimetry of small fields).
    #[default]
    Cie1931TwoDegree,
    /// CIE 1964 10° supplementary standard observer (used by TM-30 / CIE 224).
    Cie1964TenDegree,
}

impl ObserverKind {
    /// The observer's tables.
    #[must_use]
    pub fn observer(self) -> &'static Observer {
        match self {
            ObserverKind::Cie1931TwoDegree => Observer::cie1931_2deg(),
            ObserverKind::Cie1964TenDegree => Observer::cie1964_10deg(),
        }
    }
}

/// Colour-matching functions x̄, ȳ, z̄ on the grid.
#[derive(Debug, Clone, PartialEq)]
pub struct Observer {
    /// Which observer this is.
    pub kind: ObserverKind,
    /// x̄(λ).
    pub x_bar: [f64; GRID_LEN],
    /// ȳ(λ) (for the 1931 observer, the photopic luminous efficiency V(λ)).
    pub y_bar: [f64; GRID_LEN],
    /// z̄(λ).
    pub z_bar: [f64; GRID_LEN],
}

const CIE1931_CSV: &str = include_str!("../../../assets/standard/cie1931_2deg_cmfs.csv");
const CIE1964_CSV: &str = include_str!("../../../assets/standard/cie1964_10deg_cmfs.csv");

fn load(kind: ObserverKind, name: &str, text: &str) -> Observer {
    // The embedded tables are 360–830 nm at 1 nm exactly; a malformed embedded
    // table is a build defect caught by the tests below, so fall back to zeros
    // rather than panic in release code.
    let mut obs = Observer {
        kind,
        x_bar: [0.0; GRID_LEN],
        y_bar: [0.0; GRID_LEN],
        z_bar: [0.0; GRID_LEN],
    };
    if let Ok(t) = AssetTable::parse(name, text)
        && t.wavelengths_nm.len() == GRID_LEN
        && t.columns.len() == 3
    {
        obs.x_bar.copy_from_slice(&t.columns[0]);
        obs.y_bar.copy_from_slice(&t.columns[1]);
        obs.z_bar.copy_from_slice(&t.columns[2]);
    }
    obs
}

static CIE1931: LazyLock<Observer> = LazyLock::new(|| {
    load(
        ObserverKind::Cie1931TwoDegree,
        "cie1931_2deg_cmfs.csv",
        CIE1931_CSV,
    )
});
static CIE1964: LazyLock<Observer> = LazyLock::new(|| {
    load(
        ObserverKind::Cie1964TenDegree,
        "cie1964_10deg_cmfs.csv",
        CIE1964_CSV,
    )
});

impl Observer {
    /// The CIE 1931 2° standard observer.
    #[must_use]
    pub fn cie1931_2deg() -> &'static Observer {
        &CIE1931
    }

    /// The CIE 1964 10° supplementary standard observer.
    #[must_use]
    pub fn cie1964_10deg() -> &'static Observer {
        &CIE1964
    }

    /// The three functions as sensitivities (for comparison with camera curves).
    #[must_use]
    pub fn as_sensitivities(&self) -> [Sensitivity; 3] {
        [&self.x_bar, &self.y_bar, &self.z_bar].map(|c| {
            Sensitivity::from_grid(*c, Coverage::FULL)
                .unwrap_or_else(|_| Sensitivity::from_fn(|_| 0.0))
        })
    }
}

/// Photopic luminous efficiency function V(λ) (= ȳ of the 1931 observer).
#[must_use]
pub fn v_lambda() -> &'static [f64; GRID_LEN] {
    &Observer::cie1931_2deg().y_bar
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tables_load_fully() {
        for obs in [Observer::cie1931_2deg(), Observer::cie1964_10deg()] {
            assert!(obs.y_bar.iter().all(|v| v.is_finite()));
            assert!(obs.y_bar.iter().copied().fold(0.0, f64::max) > 0.9);
        }
    }

    #[test]
    fn published_peak_values() {
        // CIE 15:2018 Table 1 entries: ȳ(555 nm) = 1.0 exactly; x̄(600 nm) = 1.0622; z̄(450 nm) = 1.77211.
        let o = Observer::cie1931_2deg();
        assert!((o.y_bar[555 - 360] - 1.0).abs() < 1e-12);
        assert!((o.x_bar[600 - 360] - 1.0622).abs() < 1e-9);
        assert!((o.z_bar[450 - 360] - 1.77211).abs() < 1e-9);
        // Sums over 360–830 nm at 1 nm; recalled from memory (CIE 15 white-point
        // computations for illuminant E): Σx̄ ≈ Σȳ ≈ Σz̄ ≈ 106.86.
        let sy: f64 = o.y_bar.iter().sum();
        assert!((sy - 106.857).abs() < 0.01, "{sy}");
    }
}
