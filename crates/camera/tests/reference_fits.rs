//! Reference tests of the camera fits against `tests/fixtures/camera_fits_colour047.json`,
//! written by `scripts/gen_fixtures_camera.py` (numpy.linalg.lstsq, colour-science 0.4.7
//! CIELAB and CIEDE2000) from the same committed assets, resampled the same way.
//!
//! Tolerances (one per quantity):
//! - raw RGB and XYZ sums: 1e-9 absolute (same data, same sums; only rounding differs);
//! - matrix entries (plain LS, white-preserving LS, root-polynomial 3×6): 1e-6 absolute
//!   (when written, every entry agreed to better than 1e-10);
//! - per-sample CIEDE2000: 1e-6.

// Test helpers read the committed fixture; a malformed fixture should fail loudly.
#![allow(clippy::unwrap_used)]

use lampwright_camera::correction::{ColorCorrection, FitData, delta_e_per_sample};
use lampwright_camera::fit_linear::{fit_linear_ls, fit_white_preserving};
use lampwright_camera::root_poly::fit_root_polynomial;
use lampwright_camera::{CameraSensitivities, SceneResponse, TrainingSet};
use lampwright_color::illuminant::StandardIlluminant;
use lampwright_color::observer::Observer;
use serde_json::Value;

const FIXTURE: &str = include_str!("fixtures/camera_fits_colour047.json");

fn vec3(v: &Value) -> [f64; 3] {
    std::array::from_fn(|k| v[k].as_f64().unwrap())
}

fn rows<const N: usize>(v: &Value) -> [[f64; N]; 3] {
    std::array::from_fn(|r| std::array::from_fn(|c| v[r][c].as_f64().unwrap()))
}

#[test]
fn fits_match_numpy_fixture() {
    let doc: Value = serde_json::from_str(FIXTURE).unwrap();
    assert_eq!(doc["colour_science"], "0.4.7");
    let training = TrainingSet::standard().unwrap();
    let names: Vec<&str> = doc["samples"]
        .as_array()
        .unwrap()
        .iter()
        .map(|v| v.as_str().unwrap())
        .collect();
    assert_eq!(
        names,
        training
            .names()
            .iter()
            .map(String::as_str)
            .collect::<Vec<_>>()
    );
    let cases = doc["cases"].as_array().unwrap();
    assert_eq!(cases.len(), 10);
    for case in cases {
        let cam_name = case["camera"].as_str().unwrap();
        let light_name = case["light"].as_str().unwrap();
        let camera = CameraSensitivities::built_in_by_name(cam_name).unwrap();
        let light = StandardIlluminant::from_name(light_name)
            .unwrap()
            .spd()
            .unwrap();
        let scene = SceneResponse::new(&camera, &light, Observer::cie1931_2deg()).unwrap();
        let signals = scene.subjects(training.reflectances());
        let label = format!("{cam_name} under {light_name}");

        let close = |a: f64, b: f64, tol: f64, what: &str| {
            assert!((a - b).abs() <= tol, "{label}: {what}: {a} vs {b}");
        };
        for k in 0..3 {
            close(
                scene.white().raw_rgb[k],
                vec3(&case["white_rgb"])[k],
                1e-9,
                "white rgb",
            );
            close(
                scene.white().xyz.to_array()[k],
                vec3(&case["white_xyz"])[k],
                1e-9,
                "white xyz",
            );
            close(
                signals[0].raw_rgb[k],
                vec3(&case["first_sample_rgb"])[k],
                1e-9,
                "CES01 rgb",
            );
            close(
                signals[0].xyz.to_array()[k],
                vec3(&case["first_sample_xyz"])[k],
                1e-9,
                "CES01 xyz",
            );
        }

        let data = FitData {
            rgb: signals.iter().map(|s| s.raw_rgb).collect(),
            xyz: signals.iter().map(|s| s.xyz.to_array()).collect(),
            white_rgb: scene.white().raw_rgb,
            white_xyz: scene.white().xyz.to_array(),
        };
        let ls = fit_linear_ls(&data.rgb, &data.xyz).unwrap();
        let wp =
            fit_white_preserving(&data.rgb, &data.xyz, data.white_rgb, data.white_xyz).unwrap();
        let rp = fit_root_polynomial(&data.rgb, &data.xyz).unwrap();
        let (want_ls, want_wp, want_rp) = (
            rows::<3>(&case["linear_matrix"]),
            rows::<3>(&case["white_preserving_matrix"]),
            rows::<6>(&case["root_poly_matrix"]),
        );
        for r in 0..3 {
            for c in 0..3 {
                close(ls[r][c], want_ls[r][c], 1e-6, "LS matrix");
                close(wp[r][c], want_wp[r][c], 1e-6, "white-preserving matrix");
            }
            for c in 0..6 {
                close(rp[r][c], want_rp[r][c], 1e-6, "root-polynomial matrix");
            }
        }

        let de = delta_e_per_sample(
            &ColorCorrection::Matrix {
                xyz_from_camera_rgb: ls,
            },
            &data,
        );
        let want_de = case["linear_de2000"].as_array().unwrap();
        assert_eq!(de.len(), want_de.len());
        for (got, want) in de.iter().zip(want_de) {
            close(*got, want.as_f64().unwrap(), 1e-6, "CIEDE2000");
        }
    }
}
