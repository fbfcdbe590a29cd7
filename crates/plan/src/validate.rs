//! Checking a plan for problems before it is evaluated or shared.
//!
//! [`validate`] walks the whole plan and lists every problem it finds, each
//! with the field it is in and a sentence saying what is wrong. Errors stop
//! the plan from being evaluated correctly; warnings are things a crew should
//! know (a dimmer on an LED is ignored, an embedded spectrum stops short of
//! the visible range). `lampwright check` prints this list.

use crate::error::{PlanError, one_line};
use crate::library;
use crate::limits::{MAX_GEL_STACK, check_limits};
use crate::model::{
    CameraRef, CustomSpectrum, FORMAT_VERSION, LampRef, Plan, SubjectRef, WhiteBalanceSetting,
    ZoneLevel,
};
use crate::resolve::{
    camera_sensitivities, gel_transmittance, lamp_filament_cct_k, lamp_spd, subject_reflectance,
};
use std::collections::{HashMap, HashSet};
use std::fmt;

/// How serious an issue is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    /// Worth knowing; the plan still evaluates as the crew intends.
    Warning,
    /// The plan cannot be evaluated as written.
    Error,
}

/// One problem found in a plan.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Issue {
    /// Error or warning.
    pub severity: Severity,
    /// Where, as a path into the plan: `sources[2].level_lux`.
    pub field: String,
    /// What is wrong, one sentence.
    pub message: String,
}

impl fmt::Display for Issue {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let word = match self.severity {
            Severity::Error => "error",
            Severity::Warning => "warning",
        };
        write!(f, "{word}: {}: {}", self.field, self.message)
    }
}

/// Kelvin white-balance settings accepted, K.
pub const WHITE_BALANCE_RANGE_K: (f64, f64) = (1000.0, 25_000.0);
/// Levels above this are flagged (direct summer sun is about 100 000 lux).
pub const IMPLAUSIBLE_LUX: f64 = 200_000.0;

#[derive(Default)]
struct Issues(Vec<Issue>);

impl Issues {
    fn error(&mut self, field: impl Into<String>, message: impl Into<String>) {
        self.push(Severity::Error, &field.into(), &message.into());
    }

    fn warning(&mut self, field: impl Into<String>, message: impl Into<String>) {
        self.push(Severity::Warning, &field.into(), &message.into());
    }

    /// Names and ids from the plan are quoted in issues; keep each issue on one line.
    fn push(&mut self, severity: Severity, field: &str, message: &str) {
        self.0.push(Issue {
            severity,
            field: one_line(field).into_owned(),
            message: one_line(message).into_owned(),
        });
    }

    fn number(&mut self, field: &str, what: &str, value: f64, min: f64) {
        if !value.is_finite() {
            self.error(field, format!("{what} is {value}, not a finite number"));
        } else if value < min {
            self.error(
                field,
                format!("{what} is {value}; it must be at least {min}"),
            );
        }
    }
}

/// Every problem in the plan, errors first, in plan order within each severity.
#[must_use]
pub fn validate(plan: &Plan) -> Vec<Issue> {
    let mut out = Issues::default();
    if plan.format_version != FORMAT_VERSION {
        out.error(
            "format_version",
            format!(
                "is {}, but plans in memory are version {FORMAT_VERSION}",
                plan.format_version
            ),
        );
    }
    if let Err(e) = check_limits(plan) {
        out.error("limits", e.to_string());
    }
    if plan.name.trim().is_empty() {
        out.warning("name", "the plan has no name");
    }
    check_sources(plan, &mut out);
    check_zones(plan, &mut out);
    check_subjects(plan, &mut out);
    check_camera(plan, &mut out);
    check_kit(plan, &mut out);
    check_custom(plan, &mut out);
    let mut issues = out.0;
    issues.sort_by_key(|i| std::cmp::Reverse(i.severity));
    issues
}

