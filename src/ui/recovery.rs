//! Autosave slots and crash recovery, on disk.
//!
//! While a plan has unsaved changes, the window keeps a copy of it in a
//! *slot* in the user's data folder (see [`default_dir`]); the user's own plan
//! file is written only by Save. A slot belongs to one running window and is
//! three files named after that window's session:
//!
//! - `autosave-SESSION.ron`: the plan, written with the plan crate's atomic
//!   save, so it is always one complete plan;
//! - `autosave-SESSION.info`: which plan file the plan belongs to (if any)
//!   and when it was written;
//! - `autosave-SESSION.lock`: locked while the window runs. The operating
//!   system drops the lock when the process ends, however it ends, so a slot
//!   whose lock can be taken belongs to a window that is gone.
//!
//! The info file is written before the plan and removed after it, so a plan
//! in a slot always has the info of its own run of unsaved changes.
//!
//! At start, [`scan`] finds the plans of windows that are gone. A plan that
//! cannot be read is renamed to `….ron.corrupt`; one the user discards is
//! renamed to `….ron.discarded`. Neither is ever deleted by the window.

use lampwright_plan::Plan;
use serde::{Deserialize, Serialize};
use std::fs::{self, File, OpenOptions, TryLockError};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};
use std::time::{Duration, Instant, SystemTime, UNIX_EPOCH};

/// How long unsaved changes wait before they are autosaved (losing the
/// window's focus autosaves at once).
pub const AUTOSAVE_INTERVAL: Duration = Duration::from_secs(25);

/// Environment variable naming the data folder (preferences and autosaves)
/// instead of the platform's per-user data folder.
pub const DATA_DIR_ENV: &str = "LAMPWRIGHT_DATA_DIR";

/// Name of the recovery folder inside the data folder.
pub const RECOVERY_FOLDER: &str = "recovery";

/// The data folder: [`DATA_DIR_ENV`] when set, else the folder where eframe
/// keeps the window preferences (on Linux `$XDG_DATA_HOME/lampwright`, by
/// default `~/.local/share/lampwright`).
#[must_use]
pub fn data_dir() -> Option<PathBuf> {
    std::env::var_os(DATA_DIR_ENV)
        .filter(|v| !v.is_empty())
        .map(PathBuf::from)
        .or_else(|| eframe::storage_dir(super::APP_ID))
}

/// The recovery folder inside [`data_dir`].
#[must_use]
pub fn default_dir() -> Option<PathBuf> {
    data_dir().map(|d| d.join(RECOVERY_FOLDER))
}

/// What the info file of a slot records.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct AutosaveInfo {
    /// The plan file the autosaved plan belongs to (`None`: never saved).
    pub origin: Option<PathBuf>,
    /// When the autosave was written, seconds since 1970-01-01 UTC.
    pub saved_at_unix_s: u64,
}

/// The files of one slot.
#[derive(Debug, Clone, PartialEq, Eq)]
struct Slot {
    dir: PathBuf,
    session: String,
}

impl Slot {
    fn file(&self, extension: &str) -> PathBuf {
        self.dir
            .join(format!("autosave-{}.{extension}", self.session))
    }

    fn plan_file(&self) -> PathBuf {
        self.file("ron")
    }

    fn info_file(&self) -> PathBuf {
        self.file("info")
    }

    fn lock_file(&self) -> PathBuf {
        self.file("lock")
    }

    /// Temporary files of interrupted writes (hidden, named after the slot).
    fn temp_prefix(&self) -> String {
        format!(".autosave-{}.", self.session)
    }
}

/// Remove a file; a file that is already gone is fine.
fn remove_if_present(path: &Path) -> Result<(), String> {
    match fs::remove_file(path) {
        Ok(()) => Ok(()),
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => Ok(()),
        Err(e) => Err(format!("{}: {e}", path.display())),
    }
}

/// Write a small file so that it is, at every instant, the old or the new
/// complete text (temporary file, flush to disk, rename).
fn write_small_atomic(path: &Path, text: &str) -> std::io::Result<()> {
    let dir = path.parent().unwrap_or(Path::new("."));
    let mut name = std::ffi::OsString::from(".");
    name.push(path.file_name().unwrap_or_default());
    name.push(format!(".tmp-{}", std::process::id()));
    let tmp = dir.join(name);
    let result = (|| {
        let mut file = File::create(&tmp)?;
        file.write_all(text.as_bytes())?;
        file.sync_all()?;
        drop(file);
        fs::rename(&tmp, path)
    })();
    if result.is_err() {
        let _ = fs::remove_file(&tmp);
    }
    result
}

