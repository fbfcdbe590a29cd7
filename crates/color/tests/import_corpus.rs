//! The spectral importer against its corpus: `tests/data/good/` (every accepted
//! variant) and `tests/data/malformed/` (one defect per file).
//!
//! The corpus is invented and written by `scripts/gen_import_corpus.py`. Good
//! files follow the formula value(k, wl) = (k + 1)·(wl − 300)/1000 for value
//! column k, which [`value`] recomputes here independently of the files.

use lampwright_color::import::{
    self, ImportedTable, MAX_FILE_BYTES, MAX_ROWS, SpectrumKind, import_bytes, import_path,
};
use std::fmt::Write as _;
use std::path::PathBuf;

fn data_dir(sub: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("tests/data")
        .join(sub)
}

/// The corpus formula (see the module docs).
fn value(column: usize, wavelength_nm: f64) -> f64 {
    (column as f64 + 1.0) * (wavelength_nm - 300.0) / 1000.0
}

fn steps(start: u32, end: u32, step: usize) -> Vec<f64> {
    (start..=end).step_by(step).map(f64::from).collect()
}

/// Values parsed from decimal text of at most 5 decimals are within float
/// rounding of the formula.
const VALUE_TOL: f64 = 1e-12;

struct Good {
    file: &'static str,
    kind: SpectrumKind,
    wavelengths_nm: Vec<f64>,
    names: &'static [&'static str],
    units: &'static [Option<&'static str>],
    /// Factor between the formula and the imported value.
    scale: f64,
    /// Words that some warning must contain, one per expected warning.
    warnings: &'static [&'static str],
}

// One row per corpus file: a table, not logic.
#[allow(clippy::too_many_lines)]
fn good_cases() -> Vec<Good> {
    use SpectrumKind::{CameraSensitivity as Camera, Lamp, Reflectance, Transmittance};
    let g = |file, kind, wavelengths_nm, names, units, warnings| Good {
        file,
        kind,
        wavelengths_nm,
        names,
        units,
        scale: 1.0,
        warnings,
    };
    let w5 = || steps(380, 780, 5);
    let w10 = || steps(380, 780, 10);
    let irregular: Vec<f64> = (0..161)
        .map(|i| 380.0 + 2.5 * f64::from(i) + 0.1 * f64::from(i % 4))
        .collect();
    vec![
        g(
            "comma_header_1nm.csv",
            Lamp,
            steps(360, 830, 1),
            &["lamp"],
            &[None],
            &[],
        ),
        g(
            "comma_space_2nm.csv",
            Lamp,
            steps(380, 780, 2),
            &["Key", "Fill"],
            &[Some("W/m2/nm"); 2],
            &[],
        ),
        g(
            "semicolon_decimal_comma_5nm.csv",
            Reflectance,
            w5(),
            &["Patch A", "Patch B"],
            &[None; 2],
            &[],
        ),
        g(
            "tab_decimal_comma_10nm.txt",
            Transmittance,
            w10(),
            &["value 1"],
            &[None],
            &[],
        ),
        g(
            "no_header_5nm.csv",
            Lamp,
            w5(),
            &["value 1", "value 2", "value 3"],
            &[None; 3],
            &[],
        ),
        g(
            "quoted_header.csv",
            Lamp,
            w5(),
            &["Lamp \"A\", warm", "Lamp B"],
            &[Some("W/m2/nm"), None],
            &[],
        ),
        Good {
            // Stored as 2 × formula in percent; the header says % although the maximum is below 1.5.
            scale: 0.02,
            ..g(
                "percent_header.csv",
                Reflectance,
                w10(),
                &["R"],
                &[Some("%")],
                &["percent (the header says %)"],
            )
        },
        g(
            "percent_by_max.csv",
            Transmittance,
            w10(),
            &["T"],
            &[None],
            &["percent (its maximum 48 is above 1.5)"],
        ),
        g(
            "decreasing_10nm.csv",
            Lamp,
            w10(),
            &["lamp"],
            &[None],
            &["reversed"],
        ),
        g(
            "irregular_steps.csv",
            Lamp,
            irregular,
            &["a", "b"],
            &[None; 2],
            &[],
        ),
        g(
            "camera_rgb.csv",
            Camera,
            w5(),
            &["r", "g", "b"],
            &[None; 3],
            &[],
        ),
        g(
            "narrow_range.csv",
            Reflectance,
            steps(400, 700, 10),
            &["R"],
            &[None],
            &["400–700 nm"],
        ),
        g(
            "utf16le_bom.csv",
            Lamp,
            w5(),
            &["Lampe"],
            &[Some("µW/cm²/nm")],
            &[],
        ),
        g(
            "utf16be_bom.csv",
            Transmittance,
            w10(),
            &["filter"],
            &[None],
            &[],
        ),
        g("crlf_bom.csv", Lamp, w5(), &["lamp"], &[None], &[]),
        g(
            "units_line.csv",
            Lamp,
            w5(),
            &["Key", "Fill"],
            &[Some("W/m2/nm"), Some("counts")],
            &[],
        ),
        g("cr_only.csv", Lamp, w10(), &["lamp"], &[None], &[]),
        g(
            "whitespace_separated.txt",
            Lamp,
            w5(),
            &["value_a", "value_b"],
            &[None; 2],
            &[],
        ),
        g(
            "trailing_separators.csv",
            Reflectance,
            w10(),
            &["Patch 1", "Patch 2"],
            &[None; 2],
            &[],
        ),
        Good {
            scale: 1e-3,
            ..g(
                "scientific_notation.csv",
                Lamp,
                w5(),
                &["Irradiance"],
                &[Some("W/(m2 nm)")],
                &[],
            )
        },
    ]
}

