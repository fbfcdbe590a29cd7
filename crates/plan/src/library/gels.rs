//! The built-in gel and filter library.
//!
//! Every gel is invented by the project and named by what it does (no maker's
//! names or numbers). Curves are stored at full strength in
//! `assets/demo/gels.csv`; a plan applies a fraction f of a gel as `T^f`.

use super::{DemoTable, Provenance};
use crate::error::{PlanError, Result};
use lampwright_color::Transmittance;
use lampwright_color::table::AssetTable;
use std::sync::{LazyLock, OnceLock};

/// One gel or filter of the built-in library (full strength).
#[derive(Debug)]
pub struct GelEntry {
    /// Stable id used in plan files, kebab-case (e.g. "cto-full").
    pub id: &'static str,
    /// Display name, saying what the gel does.
    pub name: &'static str,
    /// Group for pickers: "colour correction", "neutral density", "diffusion", "colour effect".
    pub group: &'static str,
    /// What it is for.
    pub description: &'static str,
    cache: OnceLock<Result<Transmittance>>,
}

static DEMO: DemoTable = DemoTable::new("assets/demo/gels.csv", || {
    AssetTable::parse("gels.csv", include_str!("../../../../assets/demo/gels.csv"))
});

impl GelEntry {
    /// Where the data come from: every gel is invented demo data.
    #[must_use]
    pub fn provenance(&self) -> Provenance {
        Provenance::Invented
    }

    /// The full-strength transmittance on the 360–830 nm grid (computed once).
    pub fn transmittance(&self) -> Result<&Transmittance> {
        self.cache
            .get_or_init(|| {
                let (values, coverage) = DEMO.grid_column(self.id)?;
                Transmittance::from_grid(values, coverage)
                    .map_err(|e| PlanError::color_in(format!("library gel '{}'", self.id), e))
            })
            .as_ref()
            .map_err(Clone::clone)
    }
}

fn entry(
    id: &'static str,
    name: &'static str,
    group: &'static str,
    description: &'static str,
) -> GelEntry {
    GelEntry {
        id,
        name,
        group,
        description,
        cache: OnceLock::new(),
    }
}

const CORRECTION: &str = "colour correction";
const EFFECT: &str = "colour effect";

static GELS: LazyLock<Vec<GelEntry>> = LazyLock::new(|| {
    vec![
        entry(
            "cto-full",
            "CTO full (daylight to tungsten)",
            CORRECTION,
            "Ideal colour-temperature orange: turns a 5500 K source into 3200 K (about +131 mired). Use fractions for smaller warm shifts.",
        ),
        entry(
            "ctb-full",
            "CTB full (tungsten to daylight)",
            CORRECTION,
            "Ideal colour-temperature blue: turns a 3200 K source into 5500 K (about −131 mired). Costs well over a stop.",
        ),
        entry(
            "plus-green-full",
            "Plus green full",
            CORRECTION,
            "Adds green: matches tungsten or daylight to green-heavy fluorescent or LED tubes.",
        ),
        entry(
            "minus-green-full",
            "Minus green full (magenta)",
            CORRECTION,
            "Removes green: pulls a green-spiking tube or LED back towards the Planckian locus.",
        ),
        entry(
            "nd-03",
            "ND 0.3 (one stop)",
            "neutral density",
            "Neutral density 0.3: transmits 10^−0.3 ≈ 50 %, one stop less light, colour unchanged.",
        ),
        entry(
            "nd-06",
            "ND 0.6 (two stops)",
            "neutral density",
            "Neutral density 0.6: transmits 10^−0.6 ≈ 25 %, two stops less light.",
        ),
        entry(
            "nd-09",
            "ND 0.9 (three stops)",
            "neutral density",
            "Neutral density 0.9: transmits 10^−0.9 ≈ 12.6 %, three stops less light.",
        ),
        entry(
            "diffusion-neutral",
            "Neutral diffusion",
            "diffusion",
            "Softens the light; only its 10 % loss is modelled here, not the spread.",
        ),
        entry(
            "effect-deep-blue",
            "Deep blue (effect)",
            EFFECT,
            "Saturated blue for night looks and backgrounds, with the far-red leak many blue dyes have.",
        ),
        entry(
            "effect-amber",
            "Amber (effect)",
            EFFECT,
            "Warm amber for sunset and firelight looks.",
        ),
        entry(
            "effect-red",
            "Red (effect)",
            EFFECT,
            "Saturated red for warning-light and club looks.",
        ),
        entry(
            "effect-teal",
            "Teal (effect)",
            EFFECT,
            "Blue-green for backgrounds and cool night looks.",
        ),
        entry(
            "effect-lavender",
            "Lavender (effect)",
            EFFECT,
            "Pale violet that holds back green; flattering on backgrounds and hair.",
        ),
        entry(
            "effect-rose",
            "Rose (effect)",
            EFFECT,
            "Warm pink for a soft, romantic key or background.",
        ),
    ]
});