fn unix_seconds(time: SystemTime) -> u64 {
    time.duration_since(UNIX_EPOCH).map_or(0, |d| d.as_secs())
}

/// A new session name: process id, start time and a counter (several windows
/// may run in one process, as in the tests). Digits and dashes only.
fn new_session() -> String {
    static COUNTER: AtomicU64 = AtomicU64::new(0);
    let millis = SystemTime::now()
        .duration_since(UNIX_EPOCH)
        .map_or(0, |d| d.as_millis());
    let n = COUNTER.fetch_add(1, Ordering::Relaxed);
    format!("{}-{millis}-{n}", std::process::id())
}

/// What the autosaver did this frame.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Tick {
    /// Nothing to do.
    Idle,
    /// Changes are waiting; look again after this long.
    WaitFor(Duration),
    /// The plan was autosaved.
    Wrote,
    /// The plan is saved (or back as saved): the autosave was removed.
    Cleared,
    /// Autosaving failed (reported once until it works again).
    Failed(String),
}

/// The running window's slot.
#[derive(Debug)]
pub struct Autosaver {
    slot: Slot,
    /// Held for the life of the window; the lock is what tells [`scan`] that
    /// the slot is in use.
    lock: Option<File>,
    interval: Duration,
    /// The plan in the slot, if one is there.
    written: Option<Plan>,
    /// When the changes not yet autosaved began.
    waiting_since: Option<Instant>,
    failing: bool,
    writes: u64,
}

impl Autosaver {
    /// Take a new slot in `dir` (created if needed).
    pub fn start(dir: &Path, interval: Duration) -> Result<Autosaver, String> {
        fs::create_dir_all(dir).map_err(|e| format!("{}: {e}", dir.display()))?;
        let slot = Slot {
            dir: dir.to_path_buf(),
            session: new_session(),
        };
        let lock_path = slot.lock_file();
        let lock = OpenOptions::new()
            .create(true)
            .truncate(false)
            .write(true)
            .open(&lock_path)
            .map_err(|e| format!("{}: {e}", lock_path.display()))?;
        // A file system without locks still autosaves; only the check that
        // another window is using the slot is lost.
        let lock = match lock.try_lock() {
            Ok(()) => Some(lock),
            Err(_) => None,
        };
        Ok(Autosaver {
            slot,
            lock,
            interval,
            written: None,
            waiting_since: None,
            failing: false,
            writes: 0,
        })
    }

    /// The slot's plan file (present only while there are unsaved changes).
    #[must_use]
    pub fn plan_file(&self) -> PathBuf {
        self.slot.plan_file()
    }

    /// How many autosaves were written.
    #[must_use]
    pub fn writes(&self) -> u64 {
        self.writes
    }

    /// Decide and do this frame's work: autosave a dirty plan that changed
    /// since the last autosave once the interval has passed or the window
    /// lost focus; remove the autosave once the plan is clean.
    pub fn tick(
        &mut self,
        plan: &Plan,
        dirty: bool,
        origin: Option<&Path>,
        focus_lost: bool,
        now: Instant,
    ) -> Tick {
        if !dirty {
            self.waiting_since = None;
            if self.written.is_none() {
                return Tick::Idle;
            }
            return match self.clear() {
                Ok(()) => Tick::Cleared,
                Err(err) => self.failed(err),
            };
        }
        if self.written.as_ref() == Some(plan) {
            self.waiting_since = None;
            return Tick::Idle;
        }
        let since = *self.waiting_since.get_or_insert(now);
        let due = since + self.interval;
        if !focus_lost && now < due {
            return Tick::WaitFor(due - now);
        }
        match self.write(plan, origin) {
            Ok(()) => Tick::Wrote,
            Err(err) => {
                // Try again after another interval, not on every frame.
                self.waiting_since = Some(now);
                self.failed(err)
            }
        }
    }

    fn failed(&mut self, err: String) -> Tick {
        if std::mem::replace(&mut self.failing, true) {
            Tick::Idle
        } else {
            Tick::Failed(err)
        }
    }

    /// Autosave now: the info first, then the plan (atomically).
    pub fn write(&mut self, plan: &Plan, origin: Option<&Path>) -> Result<(), String> {
        let mut info = AutosaveInfo {
            origin: origin.map(Path::to_path_buf),
            saved_at_unix_s: unix_seconds(SystemTime::now()),
        };
        // A path that is not Unicode cannot be written as RON text; the plan
        // is still worth keeping without it.
        let text = ron::to_string(&info).or_else(|_| {
            info.origin = None;
            ron::to_string(&info)
        });
        let text = text.map_err(|e| format!("autosave: {e}"))?;
        let info_file = self.slot.info_file();
        write_small_atomic(&info_file, &text)
            .map_err(|e| format!("{}: {e}", info_file.display()))?;
        lampwright_plan::save_plan_atomic(&self.slot.plan_file(), plan)
            .map_err(|e| e.to_string())?;
        self.written = Some(plan.clone());
        self.waiting_since = None;
        self.failing = false;
        self.writes += 1;
        Ok(())
    }

