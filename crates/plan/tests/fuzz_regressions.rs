//! Inputs the plan-file fuzz target (`fuzz/fuzz_targets/plan_file.rs`) found
//! breaking one of its rules, kept as files under `tests/data/fuzz/` and run
//! through the same steps: load, validate, evaluate. The rules are the ones
//! every plan file must keep: no panic, every refusal and every issue one
//! non-empty line, no NaN or infinite figure in an evaluation.

use lampwright_plan::files::plan_from_bytes;
use lampwright_plan::{Plan, evaluate, validate};
use std::path::{Path, PathBuf};

fn data(name: &str) -> (PathBuf, Vec<u8>) {
    let path = PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("tests/data/fuzz")
        .join(name);
    let bytes = std::fs::read(&path).unwrap_or_else(|e| panic!("{name}: {e}"));
    (path, bytes)
}

fn assert_one_line(what: &str, text: &str) {
    assert!(
        !text.trim().is_empty() && !text.contains(['\n', '\r']),
        "{what} is not one non-empty line: {text:?}"
    );
}

/// Load `name`, then check every issue and the evaluation; returns the plan
/// and every issue as shown.
fn run(name: &str) -> (Plan, Vec<String>) {
    let (path, bytes) = data(name);
    let plan = plan_from_bytes(Path::new(name), &bytes)
        .unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    let issues: Vec<String> = validate(&plan).iter().map(ToString::to_string).collect();
    for issue in &issues {
        assert_one_line("issue", issue);
    }
    match evaluate(&plan) {
        Ok(e) => {
            for w in &e.warnings {
                assert_one_line("warning", w);
            }
        }
        Err(e) => assert_one_line("evaluation error", &e.to_string()),
    }
    (plan, issues)
}

#[test]
fn a_line_break_in_a_lamp_id_stays_out_of_the_message() {
    // A format 0 plan whose lamp id holds a line break, NUL bytes and a
    // second copy of the file's start (a damaged save).
    let (plan, issues) = run("v0-lamp-id-with-line-break.ron");
    assert_eq!(plan.sources.len(), 1, "the format 0 light migrates");
    let unknown = issues
        .iter()
        .find(|i| i.starts_with("error: sources[0].lamp: source 'Bulb': unknown lamp 'inca"))
        .unwrap_or_else(|| panic!("no unknown-lamp issue in {issues:?}"));
    assert!(
        unknown.contains("ld left out. Plan(     format_version: 0,"),
        "{unknown}"
    );
    let err = evaluate(&plan).unwrap_err().to_string();
    assert!(
        err.starts_with("source 'Bulb': unknown lamp 'inca"),
        "{err}"
    );
}

#[test]
fn a_line_break_in_a_zone_name_stays_out_of_the_warnings() {
    // A zone whose name runs on over three lines (an unclosed quote closed
    // later) and reaches a source the plan does not have.
    let (plan, _) = run("zone-name-with-line-breaks.ron");
    assert!(plan.zones[0].name.contains('\n'));
    let e = evaluate(&plan).expect("a dark zone still evaluates");
    assert!(
        e.warnings
            .iter()
            .any(|w| w.starts_with("Walllan(     format_version: 1,")
                && w.ends_with("no light reaches it (all sources off or at zero)")),
        "{:?}",
        e.warnings
    );
}
