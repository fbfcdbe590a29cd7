//! The HTML report: one self-contained page (inline CSS and SVG, no scripts,
//! no external resources) to send to a crew or a client.
//!
//! Every text taken from the plan or the evaluation (names, notes, warnings)
//! is escaped, and a Content-Security-Policy forbids scripts and remote
//! loads, so a plan whose names contain markup cannot run anything.

use super::fmt_num::{cct, dash, duv, index, lux, one, stops};
use super::svg::{chromaticity_svg, esc, spectrum_legend, spectrum_svg, swatches_svg};
use crate::evaluation::{Evaluation, LightFigures, SubjectResult};
use crate::model::Plan;
use std::fmt::Write;

const STYLE: &str = "body{font-family:system-ui,sans-serif;max-width:1000px;margin:2em auto;padding:0 1em;color:#222;line-height:1.4}\
h1{margin-bottom:0.2em}h2{margin-top:1.6em;border-bottom:1px solid #ccc}\
table{border-collapse:collapse;margin:0.5em 0}td,th{padding:0.2em 0.7em;border-bottom:1px solid #e4e4e4;text-align:left}\
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums}\
.notes{white-space:pre-wrap;color:#555}.figures{display:flex;flex-wrap:wrap;gap:1em;align-items:flex-start}\
svg .tick{font-size:10px;fill:#555}svg .axis{font-size:11px;fill:#333}svg .name{font-size:11px;fill:#222}svg .de{font-size:11px;fill:#555}\
.legend span{display:inline-block;margin-right:1em}.legend i{display:inline-block;width:1.5em;height:0.3em;vertical-align:middle;margin-right:0.3em}\
.warn li{color:#8a3b00}footer{margin-top:2em;font-size:0.85em;color:#666}";

fn light_rows(out: &mut String, light: &LightFigures) {
    let rows = [
        ("Illuminance", lux(light.illuminance_lux)),
        (
            "EV at ISO 100",
            light.ev100.map_or_else(dash, |e| format!("{e:.1}")),
        ),
        ("CCT", cct(light.cct_k)),
        ("Duv", duv(light.duv)),
        (
            "Mired",
            light.mired.map_or_else(dash, |m| format!("{m:.0}")),
        ),
        ("CRI Ra", index(light.cri_ra)),
        ("CRI R9", index(light.cri_r.map(|r| r[8]))),
        ("TM-30 Rf", index(light.tm30_rf)),
        ("TM-30 Rg", index(light.tm30_rg)),
        ("SSI", light.ssi.map_or_else(dash, |s| s.to_string())),
    ];
    out.push_str("<table>");
    for (k, v) in rows {
        let _ = write!(
            out,
            r#"<tr><th>{k}</th><td class="num">{}</td></tr>"#,
            esc(&v)
        );
    }
    out.push_str("</table>");
}

