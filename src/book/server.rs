//! The shared back end: a PostgreSQL server given by its URL, for several benches or sites.
//! The same statements as the file, with `$n` placeholders; a lost connection, a refused
//! one and a wrong URL each become the book's own error, never a panic.

use std::str::FromStr;
use std::time::Duration;

use postgres::error::SqlState;
use postgres::fallible_iterator::FallibleIterator;
use postgres::types::ToSql;
use postgres::{Client, Config, NoTls};

use super::schema::Dialect;
use super::{BookError, Db, Ty, Val};

pub struct Server {
    client: Client,
    place: String,
    wait: Duration,
}

/// `url` with any password replaced by `***`, for messages.
pub fn without_password(url: &str) -> String {
    let Some((scheme, rest)) = url.split_once("://") else {
        return url.to_string();
    };
    let (auth, host) = match rest.rsplit_once('@') {
        Some((a, h)) => (Some(a), h),
        None => (None, rest),
    };
    let shown = match auth {
        Some(a) => match a.split_once(':') {
            Some((user, _)) => format!("{scheme}://{user}:***@{host}"),
            None => format!("{scheme}://{a}@{host}"),
        },
        None => url.to_string(),
    };
    // A password given as a parameter (`?password=...`) is hidden too.
    match shown.split_once('?') {
        Some((base, query)) => {
            let q: Vec<String> = query
                .split('&')
                .map(|kv| match kv.split_once('=') {
                    Some((k, _)) if k.eq_ignore_ascii_case("password") => format!("{k}=***"),
                    _ => kv.to_string(),
                })
                .collect();
            format!("{base}?{}", q.join("&"))
        }
        None => shown,
    }
}

/// The error and every cause under it, in one line.
fn chain(e: &dyn std::error::Error) -> String {
    let mut s = e.to_string();
    let mut src = e.source();
    while let Some(x) = src {
        let t = x.to_string();
        if !s.contains(&t) {
            s.push_str(": ");
            s.push_str(&t);
        }
        src = x.source();
    }
    s
}

impl Server {
    /// Connect to the server at `url`, waiting at most `wait` for the connection and for
    /// another session's locks.
    pub fn open(url: &str, wait: Duration) -> Result<Server, BookError> {
        let place = without_password(url);
        let mut config = Config::from_str(url).map_err(|e| BookError::BadUrl {
            place: place.clone(),
            detail: chain(&e),
        })?;
        if config.get_ssl_mode() == postgres::config::SslMode::Require {
            return Err(BookError::BadUrl {
                place,
                detail: "sslmode=require asks for TLS, which this build does not speak; use \
                         the server on a trusted network or through a local socket"
                    .into(),
            });
        }
        config
            .application_name("beltwright")
            .connect_timeout(wait.max(Duration::from_secs(1)));
        let client = config.connect(NoTls).map_err(|e| {
            let detail = chain(&e);
            // The server answered and said no (login, password, database): the URL is
            // wrong. Anything else: the server was not reached.
            if e.code().is_some() {
                BookError::Refused {
                    place: place.clone(),
                    detail,
                }
            } else {
                BookError::Unreachable {
                    place: place.clone(),
                    detail,
                }
            }
        })?;
        let mut s = Server {
            client,
            place,
            wait,
        };
        s.batch(&format!(
            "SET lock_timeout = {}; SET client_min_messages = warning",
            wait.as_millis().max(1)
        ))?;
        Ok(s)
    }

    fn classify(&self, e: postgres::Error) -> BookError {
        classify(&self.place, self.wait, e)
    }
}

