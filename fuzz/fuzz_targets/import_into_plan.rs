//! Fuzz what happens to a measured spectral file after the importer accepts
//! it: the `lamp` command's figures of a lamp table, the `camera-fit`
//! command's camera from a camera table, and the window's "import into the
//! plan" (embed the table, point a source, gel, subject or the camera at it,
//! validate, evaluate, save and re-read).
//!
//! Asserted: nothing panics; every refusal is one non-empty line; a lamp
//! report and a plan evaluation hold no NaN or infinite number; a plan with an
//! embedded import saves and reads back to the same text.

#![no_main]

use lampwright_camera::CameraSensitivities;
use lampwright_color::import::import_bytes;
use lampwright_color::lamp_report::lamp_report_with_observer;
use lampwright_color::observer::ObserverKind;
use lampwright_fuzz::{is_one_line, non_finite_numbers};
use lampwright_plan::custom::{add_imported, spectrum_kind_for};
use lampwright_plan::files::{plan_from_str, plan_to_ron};
use lampwright_plan::{
    CameraRef, GelLayer, GelRef, LampRef, LibraryKind, Plan, Source, SubjectEntry, SubjectRef,
    evaluate, validate,
};
use libfuzzer_sys::fuzz_target;

fn refusal(what: &str, e: &impl std::fmt::Display) {
    let message = e.to_string();
    assert!(
        is_one_line(&message),
        "{what}: refusal not one line: {message:?}"
    );
}

/// One library source and one library subject under the default camera.
fn base_plan() -> Plan {
    Plan {
        name: "Fuzz".into(),
        sources: vec![Source {
            id: 1,
            ..Source::default()
        }],
        subjects: vec![SubjectEntry::default()],
        ..Plan::default()
    }
}

/// Point the plan's source, gel, subject or camera at the embedded entry `id`.
fn use_entry(plan: &mut Plan, kind: LibraryKind, id: &str) {
    match kind {
        LibraryKind::Lamp => plan.sources[0].lamp = LampRef::Custom(id.into()),
        LibraryKind::Gel => {
            plan.sources[0].gels = vec![GelLayer {
                gel: GelRef::Custom(id.into()),
                strength: 1.0,
            }];
        }
        LibraryKind::Subject => plan.subjects[0].subject = SubjectRef::Custom(id.into()),
        LibraryKind::Camera => plan.camera.camera = CameraRef::Custom(id.into()),
    }
}

fuzz_target!(|data: &[u8]| {
    for kind in [
        LibraryKind::Lamp,
        LibraryKind::Gel,
        LibraryKind::Subject,
        LibraryKind::Camera,
    ] {
        let table = match import_bytes("fuzz.csv", data, spectrum_kind_for(kind)) {
            Ok(table) => table,
            Err(e) => {
                refusal("import", &e);
                continue;
            }
        };

        match kind {
            LibraryKind::Lamp => match table.to_relative_spd(0) {
                Ok(spd) => {
                    for observer in [
                        ObserverKind::Cie1931TwoDegree,
                        ObserverKind::Cie1964TenDegree,
                    ] {
                        match lamp_report_with_observer(&spd, observer) {
                            Ok(report) => {
                                let bad = non_finite_numbers(&report);
                                assert!(bad.is_empty(), "non-finite lamp figures: {bad:?}");
                            }
                            Err(e) => refusal("lamp report", &e),
                        }
                    }
                }
                Err(e) => refusal("lamp spectrum", &e),
            },
            LibraryKind::Camera => {
                if let Err(e) = CameraSensitivities::from_imported("fuzz", &table) {
                    refusal("camera", &e);
                }
            }
            LibraryKind::Gel | LibraryKind::Subject => {}
        }

        let mut plan = base_plan();
        let ids = match add_imported(&mut plan, &table, kind) {
            Ok(ids) => ids,
            Err(e) => {
                refusal("add to plan", &e);
                continue;
            }
        };
        let id = ids.first().expect("an accepted import adds an entry");
        use_entry(&mut plan, kind, id);

        for issue in validate(&plan) {
            assert!(
                is_one_line(&issue.field) && is_one_line(&issue.message),
                "issue not one line: {issue}"
            );
        }
        match evaluate(&plan) {
            Ok(evaluation) => {
                let bad = non_finite_numbers(&evaluation);
                assert!(
                    bad.is_empty(),
                    "non-finite numbers in the evaluation: {bad:?}"
                );
            }
            Err(e) => refusal("evaluation", &e),
        }

        let text = plan_to_ron(&plan).unwrap_or_else(|e| panic!("the plan does not save: {e}"));
        let again = plan_from_str(&text)
            .unwrap_or_else(|e| panic!("the saved plan does not read back: {e}"));
        assert_eq!(
            plan_to_ron(&again).expect("the re-read plan saves"),
            text,
            "saving is not stable across a re-read"
        );
    }
});
