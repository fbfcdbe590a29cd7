//! The application: the plan being edited, its history and evaluation, and
//! the frame loop that ties the panels together.
//!
//! Each frame: read shortcuts and dropped files, draw (widgets only read the
//! plan and the cached evaluation, and push commands and actions), then apply
//! the commands in one place, evaluate once if the plan changed, and run the
//! file actions.

pub use super::actions::Action;
use super::command::{self, Command};
use super::dialogs::Dialog;
use super::evaluator::Evaluator;
use super::history::History;
use super::prefs::{self, Prefs};
use super::view::ViewState;
use super::widgets::PanelCtx;
use super::{compare, panels, plots, readouts, theme, upstream};
use egui::{Key, KeyboardShortcut, Modifiers};
use lampwright_plan::{Evaluation, Plan};
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

/// How the window starts.
#[derive(Debug, Clone, Default)]
pub struct StartOptions {
    /// Plan file to open instead of the demo plan.
    pub plan_path: Option<PathBuf>,
    /// A start-up view (see [`ViewState::apply_start_view`]), for screenshots.
    pub start_view: Option<String>,
    /// Try the desktop's file dialogs before the in-window browser.
    pub system_dialogs: bool,
    /// Print the time to the first frame on standard error.
    pub log_first_frame: bool,
    /// Folder of the autosaves, where plans left by a crash are looked for
    /// at start (`None`: no autosave).
    pub recovery_dir: Option<PathBuf>,
    /// How long unsaved changes wait before they are autosaved (zero: at the
    /// end of the frame that made them).
    pub autosave_interval: Duration,
}

impl StartOptions {
    /// Options for a normal start, reading `LAMPWRIGHT_VIEW` (start-up view),
    /// `LAMPWRIGHT_LOG_FIRST_FRAME` (print the first-frame time) and
    /// `LAMPWRIGHT_DATA_DIR` (where autosaves go, see [`super::recovery`]).
    #[must_use]
    pub fn from_env(plan_path: Option<PathBuf>) -> StartOptions {
        StartOptions {
            plan_path,
            start_view: std::env::var("LAMPWRIGHT_VIEW").ok(),
            system_dialogs: std::env::var_os("LAMPWRIGHT_NO_SYSTEM_DIALOGS").is_none(),
            log_first_frame: std::env::var_os("LAMPWRIGHT_LOG_FIRST_FRAME").is_some(),
            recovery_dir: super::recovery::default_dir(),
            autosave_interval: super::recovery::AUTOSAVE_INTERVAL,
        }
    }

    /// Options for headless tests: demo plan, in-window file browser only,
    /// no autosave.
    #[must_use]
    pub fn headless() -> StartOptions {
        StartOptions::default()
    }
}

/// A message for the status line.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Notice {
    /// The text, one line.
    pub text: String,
    /// An error (shown in the warning colour).
    pub is_error: bool,
}

/// The Lampwright window.
// The flags are independent (closing allowed, dialog choice, first-frame
// log, text focus, restored unsaved); folding them into an enum would not say more.
#[allow(clippy::struct_excessive_bools)]
pub struct App {
    pub(super) plan: Plan,
    pub(super) path: Option<PathBuf>,
    /// The plan as last opened or saved, to know whether there are unsaved changes.
    pub(super) saved: Plan,
    /// Unsaved whatever `saved` says (a plan restored from an autosave).
    pub(super) force_dirty: bool,
    /// This window's autosave slot.
    pub(super) autosave: Option<super::recovery::Autosaver>,
    /// Plans left by windows that closed without saving, waiting for an answer.
    pub(super) recovered: Vec<super::recovery::Recovered>,
    pub(super) history: History,
    pub(super) evaluator: Evaluator,
    pub(super) prefs: Prefs,
    pub(super) view: ViewState,
    pending: Vec<Command>,
    pub(super) actions: Vec<Action>,
    pub(super) notices: Vec<Notice>,
    pub(super) dialog: Option<Dialog>,
    pub(super) advisor: super::advisor::AdvisorState,
    pub(super) allow_close: bool,
    /// What to do once a first save succeeds: the action the unsaved-changes
    /// prompt interrupted when the plan had no file yet ("Save", then go on).
    pub(super) after_save: Option<super::actions::Action>,
    pub(super) system_dialogs: bool,
    started: Instant,
    first_frame_ms: Option<f64>,
    log_first_frame: bool,
    text_focus: bool,
    title: String,
}

