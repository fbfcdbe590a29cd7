//! Headless tests of the real window (`egui_kittest`, no display, no GPU):
//! they click through the flows a user follows and check the plan and the
//! evaluation the window shows.

use egui::accesskit::Role;
use egui::{Key, Modifiers};
use egui_kittest::Harness;
use egui_kittest::kittest::Queryable;
use lampwright::ui::{App, StartOptions, catalog, format};
use std::fmt::Write as _;
use std::path::{Path, PathBuf};
use std::sync::Arc;
use std::time::Instant;

fn harness() -> Harness<'static, App> {
    let mut harness = Harness::builder()
        .with_size(egui::vec2(1440.0, 900.0))
        .build_eframe(|cc| App::new(cc, StartOptions::headless(), Instant::now()));
    harness.run();
    harness
}

/// Click the widget with this label and let the window answer.
fn click(harness: &mut Harness<'static, App>, label: &str) {
    harness.get_by_label(label).click();
    harness.run();
}

/// Press a key with modifiers (a shortcut) and let the window answer.
fn press(harness: &mut Harness<'static, App>, modifiers: Modifiers, key: Key) {
    harness.key_press_modifiers(modifiers, key);
    harness.run();
}

/// Replace the text of a text field found by its label.
fn type_into(harness: &mut Harness<'static, App>, label: &str, text: &str) {
    harness
        .get_by_role_and_label(Role::TextInput, label)
        .focus();
    harness.run();
    press(harness, Modifiers::COMMAND, Key::A);
    harness
        .get_by_role_and_label(Role::TextInput, label)
        .type_text(text);
    harness.run();
}

/// A file dropped on the window, as the windowing layer hands it over.
#[derive(Debug)]
struct Dropped(PathBuf);

impl egui::DroppedFile for Dropped {
    fn path(&self) -> &Path {
        &self.0
    }

    fn bytes(&self) -> Result<Vec<u8>, String> {
        std::fs::read(&self.0).map_err(|e| e.to_string())
    }
}

fn drop_file(harness: &mut Harness<'static, App>, path: &Path) {
    harness
        .input_mut()
        .dropped_files
        .push(Arc::new(Dropped(path.to_path_buf())));
    harness.run();
}

#[test]
fn opens_on_the_demo_plan_with_figures() {
    let harness = harness();
    let app = harness.state();
    assert!(!app.plan().sources.is_empty(), "the demo plan has lights");
    assert!(
        !app.plan().subjects.is_empty(),
        "the demo plan has subjects"
    );
    assert!(
        app.evaluation_error().is_none(),
        "demo evaluates: {:?}",
        app.evaluation_error()
    );
    let eval = app.evaluation().expect("evaluation on screen");
    // The CCT readout shows the evaluation's figure, rounded to 10 K.
    harness.get_by_label(&format::cct(eval.light.cct_k));
    // Every subject has its swatch card with ΔE to 0.1.
    for r in &eval.subjects {
        assert!(
            harness
                .query_all_by_label_contains(&format!("ΔE00 {}", format::delta_e(r.de2000)))
                .next()
                .is_some(),
            "ΔE label for {}",
            r.name
        );
    }
}

#[test]
fn add_a_source_then_a_gel_changes_readouts_and_delta_e() {
    let mut harness = harness();
    let before_sources = harness.state().plan().sources.len();
    let before = harness.state().evaluation().expect("evaluation").clone();

    click(&mut harness, "Add source");
    assert_eq!(harness.state().plan().sources.len(), before_sources + 1);

    // Put the first gel of the library on the new source (its card is the last).
    let gel = catalog::builtin()
        .gels
        .first()
        .expect("a built-in gel")
        .clone();
    harness
        .get_all_by_label("Add gel…")
        .last()
        .expect("gel picker")
        .scroll_to_me();
    harness.run();
    harness
        .get_all_by_label("Add gel…")
        .last()
        .expect("gel picker")
        .click();
    harness.run();
    harness
        .get_by_role_and_label(Role::TextInput, "Search")
        .type_text(&gel.name);
    harness.run();
    harness
        .get_by_role_and_label(Role::Button, &gel.name)
        .click();
    harness.run();

    let app = harness.state();
    let new_source = app.plan().sources.last().expect("new source");
    assert_eq!(new_source.gels.len(), 1, "the gel is on the new source");
    let after = app.evaluation().expect("evaluation").clone();
    assert!(
        app.evaluation_error().is_none(),
        "{:?}",
        app.evaluation_error()
    );
    assert_ne!(after.light.cct_k, before.light.cct_k, "the mix CCT moves");
    assert!(
        after
            .subjects
            .iter()
            .zip(&before.subjects)
            .any(|(a, b)| (a.de2000 - b.de2000).abs() > 1e-6),
        "some subject's ΔE changes"
    );
    // The readout strip shows the new figure.
    harness.get_by_label(&format::cct(after.light.cct_k));
}

