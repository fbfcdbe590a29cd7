//! The mixed spectrum with each source's share, and the selected subject's
//! reflectance over the light.

use super::{on_grid, peak};
use crate::ui::theme;
use crate::ui::upstream;
use crate::ui::widgets::source_color;
use egui::Color32;
use egui_plot::{Legend, Line, LineStyle, Plot};
use lampwright_plan::{Evaluation, Plan};

/// Spectral irradiance of the mix and of each lit source.
pub fn mix(ui: &mut egui::Ui, plan: &Plan, eval: &Evaluation) {
    Plot::new("spectrum-plot")
        .legend(Legend::default())
        .x_axis_label("wavelength, nm")
        .y_axis_label("spectral irradiance, W/(m²·nm)")
        .include_x(360.0)
        .include_x(830.0)
        .include_y(0.0)
        .allow_scroll(false)
        .show(ui, |plot| {
            for figures in eval.sources.iter().filter(|f| f.lit) {
                let index = plan
                    .sources
                    .iter()
                    .position(|s| s.id == figures.source_id)
                    .unwrap_or(0);
                if let Some(points) = on_grid(&figures.spectrum) {
                    plot.line(
                        Line::new(figures.name.clone(), points)
                            .color(source_color(index))
                            .width(1.5),
                    );
                }
            }
            if let Some(points) = on_grid(&eval.light.spectrum) {
                plot.line(
                    Line::new("mix at the subject", points)
                        .color(Color32::from_gray(230))
                        .width(2.5),
                );
            }
        });
}

/// The selected subject's reflectance, with the light (scaled to peak 1) behind it.
pub fn reflectance(ui: &mut egui::Ui, plan: &Plan, eval: &Evaluation, selected: Option<usize>) {
    let Some(index) = selected.filter(|&i| i < plan.subjects.len()) else {
        ui.label(theme::caption(
            "Click a subject's swatches to plot its reflectance.",
        ));
        return;
    };
    let name = eval
        .subjects
        .iter()
        .find(|r| r.index == index)
        .map_or_else(|| format!("subject {}", index + 1), |r| r.name.to_string());
    let reflectance = upstream::subject_reflectance(plan, &plan.subjects[index].subject);
    let color = eval
        .subjects
        .iter()
        .find(|r| r.index == index)
        .map_or(Color32::from_gray(200), |r| {
            Color32::from_rgb(r.eye_rgb8[0], r.eye_rgb8[1], r.eye_rgb8[2])
        });
    ui.label(theme::caption(format!(
        "{name}: reflectance 0–1 (solid) over the mixed light scaled to peak 1 (dashed)"
    )));
    Plot::new("reflectance-plot")
        .legend(Legend::default())
        .x_axis_label("wavelength, nm")
        .y_axis_label("reflectance · relative light")
        .include_x(360.0)
        .include_x(830.0)
        .include_y(0.0)
        .include_y(1.0)
        .allow_scroll(false)
        .show(ui, |plot| {
            let light = &eval.light.spectrum;
            let scale = peak(light);
            let scaled: Vec<f64> = light.iter().map(|v| v / scale).collect();
            if let Some(points) = on_grid(&scaled) {
                plot.line(
                    Line::new("light (relative)", points)
                        .color(Color32::from_gray(170))
                        .style(LineStyle::dashed_loose()),
                );
            }
            if let Some(points) = reflectance.as_deref().and_then(on_grid) {
                plot.line(
                    Line::new(name.clone(), points)
                        .color(brighten(color))
                        .width(2.5),
                );
            }
        });
}

/// Dark swatch colours would vanish on the dark plot; lift them.
fn brighten(c: Color32) -> Color32 {
    let max = c.r().max(c.g()).max(c.b());
    if max >= 140 {
        return c;
    }
    let f = 140.0 / f32::from(max.max(1));
    let lift = |x: u8| (f32::from(x) * f).min(255.0) as u8;
    Color32::from_rgb(
        lift(c.r()).max(60),
        lift(c.g()).max(60),
        lift(c.b()).max(60),
    )
}
