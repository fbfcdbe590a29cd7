//! Import of measured spectral tables: lamp spectra, reflectances,
//! transmittances and camera sensitivities, as instruments and spreadsheets
//! write them.
//!
//! # Accepted input
//! - Text in UTF-8 (with or without byte-order mark) or UTF-16 LE/BE with a
//!   byte-order mark; `\n`, `\r\n` or `\r` line ends; `#` comment lines and
//!   blank lines anywhere.
//! - One wavelength column (nm) then one or more value columns, separated by
//!   commas (with or without spaces), semicolons, tabs or runs of spaces, the
//!   same on every line. A decimal comma is accepted with semicolon, tab or
//!   space separators; with comma separators it is ambiguous and refused.
//! - An optional header line (cells may be quoted) naming the columns, and an
//!   optional units line right after it. A unit in brackets in a header cell
//!   (`Irradiance (W/m2/nm)`, `R [%]`) or on the units line becomes the
//!   column's [`ImportedColumn::unit_hint`]. Columns without a header are named
//!   `value 1`, `value 2`, ….
//! - Any wavelength step (1, 2, 5, 10 nm or irregular, non-integer), in
//!   increasing or decreasing order (decreasing tables are reversed).
//!
//! # Values
//! Values are kept as given (relative or absolute), except: a reflectance or
//! transmittance column whose header says `%` or whose maximum is above 1.5 is
//! divided by 100; small negative values (dark noise, no deeper than 1 % of the
//! column maximum) are set to 0. Both add a warning. Tables that cannot support
//! colorimetry (all zero, or not covering roughly 380–780 nm) are imported with
//! a warning; [`crate::spectrum::Curve::check_colorimetric`] refuses them later.
//!
//! # Errors
//! Every refusal is a [`ColorError::Import`] naming the source, the 1-based
//! line (0 for the whole file) and the problem in one line, e.g.
//! `lamp.csv: line 7: 'n/a' is not a number`. Input size, line length, row
//! and column counts are capped ([`MAX_FILE_BYTES`], [`MAX_LINE_BYTES`],
//! [`MAX_ROWS`], [`MAX_VALUE_COLUMNS`]) so that any input, including random
//! binary data, is refused quickly with bounded memory.
//!
//! # References
//! - CIE 15:2018, *Colorimetry*, 4th ed., §7.2 (spectral data for colorimetry
//!   should cover 380–780 nm at least; end values are repeated outside the data).
//! - RFC 4180 (2005), *Common Format and MIME Type for CSV Files* (quoting rules).
//! - The Unicode Standard, §23.8 (byte-order mark; UTF-16 encoding forms).

mod cells;
mod checks;
mod decode;
mod rows;

use crate::error::{ColorError, Result};
use crate::spectrum::{
    Coverage, Reflectance, RelativeSpd, Sensitivity, SpectralIrradiance, Transmittance,
};
use std::io::Read;
use std::path::Path;

pub use cells::MAX_ABS_VALUE;

/// Largest file accepted, in bytes (4 MiB): a 1 nm table of 64 columns over
/// 200–2500 nm is well under it.
pub const MAX_FILE_BYTES: usize = 4 * 1024 * 1024;
/// Longest line accepted, in bytes (64 KiB).
pub const MAX_LINE_BYTES: usize = 64 * 1024;
/// Most data rows accepted (the resampler's limit, [`crate::resample::MAX_SAMPLES`]).
pub const MAX_ROWS: usize = crate::resample::MAX_SAMPLES;
/// Most value columns accepted in one table.
pub const MAX_VALUE_COLUMNS: usize = 64;
/// Shortest plausible wavelength, nm (below it the data are not optical spectra
/// of lamps or surfaces, or are in another unit).
pub const MIN_WAVELENGTH_NM: f64 = 200.0;
/// Longest plausible wavelength, nm (the short-wave infrared end of common spectrometers).
pub const MAX_WAVELENGTH_NM: f64 = 2500.0;
/// Wavelengths all below this are taken to be micrometres and refused.
pub const MICROMETRE_LIMIT: f64 = 10.0;
/// Negative values no deeper than this fraction of the column maximum are dark noise (set to 0).
pub const DARK_NOISE_FRACTION: f64 = 0.01;
/// A reflectance or transmittance column with a maximum above this is read as percent.
/// Fluorescent samples can exceed 1, rarely 1.5 (common practice).
pub const PERCENT_MAX_THRESHOLD: f64 = 1.5;

/// What a table holds; decides the checks and the typed curves it can give.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, serde::Serialize, serde::Deserialize)]
pub enum SpectrumKind {
    /// Spectral power of a light source, relative or absolute (W·m⁻²·nm⁻¹).
    Lamp,
    /// Spectral reflectance factor of a surface (0–1, or percent).
    Reflectance,
    /// Spectral transmittance of a filter or gel (0–1, or percent).
    Transmittance,
    /// Camera spectral sensitivities: exactly three value columns, r, g, b.
    CameraSensitivity,
}