#[test]
fn undo_returns_the_exact_earlier_plan_and_redo_reapplies() {
    let mut harness = harness();
    let original = harness.state().plan().clone();

    click(&mut harness, "Add source");
    harness
        .get_all_by_label("On")
        .next()
        .expect("on/off")
        .click();
    harness.run();
    let edited = harness.state().plan().clone();
    assert_ne!(edited, original);
    assert_eq!(harness.state().undo_len(), 2);

    press(&mut harness, Modifiers::COMMAND, Key::Z);
    press(&mut harness, Modifiers::COMMAND, Key::Z);
    assert_eq!(
        harness.state().plan(),
        &original,
        "two undos give back the opening plan"
    );

    press(&mut harness, Modifiers::COMMAND | Modifiers::SHIFT, Key::Z);
    press(&mut harness, Modifiers::COMMAND, Key::Y);
    assert_eq!(harness.state().plan(), &edited, "redo reapplies both edits");
}

#[test]
fn a_slider_drag_is_one_undo_step() {
    let mut harness = harness();
    let original = harness.state().plan().clone();
    let slider = harness
        .get_all_by_role(Role::Slider)
        .next()
        .expect("a level slider");
    let rect = slider.rect();
    let start = rect.left_center() + egui::vec2(8.0, 0.0);
    harness.drag_at(start);
    harness.run();
    for step in 1..=6 {
        harness.hover_at(start + egui::vec2(12.0 * step as f32, 0.0));
        harness.run();
    }
    harness.drop_at(start + egui::vec2(72.0, 0.0));
    harness.run();
    assert_ne!(
        harness.state().plan(),
        &original,
        "the drag changed a level"
    );
    assert_eq!(
        harness.state().undo_len(),
        1,
        "the whole drag is one undo step"
    );
    press(&mut harness, Modifiers::COMMAND, Key::Z);
    assert_eq!(harness.state().plan(), &original);
}

#[test]
fn save_then_open_gives_the_same_plan() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("shoot.ron");
    let mut harness = harness();

    click(&mut harness, "Add source");
    let saved = harness.state().plan().clone();

    press(&mut harness, Modifiers::COMMAND | Modifiers::SHIFT, Key::S);
    type_into(&mut harness, "Path", &path.display().to_string());
    click(&mut harness, "Save");
    assert!(
        path.exists(),
        "plan file written; notices: {:?}",
        harness.state().notices()
    );
    assert_eq!(harness.state().path(), Some(path.as_path()));
    assert!(!harness.state().is_dirty());

    // Change the plan, then open the file again: the prompt guards the change.
    click(&mut harness, "Add source");
    assert!(harness.state().is_dirty());
    press(&mut harness, Modifiers::COMMAND, Key::O);
    click(&mut harness, "Discard changes");
    type_into(&mut harness, "Path", &path.display().to_string());
    click(&mut harness, "Open");

    assert_eq!(
        harness.state().plan(),
        &saved,
        "the plan read back equals the plan saved"
    );
    assert!(!harness.state().is_dirty());
}

#[test]
fn new_plan_asks_before_discarding_changes() {
    let mut harness = harness();
    click(&mut harness, "Add source");
    let edited = harness.state().plan().clone();
    press(&mut harness, Modifiers::COMMAND, Key::N);
    harness.get_by_label("Unsaved changes");
    click(&mut harness, "Cancel");
    assert_eq!(harness.state().plan(), &edited, "cancel keeps the plan");
}

#[test]
fn save_in_the_prompt_for_a_plan_without_a_file_saves_then_goes_on() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("first.ron");
    let mut harness = harness();
    click(&mut harness, "Add source");
    let edited = harness.state().plan().clone();
    assert!(harness.state().path().is_none() && harness.state().is_dirty());

    // New plan → "Save" in the prompt → choose a file → the plan is saved,
    // then the new plan opens, as the user asked before the prompt.
    press(&mut harness, Modifiers::COMMAND, Key::N);
    harness.get_by_label("Unsaved changes");
    click(&mut harness, "Save");
    type_into(&mut harness, "Path", &path.display().to_string());
    click(&mut harness, "Save");
    let written = lampwright_plan::load_plan(&path).expect("the edited plan was saved");
    assert_eq!(written, edited, "the file holds the plan as it was edited");
    assert_eq!(
        harness.state().plan().sources.len(),
        1,
        "then the new plan opened"
    );
    assert!(harness.state().path().is_none() && !harness.state().is_dirty());

    // Cancelling the file browser cancels the whole request: nothing opens.
    click(&mut harness, "Add source");
    let edited = harness.state().plan().clone();
    press(&mut harness, Modifiers::COMMAND, Key::N);
    click(&mut harness, "Save");
    click(&mut harness, "Cancel");
    assert_eq!(harness.state().plan(), &edited, "cancel keeps the plan");
    assert!(harness.state().is_dirty());
}

