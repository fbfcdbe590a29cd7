//! Physical identities of the camera pipeline.
//!
//! - An ideal colorimetric camera (curves an exact linear mix of the CIE 1931
//!   CMFs) satisfies the Luther condition, so after white balance on the scene
//!   white and a correction fitted under the scene light it must reproduce the
//!   eye's adapted colour exactly, whatever the light and the fit method
//!   (Luther 1927; Vora & Trussell 1993, doi:10.1364/JOSAA.10.001499).
//!   Tolerance ΔE00 < 0.01 (rounding only).
//! - A white-preserving correction with a grey-card white balance renders any
//!   spectrally flat subject neutral: |a*|, |b*| < 0.01.
//! - White preservation holds to 1e-9 and root-polynomial corrections are
//!   exposure-invariant (Finlayson, Mackiewicz & Hurlbert 2015,
//!   doi:10.1109/TIP.2015.2405336) — property tests over random data.

use lampwright_camera::correction::{FitData, fit_color_correction};
use lampwright_camera::fit_de2000::fit_de2000;
use lampwright_camera::fit_linear::{fit_white_preserving, mat3_mul_vec};
use lampwright_camera::root_poly::{apply_root_polynomial, fit_root_polynomial};
use lampwright_camera::white_balance::WhiteBalance;
use lampwright_camera::{
    CameraPipeline, CameraSensitivities, CameraSettings, FitMethod, MatrixMode, TrainingSet,
};
use lampwright_color::Reflectance;
use lampwright_color::illuminant::{StandardIlluminant, planckian};
use proptest::prelude::*;

const ALL_METHODS: [FitMethod; 5] = [
    FitMethod::Linear,
    FitMethod::WhitePreserving,
    FitMethod::De2000 {
        preserve_white: true,
    },
    FitMethod::De2000 {
        preserve_white: false,
    },
    FitMethod::RootPolynomial,
];

fn neutral_subjects() -> Vec<Reflectance> {
    [0.03, 0.18, 0.5, 0.9, 1.0]
        .iter()
        .map(|r| Reflectance::from_fn(|_| *r))
        .collect()
}

#[test]
fn colorimetric_camera_matches_the_eye_under_every_light_and_method() {
    let camera = CameraSensitivities::colorimetric().unwrap();
    let training = TrainingSet::standard().unwrap();
    let mut subjects = training.reflectances().to_vec();
    subjects.extend(neutral_subjects());
    let mut lights: Vec<(String, lampwright_color::RelativeSpd)> = StandardIlluminant::all()
        .into_iter()
        .map(|s| (s.name(), s.spd().unwrap()))
        .collect();
    lights.push(("Planckian 2000 K".into(), planckian(2000.0).unwrap()));
    for (name, light) in &lights {
        for method in ALL_METHODS {
            let settings = CameraSettings {
                white_balance: WhiteBalance::GreyCard { subject: None },
                matrix_mode: MatrixMode::SceneProfile,
                fit_method: method,
                ..CameraSettings::default()
            };
            let c = CameraPipeline::new(&camera, &settings, light, training)
                .unwrap()
                .compare(&subjects)
                .unwrap();
            let worst = c
                .subjects
                .iter()
                .map(|s| s.delta_e_ciede2000)
                .fold(0.0, f64::max);
            assert!(worst < 0.01, "{name}, {}: max ΔE00 {worst}", method.name());
        }
    }
}

#[test]
fn colorimetric_factory_matrix_is_exact_under_d65() {
    let camera = CameraSensitivities::colorimetric().unwrap();
    let training = TrainingSet::standard().unwrap();
    for method in ALL_METHODS {
        let settings = CameraSettings {
            fit_method: method,
            ..CameraSettings::default()
        };
        let c = CameraPipeline::new(
            &camera,
            &settings,
            &StandardIlluminant::D65.spd().unwrap(),
            training,
        )
        .unwrap()
        .compare(training.reflectances())
        .unwrap();
        assert!(c.delta_e_stats.unwrap().max < 0.01, "{}", method.name());
    }
}

#[test]
fn grey_card_white_balance_makes_neutrals_neutral() {
    let training = TrainingSet::standard().unwrap();
    let mut subjects = neutral_subjects();
    subjects.push(Reflectance::from_fn(
        |wl| if wl > 600.0 { 0.8 } else { 0.1 },
    ));
    let lights = [
        StandardIlluminant::A,
        StandardIlluminant::D65,
        StandardIlluminant::F(2),
        StandardIlluminant::F(11),
        StandardIlluminant::Hp(1),
        StandardIlluminant::LedB(3),
        StandardIlluminant::LedRgb1,
    ];
    for camera in CameraSensitivities::built_in().unwrap() {
        for ill in lights {
            for mode in [
                MatrixMode::Factory,
                MatrixMode::DualIlluminant,
                MatrixMode::SceneProfile,
            ] {
                for method in [
                    FitMethod::WhitePreserving,
                    FitMethod::De2000 {
                        preserve_white: true,
                    },
                ] {
                    // The 18 % card is subject 1.
                    let settings = CameraSettings {
                        white_balance: WhiteBalance::GreyCard { subject: Some(1) },
                        matrix_mode: mode,
                        fit_method: method,
                        ..CameraSettings::default()
                    };
                    let c = CameraPipeline::new(&camera, &settings, &ill.spd().unwrap(), training)
                        .unwrap()
                        .compare(&subjects)
                        .unwrap();
                    for s in &c.subjects[..5] {
                        assert!(
                            s.camera_lab.a.abs() < 0.01 && s.camera_lab.b.abs() < 0.01,
                            "{} under {}, {mode:?}, {}: a* {} b* {}",
                            camera.name,
                            ill.name(),
                            method.name(),
                            s.camera_lab.a,
                            s.camera_lab.b
                        );
                    }
                    // The red subject is not neutral: the check can tell.
                    let red = c.subjects[5].camera_lab;
                    assert!(
                        red.a.hypot(red.b) > 10.0,
                        "{} {} {red:?}",
                        camera.name,
                        ill.name()
                    );
                }
            }
        }
    }
}

