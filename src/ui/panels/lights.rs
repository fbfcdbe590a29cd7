//! Light sources: one card each, with lamp, level, gels and dimmer.

use crate::ui::catalog::{self, Entry};
use crate::ui::command::{Command, SourceEdit};
use crate::ui::format;
use crate::ui::theme;
use crate::ui::widgets::{self, PanelCtx};
use egui::{RichText, Ui};
use lampwright_plan::{GelLayer, GelRef, LampRef, Plan, Source, SourceFigures, SourceRole};

/// Gel strengths of the trade, with their labels.
pub const STRENGTHS: [(f64, &str); 5] = [
    (0.125, "1/8"),
    (0.25, "1/4"),
    (0.5, "1/2"),
    (0.75, "3/4"),
    (1.0, "full"),
];

const GENERIC_BLACKBODY: &str = "generic:blackbody";
const GENERIC_DAYLIGHT: &str = "generic:daylight";

/// Label of a gel strength: a trade fraction when it is one, else the number.
#[must_use]
pub fn strength_label(strength: f64) -> String {
    STRENGTHS
        .iter()
        .find(|(f, _)| (f - strength).abs() < 1e-9)
        .map_or_else(
            || {
                if strength < 1e6 {
                    format!("{strength:.2}")
                } else {
                    format!("{strength:.2e}")
                }
            },
            |(_, l)| (*l).to_owned(),
        )
}

/// The source the others' levels are given against: the first key, else the first source.
#[must_use]
pub fn key_source(plan: &Plan) -> Option<&Source> {
    plan.sources
        .iter()
        .find(|s| s.role == SourceRole::Key)
        .or_else(|| plan.sources.first())
}

fn lamp_entries(plan: &Plan) -> Vec<Entry> {
    let mut entries = catalog::lamps(plan);
    for (id, name, description) in [
        (
            GENERIC_BLACKBODY,
            "Black body (Planckian), set K",
            "an ideal filament: CIE illuminant A family",
        ),
        (
            GENERIC_DAYLIGHT,
            "CIE daylight, set K",
            "CIE daylight series, 4000–25 000 K",
        ),
    ] {
        entries.push(Entry {
            id: id.into(),
            name: name.into(),
            group: "Generic".into(),
            description: description.into(),
            filament: id == GENERIC_BLACKBODY,
            custom: false,
        });
    }
    entries
}

fn lamp_from_entry(entry: &Entry) -> LampRef {
    match entry.id.as_str() {
        GENERIC_BLACKBODY => LampRef::Blackbody { cct_k: 3200.0 },
        GENERIC_DAYLIGHT => LampRef::Daylight { cct_k: 5600.0 },
        id if entry.custom => LampRef::Custom(id.to_owned()),
        id => LampRef::Library(id.to_owned()),
    }
}

/// Draw the lights tab.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    ui.horizontal(|ui| {
        if ui
            .button("Add source")
            .on_hover_text("Add a light (a fill at half the key's level)")
            .clicked()
        {
            cx.push(Command::AddSource(Box::new(new_source(plan))));
        }
        let lit = plan.sources.iter().filter(|s| plan.is_lit(s)).count();
        ui.label(theme::caption(format!(
            "{} sources, {lit} lighting the scene",
            plan.sources.len()
        )));
    });
    if plan.sources.is_empty() {
        ui.label("No light yet. Add a source to start.");
    }
    if let Some(main) = plan.zones.first() {
        ui.label(theme::caption(format!(
            "New sources reach the main zone ({}); choose the others under Zones.",
            main.name
        )));
    }
    let key_id = key_source(plan).map(|s| s.id);
    for (index, source) in plan.sources.iter().enumerate() {
        ui.add_space(6.0);
        source_card(ui, cx, index, source, key_id);
    }
}

fn new_source(plan: &Plan) -> Source {
    let key = key_source(plan);
    let n = plan.sources.len() + 1;
    let lamp = key.map_or_else(
        || {
            catalog::builtin()
                .lamps
                .first()
                .map_or(LampRef::Blackbody { cct_k: 3200.0 }, |e| {
                    LampRef::Library(e.id.clone())
                })
        },
        |k| k.lamp.clone(),
    );
    Source {
        name: if key.is_some() {
            format!("Fill {n}")
        } else {
            "Key".into()
        },
        role: if key.is_some() {
            SourceRole::Fill
        } else {
            SourceRole::Key
        },
        lamp,
        level_lux: key.map_or(1000.0, |k| k.level_lux / 2.0),
        ..Source::default()
    }
}