/// Whether any issue is an error.
#[must_use]
pub fn has_errors(issues: &[Issue]) -> bool {
    issues.iter().any(|i| i.severity == Severity::Error)
}

fn check_sources(plan: &Plan, out: &mut Issues) {
    if plan.sources.is_empty() {
        out.warning("sources", "the plan has no light sources");
    } else if !plan.sources.iter().any(|s| plan.is_lit(s)) {
        out.warning("sources", "no source is switched on");
    }
    let mut ids = HashSet::new();
    let mut names = HashSet::new();
    for (i, s) in plan.sources.iter().enumerate() {
        let f = format!("sources[{i}]");
        let who = format!("source '{}'", s.name);
        if !ids.insert(s.id) {
            out.error(
                format!("{f}.id"),
                format!("{who}: id {} is used by another source", s.id),
            );
        }
        if s.name.trim().is_empty() {
            out.warning(format!("{f}.name"), "a source has no name");
        } else if !names.insert(s.name.as_str()) {
            out.warning(
                format!("{f}.name"),
                format!("{who}: two sources share this name"),
            );
        }
        out.number(
            &format!("{f}.level_lux"),
            &format!("{who}: level (lux)"),
            s.level_lux,
            0.0,
        );
        if s.level_lux.is_finite() && s.level_lux > IMPLAUSIBLE_LUX {
            out.warning(
                format!("{f}.level_lux"),
                format!(
                    "{who}: {:.0} lux is brighter than direct sunlight",
                    s.level_lux
                ),
            );
        }
        if !s.dimmer.is_finite() || !(0.0..=1.0).contains(&s.dimmer) {
            out.error(
                format!("{f}.dimmer"),
                format!(
                    "{who}: dimmer {} is not a voltage fraction between 0 and 1",
                    s.dimmer
                ),
            );
        } else if s.dimmer < 1.0 && lamp_filament_cct_k(&s.lamp).is_none() {
            out.warning(
                format!("{f}.dimmer"),
                format!("{who}: the dimmer only shifts filament lamps; this lamp ignores it"),
            );
        }
        match lamp_spd(plan, &s.lamp) {
            Ok(spd) => {
                if let Err(e) = spd.check_colorimetric(&who) {
                    out.error(format!("{f}.lamp"), e.to_string());
                }
            }
            Err(e) => out.error(format!("{f}.lamp"), with_who(&who, &e)),
        }
        if let LampRef::Blackbody { cct_k } | LampRef::Daylight { cct_k } = s.lamp
            && !cct_k.is_finite()
        {
            out.error(
                format!("{f}.lamp"),
                format!("{who}: colour temperature {cct_k} is not a number"),
            );
        }
        for (j, layer) in s.gels.iter().enumerate() {
            let g = format!("{f}.gels[{j}]");
            out.number(
                &format!("{g}.strength"),
                &format!("{who}: gel strength"),
                layer.strength,
                0.0,
            );
            if let Err(e) = gel_transmittance(plan, &layer.gel) {
                out.error(format!("{g}.gel"), with_who(&who, &e));
            }
        }
    }
}

/// Replace the generic context of a resolve error with the source's name.
fn with_who(who: &str, e: &PlanError) -> String {
    match e {
        PlanError::UnknownId { kind, id, .. } => format!("{who}: unknown {kind} '{id}'"),
        PlanError::ColorIn { context, error } => {
            let rest = context.split_once(": ").map_or("", |(_, r)| r);
            if rest.is_empty() {
                format!("{who}: {error}")
            } else {
                format!("{who}: {rest}: {error}")
            }
        }
        other => format!("{who}: {other}"),
    }
}

