//! `lampwright lamp FILE... [--json] [--observer 2|10]`: the lamp figures of
//! measured spectra (chromaticity, CCT, Duv, CRI, TM-30, SSI) for scripts and crews.
//!
//! Each argument is a spectral table or a directory (every file directly in it,
//! in sorted order). A file that cannot be evaluated is reported and the run
//! goes on; the exit status is then 1.

use anyhow::Context;
use clap::{Args, ValueEnum};
use indicatif::{ProgressBar, ProgressStyle};
use lampwright_color::import::{SpectrumKind, import_path};
use lampwright_color::lamp_report::{LampReport, lamp_report_with_observer};
use lampwright_color::observer::ObserverKind;
use serde::Serialize;
use std::io::{IsTerminal, Write};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// From this many files on, a progress bar is drawn (only when stderr is a terminal).
const PROGRESS_MIN_FILES: usize = 50;

/// Arguments of `lampwright lamp`.
#[derive(Debug, Args)]
pub struct LampArgs {
    /// Spectral tables of lamps (wavelength in nm, then power), or directories of them.
    #[arg(required = true)]
    pub files: Vec<PathBuf>,
    /// One JSON object per file per line, in input order.
    #[arg(long)]
    pub json: bool,
    /// Observer for the chromaticity figures (CCT is always on the 1931 2° observer).
    #[arg(long, value_enum, default_value = "2")]
    pub observer: ObserverArg,
}

/// `--observer` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ObserverArg {
    /// CIE 1931 2°.
    #[value(name = "2")]
    Two,
    /// CIE 1964 10°.
    #[value(name = "10")]
    Ten,
}

impl ObserverArg {
    fn kind(self) -> ObserverKind {
        match self {
            ObserverArg::Two => ObserverKind::Cie1931TwoDegree,
            ObserverArg::Ten => ObserverKind::Cie1964TenDegree,
        }
    }

    fn label(self) -> &'static str {
        match self {
            ObserverArg::Two => "CIE 1931 2°",
            ObserverArg::Ten => "CIE 1964 10°",
        }
    }
}

/// The JSON line of one evaluated file (keys in this order).
#[derive(Debug, Serialize)]
struct LampJson<'a> {
    file: &'a str,
    xy: [f64; 2],
    uv1960: [f64; 2],
    upvp1976: [f64; 2],
    cct_k: Option<f64>,
    duv: Option<f64>,
    cri: Option<CriJson>,
    tm30: Option<Tm30Json>,
    ssi: Option<i32>,
    warnings: &'a [String],
}

#[derive(Debug, Serialize)]
struct CriJson {
    ra: f64,
    r: [f64; 14],
}

#[derive(Debug, Serialize)]
struct Tm30Json {
    rf: f64,
    rg: f64,
    rf_hj: [f64; 16],
    rcs_hj: [f64; 16],
    rhs_hj: [f64; 16],
}

/// The JSON line of a file that could not be evaluated.
#[derive(Debug, Serialize)]
struct ErrorJson<'a> {
    file: &'a str,
    error: &'a str,
}

/// Files named by the arguments: files as given, directories expanded to the
/// files directly inside them, sorted by name.
fn expand(args: &[PathBuf]) -> Vec<Result<PathBuf, (PathBuf, String)>> {
    let mut out = Vec::new();
    for arg in args {
        if arg.is_dir() {
            match std::fs::read_dir(arg) {
                Ok(entries) => {
                    let mut files: Vec<PathBuf> = entries
                        .filter_map(std::result::Result::ok)
                        .map(|e| e.path())
                        .filter(|p| p.is_file())
                        .collect();
                    files.sort();
                    out.extend(files.into_iter().map(Ok));
                }
                Err(e) => out.push(Err((arg.clone(), format!("cannot read directory: {e}")))),
            }
        } else {
            out.push(Ok(arg.clone()));
        }
    }
    out
}

/// Import and evaluate one file: the report and every warning (import first).
fn evaluate(path: &Path, observer: ObserverKind) -> anyhow::Result<(LampReport, Vec<String>)> {
    let table = import_path(path, SpectrumKind::Lamp)?;
    let spd = table.to_relative_spd(0)?;
    let report = lamp_report_with_observer(&spd, observer)?;
    let mut warnings = table.warnings.clone();
    if table.columns.len() > 1 {
        let name = table.columns.first().map_or("", |c| c.name.as_str());
        warnings.push(format!(
            "the file has {} value columns; only the first ('{name}') was evaluated",
            table.columns.len()
        ));
    }
    warnings.extend(report.warnings.iter().cloned());
    Ok((report, warnings))
}

