//! Modal dialogs: unsaved changes, the in-window file browser (used when the
//! desktop has no file dialog), the question of what a dropped CSV is, and
//! the offer to restore a plan autosaved before a crash.

use super::actions::Action;
use super::app::App;
use super::export::ReportFormat;
use super::theme;
use lampwright_plan::LibraryKind;
use std::path::{Path, PathBuf};

/// What a file is being chosen for.
#[derive(Debug, Clone, PartialEq)]
pub enum Purpose {
    /// Open a plan.
    OpenPlan,
    /// Save the plan.
    SavePlan,
    /// Import a spectral table.
    ImportCsv(Option<LibraryKind>),
    /// Write the swatch sheet.
    ExportSheet,
    /// Write a report.
    ExportReport(ReportFormat),
}

impl Purpose {
    /// Dialog title.
    #[must_use]
    pub fn title(&self) -> &'static str {
        match self {
            Purpose::OpenPlan => "Open a plan",
            Purpose::SavePlan => "Save the plan",
            Purpose::ImportCsv(_) => "Import a spectral table (CSV)",
            Purpose::ExportSheet => "Export the swatch sheet (PNG)",
            Purpose::ExportReport(_) => "Export a report",
        }
    }

    /// Name and extensions of the file filter (first extension is the default).
    #[must_use]
    pub fn filter(&self) -> (&'static str, &'static [&'static str]) {
        match self {
            Purpose::OpenPlan | Purpose::SavePlan => ("Lampwright plan", &["ron"]),
            Purpose::ImportCsv(_) => ("Spectral table", &["csv", "txt", "tsv"]),
            Purpose::ExportSheet => ("PNG image", &["png"]),
            Purpose::ExportReport(ReportFormat::Html) => ("HTML report", &["html"]),
            Purpose::ExportReport(ReportFormat::Csv) => ("CSV report", &["csv"]),
            Purpose::ExportReport(ReportFormat::Json) => ("JSON report", &["json"]),
            Purpose::ExportReport(ReportFormat::Text) => ("Text report", &["txt"]),
        }
    }

    /// The purpose writes a file (rather than reading one).
    #[must_use]
    pub fn is_save(&self) -> bool {
        matches!(
            self,
            Purpose::SavePlan | Purpose::ExportSheet | Purpose::ExportReport(_)
        )
    }

    /// Label of the confirming button.
    #[must_use]
    pub fn verb(&self) -> &'static str {
        match self {
            Purpose::OpenPlan => "Open",
            Purpose::SavePlan => "Save",
            Purpose::ImportCsv(_) => "Import",
            Purpose::ExportSheet | Purpose::ExportReport(_) => "Export",
        }
    }

    /// The action to run once a file is chosen.
    #[must_use]
    pub fn action_for(&self, path: PathBuf) -> Action {
        match self {
            Purpose::OpenPlan => Action::OpenPath(path),
            Purpose::SavePlan => Action::SaveTo(path),
            Purpose::ImportCsv(kind) => Action::ImportPath(path, *kind),
            Purpose::ExportSheet => Action::ExportSheetTo(path),
            Purpose::ExportReport(format) => Action::ExportReportTo(path, *format),
        }
    }
}

/// A file name made from a plan name (letters, digits, '-' and '_').
#[must_use]
pub fn file_stem(plan_name: &str) -> String {
    let stem: String = plan_name
        .trim()
        .chars()
        .map(|c| {
            if c.is_alphanumeric() || c == '-' || c == '_' {
                c
            } else {
                '-'
            }
        })
        .collect();
    let stem = stem.trim_matches('-').to_owned();
    if stem.is_empty() { "plan".into() } else { stem }
}

/// The in-window file browser.
#[derive(Debug, Clone)]
pub struct Browser {
    /// What for.
    pub purpose: Purpose,
    /// Folder listed.
    pub folder: PathBuf,
    /// The path field (a file name, or a full path).
    pub path_text: String,
    entries: Vec<(String, bool)>,
    error: Option<String>,
}

impl Browser {
    /// A browser listing `folder`.
    #[must_use]
    pub fn new(purpose: Purpose, folder: PathBuf, plan_name: &str) -> Browser {
        let path_text = if purpose.is_save() {
            let (_, ext) = purpose.filter();
            folder
                .join(format!("{}.{}", file_stem(plan_name), ext[0]))
                .display()
                .to_string()
        } else {
            String::new()
        };
        let mut browser = Browser {
            purpose,
            folder,
            path_text,
            entries: Vec::new(),
            error: None,
        };
        browser.list();
        browser
    }

