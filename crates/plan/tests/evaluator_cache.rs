//! The incremental evaluator returns exactly what a fresh evaluation returns,
//! whatever sequence of edits it has seen (its caches only ever return what
//! the same computation gave before).

use lampwright_plan::engine::Evaluator;
use lampwright_plan::{
    CustomLibrary, GelLayer, GelRef, Plan, WhiteBalanceSetting, demo_plans, evaluate,
};

fn same(cached: &mut Evaluator, plan: &Plan, what: &str) {
    let fresh = evaluate(plan);
    let again = cached.evaluate(plan);
    match (fresh, again) {
        (Ok(a), Ok(b)) => assert_eq!(a, b, "{what}"),
        (Err(a), Err(b)) => assert_eq!(a.to_string(), b.to_string(), "{what}"),
        (a, b) => panic!("{what}: fresh {a:?} vs cached {b:?}"),
    }
}

#[test]
fn cached_evaluations_equal_fresh_ones_through_a_session_of_edits() {
    for demo in demo_plans() {
        let mut ev = Evaluator::new();
        let mut plan = demo.clone();
        same(&mut ev, &plan, "first");
        // Level drags on every source, back and forth (repeats hit the caches).
        for i in 0..plan.sources.len() {
            let base = plan.sources[i].level_lux;
            for k in [0.5, 2.0, 1.0, 0.0, 1.0] {
                plan.sources[i].level_lux = base * k;
                same(&mut ev, &plan, &format!("{} level {i} × {k}", demo.name));
            }
        }
        // A bad level is refused the same way, cached or not.
        plan.sources[0].level_lux = -1.0;
        same(&mut ev, &plan, "negative level");
        plan.sources[0].level_lux = f64::NAN;
        same(&mut ev, &plan, "NaN level");
        plan = demo.clone();
        // Gels, dimmer, on/off, solo, camera and viewing changes.
        plan.sources[0].gels.push(GelLayer {
            gel: GelRef::Library("cto-full".into()),
            strength: 0.5,
        });
        same(&mut ev, &plan, "gel added");
        plan.sources[0].gels[0].strength = 0.25;
        same(&mut ev, &plan, "gel strength");
        plan.sources[0].dimmer = 0.6;
        same(&mut ev, &plan, "dimmer");
        plan.sources[0].enabled = !plan.sources[0].enabled;
        same(&mut ev, &plan, "toggled");
        plan.sources[0].solo = true;
        same(&mut ev, &plan, "solo");
        plan.camera.white_balance = WhiteBalanceSetting::AutoGreyWorld;
        same(&mut ev, &plan, "grey world");
        plan.camera.white_balance = WhiteBalanceSetting::Kelvin(4300.0);
        same(&mut ev, &plan, "kelvin");
        plan.viewing.adaptation = lampwright_plan::Adaptation::AsLit;
        same(&mut ev, &plan, "as lit");
        if let Some(z) = plan.zones.first_mut() {
            z.name = "Renamed".into();
        }
        same(&mut ev, &plan, "zone renamed");
        plan.subjects.reverse();
        same(&mut ev, &plan, "subjects reordered");
        // Back to the demo as it was: all from cache, still identical.
        same(&mut ev, &demo, "back to the start");
        // A change to the embedded library clears every cache.
        let mut other = demo.clone();
        other.custom = CustomLibrary::default();
        other.custom.lamps.clear();
        same(&mut ev, &other, "library");
    }
}

#[test]
fn a_repeated_evaluation_is_served_from_the_caches() {
    let plan = lampwright_plan::default_demo().unwrap();
    let mut ev = Evaluator::new();
    ev.evaluate(&plan).unwrap();
    let (_, misses) = ev.hits_and_misses();
    ev.evaluate(&plan).unwrap();
    let (hits, misses_after) = ev.hits_and_misses();
    assert_eq!(misses, misses_after, "nothing new to compute");
    assert!(hits > 0);
}
