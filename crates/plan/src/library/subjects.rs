//! The built-in subject library: skin, hair and lips, food, fabric, foliage,
//! neutrals and products.
//!
//! Every reflectance is invented by the project from smooth shapes (see
//! `scripts/gen_demo_library.py`): skin from a melanin layer over a
//! blood-bearing dermis with the haemoglobin dips near 542 and 577 nm, foods
//! and dyes from logistic cut-ons, leaves with the chlorophyll red edge. They
//! are plausible, not measured; the neutrals are ideal flat cards.

use super::{DemoTable, Provenance};
use crate::error::{PlanError, Result};
use lampwright_color::Reflectance;
use lampwright_color::table::AssetTable;
use std::sync::{LazyLock, OnceLock};

/// One subject of the built-in library.
#[derive(Debug)]
pub struct SubjectItem {
    /// Stable id used in plan files, kebab-case (e.g. "grey-card-18").
    pub id: &'static str,
    /// Display name.
    pub name: &'static str,
    /// Group: "skin", "food", "fabric", "foliage", "neutrals", "products".
    pub group: &'static str,
    /// What it is and why it is in the library.
    pub description: &'static str,
    cache: OnceLock<Result<Reflectance>>,
}

/// The subject groups, in picker order.
pub const SUBJECT_GROUPS: [&str; 6] = ["skin", "food", "fabric", "foliage", "neutrals", "products"];

static DEMO: DemoTable = DemoTable::new("assets/demo/subjects.csv", || {
    AssetTable::parse(
        "subjects.csv",
        include_str!("../../../../assets/demo/subjects.csv"),
    )
});

impl SubjectItem {
    /// Where the data come from: every subject is invented demo data.
    #[must_use]
    pub fn provenance(&self) -> Provenance {
        Provenance::Invented
    }

    /// The reflectance on the 360–830 nm grid (computed once).
    pub fn reflectance(&self) -> Result<&Reflectance> {
        self.cache
            .get_or_init(|| {
                let (values, coverage) = DEMO.grid_column(self.id)?;
                Reflectance::from_grid(values, coverage)
                    .map_err(|e| PlanError::color_in(format!("library subject '{}'", self.id), e))
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
) -> SubjectItem {
    SubjectItem {
        id,
        name,
        group,
        description,
        cache: OnceLock::new(),
    }
}

static SUBJECTS: LazyLock<Vec<SubjectItem>> = LazyLock::new(|| {
    vec![
        entry(
            "skin-light-pink",
            "Skin, light (pink undertone)",
            "skin",
            "Fair skin with a pink, blood-led undertone.",
        ),
        entry(
            "skin-light-neutral",
            "Skin, light (neutral)",
            "skin",
            "Light skin with a neutral undertone.",
        ),
        entry(
            "skin-medium-olive",
            "Skin, medium (olive)",
            "skin",
            "Medium skin with an olive, yellow-green undertone.",
        ),
        entry(
            "skin-medium-golden",
            "Skin, medium (golden)",
            "skin",
            "Medium skin with a golden undertone.",
        ),
        entry(
            "skin-tan",
            "Skin, tan",
            "skin",
            "Tanned or light-brown skin.",
        ),
        entry("skin-brown", "Skin, brown", "skin", "Brown skin."),
        entry(
            "skin-deep-warm",
            "Skin, deep (warm)",
            "skin",
            "Deep skin with a warm undertone.",
        ),
        entry(
            "skin-deep-cool",
            "Skin, deep (cool)",
            "skin",
            "Deep skin with a cool, red-violet undertone.",
        ),
        entry(
            "hair-dark-brown",
            "Hair, dark brown",
            "skin",
            "Dark brown hair: dark, slowly rising towards the red.",
        ),
        entry("hair-blonde", "Hair, blonde", "skin", "Blonde hair."),
        entry(
            "lips",
            "Lips",
            "skin",
            "Natural lips: a red cut-on with the haemoglobin dips.",
        ),
        entry(
            "tomato",
            "Tomato",
            "food",
            "Ripe tomato: a steep red cut-on near 600 nm.",
        ),
        entry(
            "chili-red",
            "Red chili",
            "food",
            "Red chili: deeper red than tomato, little light below 600 nm.",
        ),
        entry("lemon", "Lemon", "food", "Lemon peel yellow."),
        entry("orange-fruit", "Orange (fruit)", "food", "Orange peel."),
        entry(
            "leafy-greens",
            "Leafy greens",
            "food",
            "Lettuce or spinach: chlorophyll green with the red edge.",
        ),
        entry("bread-crust", "Bread crust", "food", "Baked crust brown."),
        entry("coffee", "Coffee", "food", "Black coffee, dark brown."),
        entry(
            "cream",
            "Cream",
            "food",
            "Pale warm white of cream or milk foam.",
        ),
        entry(
            "denim",
            "Denim",
            "fabric",
            "Indigo denim, with the near-infrared rise indigo has.",
        ),
        entry(
            "white-shirt",
            "White shirt",
            "fabric",
            "White cotton without optical brightener.",
        ),
        entry("red-wool", "Red wool", "fabric", "Dyed red wool."),
        entry("black-fabric", "Black fabric", "fabric", "Black cloth."),
        entry("khaki", "Khaki", "fabric", "Muted yellow-brown cloth."),
        entry(
            "foliage",
            "Foliage",
            "foliage",
            "Green leaves: the chlorophyll window near 550 nm and the red edge near 710 nm.",
        ),
        entry(
            "dry-grass",
            "Dry grass",
            "foliage",
            "Straw-coloured dry grass.",
        ),
        entry(
            "grey-card-18",
            "Grey card 18 %",
            "neutrals",
            "Ideal flat 18 % grey: the white-balance and exposure reference.",
        ),
        entry(
            "white-card",
            "White card",
            "neutrals",
            "Ideal flat 90 % white.",
        ),
        entry(
            "black-card",
            "Black card",
            "neutrals",
            "Ideal flat 4 % black.",
        ),
        entry(
            "product-red",
            "Product red",
            "products",
            "Saturated packaging red whose reflectance starts above 610 nm: under sodium light it goes brown.",
        ),
        entry(
            "product-cyan",
            "Product cyan",
            "products",
            "Saturated cyan packaging.",
        ),
        entry(
            "product-purple",
            "Product purple",
            "products",
            "Purple from a blue lobe plus a deep-red lobe above 680 nm: cameras that see further into the red than the eye render it too pink.",
        ),
        entry(
            "product-yellow",
            "Product yellow",
            "products",
            "Saturated yellow packaging.",
        ),
        entry(
            "sky-blue",
            "Sky-blue paint",
            "products",
            "A painted sky blue.",
        ),
        entry(
            "glaze-celadon",
            "Celadon glaze",
            "products",
            "Pale grey-green ceramic glaze.",
        ),
        entry(
            "glaze-cobalt",
            "Cobalt blue glaze",
            "products",
            "Cobalt blue glaze with the far-red lobe cobalt pigments have: another camera trap.",
        ),
        entry(
            "glaze-white",
            "White glaze",
            "products",
            "Warm white ceramic glaze.",
        ),
        entry(
            "glaze-tenmoku",
            "Iron brown-black glaze",
            "products",
            "Dark iron-brown glaze.",
        ),
        entry(
            "glaze-copper-red",
            "Copper red glaze",
            "products",
            "Deep copper-red glaze.",
        ),
    ]
});

/// Every subject of the built-in library, in picker order.
#[must_use]
pub fn subjects() -> &'static [SubjectItem] {
    &SUBJECTS
}

/// A library subject by id.
#[must_use]
pub fn subject(id: &str) -> Option<&'static SubjectItem> {
    SUBJECTS.iter().find(|s| s.id == id)
}

#[cfg(test)]
mod tests {
    use super::*;
    use lampwright_color::RelativeSpd;
    use lampwright_color::illuminant::StandardIlluminant;
    use lampwright_color::observer::Observer;
    use lampwright_color::spaces::Lab;
    use lampwright_color::tristimulus::xyz_of_object;

