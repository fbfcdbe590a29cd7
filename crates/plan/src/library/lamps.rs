//! The built-in lamp library.
//!
//! Standard spectra (CIE tables, Planckian radiators, CIE daylight) sit beside
//! lamps the project invented for the demo (`assets/demo/lamps.csv`, made by
//! `scripts/gen_demo_library.py`). Tungsten entries carry their filament
//! temperature so that a dimmer can shift their colour.

use super::{DemoTable, Provenance};
use crate::error::{PlanError, Result};
use lampwright_color::RelativeSpd;
use lampwright_color::illuminant::{StandardIlluminant, daylight, planckian};
use lampwright_color::table::AssetTable;
use std::sync::{LazyLock, OnceLock};

/// How a library lamp's spectrum is made.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum LampSpectrum {
    /// A CIE table (or CIE illuminant A's formula).
    Standard(StandardIlluminant),
    /// A Planckian radiator at a temperature, K (Planck's law).
    Planckian {
        /// Temperature, K.
        cct_k: f64,
    },
    /// CIE daylight at a correlated colour temperature, K (CIE 15:2018 §4.1.2).
    Daylight {
        /// Correlated colour temperature, K.
        cct_k: f64,
    },
    /// An invented column of `assets/demo/lamps.csv`, named by the entry's id.
    Demo,
}

/// One lamp of the built-in library.
#[derive(Debug)]
pub struct LampEntry {
    /// Stable id used in plan files, kebab-case (e.g. "tungsten-3200").
    pub id: &'static str,
    /// Display name.
    pub name: &'static str,
    /// Group for pickers: "tungsten", "daylight", "fluorescent", "discharge", "street", "led".
    pub group: &'static str,
    /// What it is and how it behaves, one or two sentences.
    pub description: &'static str,
    /// How the spectrum is made.
    pub spectrum: LampSpectrum,
    /// Filament temperature at full voltage, K, for tungsten lamps (enables the
    /// dimmer's colour shift); `None` for every other lamp.
    pub filament_cct_k: Option<f64>,
    cache: OnceLock<Result<RelativeSpd>>,
}

static DEMO: DemoTable = DemoTable::new("assets/demo/lamps.csv", || {
    AssetTable::parse(
        "lamps.csv",
        include_str!("../../../../assets/demo/lamps.csv"),
    )
});

impl LampEntry {
    /// Where the data come from.
    #[must_use]
    pub fn provenance(&self) -> Provenance {
        match self.spectrum {
            LampSpectrum::Standard(StandardIlluminant::A) => {
                Provenance::Standard("CIE 15:2018 §4.1, illuminant A (formula)")
            }
            LampSpectrum::Standard(
                StandardIlluminant::D50
                | StandardIlluminant::D55
                | StandardIlluminant::D65
                | StandardIlluminant::D75,
            ) => Provenance::Standard(
                "CIE 15:2018 Table 5, D illuminants (via colour-science 0.4.7)",
            ),
            LampSpectrum::Standard(_) => Provenance::Standard(
                "CIE 15:2018 Tables 10–13, F/HP/LED illuminants (via colour-science 0.4.7)",
            ),
            LampSpectrum::Planckian { .. } => {
                Provenance::Standard("Planck's law, c2 = 1.4388e-2 m·K (CIE 15:2018)")
            }
            LampSpectrum::Daylight { .. } => {
                Provenance::Standard("CIE 15:2018 §4.1.2, CIE daylight (S0, S1, S2)")
            }
            LampSpectrum::Demo => Provenance::Invented,
        }
    }

    /// The relative spectral power on the 360–830 nm grid (computed once).
    pub fn spectrum(&self) -> Result<&RelativeSpd> {
        self.cache
            .get_or_init(|| self.compute())
            .as_ref()
            .map_err(Clone::clone)
    }

    fn compute(&self) -> Result<RelativeSpd> {
        let what = || format!("library lamp '{}'", self.id);
        match self.spectrum {
            LampSpectrum::Standard(s) => s.spd().map_err(|e| PlanError::color_in(what(), e)),
            LampSpectrum::Planckian { cct_k } => {
                planckian(cct_k).map_err(|e| PlanError::color_in(what(), e))
            }
            LampSpectrum::Daylight { cct_k } => {
                daylight(cct_k).map_err(|e| PlanError::color_in(what(), e))
            }
            LampSpectrum::Demo => {
                let (values, coverage) = DEMO.grid_column(self.id)?;
                RelativeSpd::from_grid(values, coverage).map_err(|e| PlanError::color_in(what(), e))
            }
        }
    }
}

fn entry(
    id: &'static str,
    name: &'static str,
    group: &'static str,
    description: &'static str,
    spectrum: LampSpectrum,
    filament_cct_k: Option<f64>,
) -> LampEntry {
    LampEntry {
        id,
        name,
        group,
        description,
        spectrum,
        filament_cct_k,
        cache: OnceLock::new(),
    }
}

