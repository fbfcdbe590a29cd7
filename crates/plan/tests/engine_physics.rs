//! Physics with exact or well-known answers, checked through `evaluate`.

use lampwright_plan::{
    GelLayer, GelRef, LampRef, Plan, Source, SourceRole, SubjectEntry, SubjectRef, Zone, ZoneLevel,
    ZoneReach, evaluate,
};

fn source(id: u32, name: &str, lamp: LampRef, lux: f64) -> Source {
    Source {
        id,
        name: name.into(),
        lamp,
        level_lux: lux,
        ..Source::default()
    }
}

fn plan_with(sources: Vec<Source>) -> Plan {
    Plan {
        sources,
        subjects: vec![
            SubjectEntry {
                subject: SubjectRef::Library("grey-card-18".into()),
                ..SubjectEntry::default()
            },
            SubjectEntry {
                subject: SubjectRef::Library("white-card".into()),
                ..SubjectEntry::default()
            },
        ],
        ..Plan::default()
    }
}

fn gel(id: &str, strength: f64) -> GelLayer {
    GelLayer {
        gel: GelRef::Library(id.into()),
        strength,
    }
}

#[test]
fn full_cto_turns_5500k_into_about_3200k() {
    // Common practice: a full CTO converts 5500 K daylight to about 3200 K.
    let mut s = source(1, "Key", LampRef::Blackbody { cct_k: 5500.0 }, 1000.0);
    s.gels.push(gel("cto-full", 1.0));
    let e = evaluate(&plan_with(vec![s])).unwrap();
    let cct = e.light.cct_k.unwrap();
    assert!((cct - 3200.0).abs() < 100.0, "{cct}");
}

#[test]
fn nd_03_halves_the_light() {
    // Common practice: ND 0.3 = one stop (transmission 10^-0.3 ≈ 0.501).
    let mut s = source(1, "Key", LampRef::Blackbody { cct_k: 3200.0 }, 1000.0);
    s.gels.push(gel("nd-03", 1.0));
    let e = evaluate(&plan_with(vec![s])).unwrap();
    assert!(
        (e.light.illuminance_lux - 1000.0 * 10f64.powf(-0.3)).abs() < 1.0,
        "{}",
        e.light.illuminance_lux
    );
}

#[test]
fn two_half_sources_equal_one_full() {
    let one = evaluate(&plan_with(vec![source(
        1,
        "Key",
        LampRef::Library("tungsten-3200".into()),
        800.0,
    )]))
    .unwrap();
    let two = evaluate(&plan_with(vec![
        source(1, "Key", LampRef::Library("tungsten-3200".into()), 400.0),
        Source {
            role: SourceRole::Fill,
            ..source(2, "Key 2", LampRef::Library("tungsten-3200".into()), 400.0)
        },
    ]))
    .unwrap();
    assert!((one.light.illuminance_lux - two.light.illuminance_lux).abs() < 1e-9);
    for (a, b) in one.light.spectrum.iter().zip(two.light.spectrum.iter()) {
        assert!((a - b).abs() <= 1e-12 * a.abs().max(1.0));
    }
    assert!((one.light.cct_k.unwrap() - two.light.cct_k.unwrap()).abs() < 1e-9);
}

#[test]
fn level_is_illuminance_in_lux() {
    let e = evaluate(&plan_with(vec![source(
        1,
        "Key",
        LampRef::Daylight { cct_k: 5600.0 },
        2500.0,
    )]))
    .unwrap();
    assert!((e.light.illuminance_lux - 2500.0).abs() < 1e-9);
    // EV100 = log2(E·100/250) (common practice, incident meter with C = 250).
    assert!((e.light.ev100.unwrap() - (2500.0f64 * 100.0 / 250.0).log2()).abs() < 1e-9);
}

#[test]
fn blackbody_mix_reads_its_own_temperature() {
    let e = evaluate(&plan_with(vec![source(
        1,
        "Key",
        LampRef::Blackbody { cct_k: 4300.0 },
        500.0,
    )]))
    .unwrap();
    assert!((e.light.cct_k.unwrap() - 4300.0).abs() < 1.0);
    assert!(e.light.duv.unwrap().abs() < 1e-4);
    assert!((e.light.mired.unwrap() - 1e6 / 4300.0).abs() < 0.1);
}

