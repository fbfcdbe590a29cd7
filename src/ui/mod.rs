//! The Lampwright window.
//!
//! The window edits a lighting plan through [`command::Command`]s (one place
//! where the plan changes, so undo is exact), evaluates the plan once after
//! each change through the plan crate, and shows that evaluation: eye and
//! camera swatches side by side, the figures of the light, and plots. The
//! window never computes colour itself.

mod actions;
pub mod advisor;
pub mod app;
pub mod catalog;
pub mod command;
mod compare;
mod dialogs;
pub mod evaluator;
mod export;
pub mod format;
mod help;
pub mod history;
mod panels;
mod plots;
pub mod prefs;
mod readouts;
pub mod theme;
mod upstream;
mod view;
mod widgets;

pub use app::{App, StartOptions};

use std::time::Instant;

/// Default window size, points.
pub const DEFAULT_SIZE: [f32; 2] = [1440.0, 900.0];

/// Open the window and run until it closes.
///
/// Uses the OpenGL (glow) renderer, which also runs on a software
/// rasteriser, so the window opens on machines without a GPU.
pub fn run(options: StartOptions) -> anyhow::Result<()> {
    let started = Instant::now();
    let native_options = eframe::NativeOptions {
        renderer: eframe::Renderer::Glow,
        viewport: egui::ViewportBuilder::default()
            .with_title("Lampwright")
            .with_inner_size(DEFAULT_SIZE)
            .with_min_inner_size([900.0, 600.0])
            .with_app_id("lampwright")
            .with_drag_and_drop(true),
        persist_window: true,
        ..eframe::NativeOptions::default()
    };
    eframe::run_native(
        "Lampwright",
        native_options,
        Box::new(move |cc| Ok(Box::new(App::new(cc, options, started)))),
    )
    .map_err(|err| anyhow::anyhow!("could not open the window: {err}"))
}