impl App {
    /// Build the app for eframe (also used by the headless tests).
    #[must_use]
    pub fn new(cc: &eframe::CreationContext<'_>, options: StartOptions, started: Instant) -> App {
        theme::apply(&cc.egui_ctx);
        let prefs: Prefs = cc
            .storage
            .and_then(|s| eframe::get_value::<Prefs>(s, prefs::STORAGE_KEY))
            .map(Prefs::bounded)
            .unwrap_or_default();
        let (plan, demo_error) = match upstream::demo_plan() {
            Ok(plan) => (plan, None),
            Err(err) => (Plan::default(), Some(err)),
        };
        let mut app = App::with_plan(plan, prefs, started);
        if let Some(err) = demo_error {
            app.notify_error(err);
        }
        app.system_dialogs = options.system_dialogs && app.prefs.system_dialogs;
        app.log_first_frame = options.log_first_frame;
        if let Some(spec) = options.start_view {
            app.view.apply_start_view(&spec);
            // "advise=quality" (or fidelity, worst, white) starts the advisor at once.
            let goal = spec
                .split(',')
                .find_map(|part| part.trim().strip_prefix("advise="));
            if let Some(goal) = goal.and_then(super::advisor::GoalKind::from_name) {
                app.advisor.goal = goal;
                app.advisor.start(&app.plan);
            }
        }
        if let Some(path) = options.plan_path {
            app.open_path(&path);
        }
        if let Some(dir) = &options.recovery_dir {
            app.start_recovery(dir, options.autosave_interval);
        }
        app
    }

    fn with_plan(plan: Plan, prefs: Prefs, started: Instant) -> App {
        let mut evaluator = Evaluator::default();
        evaluator.refresh(&plan);
        let selected = (!plan.subjects.is_empty()).then_some(0);
        let mut app = App {
            saved: plan.clone(),
            force_dirty: false,
            autosave: None,
            recovered: Vec::new(),
            plan,
            path: None,
            history: History::default(),
            evaluator,
            prefs,
            view: ViewState::default(),
            pending: Vec::new(),
            actions: Vec::new(),
            notices: Vec::new(),
            dialog: None,
            advisor: super::advisor::AdvisorState::default(),
            allow_close: false,
            after_save: None,
            system_dialogs: false,
            started,
            first_frame_ms: None,
            log_first_frame: false,
            text_focus: false,
            title: String::new(),
        };
        app.view.selected_subject = selected;
        app
    }

    /// The plan being edited.
    #[must_use]
    pub fn plan(&self) -> &Plan {
        &self.plan
    }

    /// The evaluation on screen (the last good one when the latest failed).
    #[must_use]
    pub fn evaluation(&self) -> Option<&Evaluation> {
        self.evaluator.evaluation()
    }

    /// The error of the latest evaluation, if it failed.
    #[must_use]
    pub fn evaluation_error(&self) -> Option<&str> {
        self.evaluator.error()
    }

    /// How many times the plan was evaluated since the window opened.
    #[must_use]
    pub fn evaluation_count(&self) -> u64 {
        self.evaluator.count()
    }

    /// Messages shown in the status line, oldest first.
    #[must_use]
    pub fn notices(&self) -> &[Notice] {
        &self.notices
    }

    /// The plan file, if the plan has been opened from or saved to one.
    #[must_use]
    pub fn path(&self) -> Option<&Path> {
        self.path.as_deref()
    }

