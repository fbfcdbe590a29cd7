//! End-to-end tests of `lampwright delta-e`: the real binary on the Sharma,
//! Wu & Dalal (2005) CIEDE2000 test pairs and on malformed files.
//!
//! Reference values: `crates/color/tests/fixtures/sharma2005_ciede2000.csv`
//! (all 34 pairs of Sharma et al. 2005, DOI 10.1002/col.20070, ΔE00 to 4 decimals)
//! and `crates/color/tests/fixtures/delta_e_colour047.csv` (colour-science 0.4.7
//! ΔE76/ΔE94/ΔE2000, written by `scripts/gen_fixtures_spaces.py`).

use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

/// Published ΔE00 values are rounded to 4 decimals.
const TOL_SHARMA: f64 = 5e-5;
/// JSON carries full precision; the reference package computes the same formulas.
const TOL_DE: f64 = 1e-9;

fn fixture(name: &str) -> String {
    let path = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("crates/color/tests/fixtures")
        .join(name);
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

/// Data rows of a fixture as (header, rows of cells), comments dropped.
fn fixture_rows(name: &str) -> (Vec<String>, Vec<Vec<String>>) {
    let text = fixture(name);
    let mut lines = text.lines().filter(|l| !l.starts_with('#'));
    let header = lines
        .next()
        .expect("fixture header")
        .split(',')
        .map(str::to_string)
        .collect();
    let rows = lines
        .map(|l| l.split(',').map(str::to_string).collect())
        .collect();
    (header, rows)
}

fn column(header: &[String], name: &str) -> usize {
    header
        .iter()
        .position(|h| h == name)
        .unwrap_or_else(|| panic!("no column {name}"))
}

fn scratch_dir(tag: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!(
        "lampwright-cli-delta-e-{tag}-{}",
        std::process::id()
    ));
    std::fs::create_dir_all(&dir).expect("scratch directory");
    dir
}

fn lampwright(args: &[&std::ffi::OsStr]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lampwright"))
        .args(args)
        .output()
        .expect("the lampwright binary runs")
}

/// Writes the Sharma pairs as a pairs CSV (with a header, a comment and a blank
/// line, which must all be skipped) and returns the path and the expected ΔE00.
fn write_sharma_pairs(dir: &Path) -> (PathBuf, Vec<f64>) {
    let (header, rows) = fixture_rows("sharma2005_ciede2000.csv");
    let cols: Vec<usize> = ["L1", "a1", "b1", "L2", "a2", "b2"]
        .iter()
        .map(|c| column(&header, c))
        .collect();
    let de = column(&header, "de2000");
    let mut text = String::from("L1,a1,b1,L2,a2,b2\n# Sharma, Wu & Dalal (2005), Table 1\n\n");
    let mut want = Vec::new();
    for row in &rows {
        let cells: Vec<&str> = cols.iter().map(|&c| row[c].as_str()).collect();
        text.push_str(&cells.join(","));
        text.push('\n');
        want.push(row[de].parse().expect("published ΔE00"));
    }
    let path = dir.join("sharma.csv");
    std::fs::write(&path, text).expect("write pairs file");
    (path, want)
}

