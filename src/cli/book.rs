//! `beltwright book ...`: open the book where the user keeps it, file, find, show, export,
//! back up and restore records, and say what happened.

use std::io::Write;
use std::path::{Path, PathBuf};
use std::time::{Duration, SystemTime};

use beltwright::book::{Access, Added, Book, BookError, NewEntry, Place};
use beltwright::card;
use beltwright::header;
use beltwright::layout;
use beltwright::output::book_report::RecordView;
use beltwright::output::{self, Format};
use beltwright::record::{self, Criteria, Entry, Key, Span, Stage};
use beltwright::winding;

use super::args::{BookAction, BookArgs, FindArgs};
use super::commands::{plan_failure, read_spec_source};
use super::files::{self, write_set};
use super::{Failure, Printed};

/// Largest backup file `book load` reads, bytes.
const MAX_BACKUP_BYTES: u64 = 4 * 1024 * 1024 * 1024;

impl From<BookError> for Failure {
    fn from(e: BookError) -> Self {
        Failure {
            status: e.status(),
            message: e.to_string(),
            report: None,
        }
    }
}

/// Where the book is: `--db`, else `BELTWRIGHT_BOOK`, else `book.sqlite` under the
/// platform's data folder (`$XDG_DATA_HOME/beltwright` on Linux).
fn place(db: Option<&str>) -> Result<Place, Failure> {
    if let Some(d) = db {
        return Ok(Place::parse(d));
    }
    if let Some(d) = std::env::var_os("BELTWRIGHT_BOOK").filter(|v| !v.is_empty()) {
        return Ok(Place::parse(&d.to_string_lossy()));
    }
    dirs::data_dir()
        .map(|d| Place::File(d.join("beltwright").join("book.sqlite")))
        .ok_or_else(|| {
            Failure::input(
                "no data folder is known on this machine: give the book with --db FILE or \
                 BELTWRIGHT_BOOK",
            )
        })
}

/// The book's own files (the file, its write-ahead log and shared memory), which no
/// output may replace.
fn book_files(place: &Place) -> Vec<PathBuf> {
    match place {
        Place::File(p) => ["", "-wal", "-shm"]
            .iter()
            .map(|end| PathBuf::from(format!("{}{end}", p.display())))
            .collect(),
        Place::Server(_) => Vec::new(),
    }
}

fn say(text: String) -> Printed {
    Box::new(move |out: &mut dyn Write| out.write_all(text.as_bytes()))
}

