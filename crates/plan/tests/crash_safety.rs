//! Crash safety of `save_plan_atomic`: a child process saves in a loop and is
//! killed (SIGKILL on Unix) at random moments, many times; after every kill
//! the plan file must hold one of the plans the child was writing, complete.
//!
//! The child is this same test binary, re-executed with an environment
//! variable that turns `child_saves_forever` into the saving loop.

use lampwright_plan::{CustomSpectrum, Plan, load_plan, save_plan_atomic};
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

const CHILD_ENV: &str = "LAMPWRIGHT_CRASH_TEST_TARGET";
const KILLS: usize = 60;

/// Two large plans (a few hundred kB each, so saves take long enough to be
/// interrupted mid-write), told apart by name.
fn candidate(which: usize) -> Plan {
    let n = 3_000;
    let wl: Vec<f64> = (0..n).map(|i| 380.0 + f64::from(i) * 0.04).collect();
    let mut plan = Plan {
        name: format!("Candidate {which}"),
        ..Plan::default()
    };
    for k in 0..3 {
        plan.custom.lamps.push(CustomSpectrum {
            id: format!("lamp-{k}"),
            name: format!("Lamp {k} of candidate {which}"),
            wavelengths_nm: wl.clone(),
            values: wl
                .iter()
                .map(|w| (w * (1.0 + which as f64) * 0.001).sin().abs())
                .collect(),
            note: String::new(),
        });
    }
    plan
}

/// The saving loop, run only in the child process.
#[test]
fn child_saves_forever() {
    let Some(target) = std::env::var_os(CHILD_ENV) else {
        return; // normal test run: nothing to do here
    };
    let target = PathBuf::from(target);
    let plans = [candidate(0), candidate(1)];
    let ready = target.with_extension("ready");
    let mut i = 0usize;
    loop {
        save_plan_atomic(&target, &plans[i % 2]).unwrap();
        if i == 1 {
            std::fs::write(&ready, b"").unwrap();
        }
        i += 1;
    }
}

fn wait_for(path: &Path, timeout: Duration) -> bool {
    let start = Instant::now();
    while start.elapsed() < timeout {
        if path.exists() {
            return true;
        }
        std::thread::sleep(Duration::from_millis(2));
    }
    false
}

#[test]
fn killing_a_saver_never_leaves_a_torn_plan() {
    if std::env::var_os(CHILD_ENV).is_some() {
        return;
    }
    let dir = tempfile::tempdir().unwrap();
    let target = dir.path().join("plan.ron");
    let plans = [candidate(0), candidate(1)];
    save_plan_atomic(&target, &plans[0]).unwrap();
    let exe = std::env::current_exe().unwrap();
    // A simple linear congruential generator picks the kill delays, so the
    // schedule is reproducible without extra dependencies.
    let mut seed: u64 = 0x5eed;
    for round in 0..KILLS {
        let ready = target.with_extension("ready");
        let _ = std::fs::remove_file(&ready);
        let mut child = Command::new(&exe)
            .args([
                "child_saves_forever",
                "--exact",
                "--nocapture",
                "--test-threads=1",
            ])
            .env(CHILD_ENV, &target)
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        assert!(
            wait_for(&ready, Duration::from_mins(1)),
            "round {round}: child never saved"
        );
        seed = seed
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        let delay_us = (seed >> 33) % 20_000;
        std::thread::sleep(Duration::from_micros(delay_us));
        child.kill().unwrap(); // SIGKILL on Unix: no destructors, no flushing
        child.wait().unwrap();
        let loaded = load_plan(&target).unwrap_or_else(|e| panic!("round {round}: {e}"));
        assert!(
            plans.contains(&loaded),
            "round {round}: the file holds neither plan ({})",
            loaded.name
        );
    }
    // Interrupted saves may leave their temporary files behind (never the
    // plan itself); they are hidden and named after the plan.
    for entry in std::fs::read_dir(dir.path()).unwrap() {
        let name = entry.unwrap().file_name().to_string_lossy().into_owned();
        assert!(
            name == "plan.ron" || name == "plan.ready" || name.starts_with(".plan.ron.tmp-"),
            "unexpected file {name}"
        );
    }
}