fn check_zones(plan: &Plan, out: &mut Issues) {
    let mut ids = HashSet::new();
    let source_ids: HashSet<_> = plan.sources.iter().map(|s| s.id).collect();
    for (i, z) in plan.zones.iter().enumerate() {
        let f = format!("zones[{i}]");
        let who = format!("zone '{}'", z.name);
        if !ids.insert(z.id) {
            out.error(
                format!("{f}.id"),
                format!("{who}: id {} is used by another zone", z.id),
            );
        }
        out.number(
            &format!("{f}.weight"),
            &format!("{who}: weight"),
            z.weight,
            0.0,
        );
        if z.reach.is_empty() {
            out.warning(
                format!("{f}.reach"),
                format!("{who}: no source reaches this zone; it is dark"),
            );
        }
        let mut seen = HashSet::new();
        for (j, r) in z.reach.iter().enumerate() {
            let g = format!("{f}.reach[{j}]");
            if !source_ids.contains(&r.source) {
                out.error(
                    format!("{g}.source"),
                    format!("{who}: there is no source with id {}", r.source),
                );
            }
            if !seen.insert(r.source) {
                out.error(
                    format!("{g}.source"),
                    format!("{who}: source {} is listed twice", r.source),
                );
            }
            match r.level {
                ZoneLevel::AsSource => {}
                ZoneLevel::Lux(lux) => out.number(
                    &format!("{g}.level"),
                    &format!("{who}: level (lux)"),
                    lux,
                    0.0,
                ),
                ZoneLevel::Stops(stops) => {
                    out.number(
                        &format!("{g}.level"),
                        &format!("{who}: level (stops)"),
                        stops,
                        f64::MIN,
                    );
                }
                ZoneLevel::Distance {
                    rated_lux_at_1m,
                    distance_m,
                } => {
                    out.number(
                        &format!("{g}.level"),
                        &format!("{who}: rated output (lux at 1 m)"),
                        rated_lux_at_1m,
                        0.0,
                    );
                    if !distance_m.is_finite() || distance_m <= 0.0 {
                        out.error(
                            format!("{g}.level"),
                            format!("{who}: distance {distance_m} m must be a positive number"),
                        );
                    }
                }
            }
        }
    }
}

fn check_subjects(plan: &Plan, out: &mut Issues) {
    if plan.subjects.is_empty() {
        out.warning("subjects", "the plan has no subjects to compare");
    }
    for (i, s) in plan.subjects.iter().enumerate() {
        let f = format!("subjects[{i}]");
        out.number(&format!("{f}.weight"), "subject weight", s.weight, 0.0);
        if let Err(e) = subject_reflectance(plan, &s.subject) {
            let id = match &s.subject {
                SubjectRef::Library(id) | SubjectRef::Custom(id) => id,
            };
            let text = match e {
                PlanError::UnknownId { kind, .. } => format!("unknown {kind} '{id}'"),
                other => other.to_string(),
            };
            out.error(format!("{f}.subject"), text);
        }
    }
}

fn check_camera(plan: &Plan, out: &mut Issues) {
    if let Err(e) = camera_sensitivities(plan, &plan.camera.camera) {
        out.error("camera.camera", e.to_string());
    }
    if let WhiteBalanceSetting::Kelvin(k) = plan.camera.white_balance
        && !(k.is_finite() && (WHITE_BALANCE_RANGE_K.0..=WHITE_BALANCE_RANGE_K.1).contains(&k))
    {
        out.error(
            "camera.white_balance",
            format!(
                "Kelvin white balance {k} is outside {:.0}–{:.0} K",
                WHITE_BALANCE_RANGE_K.0, WHITE_BALANCE_RANGE_K.1
            ),
        );
    }
    if let CameraRef::Library(id) = &plan.camera.camera
        && id.trim().is_empty()
    {
        out.error("camera.camera", "no camera chosen");
    }
}

fn check_kit(plan: &Plan, out: &mut Issues) {
    for (i, id) in plan.kit.gels.iter().enumerate() {
        if library::gel(id).is_none() {
            out.error(format!("kit.gels[{i}]"), format!("unknown gel '{id}'"));
        }
    }
    if usize::from(plan.kit.max_stack) > MAX_GEL_STACK {
        out.warning(
            "kit.max_stack",
            format!(
                "{} gels on one source is more than a plan can hold ({MAX_GEL_STACK})",
                plan.kit.max_stack
            ),
        );
    }
    out.number(
        "kit.max_stops_lost",
        "most stops lost",
        plan.kit.max_stops_lost,
        0.0,
    );
}