static LAMPS: LazyLock<Vec<LampEntry>> = LazyLock::new(|| {
    use LampSpectrum::{Daylight, Demo, Planckian, Standard};
    use StandardIlluminant as S;
    vec![
        entry(
            "tungsten-3200",
            "Tungsten halogen 3200 K",
            "tungsten",
            "Film and studio tungsten halogen lamp, modelled as a Planckian radiator at 3200 K. Dimming lowers its colour temperature.",
            Planckian { cct_k: 3200.0 },
            Some(3200.0),
        ),
        entry(
            "incandescent-2700",
            "Household incandescent 2700 K",
            "tungsten",
            "Ordinary household filament bulb, modelled as a Planckian radiator at 2700 K. Dimming lowers its colour temperature.",
            Planckian { cct_k: 2700.0 },
            Some(2700.0),
        ),
        entry(
            "cie-a",
            "CIE illuminant A (2856 K)",
            "tungsten",
            "The CIE's standard tungsten illuminant. Dimming lowers its colour temperature.",
            Standard(S::A),
            Some(2856.0),
        ),
        entry(
            "daylight-d55",
            "Daylight D55",
            "daylight",
            "CIE illuminant D55: mid-morning or mid-afternoon sun and sky, about 5500 K.",
            Standard(S::D55),
            None,
        ),
        entry(
            "daylight-d65",
            "Daylight D65",
            "daylight",
            "CIE illuminant D65: average north-sky daylight, about 6500 K.",
            Standard(S::D65),
            None,
        ),
        entry(
            "daylight-shade",
            "Overcast or shade (7500 K)",
            "daylight",
            "CIE daylight at 7500 K, the bluish light of open shade or an overcast sky.",
            Daylight { cct_k: 7500.0 },
            None,
        ),
        entry(
            "discharge-daylight",
            "Daylight-balanced discharge lamp",
            "discharge",
            "Invented medium-arc metal-halide style lamp near 5650 K: a hot continuum with many narrow metal lines. High fidelity, but its lines can trip cameras.",
            Demo,
            None,
        ),
        entry(
            "metal-halide-4000",
            "Metal halide 4000 K (CIE HP4)",
            "discharge",
            "CIE HP4 high-pressure discharge table, about 4000 K, Ra about 76 (a metal-halide type).",
            Standard(S::Hp(4)),
            None,
        ),
        entry(
            "fluorescent-cool-white",
            "Cool-white fluorescent (CIE F2)",
            "fluorescent",
            "CIE F2 halophosphate tube, about 4230 K: the classic office tube, weak in deep red.",
            Standard(S::F(2)),
            None,
        ),
        entry(
            "fluorescent-triphosphor",
            "Triphosphor fluorescent (CIE F11)",
            "fluorescent",
            "CIE F11 narrow-band triphosphor tube, about 4000 K: three peaks that make some colours pop and others shift.",
            Standard(S::F(11)),
            None,
        ),
        entry(
            "hps-street",
            "High-pressure sodium street light (CIE HP1)",
            "street",
            "CIE HP1 standard high-pressure sodium, about 1960 K: almost all its light is near 589 nm, so reds and greens collapse to orange-brown.",
            Standard(S::Hp(1)),
            None,
        ),
        entry(
            "hps-improved",
            "Colour-improved sodium (CIE HP2)",
            "street",
            "CIE HP2 colour-improved high-pressure sodium, about 2500 K, Ra about 83.",
            Standard(S::Hp(2)),
            None,
        ),
        entry(
            "mercury-street",
            "Mercury-vapour street light",
            "street",
            "Invented clear mercury-vapour lamp: the mercury lines at 405, 436, 546 and 578 nm over a weak continuum. Blue-green, almost no red.",
            Demo,
            None,
        ),
        entry(
            "led-2700-budget",
            "LED 2700 K, budget",
            "led",
            "Invented blue-pumped phosphor LED at 2700 K, about Ra 80 with a weak deep red (low R9).",
            Demo,
            None,
        ),
        entry(
            "led-3200-budget",
            "LED 3200 K, budget",
            "led",
            "Invented blue-pumped phosphor LED at 3200 K, about Ra 80 with a weak deep red (low R9).",
            Demo,
            None,
        ),
        entry(
            "led-4000-budget",
            "LED 4000 K, budget",
            "led",
            "Invented blue-pumped phosphor LED at 4000 K, about Ra 80 with a weak deep red (low R9).",
            Demo,
            None,
        ),
        entry(
            "led-5600-budget",
            "LED 5600 K, budget",
            "led",
            "Invented blue-pumped phosphor LED at 5600 K, about Ra 80 with a weak deep red (low R9).",
            Demo,
            None,
        ),
        entry(
            "led-2700-hifi",
            "LED 2700 K, high fidelity",
            "led",
            "Invented phosphor LED with green and deep-red phosphors at 2700 K, about Ra 95.",
            Demo,
            None,
        ),
        entry(
            "led-3200-hifi",
            "LED 3200 K, high fidelity",
            "led",
            "Invented phosphor LED with green and deep-red phosphors at 3200 K, about Ra 95.",
            Demo,
            None,
        ),
        entry(
            "led-4000-hifi",
            "LED 4000 K, high fidelity",
            "led",
            "Invented phosphor LED with green and deep-red phosphors at 4000 K, about Ra 95.",
            Demo,
            None,
        ),
        entry(
            "led-5600-hifi",
            "LED 5600 K, high fidelity",
            "led",
            "Invented phosphor LED with green and deep-red phosphors at 5600 K, about Ra 95.",
            Demo,
            None,
        ),
        entry(
            "led-tube-cheap",
            "Cheap LED tube (green spike)",
            "led",
            "Invented cool-white LED tube near 5100 K with a narrow green spike: it sits well above the Planckian locus (Duv about +0.012), the green cast that calls for minus green.",
            Demo,
            None,
        ),
        entry(
            "led-rgb-panel",
            "RGB LED panel (white mix)",
            "led",
            "Invented three-colour LED panel mixed to 5600 K: a white that looks right but renders colours poorly.",
            Demo,
            None,
        ),
        entry(
            "led-rgbw-panel",
            "RGBW LED panel (white mix)",
            "led",
            "Invented RGB panel with an added phosphor-white channel, mixed to 5600 K.",
            Demo,
            None,
        ),
        entry(
            "cie-led-b3",
            "Phosphor LED (CIE LED-B3)",
            "led",
            "CIE LED-B3 blue-pumped phosphor LED table, about 4100 K.",
            Standard(S::LedB(3)),
            None,
        ),
        entry(
            "cie-led-v1",
            "Violet-pumped LED (CIE LED-V1)",
            "led",
            "CIE LED-V1 violet-pumped phosphor LED table, about 2720 K, high fidelity.",
            Standard(S::LedV1),
            None,
        ),
    ]
});

