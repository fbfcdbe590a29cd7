//! Autosave and recovery in the real window (`egui_kittest`, headless).
//!
//! A window is "crashed" by dropping it: nothing runs on the way out, the
//! autosave files stay, and the operating system releases the slot's lock,
//! as it does when a process is killed.

use egui::{Key, Modifiers};
use egui_kittest::Harness;
use egui_kittest::kittest::Queryable;
use lampwright::ui::{App, StartOptions};
use lampwright_plan::{Plan, load_plan, save_plan_atomic};
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

/// A user folder with a saved plan, and a data folder for autosaves.
struct Setup {
    _root: tempfile::TempDir,
    user_file: PathBuf,
    recovery: PathBuf,
}

fn setup() -> Setup {
    let root = tempfile::tempdir().expect("temp dir");
    let user_file = root.path().join("shoot.ron");
    let plan = lampwright_plan::default_demo().expect("demo plan");
    save_plan_atomic(&user_file, &plan).expect("save the user's plan");
    Setup {
        recovery: root.path().join("data").join("recovery"),
        user_file,
        _root: root,
    }
}

/// A window on the user's plan that autosaves into the setup's data folder,
/// only when it loses focus (the interval is an hour).
fn window(setup: &Setup) -> Harness<'static, App> {
    let options = StartOptions {
        plan_path: Some(setup.user_file.clone()),
        recovery_dir: Some(setup.recovery.clone()),
        autosave_interval: Duration::from_hours(1),
        ..StartOptions::headless()
    };
    let mut harness = Harness::builder()
        .with_size(egui::vec2(1440.0, 900.0))
        .build_eframe(move |cc| App::new(cc, options, Instant::now()));
    harness.run();
    harness
}

fn lose_focus(harness: &mut Harness<'static, App>) {
    harness.event(egui::Event::WindowFocused(false));
    harness.run();
    harness.event(egui::Event::WindowFocused(true));
    harness.run();
}

/// Edit through the window and let it autosave; returns the edited plan.
fn edit_and_autosave(harness: &mut Harness<'static, App>) -> Plan {
    harness.get_by_label("Add source").click();
    harness.run();
    assert!(harness.state().is_dirty());
    let file = harness.state().autosave_file().expect("autosave is on");
    assert!(!file.exists(), "not yet: the interval has not passed");
    lose_focus(harness);
    assert!(file.exists(), "losing focus autosaves");
    harness.state().plan().clone()
}

fn extension(name: &str) -> String {
    Path::new(name)
        .extension()
        .map(|e| e.to_string_lossy().into_owned())
        .unwrap_or_default()
}

fn autosave_files(dir: &Path) -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(dir)
        .expect("recovery folder")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .filter(|n| n.starts_with("autosave-") && extension(n) != "lock")
        .collect();
    names.sort();
    names
}

#[test]
fn after_a_crash_the_next_start_offers_the_plan_and_restore_reopens_it_unsaved() {
    let setup = setup();
    let original = load_plan(&setup.user_file).expect("user's plan");
    let mut first = window(&setup);
    let edited = edit_and_autosave(&mut first);
    assert_eq!(
        load_plan(&setup.user_file).expect("user's plan"),
        original,
        "autosave never writes the user's file"
    );
    drop(first); // the crash

    let mut second = window(&setup);
    assert_eq!(second.state().recovery_offers().len(), 1);
    second.get_by_label("Restore unsaved work?");
    second.get_by_label_contains("It belongs to");
    second.get_by_label("Restore").click();
    second.run();

    let app = second.state();
    assert_eq!(app.plan(), &edited, "the autosaved plan is back");
    assert_eq!(
        app.path(),
        Some(setup.user_file.as_path()),
        "attached to its file"
    );
    assert!(app.is_dirty(), "restored as unsaved changes");
    assert!(app.recovery_offers().is_empty());
    assert!(second.query_by_label("Restore unsaved work?").is_none());
    assert_eq!(load_plan(&setup.user_file).expect("user's plan"), original);
    // The plan now lives in this window's slot; the old slot is gone.
    let files = autosave_files(&setup.recovery);
    assert_eq!(files.len(), 2, "one plan and its info: {files:?}");
    let own = second.state().autosave_file().expect("autosave is on");
    assert_eq!(load_plan(&own).expect("autosave"), edited);

    // Save writes the user's file and removes the autosave.
    second.key_press_modifiers(Modifiers::COMMAND, Key::S);
    second.run();
    assert!(!second.state().is_dirty());
    assert_eq!(load_plan(&setup.user_file).expect("user's plan"), edited);
    assert!(autosave_files(&setup.recovery).is_empty());
}