    /// The plan has changes not saved to its file.
    #[must_use]
    pub fn is_dirty(&self) -> bool {
        self.force_dirty || self.plan != self.saved
    }

    /// Number of undo steps available.
    #[must_use]
    pub fn undo_len(&self) -> usize {
        self.history.undo_len()
    }

    /// Number of redo steps available.
    #[must_use]
    pub fn redo_len(&self) -> usize {
        self.history.redo_len()
    }

    /// Time from process start to the end of the first frame, ms.
    #[must_use]
    pub fn first_frame_ms(&self) -> Option<f64> {
        self.first_frame_ms
    }

    /// Queue a command as a widget would (for tests and scripted use).
    pub fn push_command(&mut self, command: Command) {
        self.pending.push(command);
    }

    /// Apply the queued commands now and re-evaluate once if the plan changed.
    /// Returns whether it changed.
    pub fn apply_pending(&mut self) -> bool {
        let mut changed = false;
        for command in std::mem::take(&mut self.pending) {
            let before = self.plan.clone();
            let key = command.coalesce_key();
            match command::apply(&mut self.plan, command) {
                Ok(()) if self.plan != before => {
                    self.history.record(&before, key);
                    changed = true;
                }
                Ok(()) => {}
                Err(err) => self.notify_error(err.to_string()),
            }
        }
        if changed {
            self.after_plan_change();
        }
        changed
    }

    /// Re-evaluate after the plan changed and keep selections valid.
    pub(super) fn after_plan_change(&mut self) {
        self.evaluator.refresh(&self.plan);
        let n = self.plan.subjects.len();
        self.view.selected_subject = match self.view.selected_subject {
            _ if n == 0 => None,
            Some(i) if i >= n => Some(n - 1),
            None => Some(0),
            keep => keep,
        };
    }

    /// Replace the plan with one opened from a file or made new (not undoable:
    /// the history starts again).
    pub(super) fn replace_plan(&mut self, plan: Plan, path: Option<PathBuf>) {
        self.saved = plan.clone();
        self.force_dirty = false;
        self.plan = plan;
        self.path = path;
        self.history.clear();
        self.view.selected_subject = None;
        self.after_plan_change();
    }

    /// Step back one edit.
    pub fn undo(&mut self) {
        if self.history.undo(&mut self.plan) {
            self.after_plan_change();
        } else {
            self.notify("Nothing to undo");
        }
    }

    /// Step forward one edit.
    pub fn redo(&mut self) {
        if self.history.redo(&mut self.plan) {
            self.after_plan_change();
        } else {
            self.notify("Nothing to redo");
        }
    }

    /// Show an information message.
    pub(super) fn notify(&mut self, text: impl Into<String>) {
        self.push_notice(text.into(), false);
    }

    /// Show an error message.
    pub(super) fn notify_error(&mut self, text: impl Into<String>) {
        self.push_notice(text.into(), true);
    }

    fn push_notice(&mut self, text: String, is_error: bool) {
        self.notices.push(Notice { text, is_error });
        if self.notices.len() > 50 {
            self.notices.remove(0);
        }
    }

    fn shortcuts(&mut self, ctx: &egui::Context) {
        let typing = ctx.egui_wants_keyboard_input();
        let cmd = Modifiers::COMMAND;
        let cmd_shift = Modifiers::COMMAND | Modifiers::SHIFT;
        let pressed = |m: Modifiers, k: Key| {
            ctx.input_mut(|i| i.consume_shortcut(&KeyboardShortcut::new(m, k)))
        };
        // Shift variants first: consume_shortcut ignores extra Shift.
        if pressed(cmd_shift, Key::S) {
            self.actions.push(Action::SaveAs);
        } else if pressed(cmd, Key::S) {
            self.actions.push(Action::Save);
        }
        if pressed(cmd, Key::N) {
            self.actions.push(Action::New);
        }
        if pressed(cmd, Key::O) {
            self.actions.push(Action::Open);
        }
        if pressed(cmd, Key::Q) {
            self.actions.push(Action::Quit);
        }
        if !typing {
            if pressed(cmd_shift, Key::Z) || pressed(cmd, Key::Y) {
                self.actions.push(Action::Redo);
            } else if pressed(cmd, Key::Z) {
                self.actions.push(Action::Undo);
            }
        }
    }