/// Every lamp of the built-in library, in picker order.
#[must_use]
pub fn lamps() -> &'static [LampEntry] {
    &LAMPS
}

/// A library lamp by id.
#[must_use]
pub fn lamp(id: &str) -> Option<&'static LampEntry> {
    LAMPS.iter().find(|l| l.id == id)
}

#[cfg(test)]
mod tests {
    use super::*;
    use lampwright_color::cct::{CctMethod, cct_duv_of_spd};

    #[test]
    fn every_lamp_loads_and_is_colorimetric() {
        for l in lamps() {
            let spd = l.spectrum().unwrap_or_else(|e| panic!("{}: {e}", l.id));
            spd.check_colorimetric(l.id).unwrap();
            // Sprague interpolation of the spiky 5 nm CIE tables rings a little
            // below zero next to the lines; invented tables are on the grid already.
            let floor = if l.spectrum == LampSpectrum::Demo {
                0.0
            } else {
                -0.02 * spd.max_value()
            };
            assert!(spd.values().iter().all(|v| *v >= floor), "{}", l.id);
        }
    }

    #[test]
    fn ids_are_unique_kebab_case() {
        let mut ids: Vec<_> = lamps().iter().map(|l| l.id).collect();
        for id in &ids {
            assert!(
                id.chars()
                    .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-'),
                "{id}"
            );
        }
        let n = ids.len();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), n);
        assert!(n >= 20);
    }

    #[test]
    fn every_demo_column_has_an_entry_and_back() {
        let table = DEMO.table().unwrap();
        for name in &table.names {
            let l = lamp(name).unwrap_or_else(|| panic!("column {name} has no entry"));
            assert_eq!(l.spectrum, LampSpectrum::Demo);
        }
        for l in lamps().iter().filter(|l| l.spectrum == LampSpectrum::Demo) {
            assert!(
                table.names.iter().any(|n| n == l.id),
                "{} has no column",
                l.id
            );
            assert!(l.provenance().is_invented());
            assert!(l.description.starts_with("Invented"), "{}", l.id);
        }
        assert!(table.source.iter().any(|s| s.contains("INVENTED")));
    }

    #[test]
    fn tungsten_lamps_sit_at_their_filament_temperature() {
        // A Planckian radiator's CCT is its temperature (definition of CCT,
        // CIE 15:2018 §9.5); CIE A is 2856 K (CIE 15:2018 §4.1).
        for l in lamps().iter().filter(|l| l.filament_cct_k.is_some()) {
            let t = l.filament_cct_k.unwrap();
            let c = cct_duv_of_spd(l.spectrum().unwrap(), CctMethod::Ohno2014).unwrap();
            assert!((c.cct_k - t).abs() < 2.0, "{}: {} K", l.id, c.cct_k);
            assert!(c.duv.abs() < 2e-4, "{}", l.id);
        }
    }
}
