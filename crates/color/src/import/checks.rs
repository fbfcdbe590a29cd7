//! Spectral checks on a raw table: wavelength units, range and order; column
//! names and unit hints; percent, dark noise and all-zero columns; coverage.

use super::rows::RawTable;
use super::{
    DARK_NOISE_FRACTION, Fail, ImportedColumn, MAX_WAVELENGTH_NM, MICROMETRE_LIMIT,
    MIN_WAVELENGTH_NM, PERCENT_MAX_THRESHOLD, SpectrumKind,
};
use crate::spectrum::{VISIBLE_END_LIMIT_NM, VISIBLE_START_LIMIT_NM};
use std::cmp::Ordering;

/// The checked table: increasing wavelengths, named columns, warnings.
pub(super) struct Checked {
    pub(super) wavelengths_nm: Vec<f64>,
    pub(super) columns: Vec<ImportedColumn>,
    pub(super) warnings: Vec<String>,
}

pub(super) fn check(mut raw: RawTable, kind: SpectrumKind) -> Result<Checked, Fail> {
    let first_line = raw.line_numbers.first().copied().unwrap_or(0);
    if raw.wavelengths.len() < 2 {
        return Err(Fail::at(
            first_line,
            "only one data row: a spectrum needs at least two wavelengths".into(),
        ));
    }
    if let Some(required) = kind.required_value_columns()
        && raw.columns.len() != required
    {
        return Err(Fail::at(
            raw.header_line.unwrap_or(first_line),
            format!(
                "{} tables need exactly {required} value columns (r, g, b); found {}",
                kind.name(),
                raw.columns.len()
            ),
        ));
    }
    check_wavelengths(&raw.wavelengths, &raw.line_numbers)?;
    let mut warnings = Vec::new();
    if raw.wavelengths[1] < raw.wavelengths[0] {
        raw.wavelengths.reverse();
        raw.line_numbers.reverse();
        for column in &mut raw.columns {
            column.reverse();
        }
        warnings.push("wavelengths were in decreasing order; the table was reversed".to_string());
    }
    let mut columns = Vec::with_capacity(raw.columns.len());
    for (index, values) in std::mem::take(&mut raw.columns).into_iter().enumerate() {
        let (name, header_unit) = raw
            .names
            .get(index)
            .map_or((None, None), |text| split_name_and_unit(text));
        let unit_hint = header_unit.or_else(|| {
            raw.units
                .get(index)
                .map(|u| strip_brackets(u.trim()).to_string())
                .filter(|u| !u.is_empty())
        });
        let column = ImportedColumn {
            name: name.unwrap_or_else(|| format!("value {}", index + 1)),
            values,
            unit_hint,
        };
        columns.push(check_column(
            column,
            kind,
            &raw.line_numbers,
            &mut warnings,
        )?);
    }
    let first = raw.wavelengths[0];
    let last = raw.wavelengths[raw.wavelengths.len() - 1];
    if first > VISIBLE_START_LIMIT_NM || last < VISIBLE_END_LIMIT_NM {
        warnings.push(format!(
            "data cover {first}–{last} nm, not roughly 380–780 nm: colour computation will refuse this table"
        ));
    }
    Ok(Checked {
        wavelengths_nm: raw.wavelengths,
        columns,
        warnings,
    })
}