    fn dropped_files(&mut self, ctx: &egui::Context) {
        let dropped: Vec<PathBuf> = ctx.input(|i| {
            i.raw
                .dropped_files
                .iter()
                .map(|f| f.path().to_path_buf())
                .collect()
        });
        for path in dropped {
            self.actions.push(Action::Dropped(path));
        }
    }

    fn close_request(&mut self, ctx: &egui::Context) {
        if ctx.input(|i| i.viewport().close_requested()) && self.is_dirty() && !self.allow_close {
            ctx.send_viewport_cmd(egui::ViewportCommand::CancelClose);
            self.dialog = Some(Dialog::Unsaved {
                then: Action::ForceQuit,
            });
        }
    }

    fn update_title(&mut self, ctx: &egui::Context) {
        let file = self
            .path
            .as_ref()
            .and_then(|p| p.file_name())
            .map(|n| format!(" ({})", n.to_string_lossy()))
            .unwrap_or_default();
        let dirty = if self.is_dirty() { " •" } else { "" };
        let title = format!("{}{file}{dirty} — Lampwright", self.plan.name);
        if title != self.title {
            ctx.send_viewport_cmd(egui::ViewportCommand::Title(title.clone()));
            self.title = title;
        }
    }

    fn draw(&mut self, ui: &mut egui::Ui) {
        let dirty = self.is_dirty();
        let stale = self.evaluator.is_stale();
        let eval_error = self.evaluator.error().map(str::to_owned);
        let eval = self.evaluator.evaluation();
        let mut text_focus = false;
        let mut cx = PanelCtx {
            plan: &self.plan,
            eval,
            stale,
            view: &mut self.view,
            out: &mut self.pending,
            actions: &mut self.actions,
            text_focus: &mut text_focus,
            advisor: &mut self.advisor,
        };

        egui::Panel::top("menu").show(ui, |ui| {
            super::actions::menu_bar(
                ui,
                &mut cx,
                &mut self.prefs,
                self.history.undo_len(),
                self.history.redo_len(),
            );
        });
        if self.prefs.show_readouts {
            egui::Panel::top("readouts")
                .frame(
                    egui::Frame::side_top_panel(ui.style())
                        .inner_margin(egui::Margin::symmetric(8, 6)),
                )
                .show(ui, |ui| readouts::ui(ui, &mut cx));
        }
        egui::Panel::bottom("status").show(ui, |ui| {
            status_line(
                ui,
                &self.notices,
                self.path.as_deref(),
                dirty,
                &self.evaluator,
            );
        });
        if self.prefs.show_plots {
            egui::Panel::right("plots")
                .resizable(true)
                .default_size(420.0)
                .size_range(300.0..=900.0)
                .show(ui, |ui| plots::ui(ui, &mut cx));
        }
        if self.prefs.show_editor {
            egui::Panel::left("editor")
                .resizable(true)
                .default_size(400.0)
                .size_range(340.0..=720.0)
                .show(ui, |ui| panels::ui(ui, &mut cx));
        }
        egui::CentralPanel::default()
            .frame(egui::Frame::central_panel(ui.style()).fill(theme::grey::BASE))
            .show(ui, |ui| {
                compare::ui(ui, &mut cx, eval_error.as_deref(), &mut self.prefs);
            });
        drop_overlay(ui.ctx());
        self.text_focus = text_focus;
    }

