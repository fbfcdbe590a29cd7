//! Zones: parts of the scene with their own mix (key side, shadow side,
//! background), and which sources reach each at what level.

use crate::ui::command::Command;
use crate::ui::format;
use crate::ui::theme;
use crate::ui::widgets::PanelCtx;
use egui::Ui;
use lampwright_plan::{Source, Zone, ZoneEvaluation, ZoneId, ZoneLevel};

#[derive(Clone, Copy, PartialEq, Eq)]
enum LevelKind {
    Own,
    Lux,
    Stops,
    Distance,
}

impl LevelKind {
    const ALL: [LevelKind; 4] = [
        LevelKind::Own,
        LevelKind::Lux,
        LevelKind::Stops,
        LevelKind::Distance,
    ];

    fn of(level: &ZoneLevel) -> LevelKind {
        match level {
            ZoneLevel::AsSource => LevelKind::Own,
            ZoneLevel::Lux(_) => LevelKind::Lux,
            ZoneLevel::Stops(_) => LevelKind::Stops,
            ZoneLevel::Distance { .. } => LevelKind::Distance,
        }
    }

    fn label(self) -> &'static str {
        match self {
            LevelKind::Own => "own level",
            LevelKind::Lux => "lux",
            LevelKind::Stops => "stops",
            LevelKind::Distance => "rated at 1 m + distance",
        }
    }

    /// A starting value of this kind, equivalent to the source's own level where possible.
    fn default_level(self, source: &Source) -> ZoneLevel {
        match self {
            LevelKind::Own => ZoneLevel::AsSource,
            LevelKind::Lux => ZoneLevel::Lux(source.level_lux),
            LevelKind::Stops => ZoneLevel::Stops(0.0),
            // At 2 m the inverse-square law needs 4× the level at 1 m.
            LevelKind::Distance => ZoneLevel::Distance {
                rated_lux_at_1m: source.level_lux * 4.0,
                distance_m: 2.0,
            },
        }
    }
}

/// Draw the zones tab.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    ui.label(
        "Zones are parts of the scene with their own mix: the key side of a face, the shadow side, the background. \
         With no zones, the whole scene is one zone lit by every source.",
    );
    ui.horizontal(|ui| {
        let label = ui.label("New zone");
        let field = ui
            .add(
                egui::TextEdit::singleline(&mut cx.view.new_zone_name)
                    .hint_text("e.g. Shadow side")
                    .desired_width(160.0),
            )
            .labelled_by(label.id);
        let enter = field.lost_focus() && ui.input(|i| i.key_pressed(egui::Key::Enter));
        if ui.button("Add zone").clicked() || enter {
            let name = cx.view.new_zone_name.trim();
            let name = if name.is_empty() {
                format!("Zone {}", plan.zones.len() + 1)
            } else {
                name.to_owned()
            };
            cx.push(Command::AddZone(name));
            cx.view.new_zone_name.clear();
        }
    });
    for zone in &plan.zones {
        ui.add_space(6.0);
        let figures = cx
            .eval
            .and_then(|e| e.zones.iter().find(|z| z.zone_id == zone.id));
        zone_card(ui, cx, zone, figures);
    }
}

fn zone_card(ui: &mut Ui, cx: &mut PanelCtx<'_>, zone: &Zone, figures: Option<&ZoneEvaluation>) {
    let plan = cx.plan;
    theme::card().show(ui, |ui| {
        ui.set_width(ui.available_width());
        ui.push_id(("zone", zone.id), |ui| {
            ui.horizontal(|ui| {
                let mut name = zone.name.clone();
                let field = ui
                    .add(
                        egui::TextEdit::singleline(&mut name)
                            .desired_width(180.0)
                            .font(egui::TextStyle::Heading),
                    )
                    .accessible_name("Zone name");
                cx.track_focus(&field);
                if field.changed() {
                    cx.push(Command::RenameZone(zone.id, name));
                }
                ui.with_layout(egui::Layout::right_to_left(egui::Align::Center), |ui| {
                    if ui.button("Remove zone").clicked() {
                        cx.push(Command::RemoveZone(zone.id));
                    }
                    let mut weight = zone.weight;
                    let drag = ui
                        .add(
                            egui::DragValue::new(&mut weight)
                                .custom_formatter(format::field_number)
                                .range(0.0..=10.0)
                                .speed(0.05)
                                .max_decimals(2),
                        )
                        .accessible_name("Zone fidelity weight")
                        .on_hover_text(
                            "How much this zone counts when the advisor improves camera fidelity (0 leaves it out)",
                        );
                    if drag.changed() {
                        cx.push(Command::ZoneWeight(zone.id, weight));
                    }
                    ui.label(theme::caption("Fidelity weight"));
                });
            });
            if let Some(f) = figures {
                ui.label(theme::caption(format!(
                    "{} · {} · Duv {} · {} from main{}",
                    format::lux(f.light.illuminance_lux),
                    format::cct(f.light.cct_k),
                    format::duv(f.light.duv),
                    format::stops(f.stops_from_main),
                    f.mired_from_white_balance
                        .map(|m| format!(" · {} mired from white balance", format::signed(m, 0)))
                        .unwrap_or_default()
                )));
            }
            egui::Grid::new("reach")
                .num_columns(3)
                .spacing([8.0, 4.0])
                .show(ui, |ui| {
                    for source in &plan.sources {
                        ui.push_id(("reach", source.id), |ui| reach_row(ui, cx, zone, source));
                        ui.end_row();
                    }
                });
        });
    });
}

