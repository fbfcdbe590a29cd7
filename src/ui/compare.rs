//! The comparison, front and centre: every subject as the eye sees it (left)
//! and as the camera renders it (right), with CIEDE2000 between them.

use super::format::{self, DeltaEBand};
use super::prefs::{Prefs, SortMode};
use super::theme;
use super::view::CentralView;
use super::widgets::{self, PanelCtx};
use egui::{RichText, Sense, Ui, Vec2};
use lampwright_plan::{Evaluation, SubjectResult};

/// Height of each swatch, points (the comparison's whole point: large).
pub const SWATCH_HEIGHT: f32 = 96.0;

/// Draw the central area.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>, eval_error: Option<&str>, prefs: &mut Prefs) {
    ui.horizontal(|ui| {
        for view in CentralView::ALL {
            let text = RichText::new(view.title()).size(15.0);
            ui.selectable_value(&mut cx.view.central, view, text);
        }
    });
    ui.add_space(2.0);
    if let Some(err) = eval_error {
        error_banner(ui, err, cx.eval.is_some());
    }
    match cx.view.central {
        CentralView::Swatches => swatches(ui, cx, prefs),
        CentralView::AcrossZones => across_zones(ui, cx),
        CentralView::Methods => super::help::ui(ui),
    }
}

fn error_banner(ui: &mut Ui, err: &str, has_previous: bool) {
    egui::Frame::new()
        .fill(theme::ERROR_FILL)
        .corner_radius(4)
        .inner_margin(egui::Margin::symmetric(10, 6))
        .show(ui, |ui| {
            ui.set_width(ui.available_width());
            ui.label(RichText::new("This plan cannot be evaluated").strong());
            ui.label(err);
            if has_previous {
                ui.label(theme::caption(
                    "The figures shown (greyed) are from the last plan that could be evaluated.",
                ));
            }
        });
    ui.add_space(4.0);
}

fn summary_line(ui: &mut Ui, eval: &Evaluation) {
    let s = &eval.summary;
    let included = eval.subjects.iter().filter(|r| r.included).count();
    ui.horizontal_wrapped(|ui| match (s.mean_de2000, s.max_de2000) {
        (Some(mean), Some(max)) => {
            ui.label(
                RichText::new(format!("Mean ΔE00 {}", format::delta_e(mean)))
                    .size(16.0)
                    .strong(),
            );
            ui.label(RichText::new(format!("worst {}", format::delta_e(max))).size(16.0));
            if let Some(name) = &s.worst_subject {
                ui.label(RichText::new(format!("({name})")).size(16.0));
            }
            if let Some(p90) = s.p90_de2000 {
                ui.label(theme::caption(format!(
                    "90th percentile {}",
                    format::delta_e(p90)
                )));
            }
            ui.label(theme::caption(format!("over {included} included subjects")));
        }
        _ => {
            ui.label("No included subjects: tick subjects in the editor to get a summary.");
        }
    });
}

fn legend(ui: &mut Ui) {
    ui.horizontal_wrapped(|ui| {
        ui.label(theme::caption(
            "Each pair: eye left, camera right · ΔE00 badges:",
        ));
        for band in DeltaEBand::ALL {
            widgets::badge(ui, band.word(), band.color()).on_hover_text(band.meaning());
        }
        ui.label(theme::caption(
            "· corner mark: outside the display gamut (clipped)",
        ));
    });
}

/// The subjects to show, filtered and sorted.
#[must_use]
pub fn visible_subjects<'a>(
    eval: &'a Evaluation,
    sort: SortMode,
    group: Option<&str>,
    min_de: f64,
    included_only: bool,
) -> Vec<&'a SubjectResult> {
    let mut shown: Vec<&SubjectResult> = eval
        .subjects
        .iter()
        .filter(|r| group.is_none_or(|g| r.group.eq_ignore_ascii_case(g)))
        .filter(|r| min_de <= 0.0 || r.de2000 >= min_de)
        .filter(|r| !included_only || r.included)
        .collect();
    match sort {
        SortMode::PlanOrder => shown.sort_by_key(|r| r.index),
        SortMode::DeltaEHighToLow => {
            shown.sort_by(|a, b| b.de2000.total_cmp(&a.de2000).then(a.index.cmp(&b.index)));
        }
        SortMode::Group => shown.sort_by(|a, b| a.group.cmp(&b.group).then(a.index.cmp(&b.index))),
    }
    shown
}