    fn list(&mut self) {
        let (_, extensions) = self.purpose.filter();
        self.entries.clear();
        self.error = None;
        match std::fs::read_dir(&self.folder) {
            Ok(read) => {
                for entry in read.flatten() {
                    let name = entry.file_name().to_string_lossy().into_owned();
                    if name.starts_with('.') {
                        continue;
                    }
                    let is_dir = entry.file_type().is_ok_and(|t| t.is_dir());
                    let wanted = is_dir
                        || Path::new(&name)
                            .extension()
                            .is_some_and(|e| extensions.iter().any(|x| e.eq_ignore_ascii_case(x)));
                    if wanted {
                        self.entries.push((name, is_dir));
                    }
                }
                self.entries.sort_by(|a, b| {
                    b.1.cmp(&a.1)
                        .then_with(|| a.0.to_lowercase().cmp(&b.0.to_lowercase()))
                });
                if self.entries.len() > 2000 {
                    self.entries.truncate(2000);
                }
            }
            Err(err) => self.error = Some(format!("{}: {err}", self.folder.display())),
        }
    }

    fn go_to(&mut self, folder: PathBuf) {
        if !self.purpose.is_save() {
            self.path_text.clear();
        } else if let Some(name) = Path::new(&self.path_text).file_name() {
            self.path_text = folder.join(name).display().to_string();
        }
        self.folder = folder;
        self.list();
    }

    /// The chosen path: the field as typed, relative to the listed folder.
    #[must_use]
    pub fn chosen(&self) -> Option<PathBuf> {
        let text = self.path_text.trim();
        if text.is_empty() {
            return None;
        }
        let path = PathBuf::from(text);
        Some(if path.is_absolute() {
            path
        } else {
            self.folder.join(path)
        })
    }
}

/// The "what is this CSV" question.
#[derive(Debug, Clone)]
pub struct CsvImport {
    /// The file.
    pub path: PathBuf,
    /// What it is.
    pub kind: LibraryKind,
    /// Name to give it.
    pub name: String,
    /// Group (subjects only).
    pub group: String,
    /// Error from the last attempt.
    pub error: Option<String>,
}

impl CsvImport {
    /// Ask about `path`; `kind` preselects the answer.
    #[must_use]
    pub fn new(path: PathBuf, kind: Option<LibraryKind>) -> CsvImport {
        let name = path.file_stem().map_or_else(
            || "Imported".to_owned(),
            |s| s.to_string_lossy().into_owned(),
        );
        CsvImport {
            path,
            kind: kind.unwrap_or(LibraryKind::Subject),
            name,
            group: "imported".into(),
            error: None,
        }
    }
}

/// An open modal.
#[derive(Debug, Clone)]
pub enum Dialog {
    /// Unsaved changes: save, discard or cancel, then do `then`.
    Unsaved {
        /// What to do after.
        then: Action,
    },
    /// The in-window file browser.
    Browse(Browser),
    /// What is this CSV?
    CsvKind(CsvImport),
    /// Restore or discard the first of the app's recovered plans.
    Recover,
}

/// What the user answered in a dialog.
enum Outcome {
    Keep,
    Close,
    Run(Action),
    SaveThen(Action),
    Import(CsvImport),
    Restore,
    DiscardRecovered,
}

/// Show the open dialog, if any, and act on the answer.
pub fn show(app: &mut App, ctx: &egui::Context) {
    let Some(mut dialog) = app.dialog.take() else {
        return;
    };
    let recent = app.prefs.recent_folders.clone();
    let outcome = match &mut dialog {
        Dialog::Unsaved { then } => unsaved(ctx, then),
        Dialog::Browse(browser) => browse(ctx, browser, &recent),
        Dialog::CsvKind(import) => csv_kind(ctx, import),
        Dialog::Recover => match app.recovered.first() {
            Some(found) => recover(ctx, found),
            None => Outcome::Close,
        },
    };
    match outcome {
        Outcome::Keep => app.dialog = Some(dialog),
        Outcome::Close => {
            // A closed file browser cancels a save the prompt asked for.
            if matches!(dialog, Dialog::Browse(_)) {
                app.after_save = None;
            }
        }
        Outcome::Run(action) => app.run_action_unchecked(ctx, action),
        Outcome::SaveThen(action) => {
            if let Some(path) = app.path.clone() {
                app.save_to(&path);
                if !app.is_dirty() {
                    app.run_action_unchecked(ctx, action);
                }
            } else {
                // No file yet: choose one, save, then go on with `action`.
                app.run_action_unchecked(ctx, Action::SaveAs);
                app.after_save = Some(action);
            }
        }
        Outcome::Import(mut import) => {
            let (path, kind) = (import.path.clone(), import.kind);
            if let Err(err) =
                app.import_csv(&path, kind, &import.name.clone(), &import.group.clone())
            {
                import.error = Some(err);
                app.dialog = Some(Dialog::CsvKind(import));
            }
        }
        Outcome::Restore => app.restore_recovered(),
        Outcome::DiscardRecovered => app.discard_recovered(),
    }
}

