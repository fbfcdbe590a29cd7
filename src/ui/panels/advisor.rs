//! The advisor tab: pick a goal and the kit's limits, ask for suggestions,
//! and apply one (one undo step).

use crate::ui::actions::Action;
use crate::ui::advisor::GoalKind;
use crate::ui::command::Command;
use crate::ui::format;
use crate::ui::theme;
use crate::ui::widgets::PanelCtx;
use egui::{RichText, Ui};
use lampwright_plan::advisor::{Figures, Suggestion, apply};
use std::fmt::Write as _;

/// Draw the advisor tab.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    ui.label(
        "The advisor searches gels from the kit, source levels and the camera's settings for changes \
         that serve one goal. Locked sources stay as they are; excluded subjects do not count.",
    );
    ui.add_space(4.0);
    goal_settings(ui, cx);
    kit_settings(ui, cx);
    ui.add_space(6.0);
    ui.horizontal(|ui| {
        let running = cx.advisor.running_for_s();
        if ui
            .add_enabled(running.is_none(), egui::Button::new("Suggest changes"))
            .clicked()
        {
            cx.actions.push(Action::Advise);
        }
        if let Some(s) = running {
            ui.spinner();
            ui.label(theme::caption(format!("searching… {s:.1} s")));
        }
    });
    ui.add_space(6.0);
    results(ui, cx);
}

fn goal_settings(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    let state = &mut *cx.advisor;
    ui.horizontal(|ui| {
        let label = ui.label("Goal");
        egui::ComboBox::from_id_salt("advisor-goal")
            .selected_text(state.goal.label())
            .width(240.0)
            .show_ui(ui, |ui| {
                for goal in GoalKind::ALL {
                    ui.selectable_value(&mut state.goal, goal, goal.label());
                }
            })
            .response
            .labelled_by(label.id);
    });
    if state.goal != GoalKind::White {
        return;
    }
    ui.horizontal(|ui| {
        let label = ui.label("Zone");
        let current = state.zone.clone().unwrap_or_else(|| "main zone".into());
        egui::ComboBox::from_id_salt("advisor-zone")
            .selected_text(current)
            .show_ui(ui, |ui| {
                ui.selectable_value(&mut state.zone, None, "main zone");
                for zone in &plan.zones {
                    ui.selectable_value(&mut state.zone, Some(zone.name.clone()), &zone.name);
                }
            })
            .response
            .labelled_by(label.id);
    });
    let mut custom = state.target.is_some();
    ui.horizontal(|ui| {
        if ui.radio(!custom, "Default target").on_hover_text(
            "The camera's Kelvin white balance when it has one, else the zone's own CCT on the blackbody line",
        ).clicked() {
            custom = false;
        }
        if ui.radio(custom, "Target").clicked() {
            custom = true;
        }
    });
    if custom {
        let (mut cct, mut duv) = state.target.unwrap_or((5600.0, 0.0));
        ui.horizontal(|ui| {
            ui.add(
                egui::DragValue::new(&mut cct)
                    .custom_formatter(format::field_number)
                    .range(1000.0..=25_000.0)
                    .speed(10.0)
                    .suffix(" K"),
            );
            ui.add(
                egui::DragValue::new(&mut duv)
                    .custom_formatter(format::field_number)
                    .range(-0.05..=0.05)
                    .speed(0.0005)
                    .fixed_decimals(3)
                    .prefix("Duv "),
            );
        });
        state.target = Some((cct, duv));
    } else {
        state.target = None;
    }
}

fn kit_settings(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let kit = &cx.plan.kit;
    let mut edited = kit.clone();
    ui.horizontal(|ui| {
        let label = ui.label("Gels per source, at most");
        ui.add(
            egui::DragValue::new(&mut edited.max_stack)
                .range(1..=4)
                .clamp_existing_to_range(false),
        )
        .labelled_by(label.id);
        let label = ui.label("Light lost, at most");
        ui.add(
            egui::DragValue::new(&mut edited.max_stops_lost)
                .custom_formatter(format::field_number)
                .range(0.0..=6.0)
                .speed(0.05)
                .fixed_decimals(1)
                .suffix(" stops")
                .clamp_existing_to_range(false),
        )
        .labelled_by(label.id);
    });
    let gels = if kit.gels.is_empty() {
        "every gel in the library".to_owned()
    } else {
        format!("{} gels from the library", kit.gels.len())
    };
    egui::CollapsingHeader::new(format!("The kit: {gels}"))
        .id_salt("kit-gels")
        .show(ui, |ui| kit_gels(ui, &mut edited));
    if &edited != kit {
        cx.push(Command::Kit(edited));
    }
}