    /// Remove the autosave (the plan first, then its info).
    pub fn clear(&mut self) -> Result<(), String> {
        remove_if_present(&self.slot.plan_file())?;
        self.written = None;
        remove_if_present(&self.slot.info_file())
    }

    /// The window closes with nothing to keep: remove the slot, lock included.
    pub fn finish(mut self) -> Result<(), String> {
        self.clear()?;
        drop(self.lock.take());
        remove_if_present(&self.slot.lock_file())
    }
}

/// A plan left behind by a window that is gone.
#[derive(Debug, Clone, PartialEq)]
pub struct Recovered {
    /// The autosaved plan.
    pub plan: Plan,
    /// The plan file it belongs to, if it had one.
    pub origin: Option<PathBuf>,
    /// When it was autosaved.
    pub saved_at: Option<SystemTime>,
    slot: Slot,
}

impl Recovered {
    /// The autosave's plan file.
    #[must_use]
    pub fn plan_file(&self) -> PathBuf {
        self.slot.plan_file()
    }

    /// Keep the files aside (renamed `….discarded`) and free the slot.
    /// Returns where the plan now is.
    pub fn discard(&self) -> Result<PathBuf, String> {
        let kept = set_aside(&self.slot, "discarded")?;
        let _ = remove_if_present(&self.slot.lock_file());
        Ok(kept)
    }

    /// Remove the slot (its plan is safe elsewhere, e.g. restored and
    /// autosaved again by the running window).
    pub fn forget(&self) -> Result<(), String> {
        remove_if_present(&self.slot.plan_file())?;
        remove_if_present(&self.slot.info_file())?;
        remove_if_present(&self.slot.lock_file())
    }
}

/// Rename a slot's plan and info to `….ron.SUFFIX` and `….info.SUFFIX`.
fn set_aside(slot: &Slot, suffix: &str) -> Result<PathBuf, String> {
    let plan = slot.plan_file();
    let aside = PathBuf::from(format!("{}.{suffix}", plan.display()));
    fs::rename(&plan, &aside).map_err(|e| format!("{}: {e}", plan.display()))?;
    let info = slot.info_file();
    if info.exists() {
        let _ = fs::rename(&info, format!("{}.{suffix}", info.display()));
    }
    Ok(aside)
}

/// What [`scan`] found.
#[derive(Debug, Default)]
pub struct Scan {
    /// Plans to offer, newest first.
    pub found: Vec<Recovered>,
    /// One-line messages about autosaves that could not be read (set aside).
    pub notices: Vec<String>,
}

/// Is a slot in use by a running window? (Its lock file is locked.)
fn in_use(slot: &Slot) -> bool {
    let Ok(file) = OpenOptions::new().write(true).open(slot.lock_file()) else {
        return false;
    };
    matches!(file.try_lock(), Err(TryLockError::WouldBlock))
}

/// The session a slot file or temporary file belongs to.
fn session_of(name: &str) -> Option<&str> {
    let rest = name
        .strip_prefix("autosave-")
        .or_else(|| name.strip_prefix(".autosave-"))?;
    let (session, _) = rest.split_once('.')?;
    let valid = !session.is_empty()
        && session
            .chars()
            .all(|c| c.is_ascii_alphanumeric() || c == '-');
    valid.then_some(session)
}

