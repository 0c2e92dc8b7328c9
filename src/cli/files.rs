//! Files at the edge: reading a layout within a size cap, and writing outputs as a set.
//!
//! Every output is checked the same way: never over a file being read, never replacing a
//! device, FIFO or other non-regular file. A set of pages is written under a lock on its
//! folder, each page to a temporary file beside it (mode from the umask, like any file the
//! user makes), and renamed into place only when all are written; pages of an earlier,
//! longer set are removed. Temporary files are removed again on SIGINT, SIGTERM or SIGHUP.

use std::fs::{File, OpenOptions};
use std::io::{Read, Write};
use std::path::{Path, PathBuf};
use std::sync::Mutex;

use super::Failure;

/// Largest layout file read, bytes: a 10 000-coil record is about 600 kB.
pub const MAX_LAYOUT_BYTES: u64 = 1024 * 1024;

/// Temporary files not yet renamed into place, for the signal handler. The writer holds
/// this lock while it creates a temporary file and while it renames a set into place, so
/// the handler (which takes the same lock, cleans up and exits holding it) never runs
/// between the two halves of either step.
static PENDING: Mutex<Vec<PathBuf>> = Mutex::new(Vec::new());

/// Remove temporary files on SIGINT, SIGTERM and SIGHUP, then exit 130 as a shell does.
pub fn clean_up_on_signals() {
    let _ = ctrlc::set_handler(|| {
        let list = PENDING
            .lock()
            .unwrap_or_else(std::sync::PoisonError::into_inner);
        for p in list.iter() {
            let _ = std::fs::remove_file(p);
        }
        // Exit with the lock held: no writer can create or rename another file now.
        std::process::exit(130);
    });
}

