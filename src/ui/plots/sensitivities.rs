//! Camera sensitivities beside the CIE 1931 colour-matching functions, so the
//! departure from the Luther condition is visible.

use super::{on_grid, peak};
use crate::ui::theme;
use egui::Color32;
use egui_plot::{Legend, Line, LineStyle, Plot};
use lampwright_color::observer::Observer;
use lampwright_plan::Evaluation;

const RED: Color32 = Color32::from_rgb(0xe0, 0x6c, 0x5c);
const GREEN: Color32 = Color32::from_rgb(0x7c, 0xc0, 0x6a);
const BLUE: Color32 = Color32::from_rgb(0x6a, 0x9a, 0xe6);

/// Draw the plot.
pub fn ui(ui: &mut egui::Ui, eval: &Evaluation) {
    let cam = &eval.camera;
    ui.label(theme::caption(format!(
        "{}: solid r, g, b (each scaled to peak 1) · dashed CIE 1931 colour-matching functions x, y, z (each scaled to peak 1) · \
         Luther residual {:.3}, µ-factor {:.3}",
        cam.name, cam.luther_residual, cam.mu_factor
    )));
    let observer = Observer::cie1931_2deg();
    Plot::new("sensitivity-plot")
        .legend(Legend::default())
        .x_axis_label("wavelength, nm")
        .y_axis_label("relative sensitivity")
        .include_x(360.0)
        .include_x(780.0)
        .include_y(0.0)
        .include_y(1.05)
        .allow_scroll(false)
        .show(ui, |plot| {
            for (values, name, color) in [
                (&observer.x_bar[..], "CIE 1931 x", RED),
                (&observer.y_bar[..], "CIE 1931 y", GREEN),
                (&observer.z_bar[..], "CIE 1931 z", BLUE),
            ] {
                let scale = peak(values);
                let scaled: Vec<f64> = values.iter().map(|v| v / scale).collect();
                if let Some(points) = on_grid(&scaled) {
                    plot.line(
                        Line::new(name, points)
                            .color(color.gamma_multiply(0.8))
                            .style(LineStyle::dashed_dense()),
                    );
                }
            }
            for (values, name, color) in [
                (&cam.sensitivities[0], "camera r", RED),
                (&cam.sensitivities[1], "camera g", GREEN),
                (&cam.sensitivities[2], "camera b", BLUE),
            ] {
                if let Some(points) = on_grid(values) {
                    plot.line(Line::new(name, points).color(color).width(2.0));
                }
            }
        });
}