fn subject_table(out: &mut String, subjects: &[SubjectResult]) {
    out.push_str(r#"<table><tr><th>Subject</th><th>Group</th><th class="num">ΔE00</th><th class="num">Eye L* a* b*</th><th class="num">Camera L* a* b*</th><th>Display gamut</th></tr>"#);
    for s in subjects {
        let lab = |l: [f64; 3]| format!("{:.1} {:+.1} {:+.1}", l[0], l[1], l[2]);
        let gamut = match (s.eye_in_gamut, s.camera_in_gamut) {
            (true, true) => "inside",
            (false, true) => "eye colour outside",
            (true, false) => "camera colour outside",
            (false, false) => "both outside",
        };
        let name = if s.included {
            esc(&s.name)
        } else {
            format!("{} (not counted)", esc(&s.name))
        };
        let _ = write!(
            out,
            r#"<tr><td>{name}</td><td>{}</td><td class="num">{:.1}</td><td class="num">{}</td><td class="num">{}</td><td>{gamut}</td></tr>"#,
            esc(&s.group),
            s.de2000,
            lab(s.eye_lab),
            lab(s.camera_lab)
        );
    }
    out.push_str("</table>");
}

fn sources_section(out: &mut String, eval: &Evaluation) {
    out.push_str(r#"<h2>Sources</h2><table><tr><th>Source</th><th class="num">At the subject</th><th class="num">From key</th><th class="num">Gel loss</th><th class="num">CCT</th><th class="num">Duv</th><th>State</th></tr>"#);
    for s in &eval.sources {
        let _ = write!(
            out,
            r#"<tr><td>{}</td><td class="num">{}</td><td class="num">{}</td><td class="num">{} stops</td><td class="num">{}</td><td class="num">{}</td><td>{}</td></tr>"#,
            esc(&s.name),
            lux(s.illuminance_lux),
            stops(s.stops_from_key),
            one(Some(s.gel_loss_stops)),
            cct(s.cct_k),
            duv(s.duv),
            if s.lit { "on" } else { "off" }
        );
    }
    out.push_str("</table>");
}

fn zones_section(out: &mut String, eval: &Evaluation) {
    if eval.zones.len() > 1 {
        out.push_str(r#"<h2>Zones</h2><table><tr><th>Zone</th><th class="num">Illuminance</th><th class="num">From main</th><th class="num">CCT</th><th class="num">Duv</th><th class="num">Mired from white balance</th><th class="num">Mean ΔE00</th></tr>"#);
        for z in &eval.zones {
            let included: Vec<f64> = z
                .subjects
                .iter()
                .filter(|s| s.included)
                .map(|s| s.de2000)
                .collect();
            let mean = if included.is_empty() {
                None
            } else {
                Some(included.iter().sum::<f64>() / included.len() as f64)
            };
            let _ = write!(
                out,
                r#"<tr><td>{}</td><td class="num">{}</td><td class="num">{}</td><td class="num">{}</td><td class="num">{}</td><td class="num">{}</td><td class="num">{}</td></tr>"#,
                esc(&z.name),
                lux(z.light.illuminance_lux),
                stops(z.stops_from_main),
                cct(z.light.cct_k),
                duv(z.light.duv),
                z.mired_from_white_balance
                    .map_or_else(dash, |m| format!("{m:+.0}")),
                one(mean)
            );
        }
        out.push_str("</table>");
    }
}

fn metamers_camera_warnings(out: &mut String, eval: &Evaluation) {
    if !eval.metamers.is_empty() {
        out.push_str(r#"<h2>Metamers</h2><table><tr><th>Pair</th><th>Match</th><th class="num">Eye ΔE00</th><th class="num">Camera ΔE00</th></tr>"#);
        for m in &eval.metamers {
            let _ = write!(
                out,
                r#"<tr><td>{} and {}</td><td>{}</td><td class="num">{:.1}</td><td class="num">{:.1}</td></tr>"#,
                esc(&m.a),
                esc(&m.b),
                if m.eye_matches {
                    "to the eye, not the camera"
                } else {
                    "on the camera, not to the eye"
                },
                m.eye_de2000,
                m.camera_de2000
            );
        }
        out.push_str("</table>");
    }

    let c = &eval.camera;
    let _ = write!(
        out,
        r#"<h2>Camera: {}</h2><table><tr><th>White balance gains (R, G, B)</th><td class="num">{:.3}, {:.3}, {:.3}</td></tr><tr><th>White balance set for</th><td class="num">{}</td></tr><tr><th>Luther residual</th><td class="num">{:.3}</td></tr><tr><th>µ-factor</th><td class="num">{:.3}</td></tr></table>"#,
        esc(&c.name),
        c.wb_gains[0],
        c.wb_gains[1],
        c.wb_gains[2],
        esc(&cct(c.wb_cct_k)),
        c.luther_residual,
        c.mu_factor
    );

    if !eval.warnings.is_empty() {
        out.push_str(r#"<h2>Warnings</h2><ul class="warn">"#);
        for w in &eval.warnings {
            let _ = write!(out, "<li>{}</li>", esc(w));
        }
        out.push_str("</ul>");
    }
}

/// The HTML report: a complete, self-contained page.
#[must_use]
pub fn report_html(plan: &Plan, eval: &Evaluation) -> String {
    let mut out = String::with_capacity(64 * 1024);
    let title = esc(&plan.name);
    let _ = write!(
        out,
        r#"<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Lampwright report: {title}</title><style>{STYLE}</style></head><body>"#
    );
    let _ = write!(out, "<h1>{title}</h1>");
    if !plan.notes.trim().is_empty() {
        let _ = write!(out, r#"<p class="notes">{}</p>"#, esc(&plan.notes));
    }

    let main = eval
        .zones
        .first()
        .map_or_else(String::new, |z| format!(" ({})", esc(&z.name)));
    let _ = write!(
        out,
        "<h2>Light at the subject{main}</h2><div class=\"figures\">"
    );
    light_rows(&mut out, &eval.light);
    out.push_str(&chromaticity_svg(eval));
    out.push_str("</div>");
    out.push_str(&spectrum_svg(eval));
    out.push_str(r#"<p class="legend"><span><i style="background:#e8dcc0;border:1px solid #333"></i>Mix</span>"#);
    for (colour, name) in spectrum_legend(eval) {
        let _ = write!(
            out,
            r#"<span><i style="background:{colour}"></i>{}</span>"#,
            esc(&name)
        );
    }
    out.push_str("</p>");

    sources_section(&mut out, eval);
    zones_section(&mut out, eval);

    out.push_str("<h2>Subjects: eye (left) versus camera (right)</h2>");
    out.push_str(&swatches_svg(&eval.subjects));
    out.push_str("<p>* a colour lies outside the display gamut and is shown clipped.</p>");
    subject_table(&mut out, &eval.subjects);
    let sm = &eval.summary;
    let worst = sm
        .worst_subject
        .as_deref()
        .map_or_else(String::new, |w| format!(" ({})", esc(w)));
    let _ = write!(
        out,
        "<p>Mean ΔE00 {}, 90th percentile {}, largest {}{worst}.</p>",
        one(sm.mean_de2000),
        one(sm.p90_de2000),
        one(sm.max_de2000)
    );
    for z in eval.zones.iter().skip(1) {
        let _ = write!(out, "<h2>Subjects in zone {}</h2>", esc(&z.name));
        out.push_str(&swatches_svg(&z.subjects));
        subject_table(&mut out, &z.subjects);
    }

    metamers_camera_warnings(&mut out, eval);
    let _ = writeln!(
        out,
        "<footer>Made with Lampwright {}. Lampwright predicts colour, not photobiological or electrical safety: lamps and gels get hot, and mains power and dimmers are for qualified people.</footer></body></html>",
        env!("CARGO_PKG_VERSION")
    );
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::sample;

    #[test]
    fn markup_in_names_is_escaped_everywhere() {
        let html = report_html(&sample::plan(), &sample::evaluation());
        for raw in [
            "<script",
            "<img",
            "<b>",
            "<i>",
            "<side>",
            "onerror=alert(1)>",
        ] {
            assert!(!html.contains(raw), "raw markup {raw} leaked");
        }
        assert!(html.contains("<title>Lampwright report: Test &lt;b&gt;plan&lt;/b&gt; &amp; &quot;friends&quot;</title>"));
        assert!(html.contains("&lt;script&gt;alert(&#39;notes&#39;)&lt;/script&gt;"));
        assert!(html.contains("Shadow &lt;side&gt;"));
        assert!(html.contains("&lt;img src=x onerror=alert(1)&gt;"));
    }

    #[test]
    fn the_page_is_self_contained() {
        let html = report_html(&sample::plan(), &sample::evaluation());
        assert!(html.starts_with("<!DOCTYPE html>"));
        assert!(html.ends_with("</html>\n"));
        for external in ["http://", "https://", "<link", "<script", "url(", "@import"] {
            assert!(!html.contains(external), "{external}");
        }
        assert!(html.contains("default-src 'none'"));
        // Spectrum, chromaticity and one swatch figure per zone.
        assert_eq!(html.matches("<svg").count(), 2 + 2);
        assert_eq!(html.matches("<svg").count(), html.matches("</svg>").count());
        assert!(html.contains("CCT</th><td class=\"num\">4990 K"));
    }
}