fn reach_row(ui: &mut Ui, cx: &mut PanelCtx<'_>, zone: &Zone, source: &Source) {
    let reach = zone.reach.iter().find(|r| r.source == source.id);
    let mut reaches = reach.is_some();
    let toggled = ui
        .checkbox(&mut reaches, &source.name)
        .on_hover_text("This source reaches the zone")
        .changed();
    if toggled {
        let level = reaches.then_some(ZoneLevel::AsSource);
        cx.push(Command::Reach {
            zone: zone.id,
            source: source.id,
            level,
        });
    }
    let Some(reach) = reach else {
        ui.label(theme::caption("does not reach"));
        return;
    };
    let kind = LevelKind::of(&reach.level);
    egui::ComboBox::from_id_salt("kind")
        .selected_text(kind.label())
        .width(110.0)
        .show_ui(ui, |ui| {
            for k in LevelKind::ALL {
                if ui.selectable_label(k == kind, k.label()).clicked() && k != kind {
                    cx.push(Command::Reach {
                        zone: zone.id,
                        source: source.id,
                        level: Some(k.default_level(source)),
                    });
                }
            }
        })
        .response
        .accessible_name("Level given as");
    ui.horizontal(|ui| level_fields(ui, cx, zone.id, source, &reach.level));
}

/// The number fields of one reach level.
fn level_fields(
    ui: &mut Ui,
    cx: &mut PanelCtx<'_>,
    zone: ZoneId,
    source: &Source,
    level: &ZoneLevel,
) {
    {
        let set = |level: ZoneLevel| Command::Reach {
            zone,
            source: source.id,
            level: Some(level),
        };
        match *level {
            ZoneLevel::AsSource => {
                ui.label(theme::caption(format::lux(source.level_lux)));
            }
            ZoneLevel::Lux(lux) => {
                let mut v = lux;
                if ui
                    .add(
                        egui::DragValue::new(&mut v)
                            .custom_formatter(format::field_number)
                            .clamp_existing_to_range(false)
                            .range(0.0..=1.0e6)
                            .speed(5.0)
                            .suffix(" lx"),
                    )
                    .changed()
                {
                    cx.push(set(ZoneLevel::Lux(v)));
                }
            }
            ZoneLevel::Stops(stops) => {
                let mut v = stops;
                if ui
                    .add(
                        egui::DragValue::new(&mut v)
                            .custom_formatter(format::field_number)
                            .clamp_existing_to_range(false)
                            .range(-12.0..=6.0)
                            .speed(0.05)
                            .fixed_decimals(1)
                            .suffix(" stops"),
                    )
                    .changed()
                {
                    cx.push(set(ZoneLevel::Stops(v)));
                }
            }
            ZoneLevel::Distance {
                rated_lux_at_1m,
                distance_m,
            } => {
                let (mut rated, mut distance) = (rated_lux_at_1m, distance_m);
                let a = ui.add(
                    egui::DragValue::new(&mut rated)
                        .custom_formatter(format::field_number)
                        .clamp_existing_to_range(false)
                        .range(0.0..=1.0e7)
                        .speed(10.0)
                        .suffix(" lx @ 1 m"),
                );
                let b = ui.add(
                    egui::DragValue::new(&mut distance)
                        .custom_formatter(format::field_number)
                        .clamp_existing_to_range(false)
                        .range(0.1..=200.0)
                        .speed(0.05)
                        .fixed_decimals(2)
                        .suffix(" m"),
                );
                if a.changed() || b.changed() {
                    cx.push(set(ZoneLevel::Distance {
                        rated_lux_at_1m: rated,
                        distance_m: distance,
                    }));
                }
            }
        }
    }
}
