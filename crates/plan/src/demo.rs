//! The built-in demo plans: three invented scenarios that show what Lampwright
//! is for, embedded from `assets/demo/plans/*.ron`.
//!
//! - "Café interview under LED tubes" (the plan the app opens on): green-spiking
//!   tubes, a daylight LED key with 1/8 minus green, a dimmed tungsten
//!   practical and a gelled RGB panel; 24 subjects in three zones.
//! - "Night market portrait": sodium street light, a daylight LED warmed with
//!   1/4 CTO, a practical bulb; key side, shadow side and background.
//! - "Ceramics catalogue": north-window daylight and a halogen key with 1/2 CTB
//!   on glazes, product colours and neutrals.

use crate::error::Result;
use crate::files::plan_from_bytes;
use crate::model::Plan;
use std::path::Path;

/// A demo plan's file name and text.
struct DemoFile {
    file_name: &'static str,
    text: &'static str,
}

const DEMO_FILES: [DemoFile; 3] = [
    DemoFile {
        file_name: "cafe-interview.ron",
        text: include_str!("../../../assets/demo/plans/cafe-interview.ron"),
    },
    DemoFile {
        file_name: "night-market-portrait.ron",
        text: include_str!("../../../assets/demo/plans/night-market-portrait.ron"),
    },
    DemoFile {
        file_name: "ceramics-catalogue.ron",
        text: include_str!("../../../assets/demo/plans/ceramics-catalogue.ron"),
    },
];

fn parse(file: &DemoFile) -> Result<Plan> {
    plan_from_bytes(Path::new(file.file_name), file.text.as_bytes())
}

/// Every demo plan, the default one first. A demo file that fails to load
/// (a build mistake the tests catch) is left out rather than stopping the app.
#[must_use]
pub fn demo_plans() -> Vec<Plan> {
    DEMO_FILES.iter().filter_map(|f| parse(f).ok()).collect()
}

/// Every demo plan with its load result, for tests and diagnostics.
#[must_use]
pub fn demo_plans_checked() -> Vec<(&'static str, Result<Plan>)> {
    DEMO_FILES.iter().map(|f| (f.file_name, parse(f))).collect()
}

/// The plan the app opens on: "Café interview under LED tubes".
pub fn default_demo() -> Result<Plan> {
    parse(&DEMO_FILES[0])
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::files::plan_from_str;
    use crate::files::plan_to_ron;
    use crate::validate::validate;

    #[test]
    fn every_demo_plan_loads_and_validates_cleanly() {
        let all = demo_plans_checked();
        assert_eq!(all.len(), 3);
        for (name, plan) in all {
            let plan = plan.unwrap_or_else(|e| panic!("{name}: {e}"));
            let issues = validate(&plan);
            assert!(issues.is_empty(), "{name}: {issues:#?}");
            // Saving and reading back gives the identical plan.
            assert_eq!(
                plan_from_str(&plan_to_ron(&plan).unwrap()).unwrap(),
                plan,
                "{name}"
            );
        }
        assert_eq!(demo_plans().len(), 3);
    }

    #[test]
    fn the_default_demo_is_the_cafe_with_its_brief() {
        let plan = default_demo().unwrap();
        assert_eq!(plan.name, "Café interview under LED tubes");
        assert_eq!(plan.sources.len(), 4);
        assert_eq!(plan.subjects.len(), 24);
        assert!(plan.sources.iter().all(|s| s.gels.len() <= 3));
        assert!(plan.sources.iter().any(|s| s.gels.len() == 3));
        let practical = plan
            .sources
            .iter()
            .find(|s| s.name == "Table lamp")
            .unwrap();
        assert!((practical.dimmer - 0.7).abs() < 1e-12);
    }
}
