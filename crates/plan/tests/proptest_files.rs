//! Property tests for plan files: random plans survive save → load exactly;
//! random or damaged bytes never make loading panic; validation never panics,
//! whatever the numbers.

use lampwright_plan::files::{plan_from_bytes, plan_from_str, plan_to_ron};
use lampwright_plan::{
    Adaptation, CameraRef, CameraSettings, CustomCamera, CustomLibrary, CustomSpectrum,
    CustomSubject, Display, FitMethod, GelLayer, GelRef, Kit, LampRef, MatrixMode, Plan, Source,
    SourceRole, SubjectEntry, SubjectRef, Viewing, WbPreset, WhiteBalanceSetting, Zone, ZoneLevel,
    ZoneReach, default_demo, load_plan, save_plan_atomic, validate,
};
use proptest::prelude::*;
use std::path::Path;

/// Any characters at all, controls and quotes included.
fn text() -> impl Strategy<Value = String> {
    prop::collection::vec(any::<char>(), 0..24).prop_map(String::from_iter)
}

fn finite() -> impl Strategy<Value = f64> {
    prop::num::f64::NORMAL | prop::num::f64::SUBNORMAL | prop::num::f64::ZERO
}

fn lamp_ref(num: BoxedStrategy<f64>) -> impl Strategy<Value = LampRef> {
    prop_oneof![
        text().prop_map(LampRef::Library),
        num.clone().prop_map(|cct_k| LampRef::Blackbody { cct_k }),
        num.prop_map(|cct_k| LampRef::Daylight { cct_k }),
        text().prop_map(LampRef::Custom),
    ]
}

fn gel_ref() -> impl Strategy<Value = GelRef> {
    prop_oneof![
        text().prop_map(GelRef::Library),
        text().prop_map(GelRef::Custom)
    ]
}

fn source(num: BoxedStrategy<f64>) -> impl Strategy<Value = Source> {
    (
        any::<u32>(),
        text(),
        0..SourceRole::ALL.len(),
        lamp_ref(num.clone()),
        num.clone(),
        any::<(bool, bool, bool)>(),
        prop::collection::vec((gel_ref(), num.clone()), 0..4),
        num,
    )
        .prop_map(
            |(id, name, role, lamp, level_lux, (enabled, solo, locked), gels, dimmer)| Source {
                id,
                name,
                role: SourceRole::ALL[role],
                lamp,
                level_lux,
                enabled,
                solo,
                gels: gels
                    .into_iter()
                    .map(|(gel, strength)| GelLayer { gel, strength })
                    .collect(),
                dimmer,
                locked,
            },
        )
}

fn zone(num: BoxedStrategy<f64>) -> impl Strategy<Value = Zone> {
    let level = prop_oneof![
        Just(ZoneLevel::AsSource),
        num.clone().prop_map(ZoneLevel::Lux),
        num.clone().prop_map(ZoneLevel::Stops),
        (num.clone(), num).prop_map(|(rated_lux_at_1m, distance_m)| ZoneLevel::Distance {
            rated_lux_at_1m,
            distance_m
        }),
    ];
    (
        any::<u32>(),
        text(),
        prop::collection::vec((any::<u32>(), level), 0..4),
    )
        .prop_map(|(id, name, reach)| Zone {
            id,
            name,
            reach: reach
                .into_iter()
                .map(|(source, level)| ZoneReach { source, level })
                .collect(),
            weight: 1.0,
        })
}

fn spectrum(num: BoxedStrategy<f64>) -> impl Strategy<Value = CustomSpectrum> {
    (
        text(),
        text(),
        prop::collection::vec(num.clone(), 0..12),
        prop::collection::vec(num, 0..12),
        text(),
    )
        .prop_map(|(id, name, wavelengths_nm, values, note)| CustomSpectrum {
            id,
            name,
            wavelengths_nm,
            values,
            note,
        })
}

fn camera_settings(num: BoxedStrategy<f64>) -> impl Strategy<Value = CameraSettings> {
    let camera = prop_oneof![
        text().prop_map(CameraRef::Library),
        Just(CameraRef::Colorimetric),
        text().prop_map(CameraRef::Custom),
    ];
    let presets = [
        WbPreset::Daylight,
        WbPreset::Cloudy,
        WbPreset::Shade,
        WbPreset::Tungsten,
        WbPreset::Fluorescent,
    ];
    let wb = prop_oneof![
        num.prop_map(WhiteBalanceSetting::Kelvin),
        (0..presets.len()).prop_map(move |i| WhiteBalanceSetting::Preset(presets[i])),
        Just(WhiteBalanceSetting::GreyCard),
        Just(WhiteBalanceSetting::AutoGreyWorld),
        Just(WhiteBalanceSetting::AutoBrightestNeutral),
    ];
    let matrices = [
        MatrixMode::Factory,
        MatrixMode::DualIlluminant,
        MatrixMode::SceneProfile,
    ];
    let fits = [
        FitMethod::Linear,
        FitMethod::WhitePreserving,
        FitMethod::De2000,
        FitMethod::RootPoly,
    ];
    (camera, wb, 0..3usize, 0..4usize).prop_map(move |(camera, white_balance, m, f)| {
        CameraSettings {
            camera,
            white_balance,
            matrix: matrices[m],
            fit: fits[f],
        }
    })
}

