//! One line of a table: separator detection, quote-aware splitting into cells,
//! and number parsing with decimal point or decimal comma.

use std::borrow::Cow;

/// Largest magnitude accepted for a number in a table. Spectra in any unit
/// (counts, W·m⁻²·nm⁻¹, µW·cm⁻²·nm⁻¹) are far below it; larger numbers are
/// typing or export errors and would overflow later products.
pub const MAX_ABS_VALUE: f64 = 1e15;

/// The character that separates cells on a line.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) enum Separator {
    Tab,
    Semicolon,
    Comma,
    /// Runs of spaces (instrument text exports).
    Spaces,
    /// A line with a single cell.
    None,
}

impl Separator {
    pub(super) fn describe(self) -> &'static str {
        match self {
            Separator::Tab => "tabs",
            Separator::Semicolon => "semicolons",
            Separator::Comma => "commas",
            Separator::Spaces => "spaces",
            Separator::None => "no separator",
        }
    }

    fn char(self) -> Option<char> {
        match self {
            Separator::Tab => Some('\t'),
            Separator::Semicolon => Some(';'),
            Separator::Comma => Some(','),
            Separator::Spaces | Separator::None => None,
        }
    }
}

/// Which separator a (trimmed, non-empty) line uses, looking outside quotes.
/// Tab wins over semicolon, semicolon over comma (so that decimal commas can
/// sit inside tab- or semicolon-separated cells), comma over spaces.
pub(super) fn detect_separator(line: &str) -> Result<Separator, String> {
    let (mut tab, mut semicolon, mut comma, mut space) = (false, false, false, false);
    let mut in_quotes = false;
    for c in line.chars() {
        match c {
            '"' => in_quotes = !in_quotes,
            _ if in_quotes => {}
            '\t' => tab = true,
            ';' => semicolon = true,
            ',' => comma = true,
            ' ' => space = true,
            _ => {}
        }
    }
    if tab && semicolon {
        return Err("line mixes tab and semicolon separators".into());
    }
    Ok(if tab {
        Separator::Tab
    } else if semicolon {
        Separator::Semicolon
    } else if comma {
        Separator::Comma
    } else if space {
        Separator::Spaces
    } else {
        Separator::None
    })
}

/// One cell: its text, outer spaces and quotes removed.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(super) struct Cell<'a> {
    pub(super) text: Cow<'a, str>,
}

/// Split a trimmed line into cells. Double quotes group text (a doubled quote
/// inside stands for one quote). Trailing empty cells (spreadsheets write
/// trailing separators) are dropped.
pub(super) fn split(line: &str, sep: Separator) -> Result<Vec<Cell<'_>>, String> {
    if line.bytes().filter(|b| *b == b'"').count() % 2 == 1 {
        return Err("a quote is opened but never closed".into());
    }
    let mut raw_cells = Vec::new();
    match sep.char() {
        Some(sep_char) => {
            let mut in_quotes = false;
            let mut start = 0;
            for (i, c) in line.char_indices() {
                if c == '"' {
                    in_quotes = !in_quotes;
                } else if c == sep_char && !in_quotes {
                    raw_cells.push(&line[start..i]);
                    start = i + c.len_utf8();
                }
            }
            if in_quotes {
                return Err("a quote is opened but never closed".into());
            }
            raw_cells.push(&line[start..]);
        }
        None => {
            if line.contains('"') && sep == Separator::Spaces {
                split_spaces_quoted(line, &mut raw_cells)?;
            } else if sep == Separator::Spaces {
                raw_cells.extend(line.split(' ').filter(|s| !s.is_empty()));
            } else {
                raw_cells.push(line);
            }
        }
    }
    let mut cells = raw_cells
        .into_iter()
        .map(unquote)
        .collect::<Result<Vec<_>, _>>()?;
    while cells.last().is_some_and(|c| c.text.is_empty()) {
        cells.pop();
    }
    Ok(cells)
}

fn split_spaces_quoted<'a>(line: &'a str, out: &mut Vec<&'a str>) -> Result<(), String> {
    let mut in_quotes = false;
    let mut start: Option<usize> = None;
    for (i, c) in line.char_indices() {
        if c == '"' {
            in_quotes = !in_quotes;
            start.get_or_insert(i);
        } else if c == ' ' && !in_quotes {
            if let Some(s) = start.take() {
                out.push(&line[s..i]);
            }
        } else {
            start.get_or_insert(i);
        }
    }
    if in_quotes {
        return Err("a quote is opened but never closed".into());
    }
    if let Some(s) = start {
        out.push(&line[s..]);
    }
    Ok(())
}

