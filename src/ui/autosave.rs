//! The window's side of autosave and recovery: autosaving each frame when it
//! is due, offering the plans of windows that closed without saving, and
//! restoring or discarding them (see [`super::recovery`] for the files).

use super::app::App;
use super::dialogs::Dialog;
use super::recovery::{self, Autosaver, Tick};
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

impl App {
    /// Look for plans left by windows that are gone, then take this window's
    /// own autosave slot. Problems become notices; the window opens anyway.
    pub(super) fn start_recovery(&mut self, dir: &Path, interval: Duration) {
        let scan = recovery::scan(dir);
        for notice in scan.notices {
            self.notify_error(notice);
        }
        self.recovered = scan.found;
        match Autosaver::start(dir, interval) {
            Ok(saver) => self.autosave = Some(saver),
            Err(err) => self.notify_error(format!("Autosave is off: {err}")),
        }
    }

    /// Autosave when due (interval passed, or the window lost focus), remove
    /// the autosave once the plan is clean, and offer any recovered plan.
    pub(super) fn autosave_frame(&mut self, ctx: &egui::Context) {
        if self.dialog.is_none() && !self.recovered.is_empty() {
            self.dialog = Some(Dialog::Recover);
        }
        let dirty = self.is_dirty();
        let Some(saver) = &mut self.autosave else {
            return;
        };
        let focus_lost = ctx.input(|i| {
            i.raw
                .events
                .iter()
                .any(|e| matches!(e, egui::Event::WindowFocused(false)))
        });
        let tick = saver.tick(
            &self.plan,
            dirty,
            self.path.as_deref(),
            focus_lost,
            Instant::now(),
        );
        match tick {
            Tick::WaitFor(wait) => ctx.request_repaint_after(wait),
            Tick::Failed(err) => self.notify_error(format!("Could not autosave: {err}")),
            Tick::Idle | Tick::Wrote | Tick::Cleared => {}
        }
    }

    /// Open the first recovered plan as unsaved changes to the file it came from.
    pub(super) fn restore_recovered(&mut self) {
        if self.recovered.is_empty() {
            return;
        }
        let found = self.recovered.remove(0);
        let name = found.plan.name.clone();
        self.replace_plan(found.plan.clone(), found.origin.clone());
        self.force_dirty = true;
        // Autosave under this window's slot before letting the old one go,
        // so the plan is on disk at every moment.
        let kept = match &mut self.autosave {
            Some(saver) => saver.write(&self.plan, self.path.as_deref()),
            None => Err("autosave is off".into()),
        };
        match kept.and_then(|()| found.forget()) {
            Ok(()) => {}
            Err(err) => self.notify_error(format!(
                "The recovered plan stays at {} ({err})",
                found.plan_file().display()
            )),
        }
        let to = found.origin.as_ref().map_or_else(
            || "not saved to a file yet".to_owned(),
            |p| format!("save to write it to {}", p.display()),
        );
        self.notify(format!("Restored the autosaved plan \"{name}\" ({to})"));
    }

    /// Set the first recovered plan aside (renamed, not deleted).
    pub(super) fn discard_recovered(&mut self) {
        if self.recovered.is_empty() {
            return;
        }
        let found = self.recovered.remove(0);
        match found.discard() {
            Ok(kept) => self.notify(format!(
                "Discarded the autosaved plan; a copy stays at {}",
                kept.display()
            )),
            Err(err) => self.notify_error(format!("Could not set the autosaved plan aside: {err}")),
        }
    }

    /// The user chose to close without keeping the changes: drop the slot.
    pub(super) fn finish_autosave(&mut self) {
        if let Some(saver) = self.autosave.take()
            && let Err(err) = saver.finish()
        {
            eprintln!("lampwright: could not remove the autosave: {err}");
        }
    }

    /// Recovered plans still waiting for an answer.
    #[must_use]
    pub fn recovery_offers(&self) -> &[recovery::Recovered] {
        &self.recovered
    }

    /// This window's autosave file (present only while there are unsaved changes).
    #[must_use]
    pub fn autosave_file(&self) -> Option<PathBuf> {
        self.autosave.as_ref().map(Autosaver::plan_file)
    }

    /// How many autosaves this window wrote.
    #[must_use]
    pub fn autosave_count(&self) -> u64 {
        self.autosave.as_ref().map_or(0, Autosaver::writes)
    }
}