fn check_good(case: &Good, table: &ImportedTable) {
    let file = case.file;
    assert_eq!(table.source_name, file);
    assert_eq!(table.kind, case.kind, "{file}");
    assert_eq!(
        table.wavelengths_nm.len(),
        case.wavelengths_nm.len(),
        "{file}"
    );
    for (got, want) in table.wavelengths_nm.iter().zip(&case.wavelengths_nm) {
        assert!(
            (got - want).abs() < 1e-9,
            "{file}: wavelength {got} vs {want}"
        );
    }
    let names: Vec<&str> = table.columns.iter().map(|c| c.name.as_str()).collect();
    assert_eq!(names, case.names, "{file}");
    let units: Vec<Option<&str>> = table
        .columns
        .iter()
        .map(|c| c.unit_hint.as_deref())
        .collect();
    assert_eq!(units, case.units, "{file}");
    for (k, column) in table.columns.iter().enumerate() {
        for (wl, got) in table.wavelengths_nm.iter().zip(&column.values) {
            let want = case.scale * value(k, *wl);
            assert!(
                (got - want).abs() < VALUE_TOL,
                "{file}: column {k} at {wl} nm: {got} vs {want}"
            );
        }
    }
    assert_eq!(
        table.warnings.len(),
        case.warnings.len(),
        "{file}: {:?}",
        table.warnings
    );
    for word in case.warnings {
        assert!(
            table.warnings.iter().any(|w| w.contains(word)),
            "{file}: no warning with '{word}': {:?}",
            table.warnings
        );
    }
    assert!(table.warnings.iter().all(|w| !w.contains('\n')));
}

#[test]
fn good_files_parse_to_the_formula() {
    let cases = good_cases();
    for case in &cases {
        let path = data_dir("good").join(case.file);
        let table = import_path(&path, case.kind).unwrap_or_else(|e| panic!("{}: {e}", case.file));
        check_good(case, &table);
        // Reading from a path and from bytes give the same table.
        let bytes = std::fs::read(&path).unwrap();
        assert_eq!(import_bytes(case.file, &bytes, case.kind).unwrap(), table);
    }
}

#[test]
fn every_good_file_is_checked() {
    let listed: Vec<&str> = good_cases()
        .iter()
        .map(|c| c.file)
        .chain(["dark_noise.csv", "all_zero.csv"])
        .collect();
    for entry in std::fs::read_dir(data_dir("good")).unwrap() {
        let name = entry.unwrap().file_name().into_string().unwrap();
        assert!(
            listed.contains(&name.as_str()),
            "good/{name} has no expectation"
        );
    }
}