fn source_card(
    ui: &mut Ui,
    cx: &mut PanelCtx<'_>,
    index: usize,
    source: &Source,
    key_id: Option<u32>,
) {
    let id = source.id;
    let figures: Option<&SourceFigures> = cx
        .eval
        .and_then(|e| e.sources.iter().find(|f| f.source_id == id));
    theme::card().show(ui, |ui| {
        ui.set_width(ui.available_width());
        ui.push_id(("source", id), |ui| {
            header_row(ui, cx, index, source);
            lamp_rows(ui, cx, source);
            level_row(ui, cx, source, key_id, figures);
            dimmer_row(ui, cx, source);
            gel_stack(ui, cx, source);
            footer_row(ui, cx, source);
        });
    });
}

/// Name, role, on, solo.
fn header_row(ui: &mut Ui, cx: &mut PanelCtx<'_>, index: usize, source: &Source) {
    let id = source.id;
    let lit = cx.plan.is_lit(source);
    ui.horizontal(|ui| {
        let (dot, _) = ui.allocate_exact_size(egui::vec2(12.0, 12.0), egui::Sense::hover());
        let color = if lit {
            widgets::source_color(index)
        } else {
            theme::grey::EDGE
        };
        ui.painter().circle_filled(dot.center(), 5.0, color);
        let mut name = source.name.clone();
        let field = ui
            .add(
                egui::TextEdit::singleline(&mut name)
                    .desired_width(132.0)
                    .font(egui::TextStyle::Heading),
            )
            .accessible_name("Source name");
        cx.track_focus(&field);
        if field.changed() {
            cx.push(Command::Source(id, SourceEdit::Name(name)));
        }
        egui::ComboBox::from_id_salt("role")
            .selected_text(source.role.label())
            .width(92.0)
            .show_ui(ui, |ui| {
                for role in SourceRole::ALL {
                    if ui
                        .selectable_label(source.role == role, role.label())
                        .clicked()
                        && role != source.role
                    {
                        cx.push(Command::Source(id, SourceEdit::Role(role)));
                    }
                }
            })
            .response
            .accessible_name("Role");
        let mut on = source.enabled;
        if ui.checkbox(&mut on, "On").changed() {
            cx.push(Command::Source(id, SourceEdit::Enabled(on)));
        }
        let mut solo = source.solo;
        if ui
            .checkbox(&mut solo, "Solo")
            .on_hover_text("Light the scene with soloed sources only")
            .changed()
        {
            cx.push(Command::Source(id, SourceEdit::Solo(solo)));
        }
    });
}

/// The lamp, and its temperature for the generic ones.
fn lamp_rows(ui: &mut Ui, cx: &mut PanelCtx<'_>, source: &Source) {
    let plan = cx.plan;
    let id = source.id;
    ui.horizontal(|ui| {
        ui.label(theme::caption("Lamp"));
        ui.label(RichText::new(catalog::lamp_name(plan, &source.lamp)).strong());
        let entries = lamp_entries(plan);
        if let Some(entry) =
            widgets::entry_picker(ui, "Change lamp…", &entries, &mut cx.view.lamp_search, None)
        {
            cx.push(Command::Source(
                id,
                SourceEdit::Lamp(lamp_from_entry(&entry)),
            ));
        }
    });
    match source.lamp {
        LampRef::Blackbody { cct_k } | LampRef::Daylight { cct_k } => {
            let daylight = matches!(source.lamp, LampRef::Daylight { .. });
            let range = if daylight {
                4000.0..=25_000.0
            } else {
                1000.0..=20_000.0
            };
            let mut k = cct_k;
            ui.horizontal(|ui| {
                ui.label(theme::caption("Temperature"));
                if ui
                    .add(
                        egui::DragValue::new(&mut k)
                            .custom_formatter(format::field_number)
                            .clamp_existing_to_range(false)
                            .range(range)
                            .speed(10.0)
                            .suffix(" K"),
                    )
                    .changed()
                {
                    let lamp = if daylight {
                        LampRef::Daylight { cct_k: k }
                    } else {
                        LampRef::Blackbody { cct_k: k }
                    };
                    cx.push(Command::Source(id, SourceEdit::Lamp(lamp)));
                }
            });
        }
        LampRef::Library(_) | LampRef::Custom(_) => {}
    }
}

