//! CIE 1960 uv diagram around the Planckian locus: isotemperature lines, the
//! mix point, each zone's point and each lit source.

use crate::ui::widgets::source_color;
use crate::ui::{format, theme};
use egui::Color32;
use egui_plot::{Line, LineStyle, MarkerShape, Plot, PlotPoint, Points, Text};
use lampwright_color::cct::{isotemperature_line_uv, planckian_uv, uv_from_cct_duv};
use lampwright_plan::Evaluation;

/// Temperatures with an isotemperature line, K.
const ISOTEMPERATURES_K: [f64; 9] = [
    1800.0, 2200.0, 2700.0, 3200.0, 4000.0, 5000.0, 5600.0, 6500.0, 10_000.0,
];
/// Half-length of the isotemperature lines, in Duv.
const ISO_SPAN_DUV: f64 = 0.02;

fn locus_points(duv: f64) -> Vec<[f64; 2]> {
    // Even steps in mired: even spacing along the locus as the eye judges it.
    (0..=240)
        .filter_map(|i| {
            let mired = 1000.0 - f64::from(i) * (1000.0 - 40.0) / 240.0;
            let t = 1e6 / mired;
            let uv = if duv == 0.0 {
                planckian_uv(t)
            } else {
                uv_from_cct_duv(t, duv)
            };
            uv.ok().map(|p| [p.u, p.v])
        })
        .collect()
}

/// Draw the diagram.
pub fn ui(ui: &mut egui::Ui, eval: &Evaluation) {
    ui.label(theme::caption(
        "CIE 1960 uv: Planckian locus (solid), ±0.01 Duv (dotted), isotemperature lines; above the locus reads green, below magenta",
    ));
    let width = ui.available_width();
    let height = (width / 1.5).min(ui.available_height() * 0.62).max(120.0);
    plot(ui, eval, width, height);
    table(ui, eval);
}

/// The points of the diagram as numbers.
fn table(ui: &mut egui::Ui, eval: &Evaluation) {
    egui::ScrollArea::vertical()
        .id_salt("uv-table")
        .show(ui, |ui| {
            egui::Grid::new("uv-grid")
                .num_columns(3)
                .striped(true)
                .spacing([14.0, 2.0])
                .show(ui, |ui| {
                    ui.label(theme::caption("Light"));
                    ui.label(theme::caption("CCT"));
                    ui.label(theme::caption("Duv"));
                    ui.end_row();
                    ui.label(egui::RichText::new("Mix at the subject").color(theme::ACCENT));
                    ui.label(format::cct(eval.light.cct_k));
                    ui.label(format::duv(eval.light.duv));
                    ui.end_row();
                    for (i, s) in eval.sources.iter().enumerate().filter(|(_, s)| s.lit) {
                        ui.label(egui::RichText::new(&s.name).color(source_color(i)));
                        ui.label(format::cct(s.cct_k));
                        ui.label(format::duv(s.duv));
                        ui.end_row();
                    }
                    if eval.zones.len() > 1 {
                        for z in &eval.zones {
                            ui.label(format!("Zone: {}", z.name));
                            ui.label(format::cct(z.light.cct_k));
                            ui.label(format::duv(z.light.duv));
                            ui.end_row();
                        }
                    }
                });
        });
}

fn plot(ui: &mut egui::Ui, eval: &Evaluation, width: f32, height: f32) {
    Plot::new("uv-plot")
        .width(width)
        .height(height)
        .data_aspect(1.0)
        .x_axis_label("u (CIE 1960)")
        .y_axis_label("v (CIE 1960)")
        .default_x_bounds(0.17, 0.34)
        .default_y_bounds(0.27, 0.37)
        .allow_scroll(false)
        .show(ui, |plot| {
            plot.line(
                Line::new("Planckian locus", locus_points(0.0))
                    .color(Color32::from_gray(200))
                    .width(1.5),
            );
            for duv in [0.01, -0.01] {
                plot.line(
                    Line::new("±0.01 Duv", locus_points(duv))
                        .color(Color32::from_gray(120))
                        .style(LineStyle::dotted_dense()),
                );
            }
            for t in ISOTEMPERATURES_K {
                if let Ok([low, high]) = isotemperature_line_uv(t, ISO_SPAN_DUV) {
                    plot.line(
                        Line::new(
                            "isotemperature lines",
                            vec![[low.u, low.v], [high.u, high.v]],
                        )
                        .color(Color32::from_gray(95)),
                    );
                    plot.text(
                        Text::new(
                            "isotemperature lines",
                            PlotPoint::new(high.u, high.v + 0.002),
                            format!("{t:.0} K"),
                        )
                        .color(theme::grey::CAPTION),
                    );
                }
            }
            for (i, source) in eval.sources.iter().enumerate().filter(|(_, s)| s.lit) {
                if let (Some(cct), Some(duv)) = (source.cct_k, source.duv)
                    && let Ok(uv) = uv_from_cct_duv(cct, duv)
                {
                    plot.points(
                        Points::new(source.name.clone(), vec![[uv.u, uv.v]])
                            .shape(MarkerShape::Diamond)
                            .radius(5.0)
                            .color(source_color(i)),
                    );
                }
            }
            if eval.zones.len() > 1 {
                for zone in &eval.zones {
                    if let Some([u, v]) = zone.light.uv {
                        plot.points(
                            Points::new("zones", vec![[u, v]])
                                .shape(MarkerShape::Square)
                                .radius(4.0)
                                .color(Color32::from_gray(220)),
                        );
                        plot.text(
                            Text::new("zones", PlotPoint::new(u + 0.004, v), zone.name.clone())
                                .color(theme::grey::TEXT),
                        );
                    }
                }
            }
            if let Some([u, v]) = eval.light.uv {
                let label = format!(
                    "mix {} Duv {}",
                    format::cct(eval.light.cct_k),
                    format::duv(eval.light.duv)
                );
                plot.points(
                    Points::new(label, vec![[u, v]])
                        .radius(7.0)
                        .color(theme::ACCENT)
                        .filled(true),
                );
            }
        });
}
