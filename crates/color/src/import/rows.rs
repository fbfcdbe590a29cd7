//! From lines to a raw numeric table: header and optional units line, one
//! separator for the whole file, equal cell counts, every cell a finite number.

use super::cells::{
    Cell, NumberReader, Separator, detect_separator, excerpt, is_plain_integer, looks_numeric,
    split,
};
use super::decode::Lines;
use super::{Fail, MAX_ROWS, MAX_VALUE_COLUMNS};

/// The numbers of a table before any spectral checks, in file order.
#[derive(Debug, Clone, PartialEq)]
pub(super) struct RawTable {
    /// Line of the header, if there is one.
    pub(super) header_line: Option<usize>,
    /// Header text of each value column (empty when there is no header).
    pub(super) names: Vec<String>,
    /// Text of each value column on the units line (empty when there is none).
    pub(super) units: Vec<String>,
    /// First column.
    pub(super) wavelengths: Vec<f64>,
    /// One vector per value column.
    pub(super) columns: Vec<Vec<f64>>,
    /// Source line of each row.
    pub(super) line_numbers: Vec<usize>,
}

struct Header {
    line: usize,
    separator: Separator,
    cells: Vec<String>,
}

/// The shape fixed by the first data row (or the header).
struct Layout {
    separator: Separator,
    separator_line: usize,
    cells: usize,
    numbers: NumberReader,
}

/// Evidence that a comma-separated file was written with decimal commas:
/// every cell a bare integer and a value cell with a leading zero ("0,05" → "0", "05").
struct CommaAmbiguity {
    all_integers: bool,
    leading_zero: Option<(usize, String)>,
}

pub(super) fn read_rows(text: &str) -> Result<RawTable, Fail> {
    let mut header: Option<Header> = None;
    let mut units: Option<Vec<String>> = None;
    let mut layout: Option<Layout> = None;
    let mut ambiguity = CommaAmbiguity {
        all_integers: true,
        leading_zero: None,
    };
    let mut table = RawTable {
        header_line: None,
        names: Vec::new(),
        units: Vec::new(),
        wavelengths: Vec::new(),
        columns: Vec::new(),
        line_numbers: Vec::new(),
    };
    for item in Lines::new(text) {
        let (line_no, line) = item?;
        let trimmed = line.trim_matches(' ');
        if trimmed.trim().is_empty() || trimmed.starts_with('#') {
            continue;
        }
        let at = |message: String| Fail::at(line_no, message);
        let separator = detect_separator(trimmed).map_err(at)?;
        let cells = split(trimmed, separator).map_err(at)?;
        if cells.is_empty() {
            // A spreadsheet row of empty cells.
            continue;
        }
        if table.wavelengths.is_empty() && !looks_numeric(&cells[0].text) {
            if header.is_none() {
                check_column_count(line_no, cells.len())?;
                header = Some(Header {
                    line: line_no,
                    separator,
                    cells: cells.iter().map(|c| c.text.to_string()).collect(),
                });
                continue;
            }
            if units.is_none() && cells.iter().all(|c| !looks_numeric(&c.text)) {
                units = Some(cells.iter().map(|c| c.text.to_string()).collect());
                continue;
            }
        }
        if layout.is_none() {
            layout = Some(first_layout(
                line_no,
                separator,
                cells.len(),
                header.as_ref(),
            )?);
            table.columns = vec![Vec::new(); layout.as_ref().map_or(0, |l| l.cells - 1)];
        }
        let Some(layout) = layout.as_mut() else {
            continue;
        };
        read_row(
            line_no,
            separator,
            &cells,
            layout,
            header.as_ref(),
            &mut table,
        )?;
        if layout.separator == Separator::Comma {
            ambiguity.observe(line_no, &cells);
        }
    }
    if table.wavelengths.is_empty() {
        return Err(match header {
            Some(_) => Fail::file("file has a header but no data rows"),
            None => Fail::file("file is empty (no data rows)"),
        });
    }
    if let (true, Some((line, cell))) = (ambiguity.all_integers, ambiguity.leading_zero) {
        return Err(Fail::at(
            line,
            format!(
                "{} after a comma looks like the decimal part of a number written with a decimal comma \
                 in a comma-separated file, which is ambiguous; save with semicolon or tab separators",
                excerpt(&cell)
            ),
        ));
    }
    if let Some(h) = header {
        table.header_line = Some(h.line);
        table.names = h.cells.into_iter().skip(1).collect();
    }
    table.units = units
        .map(|u| u.into_iter().skip(1).collect())
        .unwrap_or_default();
    Ok(table)
}

fn check_column_count(line: usize, cells: usize) -> Result<(), Fail> {
    if cells > MAX_VALUE_COLUMNS + 1 {
        return Err(Fail::at(
            line,
            format!(
                "{} value columns is more than the limit of {MAX_VALUE_COLUMNS} columns",
                cells - 1
            ),
        ));
    }
    Ok(())
}