/// Run a `book` command.
pub fn run(a: BookArgs) -> Result<Printed, Failure> {
    let place = place(a.db.as_deref())?;
    let wait = Duration::from_secs_f64(a.wait);
    match a.action {
        BookAction::Add {
            file,
            stage,
            record,
            remark,
            by,
        } => {
            let new = new_entry(&file, stage.map(Into::into), record, remark, by)?;
            let mut book = Book::open(&place, wait, Access::Write)?;
            Ok(say(match book.add(&new)? {
                Added::Filed {
                    entry,
                    record,
                    stage,
                    version,
                    supersedes,
                } => {
                    let corrects = supersedes
                        .map(|s| format!(", correcting entry {s} (kept)"))
                        .unwrap_or_default();
                    format!(
                        "filed {} as record {record}, {} version {version} (entry {entry}{corrects}) in {}\n",
                        file.display(),
                        stage.name(),
                        place.shown()
                    )
                }
                Added::Duplicate {
                    entry,
                    record,
                    stage,
                    version,
                } => format!(
                    "{} is already in the book (same layout, same job): record {record}, {} \
                     version {version}, entry {entry}; not filed again\n",
                    file.display(),
                    stage.name()
                ),
            }))
        }
        BookAction::Find(f) => {
            let c = criteria(&f);
            let mut book = Book::open(&place, wait, Access::Read)?;
            let found = book.find(&c, f.limit)?;
            let format: Format = f.format.into();
            Ok(Box::new(move |out: &mut dyn Write| {
                output::write(&found, format, out)
            }))
        }
        BookAction::Show { record, format } => {
            let mut book = Book::open(&place, wait, Access::Read)?;
            let history = book.history(record)?;
            let card = record::headline(&history).and_then(|e| card_of(e).ok());
            let format: Format = format.into();
            Ok(Box::new(move |out: &mut dyn Write| {
                let view = RecordView {
                    history: &history,
                    card: card.as_ref(),
                };
                output::write(&view, format, out)
            }))
        }
        BookAction::Export {
            record,
            stage,
            version,
            output,
        } => {
            let mut book = Book::open(&place, wait, Access::Read)?;
            let history = book.history(record)?;
            let e = pick(&history, stage.map(Into::into), version)?;
            match output {
                None => Ok(say(e.layout.clone())),
                Some(out) => {
                    write_set(
                        &[(out.clone(), e.layout.clone().into_bytes())],
                        &Vec::new,
                        &book_files(&place)
                            .iter()
                            .map(PathBuf::as_path)
                            .collect::<Vec<_>>(),
                        "-o",
                    )?;
                    Ok(say(format!(
                        "wrote {} (record {record}, {} version {})\n",
                        out.display(),
                        e.stage.name(),
                        e.version
                    )))
                }
            }
        }
        BookAction::Dump { output } => {
            let mut book = Book::open(&place, wait, Access::Read)?;
            let mut bytes = Vec::new();
            let mut n = 0usize;
            book.each_entry(&mut |e| {
                serde_json::to_writer(&mut bytes, &e).map_err(|x| BookError::Other {
                    place: place.shown(),
                    detail: format!("cannot write entry {}: {x}", e.id),
                })?;
                bytes.push(b'\n');
                n += 1;
                Ok(())
            })?;
            match output {
                None => Ok(Box::new(move |out: &mut dyn Write| out.write_all(&bytes))),
                Some(out) => {
                    write_set(
                        &[(out.clone(), bytes)],
                        &Vec::new,
                        &book_files(&place)
                            .iter()
                            .map(PathBuf::as_path)
                            .collect::<Vec<_>>(),
                        "-o",
                    )?;
                    Ok(say(format!("wrote {} ({n} entries)\n", out.display())))
                }
            }
        }
        BookAction::Load { file } => {
            let entries = read_backup(&file)?;
            let mut book = Book::open(&place, wait, Access::Write)?;
            let l = book.load(&entries).map_err(|e| match e {
                BookError::Backup { line, detail } => Failure::input(format!(
                    "{}: line {line}: {detail}; nothing of the backup was loaded",
                    file.display()
                )),
                other => other.into(),
            })?;
            Ok(say(format!(
                "loaded {} entries from {} into {} ({} already there, skipped)\n",
                l.filed,
                file.display(),
                place.shown(),
                l.skipped
            )))
        }
    }
}

/// Read a layout, plan it (a coil list as found, so a faulty one is still filed), and work
/// out the figures it is filed by.
fn new_entry(
    file: &Path,
    stage: Option<Stage>,
    record: Option<i64>,
    remark: Option<String>,
    by: Option<String>,
) -> Result<NewEntry, Failure> {
    let (spec, name, source) = read_spec_source(file)?;
    let w = winding::build_lenient(&spec).map_err(|e| plan_failure(&name, &source, &spec, &e))?;
    let h = header::of(&w);
    let c = card::card(&w);
    let figures = record::figures(&w, &h, &c);
    let readings = w
        .design
        .measured
        .as_ref()
        .and_then(|m| serde_json::to_value(m).ok());
    let stage = stage.unwrap_or(if spec.coils.is_empty() {
        Stage::Design
    } else {
        Stage::AsFound
    });
    let added_by = by
        .or_else(|| std::env::var("USER").ok())
        .or_else(|| std::env::var("LOGNAME").ok())
        .or_else(|| std::env::var("USERNAME").ok())
        .filter(|s| !s.trim().is_empty())
        .unwrap_or_else(|| "unknown".into());
    Ok(NewEntry {
        record,
        stage,
        remark,
        layout: source,
        figures,
        readings,
        added_by,
        added_at: humantime::format_rfc3339_seconds(SystemTime::now()).to_string(),
    })
}

