//! Plan files: every library item and every demo plan survives save → load
//! unchanged; every earlier-format fixture loads and migrates as documented.

use lampwright_plan::library;
use lampwright_plan::migrate::V0_REFERENCE_LUX;
use lampwright_plan::{
    CameraRef, CustomCamera, CustomSpectrum, CustomSubject, FORMAT_VERSION, GelLayer, GelRef,
    LampRef, Plan, Source, SourceRole, SubjectEntry, SubjectRef, WhiteBalanceSetting, Zone,
    ZoneLevel, ZoneReach, demo_plans, load_plan, save_plan_atomic, validate,
};
use std::path::PathBuf;

fn fixture(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(name)
}

/// A plan that refers to every library lamp, gel, subject and camera, plus
/// every kind of embedded spectrum, zone level and white-balance setting.
#[allow(clippy::too_many_lines)] // one literal plan, clearer read top to bottom than split
fn everything_plan() -> Plan {
    let mut plan = Plan {
        name: "Everything".into(),
        notes: "Notes with \"quotes\", back\\slashes, tabs\tand ünïcödé — 色".into(),
        ..Plan::default()
    };
    let mut id = 0;
    for lamp in library::lamps() {
        id += 1;
        plan.sources.push(Source {
            id,
            name: lamp.name.into(),
            role: SourceRole::ALL[id as usize % SourceRole::ALL.len()],
            lamp: LampRef::Library(lamp.id.into()),
            level_lux: 100.0 + f64::from(id) * 0.1,
            dimmer: 0.95,
            ..Source::default()
        });
    }
    // Gels spread over the sources, at awkward strengths.
    for (i, gel) in library::gels().iter().enumerate() {
        plan.sources[i % 8].gels.push(GelLayer {
            gel: GelRef::Library(gel.id.into()),
            strength: 1.0 / 3.0 + i as f64,
        });
    }
    plan.sources.push(Source {
        id: 100,
        name: "Formula lamps".into(),
        lamp: LampRef::Daylight { cct_k: 5600.0 },
        ..Source::default()
    });
    plan.sources.push(Source {
        id: 101,
        name: "Embedded".into(),
        lamp: LampRef::Custom("my-lamp".into()),
        gels: vec![GelLayer {
            gel: GelRef::Custom("my-gel".into()),
            strength: 0.125,
        }],
        ..Source::default()
    });
    for subject in library::subjects() {
        plan.subjects.push(SubjectEntry {
            subject: SubjectRef::Library(subject.id.into()),
            included: subject.group != "neutrals",
            weight: 1.5,
        });
    }
    plan.subjects.push(SubjectEntry {
        subject: SubjectRef::Custom("my-paint".into()),
        ..SubjectEntry::default()
    });
    plan.zones = vec![
        Zone {
            id: 1,
            name: "Main".into(),
            reach: vec![
                ZoneReach {
                    source: 1,
                    level: ZoneLevel::AsSource,
                },
                ZoneReach {
                    source: 2,
                    level: ZoneLevel::Lux(12.5),
                },
                ZoneReach {
                    source: 3,
                    level: ZoneLevel::Stops(-1.0 / 3.0),
                },
                ZoneReach {
                    source: 100,
                    level: ZoneLevel::Distance {
                        rated_lux_at_1m: 4000.0,
                        distance_m: 2.7,
                    },
                },
            ],
            weight: 1.0,
        },
        Zone {
            id: 2,
            name: "Dark corner".into(),
            reach: vec![ZoneReach {
                source: 101,
                level: ZoneLevel::AsSource,
            }],
            weight: 1.0,
        },
    ];
    let wl: Vec<f64> = (0..=80).map(|i| 380.0 + 5.0 * f64::from(i)).collect();
    let curve = |f: &dyn Fn(f64) -> f64| wl.iter().map(|w| f(*w)).collect::<Vec<f64>>();
    plan.custom.lamps.push(CustomSpectrum {
        id: "my-lamp".into(),
        name: "Measured lamp".into(),
        wavelengths_nm: wl.clone(),
        values: curve(&|w| 0.2 + (w - 380.0) / 400.0),
        note: "spectrometer, 2024".into(),
    });
    plan.custom.gels.push(CustomSpectrum {
        id: "my-gel".into(),
        name: "Measured gel".into(),
        wavelengths_nm: wl.clone(),
        values: curve(&|w| 0.3 + 0.6 * ((w - 380.0) / 400.0)),
        note: String::new(),
    });
    plan.custom.subjects.push(CustomSubject {
        spectrum: CustomSpectrum {
            id: "my-paint".into(),
            name: "Wall paint".into(),
            wavelengths_nm: wl.clone(),
            values: curve(&|w| 0.1 + 0.0005 * (w - 380.0)),
            note: String::new(),
        },
        group: "set".into(),
    });
    let bump = |c: f64| curve(&|w| (-((w - c) / 40.0).powi(2)).exp());
    plan.custom.cameras.push(CustomCamera {
        id: "my-cam".into(),
        name: "Measured camera".into(),
        wavelengths_nm: wl.clone(),
        r: bump(600.0),
        g: bump(540.0),
        b: bump(450.0),
        note: String::new(),
    });
    plan.camera.white_balance = WhiteBalanceSetting::Kelvin(4321.5);
    plan.kit.gels = library::gels().iter().map(|g| g.id.to_string()).collect();
    plan
}

