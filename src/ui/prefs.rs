//! Window preferences kept between sessions in eframe's storage.
//!
//! Only habits live here (recent files, last folder, which panels show, sort
//! order). Plans are files the user saves; they never go into app storage.

use serde::{Deserialize, Serialize};
use std::path::{Path, PathBuf};

/// Storage key of the preferences.
pub const STORAGE_KEY: &str = "lampwright-window-prefs";

/// How many recent files and folders are remembered.
pub const RECENT_LIMIT: usize = 10;

/// How the subject swatches are ordered.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum SortMode {
    /// As the plan lists them.
    #[default]
    PlanOrder,
    /// Largest eye-versus-camera difference first.
    DeltaEHighToLow,
    /// By group, then plan order.
    Group,
}

impl SortMode {
    /// All modes, for pickers.
    pub const ALL: [SortMode; 3] = [
        SortMode::PlanOrder,
        SortMode::DeltaEHighToLow,
        SortMode::Group,
    ];

    /// Label shown in the picker.
    #[must_use]
    pub fn label(self) -> &'static str {
        match self {
            SortMode::PlanOrder => "Plan order",
            SortMode::DeltaEHighToLow => "ΔE, high to low",
            SortMode::Group => "Group",
        }
    }
}

/// The preferences.
// Each flag is one independent View-menu or File-menu toggle.
#[allow(clippy::struct_excessive_bools)]
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct Prefs {
    /// Recently opened or saved plans, newest first.
    pub recent_files: Vec<PathBuf>,
    /// Recently used folders, newest first.
    pub recent_folders: Vec<PathBuf>,
    /// Show the plan editor on the left.
    pub show_editor: bool,
    /// Show the plots at the bottom.
    pub show_plots: bool,
    /// Show the readout strip.
    pub show_readouts: bool,
    /// Swatch order.
    pub sort: SortMode,
    /// Try the desktop's file dialogs before the in-window file browser.
    pub system_dialogs: bool,
}

impl Default for Prefs {
    fn default() -> Self {
        Prefs {
            recent_files: Vec::new(),
            recent_folders: Vec::new(),
            show_editor: true,
            show_plots: true,
            show_readouts: true,
            sort: SortMode::PlanOrder,
            system_dialogs: true,
        }
    }
}

impl Prefs {
    /// These preferences as loaded from storage, held to the limits the
    /// window keeps (at most [`RECENT_LIMIT`] recent files and folders, no
    /// repeats): stored preferences may come from an older build or be edited.
    #[must_use]
    pub fn bounded(mut self) -> Prefs {
        for list in [&mut self.recent_files, &mut self.recent_folders] {
            let mut seen: Vec<PathBuf> = Vec::new();
            list.retain(|p| {
                let first = !seen.contains(p);
                if first {
                    seen.push(p.clone());
                }
                first && seen.len() <= RECENT_LIMIT
            });
        }
        self
    }

    /// Remember a plan file (and its folder) as most recent.
    pub fn remember_file(&mut self, path: &Path) {
        push_front_unique(&mut self.recent_files, path.to_path_buf());
        if let Some(folder) = path.parent().filter(|p| !p.as_os_str().is_empty()) {
            self.remember_folder(folder);
        }
    }

    /// Remember a folder as most recent.
    pub fn remember_folder(&mut self, folder: &Path) {
        push_front_unique(&mut self.recent_folders, folder.to_path_buf());
    }

    /// The folder to start file browsing in.
    #[must_use]
    pub fn last_folder(&self) -> Option<&Path> {
        self.recent_folders.first().map(PathBuf::as_path)
    }
}

fn push_front_unique(list: &mut Vec<PathBuf>, item: PathBuf) {
    list.retain(|p| p != &item);
    list.insert(0, item);
    list.truncate(RECENT_LIMIT);
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn loaded_preferences_are_held_to_the_limits() {
        let many: Vec<PathBuf> = (0..500)
            .map(|i| PathBuf::from(format!("/plans/p{}.ron", i % 40)))
            .collect();
        let loaded = Prefs {
            recent_files: many.clone(),
            recent_folders: many,
            ..Prefs::default()
        }
        .bounded();
        for list in [&loaded.recent_files, &loaded.recent_folders] {
            assert_eq!(list.len(), RECENT_LIMIT);
            assert_eq!(list[0], PathBuf::from("/plans/p0.ron"));
            assert_eq!(list[9], PathBuf::from("/plans/p9.ron"));
        }
    }

    #[test]
    fn recent_files_are_unique_newest_first_and_bounded() {
        let mut prefs = Prefs::default();
        for i in 0..15 {
            prefs.remember_file(Path::new(&format!("/plans/p{i}.ron")));
        }
        prefs.remember_file(Path::new("/plans/p3.ron"));
        assert_eq!(prefs.recent_files.len(), RECENT_LIMIT);
        assert_eq!(prefs.recent_files[0], PathBuf::from("/plans/p3.ron"));
        assert_eq!(prefs.recent_folders, vec![PathBuf::from("/plans")]);
    }

    #[test]
    fn old_or_partial_storage_still_loads() {
        let prefs: Prefs = ron::from_str("(sort: Group)").unwrap();
        assert_eq!(prefs.sort, SortMode::Group);
        assert!(prefs.show_plots);
    }
}
