//! Every structural limit of a plan (`lampwright_plan::limits`): a plan at the
//! limit saves and loads; one item over is refused on load with the one-line
//! message `docs/limits.md` quotes, and saving refuses to write it. The values
//! checked are the ones `docs/limits.md` promises users, and the test reads
//! that page to keep the two in step.

use lampwright_color::import::{SpectrumKind, import_bytes};
use lampwright_plan::custom::add_imported;
use lampwright_plan::files::{plan_from_str, plan_to_ron};
use lampwright_plan::limits::{
    MAX_CUSTOM_PER_KIND, MAX_FILE_BYTES, MAX_GEL_STACK, MAX_KIT_GELS, MAX_NAME_CHARS, MAX_NESTING,
    MAX_NOTES_CHARS, MAX_SOURCES, MAX_SPECTRAL_POINTS, MAX_SUBJECTS, MAX_ZONES,
};
use lampwright_plan::{
    CustomCamera, CustomSpectrum, GelLayer, GelRef, LibraryKind, Plan, Source, SubjectEntry, Zone,
    ZoneLevel, ZoneReach,
};
use std::fmt::Write;

/// Plan text for `plan` without the save-side limit check (how a damaged or
/// hand-edited file over a limit looks to the reader).
fn raw_text(plan: &Plan) -> String {
    ron::ser::to_string(plan).expect("plans serialise")
}

/// `plan` at a limit loads and saves; `grow` takes it one over, which is then
/// refused on load with `message` (after the label of the text) and on save.
fn check_cap(name: &str, mut plan: Plan, grow: impl FnOnce(&mut Plan), message: &str) {
    let text = plan_to_ron(&plan).unwrap_or_else(|e| panic!("{name}: at the limit: {e}"));
    let back = plan_from_str(&text).unwrap_or_else(|e| panic!("{name}: at the limit: {e}"));
    assert_eq!(back, plan, "{name}: at the limit");

    grow(&mut plan);
    let err = plan_from_str(&raw_text(&plan)).expect_err(name).to_string();
    assert_eq!(err, format!("<plan text>: {message}"), "{name}");
    assert!(!err.contains('\n'));
    let err = plan_to_ron(&plan).expect_err(name).to_string();
    assert_eq!(err, message, "{name}: saving");
}

fn source(id: u32) -> Source {
    Source {
        id,
        name: format!("S{id}"),
        ..Source::default()
    }
}

fn gel() -> GelLayer {
    GelLayer {
        gel: GelRef::Library("nd-03".into()),
        strength: 1.0,
    }
}

fn spectrum(id: &str, points: usize) -> CustomSpectrum {
    CustomSpectrum {
        id: id.into(),
        name: id.into(),
        wavelengths_nm: (0..points).map(|i| 380.0 + 0.04 * i as f64).collect(),
        values: vec![0.5; points],
        note: String::new(),
    }
}

#[test]
fn sources() {
    let plan = Plan {
        sources: (1..=MAX_SOURCES as u32).map(source).collect(),
        ..Plan::default()
    };
    check_cap(
        "sources",
        plan,
        |p| p.sources.push(source(999)),
        "sources: number of sources is 65, more than the limit of 64",
    );
}

#[test]
fn gels_on_one_source() {
    let plan = Plan {
        sources: vec![
            source(1),
            Source {
                gels: vec![gel(); MAX_GEL_STACK],
                ..source(2)
            },
        ],
        ..Plan::default()
    };
    check_cap(
        "gels",
        plan,
        |p| p.sources[1].gels.push(gel()),
        "sources[1].gels: number of gels is 9, more than the limit of 8",
    );
}

#[test]
fn zones_and_their_reach() {
    let zone = |id: u32| Zone {
        id,
        name: format!("Z{id}"),
        ..Zone::default()
    };
    let plan = Plan {
        zones: (1..=MAX_ZONES as u32).map(zone).collect(),
        ..Plan::default()
    };
    check_cap(
        "zones",
        plan,
        |p| p.zones.push(zone(99)),
        "zones: number of zones is 17, more than the limit of 16",
    );

    let reach = |source: u32| ZoneReach {
        source,
        level: ZoneLevel::AsSource,
    };
    let plan = Plan {
        zones: vec![Zone {
            reach: (1..=MAX_SOURCES as u32).map(reach).collect(),
            ..zone(1)
        }],
        ..Plan::default()
    };
    check_cap(
        "zone reach",
        plan,
        |p| p.zones[0].reach.push(reach(99)),
        "zones[0].reach: number of sources reached is 65, more than the limit of 64",
    );
}

#[test]
fn subjects() {
    let plan = Plan {
        subjects: vec![SubjectEntry::default(); MAX_SUBJECTS],
        ..Plan::default()
    };
    check_cap(
        "subjects",
        plan,
        |p| p.subjects.push(SubjectEntry::default()),
        "subjects: number of subjects is 513, more than the limit of 512",
    );
}

#[test]
fn spectral_points_of_embedded_spectra() {
    let mut plan = Plan::default();
    plan.custom
        .gels
        .push(spectrum("filter", MAX_SPECTRAL_POINTS));
    check_cap(
        "gel points",
        plan,
        |p| {
            p.custom.gels[0] = spectrum("filter", MAX_SPECTRAL_POINTS + 1);
        },
        "custom.gels[0].wavelengths_nm: number of spectral points is 10001, more than the limit of 10000",
    );

    // Cameras are limited per channel.
    let channel = vec![0.5; MAX_SPECTRAL_POINTS];
    let mut plan = Plan::default();
    plan.custom.cameras.push(CustomCamera {
        id: "cam".into(),
        name: "Cam".into(),
        wavelengths_nm: spectrum("w", MAX_SPECTRAL_POINTS).wavelengths_nm,
        r: channel.clone(),
        g: channel.clone(),
        b: channel,
        note: String::new(),
    });
    check_cap(
        "camera points",
        plan,
        |p| p.custom.cameras[0].b.push(0.5),
        "custom.cameras[0].b: number of spectral points is 10001, more than the limit of 10000",
    );
}