#[test]
fn nothing_lit_gives_defined_results() {
    let mut s = source(1, "Key", LampRef::Blackbody { cct_k: 3200.0 }, 1000.0);
    s.enabled = false;
    let e = evaluate(&plan_with(vec![s])).unwrap();
    assert!(e.light.illuminance_lux.abs() < 1e-12);
    assert!(e.light.cct_k.is_none());
    assert!(!e.warnings.is_empty());
    for s in &e.subjects {
        assert!(s.de2000.is_finite());
        assert!(s.eye_lab.iter().chain(&s.camera_lab).all(|v| v.is_finite()));
    }
}

#[test]
fn solo_lights_only_the_soloed_source() {
    let key = source(1, "Key", LampRef::Blackbody { cct_k: 3200.0 }, 1000.0);
    let mut fill = source(2, "Fill", LampRef::Blackbody { cct_k: 6500.0 }, 300.0);
    fill.role = SourceRole::Fill;
    fill.solo = true;
    let e = evaluate(&plan_with(vec![key, fill])).unwrap();
    assert!((e.light.illuminance_lux - 300.0).abs() < 1e-9);
}

#[test]
fn key_fill_ratio_in_stops() {
    let key = source(1, "Key", LampRef::Blackbody { cct_k: 3200.0 }, 1000.0);
    let mut fill = source(2, "Fill", LampRef::Blackbody { cct_k: 3200.0 }, 250.0);
    fill.role = SourceRole::Fill;
    let e = evaluate(&plan_with(vec![key, fill])).unwrap();
    let f = e.sources.iter().find(|s| s.name == "Fill").unwrap();
    assert!((f.stops_from_key.unwrap() + 2.0).abs() < 1e-9);
}

#[test]
fn one_zone_equals_no_zones() {
    let base = plan_with(vec![
        source(1, "Key", LampRef::Library("tungsten-3200".into()), 800.0),
        Source {
            role: SourceRole::Fill,
            ..source(2, "Fill", LampRef::Daylight { cct_k: 5600.0 }, 200.0)
        },
    ]);
    let mut zoned = base.clone();
    zoned.zones = vec![Zone {
        id: 1,
        name: "Scene".into(),
        reach: vec![
            ZoneReach {
                source: 1,
                level: ZoneLevel::AsSource,
            },
            ZoneReach {
                source: 2,
                level: ZoneLevel::AsSource,
            },
        ],
        weight: 1.0,
    }];
    let a = evaluate(&base).unwrap();
    let b = evaluate(&zoned).unwrap();
    assert_eq!(a.light, b.light);
    assert_eq!(a.subjects, b.subjects);
    assert_eq!(a.summary, b.summary);
}

#[test]
fn inverse_square_doubling_distance_costs_two_stops() {
    // Inverse-square law: E = I / d² (exact), so 2× distance = ¼ light = −2 stops.
    let near = lampwright_plan::engine::inverse_square_lux(4000.0, 1.5).unwrap();
    let far = lampwright_plan::engine::inverse_square_lux(4000.0, 3.0).unwrap();
    assert!(((far / near).log2() + 2.0).abs() < 1e-12);
    assert!(lampwright_plan::engine::inverse_square_lux(4000.0, 0.0).is_none());
}

/// A 5600 K daylight key (id 1) at 1000 lx and an ambient sodium street light (id 2).
fn daylight_key_and_sodium_street(street_lux: f64) -> Plan {
    plan_with(vec![
        source(1, "Key", LampRef::Daylight { cct_k: 5600.0 }, 1000.0),
        Source {
            role: SourceRole::Ambient,
            ..source(
                2,
                "Street",
                LampRef::Library("hps-street".into()),
                street_lux,
            )
        },
    ])
}

#[test]
fn source_only_in_shadow_zone_leaves_key_side_alone() {
    let mut plan = daylight_key_and_sodium_street(100.0);
    let key_zone = Zone {
        id: 1,
        name: "Key side".into(),
        reach: vec![ZoneReach {
            source: 1,
            level: ZoneLevel::AsSource,
        }],
        weight: 1.0,
    };
    let shadow = Zone {
        id: 2,
        name: "Shadow side".into(),
        reach: vec![
            ZoneReach {
                source: 1,
                level: ZoneLevel::Stops(-3.0),
            },
            ZoneReach {
                source: 2,
                level: ZoneLevel::AsSource,
            },
        ],
        weight: 1.0,
    };
    plan.zones = vec![key_zone.clone()];
    let alone = evaluate(&plan).unwrap();
    plan.zones = vec![key_zone, shadow];
    let both = evaluate(&plan).unwrap();
    assert_eq!(alone.zones[0].light, both.zones[0].light);
    assert_eq!(alone.zones[0].subjects, both.zones[0].subjects);
    // The sodium-lit shadow side is far warmer than daylight and the engine says so.
    let shadow = &both.zones[1];
    assert!(shadow.light.cct_k.unwrap() < 4000.0);
    assert!(
        both.warnings
            .iter()
            .any(|w| w.contains("Shadow side") && w.contains("warmer")),
        "{:?}",
        both.warnings
    );
}