/// The dimmer, for lamps with a filament.
fn dimmer_row(ui: &mut Ui, cx: &mut PanelCtx<'_>, source: &Source) {
    let id = source.id;
    if catalog::lamp_has_filament(&source.lamp) {
        let mut percent = source.dimmer * 100.0;
        ui.horizontal(|ui| {
            ui.label(theme::caption("Dimmer"));
            let slider = egui::Slider::new(&mut percent, 10.0..=100.0)
                .clamping(egui::SliderClamping::Edits)
                .suffix(" %")
                .fixed_decimals(0)
                .text("voltage");
            if ui
                .add(slider)
                .on_hover_text("A filament dims warmer: its colour follows the voltage")
                .changed()
            {
                cx.push(Command::Source(id, SourceEdit::Dimmer(percent / 100.0)));
            }
        });
    }
}

/// Lock, duplicate, remove.
fn footer_row(ui: &mut Ui, cx: &mut PanelCtx<'_>, source: &Source) {
    let id = source.id;
    ui.horizontal(|ui| {
        let mut locked = source.locked;
        if ui
            .checkbox(&mut locked, "Locked")
            .on_hover_text("The advisor will not change this source")
            .changed()
        {
            cx.push(Command::Source(id, SourceEdit::Locked(locked)));
        }
        ui.with_layout(egui::Layout::right_to_left(egui::Align::Center), |ui| {
            if ui.button("Remove source").clicked() {
                cx.push(Command::RemoveSource(id));
            }
            if ui.button("Duplicate").clicked() {
                cx.push(Command::DuplicateSource(id));
            }
        });
    });
}

fn level_row(
    ui: &mut Ui,
    cx: &mut PanelCtx<'_>,
    source: &Source,
    key_id: Option<u32>,
    figures: Option<&SourceFigures>,
) {
    let plan = cx.plan;
    let id = source.id;
    let key = key_id.and_then(|k| plan.source(k));
    ui.horizontal(|ui| {
        ui.label(theme::caption("Level"));
        match key {
            Some(key) if key.id != id && key.level_lux > 0.0 => {
                let mut stops = if source.level_lux > 0.0 {
                    // A difference of logs: the ratio of two levels can overflow.
                    source.level_lux.log2() - key.level_lux.log2()
                } else {
                    -10.0
                };
                let slider = egui::Slider::new(&mut stops, -8.0..=4.0)
                    .clamping(egui::SliderClamping::Edits)
                    .step_by(0.1)
                    .fixed_decimals(1)
                    .text("stops vs key");
                if ui
                    .add(slider)
                    .on_hover_text("Level before gels, in stops from the key's level")
                    .changed()
                {
                    cx.push(Command::Source(
                        id,
                        SourceEdit::LevelLux(key.level_lux * stops.exp2()),
                    ));
                }
            }
            _ => {
                let mut lux = source.level_lux.max(0.1);
                let slider = egui::Slider::new(&mut lux, 1.0..=200_000.0)
                    .clamping(egui::SliderClamping::Edits)
                    .custom_formatter(format::field_number)
                    .logarithmic(true)
                    .fixed_decimals(0)
                    .suffix(" lx")
                    .text("key level");
                if ui
                    .add(slider)
                    .on_hover_text("The key's illuminance at the subject before gels")
                    .changed()
                {
                    cx.push(Command::Source(id, SourceEdit::LevelLux(lux)));
                }
            }
        }
    });
    ui.horizontal(|ui| {
        let label = ui.label(theme::caption("Typed"));
        let mut lux = source.level_lux;
        let drag = ui
            .add(
                egui::DragValue::new(&mut lux)
                    .custom_formatter(format::field_number)
                    .clamp_existing_to_range(false)
                    .range(0.0..=1.0e6)
                    .speed(5.0)
                    .suffix(" lx"),
            )
            .labelled_by(label.id);
        if drag.changed() {
            cx.push(Command::Source(id, SourceEdit::LevelLux(lux)));
        }
        if let Some(f) = figures {
            let gel = if f.gel_loss_stops > 0.005 {
                format!(" (gels {})", format::stops(Some(-f.gel_loss_stops)))
            } else {
                String::new()
            };
            ui.label(theme::caption(format!(
                "at subject {}{gel}",
                format::lux(f.illuminance_lux)
            )));
            ui.label(theme::caption(format!(
                "{} · Duv {}",
                format::cct(f.cct_k),
                format::duv(f.duv)
            )));
        }
    });
}

