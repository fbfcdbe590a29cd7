//! The CSV report: one row per subject per zone, for spreadsheets.
//!
//! Columns: `zone, zone_index, subject_index, subject, group, included,
//! de2000, eye_L, eye_a, eye_b, camera_L, camera_a, camera_b, eye_srgb,
//! camera_srgb, eye_in_gamut, camera_in_gamut, zone_lux, zone_cct_k,
//! zone_duv`. Fields are quoted as RFC 4180 requires. A name that a
//! spreadsheet would run as a formula (starting with `=`, `+`, `-`, `@`, tab or
//! carriage return) gets a leading apostrophe.
//!
//! # References
//! - RFC 4180 (2005), *Common Format and MIME Type for CSV Files*.
//! - OWASP, *CSV Injection* (the formula prefixes).

use crate::evaluation::{Evaluation, SubjectResult, ZoneEvaluation};
use std::fmt::Write;

const HEADER: &str = "zone,zone_index,subject_index,subject,group,included,de2000,eye_L,eye_a,eye_b,camera_L,camera_a,camera_b,eye_srgb,camera_srgb,eye_in_gamut,camera_in_gamut,zone_lux,zone_cct_k,zone_duv";

/// A text cell: formula-safe and quoted when needed.
fn text_cell(text: &str) -> String {
    let safe = if text.starts_with(['=', '+', '-', '@', '\t', '\r']) {
        format!("'{text}")
    } else {
        text.to_string()
    };
    if safe.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", safe.replace('"', "\"\""))
    } else {
        safe
    }
}

fn hex(rgb: [u8; 3]) -> String {
    format!("#{:02x}{:02x}{:02x}", rgb[0], rgb[1], rgb[2])
}

fn opt(v: Option<f64>) -> String {
    v.map_or_else(String::new, |x| x.to_string())
}

fn row(out: &mut String, zone: &ZoneEvaluation, zone_index: usize, s: &SubjectResult) {
    let _ = writeln!(
        out,
        "{},{zone_index},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{}",
        text_cell(&zone.name),
        s.index,
        text_cell(&s.name),
        text_cell(&s.group),
        s.included,
        s.de2000,
        s.eye_lab[0],
        s.eye_lab[1],
        s.eye_lab[2],
        s.camera_lab[0],
        s.camera_lab[1],
        s.camera_lab[2],
        hex(s.eye_rgb8),
        hex(s.camera_rgb8),
        s.eye_in_gamut,
        s.camera_in_gamut,
        zone.light.illuminance_lux,
        opt(zone.light.cct_k),
        opt(zone.light.duv),
    );
}

/// The CSV report (header line, then one row per subject per zone).
#[must_use]
pub fn report_csv(eval: &Evaluation) -> String {
    let mut out = String::from(HEADER);
    out.push('\n');
    for (zi, zone) in eval.zones.iter().enumerate() {
        for s in &zone.subjects {
            row(&mut out, zone, zi, s);
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::sample;

    #[test]
    fn one_row_per_subject_per_zone_with_quoting() {
        let text = report_csv(&sample::evaluation());
        let lines: Vec<&str> = text.lines().collect();
        assert_eq!(lines[0], HEADER);
        assert_eq!(lines.len(), 1 + 2 * 2);
        assert!(lines[1].starts_with("Key side,0,0,\"Skin, light\",skin,true,2.34,65,14,17,64,18,15,#c1937f,#c88c82,true,true,812.4,4987,0.0042"), "{}", lines[1]);
        assert!(
            lines[2].starts_with("Key side,0,1,\"<i>Custom</i>, \"\"quoted\"\"\",skin,true,7.89"),
            "{}",
            lines[2]
        );
        assert!(lines[3].starts_with("Shadow <side>,1,0,"));
    }

    #[test]
    fn formulas_are_defused() {
        assert_eq!(text_cell("=HYPERLINK(\"x\")"), "\"'=HYPERLINK(\"\"x\"\")\"");
        assert_eq!(text_cell("-1"), "'-1");
        assert_eq!(text_cell("plain"), "plain");
    }
}