    /// One frame of the window: input, drawing, then the changes.
    fn frame(&mut self, ui: &mut egui::Ui) {
        let ctx = ui.ctx().clone();
        self.shortcuts(&ctx);
        if self.advisor.poll() {
            self.notify("The advisor has answered (see the Advisor tab)");
        }
        if self.advisor.running_for_s().is_some() {
            ctx.request_repaint_after(std::time::Duration::from_millis(150));
        }
        self.dropped_files(&ctx);
        self.close_request(&ctx);
        self.draw(ui);
        super::dialogs::show(self, &ctx);

        if self.apply_pending() {
            ctx.request_repaint();
        }
        let actions = std::mem::take(&mut self.actions);
        for action in actions {
            self.run_action(&ctx, action);
        }
        // A drag or a typing burst ends when the pointer is up and no text
        // field has focus; the next edit is a new undo step.
        let pointer_down = ctx.input(|i| i.pointer.any_down());
        if !pointer_down && !self.text_focus {
            self.history.seal(&self.plan);
        }
        self.autosave_frame(&ctx);
        self.update_title(&ctx);
        if self.first_frame_ms.is_none() {
            let ms = self.started.elapsed().as_secs_f64() * 1000.0;
            self.first_frame_ms = Some(ms);
            if self.log_first_frame {
                eprintln!(
                    "lampwright: first frame drawn {ms:.0} ms after start (evaluation {:.1} ms)",
                    self.evaluator.last_duration_ms()
                );
            }
        }
    }
}

impl eframe::App for App {
    fn ui(&mut self, ui: &mut egui::Ui, _frame: &mut eframe::Frame) {
        self.frame(ui);
    }

    fn save(&mut self, storage: &mut dyn eframe::Storage) {
        eframe::set_value(storage, prefs::STORAGE_KEY, &self.prefs);
    }

    fn on_exit(&mut self, _gl: Option<&eframe::glow::Context>) {
        // Closing with unsaved changes happens only when the user chose to
        // discard them (which already removed the autosave) or when the
        // system ends the window: then the autosave stays for the next start.
        if !self.is_dirty() {
            self.finish_autosave();
        }
    }

    fn clear_color(&self, _visuals: &egui::Visuals) -> [f32; 4] {
        theme::grey::BASE.to_normalized_gamma_f32()
    }
}

fn status_line(
    ui: &mut egui::Ui,
    notices: &[Notice],
    path: Option<&Path>,
    dirty: bool,
    evaluator: &Evaluator,
) {
    ui.horizontal(|ui| {
        let file = path.map_or_else(
            || "not saved to a file yet".to_owned(),
            |p| p.display().to_string(),
        );
        ui.label(theme::caption(file));
        if dirty {
            ui.label(theme::caption("• unsaved changes"));
        }
        ui.separator();
        if let Some(notice) = notices.last() {
            let text = egui::RichText::new(&notice.text);
            let text = if notice.is_error {
                text.color(theme::WARNING)
            } else {
                text
            };
            ui.label(text).on_hover_ui(|ui| {
                for n in notices.iter().rev().take(12) {
                    ui.label(&n.text);
                }
            });
        }
        ui.with_layout(egui::Layout::right_to_left(egui::Align::Center), |ui| {
            ui.label(theme::caption(format!(
                "evaluated in {:.1} ms",
                evaluator.last_duration_ms()
            )));
        });
    });
}

fn drop_overlay(ctx: &egui::Context) {
    let hovering = ctx.input(|i| !i.raw.hovered_files.is_empty());
    if !hovering {
        return;
    }
    let painter = ctx.layer_painter(egui::LayerId::new(
        egui::Order::Foreground,
        egui::Id::unique("drop"),
    ));
    let rect = ctx.content_rect();
    painter.rect_filled(rect, 0.0, egui::Color32::from_black_alpha(170));
    painter.text(
        rect.center(),
        egui::Align2::CENTER_CENTER,
        "Drop a plan (.ron) to open it, or a spectrum (.csv) to import it",
        egui::FontId::proportional(22.0),
        theme::grey::TEXT,
    );
}
