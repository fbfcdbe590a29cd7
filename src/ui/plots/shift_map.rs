//! The shift map: every subject in the CIELAB a*b* plane, with an arrow from
//! where the eye sees it to where the camera puts it.

use crate::ui::theme;
use egui::Color32;
use egui_plot::{Arrows, Legend, Plot, PlotPoint, Points, Text};
use lampwright_plan::Evaluation;

/// Draw the map.
pub fn ui(ui: &mut egui::Ui, eval: &Evaluation, selected: Option<usize>) {
    ui.label(theme::caption(
        "CIELAB a*b* (D65): dot = eye, arrow tip = camera; long arrows are large hue or chroma errors",
    ));
    Plot::new("shift-map")
        .data_aspect(1.0)
        .legend(Legend::default())
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
                        Text::new(
                            "selected",
                            PlotPoint::new(eye[0], eye[1] + 3.0),
                            r.name.clone(),
                        )
                        .color(theme::ACCENT),
                    );
                }
            }
        });
}