/// The offer to restore a plan autosaved by a window that closed without
/// saving. It stays until answered: both answers keep the plan somewhere.
fn recover(ctx: &egui::Context, found: &super::recovery::Recovered) -> Outcome {
    let mut outcome = Outcome::Keep;
    egui::Modal::new(egui::Id::unique("recover")).show(ctx, |ui| {
        ui.set_width(460.0);
        ui.heading("Restore unsaved work?");
        ui.label(format!(
            "Lampwright closed without saving the plan \"{}\".",
            found.plan.name
        ));
        let origin = found.origin.as_ref().map_or_else(
            || "It was never saved to a file.".to_owned(),
            |p| format!("It belongs to {}.", p.display()),
        );
        ui.label(origin);
        if let Some(when) = found.saved_at {
            let age = super::recovery::age_text(when, std::time::SystemTime::now());
            ui.label(theme::caption(format!("Autosaved {age}.")));
        }
        ui.add_space(8.0);
        ui.horizontal(|ui| {
            if ui
                .button("Restore")
                .on_hover_text("Open it with its changes unsaved; Save writes it to its file")
                .clicked()
            {
                outcome = Outcome::Restore;
            }
            if ui
                .button("Discard")
                .on_hover_text(format!(
                    "Set it aside (kept as {}.discarded)",
                    found.plan_file().display()
                ))
                .clicked()
            {
                outcome = Outcome::DiscardRecovered;
            }
        });
    });
    outcome
}

fn unsaved(ctx: &egui::Context, then: &Action) -> Outcome {
    let mut outcome = Outcome::Keep;
    let response = egui::Modal::new(egui::Id::unique("unsaved")).show(ctx, |ui| {
        ui.set_width(380.0);
        ui.heading("Unsaved changes");
        ui.label("This plan has changes that are not saved to a file.");
        ui.add_space(8.0);
        ui.horizontal(|ui| {
            if ui.button("Save").clicked() {
                outcome = Outcome::SaveThen(then.clone());
            }
            if ui.button("Discard changes").clicked() {
                outcome = Outcome::Run(then.clone());
            }
            if ui.button("Cancel").clicked() {
                outcome = Outcome::Close;
            }
        });
    });
    if response.should_close() && matches!(outcome, Outcome::Keep) {
        outcome = Outcome::Close;
    }
    outcome
}

