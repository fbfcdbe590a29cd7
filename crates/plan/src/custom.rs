//! Adding imported spectral tables to a plan's embedded library.
//!
//! The core importer ([`lampwright_color::import`]) reads a measured table;
//! this module stores it in the plan ([`CustomLibrary`](crate::model::CustomLibrary))
//! exactly as imported (no resampling, so nothing is lost) under new ids that
//! the plan's references can use (`LampRef::Custom(id)` and so on).

use crate::error::{LibraryKind, PlanError, Result};
use crate::limits::check_limits;
use crate::model::{CustomCamera, CustomSpectrum, CustomSubject, Plan};
use lampwright_color::import::{ImportedTable, SpectrumKind, import_path};
use std::collections::HashSet;
use std::path::Path;

/// The importer's table kind that fills each kind of library entry.
#[must_use]
pub fn spectrum_kind_for(kind: LibraryKind) -> SpectrumKind {
    match kind {
        LibraryKind::Lamp => SpectrumKind::Lamp,
        LibraryKind::Gel => SpectrumKind::Transmittance,
        LibraryKind::Subject => SpectrumKind::Reflectance,
        LibraryKind::Camera => SpectrumKind::CameraSensitivity,
    }
}

/// A plan-safe id from a name: lower-case ASCII letters and digits joined by
/// single hyphens ("Lamp A (W/m2)" → "lamp-a-w-m2"); "imported" when nothing is left.
#[must_use]
pub fn id_from_name(name: &str) -> String {
    let mut out = String::new();
    for c in name.chars() {
        if c.is_ascii_alphanumeric() {
            out.push(c.to_ascii_lowercase());
        } else if !out.is_empty() && !out.ends_with('-') {
            out.push('-');
        }
        if out.len() >= 60 {
            break;
        }
    }
    let out = out.trim_end_matches('-').to_string();
    if out.is_empty() {
        "imported".into()
    } else {
        out
    }
}

/// `base`, or `base-2`, `base-3`, … whichever is not yet taken.
fn unique_id(base: &str, taken: &mut HashSet<String>) -> String {
    let mut id = base.to_string();
    let mut n = 2u32;
    while taken.contains(&id) {
        id = format!("{base}-{n}");
        n += 1;
    }
    taken.insert(id.clone());
    id
}

fn file_stem(source_name: &str) -> &str {
    Path::new(source_name)
        .file_stem()
        .and_then(|s| s.to_str())
        .unwrap_or(source_name)
}

/// Add an imported table to the plan's embedded library as `kind` entries and
/// return the new ids: one entry per value column for lamps, gels and
/// subjects; one camera from the three columns of a camera table.
///
/// The table must be of the matching kind (lamp ↔ lamp, gel ↔ transmittance,
/// subject ↔ reflectance, camera ↔ camera sensitivity). Nothing is added when
/// the plan would exceed its limits.
pub fn add_imported(
    plan: &mut Plan,
    table: &ImportedTable,
    kind: LibraryKind,
) -> Result<Vec<String>> {
    let wanted = spectrum_kind_for(kind);
    if table.kind != wanted {
        return Err(PlanError::Invalid {
            field: format!("import of '{}'", table.source_name),
            message: format!(
                "a {} table cannot be added as a {kind}; import it as a {wanted} table",
                table.kind
            ),
        });
    }
    if table.columns.is_empty() {
        return Err(PlanError::Invalid {
            field: format!("import of '{}'", table.source_name),
            message: "the table has no value columns".into(),
        });
    }
    let note = format!("Imported from {}", table.source_name);
    let mut updated = plan.clone();
    let c = &mut updated.custom;
    let mut new_ids = Vec::new();
    let spectrum = |id: String, name: &str, values: &[f64]| CustomSpectrum {
        id,
        name: name.to_string(),
        wavelengths_nm: table.wavelengths_nm.clone(),
        values: values.to_vec(),
        note: note.clone(),
    };
    match kind {
        LibraryKind::Lamp | LibraryKind::Gel => {
            let list = if kind == LibraryKind::Lamp {
                &mut c.lamps
            } else {
                &mut c.gels
            };
            let mut taken: HashSet<String> = list.iter().map(|s| s.id.clone()).collect();
            for col in &table.columns {
                let id = unique_id(&id_from_name(&col.name), &mut taken);
                list.push(spectrum(id.clone(), &col.name, &col.values));
                new_ids.push(id);
            }
        }
        LibraryKind::Subject => {
            let mut taken: HashSet<String> =
                c.subjects.iter().map(|s| s.spectrum.id.clone()).collect();
            for col in &table.columns {
                let id = unique_id(&id_from_name(&col.name), &mut taken);
                c.subjects.push(CustomSubject {
                    spectrum: spectrum(id.clone(), &col.name, &col.values),
                    group: "custom".into(),
                });
                new_ids.push(id);
            }
        }
        LibraryKind::Camera => {
            let [r, g, b] = match table.columns.as_slice() {
                [r, g, b] => [r, g, b],
                other => {
                    return Err(PlanError::Invalid {
                        field: format!("import of '{}'", table.source_name),
                        message: format!(
                            "a camera table needs exactly 3 value columns (r, g, b), found {}",
                            other.len()
                        ),
                    });
                }
            };
            let mut taken: HashSet<String> = c.cameras.iter().map(|cam| cam.id.clone()).collect();
            let name = file_stem(&table.source_name);
            let id = unique_id(&id_from_name(name), &mut taken);
            c.cameras.push(CustomCamera {
                id: id.clone(),
                name: name.to_string(),
                wavelengths_nm: table.wavelengths_nm.clone(),
                r: r.values.clone(),
                g: g.values.clone(),
                b: b.values.clone(),
                note,
            });
            new_ids.push(id);
        }
    }
    check_limits(&updated)?;
    *plan = updated;
    Ok(new_ids)
}