#[test]
fn embedded_spectra_of_each_kind() {
    let mut plan = Plan::default();
    plan.custom.lamps = (0..MAX_CUSTOM_PER_KIND)
        .map(|i| spectrum(&format!("l{i}"), 3))
        .collect();
    check_cap(
        "embedded lamps",
        plan,
        |p| p.custom.lamps.push(spectrum("one-more", 3)),
        "custom.lamps: number of embedded spectra is 257, more than the limit of 256",
    );
}

#[test]
fn kit_gels() {
    let mut plan = Plan::default();
    plan.kit.gels = vec!["nd-03".to_string(); MAX_KIT_GELS];
    check_cap(
        "kit",
        plan,
        |p| p.kit.gels.push("nd-06".into()),
        "kit.gels: number of gels is 257, more than the limit of 256",
    );
}

#[test]
fn names_and_notes() {
    let plan = Plan {
        sources: vec![Source {
            name: "n".repeat(MAX_NAME_CHARS),
            ..source(1)
        }],
        ..Plan::default()
    };
    check_cap(
        "source name",
        plan,
        |p| p.sources[0].name.push('é'),
        "sources[0].name: length in characters is 201, more than the limit of 200",
    );

    let plan = Plan {
        notes: "ü".repeat(MAX_NOTES_CHARS),
        ..Plan::default()
    };
    check_cap(
        "notes",
        plan,
        |p| p.notes.push('.'),
        "notes: length in characters is 20001, more than the limit of 20000",
    );
}

#[test]
fn nesting_depth() {
    // `Plan(` is the first level; an unknown field (read and ignored) nests the rest.
    for (open, close) in [('(', ')'), ('[', ']')] {
        let nested = |depth: usize| {
            format!(
                "Plan(format_version: 1, extra: {}0{})",
                open.to_string().repeat(depth - 1),
                close.to_string().repeat(depth - 1)
            )
        };
        plan_from_str(&nested(MAX_NESTING))
            .unwrap_or_else(|e| panic!("{open} {MAX_NESTING} deep: {e}"));
        let err = plan_from_str(&nested(MAX_NESTING + 1))
            .unwrap_err()
            .to_string();
        // "Plan(format_version: 1, extra: " is 31 characters; the 65th level opens at column 95.
        assert_eq!(
            err,
            "<plan text>: line 1, column 95: brackets nest more than 64 deep (a plan nests about 8 deep); the file is damaged",
            "{open}"
        );
    }
}

#[test]
fn an_import_with_more_points_than_a_plan_holds_is_refused_and_the_plan_kept() {
    // The importer reads up to 100 000 rows; a plan embeds at most 10 000 points.
    let mut text = String::from("nm,dense\n");
    for i in 0..=MAX_SPECTRAL_POINTS {
        writeln!(text, "{:.2},0.5", 380.0 + 0.04 * i as f64).unwrap();
    }
    let table = import_bytes("dense.csv", text.as_bytes(), SpectrumKind::Lamp).unwrap();
    let mut plan = Plan::default();
    let before = plan.clone();
    let err = add_imported(&mut plan, &table, LibraryKind::Lamp)
        .unwrap_err()
        .to_string();
    assert_eq!(
        err,
        "custom.lamps[0].wavelengths_nm: number of spectral points is 10001, more than the limit of 10000"
    );
    assert_eq!(plan, before);
}

#[test]
fn the_limits_page_lists_every_value() {
    let page =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/../../docs/limits.md"))
            .expect("docs/limits.md is readable");
    let rows = [
        (
            "plan file size",
            format!("{} MiB", MAX_FILE_BYTES / (1024 * 1024)),
        ),
        ("bracket nesting", MAX_NESTING.to_string()),
        ("light sources", MAX_SOURCES.to_string()),
        ("zones", MAX_ZONES.to_string()),
        ("sources reached by one zone", MAX_SOURCES.to_string()),
        ("subjects", MAX_SUBJECTS.to_string()),
        ("gels stacked on one source", MAX_GEL_STACK.to_string()),
        (
            "points in one embedded spectrum",
            group_thousands(MAX_SPECTRAL_POINTS),
        ),
        (
            "embedded spectra of each kind",
            MAX_CUSTOM_PER_KIND.to_string(),
        ),
        ("gel ids in the advisor's kit", MAX_KIT_GELS.to_string()),
        ("names and ids", MAX_NAME_CHARS.to_string()),
        ("notes", group_thousands(MAX_NOTES_CHARS)),
    ];
    for (what, value) in rows {
        let row = page
            .lines()
            .find(|l| l.starts_with(&format!("| {what}")))
            .unwrap_or_else(|| panic!("docs/limits.md has no row for {what}"));
        let cells: Vec<&str> = row.split('|').map(str::trim).collect();
        assert!(
            cells.get(2).is_some_and(|c| c.starts_with(&value)),
            "docs/limits.md: {what} should be {value}: {row}"
        );
    }
}

/// 10000 → "10 000", as the docs write numbers.
fn group_thousands(n: usize) -> String {
    let digits = n.to_string();
    let mut out = String::new();
    for (i, c) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i).is_multiple_of(3) {
            out.push(' ');
        }
        out.push(c);
    }
    out
}
