//! Light-source spectra of the standards: Planckian radiators, CIE daylight,
//! CIE illuminant A and the CIE tables (D, F, FL3, HP, LED series).
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed.: §4.1 (illuminant A), §4.1.2 and
//!   Table 6 (daylight S0, S1, S2; M1 and M2 rounded to three decimals),
//!   Tables 10–13 (F, FL3, HP and LED series).
//! - Planck's law with c2 = 1.4388 × 10⁻² m·K (ITS-90 value, CIE 15:2018 §3.1).

use crate::error::{ColorError, Result};
use crate::spectrum::{
    Coverage, GRID_LEN, GRID_START_NM, RelativeSpd, grid_wavelength_nm, grid_wavelengths_nm,
};
use crate::table::AssetTable;
use std::collections::HashMap;
use std::sync::LazyLock;

/// Second radiation constant c2 in m·K (CIE 15:2018).
pub const C2_M_K: f64 = 1.4388e-2;

/// Lowest and highest Planckian temperatures accepted, K.
pub const PLANCKIAN_RANGE_K: (f64, f64) = (100.0, 1.0e6);

/// CIE daylight is defined for correlated colour temperatures 4000–25 000 K.
pub const DAYLIGHT_RANGE_K: (f64, f64) = (4000.0, 25_000.0);

/// Relative spectral power of a Planckian (black-body) radiator at `t_kelvin`,
/// normalised to 100 at 560 nm.
///
/// `M(λ,T) ∝ λ⁻⁵ / (exp(c2/(λT)) − 1)`, c2 = 1.4388 × 10⁻² m·K.
pub fn planckian(t_kelvin: f64) -> Result<RelativeSpd> {
    if !(t_kelvin.is_finite() && (PLANCKIAN_RANGE_K.0..=PLANCKIAN_RANGE_K.1).contains(&t_kelvin)) {
        return Err(ColorError::OutOfRange {
            what: "Planckian temperature (K)",
            value: t_kelvin,
            range: "100–1 000 000 K",
        });
    }
    // The exponentials of the whole grid at once (vectorised); exp(x) − 1
    // loses digits only for small x, which takes `exp_m1` (above ~170 000 K).
    let x: Vec<f64> = (0..GRID_LEN)
        .map(|i| C2_M_K / (grid_wavelength_nm(i) * 1e-9 * t_kelvin))
        .collect();
    let mut e = x.clone();
    crate::batch_math::exp_in_place(&mut e);
    let m: Vec<f64> = (0..GRID_LEN)
        .map(|i| {
            let wl = grid_wavelength_nm(i) * 1e-9;
            let denom = if x[i] < 0.1 {
                x[i].exp_m1()
            } else {
                e[i] - 1.0
            };
            wl.powi(-5) / denom
        })
        .collect();
    let norm = 100.0 / m[(560 - GRID_START_NM) as usize];
    let mut values = [0.0; GRID_LEN];
    for (v, m) in values.iter_mut().zip(&m) {
        *v = m * norm;
    }
    RelativeSpd::from_grid(values, Coverage::FULL)
}

/// CIE standard illuminant A from its defining formula (CIE 15:2018 eq. 4.1),
/// normalised to 100 at 560 nm. Its CCT is 2856 K on today's c2.
#[must_use]
pub fn cie_a() -> RelativeSpd {
    // The formula keeps the historical c2 = 1.435e-2 m·K and T = 2848 K.
    let c: f64 = 1.435e7 / (2848.0 * 560.0);
    RelativeSpd::from_fn(|wl| {
        100.0 * (560.0 / wl).powi(5) * c.exp_m1() / (1.435e7 / (2848.0 * wl)).exp_m1()
    })
}