#[test]
fn a_malformed_csv_shows_an_error_and_changes_nothing() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("broken.csv");
    std::fs::write(&path, "wavelength,value\n400,0.5\n410,not-a-number\n420\n").expect("write");
    let mut harness = harness();
    let before = harness.state().plan().clone();

    drop_file(&mut harness, &path);
    harness.get_by_label("Import a spectral table");
    click(&mut harness, "Add to plan");

    assert_eq!(harness.state().plan(), &before, "nothing changed");
    let notice = harness.state().notices().last().expect("a message");
    assert!(notice.is_error, "shown as an error: {notice:?}");
    assert!(
        notice.text.contains("broken.csv"),
        "names the file: {}",
        notice.text
    );
    // The message is on screen (in the dialog and the status line).
    assert!(
        harness
            .query_all_by_label_contains("Could not import")
            .next()
            .is_some()
    );
}

#[test]
fn a_plan_that_cannot_be_evaluated_shows_a_banner_and_keeps_the_last_figures() {
    let mut harness = harness();
    let good = harness.state().evaluation().expect("evaluation").clone();
    let id = harness.state().plan().sources[0].id;
    harness
        .state_mut()
        .push_command(lampwright::ui::command::Command::Source(
            id,
            lampwright::ui::command::SourceEdit::Lamp(lampwright_plan::LampRef::Library(
                "no-such-lamp".into(),
            )),
        ));
    harness.run();
    let app = harness.state();
    assert!(
        app.evaluation_error()
            .is_some_and(|e| e.contains("no-such-lamp")),
        "{:?}",
        app.evaluation_error()
    );
    assert_eq!(
        app.evaluation(),
        Some(&good),
        "the last good evaluation stays"
    );
    harness.get_by_label("This plan cannot be evaluated");
    // Undo clears the error.
    press(&mut harness, Modifiers::COMMAND, Key::Z);
    assert!(harness.state().evaluation_error().is_none());
}

#[test]
fn swatch_sheet_exports_as_png() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("sheet.png");
    let mut harness = harness();
    click(&mut harness, "File");
    harness.get_by_label("Export").hover();
    harness.run();
    click(&mut harness, "Swatch sheet (PNG)…");
    type_into(&mut harness, "Path", &path.display().to_string());
    click(&mut harness, "Export");
    let img = image::open(&path).expect("a PNG was written").to_rgb8();
    let eval = harness.state().evaluation().expect("evaluation");
    let first = eval.subjects[0].eye_rgb8;
    assert!(
        img.pixels().any(|p| p.0 == first),
        "the first eye colour is on the sheet"
    );
}

#[test]
fn new_plan_starts_with_a_key_and_a_grey_card_and_evaluates() {
    let mut harness = harness();
    press(&mut harness, Modifiers::COMMAND, Key::N);
    let app = harness.state();
    assert_eq!(app.plan().sources.len(), 1);
    assert!(!app.plan().subjects.is_empty());
    assert!(
        app.evaluation_error().is_none(),
        "{:?}",
        app.evaluation_error()
    );
    let eval = app.evaluation().expect("evaluation");
    // A 3200 K black body reads as 3200 K (to 10 K) on the strip.
    harness.get_by_label(&format::cct(eval.light.cct_k));
    assert_eq!(format::cct(eval.light.cct_k), "3200 K");
    assert_eq!(app.undo_len(), 0, "a new plan starts a new history");
}

#[test]
fn report_exports_as_html_through_the_plan_crate() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("report.html");
    let mut harness = harness();
    click(&mut harness, "File");
    harness.get_by_label("Export").hover();
    harness.run();
    click(&mut harness, "Report (HTML)…");
    type_into(&mut harness, "Path", &path.display().to_string());
    click(&mut harness, "Export");
    let html = std::fs::read_to_string(&path).expect("report written");
    let plan_name = harness.state().plan().name.clone();
    assert!(
        html.contains("<html") || html.contains("<!DOCTYPE"),
        "an HTML page"
    );
    assert!(html.contains(&plan_name), "names the plan");
}

