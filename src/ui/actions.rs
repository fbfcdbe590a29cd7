//! File and window actions (new, open, save, import, export, undo, quit)
//! and the menu bar that asks for them.

use super::app::App;
use super::dialogs::{Browser, CsvImport, Dialog, Purpose};
use super::export::{self, ReportFormat};
use super::prefs::Prefs;
use super::upstream;
use super::view::CentralView;
use super::widgets::PanelCtx;
use lampwright_plan::{LibraryKind, Plan};
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

/// A desktop file dialog that answers faster than this did not show: no
/// portal is running (a person cannot cancel that fast).
const NO_DIALOG_THRESHOLD: Duration = Duration::from_millis(250);

/// Something the user asked for that is not an edit of the plan.
#[derive(Debug, Clone, PartialEq)]
pub enum Action {
    /// Start a new plan.
    New,
    /// Open a built-in demo plan (by its position in the demo list).
    OpenDemo(usize),
    /// Choose a plan file to open.
    Open,
    /// Open this plan file.
    OpenPath(PathBuf),
    /// Save to the current file (or ask where).
    Save,
    /// Choose where to save.
    SaveAs,
    /// Save to this file.
    SaveTo(PathBuf),
    /// Choose a spectral CSV to import (optionally as a given kind).
    Import(Option<LibraryKind>),
    /// Ask what this CSV is, then import it.
    ImportPath(PathBuf, Option<LibraryKind>),
    /// A file was dropped on the window.
    Dropped(PathBuf),
    /// Choose where to write the swatch sheet.
    ExportSheet,
    /// Write the swatch sheet PNG here.
    ExportSheetTo(PathBuf),
    /// Choose where to write a report.
    ExportReport(ReportFormat),
    /// Write a report here.
    ExportReportTo(PathBuf, ReportFormat),
    /// Ask the advisor for suggestions (runs in the background).
    Advise,
    /// Undo.
    Undo,
    /// Redo.
    Redo,
    /// Close the window (asks about unsaved changes).
    Quit,
    /// Close the window without asking.
    ForceQuit,
}

impl Action {
    /// Whether the action would throw away the plan on screen.
    fn discards_plan(&self) -> bool {
        matches!(
            self,
            Action::New | Action::OpenDemo(_) | Action::Open | Action::OpenPath(_) | Action::Quit
        )
    }
}

/// The menu bar.
pub fn menu_bar(
    ui: &mut egui::Ui,
    cx: &mut PanelCtx<'_>,
    prefs: &mut Prefs,
    undo_len: usize,
    redo_len: usize,
) {
    egui::MenuBar::new().ui(ui, |ui| {
        ui.menu_button("File", |ui| {
            if ui.button("New plan        Ctrl+N").clicked() {
                cx.actions.push(Action::New);
            }
            if ui.button("Open…           Ctrl+O").clicked() {
                cx.actions.push(Action::Open);
            }
            ui.menu_button("Open recent", |ui| {
                if prefs.recent_files.is_empty() {
                    ui.label(super::theme::caption("no recent plans"));
                }
                for path in &prefs.recent_files {
                    if ui.button(path.display().to_string()).clicked() {
                        cx.actions.push(Action::OpenPath(path.clone()));
                    }
                }
            });
            ui.menu_button("Open a demo plan", |ui| {
                for (i, name) in upstream::demo_names().iter().enumerate() {
                    if ui.button(name).clicked() {
                        cx.actions.push(Action::OpenDemo(i));
                    }
                }
            });
            ui.separator();
            if ui.button("Save            Ctrl+S").clicked() {
                cx.actions.push(Action::Save);
            }
            if ui.button("Save as…        Ctrl+Shift+S").clicked() {
                cx.actions.push(Action::SaveAs);
            }
            ui.separator();
            if ui.button("Import spectrum (CSV)…").clicked() {
                cx.actions.push(Action::Import(None));
            }
            ui.menu_button("Export", |ui| {
                if ui.button("Swatch sheet (PNG)…").clicked() {
                    cx.actions.push(Action::ExportSheet);
                }
                for format in ReportFormat::ALL {
                    if ui
                        .button(format!("Report ({})…", export::report_label(format)))
                        .clicked()
                    {
                        cx.actions.push(Action::ExportReport(format));
                    }
                }
            });
            ui.separator();
            ui.checkbox(&mut prefs.system_dialogs, "Use the desktop's file dialogs");
            ui.separator();
            if ui.button("Quit            Ctrl+Q").clicked() {
                cx.actions.push(Action::Quit);
            }
        });
        ui.menu_button("Edit", |ui| {
            if ui
                .add_enabled(
                    undo_len > 0,
                    egui::Button::new(format!("Undo ({undo_len})   Ctrl+Z")),
                )
                .clicked()
            {
                cx.actions.push(Action::Undo);
            }
            if ui
                .add_enabled(
                    redo_len > 0,
                    egui::Button::new(format!("Redo ({redo_len})   Ctrl+Shift+Z")),
                )
                .clicked()
            {
                cx.actions.push(Action::Redo);
            }
        });
        ui.menu_button("View", |ui| {
            ui.checkbox(&mut prefs.show_editor, "Plan editor");
            ui.checkbox(&mut prefs.show_readouts, "Readouts");
            ui.checkbox(&mut prefs.show_plots, "Plots");
        });
        ui.menu_button("Help", |ui| {
            if ui.button("Methods & cautions").clicked() {
                cx.view.central = CentralView::Methods;
            }
        });
        ui.separator();
        // The plan's name, editable in place.
        let label = ui.label(super::theme::caption("Plan"));
        let mut name = cx.plan.name.clone();
        let response = ui
            .add(egui::TextEdit::singleline(&mut name).desired_width(260.0))
            .labelled_by(label.id);
        cx.track_focus(&response);
        if response.changed() {
            cx.push(super::command::Command::PlanName(name));
        }
    });
}