/// Chromaticity (x, y) of CIE daylight at correlated colour temperature `t_kelvin`
/// (CIE 15:2018 eqs. 4.7–4.9), valid 4000–25 000 K.
pub fn daylight_xy(t_kelvin: f64) -> Result<(f64, f64)> {
    if !(t_kelvin.is_finite() && (DAYLIGHT_RANGE_K.0..=DAYLIGHT_RANGE_K.1).contains(&t_kelvin)) {
        return Err(ColorError::OutOfRange {
            what: "CIE daylight CCT (K)",
            value: t_kelvin,
            range: "4000–25 000 K",
        });
    }
    let t = t_kelvin;
    let x = if t <= 7000.0 {
        -4.6070e9 / t.powi(3) + 2.9678e6 / t.powi(2) + 0.09911e3 / t + 0.244063
    } else {
        -2.0064e9 / t.powi(3) + 1.9018e6 / t.powi(2) + 0.24748e3 / t + 0.237040
    };
    let y = -3.000 * x * x + 2.870 * x - 0.275;
    Ok((x, y))
}

/// The daylight basis S0, S1, S2 interpolated linearly onto the grid once
/// (CIE 15 recommends linear interpolation for the D series).
struct DaylightBasis {
    s: [[f64; GRID_LEN]; 3],
}

static DAYLIGHT_BASIS: LazyLock<Option<DaylightBasis>> = LazyLock::new(|| {
    let t = AssetTable::parse(
        "cie_daylight_basis.csv",
        include_str!("../../../assets/standard/cie_daylight_basis.csv"),
    )
    .ok()?;
    let w = &t.wavelengths_nm;
    if w.len() < 2 || t.columns.len() < 3 {
        return None;
    }
    let mut s = [[0.0; GRID_LEN]; 3];
    for (i, wl) in grid_wavelengths_nm().enumerate() {
        let k = w.partition_point(|v| *v <= wl).clamp(1, w.len() - 1) - 1;
        let f = ((wl - w[k]) / (w[k + 1] - w[k])).clamp(0.0, 1.0);
        for (basis, column) in s.iter_mut().zip(&t.columns) {
            basis[i] = column[k] * (1.0 - f) + column[k + 1] * f;
        }
    }
    Some(DaylightBasis { s })
});

/// The weights M1, M2 of S1 and S2 in CIE daylight at `t_kelvin` (CIE 15:2018
/// eqs. 4.10–4.12), rounded to three decimals as CIE 15:2018 prescribes.
pub(crate) fn daylight_m1_m2(t_kelvin: f64) -> Result<(f64, f64)> {
    let round3 = |v: f64| (v * 1000.0).round() / 1000.0;
    let (m1, m2) = daylight_m1_m2_unrounded(t_kelvin)?;
    Ok((round3(m1), round3(m2)))
}

/// [`daylight_m1_m2`] before rounding: smooth in `t_kelvin`.
pub(crate) fn daylight_m1_m2_unrounded(t_kelvin: f64) -> Result<(f64, f64)> {
    let (x, y) = daylight_xy(t_kelvin)?;
    let m = 0.0241 + 0.2562 * x - 0.7341 * y;
    Ok((
        (-1.3515 - 1.7703 * x + 5.9114 * y) / m,
        (0.0300 - 31.4424 * x + 30.0717 * y) / m,
    ))
}

/// S0, S1, S2 on the grid (CIE daylight is `S0 + M1·S1 + M2·S2`, so anything
/// linear in the spectrum can be precomputed per basis function).
pub(crate) fn daylight_basis() -> Result<&'static [[f64; GRID_LEN]; 3]> {
    DAYLIGHT_BASIS
        .as_ref()
        .map(|b| &b.s)
        .ok_or_else(|| ColorError::Numerical("daylight basis table failed to load".into()))
}

/// CIE daylight at correlated colour temperature `t_kelvin` (4000–25 000 K),
/// from the S0, S1, S2 basis with M1 and M2 rounded to three decimals as
/// CIE 15:2018 prescribes. The basis is interpolated linearly between its
/// 5 nm points (CIE 15 recommends linear interpolation for the D series).
/// Normalised to 100 at 560 nm (where S1 = S2 = 0).
pub fn daylight(t_kelvin: f64) -> Result<RelativeSpd> {
    let (m1, m2) = daylight_m1_m2(t_kelvin)?;
    let basis = daylight_basis()?;
    let mut grid = [0.0; GRID_LEN];
    for (i, g) in grid.iter_mut().enumerate() {
        *g = basis[0][i] + m1 * basis[1][i] + m2 * basis[2][i];
    }
    RelativeSpd::from_grid(grid, Coverage::FULL)
}

