//! End-to-end tests of `lampwright camera-fit` with the real binary.
//!
//! The reference numbers come from `crates/camera/tests/fixtures/camera_fits_colour047.json`
//! (`cli_case`), written by `scripts/gen_fixtures_camera.py` with numpy.linalg.lstsq and
//! colour-science 0.4.7 from the same committed assets: demo camera A, CIE illuminant A
//! from its formula at 1 nm, TCS01–TCS14 (CIE 13.3) at 5 nm. Tolerances: matrix entries
//! 1e-6, per-sample CIEDE2000 1e-6, white constraint 1e-9.

// Test helpers parse the binary's JSON; anything unexpected should fail loudly.
#![allow(clippy::unwrap_used)]

use serde_json::Value;
use std::fmt::Write as _;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

const FIXTURE: &str = include_str!("../crates/camera/tests/fixtures/camera_fits_colour047.json");

fn asset(rel: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join(rel)
}

/// Demo camera A as a three-column table, and illuminant A at 1 nm, in `dir`.
fn write_inputs(dir: &Path) -> (PathBuf, PathBuf) {
    let text = std::fs::read_to_string(asset("assets/demo/cameras.csv")).unwrap();
    let mut camera = String::from("# demo camera A, three columns\nwavelength_nm,r,g,b\n");
    for line in text.lines().filter(|l| !l.starts_with('#')).skip(1) {
        let cells: Vec<&str> = line.split(',').collect();
        camera.push_str(&cells[..4].join(","));
        camera.push('\n');
    }
    let cam_path = dir.join("camera_a.csv");
    std::fs::write(&cam_path, camera).unwrap();
    let a = lampwright_color::illuminant::cie_a();
    let mut light = String::from("wavelength_nm,A\n");
    for (i, v) in a.values().iter().enumerate() {
        writeln!(light, "{},{v}", 360 + i).unwrap();
    }
    let light_path = dir.join("illuminant_a.csv");
    std::fs::write(&light_path, light).unwrap();
    (cam_path, light_path)
}

fn run(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lampwright"))
        .arg("camera-fit")
        .args(args)
        .output()
        .unwrap()
}

fn run_json(cam: &Path, light: &Path, method: &str) -> Value {
    let samples = asset("assets/standard/cie133_tcs.csv");
    let out = run(&[
        "--camera",
        cam.to_str().unwrap(),
        "--illuminant",
        light.to_str().unwrap(),
        "--samples",
        samples.to_str().unwrap(),
        "--method",
        method,
        "--json",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).unwrap()
}

fn matrix(v: &Value) -> Vec<Vec<f64>> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|r| {
            r.as_array()
                .unwrap()
                .iter()
                .map(|x| x.as_f64().unwrap())
                .collect()
        })
        .collect()
}

