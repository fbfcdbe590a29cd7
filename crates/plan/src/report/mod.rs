//! Reports of an evaluated plan: plain text for the terminal, JSON for
//! scripts, CSV for spreadsheets and one self-contained HTML page to share.
//!
//! Every renderer reads the plan (for its names and notes) and the
//! [`Evaluation`] the engine computed; none computes colour itself. Numbers are
//! shown at the trade's precision (CCT to 10 K, Duv to 0.001, Ra and Rf as
//! integers, ΔE to 0.1) in text and HTML, and at full precision in JSON and CSV.

mod csv;
mod html;
mod json;
mod svg;
mod text;

pub use csv::report_csv;
pub use html::report_html;
pub use json::report_json;
pub use text::report_text;

use crate::error::{PlanError, Result};
use crate::evaluation::Evaluation;
use crate::model::Plan;
use std::fmt;
use std::str::FromStr;

/// The report formats.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum ReportFormat {
    /// Plain text for a terminal.
    #[default]
    Text,
    /// JSON (one object; numbers at full precision).
    Json,
    /// CSV: one row per subject per zone.
    Csv,
    /// One self-contained HTML page with inline SVG figures.
    Html,
}

impl ReportFormat {
    /// Every format, in the order the command line lists them.
    pub const ALL: [ReportFormat; 4] = [
        ReportFormat::Text,
        ReportFormat::Json,
        ReportFormat::Csv,
        ReportFormat::Html,
    ];

    /// The format's name on the command line.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            ReportFormat::Text => "text",
            ReportFormat::Json => "json",
            ReportFormat::Csv => "csv",
            ReportFormat::Html => "html",
        }
    }

    /// The usual file extension.
    #[must_use]
    pub fn extension(self) -> &'static str {
        match self {
            ReportFormat::Text => "txt",
            other => other.name(),
        }
    }
}

impl fmt::Display for ReportFormat {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for ReportFormat {
    type Err = PlanError;

    fn from_str(s: &str) -> Result<Self> {
        let wanted = s.trim().to_ascii_lowercase();
        ReportFormat::ALL
            .into_iter()
            .find(|f| f.name() == wanted || (wanted == "txt" && *f == ReportFormat::Text))
            .ok_or_else(|| PlanError::Invalid {
                field: "report format".into(),
                message: format!("'{s}' is not one of text, json, csv, html"),
            })
    }
}

/// Render a report of `evaluation` (computed from `plan`) in `format`.
pub fn render_report(plan: &Plan, evaluation: &Evaluation, format: ReportFormat) -> Result<String> {
    match format {
        ReportFormat::Text => Ok(report_text(plan, evaluation)),
        ReportFormat::Json => report_json(plan, evaluation),
        ReportFormat::Csv => Ok(report_csv(evaluation)),
        ReportFormat::Html => Ok(report_html(plan, evaluation)),
    }
}

/// Shared number formatting at the trade's precision; "—" for missing values.
pub(crate) mod fmt_num {
    /// CCT to 10 K: "3200 K".
    pub fn cct(v: Option<f64>) -> String {
        v.map_or_else(dash, |k| format!("{:.0} K", (k / 10.0).round() * 10.0))
    }

    /// Duv to 0.001 with sign: "+0.004".
    pub fn duv(v: Option<f64>) -> String {
        v.map_or_else(dash, |d| {
            let d = if d.abs() < 0.0005 { 0.0 } else { d };
            format!("{d:+.3}")
        })
    }

    /// An index as an integer: "83".
    pub fn index(v: Option<f64>) -> String {
        v.map_or_else(dash, |x| format!("{x:.0}"))
    }

    /// One decimal: ΔE, stops, EV (never "-0.0").
    pub fn one(v: Option<f64>) -> String {
        v.map_or_else(dash, |x| {
            let x = if x.abs() < 0.05 { 0.0 } else { x };
            format!("{x:.1}")
        })
    }

    /// Stops with sign: "−1.3 stops" (typographic minus).
    pub fn stops(v: Option<f64>) -> String {
        v.map_or_else(dash, |x| {
            let x = if x.abs() < 0.05 { 0.0 } else { x };
            let s = format!("{x:+.1}");
            format!("{} stops", s.replace('-', "−"))
        })
    }

    /// Illuminance: "1234 lux" (no decimals above 10 lux).
    pub fn lux(x: f64) -> String {
        if x.abs() >= 10.0 {
            format!("{x:.0} lux")
        } else {
            format!("{x:.2} lux")
        }
    }

    /// The dash for a missing value.
    pub fn dash() -> String {
        "—".into()
    }
}

#[cfg(test)]
pub(crate) mod sample {
    //! A hand-built evaluation for the renderers' tests (values invented, not computed).
    use crate::evaluation::*;
    use crate::model::{Plan, Source, SubjectEntry, SubjectRef};

    pub fn plan() -> Plan {
        Plan {
            name: "Test <b>plan</b> & \"friends\"".into(),
            notes: "<script>alert('notes')</script>".into(),
            sources: vec![Source {
                id: 1,
                name: "<img src=x onerror=alert(1)>".into(),
                ..Source::default()
            }],
            subjects: vec![SubjectEntry {
                subject: SubjectRef::Library("grey-card-18".into()),
                ..SubjectEntry::default()
            }],
            ..Plan::default()
        }
    }

