//! Frame cost of the real window, headless (`egui_kittest`, no GPU): an idle
//! frame, and a frame during a level-slider drag (one command, one plan
//! evaluation, one redraw).

use criterion::{Criterion, criterion_group, criterion_main};
use egui_kittest::Harness;
use lampwright::ui::command::{Command, SourceEdit};
use lampwright::ui::{App, StartOptions};
use std::hint::black_box;
use std::time::Instant;

fn harness() -> Harness<'static, App> {
    let mut harness = Harness::builder()
        .with_size(egui::vec2(1440.0, 900.0))
        .build_eframe(|cc| App::new(cc, StartOptions::headless(), Instant::now()));
    harness.run();
    harness
}

fn frames(c: &mut Criterion) {
    let mut group = c.benchmark_group("window");
    group.sample_size(30);

    let mut idle = harness();
    group.bench_function("idle frame (demo plan)", |b| {
        b.iter(|| {
            idle.step();
            black_box(idle.output());
        });
    });

    let mut dragging = harness();
    let id = dragging.state().plan().sources[0].id;
    let base = dragging.state().plan().sources[0].level_lux;
    let mut i = 0u32;
    group.bench_function("slider-drag frame: apply + evaluate + draw", |b| {
        b.iter(|| {
            i = i.wrapping_add(1);
            let lux = base * (1.0 + 0.01 * f64::from(i % 50));
            dragging
                .state_mut()
                .push_command(Command::Source(id, SourceEdit::LevelLux(lux)));
            dragging.step();
            black_box(dragging.state().evaluation());
        });
    });

    let plan = dragging.state().plan().clone();
    group.bench_function("plan evaluation alone", |b| {
        b.iter(|| black_box(lampwright_plan::evaluate(black_box(&plan))));
    });
    group.finish();
}

criterion_group!(benches, frames);
criterion_main!(benches);
