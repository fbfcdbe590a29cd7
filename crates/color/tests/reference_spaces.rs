//! Reference tests of the colour-space layer against committed fixtures.
//!
//! Fixtures live in `tests/fixtures/`; each names its source in its header.
//! Those ending in `_colour047` were written by `scripts/gen_fixtures_spaces.py`
//! with colour-science 0.4.7. Tolerances are per quantity and stated at the top.

use lampwright_color::Xyz;
use lampwright_color::spaces::{
    Lab, Luv, Uv1960, UvPrime, Xyy, uv_prime_from_xyz, uv1960_from_xyz,
};
use std::collections::HashMap;

/// Chromaticity coordinates (x, y, u, v, u′, v′): same formulas, double precision.
const TOL_CHROMATICITY: f64 = 1e-12;
/// CIELAB / CIELUV components and chroma: same formulas, double precision.
const TOL_LAB: f64 = 1e-9;
/// Hue angle in degrees; loosened for near-neutral samples where atan2 is ill-conditioned.
const TOL_HUE_DEG: f64 = 1e-7;

/// One fixture row, by column name.
struct Row(HashMap<String, String>);

impl Row {
    fn f(&self, key: &str) -> f64 {
        self.0
            .get(key)
            .unwrap_or_else(|| panic!("no column {key}"))
            .parse()
            .unwrap_or_else(|e| panic!("column {key}: {e}"))
    }
    fn s(&self, key: &str) -> &str {
        self.0.get(key).unwrap_or_else(|| panic!("no column {key}"))
    }
    fn xyz(&self, x: &str, y: &str, z: &str) -> Xyz {
        Xyz::new(self.f(x), self.f(y), self.f(z))
    }
}

fn fixture(name: &str) -> Vec<Row> {
    let path = format!("{}/tests/fixtures/{name}", env!("CARGO_MANIFEST_DIR"));
    let mut reader = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .from_path(&path)
        .unwrap_or_else(|e| panic!("{path}: {e}"));
    let header: Vec<String> = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    let rows: Vec<Row> = reader
        .records()
        .map(|r| {
            let r = r.unwrap();
            Row(header
                .iter()
                .cloned()
                .zip(r.iter().map(str::to_string))
                .collect())
        })
        .collect();
    assert!(!rows.is_empty(), "{name} is empty");
    rows
}

fn close(what: &str, got: f64, want: f64, tol: f64) {
    assert!(
        (got - want).abs() <= tol,
        "{what}: got {got}, want {want} (tol {tol})"
    );
}

#[test]
fn spaces_match_colour_science() {
    for (i, row) in fixture("spaces_colour047.csv").iter().enumerate() {
        let white = row.xyz("Xw", "Yw", "Zw");
        let xyz = row.xyz("X", "Y", "Z");
        let tag = format!("row {i} ({})", row.s("white"));

        let xyy = Xyy::from_xyz(xyz, white);
        close(&format!("{tag} x"), xyy.x, row.f("x"), TOL_CHROMATICITY);
        close(&format!("{tag} y"), xyy.y, row.f("y"), TOL_CHROMATICITY);
        close(
            &format!("{tag} Y"),
            xyy.big_y,
            row.f("Yxyy"),
            TOL_CHROMATICITY,
        );

        let uv = Uv1960::from_xyz(xyz);
        assert_eq!(uv1960_from_xyz(xyz), Some((uv.u, uv.v)));
        close(&format!("{tag} u"), uv.u, row.f("u1960"), TOL_CHROMATICITY);
        close(&format!("{tag} v"), uv.v, row.f("v1960"), TOL_CHROMATICITY);
        let up = UvPrime::from_xyz(xyz);
        assert_eq!(uv_prime_from_xyz(xyz), Some((up.u, up.v)));
        close(
            &format!("{tag} u'"),
            up.u,
            row.f("u_prime"),
            TOL_CHROMATICITY,
        );
        close(
            &format!("{tag} v'"),
            up.v,
            row.f("v_prime"),
            TOL_CHROMATICITY,
        );

        let lab = Lab::from_xyz(xyz, white);
        close(&format!("{tag} L*"), lab.l, row.f("L"), TOL_LAB);
        close(&format!("{tag} a*"), lab.a, row.f("a"), TOL_LAB);
        close(&format!("{tag} b*"), lab.b, row.f("b"), TOL_LAB);

        let luv = Luv::from_xyz(xyz, white);
        close(&format!("{tag} Luv L*"), luv.l, row.f("Luv_L"), TOL_LAB);
        close(&format!("{tag} u*"), luv.u, row.f("Luv_u"), TOL_LAB);
        close(&format!("{tag} v*"), luv.v, row.f("Luv_v"), TOL_LAB);

        let lch = lab.to_lch();
        close(&format!("{tag} C*"), lch.c, row.f("C"), TOL_LAB);
        close(&format!("{tag} h"), lch.h_deg, row.f("h"), TOL_HUE_DEG);
    }
}
