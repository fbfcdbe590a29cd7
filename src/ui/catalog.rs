//! What the pickers offer: the built-in libraries plus the spectra imported
//! into the plan, as plain entries with an id, a name, a group and a note.

use lampwright_plan::{CameraRef, GelRef, LampRef, Plan, SubjectRef};
use std::sync::OnceLock;

/// One pickable entry.
#[derive(Debug, Clone, PartialEq)]
pub struct Entry {
    /// Id the plan refers to.
    pub id: String,
    /// Display name.
    pub name: String,
    /// Group for the picker (e.g. "Tungsten", "skin").
    pub group: String,
    /// One line about it.
    pub description: String,
    /// A filament lamp (its colour follows the dimmer).
    pub filament: bool,
    /// Imported into this plan rather than built in.
    pub custom: bool,
}

/// The built-in libraries, loaded once.
#[derive(Debug, Default)]
pub struct Builtin {
    /// Lamps.
    pub lamps: Vec<Entry>,
    /// Gels and filters.
    pub gels: Vec<Entry>,
    /// Subjects.
    pub subjects: Vec<Entry>,
    /// Cameras.
    pub cameras: Vec<Entry>,
}

/// The built-in libraries.
pub fn builtin() -> &'static Builtin {
    static BUILTIN: OnceLock<Builtin> = OnceLock::new();
    BUILTIN.get_or_init(|| Builtin {
        lamps: super::upstream::builtin_lamps(),
        gels: super::upstream::builtin_gels(),
        subjects: super::upstream::builtin_subjects(),
        cameras: super::upstream::builtin_cameras(),
    })
}

fn custom_entry(id: &str, name: &str, group: &str, note: &str) -> Entry {
    Entry {
        id: id.to_owned(),
        name: name.to_owned(),
        group: group.to_owned(),
        description: note.to_owned(),
        filament: false,
        custom: true,
    }
}

/// Lamps the plan can use: built-in, then imported.
#[must_use]
pub fn lamps(plan: &Plan) -> Vec<Entry> {
    let mut all = builtin().lamps.clone();
    all.extend(
        plan.custom
            .lamps
            .iter()
            .map(|s| custom_entry(&s.id, &s.name, "Imported", &s.note)),
    );
    all
}

/// Gels the plan can use: built-in, then imported.
#[must_use]
pub fn gels(plan: &Plan) -> Vec<Entry> {
    let mut all = builtin().gels.clone();
    all.extend(
        plan.custom
            .gels
            .iter()
            .map(|s| custom_entry(&s.id, &s.name, "Imported", &s.note)),
    );
    all
}

/// Subjects the plan can use: built-in, then imported.
#[must_use]
pub fn subjects(plan: &Plan) -> Vec<Entry> {
    let mut all = builtin().subjects.clone();
    all.extend(plan.custom.subjects.iter().map(|s| {
        let group = if s.group.is_empty() {
            "imported"
        } else {
            s.group.as_str()
        };
        custom_entry(&s.spectrum.id, &s.spectrum.name, group, &s.spectrum.note)
    }));
    all
}

/// Cameras the plan can use: built-in, then imported.
#[must_use]
pub fn cameras(plan: &Plan) -> Vec<Entry> {
    let mut all = builtin().cameras.clone();
    all.extend(
        plan.custom
            .cameras
            .iter()
            .map(|c| custom_entry(&c.id, &c.name, "Imported", &c.note)),
    );
    all
}

fn find<'a>(entries: &'a [Entry], id: &str, custom: bool) -> Option<&'a Entry> {
    entries.iter().find(|e| e.id == id && e.custom == custom)
}

/// Display name of a lamp reference.
#[must_use]
pub fn lamp_name(plan: &Plan, lamp: &LampRef) -> String {
    match lamp {
        LampRef::Library(id) => find(&builtin().lamps, id, false)
            .map_or_else(|| format!("{id} (unknown)"), |e| e.name.clone()),
        LampRef::Custom(id) => plan
            .custom
            .lamps
            .iter()
            .find(|s| &s.id == id)
            .map_or_else(|| format!("{id} (missing)"), |s| s.name.clone()),
        LampRef::Blackbody { cct_k } => {
            format!(
                "Black body {} K",
                super::format::field_number(*cct_k, 0..=0)
            )
        }
        LampRef::Daylight { cct_k } => {
            format!(
                "CIE daylight {} K",
                super::format::field_number(*cct_k, 0..=0)
            )
        }
    }
}