fn fit_data_strategy() -> impl Strategy<Value = FitData> {
    (
        proptest::collection::vec(proptest::array::uniform3(0.01f64..2.0), 8..40),
        proptest::array::uniform9(-0.5f64..1.5),
        proptest::array::uniform3(0.2f64..2.0),
        proptest::array::uniform3(0.5f64..1.2),
        proptest::collection::vec(proptest::array::uniform3(-0.05f64..0.05), 40),
    )
        .prop_map(|(rgb, m, white_rgb, white_xyz, noise)| {
            let m = [[m[0], m[1], m[2]], [m[3], m[4], m[5]], [m[6], m[7], m[8]]];
            let xyz = rgb
                .iter()
                .zip(&noise)
                .map(|(c, n)| {
                    let x = mat3_mul_vec(&m, *c);
                    [x[0] + n[0], x[1] + n[1], x[2] + n[2]]
                })
                .collect();
            FitData {
                rgb,
                xyz,
                white_rgb,
                white_xyz,
            }
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    #[test]
    fn white_preserving_fits_map_white_exactly(data in fit_data_strategy()) {
        // A random draw can be degenerate; then an error is the right answer.
        if let Ok(m) = fit_white_preserving(&data.rgb, &data.xyz, data.white_rgb, data.white_xyz) {
            let w = mat3_mul_vec(&m, data.white_rgb);
            for (got, want) in w.iter().zip(data.white_xyz) {
                prop_assert!((got - want).abs() < 1e-9, "{got} vs {want}");
            }
        }
    }

    #[test]
    fn de2000_with_white_kept_maps_white_exactly(data in fit_data_strategy()) {
        // Only targets with positive XYZ make sense in CIELAB; keep the test to those.
        prop_assume!(data.xyz.iter().flatten().all(|v| *v > 0.0));
        if let Ok(m) = fit_de2000(&data, true) {
            let w = mat3_mul_vec(&m, data.white_rgb);
            for (got, want) in w.iter().zip(data.white_xyz) {
                prop_assert!((got - want).abs() < 1e-9, "{got} vs {want}; matrix {m:?}");
            }
        }
    }

    #[test]
    fn root_polynomial_is_exposure_invariant(data in fit_data_strategy(), k in 1e-3f64..1e3) {
        let xyz: Vec<[f64; 3]> = data.xyz.iter().map(|v| v.map(f64::abs)).collect();
        let Ok(m) = fit_root_polynomial(&data.rgb, &xyz) else { return Ok(()) };
        // The correction commutes with exposure ...
        for c in &data.rgb {
            let once = apply_root_polynomial(&m, *c);
            let scaled = apply_root_polynomial(&m, c.map(|v| v * k));
            for j in 0..3 {
                prop_assert!((scaled[j] - k * once[j]).abs() <= 1e-9 * (1.0 + (k * once[j]).abs()));
            }
        }
        // ... and fitting on data exposed k times brighter gives the same matrix.
        let rgb_k: Vec<[f64; 3]> = data.rgb.iter().map(|c| c.map(|v| v * k)).collect();
        let xyz_k: Vec<[f64; 3]> = xyz.iter().map(|c| c.map(|v| v * k)).collect();
        let m_k = fit_root_polynomial(&rgb_k, &xyz_k).unwrap();
        for r in 0..3 {
            for c in 0..6 {
                prop_assert!((m_k[r][c] - m[r][c]).abs() <= 1e-7 * (1.0 + m[r][c].abs()), "{} vs {}", m_k[r][c], m[r][c]);
            }
        }
    }

    #[test]
    fn fits_never_panic_or_return_non_finite(
        rgb in proptest::collection::vec(proptest::array::uniform3(-1e3f64..1e3), 0..12),
        xyz in proptest::collection::vec(proptest::array::uniform3(-1e3f64..1e3), 0..12),
    ) {
        let data = FitData { rgb, xyz, white_rgb: [1.0; 3], white_xyz: [0.95, 1.0, 1.09] };
        for method in ALL_METHODS {
            if let Ok(c) = fit_color_correction(method, &data) {
                prop_assert!(c.rows().iter().flatten().all(|v| v.is_finite()));
            }
        }
    }
}
