//! The JSON report: the whole evaluation, numbers at full precision, with the
//! plan's name and notes, for scripts.
//!
//! Top-level keys: `generator`, `plan` (`name`, `notes`, `format_version`),
//! `light`, `sources`, `zones` (every zone with its light figures and
//! subjects), `subjects` (the main zone's), `summary`, `metamers`, `camera`,
//! `warnings`. Spectra are 471 values, 360–830 nm at 1 nm.

use crate::error::{PlanError, Result};
use crate::evaluation::Evaluation;
use crate::model::Plan;
use serde::Serialize;

#[derive(Serialize)]
struct PlanInfo<'a> {
    name: &'a str,
    notes: &'a str,
    format_version: u32,
}

#[derive(Serialize)]
struct JsonReport<'a> {
    generator: String,
    plan: PlanInfo<'a>,
    #[serde(flatten)]
    evaluation: &'a Evaluation,
}

/// The JSON report (pretty-printed, UTF-8).
pub fn report_json(plan: &Plan, eval: &Evaluation) -> Result<String> {
    let report = JsonReport {
        generator: format!("Lampwright {}", env!("CARGO_PKG_VERSION")),
        plan: PlanInfo {
            name: &plan.name,
            notes: &plan.notes,
            format_version: plan.format_version,
        },
        evaluation: eval,
    };
    let mut text =
        serde_json::to_string_pretty(&report).map_err(|e| PlanError::Serialize(e.to_string()))?;
    text.push('\n');
    Ok(text)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::sample;

    #[test]
    fn json_report_has_zones_and_full_precision() {
        let text = report_json(&sample::plan(), &sample::evaluation()).unwrap();
        let v: serde_json::Value = serde_json::from_str(&text).unwrap();
        assert_eq!(v["plan"]["name"], "Test <b>plan</b> & \"friends\"");
        let zones = v["zones"].as_array().unwrap();
        assert_eq!(zones.len(), 2);
        assert_eq!(zones[1]["name"], "Shadow <side>");
        assert_eq!(zones[1]["light"]["cct_k"], 2010.0);
        assert_eq!(zones[0]["subjects"].as_array().unwrap().len(), 2);
        assert_eq!(v["light"]["spectrum"].as_array().unwrap().len(), 471);
        assert_eq!(v["summary"]["mean_de2000"], 5.115);
        assert_eq!(v["subjects"][1]["de2000"], 7.89);
        assert!(v["generator"].as_str().unwrap().starts_with("Lampwright "));
    }
}