impl App {
    /// Run one action.
    pub(super) fn run_action(&mut self, ctx: &egui::Context, action: Action) {
        if action.discards_plan() && self.is_dirty() {
            self.dialog = Some(Dialog::Unsaved { then: action });
            return;
        }
        self.run_action_unchecked(ctx, action);
    }

    /// Run one action without asking about unsaved changes.
    pub(super) fn run_action_unchecked(&mut self, ctx: &egui::Context, action: Action) {
        // An action waiting for a first save goes on only after that save:
        // anything else the user does meanwhile drops it.
        if !matches!(action, Action::SaveTo(_)) {
            self.after_save = None;
        }
        match action {
            Action::New => {
                self.replace_plan(starter_plan(), None);
                self.notify("New plan: a 3200 K key on an 18 % grey card and a mid skin tone");
            }
            Action::OpenDemo(i) => match lampwright_plan::demo_plans().into_iter().nth(i) {
                Some(plan) => {
                    let name = plan.name.clone();
                    self.replace_plan(plan, None);
                    self.notify(format!("Opened the demo plan \"{name}\" (invented data)"));
                }
                None => self.notify_error("That demo plan could not be read"),
            },
            Action::Open => self.choose(Purpose::OpenPlan),
            Action::OpenPath(path) => self.open_path(&path),
            Action::Save => match self.path.clone() {
                Some(path) => self.save_to(&path),
                None => self.choose(Purpose::SavePlan),
            },
            Action::SaveAs => self.choose(Purpose::SavePlan),
            Action::SaveTo(path) => {
                self.save_to(&path);
                let next = self.after_save.take();
                if let Some(next) = next.filter(|_| !self.is_dirty()) {
                    self.run_action_unchecked(ctx, next);
                }
            }
            Action::Import(kind) => self.choose(Purpose::ImportCsv(kind)),
            Action::ImportPath(path, kind) => {
                self.dialog = Some(Dialog::CsvKind(CsvImport::new(path, kind)));
            }
            Action::Dropped(path) => {
                let ext = path.extension().map(|e| e.to_string_lossy().to_lowercase());
                match ext.as_deref() {
                    Some("ron") => self.run_action(ctx, Action::OpenPath(path)),
                    Some("csv" | "txt" | "tsv") => {
                        self.dialog = Some(Dialog::CsvKind(CsvImport::new(path, None)));
                    }
                    _ => self.notify_error(format!(
                        "{}: drop a plan (.ron) or a spectral table (.csv)",
                        path.display()
                    )),
                }
            }
            Action::ExportSheet => self.choose(Purpose::ExportSheet),
            Action::ExportSheetTo(path) => self.export_sheet(&path),
            Action::ExportReport(format) => self.choose(Purpose::ExportReport(format)),
            Action::ExportReportTo(path, format) => self.export_report(&path, format),
            Action::Advise => self.advisor.start(&self.plan),
            Action::Undo => self.undo(),
            Action::Redo => self.redo(),
            Action::Quit | Action::ForceQuit => {
                // Reached with a clean plan or after "Discard changes".
                self.finish_autosave();
                self.allow_close = true;
                ctx.send_viewport_cmd(egui::ViewportCommand::Close);
            }
        }
    }

    /// Open a plan file, reporting errors in the window.
    pub fn open_path(&mut self, path: &Path) {
        match upstream::load_plan(path) {
            Ok(plan) => {
                self.replace_plan(plan, Some(path.to_path_buf()));
                self.prefs.remember_file(path);
                self.notify(format!("Opened {}", path.display()));
            }
            Err(err) => self.notify_error(format!("Could not open the plan: {err}")),
        }
    }

    /// Save the plan to a file, reporting errors in the window.
    pub fn save_to(&mut self, path: &Path) {
        let path = with_extension(path, "ron");
        match upstream::save_plan(&path, &self.plan) {
            Ok(()) => {
                self.saved = self.plan.clone();
                self.force_dirty = false;
                self.prefs.remember_file(&path);
                self.notify(format!("Saved {}", path.display()));
                self.path = Some(path);
            }
            Err(err) => self.notify_error(format!("Could not save the plan: {err}")),
        }
    }

