//! Benchmarks of the evaluation engine on the café demo plan.

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_plan::{Plan, evaluate, load_plan};
use std::hint::black_box;
use std::path::Path;

fn cafe() -> Plan {
    let path =
        Path::new(env!("CARGO_MANIFEST_DIR")).join("../../assets/demo/plans/cafe-interview.ron");
    load_plan(&path).expect("the café demo plan loads")
}

fn bench(c: &mut Criterion) {
    let plan = cafe();
    // Warm the run-wide caches (factory matrices), as the window does on start.
    evaluate(&plan).expect("the café demo evaluates");
    c.bench_function("evaluate café demo (all zones, all metrics)", |b| {
        b.iter(|| evaluate(black_box(&plan)).expect("evaluates"));
    });
    let mut changed = plan.clone();
    c.bench_function("evaluate café demo after one level change", |b| {
        let mut k = 0u32;
        b.iter(|| {
            k = k.wrapping_add(1);
            if let Some(s) = changed.sources.first_mut() {
                s.level_lux = 400.0 + f64::from(k % 7) * 10.0;
            }
            evaluate(black_box(&changed)).expect("evaluates")
        });
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
