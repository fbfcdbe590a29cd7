//! The invented demo lamps and conversion gels against colour-science 0.4.7
//! (`tests/fixtures/library_colour047.csv`, written by
//! `scripts/gen_fixtures_library.py` from the same 1 nm tables).
//!
//! Tolerances:
//! - CCT 0.5 K and Duv 2·10⁻⁵: both sides sum the same 1 nm data over
//!   360–830 nm; Lampwright's Ohno (2014) with its 0.1 % cascade and
//!   colour-science's Ohno 2013 agree to well within these.
//! - Ra and R9 0.3: colour-science reshapes to 360–780 nm and finds the
//!   reference CCT by Robertson (1968); Lampwright sums 360–830 nm and uses Ohno.

use lampwright_color::cct::{CctMethod, cct_duv_of_spd};
use lampwright_color::cri::cri_cie133;
use lampwright_color::illuminant::planckian;
use lampwright_plan::library::{gel, lamp};

const TOL_CCT_K: f64 = 0.5;
const TOL_DUV: f64 = 2e-5;
const TOL_CRI: f64 = 0.3;

struct Row {
    id: String,
    cct_k: f64,
    duv: f64,
    ra: Option<f64>,
    r9: Option<f64>,
}

fn rows() -> Vec<Row> {
    let text = include_str!("fixtures/library_colour047.csv");
    let mut lines = text.lines().filter(|l| !l.starts_with('#'));
    assert_eq!(lines.next(), Some("id,cct_k,duv,ra,r9"));
    lines
        .map(|l| {
            let c: Vec<&str> = l.split(',').collect();
            let num = |s: &str| s.parse::<f64>().expect("a number in the fixture");
            let opt = |s: &str| (!s.is_empty()).then(|| num(s));
            Row {
                id: c[0].to_string(),
                cct_k: num(c[1]),
                duv: num(c[2]),
                ra: opt(c[3]),
                r9: opt(c[4]),
            }
        })
        .collect()
}

#[test]
fn invented_lamps_match_colour_science() {
    let mut n = 0;
    for row in rows().iter().filter(|r| !r.id.contains('@')) {
        let spd = lamp(&row.id).unwrap().spectrum().unwrap();
        let c = cct_duv_of_spd(spd, CctMethod::Ohno2014).unwrap();
        assert!(
            (c.cct_k - row.cct_k).abs() < TOL_CCT_K,
            "{}: CCT {} vs {}",
            row.id,
            c.cct_k,
            row.cct_k
        );
        assert!(
            (c.duv - row.duv).abs() < TOL_DUV,
            "{}: Duv {} vs {}",
            row.id,
            c.duv,
            row.duv
        );
        let cri = cri_cie133(spd).unwrap();
        let (ra, r9) = (row.ra.unwrap(), row.r9.unwrap());
        assert!(
            (cri.ra - ra).abs() < TOL_CRI,
            "{}: Ra {} vs {ra}",
            row.id,
            cri.ra
        );
        assert!(
            (cri.r[8] - r9).abs() < TOL_CRI,
            "{}: R9 {} vs {r9}",
            row.id,
            cri.r[8]
        );
        n += 1;
    }
    assert_eq!(n, 13, "every invented lamp has a reference row");
}

#[test]
fn the_library_descriptions_hold() {
    // What the lamp descriptions promise, checked on colour-science's figures.
    let all = rows();
    let get = |id: &str| all.iter().find(|r| r.id == id).unwrap();
    for cct in ["2700", "3200", "4000", "5600"] {
        let budget = get(&format!("led-{cct}-budget"));
        let hifi = get(&format!("led-{cct}-hifi"));
        assert!(
            (78.0..=84.0).contains(&budget.ra.unwrap()),
            "budget {cct}: Ra about 80"
        );
        assert!(budget.r9.unwrap() < 20.0, "budget {cct}: weak R9");
        assert!(hifi.ra.unwrap() >= 94.0, "high fidelity {cct}: Ra about 95");
        assert!((budget.cct_k - cct.parse::<f64>().unwrap()).abs() < 1.0);
    }
    assert!(
        get("led-tube-cheap").duv > 0.01,
        "the tube sits well above the locus"
    );
}

#[test]
fn conversion_gels_match_colour_science() {
    for row in rows().iter().filter(|r| r.id.contains('@')) {
        let (gel_id, source) = row.id.split_once('@').unwrap();
        let t = gel(gel_id).unwrap().transmittance().unwrap();
        let light = &planckian(source.parse().unwrap()).unwrap() * t;
        let c = cct_duv_of_spd(&light, CctMethod::Ohno2014).unwrap();
        assert!(
            (c.cct_k - row.cct_k).abs() < TOL_CCT_K,
            "{}: CCT {} vs {}",
            row.id,
            c.cct_k,
            row.cct_k
        );
        assert!(
            (c.duv - row.duv).abs() < TOL_DUV,
            "{}: Duv {} vs {}",
            row.id,
            c.duv,
            row.duv
        );
    }
}