    /// Import a spectral table into the plan as a lamp, gel, subject or camera.
    /// On error the plan is unchanged and the message shows in the window.
    pub fn import_csv(
        &mut self,
        path: &Path,
        kind: LibraryKind,
        name: &str,
        group: &str,
    ) -> Result<(), String> {
        match upstream::import_csv(&self.plan, path, kind, name, group) {
            Ok((plan, what)) => {
                self.push_command(super::command::Command::ReplacePlan(Box::new(plan)));
                self.apply_pending();
                if let Some(folder) = path.parent() {
                    self.prefs.remember_folder(folder);
                }
                self.notify(format!("Imported {what}"));
                Ok(())
            }
            Err(err) => {
                let message = format!("Could not import {}: {err}", path.display());
                self.notify_error(message.clone());
                Err(message)
            }
        }
    }

    fn export_sheet(&mut self, path: &Path) {
        let path = with_extension(path, "png");
        if self.evaluator.is_stale() {
            self.notify_error(
                "Nothing to export: the plan on screen cannot be evaluated; fix it or undo first",
            );
            return;
        }
        let Some(eval) = self.evaluator.evaluation() else {
            self.notify_error("Nothing to export: the plan has not been evaluated");
            return;
        };
        match export::swatch_sheet_png(&self.plan, eval, &path) {
            Ok(()) => self.notify(format!("Wrote the swatch sheet {}", path.display())),
            Err(err) => self.notify_error(format!("Could not write the swatch sheet: {err}")),
        }
    }

    fn export_report(&mut self, path: &Path, format: ReportFormat) {
        let path = with_extension(path, format.extension());
        if self.evaluator.is_stale() {
            self.notify_error(
                "Nothing to report: the plan on screen cannot be evaluated; fix it or undo first",
            );
            return;
        }
        match export::report(&self.plan, self.evaluator.evaluation(), format, &path) {
            Ok(()) => self.notify(format!("Wrote the report {}", path.display())),
            Err(err) => self.notify_error(format!("Could not write the report: {err}")),
        }
    }

    /// Ask for a file: the desktop dialog when there is one, else the in-window browser.
    fn choose(&mut self, purpose: Purpose) {
        if self.system_dialogs {
            let started = Instant::now();
            let picked = system_dialog(&purpose, self.prefs.last_folder(), &self.plan.name);
            if let Some(path) = picked {
                let action = purpose.action_for(path);
                self.actions.push(action);
                return;
            }
            if started.elapsed() >= NO_DIALOG_THRESHOLD {
                return; // cancelled by the user
            }
            self.notify("No desktop file dialog is available; using Lampwright's file browser");
        }
        let folder = self
            .path
            .as_ref()
            .and_then(|p| p.parent().map(Path::to_path_buf))
            .or_else(|| self.prefs.last_folder().map(Path::to_path_buf))
            .or_else(|| std::env::current_dir().ok())
            .unwrap_or_default();
        self.dialog = Some(Dialog::Browse(Browser::new(
            purpose,
            folder,
            &self.plan.name,
        )));
    }
}

/// A new plan: one key light (a 3200 K black body, 1000 lx) on a grey card
/// and a skin tone, so there is something to see from the start.
#[must_use]
pub fn starter_plan() -> Plan {
    let mut plan = Plan {
        sources: vec![lampwright_plan::Source {
            id: 1,
            name: "Key".into(),
            ..lampwright_plan::Source::default()
        }],
        ..Plan::default()
    };
    for id in ["grey-card-18", "skin-medium-olive"] {
        if lampwright_plan::library::subject(id).is_some() {
            plan.subjects.push(lampwright_plan::SubjectEntry {
                subject: lampwright_plan::SubjectRef::Library(id.into()),
                ..lampwright_plan::SubjectEntry::default()
            });
        }
    }
    plan
}

/// Add an extension when the name has none.
fn with_extension(path: &Path, ext: &str) -> PathBuf {
    if path.extension().is_some() {
        path.to_path_buf()
    } else {
        path.with_extension(ext)
    }
}

fn system_dialog(purpose: &Purpose, folder: Option<&Path>, plan_name: &str) -> Option<PathBuf> {
    let mut dialog = rfd::FileDialog::new().set_title(purpose.title());
    if let Some(folder) = folder {
        dialog = dialog.set_directory(folder);
    }
    let (filter_name, extensions) = purpose.filter();
    dialog = dialog.add_filter(filter_name, extensions);
    if purpose.is_save() {
        dialog
            .set_file_name(format!(
                "{}.{}",
                super::dialogs::file_stem(plan_name),
                extensions[0]
            ))
            .save_file()
    } else {
        dialog.pick_file()
    }
}
