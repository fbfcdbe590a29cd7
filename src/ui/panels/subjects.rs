//! Subjects: pick from the library by group, import measured reflectances,
//! include or exclude, weight.

use crate::ui::actions::Action;
use crate::ui::catalog;
use crate::ui::command::Command;
use crate::ui::format;
use crate::ui::theme;
use crate::ui::widgets::{self, PanelCtx};
use egui::Ui;
use lampwright_plan::{LibraryKind, SubjectRef};

/// The library's subject groups, in the order the picker offers them.
pub const GROUPS: [&str; 6] = ["skin", "food", "fabric", "foliage", "neutrals", "products"];

/// Draw the subjects tab.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    let entries = catalog::subjects(plan);
    ui.label(theme::caption("Add from the library"));
    ui.horizontal_wrapped(|ui| {
        let mut groups: Vec<String> = GROUPS.iter().map(|g| (*g).to_owned()).collect();
        for e in &entries {
            if !groups.iter().any(|g| g.eq_ignore_ascii_case(&e.group)) {
                groups.push(e.group.clone());
            }
        }
        for group in &groups {
            let text = format!("{group}…");
            if let Some(entry) = widgets::entry_picker(
                ui,
                &text,
                &entries,
                &mut cx.view.subject_search,
                Some(group),
            ) {
                let subject = if entry.custom {
                    SubjectRef::Custom(entry.id)
                } else {
                    SubjectRef::Library(entry.id)
                };
                cx.push(Command::AddSubject(subject));
            }
        }
    });
    ui.horizontal(|ui| {
        if let Some(entry) = widgets::entry_picker(
            ui,
            "Search all…",
            &entries,
            &mut cx.view.subject_search,
            None,
        ) {
            let subject = if entry.custom {
                SubjectRef::Custom(entry.id)
            } else {
                SubjectRef::Library(entry.id)
            };
            cx.push(Command::AddSubject(subject));
        }
        if ui.button("Import measured reflectance…").clicked() {
            cx.actions.push(Action::Import(Some(LibraryKind::Subject)));
        }
    });
    ui.add_space(6.0);
    ui.separator();
    subject_list(ui, cx);
}

/// The plan's subjects: include, name (click to select), group, weight, remove.
fn subject_list(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    if plan.subjects.is_empty() {
        ui.label("No subjects yet. Add a grey card and a skin tone to start.");
        return;
    }
    let names: Vec<(String, String)> = plan
        .subjects
        .iter()
        .map(|s| catalog::subject_name(plan, &s.subject))
        .collect();
    let results = cx.eval.map(|e| &e.subjects);
    egui::Grid::new("subjects-grid")
        .num_columns(5)
        .striped(true)
        .spacing([10.0, 4.0])
        .show(ui, |ui| {
            ui.label(theme::caption("Count"));
            ui.label(theme::caption("Subject"));
            ui.label(theme::caption("Group"));
            ui.label(theme::caption("Weight"));
            ui.label("");
            ui.end_row();
            for (i, entry) in plan.subjects.iter().enumerate() {
                ui.push_id(("subject", i), |ui| {
                    let mut included = entry.included;
                    if ui
                        .checkbox(&mut included, "")
                        .accessible_name("Count in summary")
                        .on_hover_text("Count in the summary and the advisor")
                        .changed()
                    {
                        cx.push(Command::SubjectIncluded(i, included));
                    }
                });
                let (name, group) = &names[i];
                ui.horizontal(|ui| {
                    if let Some(r) = results.and_then(|r| r.iter().find(|r| r.index == i)) {
                        let (rect, _) =
                            ui.allocate_exact_size(egui::vec2(14.0, 14.0), egui::Sense::hover());
                        widgets::paint_swatch(ui, rect, r.eye_rgb8, true);
                    }
                    let selected = cx.view.selected_subject == Some(i);
                    if ui.selectable_label(selected, name).clicked() {
                        cx.view.selected_subject = Some(i);
                    }
                });
                ui.label(theme::caption(group));
                ui.push_id(("weight", i), |ui| {
                    let mut weight = entry.weight;
                    if ui
                        .add(
                            egui::DragValue::new(&mut weight)
                                .custom_formatter(format::field_number)
                                .clamp_existing_to_range(false)
                                .range(0.0..=10.0)
                                .speed(0.05)
                                .prefix("×")
                                .max_decimals(2),
                        )
                        .on_hover_text("Weight in the advisor's goal")
                        .changed()
                    {
                        cx.push(Command::SubjectWeight(i, weight));
                    }
                });
                ui.push_id(("remove", i), |ui| {
                    if ui.small_button("Remove").clicked() {
                        cx.push(Command::RemoveSubject(i));
                    }
                });
                ui.end_row();
            }
        });
}
