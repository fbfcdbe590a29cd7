//! Every demo plan evaluates cleanly, and the night-market plan shows what a
//! mixed-light set does: the sodium-lit shadow side reads warmer than the
//! LED-lit key side, and the engine says so in the trade's words.

use lampwright_plan::demo::demo_plans;
use lampwright_plan::evaluate;

#[test]
fn every_demo_plan_evaluates_without_nan() {
    for plan in demo_plans() {
        let e = evaluate(&plan).unwrap_or_else(|err| panic!("{}: {err}", plan.name));
        assert!(!e.subjects.is_empty(), "{}", plan.name);
        for z in &e.zones {
            assert!(z.light.illuminance_lux.is_finite());
            for s in &z.subjects {
                assert!(s.de2000.is_finite(), "{} / {}", plan.name, s.name);
                assert!(s.eye_lab.iter().chain(&s.camera_lab).all(|v| v.is_finite()));
            }
        }
        assert!(
            e.summary.mean_de2000.is_some_and(f64::is_finite),
            "{}",
            plan.name
        );
    }
}

#[test]
fn night_market_shadow_side_reads_warm() {
    let plan = demo_plans()
        .into_iter()
        .find(|p| p.name.contains("Night market"))
        .expect("the night-market demo exists");
    let e = evaluate(&plan).unwrap();
    let key = e.zones.iter().find(|z| z.name == "Key side").unwrap();
    let shadow = e.zones.iter().find(|z| z.name == "Shadow side").unwrap();
    let (key_mired, shadow_mired) = (key.light.mired.unwrap(), shadow.light.mired.unwrap());
    assert!(
        shadow_mired - key_mired > 20.0,
        "key {key_mired} mired, shadow {shadow_mired} mired"
    );
    assert!(
        e.warnings.iter().any(|w| w.starts_with("Shadow side is")
            && w.contains("warmer")
            && w.contains("orange")),
        "{:?}",
        e.warnings
    );
    // One white balance for the frame: the shadow side sits warm of it.
    assert!(shadow.mired_from_white_balance.unwrap() > key.mired_from_white_balance.unwrap());
}
