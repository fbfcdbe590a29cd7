//! The readout strip: the figures of the light at the subject, with units
//! and plain meaning, and one line per zone.

use super::format;
use super::theme;
use super::widgets::{self, PanelCtx};
use egui::Ui;
use lampwright_plan::{Evaluation, Plan, SourceRole};

/// Key-to-fill ratio in stops: how far the key sits above the brightest lit
/// fill (from the evaluation's levels after gels). When the plan names no
/// fill, the brightest lit ambient source stands in, as it fills the shadows.
#[must_use]
pub fn key_fill_stops(plan: &Plan, eval: &Evaluation) -> Option<f64> {
    let brightest = |role: SourceRole| {
        plan.sources
            .iter()
            .filter(|s| s.role == role && plan.is_lit(s))
            .filter_map(|s| {
                eval.sources
                    .iter()
                    .find(|f| f.source_id == s.id)?
                    .stops_from_key
            })
            .filter(|s| s.is_finite())
            .reduce(f64::max)
    };
    brightest(SourceRole::Fill)
        .or_else(|| brightest(SourceRole::Ambient))
        .map(|s| -s)
}

/// Draw the strip.
pub fn ui(ui: &mut Ui, cx: &mut PanelCtx<'_>) {
    let Some(eval) = cx.eval else {
        ui.label(theme::caption(
            "No figures yet: the plan has not been evaluated.",
        ));
        return;
    };
    if cx.stale {
        ui.multiply_opacity(0.45);
    }
    let light = &eval.light;
    ui.horizontal_wrapped(|ui| {
        widgets::readout(ui, "CCT", &format::cct(light.cct_k), "Correlated colour temperature (Ohno 2014), to 10 K");
        let duv_meaning = format::duv_meaning(light.duv);
        widgets::readout(
            ui,
            &format!("Duv · {duv_meaning}"),
            &format::duv(light.duv),
            "Distance from the blackbody line in CIE 1960 uv: positive is green, negative is magenta",
        );
        let mired = light.mired.map_or_else(|| format::DASH.to_owned(), |m| format!("{m:.0} mired"));
        widgets::readout(ui, "Mired", &mired, "1 000 000 / CCT; gel shifts add in mired");
        widgets::readout(ui, "Illuminance", &format::lux(light.illuminance_lux), "At the subject, all lit sources");
        let ev = light.ev100.map_or_else(|| format::DASH.to_owned(), |ev| format!("{ev:.1} EV"));
        widgets::readout(ui, "EV at ISO 100", &ev, "Incident exposure value (ISO 2720 meter constant)");
        let kf = key_fill_stops(cx.plan, eval).map_or_else(|| format::DASH.to_owned(), |s| format!("{s:.1} stops"));
        widgets::readout(ui, "Key : fill", &kf, "How many stops the key is above the brightest fill (or, with no fill, the ambient light)");
        let r9 = light.cri_r.map(|r| r[8]);
        widgets::readout(
            ui,
            "CRI Ra · R9",
            &format!("{} · {}", format::integer(light.cri_ra), format::integer(r9)),
            "CIE 13.3-1995 general index and the saturated-red index R9",
        );
        widgets::readout(
            ui,
            "TM-30 Rf · Rg",
            &format!("{} · {}", format::integer(light.tm30_rf), format::integer(light.tm30_rg)),
            "ANSI/IES TM-30-20 fidelity and gamut indices",
        );
        let ssi = light.ssi.map_or_else(|| format::DASH.to_owned(), |s| s.to_string());
        widgets::readout(ui, "SSI", &ssi, "Spectral Similarity Index (Academy), 0–100 against the default reference");
    });
    if eval.zones.len() > 1 {
        ui.horizontal_wrapped(|ui| {
            ui.label(theme::caption("Zones"));
            for zone in &eval.zones {
                let mired = zone
                    .mired_from_white_balance
                    .map(|m| format!(", {} mired vs WB", format::signed(m, 0)))
                    .unwrap_or_default();
                ui.label(format!(
                    "{}: {} ({}), {}{mired}",
                    zone.name,
                    format::lux(zone.light.illuminance_lux),
                    format::stops(zone.stops_from_main),
                    format::cct(zone.light.cct_k),
                ));
                ui.label(theme::caption("|"));
            }
        });
    }
    if let Some(first) = eval.warnings.first() {
        // One line, so the swatches keep the room; hover for every note.
        let more = eval.warnings.len() - 1;
        let text = if more > 0 {
            format!("{first}   (+{more} more: hover)")
        } else {
            first.clone()
        };
        ui.add(egui::Label::new(egui::RichText::new(text).color(theme::WARNING)).truncate())
            .on_hover_ui(|ui| {
                for warning in &eval.warnings {
                    ui.label(warning);
                }
            });
    }
}