#[test]
fn importing_a_good_subject_csv_adds_a_subject_and_undo_removes_it() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("swatch.csv");
    let mut text = String::from("wavelength_nm,Painted wall\n");
    for wl in (380..=780).step_by(10) {
        let r = 0.2 + 0.5 * f64::from(wl - 380) / 400.0;
        writeln!(text, "{wl},{r:.4}").expect("write to a string");
    }
    std::fs::write(&path, text).expect("write");
    let mut harness = harness();
    let before = harness.state().plan().clone();

    drop_file(&mut harness, &path);
    click(&mut harness, "Subject (reflectance)");
    click(&mut harness, "Add to plan");

    let app = harness.state();
    assert_eq!(
        app.plan().subjects.len(),
        before.subjects.len() + 1,
        "{:?}",
        app.notices().last()
    );
    assert_eq!(
        app.plan().custom.subjects.len(),
        before.custom.subjects.len() + 1
    );
    assert!(
        app.evaluation_error().is_none(),
        "{:?}",
        app.evaluation_error()
    );
    let eval = app.evaluation().expect("evaluation");
    assert!(
        eval.subjects.iter().any(|r| &*r.name == "swatch"),
        "named after the file"
    );
    press(&mut harness, Modifiers::COMMAND, Key::Z);
    assert_eq!(harness.state().plan(), &before);
}

#[test]
fn the_advisor_runs_in_the_background_and_a_suggestion_applies_as_one_undo_step() {
    let mut harness = harness();
    let original = harness.state().plan().clone();
    let original_rf = harness.state().evaluation().and_then(|e| e.light.tm30_rf);
    click(&mut harness, "Advisor");
    // The café demo is already close for camera fidelity; rendering quality has room.
    harness
        .get_by_role_and_label(Role::ComboBox, "Goal")
        .click();
    harness.run();
    click(&mut harness, "Rendering quality (TM-30)");
    harness.get_by_label("Suggest changes").click();
    let started = Instant::now();
    while harness.query_by_label("Apply 1").is_none()
        && harness.query_by_label_contains("Nothing better").is_none()
        && harness.query_by_label_contains("could not run").is_none()
    {
        assert!(started.elapsed().as_secs() < 600, "the advisor answers");
        std::thread::sleep(std::time::Duration::from_millis(50));
        harness.step();
    }
    harness.run();
    assert!(
        harness.query_by_label_contains("could not run").is_none(),
        "{:?}",
        harness.state().notices()
    );
    assert!(
        harness.query_by_label("Apply 1").is_some(),
        "the demo plan's rendering quality has room for improvement: {:?}",
        harness.state().notices()
    );
    {
        click(&mut harness, "Apply 1");
        assert_ne!(
            harness.state().plan(),
            &original,
            "the suggestion changed the plan"
        );
        let rf_before = original_rf;
        let rf_after = harness.state().evaluation().and_then(|e| e.light.tm30_rf);
        assert!(
            rf_after > rf_before,
            "Rf rises: {rf_before:?} -> {rf_after:?}"
        );
        assert_eq!(
            harness.state().undo_len(),
            1,
            "one suggestion, one undo step"
        );
        // The answer now belongs to an earlier plan: it can no longer be applied.
        harness.get_by_label_contains("earlier version of the plan");
        press(&mut harness, Modifiers::COMMAND, Key::Z);
        assert_eq!(harness.state().plan(), &original);
    }
}

#[test]
fn every_demo_plan_opens_from_the_menu_and_evaluates() {
    let mut harness = harness();
    let names: Vec<String> = lampwright_plan::demo_plans()
        .into_iter()
        .map(|p| p.name)
        .collect();
    assert!(names.len() >= 3, "three demo plans");
    for name in &names {
        click(&mut harness, "File");
        harness.get_by_label("Open a demo plan").hover();
        harness.run();
        harness.get_by_role_and_label(Role::Button, name).click();
        harness.run();
        let app = harness.state();
        assert_eq!(&app.plan().name, name);
        assert!(
            app.evaluation_error().is_none(),
            "{name}: {:?}",
            app.evaluation_error()
        );
        assert!(
            !app.is_dirty(),
            "a freshly opened demo has no unsaved changes"
        );
        let eval = app.evaluation().expect("evaluation");
        assert_eq!(eval.subjects.len(), app.plan().subjects.len());
    }
}

#[test]
fn the_kit_gel_list_is_edited_in_the_advisor_panel() {
    let mut harness = harness();
    // The café demo's kit lists six gels.
    assert_eq!(harness.state().plan().kit.gels.len(), 6);
    click(&mut harness, "Advisor");
    harness
        .get_by_label_contains("The kit: 6 gels from the library")
        .click();
    harness.run();
    // Take the ND 0.3 off the truck: one undo step, the rest stays.
    click(&mut harness, "ND 0.3 (one stop)");
    let kit = &harness.state().plan().kit;
    assert_eq!(kit.gels.len(), 5);
    assert!(!kit.gels.iter().any(|g| g == "nd-03"));
    press(&mut harness, Modifiers::COMMAND, Key::Z);
    assert!(harness.state().plan().kit.gels.iter().any(|g| g == "nd-03"));
    // Every gel in the library: an empty list, as plan files say it.
    click(&mut harness, "Every gel in the library");
    assert!(harness.state().plan().kit.gels.is_empty());
}