/// Every gel of the built-in library, in picker order.
#[must_use]
pub fn gels() -> &'static [GelEntry] {
    &GELS
}

/// A library gel by id.
#[must_use]
pub fn gel(id: &str) -> Option<&'static GelEntry> {
    GELS.iter().find(|g| g.id == id)
}

#[cfg(test)]
mod tests {
    use super::*;
    use lampwright_color::cct::{CctMethod, cct_duv_of_spd, mired};
    use lampwright_color::illuminant::planckian;
    use lampwright_color::observer::Observer;
    use lampwright_color::tristimulus::xyz_sums;

    fn cct_through(t_k: f64, gel_id: &str, strength: f64) -> f64 {
        let t = gel(gel_id)
            .unwrap()
            .transmittance()
            .unwrap()
            .strength(strength);
        let spd = &planckian(t_k).unwrap() * &t;
        cct_duv_of_spd(&spd, CctMethod::Ohno2014).unwrap().cct_k
    }

    #[test]
    fn every_gel_loads_within_zero_and_one() {
        let table = DEMO.table().unwrap();
        assert_eq!(table.names.len(), gels().len());
        for g in gels() {
            let t = g
                .transmittance()
                .unwrap_or_else(|e| panic!("{}: {e}", g.id));
            assert!(
                t.values().iter().all(|v| (0.0..=1.0).contains(v)),
                "{}",
                g.id
            );
            assert!(g.provenance().is_invented());
        }
        assert!(table.source.iter().any(|s| s.contains("INVENTED")));
    }

    #[test]
    fn conversion_gels_convert_between_5500_and_3200_k() {
        // Common practice: full CTO turns 5500 K into 3200 K and full CTB the reverse.
        assert!((cct_through(5500.0, "cto-full", 1.0) - 3200.0).abs() < 5.0);
        assert!((cct_through(3200.0, "ctb-full", 1.0) - 5500.0).abs() < 10.0);
    }

    #[test]
    fn half_strength_gives_about_half_the_mired_shift() {
        // Wien's approximation makes the Planck ratio exp(−c2/λ·Δ(1/T)), so T^f
        // shifts the mired value by f·Δ; Planck's law departs slightly from Wien.
        let full = mired(3200.0).unwrap() - mired(5500.0).unwrap();
        let half = mired(cct_through(5500.0, "cto-full", 0.5)).unwrap() - mired(5500.0).unwrap();
        assert!((half / full - 0.5).abs() < 0.02, "{half} vs {full}");
    }

    #[test]
    fn nd_03_costs_one_stop() {
        // Common practice: ND 0.3 is one stop (10^−0.3 ≈ 0.501).
        let obs = Observer::cie1931_2deg();
        let light = planckian(3200.0).unwrap();
        let t = gel("nd-03").unwrap().transmittance().unwrap();
        let before = xyz_sums(light.values(), obs).y;
        let after = xyz_sums((&light * t).values(), obs).y;
        let stops = (before / after).log2();
        assert!((stops - 1.0).abs() < 0.01, "{stops}");
    }

    #[test]
    fn minus_green_moves_a_green_tube_towards_the_locus() {
        let tube = super::super::lamp("led-tube-cheap")
            .unwrap()
            .spectrum()
            .unwrap();
        let before = cct_duv_of_spd(tube, CctMethod::Ohno2014).unwrap().duv;
        let t = gel("minus-green-full").unwrap().transmittance().unwrap();
        let after = cct_duv_of_spd(&(tube * t), CctMethod::Ohno2014)
            .unwrap()
            .duv;
        assert!(before > 0.008, "{before}");
        assert!(after < before - 0.006, "{before} -> {after}");
    }
}