    fn lab_under(light: &RelativeSpd, id: &str) -> Lab {
        let obs = Observer::cie1931_2deg();
        let white = xyz_of_object(light, &Reflectance::perfect_white(), obs, "white").unwrap();
        let r = subject(id).unwrap().reflectance().unwrap();
        Lab::from_xyz(xyz_of_object(light, r, obs, id).unwrap(), white)
    }

    #[test]
    fn every_subject_loads_in_range_with_a_known_group() {
        let table = DEMO.table().unwrap();
        assert_eq!(table.names.len(), subjects().len());
        for s in subjects() {
            let r = s.reflectance().unwrap_or_else(|e| panic!("{}: {e}", s.id));
            assert!(
                r.values().iter().all(|v| (0.0..=1.0).contains(v)),
                "{}",
                s.id
            );
            assert!(SUBJECT_GROUPS.contains(&s.group), "{}", s.id);
            assert!(table.names.iter().any(|n| n == s.id));
        }
        assert!(
            subjects()
                .iter()
                .filter(|s| s.id.starts_with("skin-"))
                .count()
                >= 6
        );
        assert!(table.source.iter().any(|s| s.contains("INVENTED")));
    }

    #[test]
    fn grey_card_is_flat_18_percent() {
        let r = subject("grey-card-18").unwrap().reflectance().unwrap();
        assert!(r.values().iter().all(|v| (v - 0.18).abs() < 1e-12));
    }

    #[test]
    fn skin_tones_run_from_light_to_deep_and_stay_skin_coloured() {
        let d65 = StandardIlluminant::D65.spd().unwrap();
        let ids = [
            "skin-light-pink",
            "skin-light-neutral",
            "skin-medium-golden",
            "skin-tan",
            "skin-brown",
            "skin-deep-warm",
            "skin-deep-cool",
        ];
        let mut last_l = 100.0;
        for id in ids {
            let lab = lab_under(&d65, id);
            assert!(lab.l < last_l, "{id}: L* {}", lab.l);
            last_l = lab.l;
            // Skin sits in the red-yellow quadrant, hue roughly 35–65°.
            let hue = lab.b.atan2(lab.a).to_degrees();
            assert!((35.0..=65.0).contains(&hue), "{id}: hue {hue}");
        }
    }

    #[test]
    fn product_red_turns_brown_under_sodium() {
        let d65 = StandardIlluminant::D65.spd().unwrap();
        let hps = StandardIlluminant::Hp(1).spd().unwrap();
        let day = lab_under(&d65, "product-red");
        let sodium = lab_under(&hps, "product-red");
        let chroma = |lab: Lab| lab.a.hypot(lab.b);
        assert!(chroma(day) > 50.0);
        // Lab relative to each light's own white (a crude full adaptation):
        // under sodium the red loses much of its chroma and turns towards
        // orange-brown, because almost no sodium light lies above 610 nm.
        let hue = |lab: Lab| lab.b.atan2(lab.a).to_degrees();
        assert!(chroma(sodium) < 0.65 * chroma(day), "{day:?} {sodium:?}");
        assert!(hue(sodium) > hue(day) + 10.0, "{day:?} {sodium:?}");
    }
}