/// Find the autosaves of windows that are gone, tidy what they left, and set
/// aside those that cannot be read. A missing folder finds nothing.
#[must_use]
pub fn scan(dir: &Path) -> Scan {
    let mut out = Scan::default();
    let Ok(entries) = fs::read_dir(dir) else {
        return out;
    };
    let names: Vec<String> = entries
        .flatten()
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .collect();
    let mut sessions: Vec<&str> = names.iter().filter_map(|n| session_of(n)).collect();
    sessions.sort_unstable();
    sessions.dedup();
    for session in sessions {
        let slot = Slot {
            dir: dir.to_path_buf(),
            session: session.to_owned(),
        };
        if in_use(&slot) {
            continue;
        }
        // Temporary files of writes the crash interrupted.
        let prefix = slot.temp_prefix();
        for name in names.iter().filter(|n| n.starts_with(&prefix)) {
            let _ = fs::remove_file(dir.join(name));
        }
        let plan_file = slot.plan_file();
        if !plan_file.exists() {
            // Nothing was autosaved, or it was saved and removed.
            let _ = remove_if_present(&slot.info_file());
            let _ = remove_if_present(&slot.lock_file());
            continue;
        }
        match lampwright_plan::load_plan(&plan_file) {
            Ok(plan) => {
                let info = fs::read_to_string(slot.info_file())
                    .ok()
                    .and_then(|text| ron::from_str::<AutosaveInfo>(&text).ok());
                // A time the clock cannot hold (a damaged info file) counts as unknown.
                let saved_at = info
                    .as_ref()
                    .and_then(|i| saved_at(i.saved_at_unix_s))
                    .or_else(|| fs::metadata(&plan_file).and_then(|m| m.modified()).ok());
                out.found.push(Recovered {
                    plan,
                    origin: info.and_then(|i| i.origin),
                    saved_at,
                    slot,
                });
            }
            Err(err) => out.notices.push(match set_aside(&slot, "corrupt") {
                Ok(aside) => {
                    let _ = remove_if_present(&slot.lock_file());
                    format!(
                        "An autosaved plan could not be read and was set aside as {} ({err})",
                        aside.display()
                    )
                }
                Err(move_err) => format!(
                    "An autosaved plan could not be read ({err}) nor set aside ({move_err})"
                ),
            }),
        }
    }
    out.found.sort_by_key(|r| std::cmp::Reverse(r.saved_at));
    out
}

/// The moment `unix_s` seconds after the Unix epoch, if the system clock can hold it.
fn saved_at(unix_s: u64) -> Option<SystemTime> {
    UNIX_EPOCH.checked_add(Duration::from_secs(unix_s))
}

