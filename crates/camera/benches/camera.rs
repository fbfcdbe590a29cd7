//! Camera pipeline timings: fitting a white-preserving matrix on 120 samples
//! (signals precomputed; only the solve is timed) and comparing 100 subjects
//! raw → white balance → matrix → CIELAB → CIEDE2000 (signals precomputed), plus
//! the same comparison from spectra and the heavier fits for context.

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_camera::calibration::calibration_data;
use lampwright_camera::correction::{FitData, FitMethod, fit_color_correction};
use lampwright_camera::fit_linear::fit_white_preserving;
use lampwright_camera::white_balance::WhiteBalance;
use lampwright_camera::{
    CameraPipeline, CameraSensitivities, CameraSettings, MatrixMode, TrainingSet,
};
use lampwright_color::Reflectance;
use lampwright_color::illuminant::StandardIlluminant;
use std::hint::black_box;

/// The 113 standard training samples plus seven flat greys: 120 samples.
fn training_120() -> TrainingSet {
    let t = TrainingSet::standard().expect("standard training set");
    let mut names = t.names().to_vec();
    let mut refl = t.reflectances().to_vec();
    for (i, g) in [0.03, 0.06, 0.12, 0.2, 0.36, 0.6, 0.9].iter().enumerate() {
        names.push(format!("grey{i}"));
        refl.push(Reflectance::from_fn(|_| *g));
    }
    TrainingSet::new(names, refl).expect("120 samples")
}

fn bench_fits(c: &mut Criterion) {
    let camera = CameraSensitivities::demo_cameras().expect("demo cameras")[0].clone();
    let light = StandardIlluminant::F(11).spd().expect("F11");
    let data: FitData = calibration_data(&camera, &light, &training_120()).expect("fit data");
    assert_eq!(data.rgb.len(), 120);
    c.bench_function("fit_white_preserving_120", |b| {
        b.iter(|| {
            fit_white_preserving(
                black_box(&data.rgb),
                black_box(&data.xyz),
                data.white_rgb,
                data.white_xyz,
            )
        });
    });
    c.bench_function("fit_linear_ls_120", |b| {
        b.iter(|| fit_color_correction(FitMethod::Linear, black_box(&data)));
    });
    c.bench_function("fit_root_poly_120", |b| {
        b.iter(|| fit_color_correction(FitMethod::RootPolynomial, black_box(&data)));
    });
    let mut group = c.benchmark_group("slow");
    group.sample_size(10);
    group.bench_function("fit_de2000_white_kept_120", |b| {
        b.iter(|| {
            fit_color_correction(
                FitMethod::De2000 {
                    preserve_white: true,
                },
                black_box(&data),
            )
        });
    });
    group.finish();
}

fn bench_compare(c: &mut Criterion) {
    let camera = CameraSensitivities::demo_cameras().expect("demo cameras")[1].clone();
    let training = TrainingSet::standard().expect("training");
    let light = StandardIlluminant::A.spd().expect("A");
    let settings = CameraSettings {
        white_balance: WhiteBalance::GreyWorld,
        matrix_mode: MatrixMode::DualIlluminant,
        ..CameraSettings::default()
    };
    let pipeline = CameraPipeline::new(&camera, &settings, &light, training).expect("pipeline");
    let subjects: Vec<Reflectance> = training.reflectances()[..100].to_vec();
    let signals = pipeline
        .scene()
        .expect("set up from a light")
        .subjects(&subjects);
    let plain = CameraPipeline::new(&camera, &CameraSettings::default(), &light, training)
        .expect("pipeline");
    c.bench_function("compare_100_from_signals_default", |b| {
        b.iter(|| plain.compare_signals(black_box(&signals)));
    });
    c.bench_function("compare_100_from_signals_greyworld_dual", |b| {
        b.iter(|| pipeline.compare_signals(black_box(&signals)));
    });
    c.bench_function("compare_100_from_spectra", |b| {
        b.iter(|| pipeline.compare(black_box(&subjects)));
    });
    c.bench_function("pipeline_new_factory_cached", |b| {
        b.iter(|| CameraPipeline::new(&camera, black_box(&settings), &light, training));
    });
    let profile = CameraSettings {
        matrix_mode: MatrixMode::SceneProfile,
        ..settings
    };
    c.bench_function("pipeline_new_scene_profile", |b| {
        b.iter(|| CameraPipeline::new(&camera, black_box(&profile), &light, training));
    });
}

/// Context: the colour crate's CIELAB and CIEDE2000 on 100 colours, the floor under the comparison.
fn bench_colour_parts(c: &mut Criterion) {
    use lampwright_color::Xyz;
    use lampwright_color::delta_e::delta_e_ciede2000;
    use lampwright_color::spaces::Lab;
    let w = Xyz::new(0.95, 1.0, 1.09);
    let xs: Vec<Xyz> = (0..101)
        .map(|i| Xyz::new(0.1 + 0.005 * f64::from(i), 0.2, 0.3))
        .collect();
    c.bench_function("context_lab_100", |b| {
        b.iter(|| {
            xs[..100]
                .iter()
                .map(|x| Lab::from_xyz(*x, w).l)
                .sum::<f64>()
        });
    });
    let labs: Vec<Lab> = xs.iter().map(|x| Lab::from_xyz(*x, w)).collect();
    c.bench_function("context_de2000_100", |b| {
        b.iter(|| {
            labs.windows(2)
                .map(|p| delta_e_ciede2000(p[0], p[1]))
                .sum::<f64>()
        });
    });
    let pairs: Vec<(Lab, Lab)> = labs.windows(2).map(|p| (p[0], p[1])).collect();
    c.bench_function("context_de2000_many_100", |b| {
        b.iter(|| lampwright_color::delta_e::delta_e_ciede2000_many(black_box(&pairs)));
    });
    c.bench_function("context_lab_many_100", |b| {
        b.iter(|| Lab::many_from_xyz(black_box(&xs[..100]), w));
    });
}

criterion_group!(benches, bench_fits, bench_compare, bench_colour_parts);
criterion_main!(benches);
