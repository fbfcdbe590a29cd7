//! `lampwright camera-fit --camera CAM.csv --illuminant LAMP.csv --samples REFL.csv
//! --method linear|white-preserving|de2000|root-poly [--json]`: fit a camera's
//! colour correction under one light on given samples.
//!
//! Camera RGB is exposed so that the perfect reflector gives G = 1; targets are
//! the samples' XYZ under the same light with the perfect reflector at Y = 1;
//! CIELAB for the CIEDE2000 figures is taken against the illuminant's own
//! white. There is no white balance and no chromatic adaptation here: the
//! correction maps raw camera RGB to XYZ under that light. (The eye-versus-
//! camera pipeline of the window white-balances and adapts to D65 instead.)
//!
//! `--camera` and `--illuminant` also accept a built-in name when no such file
//! exists (a demo camera's name; a CIE illuminant such as `A`, `D65`, `F2`).

use anyhow::{Context, bail};
use clap::Args;
use lampwright_camera::correction::{
    ColorCorrection, DeltaEStats, FitData, FitMethod, delta_e_per_sample, fit_color_correction,
};
use lampwright_camera::{CameraSensitivities, SceneResponse};
use lampwright_color::illuminant::StandardIlluminant;
use lampwright_color::import::{SpectrumKind, import_path};
use lampwright_color::observer::Observer;
use lampwright_color::{Reflectance, RelativeSpd};
use serde::Serialize;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Arguments of `lampwright camera-fit`.
#[derive(Debug, Args)]
pub struct CameraFitArgs {
    /// Camera sensitivities: a spectral table with three value columns R, G, B
    /// (or the name of a built-in demo camera).
    #[arg(long)]
    pub camera: PathBuf,
    /// The light: a spectral table whose first value column is used (or a CIE
    /// illuminant name such as A, D65, F2, LED-B3).
    #[arg(long)]
    pub illuminant: PathBuf,
    /// Reflectances of the samples, one value column per sample.
    #[arg(long)]
    pub samples: PathBuf,
    /// Fit method: linear, white-preserving, de2000 (ΔE00-minimising, white kept),
    /// de2000-free-white, or root-poly (3×6 root-polynomial, degree 2).
    #[arg(long, default_value = "white-preserving")]
    pub method: String,
    /// One JSON object instead of the text report.
    #[arg(long)]
    pub json: bool,
}

/// The JSON output (keys in this order).
#[derive(Debug, Serialize)]
struct FitJson<'a> {
    camera: &'a str,
    illuminant: &'a str,
    method: &'a str,
    /// Names of the matrix columns: r, g, b (and the three root terms for root-poly).
    terms: Vec<&'static str>,
    /// Rows map the terms to X, Y, Z.
    matrix: Vec<Vec<f64>>,
    white_rgb: [f64; 3],
    white_xyz: [f64; 3],
    samples: &'a [String],
    de2000: &'a [f64],
    de2000_mean: f64,
    de2000_max: f64,
}

/// Everything the report prints.
struct Fit {
    camera: String,
    illuminant: String,
    method: FitMethod,
    samples: Vec<String>,
    data: FitData,
    correction: ColorCorrection,
    de2000: Vec<f64>,
    stats: DeltaEStats,
    warnings: Vec<String>,
}

fn file_label(path: &Path) -> String {
    path.file_name().map_or_else(
        || path.display().to_string(),
        |n| n.to_string_lossy().into_owned(),
    )
}

fn load_camera(arg: &Path, warnings: &mut Vec<String>) -> anyhow::Result<CameraSensitivities> {
    if arg.is_file() {
        let table = import_path(arg, SpectrumKind::CameraSensitivity)?;
        warnings.extend(
            table
                .warnings
                .iter()
                .map(|w| format!("{}: {w}", table.source_name)),
        );
        return Ok(CameraSensitivities::from_imported(file_label(arg), &table)?);
    }
    let name = arg.to_string_lossy();
    CameraSensitivities::built_in_by_name(&name)
        .with_context(|| format!("--camera: '{name}' is neither a file nor a built-in camera"))
}

fn load_light(arg: &Path, warnings: &mut Vec<String>) -> anyhow::Result<(String, RelativeSpd)> {
    if arg.is_file() {
        let table = import_path(arg, SpectrumKind::Lamp)?;
        warnings.extend(
            table
                .warnings
                .iter()
                .map(|w| format!("{}: {w}", table.source_name)),
        );
        if table.columns.len() > 1 {
            warnings.push(format!(
                "{}: {} value columns; using the first, '{}'",
                table.source_name,
                table.columns.len(),
                table.columns[0].name
            ));
        }
        return Ok((file_label(arg), table.to_relative_spd(0)?));
    }
    let name = arg.to_string_lossy();
    let Some(ill) = StandardIlluminant::from_name(&name) else {
        bail!("--illuminant: '{name}' is neither a file nor a CIE illuminant name (A, D65, F2, …)");
    };
    Ok((ill.name(), ill.spd()?))
}