fn unquote(raw: &str) -> Result<Cell<'_>, String> {
    let text = raw.trim_matches(|c| c == ' ' || c == '\t');
    let Some(inner) = text.strip_prefix('"') else {
        return Ok(Cell {
            text: Cow::Borrowed(text),
        });
    };
    let Some(inner) = inner.strip_suffix('"') else {
        return Err(format!(
            "{} has text after its closing quote",
            excerpt(text)
        ));
    };
    if inner.replace("\"\"", "").contains('"') {
        return Err(format!("{} has a stray quote inside", excerpt(text)));
    }
    let unescaped = inner.replace("\"\"", "\"");
    Ok(Cell {
        text: Cow::Owned(unescaped.trim().to_string()),
    })
}

/// The decimal mark a file uses, fixed by the first number that has one.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) enum DecimalMark {
    Point,
    Comma,
}

/// Parses numbers of one file, keeping its decimal mark consistent.
#[derive(Debug)]
pub(super) struct NumberReader {
    separator: Separator,
    mark: Option<DecimalMark>,
}

impl NumberReader {
    pub(super) fn new(separator: Separator) -> Self {
        NumberReader {
            separator,
            mark: None,
        }
    }

    /// Parse one non-empty cell to a finite number.
    pub(super) fn parse(&mut self, cell: &Cell<'_>) -> Result<f64, String> {
        let text: &str = &cell.text;
        let has_point = text.contains('.');
        let has_comma = text.contains(',');
        if has_comma && self.separator == Separator::Comma {
            return Err(format!(
                "{} has a decimal comma in a comma-separated file, which is ambiguous; \
                 save the table with semicolon or tab separators",
                excerpt(text)
            ));
        }
        if has_point && has_comma {
            return Err(format!(
                "{} mixes decimal point and comma (thousands separators are not supported)",
                excerpt(text)
            ));
        }
        let mark = if has_comma {
            Some(DecimalMark::Comma)
        } else if has_point {
            Some(DecimalMark::Point)
        } else {
            None
        };
        let value = if has_comma {
            parse_plain(&text.replace(',', "."), text)?
        } else {
            parse_plain(text, text)?
        };
        if let Some(mark) = mark {
            match self.mark {
                None => self.mark = Some(mark),
                Some(seen) if seen != mark => {
                    let (this, earlier) = match mark {
                        DecimalMark::Point => ("a decimal point", "a decimal comma"),
                        DecimalMark::Comma => ("a decimal comma", "a decimal point"),
                    };
                    return Err(format!(
                        "{} uses {this} but earlier numbers use {earlier}",
                        excerpt(text)
                    ));
                }
                Some(_) => {}
            }
        }
        Ok(value)
    }
}

/// Whether a cell reads as a number at all (decimal comma allowed, non-finite
/// spellings included). Used to tell header lines from data lines.
pub(super) fn looks_numeric(text: &str) -> bool {
    text.replace(',', ".").parse::<f64>().is_ok()
}

/// Whether a cell is a plain integer (optional sign, digits only).
pub(super) fn is_plain_integer(text: &str) -> bool {
    let digits = text.strip_prefix(['+', '-']).unwrap_or(text);
    !digits.is_empty() && digits.bytes().all(|b| b.is_ascii_digit())
}

fn parse_plain(normalized: &str, original: &str) -> Result<f64, String> {
    match normalized.parse::<f64>() {
        Ok(v) if !v.is_finite() => Err(format!("{} is not a finite number", excerpt(original))),
        Ok(v) if v.abs() > MAX_ABS_VALUE => Err(format!(
            "{} is implausibly large for a spectral table (limit {MAX_ABS_VALUE:e})",
            excerpt(original)
        )),
        Ok(v) => Ok(v),
        Err(_) => {
            // A number followed by text ("0.5 %", "450nm") is a unit in a cell.
            let prefix_end = normalized
                .find(|c: char| !(c.is_ascii_digit() || matches!(c, '+' | '-' | '.' | 'e' | 'E')))
                .unwrap_or(normalized.len());
            let prefix = normalized[..prefix_end].trim_end_matches(['e', 'E']);
            let numeric_prefix = prefix_end < normalized.len() && prefix.parse::<f64>().is_ok();
            if numeric_prefix {
                Err(format!(
                    "{} is not a number (units or text belong in the header, not in the cells)",
                    excerpt(original)
                ))
            } else {
                Err(format!("{} is not a number", excerpt(original)))
            }
        }
    }
}