#[test]
fn discard_sets_the_autosave_aside_and_keeps_the_opened_plan() {
    let setup = setup();
    let original = load_plan(&setup.user_file).expect("user's plan");
    let mut first = window(&setup);
    let edited = edit_and_autosave(&mut first);
    drop(first);

    let mut second = window(&setup);
    second.get_by_label("Discard").click();
    second.run();
    let app = second.state();
    assert_eq!(app.plan(), &original, "the plan opened at start stays");
    assert!(!app.is_dirty());
    assert!(app.recovery_offers().is_empty());
    let files = autosave_files(&setup.recovery);
    let kept: Vec<&String> = files
        .iter()
        .filter(|n| extension(n) == "discarded" && n.contains(".ron."))
        .collect();
    assert_eq!(kept.len(), 1, "{files:?}");
    assert_eq!(
        load_plan(&setup.recovery.join(kept[0])).expect("discarded plan"),
        edited,
        "nothing is lost: the discarded plan is kept whole"
    );
    drop(second);
    // Not offered again.
    let third = window(&setup);
    assert!(third.state().recovery_offers().is_empty());
}

#[test]
fn an_unreadable_autosave_does_not_block_the_start() {
    let setup = setup();
    std::fs::create_dir_all(&setup.recovery).expect("folder");
    let broken = setup.recovery.join("autosave-7-7-7.ron");
    std::fs::write(&broken, "Plan(format_version: 1, name: \"cut off").expect("write");
    let harness = window(&setup);
    let app = harness.state();
    assert!(app.recovery_offers().is_empty());
    assert!(harness.query_by_label("Restore unsaved work?").is_none());
    let notice = app.notices().last().expect("a notice");
    assert!(notice.is_error && !notice.text.contains('\n'), "{notice:?}");
    assert!(notice.text.contains("set aside"), "{}", notice.text);
    assert!(!broken.exists());
    assert!(setup.recovery.join("autosave-7-7-7.ron.corrupt").exists());
    assert_eq!(
        app.path(),
        Some(setup.user_file.as_path()),
        "the plan opened"
    );
}

#[test]
fn undo_back_to_the_saved_plan_removes_the_autosave() {
    let setup = setup();
    let mut harness = window(&setup);
    edit_and_autosave(&mut harness);
    harness.key_press_modifiers(Modifiers::COMMAND, Key::Z);
    harness.run();
    assert!(!harness.state().is_dirty());
    assert!(autosave_files(&setup.recovery).is_empty());
}

#[test]
fn quitting_and_discarding_changes_leaves_nothing_to_recover() {
    let setup = setup();
    let mut harness = window(&setup);
    edit_and_autosave(&mut harness);
    harness.key_press_modifiers(Modifiers::COMMAND, Key::Q);
    harness.run();
    harness.get_by_label("Unsaved changes");
    harness.get_by_label("Discard changes").click();
    harness.run();
    drop(harness);
    assert!(autosave_files(&setup.recovery).is_empty());
    let next = window(&setup);
    assert!(next.state().recovery_offers().is_empty());
}

#[test]
fn the_interval_autosaves_without_a_focus_change() {
    let setup = setup();
    let options = StartOptions {
        plan_path: Some(setup.user_file.clone()),
        recovery_dir: Some(setup.recovery.clone()),
        autosave_interval: Duration::ZERO,
        ..StartOptions::headless()
    };
    let mut harness = Harness::builder()
        .with_size(egui::vec2(1440.0, 900.0))
        .build_eframe(move |cc| App::new(cc, options, Instant::now()));
    harness.run();
    assert_eq!(
        harness.state().autosave_count(),
        0,
        "a clean plan is not autosaved"
    );
    harness.get_by_label("Add source").click();
    harness.run();
    assert_eq!(harness.state().autosave_count(), 1);
    let file = harness.state().autosave_file().expect("autosave is on");
    assert_eq!(load_plan(&file).expect("autosave"), *harness.state().plan());
}

#[test]
fn headless_windows_do_not_autosave() {
    let harness = Harness::builder()
        .build_eframe(|cc| App::new(cc, StartOptions::headless(), Instant::now()));
    assert!(harness.state().autosave_file().is_none());
}