#[test]
fn perfect_white_under_grey_card_balance_is_neutral() {
    // With a grey-card white balance and an adapted eye, a white card is neutral
    // to both: a*, b* near zero.
    let e = evaluate(&plan_with(vec![source(
        1,
        "Key",
        LampRef::Library("tungsten-3200".into()),
        1000.0,
    )]))
    .unwrap();
    let white = e
        .subjects
        .iter()
        .find(|s| s.name.to_lowercase().contains("white"))
        .unwrap();
    for lab in [white.eye_lab, white.camera_lab] {
        assert!(lab[1].abs() < 0.5 && lab[2].abs() < 0.5, "{lab:?}");
    }
}

fn key_and_shadow(plan: &mut Plan, shadow_sources: Vec<ZoneReach>) {
    plan.zones = vec![
        Zone {
            id: 1,
            name: "Key side".into(),
            reach: vec![ZoneReach {
                source: 1,
                level: ZoneLevel::AsSource,
            }],
            weight: 1.0,
        },
        Zone {
            id: 2,
            name: "Shadow side".into(),
            reach: shadow_sources,
            weight: 1.0,
        },
    ];
}

#[test]
fn automatic_white_balance_meters_the_whole_frame() {
    use lampwright_plan::WhiteBalanceSetting;
    // A camera sets one white balance for the frame; in its automatic modes it
    // meters every part of it. Grey world (the mean raw signal is taken as
    // neutral) over a frame whose shadow side repeats the key side's light
    // exactly must give the key side's own gains (the mean of a set repeated
    // is its mean); a sodium-lit shadow side must pull the estimate warmer
    // (less red gain relative to blue), so key-side subjects shift.
    let mut plan = daylight_key_and_sodium_street(1000.0);
    plan.subjects.push(SubjectEntry {
        subject: SubjectRef::Library("skin-tan".into()),
        ..SubjectEntry::default()
    });
    for wb in [
        WhiteBalanceSetting::AutoGreyWorld,
        WhiteBalanceSetting::AutoBrightestNeutral,
    ] {
        plan.camera.white_balance = wb.clone();
        key_and_shadow(&mut plan, vec![]);
        plan.zones.truncate(1);
        let alone = evaluate(&plan).unwrap();
        key_and_shadow(
            &mut plan,
            vec![ZoneReach {
                source: 1,
                level: ZoneLevel::AsSource,
            }],
        );
        let same = evaluate(&plan).unwrap();
        for (a, b) in alone.camera.wb_gains.iter().zip(&same.camera.wb_gains) {
            assert!((a - b).abs() < 1e-12, "{wb:?}: {a} vs {b}");
        }
        key_and_shadow(
            &mut plan,
            vec![ZoneReach {
                source: 2,
                level: ZoneLevel::AsSource,
            }],
        );
        let mixed = evaluate(&plan).unwrap();
        let ratio = |g: [f64; 3]| g[0] / g[2];
        if wb == WhiteBalanceSetting::AutoGreyWorld {
            assert!(
                ratio(mixed.camera.wb_gains) < 0.95 * ratio(alone.camera.wb_gains),
                "grey world: {:?} vs {:?}",
                mixed.camera.wb_gains,
                alone.camera.wb_gains
            );
            // The key side's light is the same; its subjects render differently.
            assert_eq!(alone.zones[0].light, mixed.zones[0].light);
            assert_ne!(alone.zones[0].subjects, mixed.zones[0].subjects);
        }
    }
    // A grey card is read on the key side: the sodium shadow side changes nothing there.
    plan.camera.white_balance = WhiteBalanceSetting::GreyCard;
    key_and_shadow(&mut plan, vec![]);
    plan.zones.truncate(1);
    let alone = evaluate(&plan).unwrap();
    key_and_shadow(
        &mut plan,
        vec![ZoneReach {
            source: 2,
            level: ZoneLevel::AsSource,
        }],
    );
    let mixed = evaluate(&plan).unwrap();
    // Identical computations: the gains must be the same numbers.
    assert!(
        alone
            .camera
            .wb_gains
            .iter()
            .zip(&mixed.camera.wb_gains)
            .all(|(a, b)| a.to_bits() == b.to_bits())
    );
    assert_eq!(alone.zones[0].subjects, mixed.zones[0].subjects);
}
