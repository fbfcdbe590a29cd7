//! Camera spectral sensitivities: the three channel curves of a sensor behind
//! its colour filter array and IR-cut filter.
//!
//! Sources of curves: the built-in demo cameras (invented by the project, see
//! `assets/demo/cameras.csv` and `scripts/gen_demo_cameras.py`), the ideal
//! colorimetric camera (an exact linear mix of the CIE 1931 colour-matching
//! functions), or a user's spectral table read with the colour crate's importer.

use crate::error::{CameraError, Result};
use lampwright_color::import::{ImportedTable, SpectrumKind, import_path};
use lampwright_color::observer::Observer;
use lampwright_color::table::AssetTable;
use lampwright_color::{Coverage, GRID_LEN, Sensitivity};
use std::hash::{Hash, Hasher};
use std::sync::{Arc, LazyLock};

/// Spectral sensitivities of the three channels of one camera.
#[derive(Debug, Clone, PartialEq)]
pub struct CameraSensitivities {
    /// Name shown to the user.
    pub name: String,
    /// Red channel.
    pub r: Sensitivity,
    /// Green channel.
    pub g: Sensitivity,
    /// Blue channel.
    pub b: Sensitivity,
}

/// `[r̄, ḡ, b̄] = M · [x̄, ȳ, z̄]` for the ideal colorimetric camera (rows: R, G, B).
///
/// Chosen by the project so that every curve is non-negative on 360–830 nm and
/// the channels peak where a sensor's do (about 595, 555 and 446 nm): red takes
/// x̄ with its short-wavelength lobe cancelled by part of z̄. Determinant 1.
pub const COLORIMETRIC_RGB_FROM_CMF: [[f64; 3]; 3] =
    [[1.0, 0.3, -0.16], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]];

/// Name of the ideal colorimetric camera.
pub const COLORIMETRIC_NAME: &str = "Ideal colorimetric camera";

const DEMO_CSV: &str = include_str!("../../../assets/demo/cameras.csv");

static DEMO_CAMERAS: LazyLock<Result<Vec<CameraSensitivities>>> =
    LazyLock::new(|| parse_demo_table("cameras.csv", DEMO_CSV));

impl CameraSensitivities {
    /// A camera from three channel curves.
    ///
    /// Refuses channels that cannot support colour computation (non-finite,
    /// zero everywhere, or measured over less than roughly 380–780 nm).
    pub fn new(
        name: impl Into<String>,
        r: Sensitivity,
        g: Sensitivity,
        b: Sensitivity,
    ) -> Result<Self> {
        let name = name.into();
        for (label, ch) in [("red", &r), ("green", &g), ("blue", &b)] {
            ch.check_colorimetric(&format!("camera '{name}' {label} channel"))?;
        }
        Ok(CameraSensitivities { name, r, g, b })
    }

    /// The channels in R, G, B order.
    #[must_use]
    pub fn channels(&self) -> [&Sensitivity; 3] {
        [&self.r, &self.g, &self.b]
    }

    /// The ideal colorimetric camera: `[r̄, ḡ, b̄] = M · [x̄, ȳ, z̄]` (CIE 1931 2°)
    /// with [`COLORIMETRIC_RGB_FROM_CMF`]. It satisfies the Luther condition
    /// exactly, so a 3×3 matrix maps its signals to XYZ without error.
    ///
    /// # References
    /// - Luther, R. (1927), *Aus dem Gebiet der Farbreizmetrik*, Z. techn. Phys. 8, 540–558 (the condition).
    /// - CIE 15:2018, Table 1 (the colour-matching functions).
    pub fn colorimetric() -> Result<CameraSensitivities> {
        let obs = Observer::cie1931_2deg();
        let channel = |row: [f64; 3]| {
            let mut v = [0.0; GRID_LEN];
            for (i, o) in v.iter_mut().enumerate() {
                *o = row[0] * obs.x_bar[i] + row[1] * obs.y_bar[i] + row[2] * obs.z_bar[i];
            }
            Sensitivity::from_grid(v, Coverage::FULL)
        };
        let m = COLORIMETRIC_RGB_FROM_CMF;
        Ok(CameraSensitivities {
            name: COLORIMETRIC_NAME.to_string(),
            r: channel(m[0])?,
            g: channel(m[1])?,
            b: channel(m[2])?,
        })
    }