fn check_spectrum(
    field: &str,
    what: &str,
    s: &CustomSpectrum,
    out: &mut Issues,
    ids: &mut HashMap<String, usize>,
) {
    if s.id.trim().is_empty() {
        out.error(
            format!("{field}.id"),
            format!("an embedded {what} has no id"),
        );
    } else if ids.insert(s.id.clone(), 0).is_some() {
        out.error(
            format!("{field}.id"),
            format!("embedded {what} id '{}' is used twice", s.id),
        );
    }
    check_samples(
        field,
        what,
        &s.id,
        &s.wavelengths_nm,
        &[("values", &s.values)],
        out,
    );
}

fn check_samples(
    field: &str,
    what: &str,
    id: &str,
    wl: &[f64],
    channels: &[(&str, &[f64])],
    out: &mut Issues,
) {
    let who = format!("embedded {what} '{id}'");
    for (name, values) in channels {
        if values.len() != wl.len() {
            out.error(
                format!("{field}.{name}"),
                format!(
                    "{who}: {} values for {} wavelengths",
                    values.len(),
                    wl.len()
                ),
            );
            return;
        }
        if values.iter().any(|v| !v.is_finite()) {
            out.error(
                format!("{field}.{name}"),
                format!("{who}: a value is not a finite number"),
            );
            return;
        }
    }
    if wl.len() < 2 {
        out.error(
            format!("{field}.wavelengths_nm"),
            format!("{who}: at least two wavelengths are needed"),
        );
        return;
    }
    if wl.iter().any(|v| !v.is_finite()) || wl.windows(2).any(|w| w[1] <= w[0]) {
        out.error(
            format!("{field}.wavelengths_nm"),
            format!("{who}: wavelengths must be finite and strictly increasing"),
        );
        return;
    }
    let (first, last) = (wl[0], wl[wl.len() - 1]);
    if first > lampwright_color::spectrum::VISIBLE_START_LIMIT_NM
        || last < lampwright_color::spectrum::VISIBLE_END_LIMIT_NM
    {
        out.warning(
            format!("{field}.wavelengths_nm"),
            format!(
                "{who}: measured only over {first:.0}–{last:.0} nm; colour needs roughly 380–780 nm"
            ),
        );
    }
}

