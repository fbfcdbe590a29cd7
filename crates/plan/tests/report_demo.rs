//! Reports of the demo plans through the real engine: every format renders,
//! and the structure matches the plan (zones, subjects, sources).

use lampwright_plan::report::{ReportFormat, render_report};
use lampwright_plan::{demo_plans, evaluate};

#[test]
fn every_demo_plan_reports_in_every_format() {
    for plan in demo_plans() {
        let eval = evaluate(&plan).unwrap_or_else(|e| panic!("{}: {e}", plan.name));
        let zones = plan.zones.len().max(1);
        for format in ReportFormat::ALL {
            let out = render_report(&plan, &eval, format).unwrap();
            match format {
                ReportFormat::Json => {
                    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
                    assert_eq!(v["zones"].as_array().unwrap().len(), zones, "{}", plan.name);
                    assert_eq!(v["subjects"].as_array().unwrap().len(), plan.subjects.len());
                    assert_eq!(v["sources"].as_array().unwrap().len(), plan.sources.len());
                    assert_eq!(v["plan"]["name"], plan.name.as_str());
                }
                ReportFormat::Csv => {
                    assert_eq!(
                        out.lines().count(),
                        1 + zones * plan.subjects.len(),
                        "{}",
                        plan.name
                    );
                }
                ReportFormat::Html => {
                    assert!(out.contains(&format!("<h1>{}</h1>", plan.name)));
                    assert!(!out.contains("NaN"));
                    assert_eq!(out.matches("<svg").count(), 2 + zones);
                }
                ReportFormat::Text => {
                    assert!(out.starts_with(&format!("Lampwright report: {}", plan.name)));
                    for s in &plan.sources {
                        assert!(out.contains(&s.name), "{}", s.name);
                    }
                }
            }
        }
    }
}