fn browse(ctx: &egui::Context, browser: &mut Browser, recent: &[PathBuf]) -> Outcome {
    let mut outcome = Outcome::Keep;
    let mut go_to: Option<PathBuf> = None;
    let response = egui::Modal::new(egui::Id::unique("browser")).show(ctx, |ui| {
        ui.set_width(620.0);
        ui.heading(browser.purpose.title());
        ui.horizontal(|ui| {
            let label = ui.label("Path");
            let field =
                ui.add(egui::TextEdit::singleline(&mut browser.path_text).desired_width(520.0));
            let field = field.labelled_by(label.id);
            if field.lost_focus()
                && ui.input(|i| i.key_pressed(egui::Key::Enter))
                && let Some(path) = browser.chosen()
            {
                if path.is_dir() {
                    go_to = Some(path);
                } else {
                    outcome = Outcome::Run(browser.purpose.action_for(path));
                }
            }
        });
        ui.horizontal_wrapped(|ui| {
            ui.label(theme::caption("Folder:"));
            ui.label(browser.folder.display().to_string());
            if let Some(parent) = browser.folder.parent()
                && ui.small_button("Up one folder").clicked()
            {
                go_to = Some(parent.to_path_buf());
            }
        });
        if let Some(folder) = recent_folders(ui, recent) {
            go_to = Some(folder);
        }
        if let Some(err) = &browser.error {
            ui.colored_label(theme::WARNING, err);
        }
        egui::Frame::new()
            .fill(theme::grey::BASE)
            .inner_margin(6)
            .show(ui, |ui| {
                egui::ScrollArea::vertical()
                    .max_height(300.0)
                    .auto_shrink([false, false])
                    .show(ui, |ui| {
                        if browser.entries.is_empty() && browser.error.is_none() {
                            ui.label(theme::caption("no matching files here"));
                        }
                        for (name, is_dir) in &browser.entries {
                            let text = if *is_dir {
                                format!("{name}/")
                            } else {
                                name.clone()
                            };
                            let response = ui.selectable_label(false, text);
                            if response.clicked() {
                                let path = browser.folder.join(name);
                                if *is_dir {
                                    go_to = Some(path);
                                } else {
                                    browser.path_text = path.display().to_string();
                                }
                            }
                            if response.double_clicked() && !*is_dir {
                                outcome = Outcome::Run(
                                    browser.purpose.action_for(browser.folder.join(name)),
                                );
                            }
                        }
                    });
            });
        ui.add_space(6.0);
        ui.horizontal(|ui| {
            let ready = browser.chosen().is_some();
            if ui
                .add_enabled(ready, egui::Button::new(browser.purpose.verb()))
                .clicked()
                && let Some(path) = browser.chosen()
            {
                if path.is_dir() {
                    go_to = Some(path);
                } else {
                    outcome = Outcome::Run(browser.purpose.action_for(path));
                }
            }
            if ui.button("Cancel").clicked() {
                outcome = Outcome::Close;
            }
        });
    });
    if let Some(folder) = go_to {
        browser.go_to(folder);
    }
    if response.should_close() && matches!(outcome, Outcome::Keep) {
        outcome = Outcome::Close;
    }
    outcome
}

/// Buttons for the recent folders; returns the one clicked.
fn recent_folders(ui: &mut egui::Ui, recent: &[PathBuf]) -> Option<PathBuf> {
    let mut clicked = None;
    if recent.is_empty() {
        return None;
    }
    ui.horizontal_wrapped(|ui| {
        ui.label(theme::caption("Recent folders:"));
        for folder in recent.iter().take(6) {
            let name = folder.file_name().map_or_else(
                || folder.display().to_string(),
                |n| n.to_string_lossy().into_owned(),
            );
            if ui
                .small_button(name)
                .on_hover_text(folder.display().to_string())
                .clicked()
            {
                clicked = Some(folder.clone());
            }
        }
    });
    clicked
}

fn csv_kind(ctx: &egui::Context, import: &mut CsvImport) -> Outcome {
    let mut outcome = Outcome::Keep;
    let response = egui::Modal::new(egui::Id::unique("csv-kind")).show(ctx, |ui| {
        ui.set_width(440.0);
        ui.heading("Import a spectral table");
        ui.label(import.path.display().to_string());
        ui.add_space(4.0);
        ui.label("What does this file measure?");
        ui.horizontal(|ui| {
            for (kind, text) in [
                (LibraryKind::Lamp, "Lamp (spectral power)"),
                (LibraryKind::Gel, "Gel (transmittance)"),
                (LibraryKind::Subject, "Subject (reflectance)"),
                (LibraryKind::Camera, "Camera (r, g, b sensitivities)"),
            ] {
                ui.radio_value(&mut import.kind, kind, text);
            }
        });
        egui::Grid::new("csv-fields").num_columns(2).show(ui, |ui| {
            let label = ui.label("Name");
            ui.add(egui::TextEdit::singleline(&mut import.name).desired_width(260.0))
                .labelled_by(label.id);
            ui.end_row();
            if import.kind == LibraryKind::Subject {
                let label = ui.label("Group");
                ui.add(egui::TextEdit::singleline(&mut import.group).desired_width(260.0))
                    .labelled_by(label.id);
                ui.end_row();
            }
        });
        if let Some(err) = &import.error {
            ui.add_space(4.0);
            ui.colored_label(theme::WARNING, err);
        }
        ui.add_space(6.0);
        ui.horizontal(|ui| {
            if ui.button("Add to plan").clicked() {
                outcome = Outcome::Import(import.clone());
            }
            if ui.button("Cancel").clicked() {
                outcome = Outcome::Close;
            }
        });
    });
    if response.should_close() && matches!(outcome, Outcome::Keep) {
        outcome = Outcome::Close;
    }
    outcome
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn file_stems_are_safe() {
        assert_eq!(
            file_stem("Night market / portrait"),
            "Night-market---portrait"
        );
        assert_eq!(file_stem("  "), "plan");
    }
}
