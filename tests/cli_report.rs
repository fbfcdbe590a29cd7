//! End-to-end tests of `lampwright check` and `lampwright report`: the real
//! binary on the demo plans, on damaged plans and on a plan whose names carry
//! markup.

use lampwright_plan::{LampRef, Plan, demo_plans, evaluate, save_plan_atomic};
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

fn hostile(name: &str) -> String {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("crates/plan/tests/data/hostile")
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

fn save(dir: &Path, name: &str, plan: &Plan) -> PathBuf {
    let path = dir.join(name);
    save_plan_atomic(&path, plan).expect("save the plan");
    path
}

#[test]
fn check_accepts_every_demo_plan() {
    for name in [
        "cafe-interview.ron",
        "night-market-portrait.ron",
        "ceramics-catalogue.ron",
    ] {
        let o = lampwright(&["check", &demo_file(name)]);
        assert!(o.status.success(), "{name}: {}", stdout(&o));
        assert!(stdout(&o).contains(": no problems ("), "{}", stdout(&o));
    }
}

#[test]
fn check_explains_unreadable_and_invalid_plans() {
    let o = lampwright(&["check", &hostile("truncated.ron")]);
    assert_eq!(o.status.code(), Some(1));
    let out = stdout(&o);
    assert!(
        out.contains("truncated.ron: line 67, column 13: Unexpected end of RON"),
        "{out}"
    );
    assert!(out.contains("the plan cannot be read"));

    let o = lampwright(&["check", &hostile("check-unknown-ids.ron")]);
    assert_eq!(o.status.code(), Some(1));
    let out = stdout(&o);
    assert!(
        out.contains("error: sources[0].lamp: source 'Key': unknown lamp 'xyz'"),
        "{out}"
    );
    assert!(
        out.contains("error: subjects[0].subject: unknown subject 'unicorn'"),
        "{out}"
    );
    assert!(out.contains("2 errors, 0 warnings"), "{out}");
}

#[test]
fn warnings_fail_check_only_when_strict() {
    let dir = tempfile::tempdir().unwrap();
    let mut plan = demo_plans().into_iter().next().unwrap();
    // A dimmer on an LED is ignored: a warning, not an error.
    let led = plan
        .sources
        .iter_mut()
        .find(|s| matches!(&s.lamp, LampRef::Library(id) if id.starts_with("led-")))
        .unwrap();
    led.dimmer = 0.5;
    let path = save(dir.path(), "dimmed-led.ron", &plan);
    let path = path.to_str().unwrap();
    let o = lampwright(&["check", path]);
    assert!(o.status.success(), "{}", stdout(&o));
    assert!(stdout(&o).contains("warning: sources["), "{}", stdout(&o));
    assert!(stdout(&o).contains("0 errors, 1 warning"), "{}", stdout(&o));
    let o = lampwright(&["check", "--strict", path]);
    assert_eq!(o.status.code(), Some(1));
}

#[test]
fn text_report_goes_to_standard_output() {
    let o = lampwright(&["report", &demo_file("night-market-portrait.ron")]);
    assert!(o.status.success(), "{}", stderr(&o));
    let out = stdout(&o);
    assert!(
        out.starts_with("Lampwright report: Night market portrait"),
        "{out}"
    );
    for needle in [
        "Street sodium",
        "Shadow side",
        "Subjects, eye versus camera",
        "Camera: ",
    ] {
        assert!(out.contains(needle), "{needle}");
    }
}

#[test]
fn json_report_lists_zones_and_matches_the_engine() {
    let path = demo_file("cafe-interview.ron");
    let o = lampwright(&["report", &path, "--format", "json"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let v: Value = serde_json::from_str(&stdout(&o)).unwrap();
    let plan = lampwright_plan::load_plan(Path::new(&path)).unwrap();
    let eval = evaluate(&plan).unwrap();
    let zones = v["zones"].as_array().unwrap();
    assert_eq!(zones.len(), 3);
    let names: Vec<&str> = zones.iter().map(|z| z["name"].as_str().unwrap()).collect();
    assert_eq!(names, vec!["Interviewee", "Back wall", "Table top"]);
    assert_eq!(v["subjects"].as_array().unwrap().len(), 24);
    // Shared names and fixed-size bins are written as plain strings and arrays.
    assert_eq!(v["subjects"][0]["name"], "Skin, light (pink undertone)");
    assert_eq!(v["subjects"][0]["group"], "skin");
    assert_eq!(
        v["light"]["tm30_bins"]["rf_hj"].as_array().unwrap().len(),
        16
    );
    assert_eq!(v["light"]["spectrum"].as_array().unwrap().len(), 471);
    // The command line and the library share one engine: same figures (to a
    // few ULP: serde_json's default float parser is not always correctly rounded).
    let same = |json: &Value, lib: Option<f64>| {
        let (a, b) = (json.as_f64().unwrap(), lib.unwrap());
        assert!((a - b).abs() <= 1e-12 * b.abs().max(1.0), "{a} vs {b}");
    };
    same(&v["light"]["cct_k"], eval.light.cct_k);
    same(
        &v["light"]["illuminance_lux"],
        Some(eval.light.illuminance_lux),
    );
    same(&v["summary"]["mean_de2000"], eval.summary.mean_de2000);
    assert_eq!(v["plan"]["name"], "Café interview under LED tubes");
}

#[test]
fn csv_report_has_a_row_per_subject_per_zone() {
    let o = lampwright(&["report", &demo_file("ceramics-catalogue.ron"), "-f", "csv"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let out = stdout(&o);
    let lines: Vec<&str> = out.lines().collect();
    assert!(lines[0].starts_with("zone,zone_index,subject_index,subject,"));
    assert_eq!(lines.len(), 1 + 12, "one implicit zone, 12 subjects");
}

#[test]
fn html_report_escapes_markup_in_every_name() {
    let dir = tempfile::tempdir().unwrap();
    let mut plan = demo_plans().into_iter().next().unwrap();
    plan.name = "<script>alert('plan')</script>".into();
    plan.notes = "</p><iframe src=x></iframe>".into();
    plan.sources[0].name = "<img src=x onerror=alert(1)>".into();
    plan.zones[1].name = "Wall <b>&</b> \"quotes\"".into();
    let path = save(dir.path(), "markup.ron", &plan);
    let out = dir.path().join("report.html");
    let o = lampwright(&[
        "report",
        path.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert!(o.status.success(), "{}", stderr(&o));
    assert!(o.stdout.is_empty(), "the report went to the file");
    let html = std::fs::read_to_string(&out).unwrap();
    assert!(
        html.starts_with("<!DOCTYPE html>"),
        "format follows the .html extension"
    );
    for raw in ["<script", "<iframe", "<img", "<b>"] {
        assert!(!html.contains(raw), "{raw} leaked");
    }
    assert!(html.contains("&lt;script&gt;alert(&#39;plan&#39;)&lt;/script&gt;"));
    assert!(html.contains("&lt;img src=x onerror=alert(1)&gt;"));
    assert!(html.contains("Wall &lt;b&gt;&amp;&lt;/b&gt; &quot;quotes&quot;"));
    for external in ["http://", "https://", "<link"] {
        assert!(!html.contains(external), "{external}");
    }
}

#[test]
fn report_refuses_what_it_cannot_do() {
    let o = lampwright(&[
        "report",
        &demo_file("cafe-interview.ron"),
        "--format",
        "pdf",
    ]);
    assert_eq!(o.status.code(), Some(2), "clap usage error");
    assert!(
        stderr(&o).contains("'pdf' is not one of text, json, csv, html"),
        "{}",
        stderr(&o)
    );

    let o = lampwright(&["report", &hostile("check-unknown-ids.ron")]);
    assert_eq!(o.status.code(), Some(1));
    assert!(stderr(&o).contains("lampwright check"), "{}", stderr(&o));

    let dir = tempfile::tempdir().unwrap();
    let missing = dir.path().join("no-such-folder").join("r.txt");
    let o = lampwright(&[
        "report",
        &demo_file("cafe-interview.ron"),
        "-o",
        missing.to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(1));
    assert!(stderr(&o).contains("r.txt"), "{}", stderr(&o));
}