#[test]
fn dark_noise_is_clamped_with_a_warning() {
    let t = import_path(&data_dir("good").join("dark_noise.csv"), SpectrumKind::Lamp).unwrap();
    let v = &t.columns[0].values;
    // Rows 0, 1 and 3 hold -0.0010 in the file (within 1 % of the maximum 0.48).
    for (i, wl) in t.wavelengths_nm.iter().enumerate() {
        let want = if [0, 1, 3].contains(&i) {
            0.0
        } else {
            value(0, *wl)
        };
        assert!((v[i] - want).abs() < VALUE_TOL, "at {wl} nm");
    }
    assert_eq!(t.warnings.len(), 1);
    assert!(
        t.warnings[0].contains("3 small negative values (down to -0.001)"),
        "{:?}",
        t.warnings
    );
}

#[test]
fn non_colorimetric_tables_parse_but_colour_computation_refuses_them() {
    let zero = import_path(&data_dir("good").join("all_zero.csv"), SpectrumKind::Lamp).unwrap();
    assert!(
        zero.warnings[0].contains("zero at every wavelength"),
        "{:?}",
        zero.warnings
    );
    let spd = zero.to_relative_spd(0).unwrap();
    assert!(
        spd.check_colorimetric("lamp")
            .unwrap_err()
            .to_string()
            .contains("zero")
    );

    let narrow = import_path(
        &data_dir("good").join("narrow_range.csv"),
        SpectrumKind::Reflectance,
    )
    .unwrap();
    let refl = narrow.to_reflectance(0).unwrap();
    let err = refl.check_colorimetric("sample").unwrap_err().to_string();
    assert!(err.contains("400–700 nm"), "{err}");
}

#[test]
fn typed_curves_resample_the_columns() {
    let dir = data_dir("good");
    // The 5 nm camera table on the 1 nm grid: at measured wavelengths the
    // resampled curve equals the data (Sprague passes through the points).
    let cam = import_path(&dir.join("camera_rgb.csv"), SpectrumKind::CameraSensitivity).unwrap();
    for k in 0..3 {
        let s = cam.to_sensitivity(k).unwrap();
        assert!((s.at_nm(555.0) - value(k, 555.0)).abs() < 1e-9);
        assert!(s.check_colorimetric("camera").is_ok());
    }
    assert!(
        cam.to_relative_spd(0).is_err(),
        "a camera table is not a lamp"
    );
    let gel = import_path(
        &dir.join("tab_decimal_comma_10nm.txt"),
        SpectrumKind::Transmittance,
    )
    .unwrap();
    // The formula is linear, so any interpolation between samples reproduces it.
    assert!((gel.to_transmittance(0).unwrap().at_nm(543.0) - value(0, 543.0)).abs() < 1e-9);
    let lamp = import_path(&dir.join("irregular_steps.csv"), SpectrumKind::Lamp).unwrap();
    assert!((lamp.to_relative_spd(1).unwrap().at_nm(600.0) - value(1, 600.0)).abs() < 1e-9);
    assert_eq!(lamp.coverage().map(|c| c.end_nm), Some(780.0));
    assert!((lamp.wavelengths_nm[1] - 382.6).abs() < 1e-12);
}

