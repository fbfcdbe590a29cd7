//! Benchmarks of the evaluation engine on the café demo plan.

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_plan::engine::Evaluator;
use lampwright_plan::{MatrixMode, Plan, SourceRole, WhiteBalanceSetting, evaluate, load_plan};
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
    // The window's way: one incremental evaluator for the session.
    let mut engine = Evaluator::new();
    engine.evaluate(&plan).expect("evaluates");
    let mut changed = plan.clone();
    let key = changed
        .sources
        .iter()
        .position(|s| s.role == SourceRole::Key)
        .unwrap_or(0);
    level_sweep(
        c,
        "evaluator: café demo after one key level change",
        &mut engine,
        &mut changed,
        key,
    );
    let background = changed
        .sources
        .iter()
        .position(|s| s.role == SourceRole::Background)
        .unwrap_or(0);
    level_sweep(
        c,
        "evaluator: café demo after one background level change",
        &mut engine,
        &mut changed,
        background,
    );
    // The same with a scene profile: the camera's matrix is fitted under the
    // main zone's light, so a key level change refits it.
    let mut profiled = cafe();
    profiled.camera.matrix = MatrixMode::SceneProfile;
    fresh_and_after_level_change(
        c,
        "evaluate café demo, scene profile",
        "evaluator: café demo, scene profile, after one key level change",
        &mut profiled,
        key,
    );
    // The same plan as one zone: every enabled source at its own level on
    // one set of subjects (its sources, gels, subjects and camera as one mix).
    let mut single = cafe();
    single.zones.clear();
    single.camera.matrix = MatrixMode::SceneProfile;
    fresh_and_after_level_change(
        c,
        "evaluate café one zone, scene profile",
        "evaluator: café one zone, scene profile, key change",
        &mut single,
        key,
    );
    single.camera.matrix = MatrixMode::Factory;
    let mut engine_single = Evaluator::new();
    engine_single.evaluate(&single).expect("evaluates");
    level_sweep(
        c,
        "evaluator: café one zone, factory, key change",
        &mut engine_single,
        &mut single,
        key,
    );
    c.bench_function("evaluator: café demo after a white-balance change", |b| {
        let mut k = 0u32;
        b.iter(|| {
            k = k.wrapping_add(1);
            changed.camera.white_balance =
                WhiteBalanceSetting::Kelvin(3000.0 + f64::from(k % 64) * 50.0);
            engine.evaluate(black_box(&changed)).expect("evaluates")
        });
    });
}

/// Time a fresh `evaluate` of `plan` (as `fresh`), then a new evaluator
/// re-evaluating it after each change of source `index`'s level (as `sweep`).
fn fresh_and_after_level_change(
    c: &mut Criterion,
    fresh: &str,
    sweep: &str,
    plan: &mut Plan,
    index: usize,
) {
    evaluate(plan).expect("the plan evaluates");
    c.bench_function(fresh, |b| {
        b.iter(|| evaluate(black_box(&*plan)).expect("evaluates"));
    });
    let mut engine = Evaluator::new();
    engine.evaluate(plan).expect("evaluates");
    level_sweep(c, sweep, &mut engine, plan, index);
}

/// Time `engine` re-evaluating `plan` after each change of source `index`'s
/// level (64 levels in turn, so no zone is served whole from a cache).
fn level_sweep(
    c: &mut Criterion,
    name: &str,
    engine: &mut Evaluator,
    plan: &mut Plan,
    index: usize,
) {
    let base = plan.sources[index].level_lux;
    c.bench_function(name, |b| {
        let mut k = 0u32;
        b.iter(|| {
            k = k.wrapping_add(1);
            plan.sources[index].level_lux = base * (1.0 + f64::from(k % 64) / 64.0);
            engine.evaluate(black_box(&*plan)).expect("evaluates")
        });
    });
    plan.sources[index].level_lux = base;
}

criterion_group!(benches, bench);
criterion_main!(benches);
