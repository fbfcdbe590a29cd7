//! Fuzz plan files the way the window and `lampwright check`/`report` read
//! them: bytes → `plan_from_bytes` (size, encoding, RON, version, migration of
//! format 0, limits) → validation → evaluation → reports, plus a save and
//! re-read of whatever loaded.
//!
//! Asserted: nothing panics; every refusal and every issue is one non-empty
//! line; a plan that loads can be written back and reads back to the same
//! text; an evaluation (the window evaluates even plans with errors) holds no
//! NaN or infinite number; every report renders.

#![no_main]

use lampwright_fuzz::{is_one_line, non_finite_numbers};
use lampwright_plan::files::{plan_from_bytes, plan_from_str, plan_to_ron};
use lampwright_plan::report::{ReportFormat, render_report};
use lampwright_plan::{evaluate, validate};
use libfuzzer_sys::fuzz_target;
use std::path::Path;

fuzz_target!(|data: &[u8]| {
    let plan = match plan_from_bytes(Path::new("fuzz.ron"), data) {
        Ok(plan) => plan,
        Err(e) => {
            let message = e.to_string();
            assert!(is_one_line(&message), "refusal not one line: {message:?}");
            assert!(
                message.starts_with("fuzz.ron"),
                "refusal without the file: {message}"
            );
            return;
        }
    };

    for issue in validate(&plan) {
        let line = issue.to_string();
        assert!(
            is_one_line(&issue.field) && is_one_line(&issue.message),
            "issue not one line: {line:?}"
        );
    }

    // What loaded can be saved, and saving is stable across a re-read (text is
    // compared so that NaN fields, which the checker reports, compare equal).
    let text = plan_to_ron(&plan).unwrap_or_else(|e| panic!("a loaded plan does not save: {e}"));
    let again = plan_from_str(&text)
        .unwrap_or_else(|e| panic!("a saved plan does not read back: {e}\n{text}"));
    let text_again = plan_to_ron(&again).expect("the re-read plan saves");
    assert_eq!(text, text_again, "saving is not stable across a re-read");

    match evaluate(&plan) {
        Ok(evaluation) => {
            let bad = non_finite_numbers(&evaluation);
            assert!(
                bad.is_empty(),
                "non-finite numbers in the evaluation: {bad:?}"
            );
            for warning in &evaluation.warnings {
                assert!(is_one_line(warning), "warning not one line: {warning:?}");
            }
            for format in ReportFormat::ALL {
                if let Err(e) = render_report(&plan, &evaluation, format) {
                    let message = e.to_string();
                    assert!(
                        is_one_line(&message),
                        "report error not one line: {message:?}"
                    );
                }
            }
        }
        Err(e) => {
            let message = e.to_string();
            assert!(
                is_one_line(&message),
                "evaluation error not one line: {message:?}"
            );
        }
    }
});