fn controls(ui: &mut Ui, cx: &mut PanelCtx<'_>, eval: &Evaluation, prefs: &mut Prefs) {
    ui.horizontal_wrapped(|ui| {
        ui.label(theme::caption("Sort"));
        egui::ComboBox::from_id_salt("sort")
            .selected_text(prefs.sort.label())
            .show_ui(ui, |ui| {
                for mode in SortMode::ALL {
                    ui.selectable_value(&mut prefs.sort, mode, mode.label());
                }
            })
            .response
            .accessible_name("Sort");
        ui.label(theme::caption("Group"));
        let mut groups: Vec<&str> = Vec::new();
        for r in &eval.subjects {
            if !groups.contains(&&*r.group) {
                groups.push(&r.group);
            }
        }
        let current = cx
            .view
            .filter_group
            .clone()
            .unwrap_or_else(|| "all groups".into());
        egui::ComboBox::from_id_salt("group-filter")
            .selected_text(current)
            .show_ui(ui, |ui| {
                ui.selectable_value(&mut cx.view.filter_group, None, "all groups");
                for g in groups {
                    ui.selectable_value(&mut cx.view.filter_group, Some(g.to_owned()), g);
                }
            })
            .response
            .accessible_name("Group filter");
        let label = ui.label(theme::caption("ΔE00 at least"));
        ui.add(
            egui::DragValue::new(&mut cx.view.filter_min_de)
                .custom_formatter(format::field_number)
                .clamp_existing_to_range(false)
                .range(0.0..=50.0)
                .speed(0.1)
                .fixed_decimals(1),
        )
        .labelled_by(label.id);
        ui.checkbox(&mut cx.view.filter_included_only, "Included only");
    });
}

fn swatches(ui: &mut Ui, cx: &mut PanelCtx<'_>, prefs: &mut Prefs) {
    let Some(eval) = cx.eval else {
        ui.label("Nothing to show yet.");
        return;
    };
    if cx.stale {
        ui.multiply_opacity(0.45);
    }
    summary_line(ui, eval);
    controls(ui, cx, eval, prefs);
    legend(ui);
    ui.add_space(4.0);
    if eval.subjects.is_empty() {
        ui.label("This plan has no subjects. Add some under Subjects in the editor.");
        return;
    }
    let shown = visible_subjects(
        eval,
        prefs.sort,
        cx.view.filter_group.as_deref(),
        cx.view.filter_min_de,
        cx.view.filter_included_only,
    );
    egui::ScrollArea::vertical()
        .id_salt("swatch-scroll")
        .auto_shrink([false, false])
        .show(ui, |ui| {
            if shown.is_empty() {
                ui.label("No subject passes the filters.");
            }
            // Rows of equal cards, as many columns as fit at 200 points or
            // more (frames do not wrap on their own in a wrapping layout).
            let gap = 10.0;
            let available = ui.available_width() - 4.0;
            let columns = ((available + gap) / (200.0 + gap)).floor().max(1.0);
            let card_w = ((available + gap) / columns - gap).floor();
            ui.spacing_mut().item_spacing = Vec2::splat(gap);
            for row in shown.chunks(columns as usize) {
                ui.horizontal_top(|ui| {
                    for r in row {
                        swatch_card(ui, cx, r, card_w);
                    }
                });
            }
            if !eval.metamers.is_empty() {
                ui.add_space(12.0);
                ui.label(RichText::new("Camera metamers").strong());
                ui.label(theme::caption(
                    "Pairs that match to one observer but not to the other.",
                ));
                for pair in &eval.metamers {
                    let what = if pair.eye_matches {
                        "the eye sees a match the camera breaks"
                    } else {
                        "the camera makes a match the eye does not see"
                    };
                    ui.label(format!(
                        "{} and {}: eye ΔE00 {}, camera ΔE00 {} — {what}",
                        pair.a,
                        pair.b,
                        format::delta_e(pair.eye_de2000),
                        format::delta_e(pair.camera_de2000)
                    ));
                }
            }
        });
}

