//! Property tests of the spectral importer: no input makes it panic or return
//! a malformed table, and any valid table written in any accepted dialect
//! (separator, decimal mark, header, line end, encoding, order) reads back exactly.

use lampwright_color::ColorError;
use lampwright_color::import::{ImportedTable, SpectrumKind, import_bytes};
use proptest::prelude::*;

/// What every successful import guarantees.
fn assert_well_formed(table: &ImportedTable) {
    let n = table.wavelengths_nm.len();
    assert!(n >= 2);
    assert!(table.wavelengths_nm.windows(2).all(|w| w[0] < w[1]));
    assert!(
        table
            .wavelengths_nm
            .iter()
            .all(|wl| (200.0..=2500.0).contains(wl))
    );
    assert!(!table.columns.is_empty());
    for column in &table.columns {
        assert_eq!(column.values.len(), n);
        assert!(column.values.iter().all(|v| v.is_finite() && *v >= 0.0));
    }
    if table.kind == SpectrumKind::CameraSensitivity {
        assert_eq!(table.columns.len(), 3);
    }
    assert!(table.warnings.iter().all(|w| !w.contains('\n')));
}

fn assert_one_line_error(source: &str, err: &ColorError) {
    let text = err.to_string();
    let ColorError::Import { line, .. } = err else {
        panic!("not an import error: {text}");
    };
    // A line of the input is named; a whole-file problem (line 0) names none.
    let prefix = if *line == 0 {
        format!("{source}: ")
    } else {
        format!("{source}: line {line}: ")
    };
    assert!(text.starts_with(&prefix), "{text}");
    assert!(!text.starts_with(&format!("{source}: line 0")), "{text}");
    assert!(!text.contains('\n') && !text.contains('\r'), "{text}");
}

fn check_any(bytes: &[u8]) {
    for kind in SpectrumKind::ALL {
        match import_bytes("fuzz.csv", bytes, kind) {
            Ok(table) => assert_well_formed(&table),
            Err(e) => assert_one_line_error("fuzz.csv", &e),
        }
    }
}

#[derive(Debug, Clone)]
struct Dialect {
    separator: &'static str,
    decimal_comma: bool,
    header: Option<(bool, Vec<String>)>,
    crlf: bool,
    encoding: u8,
    reversed: bool,
    comment_every: Option<usize>,
}

#[derive(Debug, Clone)]
struct Table {
    wavelengths_nm: Vec<f64>,
    columns: Vec<Vec<f64>>,
}

fn table_strategy() -> impl Strategy<Value = Table> {
    (2_usize..60, 1_usize..5, 300.0_f64..500.0).prop_flat_map(|(rows, cols, start)| {
        (
            prop::collection::vec(0.05_f64..25.0, rows - 1),
            prop::collection::vec(prop::collection::vec(0.0_f64..1e6, rows), cols),
        )
            .prop_map(move |(steps, columns)| {
                let mut wavelengths_nm = vec![start];
                for step in steps {
                    let next = wavelengths_nm[wavelengths_nm.len() - 1] + step;
                    wavelengths_nm.push(next);
                }
                Table {
                    wavelengths_nm,
                    columns,
                }
            })
    })
}

fn dialect_strategy(cols: usize) -> impl Strategy<Value = Dialect> {
    (
        prop::sample::select(vec![",", ", ", ";", "\t", "   "]),
        any::<bool>(),
        prop::option::of((
            any::<bool>(),
            prop::collection::vec("[A-Za-z][A-Za-z0-9_]{0,10}", cols),
        )),
        any::<bool>(),
        0_u8..4,
        any::<bool>(),
        prop::option::of(1_usize..10),
    )
        .prop_map(
            |(separator, comma, header, crlf, encoding, reversed, comment_every)| Dialect {
                separator,
                // A decimal comma is only unambiguous with semicolons or tabs.
                decimal_comma: comma && (separator == ";" || separator == "\t"),
                header,
                crlf,
                encoding,
                reversed,
                comment_every,
            },
        )
}