fn gel_stack(ui: &mut Ui, cx: &mut PanelCtx<'_>, source: &Source) {
    let plan = cx.plan;
    let id = source.id;
    ui.horizontal(|ui| {
        ui.label(theme::caption(if source.gels.is_empty() {
            "No gels"
        } else {
            "Gels (lamp side first)"
        }));
        let entries = catalog::gels(plan);
        if let Some(entry) =
            widgets::entry_picker(ui, "Add gel…", &entries, &mut cx.view.gel_search, None)
        {
            let gel = if entry.custom {
                GelRef::Custom(entry.id)
            } else {
                GelRef::Library(entry.id)
            };
            cx.push(Command::Source(
                id,
                SourceEdit::AddGel(GelLayer { gel, strength: 1.0 }),
            ));
        }
    });
    let count = source.gels.len();
    for (i, layer) in source.gels.iter().enumerate() {
        ui.push_id(("gel", i), |ui| {
            ui.horizontal(|ui| {
                ui.add_space(8.0);
                let name = catalog::gel_name(plan, &layer.gel);
                ui.allocate_ui_with_layout(
                    egui::vec2(150.0, 18.0),
                    egui::Layout::left_to_right(egui::Align::Center),
                    |ui| {
                        ui.set_width(150.0);
                        ui.add(egui::Label::new(name.clone()).truncate())
                            .on_hover_text(name);
                    },
                );
                egui::ComboBox::from_id_salt("strength")
                    .selected_text(strength_label(layer.strength))
                    .width(56.0)
                    .show_ui(ui, |ui| {
                        for (fraction, label) in STRENGTHS {
                            if ui
                                .selectable_label((layer.strength - fraction).abs() < 1e-9, label)
                                .clicked()
                            {
                                cx.push(Command::Source(id, SourceEdit::GelStrength(i, fraction)));
                            }
                        }
                    })
                    .response
                    .accessible_name("Gel strength");
                let mut typed = layer.strength;
                let drag = ui
                    .add(
                        egui::DragValue::new(&mut typed)
                            .custom_formatter(format::field_number)
                            .clamp_existing_to_range(false)
                            .range(0.0..=4.0)
                            .speed(0.01)
                            .max_decimals(3),
                    )
                    .on_hover_text("Any fraction of the full gel (transmittance to that power)");
                if drag.changed() {
                    cx.push(Command::Source(id, SourceEdit::GelStrength(i, typed)));
                }
                if ui
                    .add_enabled(i > 0, egui::Button::new("Up").small())
                    .on_hover_text("Move towards the lamp")
                    .clicked()
                {
                    cx.push(Command::Source(id, SourceEdit::MoveGel(i, true)));
                }
                if ui
                    .add_enabled(i + 1 < count, egui::Button::new("Down").small())
                    .on_hover_text("Move away from the lamp")
                    .clicked()
                {
                    cx.push(Command::Source(id, SourceEdit::MoveGel(i, false)));
                }
                if ui
                    .small_button("Remove")
                    .on_hover_text("Take this gel off")
                    .clicked()
                {
                    cx.push(Command::Source(id, SourceEdit::RemoveGel(i)));
                }
            });
        });
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn strengths_read_as_trade_fractions() {
        assert_eq!(strength_label(0.5), "1/2");
        assert_eq!(strength_label(1.0), "full");
        assert_eq!(strength_label(0.3), "0.30");
        assert_eq!(strength_label(1e300), "1.00e300");
    }

    #[test]
    fn the_first_key_sets_the_reference() {
        let mut plan = Plan::default();
        assert!(key_source(&plan).is_none());
        plan.sources.push(Source {
            id: 1,
            role: SourceRole::Fill,
            ..Source::default()
        });
        assert_eq!(key_source(&plan).map(|s| s.id), Some(1));
        plan.sources.push(Source {
            id: 2,
            role: SourceRole::Key,
            ..Source::default()
        });
        assert_eq!(key_source(&plan).map(|s| s.id), Some(2));
    }
}