/// The CIE's tabulated illuminants and light-source spectra.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, serde::Serialize, serde::Deserialize)]
pub enum StandardIlluminant {
    /// Illuminant A (tungsten, 2856 K).
    A,
    /// D50.
    D50,
    /// D55.
    D55,
    /// D65.
    D65,
    /// D75.
    D75,
    /// F1–F12 (fluorescent lamps), by number.
    F(u8),
    /// FL3.1–FL3.15 (newer fluorescent lamps), by number.
    Fl3(u8),
    /// HP1–HP5 (high-pressure discharge lamps), by number.
    Hp(u8),
    /// LED-B1…B5 (phosphor-converted blue LEDs), by number.
    LedB(u8),
    /// LED-BH1 (hybrid blue + red LED).
    LedBh1,
    /// LED-RGB1 (three-chip LED).
    LedRgb1,
    /// LED-V1 (violet-pumped phosphor LED).
    LedV1,
    /// LED-V2 (violet-pumped phosphor LED).
    LedV2,
}

impl StandardIlluminant {
    /// Every table, in CIE order.
    #[must_use]
    pub fn all() -> Vec<StandardIlluminant> {
        use StandardIlluminant as S;
        let mut v = vec![S::A, S::D50, S::D55, S::D65, S::D75];
        v.extend((1..=12).map(S::F));
        v.extend((1..=15).map(S::Fl3));
        v.extend((1..=5).map(S::Hp));
        v.extend((1..=5).map(S::LedB));
        v.extend([S::LedBh1, S::LedRgb1, S::LedV1, S::LedV2]);
        v
    }

    /// The CIE's name, e.g. "F2", "FL3.1", "HP1", "LED-B3".
    #[must_use]
    pub fn name(self) -> String {
        use StandardIlluminant as S;
        match self {
            S::A => "A".into(),
            S::D50 => "D50".into(),
            S::D55 => "D55".into(),
            S::D65 => "D65".into(),
            S::D75 => "D75".into(),
            S::F(n) => format!("F{n}"),
            S::Fl3(n) => format!("FL3.{n}"),
            S::Hp(n) => format!("HP{n}"),
            S::LedB(n) => format!("LED-B{n}"),
            S::LedBh1 => "LED-BH1".into(),
            S::LedRgb1 => "LED-RGB1".into(),
            S::LedV1 => "LED-V1".into(),
            S::LedV2 => "LED-V2".into(),
        }
    }

    /// Look a table up by its CIE name (case-insensitive; "FL2" is accepted for "F2").
    #[must_use]
    pub fn from_name(name: &str) -> Option<StandardIlluminant> {
        let wanted = name.trim().to_ascii_uppercase();
        let wanted = match wanted.strip_prefix("FL") {
            Some(rest) if !rest.contains('.') => format!("F{rest}"),
            _ => wanted,
        };
        Self::all()
            .into_iter()
            .find(|s| s.name().to_ascii_uppercase() == wanted)
    }

    /// Nominal CCT for the D series in K (CIE 15: 5003, 5503, 6504, 7504 K).
    fn d_series_cct(self) -> Option<f64> {
        let nominal = match self {
            StandardIlluminant::D50 => 5000.0,
            StandardIlluminant::D55 => 5500.0,
            StandardIlluminant::D65 => 6500.0,
            StandardIlluminant::D75 => 7500.0,
            _ => return None,
        };
        Some(nominal * 1.4388 / 1.4380)
    }

    /// The relative spectral power on the grid.
    ///
    /// A comes from its formula (360–830 nm). D50–D75 are the CIE tables from
    /// 360 to 780 nm, continued to 830 nm by the daylight basis at the nominal CCT
    /// (the tables carried by the reference package stop at 780 nm). F, FL3, HP
    /// and LED tables are 380–780 nm at 5 nm, Sprague-interpolated, end values
    /// repeated beyond, with that coverage recorded.
    pub fn spd(self) -> Result<RelativeSpd> {
        if self == StandardIlluminant::A {
            return Ok(cie_a());
        }
        let tables = TABLES
            .as_ref()
            .map_err(|e| ColorError::Numerical(format!("illuminant tables failed to load: {e}")))?;
        let name = self.name();
        let (wl, values) = tables
            .get(&name)
            .ok_or_else(|| ColorError::InvalidInput(format!("no table for illuminant {name}")))?;
        let spd = RelativeSpd::from_samples(wl, values)?;
        if let Some(cct) = self.d_series_cct() {
            let tail = daylight(cct)?;
            let last = wl.last().copied().unwrap_or(780.0);
            let mut grid = *spd.values();
            for (i, g) in grid.iter_mut().enumerate() {
                if grid_wavelength_nm(i) > last {
                    *g = tail.values()[i];
                }
            }
            return RelativeSpd::from_grid(grid, Coverage::FULL);
        }
        Ok(spd)
    }
}