    /// The built-in demo cameras. They are invented by the project (see
    /// `assets/demo/cameras.csv`), not measurements of any real camera.
    pub fn demo_cameras() -> Result<&'static [CameraSensitivities]> {
        DEMO_CAMERAS.as_deref().map_err(Clone::clone)
    }

    /// Every built-in camera: the demo cameras, then the ideal colorimetric one.
    pub fn built_in() -> Result<Vec<CameraSensitivities>> {
        let mut all = Self::demo_cameras()?.to_vec();
        all.push(Self::colorimetric()?);
        Ok(all)
    }

    /// A built-in camera by name (exact match, or case-insensitive).
    pub fn built_in_by_name(name: &str) -> Result<CameraSensitivities> {
        let all = Self::built_in()?;
        let wanted = name.trim();
        all.iter()
            .find(|c| c.name == wanted)
            .or_else(|| all.iter().find(|c| c.name.eq_ignore_ascii_case(wanted)))
            .cloned()
            .ok_or_else(|| {
                let known: Vec<&str> = all.iter().map(|c| c.name.as_str()).collect();
                CameraError::InvalidInput(format!(
                    "no built-in camera '{wanted}'; known: {}",
                    known.join(", ")
                ))
            })
    }

    /// A camera from an imported camera-sensitivity table (exactly three value
    /// columns, taken as R, G, B in that order; see the colour crate's importer).
    pub fn from_imported(name: impl Into<String>, table: &ImportedTable) -> Result<Self> {
        let name = name.into();
        if table.columns.len() != 3 {
            return Err(CameraError::InvalidInput(format!(
                "camera '{name}': a camera table needs 3 value columns (R, G, B), found {}",
                table.columns.len()
            )));
        }
        Self::new(
            name,
            table.to_sensitivity(0)?,
            table.to_sensitivity(1)?,
            table.to_sensitivity(2)?,
        )
    }

    /// Read a camera from a spectral table file (three value columns R, G, B),
    /// named after the file.
    pub fn from_path(path: &std::path::Path) -> Result<Self> {
        let table = import_path(path, SpectrumKind::CameraSensitivity)?;
        let name = path.file_stem().map_or_else(
            || "camera".to_string(),
            |s| s.to_string_lossy().into_owned(),
        );
        Self::from_imported(name, &table)
    }

    /// A 64-bit fingerprint of the curves (not the name), for caching results
    /// computed from them within one run of the program.
    #[must_use]
    pub fn fingerprint(&self) -> u64 {
        // Four independent multiply–rotate chains over the curves' bits (it is
        // computed on every set-up, so it must not wait on one long chain),
        // then the lanes through a standard hasher.
        const K: u64 = 0x9E37_79B9_7F4A_7C15;
        let mut lanes = [1u64, 2, 3, 4];
        for ch in self.channels() {
            let mut chunks = ch.values().chunks_exact(4);
            for c in &mut chunks {
                for (l, v) in lanes.iter_mut().zip(c) {
                    *l = (l.rotate_left(23) ^ v.to_bits()).wrapping_mul(K);
                }
            }
            for v in chunks.remainder() {
                lanes[0] = (lanes[0].rotate_left(23) ^ v.to_bits()).wrapping_mul(K);
            }
        }
        let mut h = std::collections::hash_map::DefaultHasher::new();
        lanes.hash(&mut h);
        h.finish()
    }
}

/// A camera's curves behind an `Arc`, fingerprinted once.
///
/// The run-wide caches (locus, calibrated corrections) are keyed by
/// [`CameraSensitivities::fingerprint`]; a camera set up again and again under
/// changing light (a plan being edited) computes it here once instead of on
/// every set-up. The curves cannot change behind the fingerprint: they are
/// only reachable through a shared reference.
#[derive(Debug, Clone)]
pub struct SharedCamera {
    curves: Arc<CameraSensitivities>,
    fingerprint: u64,
}

impl SharedCamera {
    /// Share `curves` and fingerprint them.
    #[must_use]
    pub fn new(curves: Arc<CameraSensitivities>) -> SharedCamera {
        let fingerprint = curves.fingerprint();
        SharedCamera {
            curves,
            fingerprint,
        }
    }

    /// The curves.
    #[must_use]
    pub fn curves(&self) -> &CameraSensitivities {
        &self.curves
    }

    /// [`CameraSensitivities::fingerprint`] of the curves.
    #[must_use]
    pub fn fingerprint(&self) -> u64 {
        self.fingerprint
    }
}

impl From<CameraSensitivities> for SharedCamera {
    fn from(curves: CameraSensitivities) -> SharedCamera {
        SharedCamera::new(Arc::new(curves))
    }
}

/// Parse a demo camera table: columns named `<camera>|R`, `<camera>|G`, `<camera>|B`.
fn parse_demo_table(file: &str, text: &str) -> Result<Vec<CameraSensitivities>> {
    let table = AssetTable::parse(file, text)?;
    if table.names.len() % 3 != 0 {
        return Err(CameraError::InvalidInput(format!(
            "{file}: expected R, G, B columns per camera, found {} columns",
            table.names.len()
        )));
    }
    let mut cameras = Vec::new();
    for (names, cols) in table.names.chunks(3).zip(table.columns.chunks(3)) {
        let mut parts = names.iter().map(|n| n.rsplit_once('|'));
        let (Some(Some((name, "R"))), Some(Some((n_g, "G"))), Some(Some((n_b, "B")))) =
            (parts.next(), parts.next(), parts.next())
        else {
            return Err(CameraError::InvalidInput(format!(
                "{file}: columns {names:?} are not '<camera>|R', '|G', '|B'"
            )));
        };
        if n_g != name || n_b != name {
            return Err(CameraError::InvalidInput(format!(
                "{file}: columns {names:?} name different cameras"
            )));
        }
        let curve = |k: usize| Sensitivity::from_samples(&table.wavelengths_nm, &cols[k]);
        cameras.push(CameraSensitivities::new(
            name,
            curve(0)?,
            curve(1)?,
            curve(2)?,
        )?);
    }
    Ok(cameras)
}