/// Whether a lamp has a filament (so the dimmer shifts its colour).
#[must_use]
pub fn lamp_has_filament(lamp: &LampRef) -> bool {
    lampwright_plan::resolve::lamp_filament_cct_k(lamp).is_some()
}

/// Display name of a gel reference.
#[must_use]
pub fn gel_name(plan: &Plan, gel: &GelRef) -> String {
    match gel {
        GelRef::Library(id) => find(&builtin().gels, id, false)
            .map_or_else(|| format!("{id} (unknown)"), |e| e.name.clone()),
        GelRef::Custom(id) => plan
            .custom
            .gels
            .iter()
            .find(|s| &s.id == id)
            .map_or_else(|| format!("{id} (missing)"), |s| s.name.clone()),
    }
}

/// Display name and group of a subject reference.
#[must_use]
pub fn subject_name(plan: &Plan, subject: &SubjectRef) -> (String, String) {
    match subject {
        SubjectRef::Library(id) => find(&builtin().subjects, id, false).map_or_else(
            || (format!("{id} (unknown)"), String::new()),
            |e| (e.name.clone(), e.group.clone()),
        ),
        SubjectRef::Custom(id) => plan
            .custom
            .subjects
            .iter()
            .find(|s| &s.spectrum.id == id)
            .map_or_else(
                || (format!("{id} (missing)"), String::new()),
                |s| (s.spectrum.name.clone(), s.group.clone()),
            ),
    }
}

/// Display name of a camera reference.
#[must_use]
pub fn camera_name(plan: &Plan, camera: &CameraRef) -> String {
    match camera {
        CameraRef::Library(id) => find(&builtin().cameras, id, false)
            .map_or_else(|| format!("{id} (unknown)"), |e| e.name.clone()),
        CameraRef::Custom(id) => plan
            .custom
            .cameras
            .iter()
            .find(|c| &c.id == id)
            .map_or_else(|| format!("{id} (missing)"), |c| c.name.clone()),
        CameraRef::Colorimetric => "Ideal colorimetric camera".into(),
    }
}

/// Entries whose name, group or description contain every word of the query
/// (case-insensitive).
#[must_use]
pub fn search<'a>(entries: &'a [Entry], query: &str) -> Vec<&'a Entry> {
    let words: Vec<String> = query.split_whitespace().map(str::to_lowercase).collect();
    entries
        .iter()
        .filter(|e| {
            let hay = format!("{} {} {} {}", e.name, e.group, e.description, e.id).to_lowercase();
            words.iter().all(|w| hay.contains(w.as_str()))
        })
        .collect()
}

/// The groups of some entries, in first-seen order.
#[must_use]
pub fn groups(entries: &[&Entry]) -> Vec<String> {
    let mut seen: Vec<String> = Vec::new();
    for e in entries {
        if !seen.contains(&e.group) {
            seen.push(e.group.clone());
        }
    }
    seen
}

#[cfg(test)]
mod tests {
    use super::*;

    fn entry(name: &str, group: &str) -> Entry {
        Entry {
            id: name.to_lowercase(),
            name: name.into(),
            group: group.into(),
            description: String::new(),
            filament: false,
            custom: false,
        }
    }

    #[test]
    fn search_needs_every_word() {
        let all = vec![
            entry("Warm LED", "LED"),
            entry("Tungsten halogen", "Tungsten"),
        ];
        assert_eq!(search(&all, "led").len(), 1);
        assert_eq!(search(&all, "tungsten halo").len(), 1);
        assert_eq!(search(&all, "warm tungsten").len(), 0);
        assert_eq!(search(&all, "").len(), 2);
        assert_eq!(groups(&search(&all, "")), vec!["LED", "Tungsten"]);
    }
}