type Tables = HashMap<String, (Vec<f64>, Vec<f64>)>;

static TABLES: LazyLock<Result<Tables>> = LazyLock::new(|| {
    let mut map = HashMap::new();
    for (name, text) in [
        (
            "cie_illuminants_a_d.csv",
            include_str!("../../../assets/standard/cie_illuminants_a_d.csv"),
        ),
        (
            "cie_illuminants_f_hp_led.csv",
            include_str!("../../../assets/standard/cie_illuminants_f_hp_led.csv"),
        ),
    ] {
        let t = AssetTable::parse(name, text)?;
        for (col, values) in t.names.iter().zip(&t.columns) {
            map.insert(col.clone(), (t.wavelengths_nm.clone(), values.clone()));
        }
    }
    Ok(map)
});

/// The published table of a standard illuminant, unresampled, as
/// `(wavelengths nm, values)` (for checks against the CIE values).
pub fn published_table(ill: StandardIlluminant) -> Result<(Vec<f64>, Vec<f64>)> {
    let tables = TABLES
        .as_ref()
        .map_err(|e| ColorError::Numerical(format!("illuminant tables failed to load: {e}")))?;
    tables
        .get(&ill.name())
        .cloned()
        .ok_or_else(|| ColorError::InvalidInput(format!("no table for illuminant {}", ill.name())))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn planckian_normalised_at_560() {
        let p = planckian(3200.0).unwrap();
        assert!((p.at_nm(560.0) - 100.0).abs() < 1e-9);
        assert!(p.at_nm(700.0) > p.at_nm(450.0));
        assert!(planckian(0.0).is_err());
        assert!(planckian(f64::NAN).is_err());
    }

    #[test]
    fn formula_a_matches_published_table() {
        // CIE 15:2018 Table 5 (via colour-science 0.4.7), 300–780 nm at 5 nm; the
        // table is the formula rounded to 6 significant digits.
        let (wl, v) = published_table(StandardIlluminant::A).unwrap();
        let a = cie_a();
        for (w, t) in wl.iter().zip(&v) {
            if *w >= 360.0 {
                assert!(
                    (a.at_nm(*w) - t).abs() < 1e-3 * t.max(1.0),
                    "A at {w}: {} vs {t}",
                    a.at_nm(*w)
                );
            }
        }
    }

    #[test]
    fn daylight_basis_matches_d65_table() {
        // CIE D65 table vs the daylight computation at 6504 K. The tabulated D65 was
        // computed from the 10 nm basis and rounded, so agreement is to ~0.1 %.
        let (wl, v) = published_table(StandardIlluminant::D65).unwrap();
        let d = daylight(6500.0 * 1.4388 / 1.4380).unwrap();
        for (w, t) in wl.iter().zip(&v) {
            if *w >= 360.0 {
                assert!(
                    (d.at_nm(*w) - t).abs() < 0.02 * t.max(10.0),
                    "D65 at {w}: {} vs {t}",
                    d.at_nm(*w)
                );
            }
        }
        assert!(daylight(3000.0).is_err());
    }

    #[test]
    fn every_table_loads() {
        for s in StandardIlluminant::all() {
            let spd = s.spd().unwrap();
            assert!(spd.check_colorimetric(&s.name()).is_ok(), "{}", s.name());
            assert_eq!(StandardIlluminant::from_name(&s.name()), Some(s));
        }
        assert_eq!(
            StandardIlluminant::from_name("fl2"),
            Some(StandardIlluminant::F(2))
        );
        assert_eq!(StandardIlluminant::all().len(), 46);
    }
}