fn save_and_load(plan: &Plan) -> Plan {
    let dir = tempfile::tempdir().expect("temporary folder");
    let path = dir.path().join("plan.ron");
    save_plan_atomic(&path, plan).expect("save");
    load_plan(&path).expect("load")
}

#[test]
fn every_library_item_round_trips_through_a_file() {
    let plan = everything_plan();
    let issues = validate(&plan);
    // Dimmers on non-filament lamps are ignored, which validation points out.
    assert!(
        issues.iter().all(|i| i.field.ends_with(".dimmer")),
        "{issues:#?}"
    );
    assert_eq!(save_and_load(&plan), plan);
    // Every other camera, too.
    for cam in library::cameras().unwrap() {
        let mut p = plan.clone();
        p.camera.camera = CameraRef::Library(cam.id.into());
        assert_eq!(save_and_load(&p), p, "{}", cam.id);
    }
    for camera in [CameraRef::Colorimetric, CameraRef::Custom("my-cam".into())] {
        let mut p = plan.clone();
        p.camera.camera = camera;
        assert!(validate(&p).iter().all(|i| i.field.ends_with(".dimmer")));
        assert_eq!(save_and_load(&p), p);
    }
}

#[test]
fn every_demo_plan_round_trips_through_a_file() {
    let demos = demo_plans();
    assert_eq!(demos.len(), 3);
    for plan in demos {
        assert_eq!(save_and_load(&plan), plan, "{}", plan.name);
    }
}

#[test]
fn format_0_studio_portrait_migrates() {
    let plan = load_plan(&fixture("plan-v0-studio-portrait.ron")).unwrap();
    assert_eq!(plan.format_version, FORMAT_VERSION);
    assert_eq!(plan.name, "Studio portrait (old format)");
    assert!(plan.zones.is_empty());
    let ids: Vec<u32> = plan.sources.iter().map(|s| s.id).collect();
    assert_eq!(ids, vec![1, 2, 3]);
    // level_lux = 1000 · 2^stops (the version 0 definition).
    for (source, stops) in plan.sources.iter().zip([0.5, -1.5, -1.0]) {
        assert!((source.level_lux - V0_REFERENCE_LUX * f64::exp2(stops)).abs() < 1e-9);
    }
    assert!((plan.sources[0].level_lux - 1_414.213_562_373_095).abs() < 1e-9);
    assert_eq!(plan.sources[1].lamp, LampRef::Blackbody { cct_k: 3200.0 });
    assert_eq!(plan.sources[2].role, SourceRole::Back);
    assert!(!plan.sources[2].enabled);
    assert_eq!(plan.sources[2].gels.len(), 2);
    assert!((plan.sources[0].dimmer - 0.8).abs() < 1e-12);
    assert!((plan.sources[2].dimmer - 1.0).abs() < 1e-12);
    assert_eq!(plan.subjects.len(), 4);
    assert!(
        plan.subjects
            .iter()
            .all(|s| s.included && (s.weight - 1.0).abs() < 1e-12)
    );
    assert_eq!(plan.camera.camera, CameraRef::Library("demo-b".into()));
    assert_eq!(
        plan.camera.white_balance,
        WhiteBalanceSetting::Kelvin(3200.0)
    );
    assert!(validate(&plan).is_empty(), "{:#?}", validate(&plan));
    // Saving writes the current format, which loads back identically.
    assert_eq!(save_and_load(&plan), plan);
}

#[test]
fn format_0_minimal_plan_migrates_with_defaults() {
    let plan = load_plan(&fixture("plan-v0-minimal.ron")).unwrap();
    assert_eq!(plan.sources.len(), 1);
    let s = &plan.sources[0];
    assert_eq!(s.role, SourceRole::Key);
    assert!((s.level_lux - V0_REFERENCE_LUX).abs() < 1e-9);
    assert!(s.enabled);
    assert_eq!(plan.camera.white_balance, WhiteBalanceSetting::GreyCard);
    assert_eq!(plan.camera.camera, CameraRef::Library("demo-a".into()));
}

#[test]
fn every_fixture_loads() {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
    let mut n = 0;
    for entry in std::fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.extension().is_some_and(|e| e == "ron") {
            load_plan(&path).unwrap_or_else(|e| panic!("{e}"));
            n += 1;
        }
    }
    assert!(n >= 2);
}

#[test]
fn the_example_in_the_plan_file_guide_loads_and_validates() {
    let guide = include_str!("../../../docs/plan-files.md");
    let start = guide.find("```ron\n").expect("a RON example") + "```ron\n".len();
    let end = start + guide[start..].find("```").expect("end of the example");
    let plan = lampwright_plan::files::plan_from_str(&guide[start..end]).unwrap();
    assert_eq!(plan.name, "Kitchen interview");
    assert_eq!(plan.sources.len(), 2);
    assert!((plan.sources[1].dimmer - 0.7).abs() < 1e-12);
    assert!(
        plan.sources[1].enabled,
        "omitted fields take their defaults"
    );
    assert!(validate(&plan).is_empty(), "{:#?}", validate(&plan));
}