impl SpectrumKind {
    /// Every kind, in a fixed order.
    pub const ALL: [SpectrumKind; 4] = [
        SpectrumKind::Lamp,
        SpectrumKind::Reflectance,
        SpectrumKind::Transmittance,
        SpectrumKind::CameraSensitivity,
    ];

    /// Lower-case name for messages.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            SpectrumKind::Lamp => "lamp",
            SpectrumKind::Reflectance => "reflectance",
            SpectrumKind::Transmittance => "transmittance",
            SpectrumKind::CameraSensitivity => "camera sensitivity",
        }
    }

    /// Number of value columns a table of this kind must have, if fixed.
    #[must_use]
    pub fn required_value_columns(self) -> Option<usize> {
        match self {
            SpectrumKind::CameraSensitivity => Some(3),
            _ => None,
        }
    }
}

impl std::fmt::Display for SpectrumKind {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

/// One value column of an imported table.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ImportedColumn {
    /// Name from the header (unit part removed), or `value N` without a header.
    pub name: String,
    /// One value per wavelength of the table, in the order of
    /// [`ImportedTable::wavelengths_nm`]; percent already divided by 100 and
    /// dark noise set to 0 (see the table's warnings).
    pub values: Vec<f64>,
    /// Unit as written in the header or units line (`W/m2/nm`, `%`, `counts`), if any.
    pub unit_hint: Option<String>,
}

/// A spectral table as imported: strictly increasing wavelengths and named columns.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ImportedTable {
    /// File name or other label of the input, used in messages.
    pub source_name: String,
    /// What the table holds.
    pub kind: SpectrumKind,
    /// Wavelengths in nm, strictly increasing, within 200–2500 nm.
    pub wavelengths_nm: Vec<f64>,
    /// Value columns, each as long as `wavelengths_nm`.
    pub columns: Vec<ImportedColumn>,
    /// Things the user should know (reversed order, percent, dark noise,
    /// zero columns, short coverage), one line each.
    pub warnings: Vec<String>,
}

/// A refusal inside the importer, before the source name is attached.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Fail {
    line: usize,
    message: String,
}

impl Fail {
    fn at(line: usize, message: String) -> Fail {
        Fail { line, message }
    }

    fn file(message: impl Into<String>) -> Fail {
        Fail {
            line: 0,
            message: message.into(),
        }
    }

    fn into_error(self, source_name: &str) -> ColorError {
        import_error(source_name, self.line, self.message)
    }
}

fn import_error(source_name: &str, line: usize, message: String) -> ColorError {
    ColorError::Import {
        source_name: one_line(source_name),
        line,
        message,
    }
}

fn one_line(text: &str) -> String {
    text.chars()
        .map(|c| if c.is_control() { '?' } else { c })
        .collect()
}

/// Import a spectral table from bytes (the whole file).
///
/// `source_name` labels the input in messages (usually the file name). The
/// length is checked before anything else, so oversized input costs nothing.
pub fn import_bytes(source_name: &str, bytes: &[u8], kind: SpectrumKind) -> Result<ImportedTable> {
    let parse = || -> std::result::Result<ImportedTable, Fail> {
        let text = decode::decode(bytes)?;
        let raw = rows::read_rows(&text)?;
        let checked = checks::check(raw, kind)?;
        Ok(ImportedTable {
            source_name: one_line(source_name),
            kind,
            wavelengths_nm: checked.wavelengths_nm,
            columns: checked.columns,
            warnings: checked.warnings,
        })
    };
    parse().map_err(|fail| fail.into_error(source_name))
}

/// Import a spectral table from a file. Reads at most [`MAX_FILE_BYTES`] + 1
/// bytes, so a huge or endless file is refused without reading it. Messages
/// name the file by its file name.
pub fn import_path(path: &Path, kind: SpectrumKind) -> Result<ImportedTable> {
    let source_name = path.file_name().map_or_else(
        || path.display().to_string(),
        |n| n.to_string_lossy().into_owned(),
    );
    let io_error =
        |e: std::io::Error| import_error(&source_name, 0, format!("cannot read the file: {e}"));
    let file = std::fs::File::open(path).map_err(io_error)?;
    let too_large = || {
        import_error(
            &source_name,
            0,
            format!(
                "file is more than {MAX_FILE_BYTES} bytes, the {} MiB limit for spectral tables",
                MAX_FILE_BYTES / (1024 * 1024)
            ),
        )
    };
    if file
        .metadata()
        .is_ok_and(|m| m.len() > MAX_FILE_BYTES as u64)
    {
        return Err(too_large());
    }
    let mut bytes = Vec::new();
    file.take(MAX_FILE_BYTES as u64 + 1)
        .read_to_end(&mut bytes)
        .map_err(io_error)?;
    if bytes.len() > MAX_FILE_BYTES {
        return Err(too_large());
    }
    import_bytes(&source_name, &bytes, kind)
}

impl ImportedTable {
    /// The measured wavelength range, nm (`None` only for a table with no rows,
    /// which the importer never returns).
    #[must_use]
    pub fn coverage(&self) -> Option<Coverage> {
        Some(Coverage {
            start_nm: *self.wavelengths_nm.first()?,
            end_nm: *self.wavelengths_nm.last()?,
        })
    }

