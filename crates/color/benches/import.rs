//! Benchmarks of spectral import: a 1 nm CSV lamp table (471 rows × 3 value
//! columns) from bytes to an imported table, and resampling an irregular
//! 700-point table onto the internal grid.

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_color::RelativeSpd;
use lampwright_color::import::{SpectrumKind, import_bytes};
use std::fmt::Write as _;
use std::hint::black_box;

/// Deterministic pseudo-random numbers in [0, 1) (64-bit LCG, Knuth's MMIX constants).
struct Lcg(u64);

impl Lcg {
    fn next_unit(&mut self) -> f64 {
        self.0 = self
            .0
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (self.0 >> 11) as f64 / (1_u64 << 53) as f64
    }
}

fn csv_1nm_three_columns() -> Vec<u8> {
    let mut rng = Lcg(1);
    let mut text = String::from("# benchmark table\nwavelength_nm,key (W/m2/nm),fill,back\n");
    for wl in 360..=830 {
        let _ = writeln!(
            text,
            "{wl},{:.6},{:.6},{:.6}",
            rng.next_unit(),
            rng.next_unit(),
            rng.next_unit()
        );
    }
    text.into_bytes()
}

fn irregular_700_points() -> (Vec<f64>, Vec<f64>) {
    let mut rng = Lcg(2);
    let mut wl = 350.0;
    let mut wavelengths = Vec::with_capacity(700);
    let mut values = Vec::with_capacity(700);
    for _ in 0..700 {
        wl += 0.2 + 1.0 * rng.next_unit();
        wavelengths.push(wl);
        values.push(rng.next_unit());
    }
    (wavelengths, values)
}

fn bench_import(c: &mut Criterion) {
    let csv = csv_1nm_three_columns();
    c.bench_function("import_bytes 1 nm CSV 471x3", |b| {
        b.iter(|| import_bytes("bench.csv", black_box(&csv), SpectrumKind::Lamp));
    });
    let (wavelengths, values) = irregular_700_points();
    c.bench_function("RelativeSpd::from_samples irregular 700 points", |b| {
        b.iter(|| RelativeSpd::from_samples(black_box(&wavelengths), black_box(&values)));
    });
}

criterion_group!(benches, bench_import);
criterion_main!(benches);
