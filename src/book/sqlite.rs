//! The embedded back end: one SQLite file, in WAL mode so one shell can read while another
//! writes, with a wait for the write lock and full syncs so a filed record survives a
//! crash.

use std::path::Path;
use std::time::Duration;

use rusqlite::types::{ToSqlOutput, ValueRef};
use rusqlite::{Connection, ErrorCode, OpenFlags, ToSql};

use super::schema::Dialect;
use super::{Access, BookError, Db, Ty, Val};

pub struct Sqlite {
    conn: Connection,
    place: String,
    wait: Duration,
}

impl ToSql for Val {
    fn to_sql(&self) -> rusqlite::Result<ToSqlOutput<'_>> {
        Ok(match self {
            Val::I(Some(x)) => ToSqlOutput::from(*x),
            Val::F(Some(x)) => ToSqlOutput::from(*x),
            Val::T(Some(x)) => ToSqlOutput::from(x.as_str()),
            Val::I(None) | Val::F(None) | Val::T(None) => ToSqlOutput::from(rusqlite::types::Null),
        })
    }
}

impl Sqlite {
    /// Open (for a write, make) the book file at `path`.
    pub fn open(path: &Path, wait: Duration, access: Access) -> Result<Sqlite, BookError> {
        let place = path.display().to_string();
        let meta = std::fs::metadata(path);
        match (&meta, access) {
            (Ok(m), _) if !m.is_file() => {
                return Err(BookError::Damaged {
                    place,
                    detail: "that is a folder or device, not a file".into(),
                });
            }
            (Err(e), _) if e.kind() != std::io::ErrorKind::NotFound => {
                return Err(BookError::Other {
                    place,
                    detail: format!("cannot look at the book file: {e}"),
                });
            }
            (Err(_), Access::Read) => return Err(BookError::Missing { place }),
            (Err(_), Access::Write) => {
                if let Some(dir) = path.parent().filter(|d| !d.as_os_str().is_empty()) {
                    std::fs::create_dir_all(dir).map_err(|e| BookError::Other {
                        place: place.clone(),
                        detail: format!("cannot make the folder {}: {e}", dir.display()),
                    })?;
                }
            }
            _ => {}
        }
        let mut flags = OpenFlags::SQLITE_OPEN_READ_WRITE | OpenFlags::SQLITE_OPEN_NO_MUTEX;
        if access == Access::Write {
            flags |= OpenFlags::SQLITE_OPEN_CREATE;
        }
        let conn =
            Connection::open_with_flags(path, flags).map_err(|e| classify(&place, wait, e))?;
        let mut db = Sqlite { conn, place, wait };
        if access == Access::Read && db.batch("SELECT 1 FROM sqlite_master LIMIT 1").is_err() {
            // A WAL book in a folder this user cannot write: SQLite cannot make the shared
            // memory file a reader needs. With no log waiting to be folded in (the last
            // writer folds it in when it closes), the file alone is the whole book, and it
            // is read as an unchanging file.
            let wal = std::path::PathBuf::from(format!("{}-wal", path.display()));
            if std::fs::metadata(&wal).map_or(true, |m| m.len() == 0) {
                let uri = format!("file:{}?immutable=1", uri_path(path));
                let conn = Connection::open_with_flags(
                    uri,
                    OpenFlags::SQLITE_OPEN_READ_ONLY
                        | OpenFlags::SQLITE_OPEN_URI
                        | OpenFlags::SQLITE_OPEN_NO_MUTEX,
                )
                .map_err(|e| classify(&db.place, wait, e))?;
                db.conn = conn;
                return Ok(db);
            }
        }
        db.conn
            .busy_timeout(wait)
            .map_err(|e| classify(&db.place, wait, e))?;
        // WAL lets readers and one writer work at once; it needs a write the first time, so
        // a read-only book keeps the journal it has.
        let wal = db
            .conn
            .query_row("PRAGMA journal_mode = WAL", [], |r| r.get::<_, String>(0));
        if let Err(e) = wal {
            let e = classify(&db.place, wait, e);
            if !matches!(e, BookError::ReadOnly { .. }) || access == Access::Write {
                return Err(e);
            }
        }
        db.batch("PRAGMA synchronous = FULL; PRAGMA foreign_keys = ON;")?;
        Ok(db)
    }
}

/// `path` for an SQLite `file:` URI: absolute, with the characters a URI reserves
/// escaped.
fn uri_path(path: &Path) -> String {
    let abs = std::path::absolute(path).unwrap_or_else(|_| path.to_path_buf());
    let mut out = String::new();
    for b in abs.to_string_lossy().bytes() {
        match b {
            b'%' | b'?' | b'#' => out.push_str(&format!("%{b:02X}")),
            _ => out.push(b as char),
        }
    }
    out
}