/// (file, kind, line, keyword) for every malformed file.
// One row per corpus file: a table, not logic.
#[allow(clippy::too_many_lines)]
fn malformed_cases() -> Vec<(&'static str, SpectrumKind, usize, &'static str)> {
    use SpectrumKind::{CameraSensitivity as Camera, Lamp};
    vec![
        ("empty.csv", Lamp, 0, "file is empty"),
        ("blank_and_comments_only.csv", Lamp, 0, "no data rows"),
        ("header_only.csv", Lamp, 0, "header but no data rows"),
        ("nan_value.csv", Lamp, 5, "'nan' is not a finite number"),
        ("inf_value.csv", Lamp, 6, "'inf' is not a finite number"),
        (
            "infinity_wavelength.csv",
            Lamp,
            4,
            "'Infinity' is not a finite number",
        ),
        ("empty_cell.csv", Lamp, 4, "missing value"),
        ("short_row.csv", Lamp, 5, "missing values"),
        ("long_row.csv", Lamp, 5, "row has 4 cells"),
        ("text_in_cell.csv", Lamp, 7, "'n/a' is not a number"),
        (
            "unit_in_cell.csv",
            Lamp,
            6,
            "units or text belong in the header",
        ),
        (
            "wavelength_with_unit.csv",
            Lamp,
            3,
            "units or text belong in the header",
        ),
        ("mixed_separators.csv", Lamp, 8, "inconsistent separators"),
        (
            "tab_and_semicolon_on_one_line.csv",
            Lamp,
            5,
            "mixes tab and semicolon",
        ),
        (
            "header_separator_differs.csv",
            Lamp,
            3,
            "inconsistent separators",
        ),
        (
            "decimal_comma_with_comma_separator.csv",
            Lamp,
            2,
            "ambiguous",
        ),
        ("decimal_comma_extra_cells.csv", Lamp, 3, "ambiguous"),
        (
            "quoted_decimal_comma_comma_separator.csv",
            Lamp,
            3,
            "ambiguous",
        ),
        (
            "mixed_decimal_marks.csv",
            Lamp,
            4,
            "decimal point but earlier numbers use a decimal comma",
        ),
        ("thousands_separator.csv", Lamp, 3, "thousands separators"),
        (
            "duplicate_wavelength.csv",
            Lamp,
            9,
            "duplicate wavelength 430 nm",
        ),
        ("non_monotonic.csv", Lamp, 9, "out of order"),
        ("large_negative.csv", Lamp, 13, "negative beyond dark noise"),
        ("micrometres.csv", Lamp, 3, "micrometres"),
        (
            "wavelength_too_low.csv",
            Lamp,
            3,
            "outside the plausible range",
        ),
        (
            "wavelength_too_high.csv",
            Lamp,
            44,
            "outside the plausible range",
        ),
        ("nul_bytes.csv", Lamp, 6, "NUL"),
        ("binary_control_chars.bin", Lamp, 3, "binary"),
        ("invalid_utf8.csv", Lamp, 2, "invalid UTF-8"),
        ("utf16_without_bom.csv", Lamp, 1, "byte-order mark"),
        ("utf16_odd_length.csv", Lamp, 0, "odd number of bytes"),
        (
            "utf16_unpaired_surrogate.csv",
            Lamp,
            3,
            "unpaired surrogate",
        ),
        ("utf32_bom.csv", Lamp, 0, "UTF-32"),
        ("long_line.csv", Lamp, 3, "KiB limit"),
        ("too_many_columns.csv", Lamp, 2, "limit of 64 columns"),
        (
            "camera_two_columns.csv",
            Camera,
            2,
            "exactly 3 value columns",
        ),
        (
            "camera_four_columns.csv",
            Camera,
            1,
            "exactly 3 value columns",
        ),
        ("only_wavelength_column.csv", Lamp, 2, "only one column"),
        ("single_row.csv", Lamp, 3, "at least two wavelengths"),
        ("unterminated_quote.csv", Lamp, 2, "never closed"),
        (
            "text_after_closing_quote.csv",
            Lamp,
            2,
            "after its closing quote",
        ),
        ("implausibly_large.csv", Lamp, 5, "implausibly large"),
        (
            "text_row_after_data.csv",
            Lamp,
            44,
            "'end of data' is not a number",
        ),
    ]
}

#[test]
fn malformed_files_are_refused_with_file_line_and_reason() {
    for (file, kind, line, keyword) in malformed_cases() {
        let err = import_path(&data_dir("malformed").join(file), kind)
            .map(|t| t.warnings)
            .expect_err(file)
            .to_string();
        // Whole-file problems (line 0) name no line.
        let prefix = if line == 0 {
            format!("{file}: ")
        } else {
            format!("{file}: line {line}: ")
        };
        assert!(err.starts_with(&prefix), "{file}: {err}");
        assert!(line != 0 || !err.contains("line 0"), "{file}: {err}");
        assert!(
            err.contains(keyword),
            "{file}: expected '{keyword}' in: {err}"
        );
        assert!(
            !err.contains('\n') && err.len() < 300,
            "{file}: not one short line: {err}"
        );
    }
}

