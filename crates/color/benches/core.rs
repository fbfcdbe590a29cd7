//! Benchmarks of the colour-space layer: spectrum → XYZ → CIELAB, colour
//! differences, CAM02-UCS (the inner loop of TM-30) and XYZ → sRGB swatch bytes.
//!
//! The surface is an invented smooth reflectance (a warm skin-like ramp), the
//! light CIE D65 from the built-in tables, the observer CIE 1931 2°.

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_color::cam02::Cam02Ucs;
use lampwright_color::delta_e::{delta_e_cie1976, delta_e_cie1994, delta_e_ciede2000};
use lampwright_color::illuminant::StandardIlluminant;
use lampwright_color::observer::Observer;
use lampwright_color::rgb::LinearSrgb;
use lampwright_color::spaces::Lab;
use lampwright_color::tristimulus::{xyz_of_object, xyz_sums};
use lampwright_color::{Reflectance, Xyz};
use std::hint::black_box;

/// Invented reflectance: 0.2 in the blue rising smoothly to 0.6 in the red.
fn invented_reflectance() -> Reflectance {
    Reflectance::from_fn(|wl| 0.2 + 0.4 / (1.0 + (-(wl - 580.0) / 30.0).exp()))
}

fn bench_spectrum_to_lab(c: &mut Criterion) {
    let obs = Observer::cie1931_2deg();
    let Ok(d65) = StandardIlluminant::D65.spd() else {
        return;
    };
    let refl = invented_reflectance();
    let stimulus = &d65 * &refl;
    let white_sums = xyz_sums(d65.values(), obs);
    let k = 100.0 / white_sums.y;
    let white = white_sums.scaled(k);

    // The colour of a stimulus spectrum whose light is known: one pass over the
    // 471 grid values for X, Y, Z, then CIELAB.
    c.bench_function("stimulus spectrum → XYZ → Lab (471 nm samples)", |b| {
        b.iter(|| {
            let xyz = xyz_sums(black_box(stimulus.values()), obs).scaled(k);
            Lab::from_xyz(xyz, white)
        });
    });
    // The whole object-colour path: light × reflectance, white sums, XYZ, Lab.
    c.bench_function(
        "xyz_of_object + Lab (light × reflectance, white, Lab)",
        |b| {
            b.iter(|| {
                let xyz = xyz_of_object(black_box(&d65), black_box(&refl), obs, "bench")
                    .unwrap_or_default();
                Lab::from_xyz(xyz, white)
            });
        },
    );
    c.bench_function("Lab::from_xyz", |b| {
        b.iter(|| Lab::from_xyz(black_box(Xyz::new(41.2, 35.8, 18.1)), white));
    });
}

fn bench_delta_e(c: &mut Criterion) {
    // Sharma et al. (2005) pair 25.
    let a = Lab::new(60.2574, -34.0099, 36.2677);
    let b = Lab::new(60.4626, -34.1751, 39.4387);
    c.bench_function("delta_e_ciede2000", |bench| {
        bench.iter(|| delta_e_ciede2000(black_box(a), black_box(b)));
    });
    c.bench_function("delta_e_cie1994", |bench| {
        bench.iter(|| delta_e_cie1994(black_box(a), black_box(b)));
    });
    c.bench_function("delta_e_cie1976", |bench| {
        bench.iter(|| delta_e_cie1976(black_box(a), black_box(b)));
    });
}

fn bench_cam02(c: &mut Criterion) {
    let white = Xyz::new(94.81, 100.0, 107.32);
    let Ok(ucs) = Cam02Ucs::tm30(white) else {
        return;
    };
    c.bench_function("Cam02Ucs::tm30 (white-dependent set-up)", |b| {
        b.iter(|| Cam02Ucs::tm30(black_box(white)));
    });
    c.bench_function("Cam02Ucs::jab (one sample)", |b| {
        b.iter(|| ucs.jab(black_box(Xyz::new(19.01, 20.0, 21.78))));
    });
    let many: Vec<Xyz> = (0..99)
        .map(|i| {
            let t = f64::from(i) / 98.0;
            Xyz::new(10.0 + 60.0 * t, 12.0 + 50.0 * (1.0 - t), 8.0 + 70.0 * t * t)
        })
        .collect();
    c.bench_function("Cam02Ucs::jab_many (99 samples, as TM-30)", |b| {
        b.iter(|| ucs.jab_many(black_box(&many)));
    });
    // The powers inside it: 297 values (three channels of 99 samples).
    let bases: Vec<f64> = (0..297).map(|i| 0.05 + f64::from(i) * 0.37).collect();
    c.bench_function("batch_math::pow_nonnegative_in_place (297 values)", |b| {
        b.iter(|| {
            let mut v = bases.clone();
            lampwright_color::batch_math::pow_nonnegative_in_place(black_box(&mut v), 0.42);
            v
        });
    });
    // The camera's inner loop: 137 reflectances (24 subjects and the 113
    // training samples) dotted with six light-weighted curves.
    let rows: Vec<Vec<f64>> = (0..137)
        .map(|i| {
            (0..471)
                .map(|j| 0.3 + 0.2 * (f64::from(i) * 0.1 + f64::from(j) * 0.013).sin())
                .collect()
        })
        .collect();
    let refs: Vec<&[f64]> = rows.iter().map(Vec::as_slice).collect();
    let weights: Vec<Vec<f64>> = (0..6)
        .map(|k| {
            (0..471)
                .map(|j| f64::from(j * (k + 1) % 97) / 97.0)
                .collect()
        })
        .collect();
    c.bench_function("weighted_sums_6 (137 rows × 471 values)", |b| {
        b.iter(|| {
            lampwright_color::weighted_sums::weighted_sums_6(
                black_box(&refs),
                std::array::from_fn(|k| weights[k].as_slice()),
            )
        });
    });
    c.bench_function("Cam02::appearance (all correlates)", |b| {
        b.iter(|| {
            ucs.cam02()
                .appearance(black_box(Xyz::new(19.01, 20.0, 21.78)))
        });
    });
}

fn bench_rgb(c: &mut Criterion) {
    c.bench_function("XYZ → sRGB 8-bit swatch", |b| {
        b.iter(|| {
            LinearSrgb::from_xyz_unclamped(black_box(Xyz::new(0.412, 0.358, 0.181)))
                .to_rgb8_clamped()
        });
    });
}

criterion_group!(
    benches,
    bench_spectrum_to_lab,
    bench_delta_e,
    bench_cam02,
    bench_rgb
);
criterion_main!(benches);
