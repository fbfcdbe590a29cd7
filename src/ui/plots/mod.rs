//! Plots in the bottom panel: spectra, reflectance, camera versus observer,
//! chromaticity, TM-30 and the a*b* shift map. They draw the evaluation and
//! standard data; they compute no colour.

mod chromaticity;
mod sensitivities;
mod shift_map;
mod spectra;
mod tm30;

use super::theme;
use super::view::PlotTab;
use super::widgets::PanelCtx;
use lampwright_color::{GRID_LEN, spectrum::grid_wavelength_nm};

/// Draw the plot panel.
pub fn ui(ui: &mut egui::Ui, cx: &mut PanelCtx<'_>) {
    ui.add_space(4.0);
    ui.horizontal_wrapped(|ui| {
        for tab in PlotTab::ALL {
            ui.selectable_value(&mut cx.view.plot_tab, tab, tab.title());
        }
    });
    let Some(eval) = cx.eval else {
        ui.label(theme::caption(
            "No plots yet: the plan has not been evaluated.",
        ));
        return;
    };
    if cx.stale {
        ui.multiply_opacity(0.45);
    }
    match cx.view.plot_tab {
        PlotTab::Spectrum => spectra::mix(ui, cx.plan, eval),
        PlotTab::Reflectance => spectra::reflectance(ui, cx.plan, eval, cx.view.selected_subject),
        PlotTab::Sensitivities => sensitivities::ui(ui, eval),
        PlotTab::Chromaticity => chromaticity::ui(ui, eval),
        PlotTab::Tm30 => tm30::ui(ui, eval),
        PlotTab::ShiftMap => shift_map::ui(ui, eval, cx.view.selected_subject),
    }
}

/// Points (wavelength, value) of a curve on the 360–830 nm grid; `None` when
/// the curve is not on the grid.
pub(crate) fn on_grid(values: &[f64]) -> Option<Vec<[f64; 2]>> {
    (values.len() == GRID_LEN).then(|| {
        values
            .iter()
            .enumerate()
            .map(|(i, v)| [grid_wavelength_nm(i), *v])
            .collect()
    })
}

/// The largest finite value of a curve (1 when none is positive), for scaling.
pub(crate) fn peak(values: &[f64]) -> f64 {
    let max = values
        .iter()
        .copied()
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max);
    if max > 0.0 { max } else { 1.0 }
}