fn check_wavelengths(wavelengths: &[f64], lines: &[usize]) -> Result<(), Fail> {
    if wavelengths
        .iter()
        .all(|wl| *wl > 0.0 && *wl < MICROMETRE_LIMIT)
    {
        return Err(Fail::at(
            lines[0],
            format!(
                "all wavelengths are below {MICROMETRE_LIMIT}: they look like micrometres (µm); \
                 give wavelengths in nanometres (1 µm = 1000 nm)"
            ),
        ));
    }
    if let Some(i) = wavelengths
        .iter()
        .position(|wl| !(MIN_WAVELENGTH_NM..=MAX_WAVELENGTH_NM).contains(wl))
    {
        return Err(Fail::at(
            lines[i],
            format!(
                "wavelength {} nm is outside the plausible range {MIN_WAVELENGTH_NM}–{MAX_WAVELENGTH_NM} nm",
                wavelengths[i]
            ),
        ));
    }
    let increasing = wavelengths[1] > wavelengths[0];
    for i in 1..wavelengths.len() {
        let (prev, wl) = (wavelengths[i - 1], wavelengths[i]);
        match (wl.partial_cmp(&prev), increasing) {
            (Some(Ordering::Greater), true) | (Some(Ordering::Less), false) => {}
            (Some(Ordering::Equal), _) => {
                return Err(Fail::at(
                    lines[i],
                    format!(
                        "duplicate wavelength {wl} nm (also on line {})",
                        lines[i - 1]
                    ),
                ));
            }
            _ => {
                let direction = if increasing { "increase" } else { "decrease" };
                return Err(Fail::at(
                    lines[i],
                    format!(
                        "wavelength {wl} nm is out of order after {prev} nm: wavelengths must all {direction}"
                    ),
                ));
            }
        }
    }
    Ok(())
}

fn check_column(
    mut column: ImportedColumn,
    kind: SpectrumKind,
    lines: &[usize],
    warnings: &mut Vec<String>,
) -> Result<ImportedColumn, Fail> {
    let max = column
        .values
        .iter()
        .copied()
        .fold(f64::NEG_INFINITY, f64::max);
    let min = column.values.iter().copied().fold(f64::INFINITY, f64::min);
    if min < 0.0 {
        let allowed = DARK_NOISE_FRACTION * max.max(0.0);
        if let Some(i) = column.values.iter().position(|v| *v < -allowed) {
            return Err(Fail::at(
                lines[i],
                format!(
                    "value {} in column '{}' is negative beyond dark noise \
                     (more than {}% of the column maximum {})",
                    column.values[i],
                    column.name,
                    DARK_NOISE_FRACTION * 100.0,
                    max
                ),
            ));
        }
        let count = column.values.iter().filter(|v| **v < 0.0).count();
        for v in &mut column.values {
            *v = v.max(0.0);
        }
        warnings.push(format!(
            "column '{}': {count} small negative values (down to {min}) read as dark noise and set to 0",
            column.name
        ));
    }
    if matches!(
        kind,
        SpectrumKind::Reflectance | SpectrumKind::Transmittance
    ) {
        let header_says_percent = column.unit_hint.as_deref().is_some_and(|u| u.contains('%'));
        if header_says_percent || max > PERCENT_MAX_THRESHOLD {
            let reason = if header_says_percent {
                "the header says %".to_string()
            } else {
                format!("its maximum {max} is above {PERCENT_MAX_THRESHOLD}")
            };
            for v in &mut column.values {
                *v /= 100.0;
            }
            warnings.push(format!(
                "column '{}' read as percent ({reason}) and divided by 100",
                column.name
            ));
        }
    }
    if column.values.iter().all(|v| *v == 0.0) {
        warnings.push(format!(
            "column '{}' is zero at every wavelength: colour computation will refuse it",
            column.name
        ));
    }
    Ok(column)
}

/// Split a header cell into a column name and a unit hint: the text in a
/// final pair of brackets ("Irradiance (W/m2/nm)", "R [%]"), or "%" when the
/// name holds a percent sign ("T%").
fn split_name_and_unit(text: &str) -> (Option<String>, Option<String>) {
    let text = text.trim();
    let non_empty = |s: &str| Some(s.trim().to_string()).filter(|s| !s.is_empty());
    if let Some(open) = final_bracket_start(text) {
        let unit = &text[open + 1..text.len() - 1];
        return (non_empty(&text[..open]), non_empty(unit));
    }
    let unit = text.contains('%').then(|| "%".to_string());
    (non_empty(text), unit)
}

/// Byte index of the bracket that opens a final "(…)" or "[…]" group.
fn final_bracket_start(text: &str) -> Option<usize> {
    let (open, close) = match text.chars().last()? {
        ')' => ('(', ')'),
        ']' => ('[', ']'),
        _ => return None,
    };
    let mut depth = 0_usize;
    for (i, c) in text.char_indices().rev() {
        if c == close {
            depth += 1;
        } else if c == open {
            depth -= 1;
            if depth == 0 {
                return Some(i);
            }
        }
    }
    None
}