/// The card of a filed entry, planned from its layout as filed.
fn card_of(e: &Entry) -> Result<card::DataCard, Failure> {
    let name = format!("entry {}", e.id);
    let spec = layout::parse(&e.layout, &name).map_err(|x| Failure::input(x.to_string()))?;
    let w = winding::build_lenient(&spec).map_err(|x| plan_failure(&name, &e.layout, &spec, &x))?;
    Ok(card::card(&w))
}

/// The entry `export` writes: the given stage and version, else the latest.
fn pick(h: &record::History, stage: Option<Stage>, version: Option<u32>) -> Result<Entry, Failure> {
    let found = match (stage, version) {
        (None, None) => record::headline(h).cloned(),
        (Some(s), None) => h
            .entries
            .iter()
            .filter(|e| e.stage == s)
            .max_by_key(|e| e.version)
            .cloned(),
        (Some(s), Some(v)) => h
            .entries
            .iter()
            .find(|e| e.stage == s && e.version == v)
            .cloned(),
        (None, Some(v)) => {
            let of: Vec<&Entry> = h.entries.iter().filter(|e| e.version == v).collect();
            if of.len() > 1 {
                let stages: Vec<&str> = of.iter().map(|e| e.stage.name()).collect();
                return Err(Failure::input(format!(
                    "record {} has a version {v} of {}: give --stage",
                    h.record,
                    stages.join(" and ")
                )));
            }
            of.first().map(|e| (*e).clone())
        }
    };
    found.ok_or_else(|| {
        let have: Vec<String> = h
            .entries
            .iter()
            .map(|e| format!("{} v{}", e.stage.name(), e.version))
            .collect();
        Failure::from(BookError::NoEntry {
            record: h.record,
            what: format!(
                "{}{}; it has {}",
                stage.map_or("entry".to_string(), |s| format!("{} entry", s.name())),
                version.map(|v| format!(" version {v}")).unwrap_or_default(),
                have.join(", ")
            ),
        })
    })
}

fn criteria(f: &FindArgs) -> Criteria {
    let span = |r: &Option<(f64, f64)>| r.map(|(low, high)| Span { low, high });
    let ranges = [
        (Key::Slots, span(&f.slots)),
        (Key::Poles, span(&f.poles)),
        (Key::Layers, span(&f.layers)),
        (Key::Pitch, span(&f.pitch)),
        (Key::Turns, span(&f.turns)),
        (Key::WireMm, span(&f.wire_mm)),
        (Key::BoreMm, span(&f.bore_mm)),
        (Key::StackMm, span(&f.stack_mm)),
        (Key::PowerKw, span(&f.power_kw)),
        (Key::VoltageV, span(&f.voltage)),
        (Key::FrequencyHz, span(&f.frequency)),
    ]
    .into_iter()
    .filter_map(|(k, s)| s.map(|s| (k, s)))
    .collect();
    Criteria {
        ranges,
        frame: f.frame.clone().filter(|s| !s.trim().is_empty()),
        text: f
            .text
            .iter()
            .map(|t| t.trim().to_string())
            .filter(|t| !t.is_empty())
            .collect(),
    }
}

/// A backup's entries with their line numbers; a line that is not an entry is refused
/// with its number.
fn read_backup(path: &PathBuf) -> Result<Vec<(usize, Entry)>, Failure> {
    let name = path.display().to_string();
    let meta = std::fs::metadata(path)
        .map_err(|e| Failure::input(format!("{name}: cannot read the backup: {e}")))?;
    if !meta.is_file() {
        return Err(Failure::input(format!(
            "{name}: not a file; give a backup made by `beltwright book dump`"
        )));
    }
    if meta.len() > MAX_BACKUP_BYTES {
        return Err(Failure::input(format!(
            "{name}: larger than {MAX_BACKUP_BYTES} bytes; split it and load each part"
        )));
    }
    let text = files::read_text(path)
        .map_err(|e| Failure::input(format!("{name}: cannot read the backup: {e}")))?;
    let mut out = Vec::new();
    for (i, line) in text.lines().enumerate() {
        if line.trim().is_empty() {
            continue;
        }
        let e: Entry = serde_json::from_str(line).map_err(|e| {
            Failure::input(format!(
                "{name}: line {}: not an entry of a `book dump` backup ({e}); nothing was loaded",
                i + 1
            ))
        })?;
        out.push((i + 1, e));
    }
    Ok(out)
}