/// The measured range common to the three channels.
#[must_use]
pub fn common_coverage(camera: &CameraSensitivities) -> Coverage {
    camera
        .r
        .coverage()
        .intersect(&camera.g.coverage())
        .intersect(&camera.b.coverage())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demo_cameras_load_with_their_names() {
        let demos = CameraSensitivities::demo_cameras().unwrap();
        assert_eq!(demos.len(), 5);
        assert!(demos.iter().all(|c| c.name.starts_with("Demo camera ")));
        assert!(demos.iter().any(|c| c.name.contains("wide green")));
        assert!(demos.iter().any(|c| c.name.contains("blue leak")));
        for c in demos {
            // Green peak scaled to 1 by the generator.
            assert!((c.g.max_value() - 1.0).abs() < 1e-6, "{}", c.name);
            // IR cut: nothing left past 720 nm (the cut filters sit at 650–690 nm).
            assert!(c.r.at_nm(730.0) < 0.02 * c.r.max_value(), "{}", c.name);
            assert_eq!(common_coverage(c), Coverage::FULL);
        }
    }

    #[test]
    fn blue_leak_camera_has_secondary_red_lobe() {
        let c = CameraSensitivities::built_in_by_name("Demo camera C — blue leak").unwrap();
        // Red response near 445 nm higher than at 490 nm: a second lobe in the blue.
        assert!(c.r.at_nm(445.0) > 2.0 * c.r.at_nm(490.0));
        let a = CameraSensitivities::built_in_by_name("demo camera a — balanced").unwrap();
        assert!(a.r.at_nm(445.0) < c.r.at_nm(445.0) * 0.1);
    }

    #[test]
    fn colorimetric_camera_is_positive_and_rgb_like() {
        let c = CameraSensitivities::colorimetric().unwrap();
        for ch in c.channels() {
            assert!(ch.values().iter().all(|v| *v >= 0.0));
        }
        let peak = |s: &Sensitivity| {
            let (i, _) = s
                .values()
                .iter()
                .enumerate()
                .fold(
                    (0, f64::MIN),
                    |acc, (i, v)| if *v > acc.1 { (i, *v) } else { acc },
                );
            360 + i
        };
        assert!(peak(&c.r) > peak(&c.g) && peak(&c.g) > peak(&c.b));
        // Exact mix of the CMFs at a sample wavelength (CIE 15 Table 1 via the observer).
        let o = Observer::cie1931_2deg();
        let i = 600 - 360;
        assert!(
            (c.r.values()[i] - (o.x_bar[i] + 0.3 * o.y_bar[i] - 0.16 * o.z_bar[i])).abs() < 1e-15
        );
    }

    #[test]
    fn unknown_camera_and_bad_tables_are_errors() {
        assert!(CameraSensitivities::built_in_by_name("nothing").is_err());
        assert!(parse_demo_table("t", "wavelength_nm,a|R,a|G\n400,1,1\n").is_err());
        assert!(parse_demo_table("t", "wavelength_nm,a|R,b|G,a|B\n400,1,1,1\n").is_err());
        let dark = Sensitivity::from_fn(|_| 0.0);
        let ok = Sensitivity::from_fn(|_| 1.0);
        assert!(CameraSensitivities::new("x", dark, ok.clone(), ok).is_err());
    }

    #[test]
    fn imports_a_three_column_table() {
        let text = "wavelength,r,g,b\n380,0.1,0.2,0.9\n500,0.1,0.9,0.3\n600,0.9,0.4,0.05\n780,0.01,0.01,0.01\n";
        let t = lampwright_color::import::import_bytes(
            "cam.csv",
            text.as_bytes(),
            SpectrumKind::CameraSensitivity,
        )
        .unwrap();
        let c = CameraSensitivities::from_imported("cam", &t).unwrap();
        assert!((c.g.at_nm(500.0) - 0.9).abs() < 1e-12);
        assert!((c.r.at_nm(600.0) - 0.9).abs() < 1e-12);
        let two = "wavelength,r,g\n380,0.1,0.2\n780,0.1,0.9\n";
        assert!(
            lampwright_color::import::import_bytes(
                "cam.csv",
                two.as_bytes(),
                SpectrumKind::CameraSensitivity
            )
            .is_err()
        );
    }

    #[test]
    fn fingerprint_follows_curves_not_name() {
        let a = CameraSensitivities::colorimetric().unwrap();
        let mut b = a.clone();
        b.name = "other".into();
        assert_eq!(a.fingerprint(), b.fingerprint());
        b.r = b.r.scaled(2.0);
        assert_ne!(a.fingerprint(), b.fingerprint());
        // A shared camera keeps its curves' fingerprint, taken once.
        let shared = SharedCamera::from(b.clone());
        assert_eq!(shared.fingerprint(), b.fingerprint());
        assert_eq!(shared.curves().r, b.r);
    }
}
