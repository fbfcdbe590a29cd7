//! End-to-end tests of `lampwright advise`: the real binary on a demo plan
//! and on small plans written for the test; its JSON checked against the
//! plan crate's own evaluation of the applied plan.

use lampwright_plan::{
    CameraRef, Kit, LampRef, Plan, Source, SubjectEntry, SubjectRef, evaluate, load_plan,
    save_plan_atomic,
};
use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn lampwright(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lampwright"))
        .args(args)
        .output()
        .expect("run lampwright")
}

fn demo_file(name: &str) -> String {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("assets/demo/plans")
        .join(name)
        .display()
        .to_string()
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

fn save(dir: &Path, name: &str, plan: &Plan) -> String {
    let path: PathBuf = dir.join(name);
    save_plan_atomic(&path, plan).expect("save the plan");
    path.display().to_string()
}

/// One lamp with an invented green spike, a few subjects, a correction kit.
fn green_tube_plan(lamp: &str) -> Plan {
    Plan {
        name: "Green tube".into(),
        sources: vec![Source {
            id: 1,
            name: "Tube".into(),
            lamp: LampRef::Library(lamp.into()),
            level_lux: 500.0,
            ..Source::default()
        }],
        subjects: ["grey-card-18", "skin-tan", "denim"]
            .iter()
            .map(|id| SubjectEntry {
                subject: SubjectRef::Library((*id).into()),
                ..SubjectEntry::default()
            })
            .collect(),
        kit: Kit {
            gels: vec!["minus-green-full".into(), "plus-green-full".into()],
            max_stack: 1,
            max_stops_lost: 2.0,
        },
        ..Plan::default()
    }
}

#[test]
fn json_lists_suggestions_with_moves_before_and_after() {
    let o = lampwright(&["advise", &demo_file("night-market-portrait.ron"), "--json"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let v: Value = serde_json::from_str(&stdout(&o)).expect("JSON");
    let list = v.as_array().expect("a list of suggestions");
    assert!(!list.is_empty() && list.len() <= 5);
    for s in list {
        let moves = s["moves"].as_array().expect("moves");
        assert!(
            !moves.is_empty()
                && moves
                    .iter()
                    .all(|m| m.as_str().is_some_and(|t| !t.is_empty()))
        );
        for side in ["before", "after"] {
            for key in [
                "mean_de2000",
                "max_de2000",
                "cct_k",
                "duv",
                "rf",
                "rg",
                "stops_lost",
            ] {
                assert!(s[side].get(key).is_some(), "{side}.{key} missing");
            }
        }
        assert_eq!(s["before"]["stops_lost"].as_f64(), Some(0.0));
        // Camera fidelity: every suggestion lowers the mean ΔE00.
        assert!(
            s["after"]["mean_de2000"].as_f64().unwrap()
                < s["before"]["mean_de2000"].as_f64().unwrap()
        );
    }
}

#[test]
fn white_goal_names_minus_green_and_apply_writes_what_it_promised() {
    let dir = tempfile::tempdir().unwrap();
    let plan = green_tube_plan("led-tube-cheap");
    let file = save(dir.path(), "tube.ron", &plan);
    let cct = evaluate(&plan)
        .unwrap()
        .light
        .cct_k
        .unwrap()
        .round()
        .to_string();
    let args = [
        "advise",
        &file,
        "--goal",
        "white",
        "--target-cct",
        &cct,
        "--target-duv",
        "0",
        "--tolerance-mired",
        "20",
    ];
    let o = lampwright(&[&args[..], &["--json"]].concat());
    assert!(o.status.success(), "{}", stderr(&o));
    let v: Value = serde_json::from_str(&stdout(&o)).unwrap();
    let top = &v[0];
    let words = top["moves"][0].as_str().unwrap();
    assert!(
        words.starts_with("add ") && words.ends_with(" minus green to Tube"),
        "{words}"
    );

    // The text form says the same first.
    let o = lampwright(&args);
    assert!(
        stdout(&o).contains(&format!("1. {words}")),
        "{}",
        stdout(&o)
    );

    let new = dir.path().join("tube-fixed.ron").display().to_string();
    let o = lampwright(&[&args[..], &["--apply", "1", "-o", &new]].concat());
    assert!(o.status.success(), "{}", stderr(&o));
    assert!(stdout(&o).contains(words), "{}", stdout(&o));
    let applied = load_plan(Path::new(&new)).unwrap();
    assert_eq!(applied.sources[0].gels.len(), 1);
    let e = evaluate(&applied).unwrap();
    for (json, ours) in [
        (&top["after"]["cct_k"], e.light.cct_k.unwrap()),
        (&top["after"]["duv"], e.light.duv.unwrap()),
        (&top["after"]["rf"], e.light.tm30_rf.unwrap()),
        (&top["after"]["mean_de2000"], e.summary.mean_de2000.unwrap()),
    ] {
        let promised = json.as_f64().unwrap();
        assert!(
            (promised - ours).abs() <= 1e-6 * ours.abs().max(1e-9),
            "{promised} vs {ours}"
        );
    }
}

#[test]
fn nothing_better_is_an_empty_list_and_a_note() {
    let dir = tempfile::tempdir().unwrap();
    let mut plan = green_tube_plan("daylight-d65");
    plan.camera.camera = CameraRef::Colorimetric;
    let file = save(dir.path(), "d65.ron", &plan);
    let o = lampwright(&["advise", &file, "--json"]);
    assert!(o.status.success(), "{}", stderr(&o));
    assert_eq!(
        serde_json::from_str::<Value>(&stdout(&o)).unwrap(),
        Value::Array(Vec::new())
    );
    assert!(
        stderr(&o).contains("nothing better found"),
        "{}",
        stderr(&o)
    );
    // Text says it too, and there is nothing to apply.
    let o = lampwright(&["advise", &file]);
    assert!(
        stdout(&o).contains("nothing better found"),
        "{}",
        stdout(&o)
    );
    let out = dir.path().join("x.ron").display().to_string();
    let o = lampwright(&["advise", &file, "--apply", "1", "-o", &out]);
    assert!(!o.status.success());
    assert!(stderr(&o).contains("no suggestion 1"), "{}", stderr(&o));
    assert!(!Path::new(&out).exists());
}

#[test]
fn bad_requests_are_refused_with_a_reason() {
    let plan = demo_file("night-market-portrait.ron");
    let o = lampwright(&["advise", &plan, "--goal", "white", "--zone", "Hallway"]);
    assert!(!o.status.success());
    assert!(
        stderr(&o).contains("no zone called 'Hallway'"),
        "{}",
        stderr(&o)
    );
    let o = lampwright(&["advise", &plan, "--goal", "white", "--target-cct", "300"]);
    assert!(!o.status.success());
    assert!(stderr(&o).contains("target CCT"), "{}", stderr(&o));
    // --apply without -o is a usage error.
    let o = lampwright(&["advise", &plan, "--apply", "1"]);
    assert!(!o.status.success());
    let o = lampwright(&["advise", "no-such-plan.ron"]);
    assert!(!o.status.success());
    assert!(stderr(&o).contains("no-such-plan.ron"), "{}", stderr(&o));
}