fn write(table: &Table, d: &Dialect) -> Vec<u8> {
    let number = |v: f64| {
        let s = format!("{v}");
        if d.decimal_comma {
            s.replace('.', ",")
        } else {
            s
        }
    };
    let mut lines = vec!["# generated table".to_string()];
    if let Some((quoted, names)) = &d.header {
        let q = |s: &str| {
            if *quoted {
                format!("\"{s}\"")
            } else {
                s.to_string()
            }
        };
        let cells: Vec<String> = std::iter::once(q("nm"))
            .chain(names.iter().map(|n| q(n)))
            .collect();
        lines.push(cells.join(d.separator));
    }
    let mut order: Vec<usize> = (0..table.wavelengths_nm.len()).collect();
    if d.reversed {
        order.reverse();
    }
    for (i, row) in order.into_iter().enumerate() {
        if d.comment_every.is_some_and(|every| i % every == 0) {
            lines.push(format!("# comment before row {i}"));
        }
        let cells: Vec<String> = std::iter::once(table.wavelengths_nm[row])
            .chain(table.columns.iter().map(|c| c[row]))
            .map(number)
            .collect();
        lines.push(cells.join(d.separator));
    }
    let end = if d.crlf { "\r\n" } else { "\n" };
    let text = lines.join(end) + end;
    match d.encoding {
        0 => text.into_bytes(),
        1 => [0xEF, 0xBB, 0xBF]
            .into_iter()
            .chain(text.into_bytes())
            .collect(),
        2 => [0xFF, 0xFE]
            .into_iter()
            .chain(text.encode_utf16().flat_map(u16::to_le_bytes))
            .collect(),
        _ => [0xFE, 0xFF]
            .into_iter()
            .chain(text.encode_utf16().flat_map(u16::to_be_bytes))
            .collect(),
    }
}

proptest! {
    #[test]
    fn arbitrary_bytes_never_panic(bytes in prop::collection::vec(any::<u8>(), 0..2000)) {
        check_any(&bytes);
    }

    #[test]
    fn arbitrary_text_lines_never_panic(
        lines in prop::collection::vec("[0-9a-zA-Z.,;\t \"#+\\-eE%()\\[\\]]{0,30}", 0..30),
        crlf in any::<bool>(),
    ) {
        let text = lines.join(if crlf { "\r\n" } else { "\n" });
        check_any(text.as_bytes());
    }

    #[test]
    fn valid_tables_round_trip(
        (table, dialect) in table_strategy().prop_flat_map(|t| {
            let cols = t.columns.len();
            (Just(t), dialect_strategy(cols))
        })
    ) {
        let bytes = write(&table, &dialect);
        let got = import_bytes("gen.csv", &bytes, SpectrumKind::Lamp)
            .unwrap_or_else(|e| panic!("{e}\n{}", String::from_utf8_lossy(&bytes)));
        assert_well_formed(&got);
        prop_assert_eq!(&got.wavelengths_nm, &table.wavelengths_nm);
        for (k, column) in got.columns.iter().enumerate() {
            prop_assert_eq!(&column.values, &table.columns[k]);
            let want = match &dialect.header {
                Some((_, names)) => names[k].clone(),
                None => format!("value {}", k + 1),
            };
            prop_assert_eq!(&column.name, &want);
        }
        prop_assert_eq!(got.warnings.iter().any(|w| w.contains("reversed")), dialect.reversed && table.wavelengths_nm.len() > 1);
    }

    #[test]
    fn corrupted_valid_tables_never_panic(
        table in table_strategy(),
        dialect in dialect_strategy(4),
        edits in prop::collection::vec((any::<prop::sample::Index>(), any::<u8>(), 0_u8..3), 1..8),
    ) {
        let table = Table { columns: table.columns.into_iter().take(4).collect(), ..table };
        let dialect = Dialect { header: None, ..dialect };
        let mut bytes = write(&table, &dialect);
        for (at, byte, op) in edits {
            if bytes.is_empty() {
                break;
            }
            let i = at.index(bytes.len());
            match op {
                0 => bytes[i] = byte,
                1 => bytes.insert(i, byte),
                _ => { bytes.remove(i); }
            }
        }
        check_any(&bytes);
    }
}
