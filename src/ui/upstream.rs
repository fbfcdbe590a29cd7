//! The plan crate's services the window relies on, in one place:
//! evaluation, the demo plan, plan files, imports and the built-in libraries.

use super::catalog::Entry;
use lampwright_plan::{
    CameraRef, Evaluation, LibraryKind, Plan, SubjectEntry, SubjectRef, library,
};
use std::path::Path;

/// Evaluate a plan with the engine's incremental evaluator, which reuses the
/// work an edit did not touch (errors as the plan crate's one-line messages).
pub fn evaluate(
    engine: &mut lampwright_plan::engine::Evaluator,
    plan: &Plan,
) -> Result<Evaluation, String> {
    engine.evaluate(plan).map_err(|e| e.to_string())
}

/// The built-in demo plan the window opens on, or the reason it cannot be
/// read (a build mistake the plan crate's tests catch).
pub fn demo_plan() -> Result<Plan, String> {
    lampwright_plan::default_demo().map_err(|e| format!("the demo plan could not be read: {e}"))
}

/// Names of the built-in demo plans, in the demo list's order.
#[must_use]
pub fn demo_names() -> &'static [String] {
    static NAMES: std::sync::OnceLock<Vec<String>> = std::sync::OnceLock::new();
    NAMES.get_or_init(|| {
        lampwright_plan::demo_plans()
            .into_iter()
            .map(|p| p.name)
            .collect()
    })
}

/// Read a plan file.
pub fn load_plan(path: &Path) -> Result<Plan, String> {
    lampwright_plan::load_plan(path).map_err(|e| e.to_string())
}

/// Write a plan file atomically (the old file stays whole if anything fails).
pub fn save_plan(path: &Path, plan: &Plan) -> Result<(), String> {
    lampwright_plan::save_plan_atomic(path, plan).map_err(|e| e.to_string())
}

/// Built-in lamps.
#[must_use]
pub fn builtin_lamps() -> Vec<Entry> {
    library::lamps()
        .iter()
        .map(|l| Entry {
            id: l.id.into(),
            name: l.name.into(),
            group: l.group.into(),
            description: l.description.into(),
            filament: l.filament_cct_k.is_some(),
            custom: false,
        })
        .collect()
}

/// Built-in gels.
#[must_use]
pub fn builtin_gels() -> Vec<Entry> {
    library::gels()
        .iter()
        .map(|g| Entry {
            id: g.id.into(),
            name: g.name.into(),
            group: g.group.into(),
            description: g.description.into(),
            filament: false,
            custom: false,
        })
        .collect()
}

/// Built-in subjects.
#[must_use]
pub fn builtin_subjects() -> Vec<Entry> {
    library::subjects()
        .iter()
        .map(|s| Entry {
            id: s.id.into(),
            name: s.name.into(),
            group: s.group.into(),
            description: s.description.into(),
            filament: false,
            custom: false,
        })
        .collect()
}

/// Built-in cameras (empty, with the error in the log, if the embedded table is broken).
#[must_use]
pub fn builtin_cameras() -> Vec<Entry> {
    match library::cameras() {
        Ok(cameras) => cameras
            .iter()
            .map(|c| Entry {
                id: c.id.into(),
                name: c.camera.name.clone(),
                group: "Built-in".into(),
                description: String::new(),
                filament: false,
                custom: false,
            })
            .collect(),
        Err(err) => {
            eprintln!("lampwright: built-in cameras unavailable: {err}");
            Vec::new()
        }
    }
}

/// Import a spectral table into a copy of the plan; returns the new plan and
/// a description of what was added. `name` renames a single imported entry;
/// `group` is the group of imported subjects. Imported subjects join the
/// plan's subject list and an imported camera becomes the plan's camera.
pub fn import_csv(
    plan: &Plan,
    path: &Path,
    kind: LibraryKind,
    name: &str,
    group: &str,
) -> Result<(Plan, String), String> {
    let mut updated = plan.clone();
    let ids = lampwright_plan::custom::import_file(&mut updated, path, kind)
        .map_err(|e| e.to_string())?;
    let name = name.trim();
    let rename = ids.len() == 1 && !name.is_empty();
    let group = group.trim();
    let custom = &mut updated.custom;
    match kind {
        LibraryKind::Lamp | LibraryKind::Gel => {
            let list = if kind == LibraryKind::Lamp {
                &mut custom.lamps
            } else {
                &mut custom.gels
            };
            for entry in list.iter_mut().filter(|s| rename && ids.contains(&s.id)) {
                name.clone_into(&mut entry.name);
            }
        }
        LibraryKind::Subject => {
            for entry in custom
                .subjects
                .iter_mut()
                .filter(|s| ids.contains(&s.spectrum.id))
            {
                if rename {
                    name.clone_into(&mut entry.spectrum.name);
                }
                if !group.is_empty() {
                    group.clone_into(&mut entry.group);
                }
            }
            for id in &ids {
                updated.subjects.push(SubjectEntry {
                    subject: SubjectRef::Custom(id.clone()),
                    ..SubjectEntry::default()
                });
            }
        }
        LibraryKind::Camera => {
            for entry in custom
                .cameras
                .iter_mut()
                .filter(|c| rename && ids.contains(&c.id))
            {
                name.clone_into(&mut entry.name);
            }
            if let Some(id) = ids.first() {
                updated.camera.camera = CameraRef::Custom(id.clone());
            }
        }
    }
    lampwright_plan::limits::check_limits(&updated).map_err(|e| e.to_string())?;
    let what = match (kind, ids.len()) {
        (LibraryKind::Subject, n) => format!(
            "{n} subject{} (added to the plan)",
            if n == 1 { "" } else { "s" }
        ),
        (LibraryKind::Camera, _) => "a camera (now the plan's camera)".to_owned(),
        (LibraryKind::Lamp, n) => format!(
            "{n} lamp{} (pick it under Change lamp…)",
            if n == 1 { "" } else { "s" }
        ),
        (LibraryKind::Gel, n) => format!(
            "{n} gel{} (pick it under Add gel…)",
            if n == 1 { "" } else { "s" }
        ),
    };
    Ok((updated, what))
}

/// A subject's reflectance on the 360–830 nm grid, for plotting.
#[must_use]
pub fn subject_reflectance(plan: &Plan, subject: &SubjectRef) -> Option<Vec<f64>> {
    lampwright_plan::resolve::subject_reflectance(plan, subject)
        .ok()
        .map(|s| s.reflectance.values().to_vec())
}
