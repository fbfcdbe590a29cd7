//! `lampwright report PLAN.ron [--format text|json|csv|html] [-o FILE]`:
//! evaluate a plan and write its report.
//!
//! The report is the same evaluation the window shows. Without `--format` the
//! format follows the output file's extension (`.json`, `.csv`, `.html`/`.htm`,
//! anything else text); without `-o` the report goes to standard output. An
//! output file is written atomically (a temporary file renamed into place),
//! so an old report is never left half overwritten.

use anyhow::{Context, bail};
use clap::Args;
use lampwright_plan::report::{ReportFormat, render_report};
use lampwright_plan::{evaluate, load_plan};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Arguments of `lampwright report`.
#[derive(Debug, Args)]
pub struct ReportArgs {
    /// The plan file (.ron).
    pub plan: PathBuf,
    /// Report format: text, json, csv or html (default: from the output file's extension, else text).
    #[arg(long, short = 'f', value_name = "text|json|csv|html")]
    pub format: Option<ReportFormat>,
    /// Write the report to this file instead of standard output.
    #[arg(long, short = 'o')]
    pub output: Option<PathBuf>,
}

/// The format an output file's extension asks for.
fn format_from_extension(path: &Path) -> ReportFormat {
    match path
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase)
        .as_deref()
    {
        Some("json") => ReportFormat::Json,
        Some("csv") => ReportFormat::Csv,
        Some("html" | "htm") => ReportFormat::Html,
        _ => ReportFormat::Text,
    }
}

/// Write `text` to `path` through a temporary file in the same folder.
fn write_atomic(path: &Path, text: &str) -> anyhow::Result<()> {
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path
        .file_name()
        .with_context(|| format!("{}: not a file name", path.display()))?;
    let mut tmp_name = std::ffi::OsString::from(".");
    tmp_name.push(name);
    tmp_name.push(format!(".tmp-{}", std::process::id()));
    let tmp = dir.join(tmp_name);
    let result = (|| -> std::io::Result<()> {
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(text.as_bytes())?;
        f.sync_all()?;
        std::fs::rename(&tmp, path)
    })();
    if let Err(e) = result {
        let _ = std::fs::remove_file(&tmp);
        bail!("{}: {e}", path.display());
    }
    Ok(())
}

/// Run `lampwright report`.
pub fn run(args: &ReportArgs) -> anyhow::Result<ExitCode> {
    let plan = load_plan(&args.plan)?;
    let evaluation = evaluate(&plan).with_context(|| {
        format!(
            "{}: the plan cannot be evaluated (run `lampwright check {}` for every problem)",
            args.plan.display(),
            args.plan.display()
        )
    })?;
    let format = args
        .format
        .or_else(|| args.output.as_deref().map(format_from_extension))
        .unwrap_or_default();
    let text = render_report(&plan, &evaluation, format)?;
    if let Some(path) = &args.output {
        write_atomic(path, &text)?;
    } else {
        let stdout = std::io::stdout();
        let mut out = stdout.lock();
        out.write_all(text.as_bytes())
            .and_then(|()| out.flush())
            .context("writing to standard output")?;
    }
    Ok(ExitCode::SUCCESS)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn extension_picks_the_format() {
        assert_eq!(
            format_from_extension(Path::new("a/r.JSON")),
            ReportFormat::Json
        );
        assert_eq!(
            format_from_extension(Path::new("r.htm")),
            ReportFormat::Html
        );
        assert_eq!(format_from_extension(Path::new("r.csv")), ReportFormat::Csv);
        assert_eq!(
            format_from_extension(Path::new("r.txt")),
            ReportFormat::Text
        );
        assert_eq!(
            format_from_extension(Path::new("report")),
            ReportFormat::Text
        );
    }
}