fn swatch_card(ui: &mut Ui, cx: &mut PanelCtx<'_>, r: &SubjectResult, card_w: f32) {
    let selected = cx.view.selected_subject == Some(r.index);
    let mut frame = theme::card()
        .fill(theme::grey::SWATCH_SURROUND)
        .inner_margin(6);
    if selected {
        frame = frame.stroke(egui::Stroke::new(2.0, theme::ACCENT));
    }
    let inner = frame.show(ui, |ui| {
        ui.vertical(|ui| {
            // Card width less the frame's margins (6 each side) and stroke.
            let width = card_w - 16.0;
            ui.set_width(width);
            ui.spacing_mut().item_spacing = Vec2::new(2.0, 3.0);
            let swatch_w = (width - 2.0) / 2.0;
            ui.horizontal(|ui| {
                let (eye, _) =
                    ui.allocate_exact_size(Vec2::new(swatch_w, SWATCH_HEIGHT), Sense::hover());
                let (cam, _) =
                    ui.allocate_exact_size(Vec2::new(swatch_w, SWATCH_HEIGHT), Sense::hover());
                widgets::paint_swatch(ui, eye, r.eye_rgb8, r.eye_in_gamut);
                widgets::paint_swatch(ui, cam, r.camera_rgb8, r.camera_in_gamut);
            });
            let dark = egui::Color32::from_gray(18);
            ui.horizontal(|ui| {
                ui.add(egui::Label::new(RichText::new(&*r.name).color(dark).strong()).truncate());
                if !r.included {
                    ui.label(
                        RichText::new("(excluded)")
                            .color(egui::Color32::from_gray(40))
                            .small(),
                    );
                }
            });
            ui.horizontal(|ui| {
                let band = DeltaEBand::of(r.de2000);
                ui.label(
                    RichText::new(format!("ΔE00 {}", format::delta_e(r.de2000)))
                        .color(dark)
                        .size(15.0),
                );
                widgets::badge(ui, band.word(), band.color()).on_hover_text(band.meaning());
                if !r.eye_in_gamut || !r.camera_in_gamut {
                    let which = match (r.eye_in_gamut, r.camera_in_gamut) {
                        (false, false) => "both out of gamut",
                        (false, true) => "eye out of gamut",
                        _ => "camera out of gamut",
                    };
                    ui.label(
                        RichText::new(which)
                            .color(egui::Color32::from_gray(30))
                            .small(),
                    );
                }
            });
        });
    });
    let response = inner.response.interact(Sense::click());
    let response = response.on_hover_text(format!(
        "{} ({})\nLeft: eye  L* {:.1} a* {:.1} b* {:.1}\nRight: camera  L* {:.1} a* {:.1} b* {:.1}\nClick to plot its reflectance",
        r.name, r.group, r.eye_lab[0], r.eye_lab[1], r.eye_lab[2], r.camera_lab[0], r.camera_lab[1], r.camera_lab[2]
    ));
    if response.clicked() {
        cx.view.selected_subject = Some(r.index);
    }
}

fn across_zones(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let Some(eval) = cx.eval else {
        ui.label("Nothing to show yet.");
        return;
    };
    if cx.stale {
        ui.multiply_opacity(0.45);
    }
    if eval.subjects.is_empty() {
        ui.label("This plan has no subjects.");
        return;
    }
    let selected = cx.view.selected_subject.unwrap_or(0);
    let current = eval
        .subjects
        .iter()
        .find(|r| r.index == selected)
        .or_else(|| eval.subjects.first());
    ui.horizontal(|ui| {
        ui.label("Subject");
        egui::ComboBox::from_id_salt("zone-subject")
            .selected_text(current.map_or("", |r| &*r.name))
            .show_ui(ui, |ui| {
                for r in &eval.subjects {
                    if ui
                        .selectable_label(Some(r.index) == current.map(|c| c.index), &*r.name)
                        .clicked()
                    {
                        cx.view.selected_subject = Some(r.index);
                    }
                }
            })
            .response
            .accessible_name("Subject");
        ui.label(theme::caption("Top: eye · bottom: camera, in each zone"));
    });
    ui.add_space(6.0);
    let Some(current) = current else { return };
    if eval.zones.len() <= 1 {
        ui.label(theme::caption("The plan has one zone. Add zones (key side, shadow side, background) in the editor to compare."));
    }
    // Zone columns share the width (a horizontal scroll past five zones).
    let n = eval.zones.len().max(1) as f32;
    let width = ((ui.available_width() + 10.0) / n - 10.0 - 16.0).clamp(120.0, 240.0);
    egui::ScrollArea::horizontal()
        .id_salt("zones-scroll")
        .show(ui, |ui| {
            ui.horizontal_top(|ui| {
                for zone in &eval.zones {
                    let result = zone.subjects.iter().find(|r| r.index == current.index);
                    zone_card(ui, zone, result, width);
                }
            });
        });
}