/// The error SQLite gave, as the book's kinds.
fn classify(place: &str, wait: Duration, e: rusqlite::Error) -> BookError {
    let detail = e.to_string();
    let place = place.to_string();
    match e.sqlite_error_code() {
        Some(ErrorCode::DatabaseBusy | ErrorCode::DatabaseLocked) => BookError::Busy {
            place,
            waited_s: wait.as_secs_f64(),
        },
        Some(ErrorCode::ReadOnly) => BookError::ReadOnly { place, detail },
        Some(ErrorCode::DiskFull) => BookError::Full { place, detail },
        Some(ErrorCode::NotADatabase | ErrorCode::DatabaseCorrupt) => {
            BookError::Damaged { place, detail }
        }
        Some(ErrorCode::SystemIoFailure) => BookError::Io { place, detail },
        Some(ErrorCode::CannotOpen | ErrorCode::PermissionDenied) => {
            BookError::ReadOnly { place, detail }
        }
        _ => BookError::Other { place, detail },
    }
}

impl Db for Sqlite {
    fn dialect(&self) -> Dialect {
        Dialect::Sqlite
    }

    fn place(&self) -> &str {
        &self.place
    }

    fn exec(&mut self, sql: &str, params: &[Val]) -> Result<u64, BookError> {
        let mut st = self
            .conn
            .prepare_cached(sql)
            .map_err(|e| classify(&self.place, self.wait, e))?;
        let p: Vec<&dyn ToSql> = params.iter().map(|v| v as &dyn ToSql).collect();
        // A statement that returns rows (a SELECT of a function) is stepped through.
        let mut rows = st
            .query(p.as_slice())
            .map_err(|e| classify(&self.place, self.wait, e))?;
        let mut n = 0;
        while rows
            .next()
            .map_err(|e| classify(&self.place, self.wait, e))?
            .is_some()
        {
            n += 1;
        }
        Ok(n)
    }

    fn batch(&mut self, sql: &str) -> Result<(), BookError> {
        self.conn
            .execute_batch(sql)
            .map_err(|e| classify(&self.place, self.wait, e))
    }

    fn each(
        &mut self,
        sql: &str,
        params: &[Val],
        cols: &[Ty],
        f: &mut dyn FnMut(Vec<Val>) -> Result<(), BookError>,
    ) -> Result<(), BookError> {
        let place = self.place.clone();
        let wait = self.wait;
        let mut st = self
            .conn
            .prepare_cached(sql)
            .map_err(|e| classify(&place, wait, e))?;
        let p: Vec<&dyn ToSql> = params.iter().map(|v| v as &dyn ToSql).collect();
        let mut rows = st
            .query(p.as_slice())
            .map_err(|e| classify(&place, wait, e))?;
        while let Some(row) = rows.next().map_err(|e| classify(&place, wait, e))? {
            let mut out = Vec::with_capacity(cols.len());
            for (i, ty) in cols.iter().enumerate() {
                let v = row.get_ref(i).map_err(|e| classify(&place, wait, e))?;
                out.push(match (ty, v) {
                    (Ty::I, ValueRef::Integer(x)) => Val::I(Some(x)),
                    (Ty::I, ValueRef::Real(x)) => Val::I(Some(x as i64)),
                    (Ty::I, _) => Val::I(None),
                    (Ty::F, ValueRef::Real(x)) => Val::F(Some(x)),
                    (Ty::F, ValueRef::Integer(x)) => Val::F(Some(x as f64)),
                    (Ty::F, _) => Val::F(None),
                    (Ty::T, ValueRef::Text(t)) => {
                        Val::T(Some(String::from_utf8_lossy(t).into_owned()))
                    }
                    (Ty::T, _) => Val::T(None),
                });
            }
            f(out)?;
        }
        Ok(())
    }

    fn begin(&mut self) -> Result<(), BookError> {
        self.batch("BEGIN IMMEDIATE")
    }

    fn begin_read(&mut self) -> Result<(), BookError> {
        self.batch("BEGIN")
    }

    fn schema_version(&mut self) -> Result<Option<i64>, BookError> {
        let mut names = Vec::new();
        self.each(
            "SELECT name FROM sqlite_master WHERE type = 'table'",
            &[],
            &[Ty::T],
            &mut |r| {
                if let Some(Val::T(Some(n))) = r.into_iter().next() {
                    names.push(n);
                }
                Ok(())
            },
        )?;
        if names.is_empty() {
            return Ok(None);
        }
        if !names.iter().any(|n| n == "book_schema") {
            return Err(BookError::Damaged {
                place: self.place.clone(),
                detail: "the file is an SQLite database with other tables".into(),
            });
        }
        let mut v = None;
        self.each(
            "SELECT max(version) FROM book_schema",
            &[],
            &[Ty::I],
            &mut |r| {
                if let Some(Val::I(x)) = r.into_iter().next() {
                    v = x;
                }
                Ok(())
            },
        )?;
        Ok(Some(v.unwrap_or(0)))
    }
}
