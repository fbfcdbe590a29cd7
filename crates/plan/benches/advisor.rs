//! Advisor benchmarks: the full answer (search plus final evaluations) for
//! plans of two and four sources with the whole gel library at 1/8 steps and
//! levels in 1/3-stop steps (kit: every library gel, two layers, 2 stops).

use criterion::{Criterion, criterion_group, criterion_main};
use lampwright_plan::advisor::{
    AdvisorOptions, FidelityAggregate, Goal, QualityGoal, WhiteGoal, WhiteTarget, advise,
};
use lampwright_plan::{
    GelLayer, GelRef, Kit, LampRef, Plan, Source, SourceRole, SubjectEntry, SubjectRef,
};
use std::hint::black_box;

const SUBJECTS: [&str; 12] = [
    "skin-light-pink",
    "skin-medium-olive",
    "skin-deep-warm",
    "skin-tan",
    "grey-card-18",
    "white-card",
    "denim",
    "red-wool",
    "foliage",
    "lemon",
    "khaki",
    "product-purple",
];

fn source(
    id: u32,
    name: &str,
    role: SourceRole,
    lamp: &str,
    lux: f64,
    gels: Vec<GelLayer>,
) -> Source {
    Source {
        id,
        name: name.into(),
        role,
        lamp: LampRef::Library(lamp.into()),
        level_lux: lux,
        gels,
        ..Source::default()
    }
}

fn bench_plan(sources: usize) -> Plan {
    let mut all = vec![
        source(
            1,
            "Key",
            SourceRole::Key,
            "led-5600-budget",
            1000.0,
            Vec::new(),
        ),
        source(
            2,
            "Fill",
            SourceRole::Fill,
            "tungsten-3200",
            400.0,
            vec![GelLayer {
                gel: GelRef::Library("ctb-full".into()),
                strength: 0.5,
            }],
        ),
        source(
            3,
            "Back",
            SourceRole::Back,
            "led-tube-cheap",
            300.0,
            Vec::new(),
        ),
        source(
            4,
            "Window",
            SourceRole::Ambient,
            "daylight-d65",
            200.0,
            Vec::new(),
        ),
    ];
    all.truncate(sources);
    Plan {
        name: format!("Advisor benchmark, {sources} sources"),
        sources: all,
        subjects: SUBJECTS
            .iter()
            .map(|id| SubjectEntry {
                subject: SubjectRef::Library((*id).into()),
                included: true,
                weight: if id.starts_with("skin") { 2.0 } else { 1.0 },
            })
            .collect(),
        kit: Kit {
            gels: Vec::new(),
            max_stack: 2,
            max_stops_lost: 2.0,
        },
        ..Plan::default()
    }
}

fn goals() -> [(&'static str, Goal); 3] {
    [
        ("fidelity", Goal::Fidelity(FidelityAggregate::WeightedMean)),
        (
            "white",
            Goal::White(WhiteGoal {
                zone: None,
                target: WhiteTarget::Chromaticity {
                    cct_k: 4300.0,
                    duv: 0.0,
                },
                tolerance_mired: 5.0,
                tolerance_duv: 0.001,
            }),
        ),
        ("quality", Goal::Quality(QualityGoal::default())),
    ]
}

fn advisor(c: &mut Criterion) {
    let options = AdvisorOptions::default();
    for n in [2, 4] {
        let plan = bench_plan(n);
        let mut group = c.benchmark_group(format!("advise_{n}_sources"));
        group.sample_size(10);
        for (name, goal) in goals() {
            group.bench_function(name, |b| {
                b.iter(|| advise(black_box(&plan), &goal, &options));
            });
        }
        group.finish();
    }
}

criterion_group!(benches, advisor);
criterion_main!(benches);
