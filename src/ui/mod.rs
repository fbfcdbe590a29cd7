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
mod autosave;
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
pub mod recovery;
pub mod theme;
mod upstream;
mod view;
mod widgets;

pub use actions::starter_plan;
pub use app::{App, StartOptions};

use std::time::Instant;

/// Application id: names the window for the desktop and the data folder.
pub const APP_ID: &str = "lampwright";

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
            .with_app_id(APP_ID)
            .with_drag_and_drop(true),
        persist_window: true,
        // LAMPWRIGHT_DATA_DIR moves the preferences along with the autosaves.
        persistence_path: std::env::var_os(recovery::DATA_DIR_ENV)
            .filter(|v| !v.is_empty())
            .map(|dir| std::path::PathBuf::from(dir).join("app.ron")),
        ..eframe::NativeOptions::default()
    };
    eframe::run_native(
        "Lampwright",
        native_options,
        Box::new(move |cc| Ok(Box::new(App::new(cc, options, started)))),
    )
    .map_err(|err| anyhow::anyhow!("could not open the window: {err}"))
}