fn fit(args: &CameraFitArgs) -> anyhow::Result<Fit> {
    let method = FitMethod::from_name(&args.method).context("--method")?;
    let mut warnings = Vec::new();
    let camera = load_camera(&args.camera, &mut warnings)?;
    let (illuminant, light) = load_light(&args.illuminant, &mut warnings)?;
    let table = import_path(&args.samples, SpectrumKind::Reflectance)?;
    warnings.extend(
        table
            .warnings
            .iter()
            .map(|w| format!("{}: {w}", table.source_name)),
    );
    let reflectances = (0..table.columns.len())
        .map(|i| table.to_reflectance(i))
        .collect::<Result<Vec<Reflectance>, _>>()?;
    let samples: Vec<String> = table.columns.iter().map(|c| c.name.clone()).collect();

    let scene = SceneResponse::new(&camera, &light, Observer::cie1931_2deg())?;
    let signals = scene.subjects(&reflectances);
    let data = FitData {
        rgb: signals.iter().map(|s| s.raw_rgb).collect(),
        xyz: signals.iter().map(|s| s.xyz.to_array()).collect(),
        white_rgb: scene.white().raw_rgb,
        white_xyz: scene.white().xyz.to_array(),
    };
    let correction = fit_color_correction(method, &data).with_context(|| {
        format!(
            "fitting a {} correction on {} samples",
            method.name(),
            samples.len()
        )
    })?;
    let de2000 = delta_e_per_sample(&correction, &data);
    let stats = DeltaEStats::of(&de2000).context("no samples")?;
    Ok(Fit {
        camera: camera.name,
        illuminant,
        method,
        samples,
        data,
        correction,
        de2000,
        stats,
        warnings,
    })
}

fn terms(correction: &ColorCorrection) -> Vec<&'static str> {
    match correction {
        ColorCorrection::Matrix { .. } => vec!["r", "g", "b"],
        ColorCorrection::RootPolynomial { .. } => {
            vec!["r", "g", "b", "sqrt(rg)", "sqrt(gb)", "sqrt(rb)"]
        }
    }
}

fn write_json(out: &mut impl Write, f: &Fit) -> anyhow::Result<()> {
    let doc = FitJson {
        camera: &f.camera,
        illuminant: &f.illuminant,
        method: f.method.name(),
        terms: terms(&f.correction),
        matrix: f.correction.rows(),
        white_rgb: f.data.white_rgb,
        white_xyz: f.data.white_xyz,
        samples: &f.samples,
        de2000: &f.de2000,
        de2000_mean: f.stats.mean,
        de2000_max: f.stats.max,
    };
    writeln!(out, "{}", serde_json::to_string(&doc)?)?;
    Ok(())
}

fn write_text(out: &mut impl Write, f: &Fit) -> anyhow::Result<()> {
    writeln!(out, "Camera:     {}", f.camera)?;
    writeln!(out, "Illuminant: {}", f.illuminant)?;
    writeln!(
        out,
        "Method:     {} ({} samples)",
        f.method.name(),
        f.samples.len()
    )?;
    writeln!(out)?;
    let names = terms(&f.correction);
    match f.correction {
        ColorCorrection::Matrix { .. } => {
            writeln!(out, "3×3 matrix, rows map camera RGB to X, Y, Z")?;
        }
        ColorCorrection::RootPolynomial { .. } => {
            writeln!(
                out,
                "3×6 root-polynomial matrix, rows map r, g, b, √(rg), √(gb), √(rb) to X, Y, Z"
            )?;
        }
    }
    writeln!(
        out,
        "(RGB with the perfect reflector at G = 1, XYZ with it at Y = 1, no white balance or adaptation)"
    )?;
    write!(out, "     ")?;
    for n in &names {
        write!(out, " {n:>11}")?;
    }
    writeln!(out)?;
    for (label, row) in ["X", "Y", "Z"].iter().zip(f.correction.rows()) {
        write!(out, "  {label}  ")?;
        for v in row {
            write!(out, " {v:>11.6}")?;
        }
        writeln!(out)?;
    }
    writeln!(out)?;
    writeln!(
        out,
        "CIEDE2000 per sample (CIELAB against the illuminant's own white):"
    )?;
    let width = f
        .samples
        .iter()
        .map(|s| s.chars().count())
        .max()
        .unwrap_or(6)
        .max(6);
    for (name, de) in f.samples.iter().zip(&f.de2000) {
        writeln!(out, "  {name:<width$}  {de:>7.2}")?;
    }
    writeln!(
        out,
        "  {:<width$}  {:>7.2}\n  {:<width$}  {:>7.2}",
        "mean", f.stats.mean, "max", f.stats.max
    )?;
    Ok(())
}

/// Run `lampwright camera-fit`.
pub fn run(args: &CameraFitArgs) -> anyhow::Result<ExitCode> {
    let f = fit(args)?;
    for w in &f.warnings {
        eprintln!("lampwright: warning: {w}");
    }
    let stdout = std::io::stdout();
    let mut out = stdout.lock();
    let written = if args.json {
        write_json(&mut out, &f)
    } else {
        write_text(&mut out, &f)
    }
    .and_then(|()| out.flush().map_err(Into::into));
    match written {
        Ok(()) => Ok(ExitCode::SUCCESS),
        // A closed pipe (e.g. `| head`) is not an error of ours.
        Err(e)
            if e.downcast_ref::<std::io::Error>()
                .is_some_and(|io| io.kind() == std::io::ErrorKind::BrokenPipe) =>
        {
            Ok(ExitCode::SUCCESS)
        }
        Err(e) => Err(e),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn built_in_names_work_and_unknown_names_are_refused() {
        let args = |camera: &str, ill: &str, method: &str| CameraFitArgs {
            camera: camera.into(),
            illuminant: ill.into(),
            samples: "no-such-file.csv".into(),
            method: method.into(),
            json: false,
        };
        let mut w = Vec::new();
        assert!(load_camera(Path::new("Demo camera A — balanced"), &mut w).is_ok());
        assert!(load_light(Path::new("F2"), &mut w).is_ok());
        assert!(load_camera(Path::new("no camera"), &mut w).is_err());
        assert!(load_light(Path::new("no light"), &mut w).is_err());
        let e = fit(&args("Demo camera A — balanced", "A", "cubic"))
            .err()
            .unwrap();
        assert!(format!("{e:#}").contains("unknown fit method"), "{e:#}");
        assert!(fit(&args("Demo camera A — balanced", "A", "linear")).is_err());
    }
}