/// "3 min ago", "2 h ago", "5 days ago": how long ago a moment was.
#[must_use]
pub fn age_text(then: SystemTime, now: SystemTime) -> String {
    let s = now.duration_since(then).map_or(0, |d| d.as_secs());
    match s {
        0..60 => "less than a minute ago".into(),
        60..3600 => format!("{} min ago", s / 60),
        3600..172_800 => format!("{} h ago", s / 3600),
        _ => format!("{} days ago", s / 86_400),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn an_impossible_save_time_is_unknown_not_a_crash() {
        // A damaged info file can hold any u64; the largest must not overflow the clock.
        assert!(saved_at(u64::MAX).is_none());
        assert_eq!(saved_at(0), Some(UNIX_EPOCH));
    }

    fn named(name: &str) -> Plan {
        Plan {
            name: name.into(),
            ..Plan::default()
        }
    }

    fn file_names(dir: &Path) -> Vec<String> {
        let mut names: Vec<String> = fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        names.sort();
        names
    }

    #[test]
    fn waits_for_the_interval_or_a_focus_loss_and_clears_when_clean() {
        let dir = tempfile::tempdir().unwrap();
        let mut saver = Autosaver::start(dir.path(), Duration::from_secs(25)).unwrap();
        let t0 = Instant::now();
        let plan = named("edited");
        assert_eq!(saver.tick(&plan, false, None, false, t0), Tick::Idle);
        assert_eq!(
            saver.tick(&plan, true, None, false, t0),
            Tick::WaitFor(Duration::from_secs(25))
        );
        assert!(!saver.plan_file().exists());
        let t1 = t0 + Duration::from_secs(10);
        assert_eq!(
            saver.tick(&plan, true, None, false, t1),
            Tick::WaitFor(Duration::from_secs(15))
        );
        let t2 = t0 + Duration::from_secs(25);
        assert_eq!(saver.tick(&plan, true, None, false, t2), Tick::Wrote);
        assert_eq!(
            lampwright_plan::load_plan(&saver.plan_file()).unwrap(),
            plan
        );
        // Unchanged since: nothing more to write.
        assert_eq!(saver.tick(&plan, true, None, true, t2), Tick::Idle);
        // A focus loss writes a new change at once.
        let plan2 = named("edited again");
        assert_eq!(saver.tick(&plan2, true, None, true, t2), Tick::Wrote);
        assert_eq!(saver.writes(), 2);
        // Saved (clean): the autosave goes.
        assert_eq!(saver.tick(&plan2, false, None, false, t2), Tick::Cleared);
        assert!(!saver.plan_file().exists());
        let names = file_names(dir.path());
        assert_eq!(names.len(), 1, "only the lock file is left: {names:?}");
        assert!(
            Path::new(&names[0])
                .extension()
                .is_some_and(|e| e == "lock")
        );
        saver.finish().unwrap();
        assert!(file_names(dir.path()).is_empty());
    }

    #[test]
    fn a_running_window_slot_is_not_offered_and_a_gone_one_is() {
        let dir = tempfile::tempdir().unwrap();
        let origin = dir.path().join("shoot.ron");
        let mut running = Autosaver::start(dir.path(), Duration::ZERO).unwrap();
        running.write(&named("running"), Some(&origin)).unwrap();
        assert!(scan(dir.path()).found.is_empty(), "its lock is held");

        // Dropping the lock is what the operating system does when a process dies.
        drop(running.lock.take());
        let found = scan(dir.path()).found;
        assert_eq!(found.len(), 1);
        assert_eq!(found[0].plan, named("running"));
        assert_eq!(found[0].origin.as_deref(), Some(origin.as_path()));
        let age = SystemTime::now()
            .duration_since(found[0].saved_at.unwrap())
            .unwrap();
        assert!(age < Duration::from_hours(1), "{age:?}");
    }

    #[test]
    fn discard_keeps_the_plan_aside_and_forget_removes_the_slot() {
        let dir = tempfile::tempdir().unwrap();
        for name in ["first", "second"] {
            let mut saver = Autosaver::start(dir.path(), Duration::ZERO).unwrap();
            saver.write(&named(name), None).unwrap();
            drop(saver); // as after a crash: the files stay, the lock goes
        }
        let found = scan(dir.path()).found;
        assert_eq!(found.len(), 2);
        let kept = found[0].discard().unwrap();
        assert!(kept.extension().is_some_and(|e| e == "discarded"));
        let plan = lampwright_plan::load_plan(&kept).unwrap();
        assert_eq!(plan, found[0].plan, "the discarded plan is kept whole");
        found[1].forget().unwrap();
        assert!(scan(dir.path()).found.is_empty());
        let names = file_names(dir.path());
        assert_eq!(names.len(), 2, "{names:?}");
        assert!(
            names
                .iter()
                .all(|n| Path::new(n).extension().is_some_and(|e| e == "discarded")),
            "{names:?}"
        );
    }

    #[test]
    fn an_unreadable_autosave_is_set_aside_with_a_one_line_notice() {
        let dir = tempfile::tempdir().unwrap();
        fs::write(
            dir.path().join("autosave-1-2-3.ron"),
            "Plan(format_version: 1, name: ",
        )
        .unwrap();
        fs::write(dir.path().join("autosave-1-2-3.info"), "not ron at all").unwrap();
        fs::write(dir.path().join(".autosave-1-2-3.ron.tmp-1-0"), "torn").unwrap();
        let scan = scan(dir.path());
        assert!(scan.found.is_empty());
        assert_eq!(scan.notices.len(), 1);
        assert!(!scan.notices[0].contains('\n'), "{}", scan.notices[0]);
        assert!(scan.notices[0].contains("set aside"), "{}", scan.notices[0]);
        assert_eq!(
            file_names(dir.path()),
            vec!["autosave-1-2-3.info.corrupt", "autosave-1-2-3.ron.corrupt"]
        );
    }

    #[test]
    fn a_missing_info_file_still_offers_the_plan_without_a_file() {
        let dir = tempfile::tempdir().unwrap();
        lampwright_plan::save_plan_atomic(&dir.path().join("autosave-9.ron"), &named("x")).unwrap();
        let found = scan(dir.path()).found;
        assert_eq!(found.len(), 1);
        assert_eq!(found[0].origin, None);
        assert!(found[0].saved_at.is_some(), "the file time stands in");
    }

    #[test]
    fn leftovers_without_a_plan_are_tidied_and_other_files_are_left_alone() {
        let dir = tempfile::tempdir().unwrap();
        for name in [
            "autosave-5.info",
            "autosave-5.lock",
            "notes.txt",
            "autosave-..ron",
        ] {
            fs::write(dir.path().join(name), "x").unwrap();
        }
        assert!(scan(dir.path()).found.is_empty());
        assert_eq!(file_names(dir.path()), vec!["autosave-..ron", "notes.txt"]);
        assert!(scan(&dir.path().join("missing")).found.is_empty());
    }

    #[test]
    fn ages_read_in_words() {
        let now = SystemTime::now();
        let ago = |s| age_text(now - Duration::from_secs(s), now);
        assert_eq!(ago(5), "less than a minute ago");
        assert_eq!(ago(180), "3 min ago");
        assert_eq!(ago(7200), "2 h ago");
        assert_eq!(ago(5 * 86_400), "5 days ago");
    }
}
