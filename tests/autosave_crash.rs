//! Crash safety of autosave: a child process drives the real window
//! (headless) through edits, autosaves (on focus loss) and saves (Ctrl+S) in
//! a loop, and is killed with SIGKILL at seeded random moments, many times.
//! After every kill:
//!
//! - the user's plan file loads and is the plan of the last logged save, or
//!   of the save that was under way;
//! - the autosave, if present, loads, equals the last logged autosave (or the
//!   one under way), and its info names the user's file;
//! - the recovery scan of the next start offers exactly that plan.
//!
//! The child appends a line to a log after each completed autosave or save
//! and flushes it to disk, so the parent knows what completed. Its edits are
//! a function of the step number and the plan, so the parent replays them
//! with the window's own command function to know each step's plan.
//!
//! The child is this test binary, re-run with an environment variable that
//! turns `child_edits_autosaves_and_saves_forever` into the loop.

use egui::{Key, Modifiers};
use egui_kittest::Harness;
use lampwright::ui::command::{self, Command, SourceEdit};
use lampwright::ui::{App, StartOptions, recovery};
use lampwright_plan::{CustomSpectrum, GelLayer, GelRef, Plan, load_plan, save_plan_atomic};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::Stdio;
use std::time::{Duration, Instant};

const CHILD_ENV: &str = "LAMPWRIGHT_AUTOSAVE_CRASH_DIR";
const KILLS: usize = 200;
/// Every this many steps, the step ends with a save.
const SAVE_EVERY: u64 = 4;

/// The user's plan at the start: a key light on two subjects (cheap to
/// evaluate) carrying four embedded lamps of 10 000 points each (about
/// 1 MB of text), so that writes take a good share of the child's time and
/// kills often land inside one.
fn initial_plan() -> Plan {
    let mut plan = lampwright::ui::starter_plan();
    let wavelengths_nm: Vec<f64> = (0..10_000).map(|i| 380.0 + f64::from(i) * 0.04).collect();
    for k in 0..4 {
        let values = wavelengths_nm
            .iter()
            .map(|w| 0.5 + 0.4 * (w * 0.05 + f64::from(k)).sin())
            .collect();
        plan.custom.lamps.push(CustomSpectrum {
            id: format!("bulk-{k}"),
            name: format!("Bulk lamp {k}"),
            wavelengths_nm: wavelengths_nm.clone(),
            values,
            note: "makes the plan file large".into(),
        });
    }
    plan
}

/// The edits of one step: a new plan name (so every step's plan differs), a
/// level on the first source, and a gel put on or taken off.
fn step_commands(plan: &Plan, step: u64) -> Vec<Command> {
    let mut commands = vec![Command::PlanName(format!("Crash test, step {step}"))];
    if let Some(source) = plan.sources.first() {
        let lux = 50.0 + ((step * 7919) % 2000) as f64;
        commands.push(Command::Source(source.id, SourceEdit::LevelLux(lux)));
        let edit = if source.gels.is_empty() || step.is_multiple_of(3) {
            SourceEdit::AddGel(GelLayer {
                gel: GelRef::Library("cto-full".into()),
                strength: 0.5,
            })
        } else {
            SourceEdit::RemoveGel(0)
        };
        commands.push(Command::Source(source.id, edit));
    }
    commands
}

struct Paths {
    user_file: PathBuf,
    recovery: PathBuf,
    log: PathBuf,
}

fn paths(root: &Path) -> Paths {
    Paths {
        user_file: root.join("user").join("shoot.ron"),
        recovery: root.join("data").join("recovery"),
        log: root.join("log.txt"),
    }
}