/// Import a spectral file (see [`lampwright_color::import`] for the accepted
/// layouts) and add it to the plan as `kind` entries; returns the new ids.
pub fn import_file(plan: &mut Plan, path: &Path, kind: LibraryKind) -> Result<Vec<String>> {
    let table = import_path(path, spectrum_kind_for(kind))?;
    add_imported(plan, &table, kind)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{LampRef, SubjectRef};
    use crate::resolve::{lamp_spd, subject_reflectance};
    use lampwright_color::import::import_bytes;
    use std::fmt::Write;

    #[test]
    fn ids_are_clean_and_unique() {
        assert_eq!(id_from_name("Lamp A (W/m2)"), "lamp-a-w-m2");
        assert_eq!(id_from_name("«»"), "imported");
        let mut taken = HashSet::from(["x".to_string()]);
        assert_eq!(unique_id("x", &mut taken), "x-2");
        assert_eq!(unique_id("x", &mut taken), "x-3");
    }

    #[test]
    fn lamp_columns_become_embedded_lamps_the_plan_can_use() {
        let csv = "wavelength,Warm LED,Cool LED\n380,0.1,0.3\n480,0.4,0.9\n580,1.0,0.8\n680,0.7,0.4\n780,0.2,0.1\n";
        let table = import_bytes("leds.csv", csv.as_bytes(), SpectrumKind::Lamp).unwrap();
        let mut plan = Plan::default();
        let ids = add_imported(&mut plan, &table, LibraryKind::Lamp).unwrap();
        assert_eq!(ids, vec!["warm-led", "cool-led"]);
        let again = add_imported(&mut plan, &table, LibraryKind::Lamp).unwrap();
        assert_eq!(again, vec!["warm-led-2", "cool-led-2"]);
        assert_eq!(plan.custom.lamps[0].note, "Imported from leds.csv");
        let spd = lamp_spd(&plan, &LampRef::Custom("cool-led".into())).unwrap();
        assert!((spd.at_nm(480.0) - 0.9).abs() < 1e-9);
    }

    #[test]
    fn reflectances_become_subjects_and_kinds_must_match() {
        let csv = "nm,Paint\n380,20\n580,40\n780,60\n";
        let table = import_bytes("paint.csv", csv.as_bytes(), SpectrumKind::Reflectance).unwrap();
        let mut plan = Plan::default();
        let e = add_imported(&mut plan, &table, LibraryKind::Gel)
            .unwrap_err()
            .to_string();
        assert!(e.contains("cannot be added as a gel"), "{e}");
        assert!(plan.custom.gels.is_empty());
        let ids = add_imported(&mut plan, &table, LibraryKind::Subject).unwrap();
        let s = subject_reflectance(&plan, &SubjectRef::Custom(ids[0].clone())).unwrap();
        assert_eq!(&*s.group, "custom");
        assert!(
            (s.reflectance.at_nm(580.0) - 0.4).abs() < 1e-9,
            "percent was converted"
        );
    }

    #[test]
    fn camera_tables_make_one_camera() {
        let mut csv = String::from("nm,r,g,b\n");
        for i in 0..=40 {
            let wl = 380.0 + 10.0 * f64::from(i);
            let bump = |c: f64| (-((wl - c) / 40.0_f64).powi(2)).exp();
            writeln!(csv, "{wl},{},{},{}", bump(600.0), bump(540.0), bump(450.0)).unwrap();
        }
        let table = import_bytes(
            "My Cam.csv",
            csv.as_bytes(),
            SpectrumKind::CameraSensitivity,
        )
        .unwrap();
        let mut plan = Plan::default();
        let ids = add_imported(&mut plan, &table, LibraryKind::Camera).unwrap();
        assert_eq!(ids, vec!["my-cam"]);
        assert_eq!(plan.custom.cameras[0].name, "My Cam");
    }

    #[test]
    fn too_many_points_leave_the_plan_untouched() {
        let mut csv = String::from("nm,v\n");
        for i in 0..10_001 {
            writeln!(csv, "{},0.5", 380.0 + f64::from(i) * 0.04).unwrap();
        }
        let table = import_bytes("dense.csv", csv.as_bytes(), SpectrumKind::Lamp).unwrap();
        let mut plan = Plan::default();
        let e = add_imported(&mut plan, &table, LibraryKind::Lamp).unwrap_err();
        assert!(matches!(e, PlanError::Limit { .. }), "{e}");
        assert!(plan.custom.lamps.is_empty());
    }
}