fn custom(num: BoxedStrategy<f64>) -> impl Strategy<Value = CustomLibrary> {
    let camera = (
        text(),
        text(),
        prop::collection::vec(num.clone(), 0..6),
        prop::collection::vec(num.clone(), 0..6),
        prop::collection::vec(num.clone(), 0..6),
        prop::collection::vec(num.clone(), 0..6),
    )
        .prop_map(|(id, name, wavelengths_nm, r, g, b)| CustomCamera {
            id,
            name,
            wavelengths_nm,
            r,
            g,
            b,
            note: String::new(),
        });
    (
        prop::collection::vec(spectrum(num.clone()), 0..2),
        prop::collection::vec(spectrum(num.clone()), 0..2),
        prop::collection::vec((spectrum(num), text()), 0..2),
        prop::collection::vec(camera, 0..2),
    )
        .prop_map(|(lamps, gels, subjects, cameras)| CustomLibrary {
            lamps,
            gels,
            subjects: subjects
                .into_iter()
                .map(|(spectrum, group)| CustomSubject { spectrum, group })
                .collect(),
            cameras,
        })
}

fn plan_with(num: BoxedStrategy<f64>) -> impl Strategy<Value = Plan> {
    let subject = (
        prop_oneof![
            text().prop_map(SubjectRef::Library),
            text().prop_map(SubjectRef::Custom)
        ],
        any::<bool>(),
        num.clone(),
    )
        .prop_map(|(subject, included, weight)| SubjectEntry {
            subject,
            included,
            weight,
        });
    let viewing = (any::<bool>(), any::<bool>()).prop_map(|(a, d)| Viewing {
        adaptation: if a {
            Adaptation::Adapted
        } else {
            Adaptation::AsLit
        },
        display: if d { Display::Srgb } else { Display::DisplayP3 },
    });
    let kit = (
        prop::collection::vec(text(), 0..3),
        any::<u8>(),
        num.clone(),
    )
        .prop_map(|(gels, max_stack, max_stops_lost)| Kit {
            gels,
            max_stack,
            max_stops_lost,
        });
    (
        text(),
        text(),
        prop::collection::vec(source(num.clone()), 0..5),
        prop::collection::vec(zone(num.clone()), 0..3),
        prop::collection::vec(subject, 0..5),
        camera_settings(num.clone()),
        viewing,
        kit,
        custom(num),
    )
        .prop_map(
            |(name, notes, sources, zones, subjects, camera, viewing, kit, custom)| Plan {
                format_version: lampwright_plan::FORMAT_VERSION,
                name,
                notes,
                sources,
                zones,
                subjects,
                camera,
                viewing,
                kit,
                custom,
            },
        )
}

fn finite_plan() -> impl Strategy<Value = Plan> {
    plan_with(finite().boxed())
}

fn any_number_plan() -> impl Strategy<Value = Plan> {
    let num = prop_oneof![
        finite(),
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        -10.0..30_000.0f64,
    ];
    plan_with(num.boxed())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    #[test]
    fn random_plans_round_trip_through_text(plan in finite_plan()) {
        let text = plan_to_ron(&plan).unwrap();
        prop_assert_eq!(plan_from_str(&text).unwrap(), plan);
    }

    #[test]
    fn validation_and_saving_never_panic(plan in any_number_plan()) {
        let _ = validate(&plan);
        if let Ok(text) = plan_to_ron(&plan) {
            let _ = plan_from_str(&text);
        }
    }

    #[test]
    fn random_bytes_never_panic(bytes in prop::collection::vec(any::<u8>(), 0..512)) {
        let _ = plan_from_bytes(Path::new("random.ron"), &bytes);
    }

    #[test]
    fn damaged_demo_text_never_panics(cut in 0usize..6000, at in 0usize..6000, insert in any::<char>()) {
        let demo = plan_to_ron(&default_demo().unwrap()).unwrap();
        let mut chars: Vec<char> = demo.chars().collect();
        chars.truncate(cut.max(1).min(chars.len()));
        let at = at.min(chars.len());
        chars.insert(at, insert);
        let text: String = chars.into_iter().collect();
        let _ = plan_from_str(&text);
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]

    #[test]
    fn random_plans_round_trip_through_files(plan in finite_plan()) {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("plan.ron");
        save_plan_atomic(&path, &plan).unwrap();
        prop_assert_eq!(load_plan(&path).unwrap(), plan);
    }
}