#[test]
fn every_malformed_file_is_checked() {
    let listed: Vec<&str> = malformed_cases().iter().map(|c| c.0).collect();
    for entry in std::fs::read_dir(data_dir("malformed")).unwrap() {
        let name = entry.unwrap().file_name().into_string().unwrap();
        assert!(
            listed.contains(&name.as_str()),
            "malformed/{name} has no expectation"
        );
    }
}

#[test]
fn malformed_lamp_files_are_refused_for_every_kind() {
    // Kind-independent defects stay defects whatever the table is said to hold.
    for (file, kind, _, _) in malformed_cases() {
        if kind != SpectrumKind::Lamp || file == "large_negative.csv" {
            continue;
        }
        let bytes = std::fs::read(data_dir("malformed").join(file)).unwrap();
        for kind in [SpectrumKind::Reflectance, SpectrumKind::Transmittance] {
            assert!(
                import_bytes(file, &bytes, kind).is_err(),
                "{file} as {kind}"
            );
        }
    }
}

/// A deterministic pseudo-random byte stream (64-bit LCG, Knuth's MMIX constants).
fn lcg_bytes(len: usize, seed: u64) -> Vec<u8> {
    let mut state = seed;
    (0..len)
        .map(|_| {
            state = state
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (state >> 56) as u8
        })
        .collect()
}

#[test]
fn random_binary_of_five_mib_is_refused() {
    let bytes = lcg_bytes(5 * 1024 * 1024, 0x5eed);
    let err = import_bytes("noise.bin", &bytes, SpectrumKind::Lamp)
        .unwrap_err()
        .to_string();
    assert!(
        err.starts_with("noise.bin: ") && err.contains("MiB limit"),
        "{err}"
    );

    let path = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("noise_5mib.bin");
    std::fs::write(&path, &bytes).unwrap();
    let err = import_path(&path, SpectrumKind::Lamp)
        .unwrap_err()
        .to_string();
    assert!(
        err.starts_with("noise_5mib.bin: ") && err.contains("MiB limit"),
        "{err}"
    );

    // Under the cap, random bytes are refused as binary, not parsed.
    let small = lcg_bytes(64 * 1024, 7);
    let err = import_bytes("noise.bin", &small, SpectrumKind::Lamp)
        .unwrap_err()
        .to_string();
    assert!(err.contains("binary") || err.contains("UTF-8"), "{err}");
}

#[test]
fn file_one_byte_over_the_cap_is_refused_and_at_the_cap_is_read() {
    // A comment-only file of exactly the cap is read (and has no data rows);
    // one more byte is refused for its size.
    let mut text = vec![b'#'; MAX_FILE_BYTES];
    for i in (1000..MAX_FILE_BYTES).step_by(1000) {
        text[i] = b'\n';
    }
    let err = import_bytes("big.csv", &text, SpectrumKind::Lamp)
        .unwrap_err()
        .to_string();
    assert!(err.contains("no data rows"), "{err}");
    text.push(b'\n');
    let err = import_bytes("big.csv", &text, SpectrumKind::Lamp)
        .unwrap_err()
        .to_string();
    assert!(err.contains("MiB limit"), "{err}");
}

#[test]
fn too_many_rows_are_refused_at_the_first_row_over_the_cap() {
    // MAX_ROWS + 1 rows at 0.02 nm steps from 300 nm stay inside the plausible range.
    let mut text = String::from("nm,a\n");
    for i in 0..=MAX_ROWS {
        writeln!(text, "{:.2},1", 300.0 + 0.02 * i as f64).unwrap();
    }
    let err = import_bytes("rows.csv", text.as_bytes(), SpectrumKind::Lamp)
        .unwrap_err()
        .to_string();
    assert!(
        err.starts_with(&format!("rows.csv: line {}: ", MAX_ROWS + 2)),
        "{err}"
    );
    assert!(err.contains("data rows"), "{err}");
}

#[test]
fn missing_file_is_an_import_error() {
    let err = import_path(
        &data_dir("good").join("no_such_file.csv"),
        SpectrumKind::Lamp,
    )
    .unwrap_err();
    assert!(matches!(
        err,
        lampwright_color::ColorError::Import { line: 0, .. }
    ));
    assert!(err.to_string().starts_with("no_such_file.csv: cannot read"));
    assert_eq!(import::MAX_VALUE_COLUMNS, 64);
}