/// The loop, run only in the child process.
#[test]
fn child_edits_autosaves_and_saves_forever() {
    let Some(root) = std::env::var_os(CHILD_ENV) else {
        return; // normal test run: nothing to do here
    };
    let paths = paths(Path::new(&root));
    let options = StartOptions {
        plan_path: Some(paths.user_file.clone()),
        recovery_dir: Some(paths.recovery.clone()),
        autosave_interval: Duration::from_hours(1),
        ..StartOptions::headless()
    };
    let mut harness = Harness::builder()
        .with_size(egui::vec2(1024.0, 700.0))
        .build_eframe(move |cc| App::new(cc, options, Instant::now()));
    harness.run();
    let mut log = std::fs::OpenOptions::new()
        .create(true)
        .append(true)
        .open(&paths.log)
        .unwrap();
    let mut logged = |line: String| {
        log.write_all(line.as_bytes()).unwrap();
        log.sync_data().unwrap();
    };
    for step in 0.. {
        let commands = step_commands(harness.state().plan(), step);
        for c in commands {
            harness.state_mut().push_command(c);
        }
        harness.run();
        let before = harness.state().autosave_count();
        harness.event(egui::Event::WindowFocused(false));
        harness.run();
        assert_eq!(
            harness.state().autosave_count(),
            before + 1,
            "{:?}",
            harness.state().notices()
        );
        logged(format!("autosave {step}\n"));
        harness.event(egui::Event::WindowFocused(true));
        harness.run();
        if step % SAVE_EVERY == SAVE_EVERY - 1 {
            harness.key_press_modifiers(Modifiers::COMMAND, Key::S);
            harness.run();
            assert!(
                !harness.state().is_dirty(),
                "{:?}",
                harness.state().notices()
            );
            logged(format!("save {step}\n"));
        }
    }
}

/// The plan after each step, replayed with the window's command function.
struct Replay {
    plans: Vec<Plan>,
}

impl Replay {
    fn plan(&mut self, step: u64) -> &Plan {
        let step = step as usize;
        while self.plans.len() <= step + 1 {
            let mut plan = self.plans.last().expect("start").clone();
            let n = self.plans.len() as u64 - 1;
            for c in step_commands(&plan, n) {
                // A refused command leaves the plan as it was, in the window too.
                let _ = command::apply(&mut plan, c);
            }
            self.plans.push(plan);
        }
        &self.plans[step + 1]
    }
}

/// What the child completed, from its log (a torn last line is ignored).
#[derive(Debug, Clone, Copy, PartialEq)]
enum Event {
    Autosave(u64),
    Save(u64),
}

fn read_log(path: &Path) -> Vec<Event> {
    let text = std::fs::read_to_string(path).unwrap_or_default();
    let complete = text.rfind('\n').map_or("", |end| &text[..=end]);
    complete
        .lines()
        .map(|line| {
            let (kind, n) = line.split_once(' ').expect("log line");
            let n: u64 = n.parse().expect("step number");
            match kind {
                "autosave" => Event::Autosave(n),
                "save" => Event::Save(n),
                other => panic!("log line {other}"),
            }
        })
        .collect()
}

/// The autosaved plans in the recovery folder (not the set-aside ones).
fn autosaves(dir: &Path) -> Vec<PathBuf> {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return Vec::new();
    };
    entries
        .map(|e| e.expect("entry").path())
        .filter(|p| {
            let name = p.file_name().unwrap_or_default().to_string_lossy();
            name.starts_with("autosave-") && p.extension().is_some_and(|e| e == "ron")
        })
        .collect()
}

/// How many files in `dir` start with `prefix`.
fn count_prefixed(dir: &Path, prefix: &str) -> usize {
    std::fs::read_dir(dir).map_or(0, |entries| {
        entries
            .filter(|e| {
                e.as_ref()
                    .is_ok_and(|e| e.file_name().to_string_lossy().starts_with(prefix))
            })
            .count()
    })
}

fn wait_for_first_line(log: &Path, child: &mut std::process::Child) {
    let start = Instant::now();
    while read_log(log).is_empty() {
        if let Ok(Some(status)) = child.try_wait() {
            panic!("the child stopped before its first autosave: {status}");
        }
        assert!(
            start.elapsed() < Duration::from_mins(5),
            "the child never autosaved"
        );
        std::thread::sleep(Duration::from_millis(5));
    }
}

/// What may be on disk after the last logged event, given that the next one
/// may have been under way: (user's file candidates, autosave candidates;
/// `None` = no autosave).
fn allowed(
    events: &[Event],
    replay: &mut Replay,
    initial: &Plan,
) -> (Vec<Plan>, Vec<Option<Plan>>) {
    let last_save = events.iter().rev().find_map(|e| match e {
        Event::Save(n) => Some(*n),
        Event::Autosave(_) => None,
    });
    let saved = last_save.map_or_else(|| initial.clone(), |n| replay.plan(n).clone());
    match events.last() {
        None => (vec![saved], vec![None, Some(replay.plan(0).clone())]),
        Some(Event::Autosave(n)) if n % SAVE_EVERY == SAVE_EVERY - 1 => {
            // A save was next: it writes the user's file, then the autosave goes.
            let now = replay.plan(*n).clone();
            (vec![saved, now.clone()], vec![Some(now), None])
        }
        Some(Event::Autosave(n)) => (
            vec![saved],
            vec![
                Some(replay.plan(*n).clone()),
                Some(replay.plan(n + 1).clone()),
            ],
        ),
        Some(Event::Save(n)) => (vec![saved], vec![None, Some(replay.plan(n + 1).clone())]),
    }
}