/// Read a layout file: at most [`MAX_LAYOUT_BYTES`] from any file, device or pipe (the
/// size metadata is not trusted: a device reports 0), as UTF-8 text.
pub fn read_layout(path: &Path) -> Result<String, Failure> {
    let name = path.display().to_string();
    let fail =
        |e: std::io::Error| Failure::input(format!("{name}: cannot read the layout file: {e}"));
    let meta = std::fs::metadata(path).map_err(fail)?;
    if meta.is_dir() {
        return Err(Failure::input(format!(
            "{name}: that is a folder; give a layout file (.toml)"
        )));
    }
    let mut bytes = Vec::new();
    File::open(path)
        .map_err(fail)?
        .take(MAX_LAYOUT_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(fail)?;
    if bytes.len() as u64 > MAX_LAYOUT_BYTES {
        return Err(Failure::input(format!(
            "{name}: more than {MAX_LAYOUT_BYTES} bytes is too large for a layout file (a \
             10 000-coil record is about 600 kB)"
        )));
    }
    String::from_utf8(bytes)
        .map_err(|_| Failure::input(format!("{name}: the layout file is not UTF-8 text")))
}

/// A whole text file (UTF-8), for inputs read whole that are not layouts (a backup).
pub fn read_text(path: &Path) -> std::io::Result<String> {
    std::fs::read_to_string(path)
}

/// The same file, compared by the canonical path of its folder and its name, so a target
/// that does not exist yet is compared too.
fn same_file(a: &Path, b: &Path) -> bool {
    if let (Ok(x), Ok(y)) = (a.canonicalize(), b.canonicalize()) {
        return x == y;
    }
    let split = |p: &Path| {
        let dir = match p.parent() {
            Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
            _ => PathBuf::from("."),
        };
        (
            dir.canonicalize().ok(),
            p.file_name().map(|n| n.to_os_string()),
        )
    };
    let (da, na) = split(a);
    let (db, nb) = split(b);
    da.is_some() && da == db && na == nb
}

/// Refuse an output path that is one of the inputs, or that exists and is not a regular
/// file (a device, FIFO, socket or folder).
pub fn check_output(path: &Path, inputs: &[&Path], flag: &str) -> Result<(), Failure> {
    let name = path.display();
    if inputs.iter().any(|i| same_file(path, i)) {
        return Err(Failure::input(format!(
            "{flag} {name}: that is a file being read; give another file name for the output"
        )));
    }
    if let Ok(meta) = std::fs::metadata(path)
        && !meta.is_file()
    {
        return Err(Failure::input(format!(
            "{flag} {name}: that is not a regular file (a device, pipe or folder); give a \
             file name"
        )));
    }
    Ok(())
}

fn folder_of(path: &Path) -> PathBuf {
    match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// Whether `path` is a page this tool wrote as part of the set `set` (the file name of the
/// set's first page): an SVG sheet whose root, or a PNG whose `Comment` text chunk, names
/// that set. Only such pages are removed as stale; a file of the same name the user made,
/// or a page of another set, is left alone.
pub fn made_for(path: &Path, set: &str) -> bool {
    let mut head = Vec::new();
    let Ok(f) = File::open(path) else {
        return false;
    };
    if f.take(4096).read_to_end(&mut head).is_err() {
        return false;
    }
    let mark = beltwright::draw::export::set_mark(set);
    let mark = mark.as_bytes();
    head.windows(mark.len()).any(|w| w == mark)
}

/// Write `files` as one set: all of them or none. `stale` lists, under the folder's lock,
/// the pages of an earlier, longer set under the same names; those this tool wrote are
/// removed. `inputs` are never written over.
pub fn write_set(
    files: &[(PathBuf, Vec<u8>)],
    stale: &dyn Fn() -> Vec<(PathBuf, String)>,
    inputs: &[&Path],
    flag: &str,
) -> Result<(), Failure> {
    for (p, _) in files {
        check_output(p, inputs, flag)?;
    }
    let Some((first, _)) = files.first() else {
        return Ok(());
    };
    let dir = folder_of(first);
    let fail = |p: &Path, e: std::io::Error| {
        Failure::output(format!("{}: cannot write: {e}", p.display()))
    };
    // One writer at a time per folder: concurrent runs cannot tear a set.
    let lock = File::open(&dir).map_err(|e| fail(&dir, e))?;
    lock.lock().map_err(|e| fail(&dir, e))?;
    let mut temps: Vec<PathBuf> = Vec::with_capacity(files.len());
    let result = (|| {
        for (n, (path, bytes)) in files.iter().enumerate() {
            let tmp = folder_of(path).join(format!(
                ".{}.{}-{n}.tmp",
                path.file_name()
                    .map_or_else(String::new, |s| s.to_string_lossy().into_owned()),
                std::process::id()
            ));
            // Create and register under the signal handler's lock.
            let mut f = {
                let mut list = PENDING
                    .lock()
                    .unwrap_or_else(std::sync::PoisonError::into_inner);
                let f = OpenOptions::new()
                    .write(true)
                    .create_new(true)
                    .open(&tmp)
                    .map_err(|e| fail(path, e))?;
                list.push(tmp.clone());
                f
            };
            temps.push(tmp.clone());
            f.write_all(bytes).map_err(|e| fail(path, e))?;
            f.sync_all().map_err(|e| fail(path, e))?;
        }
        // Stale pages are listed only now, under the folder's lock.
        let stale: Vec<PathBuf> = stale()
            .into_iter()
            .filter(|(p, set)| std::fs::metadata(p).is_ok_and(|m| m.is_file()) && made_for(p, set))
            .map(|(p, _)| p)
            .collect();
        // Rename the whole set and remove the stale pages with the signal handler held off.
        let mut list = PENDING
            .lock()
            .unwrap_or_else(std::sync::PoisonError::into_inner);
        for ((path, _), tmp) in files.iter().zip(&temps) {
            std::fs::rename(tmp, path).map_err(|e| fail(path, e))?;
            list.retain(|p| p != tmp);
        }
        for s in stale {
            let _ = std::fs::remove_file(s);
        }
        drop(list);
        Ok(())
    })();
    if result.is_err() {
        let mut list = PENDING
            .lock()
            .unwrap_or_else(std::sync::PoisonError::into_inner);
        for t in &temps {
            let _ = std::fs::remove_file(t);
            list.retain(|p| p != t);
        }
    }
    let _ = lock.unlock();
    result
}