/// A short, quoted, one-line excerpt of user text for error messages.
pub(super) fn excerpt(text: &str) -> String {
    const MAX_CHARS: usize = 40;
    let mut out: String = text
        .chars()
        .take(MAX_CHARS)
        .map(|c| if c.is_control() { '?' } else { c })
        .collect();
    if text.chars().nth(MAX_CHARS).is_some() {
        out.push('…');
    }
    format!("'{out}'")
}

#[cfg(test)]
mod tests {
    use super::*;

    fn texts(line: &str, sep: Separator) -> Vec<String> {
        split(line, sep)
            .unwrap()
            .into_iter()
            .map(|c| c.text.into_owned())
            .collect()
    }

    #[test]
    fn detects_separators_outside_quotes() {
        assert_eq!(detect_separator("400\t0,5").unwrap(), Separator::Tab);
        assert_eq!(detect_separator("400;0,5").unwrap(), Separator::Semicolon);
        assert_eq!(detect_separator("400, 0.5").unwrap(), Separator::Comma);
        assert_eq!(detect_separator("400   0.5").unwrap(), Separator::Spaces);
        assert_eq!(detect_separator("\"a;b\",c").unwrap(), Separator::Comma);
        assert_eq!(detect_separator("400").unwrap(), Separator::None);
        assert!(detect_separator("400;1\t2").is_err());
    }

    #[test]
    fn splits_quotes_and_drops_trailing_empties() {
        assert_eq!(
            texts(
                r#""Wavelength (nm)", "Lamp ""A"", warm",,"#,
                Separator::Comma
            ),
            vec!["Wavelength (nm)", "Lamp \"A\", warm"]
        );
        assert_eq!(texts("400,,1", Separator::Comma), vec!["400", "", "1"]);
        assert_eq!(
            texts("400   0.5 1", Separator::Spaces),
            vec!["400", "0.5", "1"]
        );
        assert_eq!(
            texts(r#"nm "Lamp A" B"#, Separator::Spaces),
            vec!["nm", "Lamp A", "B"]
        );
        assert!(split("\"a,b", Separator::Comma).is_err());
        assert!(split("\"a\"b,c", Separator::Comma).is_err());
    }

    fn cell(text: &str) -> Cell<'_> {
        Cell {
            text: Cow::Borrowed(text),
        }
    }

    #[test]
    fn parses_numbers_with_consistent_decimal_mark() {
        let mut semi = NumberReader::new(Separator::Semicolon);
        assert!((semi.parse(&cell("0,25")).unwrap() - 0.25).abs() < 1e-15);
        assert!((semi.parse(&cell("1,5E-03")).unwrap() - 0.0015).abs() < 1e-15);
        assert!(
            semi.parse(&cell("0.5"))
                .unwrap_err()
                .contains("decimal point")
        );
        let mut comma = NumberReader::new(Separator::Comma);
        assert!(comma.parse(&cell("0,5")).unwrap_err().contains("ambiguous"));
        assert!((comma.parse(&cell("-2.5e1")).unwrap() + 25.0).abs() < 1e-15);
        assert!(comma.parse(&cell("1.234,5")).is_err());
    }

    #[test]
    fn refuses_non_finite_text_and_units() {
        let mut r = NumberReader::new(Separator::Comma);
        for bad in ["nan", "NaN", "inf", "-Infinity", "+inf"] {
            assert!(r.parse(&cell(bad)).unwrap_err().contains("finite"), "{bad}");
        }
        assert_eq!(r.parse(&cell("n/a")).unwrap_err(), "'n/a' is not a number");
        assert!(r.parse(&cell("0.5 %")).unwrap_err().contains("units"));
        assert!(
            r.parse(&cell("1e300"))
                .unwrap_err()
                .contains("implausibly large")
        );
        assert!(r.parse(&cell("0x10")).is_err());
    }

    #[test]
    fn excerpts_are_short_and_single_line() {
        assert_eq!(excerpt("a\u{7}b"), "'a?b'");
        assert_eq!(excerpt(&"x".repeat(100)).chars().count(), 43);
    }
}
