//! Structural limits of a plan.
//!
//! Plans are small documents; these limits sit far above any real shoot and
//! keep a damaged or hostile file from exhausting memory or time. Loading
//! refuses a plan that breaks one, and saving refuses to write a file that
//! could not be read back. `docs/limits.md` lists them for users.

use crate::error::{PlanError, Result};
use crate::model::{CustomSpectrum, Plan};

/// Largest plan file read, bytes (16 MiB).
pub const MAX_FILE_BYTES: u64 = 16 * 1024 * 1024;
/// Deepest nesting of brackets accepted by the RON reader (a real plan nests
/// about 8 deep).
pub const MAX_NESTING: usize = 64;
/// Most light sources in a plan.
pub const MAX_SOURCES: usize = 64;
/// Most zones in a plan.
pub const MAX_ZONES: usize = 16;
/// Most subjects in a plan.
pub const MAX_SUBJECTS: usize = 512;
/// Most gels stacked on one source.
pub const MAX_GEL_STACK: usize = 8;
/// Most spectral points in one embedded spectrum (per channel for cameras).
pub const MAX_SPECTRAL_POINTS: usize = 10_000;
/// Most embedded spectra of each kind (lamps, gels, subjects, cameras).
pub const MAX_CUSTOM_PER_KIND: usize = 256;
/// Most gel ids in the advisor's kit.
pub const MAX_KIT_GELS: usize = 256;
/// Longest name or id, characters.
pub const MAX_NAME_CHARS: usize = 200;
/// Longest free text (plan notes, spectrum notes), characters.
pub const MAX_NOTES_CHARS: usize = 20_000;

fn limit(field: String, what: &'static str, found: usize, max: usize) -> Result<()> {
    if found > max {
        Err(PlanError::Limit {
            field,
            what,
            found,
            limit: max,
        })
    } else {
        Ok(())
    }
}

fn name(field: String, text: &str) -> Result<()> {
    limit(
        field,
        "length in characters",
        text.chars().count(),
        MAX_NAME_CHARS,
    )
}

fn notes(field: String, text: &str) -> Result<()> {
    limit(
        field,
        "length in characters",
        text.chars().count(),
        MAX_NOTES_CHARS,
    )
}

fn spectrum(field: &str, s: &CustomSpectrum) -> Result<()> {
    name(format!("{field}.id"), &s.id)?;
    name(format!("{field}.name"), &s.name)?;
    notes(format!("{field}.note"), &s.note)?;
    limit(
        format!("{field}.wavelengths_nm"),
        "number of spectral points",
        s.wavelengths_nm.len(),
        MAX_SPECTRAL_POINTS,
    )?;
    limit(
        format!("{field}.values"),
        "number of spectral points",
        s.values.len(),
        MAX_SPECTRAL_POINTS,
    )
}

/// Check every structural limit; the error names the first field over its limit.
pub fn check_limits(plan: &Plan) -> Result<()> {
    name("name".into(), &plan.name)?;
    notes("notes".into(), &plan.notes)?;
    limit(
        "sources".into(),
        "number of sources",
        plan.sources.len(),
        MAX_SOURCES,
    )?;
    for (i, s) in plan.sources.iter().enumerate() {
        name(format!("sources[{i}].name"), &s.name)?;
        limit(
            format!("sources[{i}].gels"),
            "number of gels",
            s.gels.len(),
            MAX_GEL_STACK,
        )?;
    }
    limit(
        "zones".into(),
        "number of zones",
        plan.zones.len(),
        MAX_ZONES,
    )?;
    for (i, z) in plan.zones.iter().enumerate() {
        name(format!("zones[{i}].name"), &z.name)?;
        limit(
            format!("zones[{i}].reach"),
            "number of sources reached",
            z.reach.len(),
            MAX_SOURCES,
        )?;
    }
    limit(
        "subjects".into(),
        "number of subjects",
        plan.subjects.len(),
        MAX_SUBJECTS,
    )?;
    limit(
        "kit.gels".into(),
        "number of gels",
        plan.kit.gels.len(),
        MAX_KIT_GELS,
    )?;
    let c = &plan.custom;
    for (field, count) in [
        ("custom.lamps", c.lamps.len()),
        ("custom.gels", c.gels.len()),
        ("custom.subjects", c.subjects.len()),
        ("custom.cameras", c.cameras.len()),
    ] {
        limit(
            field.into(),
            "number of embedded spectra",
            count,
            MAX_CUSTOM_PER_KIND,
        )?;
    }
    for (i, s) in c.lamps.iter().enumerate() {
        spectrum(&format!("custom.lamps[{i}]"), s)?;
    }
    for (i, s) in c.gels.iter().enumerate() {
        spectrum(&format!("custom.gels[{i}]"), s)?;
    }
    for (i, s) in c.subjects.iter().enumerate() {
        spectrum(&format!("custom.subjects[{i}].spectrum"), &s.spectrum)?;
        name(format!("custom.subjects[{i}].group"), &s.group)?;
    }
    for (i, cam) in c.cameras.iter().enumerate() {
        let field = format!("custom.cameras[{i}]");
        name(format!("{field}.id"), &cam.id)?;
        name(format!("{field}.name"), &cam.name)?;
        notes(format!("{field}.note"), &cam.note)?;
        for (channel, values) in [
            ("wavelengths_nm", &cam.wavelengths_nm),
            ("r", &cam.r),
            ("g", &cam.g),
            ("b", &cam.b),
        ] {
            limit(
                format!("{field}.{channel}"),
                "number of spectral points",
                values.len(),
                MAX_SPECTRAL_POINTS,
            )?;
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{GelLayer, GelRef, Source};

    #[test]
    fn default_plan_is_within_limits() {
        check_limits(&Plan::default()).unwrap();
    }

    #[test]
    fn too_many_gels_names_the_source() {
        let mut plan = Plan::default();
        let layer = GelLayer {
            gel: GelRef::Library("nd-03".into()),
            strength: 1.0,
        };
        plan.sources.push(Source::default());
        plan.sources.push(Source {
            gels: vec![layer; MAX_GEL_STACK + 1],
            ..Source::default()
        });
        let e = check_limits(&plan).unwrap_err().to_string();
        assert_eq!(
            e,
            "sources[1].gels: number of gels is 9, more than the limit of 8"
        );
    }

    #[test]
    fn long_names_and_big_spectra_are_refused() {
        let mut plan = Plan {
            name: "x".repeat(MAX_NAME_CHARS + 1),
            ..Plan::default()
        };
        assert!(
            check_limits(&plan)
                .unwrap_err()
                .to_string()
                .starts_with("name:")
        );
        plan.name = "ok".into();
        plan.custom.lamps.push(CustomSpectrum {
            id: "m".into(),
            wavelengths_nm: vec![0.0; MAX_SPECTRAL_POINTS + 1],
            ..CustomSpectrum::default()
        });
        let e = check_limits(&plan).unwrap_err().to_string();
        assert!(e.starts_with("custom.lamps[0].wavelengths_nm:"), "{e}");
    }
}
