//! `lampwright delta-e PAIRS.csv [--json]`: colour differences of CIELAB pairs.
//!
//! Each data row is `L1,a1,b1,L2,a2,b2` (the first colour is the reference for
//! ΔE94). A header row is optional and recognised by a first cell that is not a
//! number; blank lines and lines starting with `#` are skipped. The whole file
//! is checked before anything is printed: a malformed row stops the run with
//! one line naming the file and line, and exit status 1.

use anyhow::{Context, bail};
use clap::Args;
use lampwright_color::delta_e::{delta_e_cie1976, delta_e_cie1994, delta_e_ciede2000};
use lampwright_color::spaces::Lab;
use serde::Serialize;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Arguments of `lampwright delta-e`.
#[derive(Debug, Args)]
pub struct DeltaEArgs {
    /// CSV file of CIELAB pairs: L1,a1,b1,L2,a2,b2 per row (header optional).
    pub pairs: PathBuf,
    /// One JSON object per pair per line (keys line, de76, de94, de2000).
    #[arg(long)]
    pub json: bool,
}

/// One pair read from the file.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Pair {
    /// 1-based line number in the file.
    line: usize,
    reference: Lab,
    sample: Lab,
}

/// The JSON line of one pair (keys in this order).
#[derive(Debug, Serialize)]
struct PairJson {
    line: usize,
    de76: f64,
    de94: f64,
    de2000: f64,
}

const COLUMNS: &str = "L1,a1,b1,L2,a2,b2";

/// Parse the pairs file. Errors name the file and the 1-based line.
fn parse_pairs(name: &str, text: &str) -> anyhow::Result<Vec<Pair>> {
    let mut pairs = Vec::new();
    let mut first_content_line = true;
    for (index, raw) in text.lines().enumerate() {
        let line = index + 1;
        let trimmed = raw.trim();
        if trimmed.is_empty() || trimmed.starts_with('#') {
            continue;
        }
        let cells: Vec<&str> = trimmed.split(',').map(str::trim).collect();
        let is_first = std::mem::replace(&mut first_content_line, false);
        if is_first && cells.first().is_some_and(|c| c.parse::<f64>().is_err()) {
            continue; // header row
        }
        if cells.len() != 6 {
            bail!(
                "{name}: line {line}: expected 6 numbers ({COLUMNS}), found {} field{}",
                cells.len(),
                if cells.len() == 1 { "" } else { "s" }
            );
        }
        let mut v = [0.0; 6];
        for (k, (cell, slot)) in cells.iter().zip(v.iter_mut()).enumerate() {
            let column = COLUMNS.split(',').nth(k).unwrap_or("?");
            *slot = match cell.parse::<f64>() {
                Ok(x) if x.is_finite() => x,
                Ok(_) => bail!("{name}: line {line}: {column} = '{cell}' is not a finite number"),
                Err(_) => bail!("{name}: line {line}: {column} = '{cell}' is not a number"),
            };
        }
        pairs.push(Pair {
            line,
            reference: Lab::new(v[0], v[1], v[2]),
            sample: Lab::new(v[3], v[4], v[5]),
        });
    }
    if pairs.is_empty() {
        bail!("{name}: no colour pairs found (expected rows of {COLUMNS})");
    }
    Ok(pairs)
}

fn differences(p: &Pair) -> PairJson {
    PairJson {
        line: p.line,
        de76: delta_e_cie1976(p.reference, p.sample),
        de94: delta_e_cie1994(p.reference, p.sample),
        de2000: delta_e_ciede2000(p.reference, p.sample),
    }
}

fn write_output(out: &mut impl Write, pairs: &[Pair], json: bool) -> anyhow::Result<()> {
    if json {
        for p in pairs {
            writeln!(out, "{}", serde_json::to_string(&differences(p))?)?;
        }
    } else {
        writeln!(
            out,
            "{:>6}  {:>10}  {:>10}  {:>10}",
            "line", "ΔE76", "ΔE94", "ΔE2000"
        )?;
        for p in pairs {
            let d = differences(p);
            writeln!(
                out,
                "{:>6}  {:>10.4}  {:>10.4}  {:>10.4}",
                d.line, d.de76, d.de94, d.de2000
            )?;
        }
    }
    out.flush()?;
    Ok(())
}

/// Run `lampwright delta-e`.
pub fn run(args: &DeltaEArgs) -> anyhow::Result<ExitCode> {
    let name = display_name(&args.pairs);
    let text =
        std::fs::read_to_string(&args.pairs).with_context(|| format!("cannot read {name}"))?;
    let pairs = parse_pairs(&name, &text)?;
    let stdout = std::io::stdout();
    match write_output(&mut stdout.lock(), &pairs, args.json) {
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

fn display_name(path: &Path) -> String {
    path.display().to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn header_comments_and_blank_lines() {
        let text = "# pairs\nL1,a1,b1,L2,a2,b2\n\n50,2.6772,-79.7751,50,0,-82.7485\r\n  # note\n50,0,0,50,-1,2\n";
        let pairs = parse_pairs("p.csv", text).unwrap();
        assert_eq!(pairs.len(), 2);
        assert_eq!((pairs[0].line, pairs[1].line), (4, 6));
        assert!((pairs[1].sample.b - 2.0).abs() < 1e-15);
    }

    #[test]
    fn no_header_is_fine() {
        let pairs = parse_pairs("p.csv", "50,0,0,50,-1,2").unwrap();
        assert_eq!(pairs[0].line, 1);
    }

    #[test]
    fn malformed_rows_name_file_and_line() {
        let e = parse_pairs("p.csv", "L1,a1,b1,L2,a2,b2\n50,0,0,50,-1\n").unwrap_err();
        assert_eq!(
            e.to_string(),
            "p.csv: line 2: expected 6 numbers (L1,a1,b1,L2,a2,b2), found 5 fields"
        );
        let e = parse_pairs("p.csv", "50,0,0,50,x,2\n").unwrap_err();
        assert_eq!(e.to_string(), "p.csv: line 1: a2 = 'x' is not a number");
        let e = parse_pairs("p.csv", "50,0,0,50,1,2\n50,0,NaN,50,1,2\n").unwrap_err();
        assert_eq!(
            e.to_string(),
            "p.csv: line 2: b1 = 'NaN' is not a finite number"
        );
        // Only the first content line may be a header.
        let e = parse_pairs("p.csv", "50,0,0,50,1,2\nL1,a1,b1,L2,a2,b2\n").unwrap_err();
        assert!(e.to_string().starts_with("p.csv: line 2: L1 = 'L1'"), "{e}");
        assert!(parse_pairs("p.csv", "# nothing\n\n").is_err());
    }

    #[test]
    fn text_table_is_aligned() {
        let pairs = parse_pairs("p.csv", "50,0,0,53,4,12\n").unwrap();
        let mut out = Vec::new();
        write_output(&mut out, &pairs, false).unwrap();
        let text = String::from_utf8(out).unwrap();
        let lines: Vec<&str> = text.lines().collect();
        let fields: Vec<&str> = lines[1].split_whitespace().collect();
        // 3-4-12 → ΔE76 = 13 exactly.
        assert_eq!(fields[..2], ["1", "13.0000"]);
        assert_eq!(fields.len(), 4);
        assert_eq!(lines[0].chars().count(), lines[1].chars().count());
    }
}
