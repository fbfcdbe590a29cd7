//! Camera (sensitivities, white balance, matrix) and viewing (adaptation, display).

use crate::ui::actions::Action;
use crate::ui::catalog;
use crate::ui::command::Command;
use crate::ui::format;
use crate::ui::theme;
use crate::ui::widgets::PanelCtx;
use egui::Ui;
use lampwright_plan::{
    Adaptation, CameraRef, Display, FitMethod, LibraryKind, MatrixMode, WbPreset,
    WhiteBalanceSetting,
};

const PRESETS: [(WbPreset, &str); 5] = [
    (WbPreset::Daylight, "Daylight"),
    (WbPreset::Cloudy, "Cloudy"),
    (WbPreset::Shade, "Shade"),
    (WbPreset::Tungsten, "Tungsten"),
    (WbPreset::Fluorescent, "Fluorescent"),
];

fn wb_label(wb: &WhiteBalanceSetting) -> String {
    match wb {
        WhiteBalanceSetting::Kelvin(k) => format!("Kelvin {k:.0} K"),
        WhiteBalanceSetting::Preset(p) => {
            let name = PRESETS
                .iter()
                .find(|(q, _)| q == p)
                .map_or("preset", |(_, n)| n);
            format!("Preset: {name}")
        }
        WhiteBalanceSetting::GreyCard => "Grey card (custom)".into(),
        WhiteBalanceSetting::AutoGreyWorld => "Auto: grey world".into(),
        WhiteBalanceSetting::AutoBrightestNeutral => "Auto: brightest neutral".into(),
    }
}

fn matrix_label(mode: MatrixMode) -> &'static str {
    match mode {
        MatrixMode::Factory => "Factory (fitted under D65)",
        MatrixMode::DualIlluminant => "Dual-illuminant (D65 + A by mired)",
        MatrixMode::SceneProfile => "Scene profile (fitted under this light)",
    }
}

fn fit_label(fit: FitMethod) -> &'static str {
    match fit {
        FitMethod::Linear => "Least squares",
        FitMethod::WhitePreserving => "White-preserving least squares",
        FitMethod::De2000 => "Refined for CIEDE2000",
        FitMethod::RootPoly => "Root-polynomial (degree 2)",
    }
}

/// Draw the camera and viewing tab.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    ui.heading("Camera");
    egui::Grid::new("camera-grid")
        .num_columns(2)
        .spacing([10.0, 8.0])
        .show(ui, |ui| {
            camera_row(ui, cx);
            white_balance_rows(ui, cx);
            matrix_rows(ui, cx);
        });
    camera_figures(ui, cx);
    viewing(ui, cx);
}

/// Which sensitivities.
fn camera_row(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    let settings = &plan.camera;
    ui.label("Sensitivities");
    ui.horizontal(|ui| {
        egui::ComboBox::from_id_salt("camera")
            .selected_text(catalog::camera_name(plan, &settings.camera))
            .width(220.0)
            .show_ui(ui, |ui| {
                for entry in catalog::cameras(plan) {
                    let camera = if entry.custom {
                        CameraRef::Custom(entry.id.clone())
                    } else {
                        CameraRef::Library(entry.id.clone())
                    };
                    let text = if entry.custom {
                        format!("{} (imported)", entry.name)
                    } else {
                        entry.name.clone()
                    };
                    let r = ui.selectable_label(settings.camera == camera, text);
                    let r = if entry.description.is_empty() {
                        r
                    } else {
                        r.on_hover_text(&entry.description)
                    };
                    if r.clicked() && settings.camera != camera {
                        cx.push(Command::Camera(camera));
                    }
                }
                if ui
                    .selectable_label(
                        settings.camera == CameraRef::Colorimetric,
                        "Ideal colorimetric camera",
                    )
                    .clicked()
                    && settings.camera != CameraRef::Colorimetric
                {
                    cx.push(Command::Camera(CameraRef::Colorimetric));
                }
            })
            .response
            .accessible_name("Sensitivities");
        if ui
            .button("Import…")
            .on_hover_text("Measured r, g, b sensitivities as CSV")
            .clicked()
        {
            cx.actions.push(Action::Import(Some(LibraryKind::Camera)));
        }
    });
    ui.end_row();
}