    /// Index of the column with this name, if any.
    #[must_use]
    pub fn column_index(&self, name: &str) -> Option<usize> {
        self.columns.iter().position(|c| c.name == name)
    }

    /// Column `index` of a lamp table as a relative spectral power
    /// distribution on the internal grid (resampled; see [`crate::resample::to_grid`]).
    pub fn to_relative_spd(&self, index: usize) -> Result<RelativeSpd> {
        let values = self.values_of(index, SpectrumKind::Lamp)?;
        RelativeSpd::from_samples(&self.wavelengths_nm, values)
            .map_err(|e| self.resample_error(index, &e))
    }

    /// Column `index` of a lamp table measured in W·m⁻²·nm⁻¹, as spectral irradiance.
    pub fn to_spectral_irradiance(&self, index: usize) -> Result<SpectralIrradiance> {
        let values = self.values_of(index, SpectrumKind::Lamp)?;
        SpectralIrradiance::from_samples(&self.wavelengths_nm, values)
            .map_err(|e| self.resample_error(index, &e))
    }

    /// Column `index` of a reflectance table as a reflectance on the internal grid.
    pub fn to_reflectance(&self, index: usize) -> Result<Reflectance> {
        let values = self.values_of(index, SpectrumKind::Reflectance)?;
        Reflectance::from_samples(&self.wavelengths_nm, values)
            .map_err(|e| self.resample_error(index, &e))
    }

    /// Column `index` of a transmittance table as a transmittance on the internal grid.
    pub fn to_transmittance(&self, index: usize) -> Result<Transmittance> {
        let values = self.values_of(index, SpectrumKind::Transmittance)?;
        Transmittance::from_samples(&self.wavelengths_nm, values)
            .map_err(|e| self.resample_error(index, &e))
    }

    /// Column `index` (0 = r, 1 = g, 2 = b) of a camera table as a channel sensitivity.
    pub fn to_sensitivity(&self, index: usize) -> Result<Sensitivity> {
        let values = self.values_of(index, SpectrumKind::CameraSensitivity)?;
        Sensitivity::from_samples(&self.wavelengths_nm, values)
            .map_err(|e| self.resample_error(index, &e))
    }

    fn values_of(&self, index: usize, wanted: SpectrumKind) -> Result<&[f64]> {
        if self.kind != wanted {
            return Err(ColorError::InvalidInput(format!(
                "{} holds {} data, not {} data",
                self.source_name, self.kind, wanted
            )));
        }
        self.columns
            .get(index)
            .map(|c| c.values.as_slice())
            .ok_or_else(|| {
                ColorError::InvalidInput(format!(
                    "{} has {} value columns; there is no column {}",
                    self.source_name,
                    self.columns.len(),
                    index + 1
                ))
            })
    }

    fn resample_error(&self, index: usize, e: &ColorError) -> ColorError {
        let name = self.columns.get(index).map_or("?", |c| c.name.as_str());
        import_error(&self.source_name, 0, format!("column '{name}': {e}"))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn imports_and_builds_typed_curves() {
        let text = "# invented test data\nnm,Key (W/m2/nm),Fill\n380,1,2\n580,2,3\n780,3,4\n";
        let t = import_bytes("lamp.csv", text.as_bytes(), SpectrumKind::Lamp).unwrap();
        assert_eq!(t.columns[0].name, "Key");
        assert_eq!(t.columns[0].unit_hint.as_deref(), Some("W/m2/nm"));
        assert_eq!(t.column_index("Fill"), Some(1));
        assert_eq!(
            t.coverage(),
            Some(Coverage {
                start_nm: 380.0,
                end_nm: 780.0
            })
        );
        let spd = t.to_relative_spd(1).unwrap();
        assert!((spd.at_nm(580.0) - 3.0).abs() < 1e-12);
        assert!(spd.check_colorimetric("lamp").is_ok());
        assert!(t.to_reflectance(0).is_err());
        assert!(t.to_relative_spd(2).is_err());
    }

    #[test]
    fn errors_name_source_and_line() {
        let err = import_bytes(
            "lamp.csv",
            b"nm,a\n400,1\n410,2\n420,n/a\n",
            SpectrumKind::Lamp,
        )
        .unwrap_err();
        assert_eq!(err.to_string(), "lamp.csv: line 4: 'n/a' is not a number");
        let err = import_bytes("lamp.csv", b"", SpectrumKind::Lamp).unwrap_err();
        assert_eq!(err.to_string(), "lamp.csv: file is empty");
        let err = import_bytes("a\nb.csv", b"", SpectrumKind::Lamp).unwrap_err();
        assert!(!err.to_string().contains('\n'));
    }

    #[test]
    fn refuses_oversized_bytes_before_reading() {
        let big = vec![b'1'; MAX_FILE_BYTES + 1];
        let err = import_bytes("big.csv", &big, SpectrumKind::Lamp).unwrap_err();
        assert!(err.to_string().contains("MiB limit"), "{err}");
    }
}
