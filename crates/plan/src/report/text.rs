//! The plain-text report, for a terminal.
//!
//! Names from the plan are printed as they are, except that control
//! characters become spaces so that a name cannot move the cursor or clear
//! the screen.

use super::fmt_num::{cct, dash, duv, index, lux, one, stops};
use crate::evaluation::{Evaluation, LightFigures, SubjectResult};
use crate::model::Plan;
use std::fmt::Write;

/// A plan's text with terminal control characters made harmless.
fn clean(text: &str) -> String {
    text.chars()
        .map(|c| if c.is_control() { ' ' } else { c })
        .collect()
}

fn light_lines(out: &mut String, light: &LightFigures) {
    let ev = light.ev100.map_or_else(dash, |e| format!("{e:.1}"));
    let _ = writeln!(
        out,
        "  Illuminance {} (EV {ev} at ISO 100)",
        lux(light.illuminance_lux)
    );
    let mired = light.mired.map_or_else(dash, |m| format!("{m:.0}"));
    let _ = writeln!(
        out,
        "  CCT {}, Duv {}, {mired} mired",
        cct(light.cct_k),
        duv(light.duv)
    );
    let r9 = light.cri_r.map(|r| r[8]);
    let ssi = light.ssi.map_or_else(dash, |s| s.to_string());
    let _ = writeln!(
        out,
        "  CRI Ra {}, R9 {}; TM-30 Rf {}, Rg {}; SSI {ssi}",
        index(light.cri_ra),
        index(r9),
        index(light.tm30_rf),
        index(light.tm30_rg)
    );
}

fn subject_table(out: &mut String, subjects: &[SubjectResult]) {
    let width = subjects
        .iter()
        .map(|s| clean(&s.name).chars().count())
        .max()
        .unwrap_or(7)
        .clamp(7, 40);
    let _ = writeln!(
        out,
        "  {:<width$}  {:<9}  {:>5}  {:>20}  {:>20}",
        "Subject", "Group", "ΔE00", "Eye L* a* b*", "Camera L* a* b*"
    );
    for s in subjects {
        let lab = |l: [f64; 3]| format!("{:.1} {:+.1} {:+.1}", l[0], l[1], l[2]);
        let mut name: String = clean(&s.name).chars().take(width).collect();
        if !s.included {
            name = format!("({name})");
        }
        let gamut = if s.eye_in_gamut && s.camera_in_gamut {
            ""
        } else {
            "  out of display gamut"
        };
        let _ = writeln!(
            out,
            "  {name:<width$}  {:<9}  {:>5.1}  {:>20}  {:>20}{gamut}",
            clean(&s.group),
            s.de2000,
            lab(s.eye_lab),
            lab(s.camera_lab)
        );
    }
}

/// The plain-text report.
#[must_use]
pub fn report_text(plan: &Plan, eval: &Evaluation) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "Lampwright report: {}", clean(&plan.name));
    if !plan.notes.trim().is_empty() {
        let _ = writeln!(out, "Notes: {}", clean(&plan.notes));
    }
    let main = eval
        .zones
        .first()
        .map_or_else(String::new, |z| format!(" ({})", clean(&z.name)));
    let _ = writeln!(out, "\nLight at the subject{main}");
    light_lines(&mut out, &eval.light);

    let _ = writeln!(out, "\nSources");
    for s in &eval.sources {
        let state = if s.lit { "" } else { "  (off)" };
        let _ = writeln!(
            out,
            "  {}: {}, {} from key, gels cost {} stops, CCT {}, Duv {}{state}",
            clean(&s.name),
            lux(s.illuminance_lux),
            stops(s.stops_from_key),
            one(Some(s.gel_loss_stops)),
            cct(s.cct_k),
            duv(s.duv)
        );
    }

    if eval.zones.len() > 1 {
        let _ = writeln!(out, "\nZones");
        for z in &eval.zones {
            let shift = z
                .mired_from_white_balance
                .map_or_else(dash, |m| format!("{m:+.0}"));
            let _ = writeln!(
                out,
                "  {}: {}, {} from main, CCT {}, Duv {}, {shift} mired from white balance",
                clean(&z.name),
                lux(z.light.illuminance_lux),
                stops(z.stops_from_main),
                cct(z.light.cct_k),
                duv(z.light.duv)
            );
        }
    }

    let _ = writeln!(out, "\nSubjects, eye versus camera (CIEDE2000)");
    subject_table(&mut out, &eval.subjects);
    let sm = &eval.summary;
    let worst = sm
        .worst_subject
        .as_deref()
        .map_or_else(String::new, |w| format!(" ({})", clean(w)));
    let _ = writeln!(
        out,
        "  Mean ΔE00 {}, 90th percentile {}, largest {}{worst}",
        one(sm.mean_de2000),
        one(sm.p90_de2000),
        one(sm.max_de2000)
    );
    for z in eval.zones.iter().skip(1) {
        let _ = writeln!(out, "\nSubjects in zone {}", clean(&z.name));
        subject_table(&mut out, &z.subjects);
    }

    if !eval.metamers.is_empty() {
        let _ = writeln!(out, "\nMetamers");
        for m in &eval.metamers {
            let who = if m.eye_matches {
                "match to the eye, not to the camera"
            } else {
                "match on the camera, not to the eye"
            };
            let _ = writeln!(
                out,
                "  {} and {}: {who} (eye ΔE00 {:.1}, camera ΔE00 {:.1})",
                clean(&m.a),
                clean(&m.b),
                m.eye_de2000,
                m.camera_de2000
            );
        }
    }

    let c = &eval.camera;
    let _ = writeln!(out, "\nCamera: {}", clean(&c.name));
    let _ = writeln!(
        out,
        "  White balance gains R {:.3}, G {:.3}, B {:.3} (set for {})",
        c.wb_gains[0],
        c.wb_gains[1],
        c.wb_gains[2],
        cct(c.wb_cct_k)
    );
    let _ = writeln!(
        out,
        "  Luther residual {:.3}, µ-factor {:.3}",
        c.luther_residual, c.mu_factor
    );

    if !eval.warnings.is_empty() {
        let _ = writeln!(out, "\nWarnings");
        for w in &eval.warnings {
            let _ = writeln!(out, "  - {}", clean(w));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::sample;

    #[test]
    fn text_report_shows_figures_at_trade_precision() {
        let text = report_text(&sample::plan(), &sample::evaluation());
        assert!(text.starts_with("Lampwright report: Test <b>plan</b>"));
        assert!(text.contains("CCT 4990 K, Duv +0.004, 201 mired"), "{text}");
        assert!(text.contains("CRI Ra 83, R9 80; TM-30 Rf 84, Rg 98; SSI 71"));
        assert!(text.contains("Mean ΔE00 5.1, 90th percentile 7.3, largest 7.9"));
        assert!(text.contains("Shadow <side>: 101 lux, −3.0 stops from main"));
        assert!(text.contains("out of display gamut"));
        assert!(text.contains("Metamers"));
    }

    #[test]
    fn control_characters_cannot_reach_the_terminal() {
        let mut plan = sample::plan();
        plan.name = "evil\u{1b}[2Jname\r\n".into();
        let text = report_text(&plan, &sample::evaluation());
        assert!(!text.contains('\u{1b}'));
        assert!(text.starts_with("Lampwright report: evil [2Jname  \n"));
    }
}
