//! Fuzz the window's crash recovery as it runs at start-up: `recovery::scan`
//! over a recovery folder holding one autosave slot left by a window that is
//! gone. The input is the slot's info file (RON `AutosaveInfo`: the plan's
//! origin and when it was saved); after a NUL byte, the rest replaces the
//! autosaved plan (a valid plan otherwise).
//!
//! Asserted: nothing panics; a plan that cannot be read is set aside with a
//! one-line notice; a plan that can is offered, and its age reads as text.

#![no_main]

use lampwright::ui::recovery::{age_text, scan};
use lampwright_fuzz::is_one_line;
use libfuzzer_sys::fuzz_target;
use std::path::PathBuf;
use std::time::SystemTime;

const PLAN: &str = "Plan(format_version: 1, name: \"Autosaved\", sources: [Source(id: 1)])\n";

/// This process's recovery folder (emptied before each input).
fn folder() -> PathBuf {
    std::env::temp_dir().join(format!("lampwright-fuzz-recovery-{}", std::process::id()))
}

fuzz_target!(|data: &[u8]| {
    let (info, plan) = match data.iter().position(|b| *b == 0) {
        Some(i) => (&data[..i], &data[i + 1..]),
        None => (data, PLAN.as_bytes()),
    };
    let dir = folder();
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("the recovery folder can be made");
    std::fs::write(dir.join("autosave-1-2-3.ron"), plan).expect("write the plan");
    std::fs::write(dir.join("autosave-1-2-3.info"), info).expect("write the info");

    let found = scan(&dir);
    for notice in &found.notices {
        assert!(is_one_line(notice), "notice not one line: {notice:?}");
    }
    let now = SystemTime::now();
    for offer in &found.found {
        if let Some(saved_at) = offer.saved_at {
            assert!(!age_text(saved_at, now).is_empty());
        }
    }
});