/// The error the server or the connection gave, as the book's kinds.
fn classify(place: &str, wait: Duration, e: postgres::Error) -> BookError {
    let place = place.to_string();
    let detail = chain(&e);
    if e.is_closed() {
        return BookError::Lost { place, detail };
    }
    if let Some(c) = e.code() {
        return if *c == SqlState::ADMIN_SHUTDOWN
            || *c == SqlState::CRASH_SHUTDOWN
            || *c == SqlState::CANNOT_CONNECT_NOW
        {
            BookError::Lost { place, detail }
        } else if *c == SqlState::DISK_FULL {
            BookError::Full { place, detail }
        } else if *c == SqlState::READ_ONLY_SQL_TRANSACTION {
            BookError::ReadOnly { place, detail }
        } else if *c == SqlState::LOCK_NOT_AVAILABLE {
            BookError::Busy {
                place,
                waited_s: wait.as_secs_f64(),
            }
        } else {
            BookError::Other { place, detail }
        };
    }
    // No answer from the server: the connection broke under the command when the cause is
    // the socket; anything else (a value the client could not send) is ours.
    let mut src: Option<&(dyn std::error::Error + 'static)> = std::error::Error::source(&e);
    while let Some(x) = src {
        if x.is::<std::io::Error>() {
            return BookError::Lost { place, detail };
        }
        src = x.source();
    }
    BookError::Other { place, detail }
}

fn boxed(v: &Val) -> Box<dyn ToSql + Sync> {
    match v {
        Val::I(x) => Box::new(*x),
        Val::F(x) => Box::new(*x),
        Val::T(x) => Box::new(x.clone()),
    }
}

impl Db for Server {
    fn dialect(&self) -> Dialect {
        Dialect::Postgres
    }

    fn place(&self) -> &str {
        &self.place
    }

    fn exec(&mut self, sql: &str, params: &[Val]) -> Result<u64, BookError> {
        let mut n = 0;
        self.each(sql, params, &[], &mut |_| {
            n += 1;
            Ok(())
        })?;
        Ok(n)
    }

    fn batch(&mut self, sql: &str) -> Result<(), BookError> {
        self.client.batch_execute(sql).map_err(|e| self.classify(e))
    }

    fn each(
        &mut self,
        sql: &str,
        params: &[Val],
        cols: &[Ty],
        f: &mut dyn FnMut(Vec<Val>) -> Result<(), BookError>,
    ) -> Result<(), BookError> {
        let sql = Dialect::Postgres.sql(sql);
        let owned: Vec<Box<dyn ToSql + Sync>> = params.iter().map(boxed).collect();
        let refs: Vec<&dyn ToSql> = owned.iter().map(|b| b.as_ref() as &dyn ToSql).collect();
        let place = self.place.clone();
        let wait = self.wait;
        let mut it = match self.client.query_raw(sql.as_str(), refs) {
            Ok(it) => it,
            Err(e) => return Err(classify(&place, wait, e)),
        };
        loop {
            let row = match it.next() {
                Ok(Some(r)) => r,
                Ok(None) => break,
                Err(e) => return Err(classify(&place, wait, e)),
            };
            let mut out = Vec::with_capacity(cols.len());
            for (i, ty) in cols.iter().enumerate() {
                let v = match ty {
                    Ty::I => row.try_get::<_, Option<i64>>(i).map(Val::I),
                    Ty::F => row.try_get::<_, Option<f64>>(i).map(Val::F),
                    Ty::T => row.try_get::<_, Option<String>>(i).map(Val::T),
                };
                out.push(v.map_err(|e| BookError::Other {
                    place: place.clone(),
                    detail: chain(&e),
                })?);
            }
            f(out)?;
        }
        Ok(())
    }

    fn begin(&mut self) -> Result<(), BookError> {
        // One writer at a time on the book, for the transaction's life (lock_timeout bounds
        // the wait), as SQLite's write lock does.
        self.batch("BEGIN; SELECT pg_advisory_xact_lock(7312604)")
    }

    fn begin_read(&mut self) -> Result<(), BookError> {
        self.batch("BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY")
    }

    fn schema_version(&mut self) -> Result<Option<i64>, BookError> {
        let mut tables = Vec::new();
        self.each(
            "SELECT table_name::text FROM information_schema.tables WHERE table_schema = \
             current_schema() AND table_name IN ('book_schema', 'records', 'entries')",
            &[],
            &[Ty::T],
            &mut |r| {
                if let Some(Val::T(Some(n))) = r.into_iter().next() {
                    tables.push(n);
                }
                Ok(())
            },
        )?;
        if tables.is_empty() {
            return Ok(None);
        }
        if !tables.iter().any(|t| t == "book_schema") {
            return Err(BookError::Damaged {
                place: self.place.clone(),
                detail: "the database has tables named records or entries that are not a \
                         book's"
                    .into(),
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
