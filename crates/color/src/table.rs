//! Reader for the data tables embedded from `assets/` (standard and demo data).
//!
//! Format: UTF-8 CSV; lines starting with `#` name the source and are kept;
//! the first other line is the header (`wavelength_nm,<name>,<name>…`); then one
//! row per wavelength. Blank cells are not allowed. These files are written by
//! the project's scripts, so errors here are programming errors, but they are
//! still reported as errors, never panics.

use crate::error::{ColorError, Result};

/// A parsed asset table: source lines, column names and numeric columns.
#[derive(Debug, Clone, PartialEq)]
pub struct AssetTable {
    /// The `#` lines, without the `#`, in order: where the data come from.
    pub source: Vec<String>,
    /// Names of the value columns (the header without its first cell).
    pub names: Vec<String>,
    /// First column: wavelengths in nm.
    pub wavelengths_nm: Vec<f64>,
    /// One vector per value column, same length as `wavelengths_nm`.
    pub columns: Vec<Vec<f64>>,
}

impl AssetTable {
    /// Parse the text of an asset file; `name` is used in error messages.
    pub fn parse(name: &str, text: &str) -> Result<AssetTable> {
        let err = |line: usize, message: String| ColorError::Import {
            source_name: name.to_string(),
            line,
            message,
        };
        let mut source = Vec::new();
        let mut names: Option<Vec<String>> = None;
        let mut wavelengths_nm = Vec::new();
        let mut columns: Vec<Vec<f64>> = Vec::new();
        for (i, raw) in text.lines().enumerate() {
            let line_no = i + 1;
            let line = raw.trim();
            if line.is_empty() {
                continue;
            }
            if let Some(comment) = line.strip_prefix('#') {
                source.push(comment.trim().to_string());
                continue;
            }
            let cells: Vec<&str> = line.split(',').map(str::trim).collect();
            match &names {
                None => {
                    if cells.len() < 2 {
                        return Err(err(
                            line_no,
                            "header needs a wavelength column and at least one value column".into(),
                        ));
                    }
                    names = Some(cells[1..].iter().map(|s| (*s).to_string()).collect());
                    columns = vec![Vec::new(); cells.len() - 1];
                }
                Some(n) => {
                    if cells.len() != n.len() + 1 {
                        return Err(err(
                            line_no,
                            format!("expected {} cells, found {}", n.len() + 1, cells.len()),
                        ));
                    }
                    let parse = |s: &str| -> Result<f64> {
                        s.parse::<f64>()
                            .ok()
                            .filter(|v| v.is_finite())
                            .ok_or_else(|| err(line_no, format!("'{s}' is not a finite number")))
                    };
                    wavelengths_nm.push(parse(cells[0])?);
                    for (col, cell) in columns.iter_mut().zip(&cells[1..]) {
                        col.push(parse(cell)?);
                    }
                }
            }
        }
        let names = names.ok_or_else(|| err(0, "no header line".into()))?;
        if wavelengths_nm.is_empty() {
            return Err(err(0, "no data rows".into()));
        }
        Ok(AssetTable {
            source,
            names,
            wavelengths_nm,
            columns,
        })
    }

    /// The column with this name.
    pub fn column(&self, name: &str) -> Result<&[f64]> {
        self.names
            .iter()
            .position(|n| n == name)
            .map(|i| self.columns[i].as_slice())
            .ok_or_else(|| ColorError::InvalidInput(format!("no column '{name}' in table")))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_source_header_and_rows() {
        let t = AssetTable::parse(
            "t.csv",
            "# From a standard\nwavelength_nm,a,b\n380,1,2\n385,3,4\n",
        )
        .unwrap();
        assert_eq!(t.source, vec!["From a standard"]);
        assert_eq!(t.names, vec!["a", "b"]);
        assert_eq!(t.column("b").unwrap(), &[2.0, 4.0]);
        assert!(t.column("c").is_err());
    }

    #[test]
    fn reports_line_of_bad_cell() {
        let e = AssetTable::parse("t.csv", "w,a\n380,1\n385,x\n")
            .unwrap_err()
            .to_string();
        assert!(e.contains("t.csv: line 3"), "{e}");
        assert!(AssetTable::parse("t.csv", "w,a\n380,1,2\n").is_err());
        assert!(AssetTable::parse("t.csv", "w,a\n").is_err());
    }
}