    fn light(lux: f64, cct: f64) -> LightFigures {
        LightFigures {
            spectrum: (0..lampwright_color::GRID_LEN)
                .map(|i| 0.001 * (1.0 + (i as f64 / 50.0).sin()))
                .collect(),
            illuminance_lux: lux,
            ev100: Some(9.6),
            xy: Some([0.4, 0.39]),
            uv: Some([0.235, 0.351]),
            cct_k: Some(cct),
            duv: Some(0.0042),
            mired: Some(1e6 / cct),
            cri_ra: Some(82.6),
            cri_r: Some([80.0; 14]),
            tm30_rf: Some(84.2),
            tm30_rg: Some(97.5),
            tm30_bins: None,
            ssi: Some(71),
        }
    }

    fn subject(index: usize, name: &str, de: f64) -> SubjectResult {
        SubjectResult {
            index,
            name: name.into(),
            group: "skin".into(),
            included: true,
            eye_lab: [65.0, 14.0, 17.0],
            camera_lab: [64.0, 18.0, 15.0],
            eye_rgb8: [193, 147, 127],
            camera_rgb8: [200, 140, 130],
            eye_in_gamut: true,
            camera_in_gamut: index != 1,
            de2000: de,
        }
    }

    pub fn evaluation() -> Evaluation {
        let subjects = vec![
            subject(0, "Skin, light", 2.34),
            subject(1, "<i>Custom</i>, \"quoted\"", 7.89),
        ];
        Evaluation {
            light: light(812.4, 4987.0),
            sources: vec![SourceFigures {
                source_id: 1,
                name: "<img src=x onerror=alert(1)>".into(),
                lit: true,
                illuminance_lux: 812.4,
                stops_from_key: None,
                gel_loss_stops: 0.42,
                cct_k: Some(4987.0),
                duv: Some(0.0042),
                spectrum: vec![0.0; lampwright_color::GRID_LEN].into(),
            }],
            zones: vec![
                ZoneEvaluation {
                    zone_id: 1,
                    name: "Key side".into(),
                    light: light(812.4, 4987.0),
                    stops_from_main: Some(0.0),
                    mired_from_white_balance: Some(3.2),
                    subjects: subjects.clone(),
                },
                ZoneEvaluation {
                    zone_id: 2,
                    name: "Shadow <side>".into(),
                    light: light(101.0, 2010.0),
                    stops_from_main: Some(-3.0),
                    mired_from_white_balance: Some(297.0),
                    subjects: subjects.clone(),
                },
            ],
            subjects,
            summary: Summary {
                mean_de2000: Some(5.115),
                p90_de2000: Some(7.334),
                max_de2000: Some(7.89),
                worst_subject: Some("<i>Custom</i>, \"quoted\"".into()),
            },
            metamers: vec![MetamerPair {
                a: "Skin, light".into(),
                b: "<i>Custom</i>".into(),
                eye_de2000: 0.8,
                camera_de2000: 4.1,
                eye_matches: true,
            }],
            camera: CameraFigures {
                name: "Demo camera A".into(),
                sensitivities: [vec![0.5; 3], vec![0.5; 3], vec![0.5; 3]].into(),
                luther_residual: 0.12,
                mu_factor: 0.93,
                wb_gains: [1.9, 1.0, 1.6],
                wb_cct_k: Some(5000.0),
                matrix: [[0.6, 0.3, 0.1], [0.2, 0.7, 0.1], [0.0, 0.1, 0.9]],
            },
            warnings: vec!["Source '<img>' loses 3.2 stops & more".into()],
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn formats_parse_by_name() {
        for f in ReportFormat::ALL {
            assert_eq!(f.name().parse::<ReportFormat>().unwrap(), f);
        }
        assert_eq!("TXT".parse::<ReportFormat>().unwrap(), ReportFormat::Text);
        assert!("pdf".parse::<ReportFormat>().is_err());
    }

    #[test]
    fn numbers_use_the_trade_precision() {
        assert_eq!(fmt_num::cct(Some(3196.0)), "3200 K");
        assert_eq!(fmt_num::duv(Some(-0.00449)), "-0.004");
        assert_eq!(fmt_num::duv(Some(0.0002)), "+0.000");
        assert_eq!(fmt_num::index(Some(82.6)), "83");
        assert_eq!(fmt_num::one(Some(2.345)), "2.3");
        assert_eq!(fmt_num::one(Some(-0.00001)), "0.0");
        assert_eq!(fmt_num::stops(Some(-1.26)), "−1.3 stops");
        assert_eq!(fmt_num::cct(None), "—");
        assert_eq!(fmt_num::lux(812.4), "812 lux");
        assert_eq!(fmt_num::lux(0.5), "0.50 lux");
    }

    #[test]
    fn every_format_renders_the_sample() {
        let plan = sample::plan();
        let eval = sample::evaluation();
        for f in ReportFormat::ALL {
            let out = render_report(&plan, &eval, f).unwrap();
            assert!(!out.is_empty(), "{f}");
        }
    }
}
