//! Benchmarks of the light-source metrics: the full lamp report (XYZ, CCT/Duv,
//! CRI, TM-30 with bins, SSI, LER) per spectrum, and CCT/Duv alone.
//!
//! The spectra are the CIE tables of the metric fixtures (1 nm, 360–830 nm), the
//! same data `scripts/bench_vs_colour_science.py` feeds the reference package:
//! A (Planckian reference), F2 and LED-B3 (TM-30 blend of Planckian and
//! daylight), D65 (daylight reference).

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_color::cct::{
    CctMethod, cct_duv, cct_duv_of_spd, cct_ohno2014, cct_robertson1968, uv1960_of_spd,
};
use lampwright_color::cri::cri_cie133;
use lampwright_color::illuminant::{daylight, planckian};
use lampwright_color::lamp_report::lamp_report;
use lampwright_color::ssi::ssi_default;
use lampwright_color::tm30::tm30;
use lampwright_color::{Coverage, GRID_LEN, RelativeSpd};
use std::hint::black_box;

/// Names of the benchmarked spectra (columns of the fixture CSV).
const NAMES: [&str; 4] = ["A", "F2", "LED-B3", "D65"];

fn spectra() -> Vec<(String, RelativeSpd)> {
    let text = include_str!("../tests/fixtures/metrics_spectra_colour047.csv");
    let mut lines = text.lines().filter(|l| !l.starts_with('#'));
    let header: Vec<&str> = lines
        .next()
        .map(|l| l.split(',').collect())
        .unwrap_or_default();
    let rows: Vec<Vec<f64>> = lines
        .map(|l| {
            l.split(',')
                .map(|c| c.parse().unwrap_or(f64::NAN))
                .collect()
        })
        .collect();
    NAMES
        .iter()
        .filter_map(|name| {
            let col = header.iter().position(|h| h == name)?;
            let mut grid = [0.0; GRID_LEN];
            for (g, row) in grid.iter_mut().zip(&rows) {
                *g = row[col];
            }
            Some((
                (*name).to_string(),
                RelativeSpd::from_grid(grid, Coverage::FULL).ok()?,
            ))
        })
        .collect()
}

fn bench_metrics(c: &mut Criterion) {
    let spectra = spectra();
    assert_eq!(spectra.len(), NAMES.len(), "fixture spectra missing");
    // Warm the lazily built tables outside the timing.
    for (_, s) in &spectra {
        let _ = lamp_report(s);
    }
    let mut g = c.benchmark_group("lamp_report");
    for (name, s) in &spectra {
        g.bench_function(name.as_str(), |b| b.iter(|| lamp_report(black_box(s))));
    }
    g.finish();

    let mut g = c.benchmark_group("cct_duv_of_spd");
    for (name, s) in &spectra {
        g.bench_function(name.as_str(), |b| {
            b.iter(|| cct_duv_of_spd(black_box(s), CctMethod::Ohno2014));
        });
    }
    g.finish();

    // The parts of a report, on F2 (TM-30 blend: Planckian and daylight).
    if let Some((_, f2)) = spectra.iter().find(|(n, _)| n == "F2") {
        let mut g = c.benchmark_group("parts_f2");
        g.bench_function("cri_cie133", |b| b.iter(|| cri_cie133(black_box(f2))));
        g.bench_function("tm30", |b| b.iter(|| tm30(black_box(f2))));
        g.bench_function("ssi_default", |b| b.iter(|| ssi_default(black_box(f2))));
        g.bench_function("planckian_4225k", |b| {
            b.iter(|| planckian(black_box(4225.0)));
        });
        g.bench_function("daylight_4225k", |b| b.iter(|| daylight(black_box(4225.0))));
        g.finish();
    }

    let uv = spectra
        .iter()
        .find(|(n, _)| n == "F2")
        .and_then(|(_, s)| uv1960_of_spd(s, "F2").ok());
    if let Some(uv) = uv {
        let mut g = c.benchmark_group("cct_from_uv");
        g.bench_function("ohno2014", |b| b.iter(|| cct_ohno2014(black_box(uv))));
        g.bench_function("robertson1968", |b| {
            b.iter(|| cct_robertson1968(black_box(uv)));
        });
        g.bench_function("dispatch_ohno2014", |b| {
            b.iter(|| cct_duv(black_box(uv), CctMethod::Ohno2014));
        });
        g.finish();
    }
}

criterion_group!(benches, bench_metrics);
criterion_main!(benches);
