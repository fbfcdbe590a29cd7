//! The shift map: every subject in the CIELAB a*b* plane, with an arrow from
//! where the eye sees it to where the camera puts it.

use crate::ui::{format, theme};
use egui::Color32;
use egui_plot::{Arrows, Plot, PlotPoint, Points, Text};
use lampwright_plan::Evaluation;

/// Draw the map.
pub fn ui(ui: &mut egui::Ui, eval: &Evaluation, selected: Option<usize>) {
    ui.label(theme::caption(
        "CIELAB a*b* (D65): dot = eye, arrow tip = camera; long arrows are large hue or chroma errors",
    ));
    let side = ui
        .available_width()
        .min(ui.available_height() * 0.6)
        .max(120.0);
    ui.vertical_centered(|ui| plot(ui, eval, selected, side));
    table(ui, eval, selected);
}

fn plot(ui: &mut egui::Ui, eval: &Evaluation, selected: Option<usize>, side: f32) {
    Plot::new("shift-map")
        .width(side)
        .height(side)
        .data_aspect(1.0)
        .x_axis_label("a*  (green − / red +)")
        .y_axis_label("b*  (blue − / yellow +)")
        .include_x(-40.0)
        .include_x(40.0)
        .include_y(-40.0)
        .include_y(40.0)
        .allow_scroll(false)
        .show(ui, |plot| {
            for r in &eval.subjects {
                let eye = [r.eye_lab[1], r.eye_lab[2]];
                let cam = [r.camera_lab[1], r.camera_lab[2]];
                let color = Color32::from_rgb(r.eye_rgb8[0], r.eye_rgb8[1], r.eye_rgb8[2]);
                let is_selected = selected == Some(r.index);
                let arrow_color = if is_selected {
                    theme::ACCENT
                } else {
                    Color32::from_gray(200)
                };
                plot.arrows(
                    Arrows::new("eye to camera", vec![eye], vec![cam])
                        .color(arrow_color)
                        .tip_length(7.0),
                );
                plot.points(
                    Points::new("subjects (eye)", vec![eye])
                        .radius(if is_selected { 6.0 } else { 4.5 })
                        .color(color)
                        .filled(true),
                );
                if is_selected {
                    plot.text(
                        Text::new("selected", PlotPoint::new(eye[0], eye[1] + 3.0), &*r.name)
                            .color(theme::ACCENT),
                    );
                }
            }
        });
}

/// The subjects, largest difference first, with their CIELAB values.
fn table(ui: &mut egui::Ui, eval: &Evaluation, selected: Option<usize>) {
    let mut rows: Vec<_> = eval.subjects.iter().collect();
    rows.sort_by(|a, b| b.de2000.total_cmp(&a.de2000));
    egui::ScrollArea::vertical()
        .id_salt("shift-table")
        .show(ui, |ui| {
            egui::Grid::new("shift-grid")
                .num_columns(4)
                .striped(true)
                .spacing([14.0, 2.0])
                .show(ui, |ui| {
                    ui.label(theme::caption("Subject"));
                    ui.label(theme::caption("eye L* a* b*"));
                    ui.label(theme::caption("camera L* a* b*"));
                    ui.label(theme::caption("ΔE00"));
                    ui.end_row();
                    for r in rows {
                        let name = egui::RichText::new(&*r.name);
                        let name = if selected == Some(r.index) {
                            name.color(theme::ACCENT)
                        } else {
                            name
                        };
                        ui.label(name);
                        ui.monospace(lab(r.eye_lab));
                        ui.monospace(lab(r.camera_lab));
                        ui.monospace(format::delta_e(r.de2000));
                        ui.end_row();
                    }
                });
        });
}

fn lab(v: [f64; 3]) -> String {
    format!("{:5.1} {:6.1} {:6.1}", v[0], v[1], v[2])
}