fn floats(v: &Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

fn assert_close(got: &[Vec<f64>], want: &[Vec<f64>], tol: f64, what: &str) {
    assert_eq!(got.len(), want.len(), "{what}: rows");
    for (gr, wr) in got.iter().zip(want) {
        assert_eq!(gr.len(), wr.len(), "{what}: columns");
        for (g, w) in gr.iter().zip(wr) {
            assert!((g - w).abs() <= tol, "{what}: {g} vs {w}");
        }
    }
}

fn white_is_kept(doc: &Value) {
    let m = matrix(&doc["matrix"]);
    let (w_rgb, w_xyz) = (floats(&doc["white_rgb"]), floats(&doc["white_xyz"]));
    for (row, want) in m.iter().zip(&w_xyz) {
        let got: f64 = row.iter().zip(&w_rgb).map(|(a, b)| a * b).sum();
        assert!((got - want).abs() < 1e-9, "{got} vs {want}");
    }
}

#[test]
fn linear_and_white_preserving_match_numpy() {
    let fixture: Value = serde_json::from_str(FIXTURE).unwrap();
    let case = &fixture["cli_case"];
    let dir = tempfile::tempdir().unwrap();
    let (cam, light) = write_inputs(dir.path());

    let doc = run_json(&cam, &light, "linear");
    assert_eq!(doc["method"], "linear");
    assert_eq!(doc["samples"], case["samples"]);
    assert_close(
        &matrix(&doc["matrix"]),
        &matrix(&case["linear_matrix"]),
        1e-6,
        "linear matrix",
    );
    assert_close(
        &[floats(&doc["white_rgb"])],
        &[floats(&case["white_rgb"])],
        1e-9,
        "white rgb",
    );
    let de = floats(&doc["de2000"]);
    assert_close(
        std::slice::from_ref(&de),
        &[floats(&case["linear_de2000"])],
        1e-6,
        "CIEDE2000",
    );
    let mean = de.iter().sum::<f64>() / de.len() as f64;
    let max = de.iter().copied().fold(f64::MIN, f64::max);
    assert!((doc["de2000_mean"].as_f64().unwrap() - mean).abs() < 1e-12);
    assert!((doc["de2000_max"].as_f64().unwrap() - max).abs() < 1e-12);

    let wp = run_json(&cam, &light, "white-preserving");
    assert_close(
        &matrix(&wp["matrix"]),
        &matrix(&case["white_preserving_matrix"]),
        1e-6,
        "white-preserving",
    );
    white_is_kept(&wp);
}

#[test]
fn root_poly_prints_a_3x6_matrix() {
    let fixture: Value = serde_json::from_str(FIXTURE).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let (cam, light) = write_inputs(dir.path());
    let doc = run_json(&cam, &light, "root-poly");
    assert_eq!(doc["terms"].as_array().unwrap().len(), 6);
    assert_close(
        &matrix(&doc["matrix"]),
        &matrix(&fixture["cli_case"]["root_poly_matrix"]),
        1e-6,
        "root-poly",
    );

    let samples = asset("assets/standard/cie133_tcs.csv");
    let out = run(&[
        "--camera",
        cam.to_str().unwrap(),
        "--illuminant",
        light.to_str().unwrap(),
        "--samples",
        samples.to_str().unwrap(),
        "--method",
        "root-poly",
    ]);
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(text.contains("3×6 root-polynomial matrix"), "{text}");
    assert!(text.contains("TCS14"));
}

#[test]
fn de2000_keeps_white_and_lowers_its_objective() {
    let dir = tempfile::tempdir().unwrap();
    let (cam, light) = write_inputs(dir.path());
    let start = run_json(&cam, &light, "white-preserving");
    let refined = run_json(&cam, &light, "de2000");
    white_is_kept(&refined);
    let sum_sq = |d: &Value| floats(&d["de2000"]).iter().map(|v| v * v).sum::<f64>();
    assert!(
        sum_sq(&refined) <= sum_sq(&start),
        "{} vs {}",
        sum_sq(&refined),
        sum_sq(&start)
    );
}

#[test]
fn text_report_and_built_in_names() {
    let samples = asset("assets/standard/cie133_tcs.csv");
    let out = run(&[
        "--camera",
        "Demo camera C — blue leak",
        "--illuminant",
        "F2",
        "--samples",
        samples.to_str().unwrap(),
        "--method",
        "linear",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(
        text.contains("3×3 matrix, rows map camera RGB to X, Y, Z"),
        "{text}"
    );
    assert!(text.contains("Illuminant: F2"));
    for i in 1..=14 {
        assert!(text.contains(&format!("TCS{i:02}")));
    }
}

#[test]
fn bad_input_is_one_line_and_exit_1() {
    let dir = tempfile::tempdir().unwrap();
    let (cam, light) = write_inputs(dir.path());
    let samples = asset("assets/standard/cie133_tcs.csv");
    let (cam, light, samples) = (
        cam.to_str().unwrap(),
        light.to_str().unwrap(),
        samples.to_str().unwrap(),
    );

    let out = run(&[
        "--camera",
        cam,
        "--illuminant",
        light,
        "--samples",
        samples,
        "--method",
        "cubic",
    ]);
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("unknown fit method 'cubic'"));

    let out = run(&[
        "--camera",
        cam,
        "--illuminant",
        light,
        "--samples",
        "missing.csv",
        "--method",
        "linear",
    ]);
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("missing.csv"));

    let two = dir.path().join("two.csv");
    std::fs::write(
        &two,
        "wavelength_nm,r,g\n380,0.1,0.2\n500,0.3,0.9\n780,0.1,0.1\n",
    )
    .unwrap();
    let out = run(&[
        "--camera",
        two.to_str().unwrap(),
        "--illuminant",
        light,
        "--samples",
        samples,
        "--method",
        "linear",
    ]);
    assert_eq!(out.status.code(), Some(1));
    assert!(out.stdout.is_empty());
    assert_eq!(
        String::from_utf8_lossy(&out.stderr).lines().count(),
        1,
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );

    // Two samples cannot determine a 3×3 matrix.
    let few = dir.path().join("few.csv");
    std::fs::write(
        &few,
        "wavelength_nm,s1,s2\n380,0.1,0.2\n500,0.3,0.9\n780,0.1,0.1\n",
    )
    .unwrap();
    let out = run(&[
        "--camera",
        cam,
        "--illuminant",
        light,
        "--samples",
        few.to_str().unwrap(),
        "--method",
        "linear",
    ]);
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("at least 3 samples"));
}