/// White-balance mode and Kelvin.
fn white_balance_rows(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    let settings = &plan.camera;
    ui.label("White balance");
    egui::ComboBox::from_id_salt("wb")
        .selected_text(wb_label(&settings.white_balance))
        .width(220.0)
        .show_ui(ui, |ui| {
            let current = &settings.white_balance;
            let mut choices = vec![
                WhiteBalanceSetting::GreyCard,
                WhiteBalanceSetting::Kelvin(match current {
                    WhiteBalanceSetting::Kelvin(k) => *k,
                    _ => 5600.0,
                }),
                WhiteBalanceSetting::AutoGreyWorld,
                WhiteBalanceSetting::AutoBrightestNeutral,
            ];
            choices.extend(PRESETS.iter().map(|(p, _)| WhiteBalanceSetting::Preset(*p)));
            for choice in choices {
                let same_kind = std::mem::discriminant(&choice) == std::mem::discriminant(current)
                    && !matches!(choice, WhiteBalanceSetting::Preset(_));
                let checked = same_kind || &choice == current;
                if ui.selectable_label(checked, wb_label(&choice)).clicked() && &choice != current {
                    cx.push(Command::WhiteBalance(choice));
                }
            }
        })
        .response
        .accessible_name("White balance");
    ui.end_row();

    if let WhiteBalanceSetting::Kelvin(k) = settings.white_balance {
        ui.label("");
        let mut kelvin = k;
        let slider = egui::Slider::new(&mut kelvin, 2000.0..=10_000.0)
            .clamping(egui::SliderClamping::Edits)
            .logarithmic(true)
            .step_by(10.0)
            .fixed_decimals(0)
            .suffix(" K")
            .text("white balance");
        if ui.add(slider).changed() {
            cx.push(Command::WhiteBalance(WhiteBalanceSetting::Kelvin(kelvin)));
        }
        ui.end_row();
    }
}

/// Matrix mode and fit.
fn matrix_rows(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    let settings = &plan.camera;
    ui.label("Matrix");
    egui::ComboBox::from_id_salt("matrix")
        .selected_text(matrix_label(settings.matrix))
        .width(220.0)
        .show_ui(ui, |ui| {
            for mode in [
                MatrixMode::Factory,
                MatrixMode::DualIlluminant,
                MatrixMode::SceneProfile,
            ] {
                if ui
                    .selectable_label(settings.matrix == mode, matrix_label(mode))
                    .clicked()
                    && settings.matrix != mode
                {
                    cx.push(Command::Matrix(mode));
                }
            }
        })
        .response
        .accessible_name("Matrix");
    ui.end_row();

    ui.label("Matrix fit");
    egui::ComboBox::from_id_salt("fit")
        .selected_text(fit_label(settings.fit))
        .width(220.0)
        .show_ui(ui, |ui| {
            for fit in [
                FitMethod::Linear,
                FitMethod::WhitePreserving,
                FitMethod::De2000,
                FitMethod::RootPoly,
            ] {
                if ui
                    .selectable_label(settings.fit == fit, fit_label(fit))
                    .clicked()
                    && settings.fit != fit
                {
                    cx.push(Command::Fit(fit));
                }
            }
        })
        .response
        .accessible_name("Matrix fit");
    ui.end_row();
}

/// The camera's figures under this light.
fn camera_figures(ui: &mut Ui, cx: &PanelCtx<'_>) {
    if let Some(eval) = cx.eval {
        let cam = &eval.camera;
        ui.add_space(4.0);
        theme::card().show(ui, |ui| {
            ui.set_width(ui.available_width());
            ui.label(theme::caption("Under this light"));
            ui.label(format!(
                "White balance set for {} · gains R {:.2} G {:.2} B {:.2}",
                format::cct(cam.wb_cct_k),
                cam.wb_gains[0],
                cam.wb_gains[1],
                cam.wb_gains[2]
            ));
            ui.label(format!(
                "Luther residual {:.3} (0 = colorimetric) · µ-factor {:.3} (1 = colorimetric)",
                cam.luther_residual, cam.mu_factor
            ));
        });
    }
}

/// Adaptation and display space.
fn viewing(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let plan = cx.plan;
    ui.add_space(10.0);
    ui.heading("Viewing");
    let viewing = plan.viewing;
    ui.label(theme::caption("Eye side of the swatches"));
    ui.horizontal(|ui| {
        for (value, text, hint) in [
            (
                Adaptation::Adapted,
                "Adapted to the scene white",
                "The eye has adjusted to the light (CAT16 to D65)",
            ),
            (
                Adaptation::AsLit,
                "As lit",
                "No adaptation: the colour of the light shows",
            ),
        ] {
            if ui
                .radio(viewing.adaptation == value, text)
                .on_hover_text(hint)
                .clicked()
                && viewing.adaptation != value
            {
                cx.push(Command::Adaptation(value));
            }
        }
    });
    ui.label(theme::caption("Display"));
    ui.horizontal(|ui| {
        for (value, text, hint) in [
            (Display::Srgb, "sRGB", "For almost every screen"),
            (
                Display::DisplayP3,
                "Display P3",
                "Swatch values encoded for a Display P3 screen; on an sRGB screen they look duller",
            ),
        ] {
            if ui
                .radio(viewing.display == value, text)
                .on_hover_text(hint)
                .clicked()
                && viewing.display != value
            {
                cx.push(Command::Display(value));
            }
        }
    });
}