fn check_custom(plan: &Plan, out: &mut Issues) {
    let c = &plan.custom;
    let mut ids = HashMap::new();
    for (i, s) in c.lamps.iter().enumerate() {
        check_spectrum(&format!("custom.lamps[{i}]"), "lamp", s, out, &mut ids);
    }
    let mut ids = HashMap::new();
    for (i, s) in c.gels.iter().enumerate() {
        let f = format!("custom.gels[{i}]");
        check_spectrum(&f, "gel", s, out, &mut ids);
        if s.values.iter().any(|v| *v > 1.0 + 1e-9 || *v < 0.0) {
            out.warning(
                format!("{f}.values"),
                format!("embedded gel '{}': transmittance outside 0–1", s.id),
            );
        }
    }
    let mut ids = HashMap::new();
    for (i, s) in c.subjects.iter().enumerate() {
        check_spectrum(
            &format!("custom.subjects[{i}].spectrum"),
            "subject",
            &s.spectrum,
            out,
            &mut ids,
        );
    }
    let mut ids = HashSet::new();
    for (i, cam) in c.cameras.iter().enumerate() {
        let f = format!("custom.cameras[{i}]");
        if cam.id.trim().is_empty() {
            out.error(format!("{f}.id"), "an embedded camera has no id");
        } else if !ids.insert(cam.id.as_str()) {
            out.error(
                format!("{f}.id"),
                format!("embedded camera id '{}' is used twice", cam.id),
            );
        }
        check_samples(
            &f,
            "camera",
            &cam.id,
            &cam.wavelengths_nm,
            &[("r", &cam.r), ("g", &cam.g), ("b", &cam.b)],
            out,
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{GelLayer, GelRef, Source, SubjectEntry, Zone, ZoneReach};

    fn fields(issues: &[Issue]) -> Vec<&str> {
        issues.iter().map(|i| i.field.as_str()).collect()
    }

    fn good_plan() -> Plan {
        let mut plan = Plan::default();
        plan.sources.push(Source {
            id: 1,
            name: "Key".into(),
            ..Source::default()
        });
        plan.subjects.push(SubjectEntry::default());
        plan
    }

    #[test]
    fn a_sound_plan_has_no_issues() {
        assert_eq!(validate(&good_plan()), Vec::new());
    }

    #[test]
    fn finds_bad_numbers_unknown_ids_and_duplicates() {
        let mut plan = good_plan();
        plan.sources[0].level_lux = -5.0;
        plan.sources.push(Source {
            id: 1,
            name: "Fill".into(),
            lamp: LampRef::Library("xyz".into()),
            level_lux: f64::NAN,
            gels: vec![GelLayer {
                gel: GelRef::Library("no-gel".into()),
                strength: 1.0,
            }],
            ..Source::default()
        });
        plan.zones.push(Zone {
            id: 1,
            name: "Back wall".into(),
            reach: vec![ZoneReach {
                source: 9,
                level: ZoneLevel::Lux(100.0),
            }],
            weight: 1.0,
        });
        plan.subjects.push(SubjectEntry {
            subject: SubjectRef::Library("unicorn".into()),
            ..SubjectEntry::default()
        });
        let issues = validate(&plan);
        assert!(has_errors(&issues));
        let text: Vec<String> = issues.iter().map(ToString::to_string).collect();
        let joined = text.join("\n");
        for expected in [
            "error: sources[0].level_lux: source 'Key': level (lux) is -5; it must be at least 0",
            "error: sources[1].id: source 'Fill': id 1 is used by another source",
            "error: sources[1].level_lux: source 'Fill': level (lux) is NaN, not a finite number",
            "error: sources[1].lamp: source 'Fill': unknown lamp 'xyz'",
            "error: sources[1].gels[0].gel: source 'Fill': unknown gel 'no-gel'",
            "error: zones[0].reach[0].source: zone 'Back wall': there is no source with id 9",
            "error: subjects[1].subject: unknown subject 'unicorn'",
        ] {
            assert!(
                text.iter().any(|t| t == expected),
                "missing {expected}\n{joined}"
            );
        }
    }

    #[test]
    fn warns_about_ignored_dimmer_and_short_spectra() {
        let mut plan = good_plan();
        plan.sources[0].lamp = LampRef::Library("led-5600-hifi".into());
        plan.sources[0].dimmer = 0.5;
        plan.custom.lamps.push(CustomSpectrum {
            id: "short".into(),
            wavelengths_nm: vec![450.0, 500.0, 650.0],
            values: vec![1.0, 1.0, 1.0],
            ..CustomSpectrum::default()
        });
        let issues = validate(&plan);
        assert!(!has_errors(&issues), "{issues:?}");
        assert_eq!(
            fields(&issues),
            vec!["sources[0].dimmer", "custom.lamps[0].wavelengths_nm"]
        );
    }

    #[test]
    fn embedded_length_mismatch_is_an_error() {
        let mut plan = good_plan();
        plan.custom.gels.push(CustomSpectrum {
            id: "g".into(),
            wavelengths_nm: vec![380.0, 580.0, 780.0],
            values: vec![0.5, 0.5],
            ..CustomSpectrum::default()
        });
        let issues = validate(&plan);
        assert_eq!(issues.len(), 1);
        assert_eq!(
            issues[0].to_string(),
            "error: custom.gels[0].values: embedded gel 'g': 2 values for 3 wavelengths"
        );
    }
}