fn strip_brackets(text: &str) -> &str {
    match final_bracket_start(text) {
        Some(0) => text[1..text.len() - 1].trim(),
        _ => text,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splits_names_and_units() {
        let s = |t: &str| split_name_and_unit(t);
        assert_eq!(
            s("Irradiance (W/m2/nm)"),
            (Some("Irradiance".into()), Some("W/m2/nm".into()))
        );
        assert_eq!(
            s("E [W/(m2 nm)]"),
            (Some("E".into()), Some("W/(m2 nm)".into()))
        );
        assert_eq!(
            s("E (W/(m2 nm))"),
            (Some("E".into()), Some("W/(m2 nm)".into()))
        );
        assert_eq!(s("T%"), (Some("T%".into()), Some("%".into())));
        assert_eq!(s("(%)"), (None, Some("%".into())));
        assert_eq!(s("Lamp A"), (Some("Lamp A".into()), None));
        assert_eq!(s("odd)"), (Some("odd)".into()), None));
        assert_eq!(strip_brackets("[%]"), "%");
    }

    fn raw(wavelengths: &[f64], values: &[f64]) -> RawTable {
        RawTable {
            header_line: None,
            names: vec![],
            units: vec![],
            wavelengths: wavelengths.to_vec(),
            columns: vec![values.to_vec()],
            line_numbers: (1..=wavelengths.len()).collect(),
        }
    }

    #[test]
    fn reverses_decreasing_tables() {
        let c = check(
            raw(&[780.0, 580.0, 380.0], &[3.0, 2.0, 1.0]),
            SpectrumKind::Lamp,
        )
        .unwrap();
        assert_eq!(c.wavelengths_nm, vec![380.0, 580.0, 780.0]);
        assert_eq!(c.columns[0].values, vec![1.0, 2.0, 3.0]);
        assert!(c.warnings[0].contains("reversed"));
    }

    #[test]
    fn wavelength_errors_name_their_line() {
        let f = |w: &[f64]| {
            check(raw(w, &vec![1.0; w.len()]), SpectrumKind::Lamp)
                .err()
                .unwrap()
        };
        assert!(f(&[0.38, 0.39, 0.4]).message.contains("micrometres"));
        assert_eq!(f(&[380.0, 390.0, 3000.0]).line, 3);
        assert_eq!(f(&[380.0, 390.0, 390.0]).line, 3);
        assert_eq!(f(&[380.0, 390.0, 385.0, 400.0]).line, 3);
        assert_eq!(f(&[380.0]).line, 1);
    }

    #[test]
    fn negative_values_are_noise_or_errors() {
        let ok = check(
            raw(&[380.0, 390.0, 400.0], &[-0.005, 1.0, 0.5]),
            SpectrumKind::Lamp,
        )
        .unwrap();
        assert_eq!(ok.columns[0].values, vec![0.0, 1.0, 0.5]);
        assert!(ok.warnings.iter().any(|w| w.contains("dark noise")));
        let bad = check(
            raw(&[380.0, 390.0, 400.0], &[0.0, 1.0, -0.02]),
            SpectrumKind::Lamp,
        )
        .err()
        .unwrap();
        assert_eq!(bad.line, 3);
        assert!(bad.message.contains("negative"));
        assert!(check(raw(&[380.0, 390.0], &[-1e-9, 0.0]), SpectrumKind::Lamp).is_err());
    }

    #[test]
    fn percent_only_for_reflectance_and_transmittance() {
        let lamp = check(raw(&[380.0, 780.0], &[50.0, 80.0]), SpectrumKind::Lamp).unwrap();
        assert_eq!(lamp.columns[0].values, vec![50.0, 80.0]);
        let refl = check(
            raw(&[380.0, 780.0], &[50.0, 80.0]),
            SpectrumKind::Reflectance,
        )
        .unwrap();
        assert_eq!(refl.columns[0].values, vec![0.5, 0.8]);
        let fluorescent =
            check(raw(&[380.0, 780.0], &[0.5, 1.4]), SpectrumKind::Reflectance).unwrap();
        assert_eq!(fluorescent.columns[0].values, vec![0.5, 1.4]);
    }
}