fn first_layout(
    line: usize,
    separator: Separator,
    cells: usize,
    header: Option<&Header>,
) -> Result<Layout, Fail> {
    let expected = header.map_or(cells, |h| h.cells.len());
    check_column_count(line, expected)?;
    if expected < 2 {
        return Err(Fail::at(
            line,
            "only one column: a table needs a wavelength column and at least one value column"
                .into(),
        ));
    }
    let separator = match (header, separator) {
        // A short first row: the count check names it; take the header's separator.
        (Some(h), Separator::None) => h.separator,
        (Some(h), sep) if h.separator != Separator::None && h.separator != sep => {
            return Err(Fail::at(
                line,
                format!(
                    "data rows use {} but the header on line {} uses {}: inconsistent separators",
                    sep.describe(),
                    h.line,
                    h.separator.describe()
                ),
            ));
        }
        (_, sep) => sep,
    };
    Ok(Layout {
        separator,
        separator_line: line,
        cells: expected,
        numbers: NumberReader::new(separator),
    })
}

fn read_row(
    line: usize,
    separator: Separator,
    cells: &[Cell<'_>],
    layout: &mut Layout,
    header: Option<&Header>,
    table: &mut RawTable,
) -> Result<(), Fail> {
    let at = |message: String| Fail::at(line, message);
    if separator != Separator::None && separator != layout.separator {
        return Err(at(format!(
            "this row uses {} but line {} uses {}: inconsistent separators",
            separator.describe(),
            layout.separator_line,
            layout.separator.describe()
        )));
    }
    if cells.len() != layout.cells {
        let expected = match header {
            Some(h) => format!(
                "the header on line {} names {} columns",
                h.line, layout.cells
            ),
            None => format!("line {} has {}", layout.separator_line, layout.cells),
        };
        let count = cells.len();
        let noun = if count == 1 { "cell" } else { "cells" };
        let mut message = format!("row has {count} {noun} but {expected}");
        if cells.len() < layout.cells {
            message.push_str(": missing values");
        } else if layout.separator == Separator::Comma {
            message.push_str(
                " (a decimal comma in a comma-separated file is ambiguous; save with semicolon or tab separators)",
            );
        }
        return Err(at(message));
    }
    if table.wavelengths.len() >= MAX_ROWS {
        return Err(at(format!(
            "more than {MAX_ROWS} data rows, the limit for one table"
        )));
    }
    for (index, cell) in cells.iter().enumerate() {
        if cell.text.is_empty() {
            return Err(at(format!("cell {} is empty: missing value", index + 1)));
        }
        let value = layout.numbers.parse(cell).map_err(at)?;
        if index == 0 {
            table.wavelengths.push(value);
        } else {
            table.columns[index - 1].push(value);
        }
    }
    table.line_numbers.push(line);
    Ok(())
}

impl CommaAmbiguity {
    fn observe(&mut self, line: usize, cells: &[Cell<'_>]) {
        if !self.all_integers {
            return;
        }
        if !cells.iter().all(|c| is_plain_integer(&c.text)) {
            self.all_integers = false;
            return;
        }
        if self.leading_zero.is_none() {
            let zero_led = cells.iter().skip(1).find(|c| {
                let digits = c.text.trim_start_matches(['+', '-']);
                digits.len() >= 2 && digits.starts_with('0')
            });
            if let Some(cell) = zero_led {
                self.leading_zero = Some((line, cell.text.to_string()));
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_header_units_and_rows() {
        let t =
            read_rows("# c\n\"nm\",\"Lamp (W/m2/nm)\"\n,W/m2/nm\n\n400,1.5\n401,2\n,,\n").unwrap();
        assert_eq!(t.header_line, Some(2));
        assert_eq!(t.names, vec!["Lamp (W/m2/nm)"]);
        assert_eq!(t.units, vec!["W/m2/nm"]);
        assert_eq!(t.wavelengths, vec![400.0, 401.0]);
        assert_eq!(t.columns, vec![vec![1.5, 2.0]]);
        assert_eq!(t.line_numbers, vec![5, 6]);
    }

    #[test]
    fn reads_headerless_decimal_comma() {
        let t = read_rows("400;0,5;1\r\n401;0,25;2\r\n").unwrap();
        assert_eq!(t.header_line, None);
        assert_eq!(t.columns, vec![vec![0.5, 0.25], vec![1.0, 2.0]]);
    }

    fn fail(text: &str) -> Fail {
        read_rows(text).unwrap_err()
    }

    #[test]
    fn refuses_shape_errors_at_their_line() {
        let f = fail("nm,a\n400,1\n401\n");
        assert_eq!((f.line, f.message.contains("missing")), (3, true));
        let f = fail("400,1\n401;2\n");
        assert_eq!(
            (f.line, f.message.contains("inconsistent separators")),
            (2, true)
        );
        let f = fail("nm;a\n400,1\n");
        assert_eq!((f.line, f.message.contains("header on line 1")), (2, true));
        let f = fail("400,1,,2\n");
        assert_eq!((f.line, f.message.contains("missing value")), (1, true));
        let f = fail("nm,a\n400,0,5\n");
        assert_eq!((f.line, f.message.contains("ambiguous")), (2, true));
        let f = fail("400,0,05\n401,0,10\n");
        assert_eq!((f.line, f.message.contains("ambiguous")), (1, true));
        assert_eq!(fail("nm,a\n").message, "file has a header but no data rows");
        assert_eq!(fail("# only\n\n").line, 0);
        assert!(fail("400\n401\n").message.contains("only one column"));
    }

    #[test]
    fn integer_counts_are_not_mistaken_for_decimal_commas() {
        let t = read_rows("400,100,2000\n401,150,2100\n").unwrap();
        assert_eq!(t.columns.len(), 2);
    }
}
