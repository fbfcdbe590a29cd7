//! Plan files: RON text, read defensively and written atomically.
//!
//! A plan file is UTF-8 [RON](https://github.com/ron-rs/ron) with one
//! top-level `Plan(...)` struct, pretty-printed one field per line so that
//! plans diff well in version control. Reading never panics: size, encoding,
//! nesting depth, syntax, types, format version and structural limits are each
//! checked and refused with a one-line message naming the file and the line
//! and column (or the field). Earlier format versions are migrated
//! ([`crate::migrate`]). Writing goes to a temporary file in the same folder,
//! which is flushed to disk and then renamed over the old file, so a crash at
//! any moment leaves either the old or the new plan, never a torn one.

use crate::error::{PlanError, Result};
use crate::limits::{MAX_FILE_BYTES, MAX_NESTING, check_limits};
use crate::migrate;
use crate::model::{FORMAT_VERSION, Plan};
use ron::extensions::Extensions;
use ron::ser::PrettyConfig;
use serde::Deserialize;
use std::fs::{self, File, OpenOptions};
use std::io::{Read, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

/// Label used in messages for plans parsed from memory.
pub const MEMORY_LABEL: &str = "<plan text>";

fn ron_options() -> ron::Options {
    ron::Options::default()
        // The RON reader spends two levels of its budget on each bracket
        // level (the list or struct, then the value inside it), so this
        // refuses exactly the files whose brackets nest deeper than MAX_NESTING.
        .with_recursion_limit(2 * MAX_NESTING)
        .with_default_extension(Extensions::empty())
}

fn pretty() -> PrettyConfig {
    PrettyConfig::new()
        .struct_names(true)
        .indentor("    ")
        .new_line("\n")
}

/// The plan as pretty RON text (what [`save_plan_atomic`] writes).
pub fn plan_to_ron(plan: &Plan) -> Result<String> {
    check_limits(plan)?;
    let mut text = ron_options()
        .to_string_pretty(plan, pretty())
        .map_err(|e| PlanError::Serialize(e.to_string()))?;
    text.push('\n');
    Ok(text)
}

/// Line (1-based) holding byte `offset` of `bytes`.
fn line_of_offset(bytes: &[u8], offset: usize) -> usize {
    bytes[..offset.min(bytes.len())]
        .split(|b| *b == b'\n')
        .count()
}

fn parse_error(path: &Path, e: &ron::error::SpannedError) -> PlanError {
    let message = match &e.code {
        ron::Error::ExceededRecursionLimit => format!(
            "brackets nest more than {MAX_NESTING} deep (a plan nests about 8 deep); the file is damaged"
        ),
        other => one_line(&other.to_string()),
    };
    PlanError::Parse {
        path: path.to_path_buf(),
        line: e.span.start.line,
        column: e.span.start.col,
        message,
    }
}

/// A limit broken by a file's content names the file too.
fn in_file(path: &Path, e: PlanError) -> PlanError {
    match e {
        PlanError::Limit {
            field,
            what,
            found,
            limit,
        } => PlanError::Limit {
            field: format!("{}: {field}", path.display()),
            what,
            found,
            limit,
        },
        other => other,
    }
}

/// Messages from the parser may quote the file; keep them on one line and short.
fn one_line(text: &str) -> String {
    let cleaned = crate::error::one_line(text);
    if cleaned.chars().count() > 300 {
        let mut short: String = cleaned.chars().take(300).collect();
        short.push('…');
        short
    } else {
        cleaned.into_owned()
    }
}

/// Just the version field, read before the rest so that old and future files
/// get the right message.
#[derive(Deserialize)]
#[serde(rename = "Plan")]
struct VersionProbe {
    #[serde(default = "missing_version")]
    format_version: u64,
}

/// Stands for "no version field" in [`VersionProbe`].
const MISSING_VERSION: u64 = u64::MAX;

fn missing_version() -> u64 {
    MISSING_VERSION
}

/// Parse plan text. `path` labels messages (use [`MEMORY_LABEL`] for text
/// that did not come from a file).
pub fn plan_from_bytes(path: &Path, bytes: &[u8]) -> Result<Plan> {
    if bytes.len() as u64 > MAX_FILE_BYTES {
        return Err(PlanError::TooLarge {
            path: path.to_path_buf(),
            size_bytes: bytes.len() as u64,
            limit_bytes: MAX_FILE_BYTES,
        });
    }
    if bytes.starts_with(b"\xFF\xFE") || bytes.starts_with(b"\xFE\xFF") {
        return Err(PlanError::Parse {
            path: path.to_path_buf(),
            line: 1,
            column: 1,
            message: "the file is UTF-16 text; plan files are UTF-8 RON (save it as UTF-8)".into(),
        });
    }
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let text = std::str::from_utf8(bytes).map_err(|e| PlanError::NotUtf8 {
        path: path.to_path_buf(),
        line: line_of_offset(bytes, e.valid_up_to()),
        offset: e.valid_up_to(),
    })?;
    if text.trim().is_empty() {
        return Err(PlanError::Parse {
            path: path.to_path_buf(),
            line: 1,
            column: 1,
            message: "the file is empty; a plan file starts with `Plan(`".into(),
        });
    }
    let probe: VersionProbe = ron_options()
        .from_str(text)
        .map_err(|e| parse_error(path, &e))?;
    let version = probe.format_version;
    if version == MISSING_VERSION {
        return Err(PlanError::Parse {
            path: path.to_path_buf(),
            line: 1,
            column: 1,
            message: "no `format_version` field; is this a Lampwright plan?".into(),
        });
    }
    let plan = match version {
        0 => {
            let old: migrate::PlanV0 = ron_options()
                .from_str(text)
                .map_err(|e| parse_error(path, &e))?;
            migrate::v0_to_v1(old)
        }
        v if v == u64::from(FORMAT_VERSION) => ron_options()
            .from_str::<Plan>(text)
            .map_err(|e| parse_error(path, &e))?,
        found => {
            let hint = if found > u64::from(FORMAT_VERSION) {
                "; it was written by a newer Lampwright: update Lampwright to open it"
            } else {
                ""
            };
            return Err(PlanError::UnsupportedVersion {
                path: path.to_path_buf(),
                found,
                newest: FORMAT_VERSION,
                hint: hint.into(),
            });
        }
    };
    check_limits(&plan).map_err(|e| in_file(path, e))?;
    Ok(plan)
}

/// Parse plan text held in memory.
pub fn plan_from_str(text: &str) -> Result<Plan> {
    plan_from_bytes(Path::new(MEMORY_LABEL), text.as_bytes())
}

/// Read a plan file (any supported format version; earlier ones are migrated).
pub fn load_plan(path: &Path) -> Result<Plan> {
    let file = File::open(path).map_err(|e| PlanError::io(path, &e))?;
    let meta = file.metadata().map_err(|e| PlanError::io(path, &e))?;
    if !meta.is_file() {
        return Err(PlanError::Io {
            path: path.to_path_buf(),
            message: "not a regular file".into(),
        });
    }
    if meta.len() > MAX_FILE_BYTES {
        return Err(PlanError::TooLarge {
            path: path.to_path_buf(),
            size_bytes: meta.len(),
            limit_bytes: MAX_FILE_BYTES,
        });
    }
    // Read at most one byte past the limit, in case the file grows meanwhile.
    let mut bytes = Vec::with_capacity(usize::try_from(meta.len()).unwrap_or(0));
    file.take(MAX_FILE_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(|e| PlanError::io(path, &e))?;
    plan_from_bytes(path, &bytes)
}

static TEMP_COUNTER: AtomicU64 = AtomicU64::new(0);

fn temp_path(dir: &Path, file_name: &std::ffi::OsStr) -> PathBuf {
    let n = TEMP_COUNTER.fetch_add(1, Ordering::Relaxed);
    let mut name = std::ffi::OsString::from(".");
    name.push(file_name);
    name.push(format!(".tmp-{}-{n}", std::process::id()));
    dir.join(name)
}

/// Write a plan so that the file at `path` is, at every instant, either the
/// old complete plan or the new complete plan.
///
/// Steps: check limits and serialise; create a new temporary file in the same
/// folder; write; flush to disk (`fsync`); rename over `path` (atomic within a
/// file system); flush the folder so the rename itself survives power loss.
/// On any error the temporary file is removed and the old file is untouched.
pub fn save_plan_atomic(path: &Path, plan: &Plan) -> Result<()> {
    let text = plan_to_ron(plan)?;
    let file_name = path.file_name().ok_or_else(|| PlanError::Io {
        path: path.to_path_buf(),
        message: "not a file name".into(),
    })?;
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let tmp = temp_path(&dir, file_name);
    let write = || -> std::io::Result<()> {
        let mut f = OpenOptions::new().write(true).create_new(true).open(&tmp)?;
        f.write_all(text.as_bytes())?;
        f.sync_all()?;
        drop(f);
        fs::rename(&tmp, path)
    };
    if let Err(e) = write() {
        let _ = fs::remove_file(&tmp);
        return Err(PlanError::io(path, &e));
    }
    sync_dir(&dir).map_err(|e| PlanError::io(&dir, &e))
}

#[cfg(unix)]
fn sync_dir(dir: &Path) -> std::io::Result<()> {
    File::open(dir)?.sync_all()
}

#[cfg(not(unix))]
fn sync_dir(_dir: &Path) -> std::io::Result<()> {
    // Folders cannot be opened for syncing on every platform; the rename is
    // still atomic there, only its durability across power loss is weaker.
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::Source;

    #[test]
    fn round_trips_through_text() {
        let mut plan = Plan::default();
        plan.sources.push(Source::default());
        plan.name = "Test \"quoted\" ⟨plan⟩".into();
        let text = plan_to_ron(&plan).unwrap();
        assert!(text.starts_with("Plan("), "{text}");
        assert_eq!(plan_from_str(&text).unwrap(), plan);
    }

    #[test]
    fn errors_name_line_and_column() {
        let e = plan_from_str("Plan(\n    format_version: 1,\n    name: 42,\n)").unwrap_err();
        match &e {
            PlanError::Parse { line, .. } => assert_eq!(*line, 3, "{e}"),
            other => panic!("{other}"),
        }
        assert!(
            e.to_string().starts_with("<plan text>: line 3, column"),
            "{e}"
        );
    }

    #[test]
    fn versions_are_checked_first() {
        let e = plan_from_str("Plan(format_version: 7, name: \"x\")")
            .unwrap_err()
            .to_string();
        assert!(
            e.contains("version 7") && e.contains("newer Lampwright"),
            "{e}"
        );
        let e = plan_from_str("Plan(name: \"x\")").unwrap_err().to_string();
        assert!(e.contains("no `format_version`"), "{e}");
        let e = plan_from_str("   ").unwrap_err().to_string();
        assert!(e.contains("empty"), "{e}");
    }

    #[test]
    fn non_utf8_names_the_line() {
        let e = plan_from_bytes(Path::new("a.ron"), b"Plan(\n  name: \"\xff\"\n)").unwrap_err();
        assert_eq!(
            e.to_string(),
            "a.ron: not UTF-8 text (first invalid byte at line 2, byte offset 15); plan files are UTF-8 RON"
        );
    }

    #[test]
    fn save_replaces_and_leaves_no_temp_files() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("plan.ron");
        let mut plan = Plan::default();
        save_plan_atomic(&path, &plan).unwrap();
        plan.name = "Second".into();
        save_plan_atomic(&path, &plan).unwrap();
        assert_eq!(load_plan(&path).unwrap(), plan);
        let names: Vec<_> = fs::read_dir(dir.path())
            .unwrap()
            .map(|e| e.unwrap().file_name())
            .collect();
        assert_eq!(names, vec![std::ffi::OsString::from("plan.ron")]);
    }

    #[test]
    fn save_into_missing_folder_fails_cleanly() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("missing").join("plan.ron");
        let e = save_plan_atomic(&path, &Plan::default()).unwrap_err();
        assert!(matches!(e, PlanError::Io { .. }), "{e}");
    }
}
