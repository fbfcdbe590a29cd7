//! The built-in libraries: lamps, gels, subjects and cameras.
//!
//! Each library is loaded once, on first use, from tables embedded at build
//! time (`assets/demo/*.csv`, `assets/standard/*.csv`). Every entry says where
//! its data come from ([`Provenance`]): a CIE table or formula, or a curve the
//! project invented for the demo (marked as such in the CSV header and in
//! `docs/libraries.md`). Nothing here is a measurement of a branded product.
//!
//! Entries are `'static`; their typed curves are computed on first use and
//! cached, so the window can ask for them every frame.

mod gels;
mod lamps;
mod subjects;

pub use gels::{GelEntry, gel, gels};
pub use lamps::{LampEntry, LampSpectrum, lamp, lamps};
pub use subjects::{SUBJECT_GROUPS, SubjectItem, subject, subjects};

use crate::error::{PlanError, Result};
use lampwright_camera::CameraSensitivities;
use lampwright_color::spectrum::grid_wavelength_nm;
use lampwright_color::table::AssetTable;
use lampwright_color::{ColorError, Coverage, GRID_LEN};
use std::sync::LazyLock;

/// Where a library entry's data come from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Provenance {
    /// A published standard table or formula; the string names it.
    Standard(&'static str),
    /// Invented by the Lampwright project for the demo (not a measurement).
    Invented,
}

impl Provenance {
    /// One line for people: the standard, or "invented demo data".
    #[must_use]
    pub fn label(self) -> &'static str {
        match self {
            Provenance::Standard(s) => s,
            Provenance::Invented => "invented demo data (Lampwright project, not a measurement)",
        }
    }

    /// Whether the data were invented for the demo.
    #[must_use]
    pub fn is_invented(self) -> bool {
        matches!(self, Provenance::Invented)
    }
}

/// An embedded demo table, parsed once.
pub(crate) struct DemoTable {
    name: &'static str,
    table: LazyLock<Result<AssetTable, ColorError>>,
}

impl DemoTable {
    pub(crate) const fn new(
        name: &'static str,
        parse: fn() -> Result<AssetTable, ColorError>,
    ) -> DemoTable {
        DemoTable {
            name,
            table: LazyLock::new(parse),
        }
    }

    /// The parsed table.
    pub(crate) fn table(&self) -> Result<&AssetTable> {
        self.table
            .as_ref()
            .map_err(|e| PlanError::color_in(self.name, e.clone()))
    }

    /// The column named `id`, which must lie on the internal grid (360–830 nm at 1 nm).
    pub(crate) fn grid_column(&self, id: &str) -> Result<([f64; GRID_LEN], Coverage)> {
        let table = self.table()?;
        let bad = |message: String| PlanError::Invalid {
            field: format!("{} column '{id}'", self.name),
            message,
        };
        let column = table
            .column(id)
            .map_err(|e| PlanError::color_in(self.name, e))?;
        if table.wavelengths_nm.len() != GRID_LEN
            || table
                .wavelengths_nm
                .iter()
                .enumerate()
                .any(|(i, wl)| (wl - grid_wavelength_nm(i)).abs() > 1e-9)
        {
            return Err(bad("the table is not on the 360–830 nm, 1 nm grid".into()));
        }
        let mut values = [0.0; GRID_LEN];
        values.copy_from_slice(column);
        Ok((values, Coverage::FULL))
    }
}

/// A built-in camera with its library id.
#[derive(Debug, Clone, Copy)]
pub struct CameraEntry {
    /// Library id, e.g. "demo-a".
    pub id: &'static str,
    /// The camera's curves and name.
    pub camera: &'static CameraSensitivities,
}

static CAMERA_IDS: LazyLock<Result<Vec<CameraEntry>>> = LazyLock::new(|| {
    let demo = CameraSensitivities::demo_cameras().map_err(PlanError::Camera)?;
    Ok(demo
        .iter()
        .map(|camera| CameraEntry {
            id: camera_id(&camera.name),
            camera,
        })
        .collect())
});

/// Library id of a demo camera from its name: "Demo camera A — balanced" →
/// "demo-a". Names that do not follow the pattern become kebab-case whole.
fn camera_id(name: &str) -> &'static str {
    let id = name
        .strip_prefix("Demo camera ")
        .and_then(|rest| rest.split_whitespace().next())
        .map_or_else(
            || kebab_case(name),
            |letter| format!("demo-{}", letter.to_ascii_lowercase()),
        );
    // The camera list is built once per process; leaking a handful of short
    // ids gives them the 'static lifetime the other libraries have.
    Box::leak(id.into_boxed_str())
}

fn kebab_case(name: &str) -> String {
    let mut out = String::new();
    for c in name.chars() {
        if c.is_ascii_alphanumeric() {
            out.push(c.to_ascii_lowercase());
        } else if !out.ends_with('-') && !out.is_empty() {
            out.push('-');
        }
    }
    out.trim_end_matches('-').to_string()
}

/// The built-in demo cameras (invented by the project; see `assets/demo/cameras.csv`).
pub fn cameras() -> Result<&'static [CameraEntry]> {
    CAMERA_IDS.as_deref().map_err(Clone::clone)
}

/// A built-in demo camera by library id (e.g. "demo-a"); `Ok(None)` when there is none.
pub fn camera(id: &str) -> Result<Option<&'static CameraSensitivities>> {
    Ok(cameras()?.iter().find(|c| c.id == id).map(|c| c.camera))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn camera_ids_follow_the_names() {
        let all = cameras().unwrap();
        assert!(all.len() >= 2);
        assert_eq!(all[0].id, "demo-a");
        assert!(all[0].camera.name.starts_with("Demo camera A"));
        assert!(camera("demo-a").unwrap().is_some());
        assert!(camera("no-such-camera").unwrap().is_none());
        let mut ids: Vec<_> = all.iter().map(|c| c.id).collect();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), all.len(), "camera ids are unique");
    }

    #[test]
    fn kebab_case_keeps_letters_and_digits() {
        assert_eq!(kebab_case("Studio cam — 2"), "studio-cam-2");
    }
}
