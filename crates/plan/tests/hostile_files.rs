//! Hostile plan files (`tests/data/hostile/`, written by
//! `scripts/gen_hostile_plans.py`): each must be refused with a clear one-line
//! message that names the file and, where there is one, the line and column or
//! the field, never a panic or a hang. A second group loads but must fail
//! validation.

use lampwright_plan::files::plan_from_bytes;
use lampwright_plan::limits::MAX_FILE_BYTES;
use lampwright_plan::validate::has_errors;
use lampwright_plan::{PlanError, load_plan, validate};
use std::io::Write;
use std::path::PathBuf;

fn corpus() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/data/hostile")
}

/// File name, and the text its error message must contain after the file name.
const REFUSED: &[(&str, &str)] = &[
    (
        "deep-nesting.ron",
        "line 1, column 95: brackets nest more than 64 deep",
    ),
    (
        "deep-nesting-unknown-field.ron",
        "line 1, column 95: brackets nest more than 64 deep",
    ),
    (
        "duplicate-field.ron",
        "line 4, column 5: Unexpected duplicate field named `name`",
    ),
    ("empty.ron", "line 1, column 1: the file is empty"),
    ("whitespace-only.ron", "line 1, column 1: the file is empty"),
    (
        "future-version.ron",
        "plan format version 2 is not one this Lampwright reads (it reads versions 0 to 1); it was written by a newer Lampwright",
    ),
    (
        "huge-array.ron",
        "custom.lamps[0].wavelengths_nm: number of spectral points is 12000, more than the limit of 10000",
    ),
    (
        "huge-integer.ron",
        "line 3, column 26: Integer is out of bounds",
    ),
    (
        "json.ron",
        "line 1, column 1: Expected opening `(` for struct `Plan`",
    ),
    (
        "long-name.ron",
        "name: length in characters is 300, more than the limit of 200",
    ),
    (
        "negative-id.ron",
        "line 3, column 27: Integer is out of bounds",
    ),
    (
        "negative-version.ron",
        "line 1, column 23: Integer is out of bounds",
    ),
    (
        "no-version.ron",
        "line 1, column 1: no `format_version` field",
    ),
    (
        "non-utf8.ron",
        "not UTF-8 text (first invalid byte at line 3, byte offset 43)",
    ),
    ("utf16.ron", "line 1, column 1: the file is UTF-16 text"),
    (
        "not-a-plan.ron",
        "line 1, column 1: Expected struct `Plan` but found `CameraSettings`",
    ),
    ("nul-bytes.ron", "line 1, column 6: Expected identifier"),
    ("random-bytes.ron", "line 1, column 1:"),
    (
        "too-many-gels.ron",
        "sources[0].gels: number of gels is 9, more than the limit of 8",
    ),
    (
        "too-many-sources.ron",
        "sources: number of sources is 65, more than the limit of 64",
    ),
    (
        "trailing-garbage.ron",
        "line 4, column 2: Non-whitespace trailing characters",
    ),
    ("truncated.ron", "line 67, column 13: Unexpected end of RON"),
    (
        "unknown-lamp-kind.ron",
        "line 3, column 35: Unexpected variant named `Candle` in enum `LampRef`",
    ),
    (
        "unknown-role.ron",
        "line 3, column 48: Unexpected variant named `Spotlight` in enum `SourceRole`",
    ),
    (
        "unterminated-string.ron",
        "line 3, column 11: Expected end of string",
    ),
    ("version-as-text.ron", "line 1, column 21: Expected integer"),
    ("wrong-type-level.ron", "line 3, column 52: Expected float"),
    (
        "wrong-type-sources.ron",
        "line 3, column 13: Expected opening `[`",
    ),
];

/// Files that load but must fail `check`, with an expected issue.
const LOAD_BUT_FAIL_CHECK: &[(&str, &str)] = &[
    (
        "check-nan-level.ron",
        "error: sources[0].level_lux: source 'Key': level (lux) is NaN, not a finite number",
    ),
    (
        "check-infinite-strength.ron",
        "error: sources[0].gels[0].strength: source 'Key': gel strength is inf, not a finite number",
    ),
    (
        "check-unknown-ids.ron",
        "error: sources[0].lamp: source 'Key': unknown lamp 'xyz'",
    ),
    (
        "check-zone-missing-source.ron",
        "error: zones[0].reach[0].source: zone 'Wall': there is no source with id 7",
    ),
    (
        "check-custom-length-mismatch.ron",
        "error: custom.gels[0].values: embedded gel 'g': 2 values for 3 wavelengths",
    ),
];

#[test]
fn every_hostile_file_is_refused_with_a_clear_message() {
    for (name, expected) in REFUSED {
        let path = corpus().join(name);
        let message = load_plan(&path)
            .err()
            .unwrap_or_else(|| panic!("{name} loaded"))
            .to_string();
        let prefix = format!("{}: ", path.display());
        assert!(message.starts_with(&prefix), "{name}: {message}");
        assert!(
            message[prefix.len()..].starts_with(expected),
            "{name}:\n  got      {message}\n  expected {expected}"
        );
        assert!(!message.contains('\n'), "{name}: message is one line");
        assert!(message.len() < 400, "{name}: message is short");
    }
}

#[test]
fn the_corpus_is_fully_covered() {
    let mut listed: Vec<&str> = REFUSED
        .iter()
        .chain(LOAD_BUT_FAIL_CHECK)
        .map(|(n, _)| *n)
        .collect();
    listed.sort_unstable();
    let mut present: Vec<String> = std::fs::read_dir(corpus())
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    present.sort();
    assert_eq!(listed, present);
}

#[test]
fn damaged_values_load_but_fail_validation() {
    for (name, expected) in LOAD_BUT_FAIL_CHECK {
        let plan = load_plan(&corpus().join(name)).unwrap_or_else(|e| panic!("{name}: {e}"));
        let issues = validate(&plan);
        assert!(has_errors(&issues), "{name}");
        let text: Vec<String> = issues.iter().map(ToString::to_string).collect();
        assert!(text.iter().any(|t| t == expected), "{name}: {text:#?}");
    }
}

#[test]
fn a_20_mib_file_is_refused_before_it_is_read() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("huge.ron");
    let mut f = std::fs::File::create(&path).unwrap();
    f.write_all(b"Plan(format_version: 1, notes: \"").unwrap();
    let chunk = vec![b'a'; 1024 * 1024];
    for _ in 0..20 {
        f.write_all(&chunk).unwrap();
    }
    f.write_all(b"\")\n").unwrap();
    drop(f);
    let e = load_plan(&path).unwrap_err();
    match &e {
        PlanError::TooLarge {
            size_bytes,
            limit_bytes,
            ..
        } => {
            assert!(*size_bytes > 20 * 1024 * 1024);
            assert_eq!(*limit_bytes, MAX_FILE_BYTES);
        }
        other => panic!("{other}"),
    }
    assert!(
        e.to_string()
            .contains("plan files are limited to 16777216 bytes"),
        "{e}"
    );
    // The same limit holds for text handed over in memory.
    let bytes = std::fs::read(&path).unwrap();
    assert!(matches!(
        plan_from_bytes(&path, &bytes),
        Err(PlanError::TooLarge { .. })
    ));
}

#[test]
fn folders_and_missing_files_are_refused() {
    let dir = tempfile::tempdir().unwrap();
    assert!(matches!(load_plan(dir.path()), Err(PlanError::Io { .. })));
    let e = load_plan(&dir.path().join("missing.ron"))
        .unwrap_err()
        .to_string();
    assert!(e.contains("missing.ron"), "{e}");
}