/// One zone's column: its level and light, the subject as the eye sees it
/// (top) and as the camera renders it (bottom).
fn zone_card(
    ui: &mut Ui,
    zone: &lampwright_plan::ZoneEvaluation,
    result: Option<&SubjectResult>,
    width: f32,
) {
    let dark = egui::Color32::from_gray(18);
    let soft = egui::Color32::from_gray(35);
    theme::card()
        .fill(theme::grey::SWATCH_SURROUND)
        .inner_margin(8)
        .show(ui, |ui| {
            ui.vertical(|ui| {
                ui.set_width(width);
                ui.label(RichText::new(&zone.name).strong().color(dark).size(15.0));
                ui.label(
                    RichText::new(format!(
                        "{} · {} · {}",
                        format::lux(zone.light.illuminance_lux),
                        format::stops(zone.stops_from_main),
                        format::cct(zone.light.cct_k)
                    ))
                    .color(soft)
                    .small(),
                );
                let Some(r) = result else {
                    ui.label(RichText::new("not in this zone").color(dark));
                    return;
                };
                ui.spacing_mut().item_spacing.y = 2.0;
                for (rgb8, in_gamut) in [
                    (r.eye_rgb8, r.eye_in_gamut),
                    (r.camera_rgb8, r.camera_in_gamut),
                ] {
                    let (rect, _) =
                        ui.allocate_exact_size(Vec2::new(width, SWATCH_HEIGHT), Sense::hover());
                    widgets::paint_swatch(ui, rect, rgb8, in_gamut);
                }
                ui.horizontal(|ui| {
                    let band = DeltaEBand::of(r.de2000);
                    ui.label(
                        RichText::new(format!("ΔE00 {}", format::delta_e(r.de2000)))
                            .color(dark)
                            .size(15.0),
                    );
                    widgets::badge(ui, band.word(), band.color());
                });
                if let Some(m) = zone.mired_from_white_balance {
                    ui.label(
                        RichText::new(format!("{} mired from white balance", format::signed(m, 0)))
                            .color(soft)
                            .small(),
                    );
                }
            });
        });
}

#[cfg(test)]
mod tests {
    use super::*;

    fn result(index: usize, group: &str, de: f64, included: bool) -> SubjectResult {
        SubjectResult {
            index,
            name: format!("s{index}").into(),
            group: group.into(),
            included,
            de2000: de,
            ..SubjectResult::default()
        }
    }

    #[test]
    fn filters_and_sorts() {
        let eval = Evaluation {
            subjects: vec![
                result(0, "skin", 1.0, true),
                result(1, "food", 5.0, true),
                result(2, "skin", 3.0, false),
            ],
            ..Evaluation::default()
        };
        let idx = |v: Vec<&SubjectResult>| v.iter().map(|r| r.index).collect::<Vec<_>>();
        assert_eq!(
            idx(visible_subjects(
                &eval,
                SortMode::PlanOrder,
                None,
                0.0,
                false
            )),
            vec![0, 1, 2]
        );
        assert_eq!(
            idx(visible_subjects(
                &eval,
                SortMode::DeltaEHighToLow,
                None,
                0.0,
                false
            )),
            vec![1, 2, 0]
        );
        assert_eq!(
            idx(visible_subjects(&eval, SortMode::Group, None, 0.0, false)),
            vec![1, 0, 2]
        );
        assert_eq!(
            idx(visible_subjects(
                &eval,
                SortMode::PlanOrder,
                Some("skin"),
                0.0,
                false
            )),
            vec![0, 2]
        );
        assert_eq!(
            idx(visible_subjects(
                &eval,
                SortMode::PlanOrder,
                None,
                2.0,
                false
            )),
            vec![1, 2]
        );
        assert_eq!(
            idx(visible_subjects(
                &eval,
                SortMode::PlanOrder,
                None,
                0.0,
                true
            )),
            vec![0, 1]
        );
    }
}