#[test]
fn json_matches_sharma_2005() {
    let dir = scratch_dir("json");
    let (path, want) = write_sharma_pairs(&dir);
    let out = lampwright(&["delta-e".as_ref(), path.as_os_str(), "--json".as_ref()]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let stdout = String::from_utf8(out.stdout).unwrap();
    let lines: Vec<&str> = stdout.lines().collect();
    assert_eq!(lines.len(), 34);
    for (i, (line, want)) in lines.iter().zip(&want).enumerate() {
        let v: Value = serde_json::from_str(line).unwrap();
        let mut keys: Vec<&str> = v.as_object().unwrap().keys().map(String::as_str).collect();
        keys.sort_unstable();
        assert_eq!(keys, ["de2000", "de76", "de94", "line"]);
        assert!(line.starts_with("{\"line\":"), "{line}");
        // Three lines of preamble, then one pair per line.
        assert_eq!(v["line"].as_u64(), Some(i as u64 + 4));
        let got = v["de2000"].as_f64().unwrap();
        assert!(
            (got - want).abs() <= TOL_SHARMA,
            "pair {}: {got} vs {want}",
            i + 1
        );
    }
    std::fs::remove_dir_all(dir).ok();
}

#[test]
fn text_table_matches_sharma_2005() {
    let dir = scratch_dir("text");
    let (path, want) = write_sharma_pairs(&dir);
    let out = lampwright(&["delta-e".as_ref(), path.as_os_str()]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let stdout = String::from_utf8(out.stdout).unwrap();
    let lines: Vec<&str> = stdout.lines().collect();
    assert_eq!(lines.len(), 35);
    assert!(lines[0].contains("ΔE76") && lines[0].contains("ΔE94") && lines[0].contains("ΔE2000"));
    let width = lines[0].chars().count();
    for (line, want) in lines[1..].iter().zip(&want) {
        assert_eq!(line.chars().count(), width, "misaligned: {line}");
        let fields: Vec<&str> = line.split_whitespace().collect();
        let got: f64 = fields[3].parse().unwrap();
        // Printed to 4 decimals: the rounding of both sides adds up to one unit.
        assert!((got - want).abs() <= 1e-4 + 1e-12, "{line} vs {want}");
    }
    std::fs::remove_dir_all(dir).ok();
}

#[test]
fn all_three_differences_match_colour_science() {
    let (header, rows) = fixture_rows("delta_e_colour047.csv");
    let cols: Vec<usize> = ["L1", "a1", "b1", "L2", "a2", "b2"]
        .iter()
        .map(|c| column(&header, c))
        .collect();
    let dir = scratch_dir("colour");
    let mut text = String::new();
    for row in rows.iter().take(30) {
        text.push_str(
            &cols
                .iter()
                .map(|&c| row[c].as_str())
                .collect::<Vec<_>>()
                .join(","),
        );
        text.push('\n');
    }
    let path = dir.join("pairs.csv");
    std::fs::write(&path, text).unwrap();
    let out = lampwright(&["delta-e".as_ref(), path.as_os_str(), "--json".as_ref()]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let stdout = String::from_utf8(out.stdout).unwrap();
    assert_eq!(stdout.lines().count(), 30);
    for (line, row) in stdout.lines().zip(&rows) {
        let v: Value = serde_json::from_str(line).unwrap();
        for key in ["de76", "de94", "de2000"] {
            let want: f64 = row[column(&header, key)].parse().unwrap();
            let got = v[key].as_f64().unwrap();
            assert!((got - want).abs() <= TOL_DE, "{key}: {got} vs {want}");
        }
    }
    std::fs::remove_dir_all(dir).ok();
}

#[test]
fn malformed_row_names_file_and_line_and_exits_1() {
    let dir = scratch_dir("bad");
    let path = dir.join("bad.csv");
    std::fs::write(
        &path,
        "L1,a1,b1,L2,a2,b2\n50,0,0,50,1,2\n50,0,zero,50,1,2\n",
    )
    .unwrap();
    let out = lampwright(&["delta-e".as_ref(), path.as_os_str()]);
    assert_eq!(out.status.code(), Some(1));
    assert!(
        out.stdout.is_empty(),
        "nothing is printed before the whole file is checked"
    );
    let stderr = String::from_utf8(out.stderr).unwrap();
    assert_eq!(stderr.lines().count(), 1, "{stderr}");
    assert!(
        stderr.contains("bad.csv: line 3:") && stderr.contains("'zero' is not a number"),
        "{stderr}"
    );

    let short = dir.join("short.csv");
    std::fs::write(&short, "50,0,0,50,1\n").unwrap();
    let out = lampwright(&["delta-e".as_ref(), short.as_os_str()]);
    assert_eq!(out.status.code(), Some(1));
    let stderr = String::from_utf8(out.stderr).unwrap();
    assert!(
        stderr.contains("short.csv: line 1: expected 6 numbers"),
        "{stderr}"
    );

    let missing = dir.join("missing.csv");
    let out = lampwright(&["delta-e".as_ref(), missing.as_os_str()]);
    assert_eq!(out.status.code(), Some(1));
    assert!(
        String::from_utf8(out.stderr)
            .unwrap()
            .contains("missing.csv")
    );
    std::fs::remove_dir_all(dir).ok();
}