fn json_line(file: &str, r: &LampReport, warnings: &[String]) -> serde_json::Result<String> {
    serde_json::to_string(&LampJson {
        file,
        xy: [r.xy.0, r.xy.1],
        uv1960: [r.uv1960.u, r.uv1960.v],
        upvp1976: [r.uv_prime.u, r.uv_prime.v],
        cct_k: r.cct.map(|c| c.cct_k),
        duv: r.cct.map(|c| c.duv),
        cri: r.cri.as_ref().map(|c| CriJson { ra: c.ra, r: c.r }),
        tm30: r.tm30.as_ref().map(|t| Tm30Json {
            rf: t.rf,
            rg: t.rg,
            rf_hj: t.rf_hj,
            rcs_hj: t.rcs_hj,
            rhs_hj: t.rhs_hj,
        }),
        ssi: r.ssi.map(|s| s.value),
        warnings,
    })
}

/// A readable block: numbers at the precision the trade reads them.
fn text_block(file: &str, r: &LampReport, warnings: &[String], observer: ObserverArg) -> String {
    use std::fmt::Write as _;
    let mut s = String::new();
    let _ = writeln!(s, "{file}");
    let _ = writeln!(
        s,
        "  chromaticity ({}): x {:.4}  y {:.4}   u′ {:.4}  v′ {:.4}",
        observer.label(),
        r.xy.0,
        r.xy.1,
        r.uv_prime.u,
        r.uv_prime.v
    );
    match r.cct {
        Some(c) => {
            let _ = writeln!(
                s,
                "  CCT {:.0} K ({:.0} mired)   Duv {:+.4}",
                (c.cct_k / 10.0).round() * 10.0,
                1e6 / c.cct_k,
                c.duv
            );
        }
        None => {
            let _ = writeln!(s, "  CCT —");
        }
    }
    if let Some(c) = &r.cri {
        let ri: Vec<String> = c.r.iter().map(|v| format!("{v:.0}")).collect();
        let _ = writeln!(
            s,
            "  CRI Ra {:.0}   R9 {:.0}   R1–R14: {}",
            c.ra,
            c.r[8],
            ri.join(" ")
        );
    }
    if let Some(t) = &r.tm30 {
        let _ = writeln!(s, "  TM-30 Rf {:.0}   Rg {:.0}", t.rf, t.rg);
    }
    if let Some(x) = &r.ssi {
        let _ = writeln!(s, "  SSI {}", x.value);
    }
    let _ = writeln!(
        s,
        "  luminous efficacy of radiation {:.0} lm/W",
        r.ler_lm_per_w
    );
    for w in warnings {
        let _ = writeln!(s, "  warning: {w}");
    }
    s
}

/// Run `lampwright lamp`.
pub fn run(args: &LampArgs) -> anyhow::Result<ExitCode> {
    let inputs = expand(&args.files);
    let observer = args.observer.kind();
    let bar = (std::io::stderr().is_terminal() && inputs.len() >= PROGRESS_MIN_FILES).then(|| {
        let bar = ProgressBar::new(inputs.len() as u64);
        if let Ok(style) = ProgressStyle::with_template("{bar:40} {pos}/{len} files  {eta} left") {
            bar.set_style(style);
        }
        bar
    });
    let stdout = std::io::stdout();
    let mut out = std::io::BufWriter::new(stdout.lock());
    let mut failed = false;
    for input in &inputs {
        let (path, result) = match input {
            Ok(p) => (p, evaluate(p, observer)),
            Err((p, msg)) => (p, Err(anyhow::anyhow!("{msg}"))),
        };
        let file = path.display().to_string();
        let line = match result {
            Ok((report, warnings)) => {
                if args.json {
                    json_line(&file, &report, &warnings).context("writing JSON")? + "\n"
                } else {
                    text_block(&file, &report, &warnings, args.observer)
                }
            }
            Err(e) => {
                failed = true;
                let msg = format!("{e:#}");
                if args.json {
                    serde_json::to_string(&ErrorJson {
                        file: &file,
                        error: &msg,
                    })
                    .context("writing JSON")?
                        + "\n"
                } else {
                    format!("{file}\n  error: {msg}\n")
                }
            }
        };
        let text = if args.json || inputs.len() == 1 {
            line
        } else {
            line + "\n"
        };
        out.write_all(text.as_bytes())
            .context("writing to standard output")?;
        if let Some(b) = &bar {
            b.inc(1);
        }
    }
    out.flush().context("writing to standard output")?;
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    Ok(if failed {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn directories_expand_sorted_files_only() {
        let dir = tempfile::tempdir().unwrap();
        for name in ["b.csv", "a.csv", "c.txt"] {
            std::fs::write(dir.path().join(name), "x").unwrap();
        }
        std::fs::create_dir(dir.path().join("sub")).unwrap();
        let got: Vec<String> = expand(&[dir.path().to_path_buf()])
            .into_iter()
            .map(|r| {
                r.unwrap()
                    .file_name()
                    .unwrap()
                    .to_string_lossy()
                    .into_owned()
            })
            .collect();
        assert_eq!(got, ["a.csv", "b.csv", "c.txt"]);
    }
}
