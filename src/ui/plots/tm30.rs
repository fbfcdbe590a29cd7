//! TM-30 colour-vector graphic and the 16 hue-bin chroma shifts, from the
//! evaluation's per-bin figures.

use crate::ui::{format, theme};
use egui::Color32;
use egui_plot::{Arrows, Bar, BarChart, Line, Plot, PlotPoint, Points, Text};
use lampwright_plan::{Evaluation, TM30_BINS};
use std::f64::consts::TAU;

/// A fixed colour per hue bin, to find bins at a glance (a display aid, not a
/// colour computation: an even walk round a hue wheel starting at red).
fn bin_color(j: usize) -> Color32 {
    let hue = j as f32 / TM30_BINS as f32;
    egui::ecolor::Hsva::new(hue, 0.55, 0.85, 1.0).into()
}

/// Draw the two plots side by side.
pub fn ui(ui: &mut egui::Ui, eval: &Evaluation) {
    let light = &eval.light;
    let Some(bins) = light
        .tm30_bins
        .as_ref()
        .filter(|b| b.reference_ab.len() == TM30_BINS && b.test_ab.len() == TM30_BINS)
    else {
        ui.label(theme::caption(
            "TM-30 figures are not available for this light.",
        ));
        return;
    };
    ui.label(theme::caption(format!(
        "TM-30 Rf {} · Rg {} — top: each hue bin's average moves from the reference circle (grey) to the test light (arrows); \
         bottom: chroma shift per bin, %",
        format::integer(light.tm30_rf),
        format::integer(light.tm30_rg)
    )));
    let side = ui
        .available_width()
        .min(ui.available_height() * 0.58)
        .max(120.0);
    ui.vertical_centered(|ui| vector_graphic(ui, bins, side));
    let rest = ui.available_height().max(100.0);
    chroma_bars(ui, bins, rest);
}

fn vector_graphic(ui: &mut egui::Ui, bins: &lampwright_plan::Tm30Bins, side: f32) {
    let circle: Vec<[f64; 2]> = (0..=120)
        .map(|i| {
            let a = TAU * f64::from(i) / 120.0;
            [a.cos(), a.sin()]
        })
        .collect();
    let mut origins = Vec::new();
    let mut tips = Vec::new();
    let mut test_polygon = Vec::new();
    for j in 0..TM30_BINS {
        let [ar, br] = bins.reference_ab[j];
        let [at, bt] = bins.test_ab[j];
        let radius = ar.hypot(br);
        if radius <= 0.0 || !radius.is_finite() {
            continue;
        }
        // Normalised as in TM-30: the reference average sits on the unit
        // circle at the bin's centre hue, the test average moves by the same
        // offset scaled by the reference radius.
        let theta = TAU * (j as f64 + 0.5) / TM30_BINS as f64;
        let (c, s) = (theta.cos(), theta.sin());
        let tip = [c + (at - ar) / radius, s + (bt - br) / radius];
        origins.push([c, s]);
        tips.push(tip);
        test_polygon.push(tip);
    }
    if let Some(first) = test_polygon.first().copied() {
        test_polygon.push(first);
    }
    Plot::new("tm30-cvg")
        .width(side)
        .height(side)
        .data_aspect(1.0)
        .show_axes(false)
        .show_grid(false)
        .default_x_bounds(-1.5, 1.5)
        .default_y_bounds(-1.5, 1.5)
        .allow_scroll(false)
        .allow_drag(false)
        .allow_zoom(false)
        .show(ui, |plot| {
            plot.line(
                Line::new("reference", circle)
                    .color(Color32::from_gray(150))
                    .width(1.5),
            );
            plot.line(
                Line::new("test light", test_polygon)
                    .color(theme::ACCENT)
                    .width(2.0),
            );
            for (j, (o, t)) in origins.iter().zip(&tips).enumerate() {
                plot.arrows(
                    Arrows::new("hue-bin shifts", vec![*o], vec![*t])
                        .color(bin_color(j))
                        .tip_length(8.0),
                );
                plot.points(
                    Points::new("hue-bin shifts", vec![*o])
                        .radius(2.5)
                        .color(bin_color(j)),
                );
            }
            for j in [0usize, 4, 8, 12] {
                let theta = TAU * (j as f64 + 0.5) / TM30_BINS as f64;
                plot.text(
                    Text::new(
                        "labels",
                        PlotPoint::new(1.32 * theta.cos(), 1.32 * theta.sin()),
                        format!("bin {}", j + 1),
                    )
                    .color(theme::grey::CAPTION),
                );
            }
        });
}

fn chroma_bars(ui: &mut egui::Ui, bins: &lampwright_plan::Tm30Bins, height: f32) {
    let bars: Vec<Bar> = bins
        .rcs_hj
        .iter()
        .enumerate()
        .filter(|(_, v)| v.is_finite())
        .map(|(j, v)| {
            Bar::new((j + 1) as f64, v * 100.0)
                .fill(bin_color(j))
                .name(format!("bin {}", j + 1))
                .width(0.8)
        })
        .collect();
    Plot::new("tm30-rcs")
        .height(height)
        .x_axis_label("hue bin")
        .y_axis_label("chroma shift Rcs,h, %")
        .include_y(-20.0)
        .include_y(20.0)
        .y_axis_formatter(|mark, _| format!("{:+.0}", mark.value))
        .include_x(0.5)
        .include_x(16.5)
        .allow_scroll(false)
        .show(ui, |plot| {
            plot.bar_chart(BarChart::new("chroma shift", bars));
        });
}
