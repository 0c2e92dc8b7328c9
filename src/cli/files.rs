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

/// Temporary files not yet renamed into place, for the signal handler.
static PENDING: Mutex<Vec<PathBuf>> = Mutex::new(Vec::new());

/// Remove temporary files on SIGINT, SIGTERM and SIGHUP, then exit 130 as a shell does.
pub fn clean_up_on_signals() {
    let _ = ctrlc::set_handler(|| {
        if let Ok(list) = PENDING.lock() {
            for p in list.iter() {
                let _ = std::fs::remove_file(p);
            }
        }
        std::process::exit(130);
    });
}

fn pending(path: &Path, add: bool) {
    if let Ok(mut list) = PENDING.lock() {
        if add {
            list.push(path.to_path_buf());
        } else {
            list.retain(|p| p != path);
        }
    }
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

/// Write `files` as one set: all of them or none. `stale` are pages of an earlier set under
/// the same name that this set does not have; they are removed. `inputs` are never
/// written over.
pub fn write_set(
    files: &[(PathBuf, Vec<u8>)],
    stale: &[PathBuf],
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
            pending(&tmp, true);
            temps.push(tmp.clone());
            let mut f = OpenOptions::new()
                .write(true)
                .create_new(true)
                .open(&tmp)
                .map_err(|e| fail(path, e))?;
            f.write_all(bytes).map_err(|e| fail(path, e))?;
            f.sync_all().map_err(|e| fail(path, e))?;
        }
        for ((path, _), tmp) in files.iter().zip(&temps) {
            std::fs::rename(tmp, path).map_err(|e| fail(path, e))?;
            pending(tmp, false);
        }
        for s in stale {
            if std::fs::metadata(s).is_ok_and(|m| m.is_file()) {
                let _ = std::fs::remove_file(s);
            }
        }
        Ok(())
    })();
    if result.is_err() {
        for t in &temps {
            let _ = std::fs::remove_file(t);
            pending(t, false);
        }
    }
    let _ = lock.unlock();
    result
}
