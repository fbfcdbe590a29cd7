//! Benchmarks of plan files, validation and reports on the café demo plan.

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_plan::files::{plan_from_str, plan_to_ron};
use lampwright_plan::report::{ReportFormat, render_report};
use lampwright_plan::{default_demo, evaluate, save_plan_atomic, validate};
use std::hint::black_box;

fn bench(c: &mut Criterion) {
    let plan = default_demo().expect("the café demo loads");
    let text = plan_to_ron(&plan).expect("serialises");
    c.bench_function("read café plan from RON text", |b| {
        b.iter(|| plan_from_str(black_box(&text)).expect("parses"));
    });
    c.bench_function("write café plan as RON text", |b| {
        b.iter(|| plan_to_ron(black_box(&plan)).expect("serialises"));
    });
    let dir = tempfile::tempdir().expect("temporary folder");
    let path = dir.path().join("cafe.ron");
    c.bench_function(
        "save café plan atomically (write, fsync, rename, fsync folder)",
        |b| {
            b.iter(|| save_plan_atomic(black_box(&path), black_box(&plan)).expect("saves"));
        },
    );
    c.bench_function("validate café plan", |b| {
        b.iter(|| validate(black_box(&plan)));
    });
    let eval = evaluate(&plan).expect("evaluates");
    for format in ReportFormat::ALL {
        c.bench_function(&format!("render café report as {format}"), |b| {
            b.iter(|| render_report(black_box(&plan), black_box(&eval), format).expect("renders"));
        });
    }
}

criterion_group!(benches, bench);
criterion_main!(benches);