#[test]
fn killing_the_window_never_loses_the_saved_file_nor_the_last_autosave() {
    if std::env::var_os(CHILD_ENV).is_some() {
        return;
    }
    let initial = initial_plan();
    let mut replay = Replay {
        plans: vec![initial.clone()],
    };
    let exe = std::env::current_exe().unwrap();
    // A linear congruential generator picks the delays: reproducible, no
    // extra dependency.
    let mut seed: u64 = 0xa5_70_5a_7e;
    let mut longest_log = 0;
    let mut interrupted_autosaves = 0;
    let mut interrupted_saves = 0;
    let mut autosave_seen = 0;
    for round in 0..KILLS {
        let root = tempfile::tempdir().unwrap();
        let paths = paths(root.path());
        std::fs::create_dir_all(paths.user_file.parent().unwrap()).unwrap();
        save_plan_atomic(&paths.user_file, &initial).unwrap();
        let mut child = std::process::Command::new(&exe)
            .args([
                "child_edits_autosaves_and_saves_forever",
                "--exact",
                "--nocapture",
                "--test-threads=1",
            ])
            .env(CHILD_ENV, root.path())
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        wait_for_first_line(&paths.log, &mut child);
        seed = seed
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        let delay_us = (seed >> 33) % 800_000;
        std::thread::sleep(Duration::from_micros(delay_us));
        child.kill().unwrap(); // SIGKILL on Unix: no destructors, no flushing
        child.wait().unwrap();

        let events = read_log(&paths.log);
        longest_log = longest_log.max(events.len());
        let (user_ok, autosave_ok) = allowed(&events, &mut replay, &initial);
        let user = load_plan(&paths.user_file)
            .unwrap_or_else(|e| panic!("round {round}: the user's file: {e}"));
        assert!(
            user_ok.contains(&user),
            "round {round}: the user's file holds \"{}\" after {:?}",
            user.name,
            events.last()
        );
        let files = autosaves(&paths.recovery);
        assert!(files.len() <= 1, "round {round}: {files:?}");
        let on_disk = files
            .first()
            .map(|f| load_plan(f).unwrap_or_else(|e| panic!("round {round}: the autosave: {e}")));
        assert!(
            autosave_ok.contains(&on_disk),
            "round {round}: the autosave holds {:?} after {:?}",
            on_disk.as_ref().map(|p| &p.name),
            events.last()
        );
        // Temporary files show that the kill landed inside a write.
        interrupted_autosaves += usize::from(count_prefixed(&paths.recovery, ".autosave-") > 0);
        interrupted_saves +=
            usize::from(count_prefixed(paths.user_file.parent().unwrap(), ".shoot.ron.tmp-") > 0);
        // The next start offers exactly that plan, attached to the user's file,
        // and tidies the temporary files.
        let scan = recovery::scan(&paths.recovery);
        assert!(scan.notices.is_empty(), "round {round}: {:?}", scan.notices);
        match &on_disk {
            Some(plan) => {
                autosave_seen += 1;
                assert_eq!(scan.found.len(), 1, "round {round}");
                assert_eq!(&scan.found[0].plan, plan, "round {round}");
                assert_eq!(
                    scan.found[0].origin.as_deref(),
                    Some(paths.user_file.as_path()),
                    "round {round}: the info names the user's file"
                );
            }
            None => assert!(scan.found.is_empty(), "round {round}"),
        }
        assert_eq!(
            count_prefixed(&paths.recovery, ".autosave-"),
            0,
            "round {round}"
        );
    }
    // The schedule reached past the first save and found autosaves to check.
    assert!(
        longest_log > 2 * SAVE_EVERY as usize,
        "longest log {longest_log}"
    );
    assert!(autosave_seen > KILLS / 4, "autosaves seen {autosave_seen}");
    eprintln!(
        "{KILLS} kills; longest log {longest_log} events; {autosave_seen} autosaves checked; \
         {interrupted_autosaves} kills inside an autosave write, {interrupted_saves} inside a save"
    );
}