/// Which library gels the crew has on the truck: the advisor proposes only
/// those. An empty list means the whole library.
fn kit_gels(ui: &mut Ui, kit: &mut lampwright_plan::Kit) {
    let library = &crate::ui::catalog::builtin().gels;
    let mut everything = kit.gels.is_empty();
    if ui
        .checkbox(&mut everything, "Every gel in the library")
        .on_hover_text("Untick to say which gels the crew has; the advisor proposes only those")
        .changed()
    {
        kit.gels = if everything {
            Vec::new()
        } else {
            library.iter().map(|g| g.id.clone()).collect()
        };
    }
    if kit.gels.is_empty() {
        return;
    }
    let mut group = "";
    egui::ScrollArea::vertical()
        .id_salt("kit-gel-list")
        .max_height(220.0)
        .show(ui, |ui| {
            for g in library {
                if g.group != group {
                    group = &g.group;
                    ui.label(theme::caption(&g.group));
                }
                let mut have = kit.gels.contains(&g.id);
                // An empty list means the whole library, so the last gel stays.
                let last = have && kit.gels.len() == 1;
                let response = ui
                    .add_enabled(!last, egui::Checkbox::new(&mut have, &g.name))
                    .on_hover_text(&g.description)
                    .on_disabled_hover_text(
                        "The kit needs at least one gel (or tick every gel in the library)",
                    );
                if response.changed() {
                    if have {
                        kit.gels.push(g.id.clone());
                    } else {
                        kit.gels.retain(|id| id != &g.id);
                    }
                }
            }
        });
}

fn results(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let Some((asked_for, outcome)) = cx.advisor.result() else {
        return;
    };
    let current = asked_for == cx.plan;
    match outcome {
        Err(err) => {
            ui.colored_label(theme::WARNING, format!("The advisor could not run: {err}"));
        }
        Ok(advice) => {
            if !current {
                ui.label(theme::caption(
                    "These suggestions are for an earlier version of the plan; ask again to apply one.",
                ));
            }
            for note in &advice.notes {
                ui.label(note);
            }
            ui.label(theme::caption(format!(
                "Now: {}",
                figures_line(&advice.before)
            )));
            if advice.suggestions.is_empty() {
                ui.label("Nothing better was found within the kit and its limits.");
            }
            let mut chosen = None;
            for (i, suggestion) in advice.suggestions.iter().enumerate() {
                ui.add_space(4.0);
                theme::card().show(ui, |ui| {
                    ui.set_width(ui.available_width());
                    ui.label(
                        RichText::new(format!("{}. {}", i + 1, suggestion.sentence())).strong(),
                    );
                    ui.label(theme::caption(format!(
                        "After: {}",
                        figures_line(&suggestion.after)
                    )));
                    losses(ui, suggestion);
                    if ui
                        .add_enabled(current, egui::Button::new(format!("Apply {}", i + 1)))
                        .clicked()
                    {
                        chosen = Some(i);
                    }
                });
            }
            if let Some(i) = chosen {
                let updated = apply(cx.plan, &advice.suggestions[i]);
                cx.push(Command::ReplacePlan(Box::new(updated)));
            }
        }
    }
}

fn losses(ui: &mut Ui, suggestion: &Suggestion) {
    let parts: Vec<String> = suggestion
        .source_losses
        .iter()
        .map(|l| match l.stops_lost {
            Some(s) if s.abs() < 0.05 => format!("{} keeps its light", l.name),
            Some(s) => format!("{} {}", l.name, format::stops(Some(-s))),
            None => format!("{} off", l.name),
        })
        .collect();
    if !parts.is_empty() {
        ui.label(theme::caption(format!("Light: {}", parts.join(", "))));
    }
}

/// The figures a crew compares, in one line.
fn figures_line(f: &Figures) -> String {
    let de = |v: Option<f64>| v.map_or_else(|| format::DASH.to_owned(), format::delta_e);
    let mut line = format!(
        "mean ΔE00 {} · worst {} · {} · Duv {} · Rf {} · Rg {} · R9 {}",
        de(f.mean_de2000),
        de(f.max_de2000),
        format::cct(f.cct_k),
        format::duv(f.duv),
        format::integer(f.rf),
        format::integer(f.rg),
        format::integer(f.r9),
    );
    if let Some(lost) = f.stops_lost.filter(|s| s.abs() >= 0.05) {
        let _ = write!(line, " · {} of light", format::stops(Some(-lost)));
    }
    if let Some(w) = &f.white {
        let _ = write!(
            line,
            " · {} white {} (target {})",
            w.zone,
            format::cct(w.cct_k),
            format::cct(w.target_cct_k)
        );
    }
    line
}
