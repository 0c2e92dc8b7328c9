//! How a two-winding core reads: the pair's own facts (which winding is where, its leads,
//! what the running winding induces in the idle one, the slots both fill) and then each
//! winding's own report, under a heading that says which it is.

use schemars::JsonSchema;
use serde::Serialize;

use super::json::{Opening, Worded};
use super::reports::paragraph;
use super::{Align, Format, Report, Section, Table, caution, num};
use crate::two_winding::{Coupling, Finding, Part, Position, Speed, TwoStudy, TwoWindingReport};
use crate::winding::Connection;

/// Which command's view of the pair.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum View {
    /// `plan`: each winding's plan.
    Plan,
    /// `factors`: each winding's factors.
    Factors,
    /// `field`: each winding's field.
    Field,
    /// `card`: each winding's card and the pair's copper and fill.
    Card,
    /// `audit`: each recorded winding's audit and the pair's findings.
    Audit,
}

/// A view of a two-winding study.
pub struct TwoWindingView<'a, 'w> {
    /// The study of both windings.
    pub study: &'a TwoStudy<'w>,
    /// Which view.
    pub view: View,
}

/// The JSON of a two-winding view: the first winding's own JSON of the view at the top
/// level (so the contract's `coils`, `winding_factor`, `rows`, `findings` read as for one
/// winding), the second's under `second_winding`, and the pair's report under `pair`.
#[derive(Serialize, JsonSchema)]
pub struct TwoWindingJson<'a> {
    /// The first winding's JSON of this view (its own `schema_version` and `caution`).
    #[serde(flatten)]
    first: serde_json::Map<String, serde_json::Value>,
    /// "two-winding".
    kind: &'static str,
    /// The second winding's JSON of this view, as for one winding.
    second_winding: serde_json::Map<String, serde_json::Value>,
    /// The pair: where each winding lies, its leads, the coupling, the slots both fill.
    pair: &'a TwoWindingReport,
    /// The pair's findings in words.
    pair_findings: Vec<Worded<'a, Finding>>,
}

/// A winding's name in words: "the 4-pole winding".
pub fn winding_name(p: &Part) -> String {
    format!("the {}-pole winding", p.poles)
}

/// Where a winding lies and what it is for, in a line.
pub fn part_line(i: usize, p: &Part) -> String {
    let speed = match p.speed {
        Speed::Low => "low speed",
        Speed::High => "high speed",
    };
    let at = match p.position {
        Position::Bottom => "bottom of the slots",
        Position::Top => "top of the slots, above the other",
        Position::OddSlots => "slots 1, 3, 5, ...",
        Position::EvenSlots => "slots 2, 4, 6, ...",
    };
    let rpm = p
        .synchronous_rpm
        .map(|r| format!(", {} rpm synchronous", num(r, 0)))
        .unwrap_or_default();
    format!(
        "Winding {} of 2, {} poles ({speed}{rpm}), {}: {at}",
        i + 1,
        p.poles,
        connection(p.connection)
    )
}

/// The title a winding's sheets carry: the layout's, then which winding.
pub fn sheet_title(title: Option<&str>, poles: usize, at: Position) -> String {
    let which = format!("{poles}-pole winding, {}", short_position(at));
    match title {
        Some(t) => format!("{t} · {which}"),
        None => which,
    }
}

fn short_position(p: Position) -> &'static str {
    match p {
        Position::Bottom => "bottom",
        Position::Top => "top",
        Position::OddSlots => "odd slots",
        Position::EvenSlots => "even slots",
    }
}

/// Where a winding lies, for a heading: "bottom of the slots", "odd slots".
fn place_words(p: Position) -> &'static str {
    match p {
        Position::Bottom => "bottom of the slots",
        Position::Top => "top of the slots",
        Position::OddSlots => "odd slots",
        Position::EvenSlots => "even slots",
    }
}

fn connection(c: Connection) -> &'static str {
    match c {
        Connection::Star => "star",
        Connection::Delta => "delta",
    }
}

fn volts(v: Option<f64>) -> String {
    v.map(|v| format!("{} V", num(v, 0)))
        .unwrap_or_else(|| "-".into())
}

/// A finding of the pair in words.
pub fn finding_words(r: &TwoWindingReport, f: &Finding) -> String {
    let name = |i: usize| winding_name(&r.windings[i]);
    match f {
        Finding::ClosedDeltaLoop {
            running,
            idle,
            loop_ratio,
            loop_v,
        } => format!(
            "while {} runs, {}'s three EMFs do not cancel round its delta: {} of the running \
             phase voltage{} drives a current round the closed delta, heating an idle winding. \
             Bring {} out with its delta open (leads = 6, closed only by its own speed's \
             contactor), or connect it in star",
            name(*running),
            name(*idle),
            percent(*loop_ratio),
            loop_v
                .map(|v| format!(" ({} V)", num(v, 0)))
                .unwrap_or_default(),
            name(*idle)
        ),
        Finding::PathsCirculate {
            running,
            idle,
            path_ratio,
            path_v,
        } => format!(
            "while {} runs, the parallel paths of {}'s phases have EMFs {} of the running \
             phase voltage apart{}: a current circulates between them, heating an idle \
             winding. Give {} one path, or paths that link the other field alike",
            name(*running),
            name(*idle),
            percent(*path_ratio),
            path_v
                .map(|v| format!(" ({} V)", num(v, 0)))
                .unwrap_or_default(),
            name(*idle)
        ),
        Finding::SlotsOverfull { fill, limit } => format!(
            "both windings fill the fullest slot to {} of its area; about {} is what goes in \
             by hand: thinner wire or fewer turns",
            percent(*fill),
            percent(*limit)
        ),
        Finding::Unbalanced { winding } => format!(
            "{} is not balanced: its phase EMFs differ (see its report below)",
            name(*winding)
        ),
        Finding::AuditFindings { winding, problems } => format!(
            "the audit of {} found {}: see its findings below",
            name(*winding),
            crate::numbering::count(*problems, "problem", "problems")
        ),
    }
}

fn percent(x: f64) -> String {
    format!("{} %", num(100.0 * x, 1))
}

fn capital(s: &str) -> String {
    let mut c = s.chars();
    c.next()
        .map(|f| f.to_uppercase().chain(c).collect())
        .unwrap_or_default()
}

/// The two windings side by side.
pub fn parts_table(r: &TwoWindingReport) -> Table {
    let mut t = Table::new(&[
        ("winding", Align::Left),
        ("poles", Align::Right),
        ("rpm", Align::Right),
        ("place", Align::Left),
        ("connection", Align::Left),
        ("k_w1", Align::Right),
        ("N_ph", Align::Right),
        ("leads", Align::Left),
    ]);
    for (i, p) in r.windings.iter().enumerate() {
        t.push(vec![
            (i + 1).to_string(),
            p.poles.to_string(),
            match (p.speed, p.synchronous_rpm) {
                (_, Some(n)) => num(n, 0),
                (Speed::Low, None) => "low".into(),
                (Speed::High, None) => "high".into(),
            },
            short_position(p.position).into(),
            connection(p.connection).into(),
            num(p.winding_factor, 4),
            num(p.series_turns_per_phase, 0),
            p.leads.join(" "),
        ]);
    }
    t
}

/// What each winding induces in the other while it runs.
pub fn coupling_table(r: &TwoWindingReport) -> Table {
    let paths = r.couplings.iter().any(|c| c.idle_paths > 1);
    let mut columns = vec![
        ("running", Align::Left),
        ("idle", Align::Left),
        ("idle phase", Align::Right),
    ];
    if paths {
        columns.push(("between paths", Align::Right));
    }
    columns.extend([
        ("idle leads", Align::Right),
        ("round a delta", Align::Right),
    ]);
    let mut t = Table::new(&columns);
    for c in &r.couplings {
        let Coupling { running, idle, .. } = c;
        let how = match (c.idle_connection, c.closed_inside) {
            (Connection::Star, _) => "star",
            (Connection::Delta, true) => "delta",
            (Connection::Delta, false) => "open delta",
        };
        let mut row = vec![
            format!("{}-pole", r.windings[*running].poles),
            format!("{}-pole ({how})", r.windings[*idle].poles),
            with_volts(Some(c.phase_ratio), c.idle_phase_v),
        ];
        if paths {
            row.push(with_volts(Some(c.path_ratio), c.path_v));
        }
        row.extend([
            with_volts(c.line_ratio, c.idle_line_v),
            with_volts(c.loop_ratio, c.loop_v),
        ]);
        t.push(row);
    }
    t
}

/// A ratio of the running phase voltage with its volts, or "-" where it has no meaning.
fn with_volts(ratio: Option<f64>, v: Option<f64>) -> String {
    match (ratio, v) {
        (Some(x), Some(_)) => format!("{} ({})", percent(x), volts(v)),
        (Some(x), None) => percent(x),
        (None, _) => "-".into(),
    }
}

/// The pair's summary lines.
pub fn summary(r: &TwoWindingReport) -> Vec<String> {
    let mut lines: Vec<String> = r
        .windings
        .iter()
        .enumerate()
        .map(|(i, p)| part_line(i, p))
        .collect();
    if let Some(f) = r.slot_fill {
        lines.push(format!(
            "{} the fullest slot to {} ({} wires; limit about {}).",
            match r.sharing {
                crate::spec::Sharing::Layers => "Both windings fill",
                crate::spec::Sharing::Slots => "Each slot holds one winding; its wire fills",
            },
            percent(f),
            r.wires_per_slot,
            percent(r.slot_fill_limit)
        ));
    }
    if let (Some(m), Some(o)) = (r.copper_mass_kg, r.wire_to_order_kg) {
        lines.push(format!(
            "Copper in both windings {} kg; wire to order {} kg.",
            num(m, 2),
            num(o, 2)
        ));
    }
    lines.push(
        "Each speed's contactor feeds its own winding's leads; the idle winding's leads stay \
         live with what the running one induces (table below): insulate them apart and never \
         join the two windings' leads."
            .into(),
    );
    for c in &r.couplings {
        if let Some(l) = c.loop_ratio
            && !c.closed_inside
            && l > crate::two_winding::CANCELS
        {
            lines.push(format!(
                "{}'s delta is brought out open: its contactor must leave it open while {} \
                 runs ({}{} round it).",
                capital(&winding_name(&r.windings[c.idle])),
                winding_name(&r.windings[c.running]),
                percent(l),
                c.loop_v
                    .map(|v| format!(" of the phase voltage, {} V,", num(v, 0)))
                    .unwrap_or_default()
            ));
        }
    }
    if r.sharing == crate::spec::Sharing::Layers {
        lines.push(
            "In each winding's own tables and sheets below, top and bottom are its own layers \
             within its share of the slot."
                .into(),
        );
    }
    lines.push(format!(
        "Test each winding's insulation against the other winding and the frame, the \
             winding not under test joined to the frame (IEC 60034-1's high-voltage test, \
             from memory){}",
        match r.sharing {
            crate::spec::Sharing::Layers => {
                "; the fill above leaves no room for a separator between the windings \
                     unless the slot area given allows for one."
            }
            crate::spec::Sharing::Slots => ".",
        }
    ));
    lines.iter().map(|l| paragraph(l)).collect()
}

/// The pair's sections: the windings, the coupling and the findings.
pub fn pair_sections(r: &TwoWindingReport) -> Vec<Section> {
    let mut s = vec![
        Section::Lines(summary(r)),
        Section::Table(parts_table(r)),
        Section::Heading("What the running winding induces in the idle one".into()),
        Section::Lines(vec![paragraph(
            "From the running winding's stepped MMF over a smooth gap at its rated phase \
             voltage; the rotor's damping of the field's harmonics is left out, so these are \
             upper estimates.",
        )]),
        Section::Table(coupling_table(r)),
    ];
    if r.findings.is_empty() {
        s.push(Section::Lines(vec![paragraph(
            "Nothing to act on between the two windings.",
        )]));
    } else {
        s.push(Section::Heading("To act on".into()));
        s.push(Section::Items(
            r.findings
                .iter()
                .enumerate()
                .map(|(n, f)| paragraph(&format!("{}. {}", n + 1, capital(&finding_words(r, f)))))
                .collect(),
        ));
    }
    s
}

impl TwoWindingView<'_, '_> {
    fn title(&self) -> String {
        let what = match self.view {
            View::Plan => "Plan",
            View::Factors => "Winding factors",
            View::Field => "Field",
            View::Card => "Data card",
            View::Audit => "Audit",
        };
        format!("{what} of two windings in one core")
    }

    /// Winding `i`'s own report of this view, as a JSON object and as sections.
    fn own(&self, i: usize) -> (serde_json::Map<String, serde_json::Value>, Vec<Section>) {
        let st = &self.study.studies()[i];
        fn of<R: Report>(r: &R) -> (serde_json::Map<String, serde_json::Value>, Vec<Section>) {
            let map = match serde_json::to_value(r.json()) {
                Ok(serde_json::Value::Object(m)) => m,
                _ => serde_json::Map::new(),
            };
            (map, r.sections())
        }
        match self.view {
            View::Plan => of(st.plan()),
            View::Factors => of(st.factors()),
            View::Field => match st.field() {
                Ok(f) => of(f),
                Err(_) => (serde_json::Map::new(), Vec::new()),
            },
            View::Card => of(st.card()),
            View::Audit => match st.audit() {
                Some(a) => of(a),
                None => (
                    serde_json::Map::new(),
                    vec![Section::Lines(vec![paragraph(
                        "Planned by beltwright, not recorded: nothing to audit. Audit the \
                         record of what was found in the core (coils marked winding = 1 or 2).",
                    )])],
                ),
            },
        }
    }

    /// Every finding of the pair: each recorded winding's audit's, then the pair's own.
    fn findings_table(&self) -> Table {
        use super::Words;
        let r = self.study.report();
        let mut t = Table::new(&[
            ("winding", Align::Left),
            ("kind", Align::Left),
            ("message", Align::Left),
        ]);
        for (i, st) in self.study.studies().iter().enumerate() {
            for f in st
                .audit()
                .map(|a| a.findings.as_slice())
                .unwrap_or_default()
            {
                let kind = serde_json::to_value(f.kind)
                    .ok()
                    .and_then(|v| v.as_str().map(str::to_string))
                    .unwrap_or_default();
                t.push(vec![(i + 1).to_string(), kind, f.message()]);
            }
        }
        for f in r.findings.iter().filter(|f| f.between()) {
            let kind = serde_json::to_value(f)
                .ok()
                .and_then(|v| v.get("kind").and_then(|k| k.as_str()).map(str::to_string))
                .unwrap_or_default();
            t.push(vec!["both".into(), kind, capital(&finding_words(r, f))]);
        }
        t
    }

    /// Winding `i`'s own main table of this view (the pair's table where it has none).
    fn own_table(&self, i: usize) -> Table {
        let st = &self.study.studies()[i];
        match self.view {
            View::Plan => st.plan().main_table(),
            View::Factors => st.factors().main_table(),
            View::Field => match st.field() {
                Ok(f) => f.main_table(),
                Err(_) => parts_table(self.study.report()),
            },
            View::Card => st.card().main_table(),
            View::Audit => match st.audit() {
                Some(a) => a.main_table(),
                None => parts_table(self.study.report()),
            },
        }
    }

    fn sound(&self) -> bool {
        self.study.report().findings.is_empty()
    }
}

/// How many problems the audit of a two-winding core found: each recorded winding's
/// findings, a synthesized winding that is not balanced, and the findings between them.
pub fn problems(study: &TwoStudy) -> usize {
    let r = study.report();
    let own: usize = study
        .studies()
        .iter()
        .zip(&r.windings)
        .map(|(s, p)| match s.audit() {
            Some(a) => a.findings.len(),
            None => usize::from(!p.balanced),
        })
        .sum();
    own + r.findings.iter().filter(|f| f.between()).count()
}

impl Report for TwoWindingView<'_, '_> {
    fn json(&self) -> impl Serialize + '_ {
        let r = self.study.report();
        let (mut first, _) = self.own(0);
        let (second, _) = self.own(1);
        if first.is_empty() {
            // Keep the opening every JSON begins with.
            if let Ok(serde_json::Value::Object(o)) = serde_json::to_value(Opening::default()) {
                first = o;
            }
        }
        // The audit's verdict at the top level is the whole core's: neither winding nor
        // the pair has anything to act on (each winding's own is in its findings).
        if self.view == View::Audit {
            first.insert("sound".into(), serde_json::Value::Bool(self.sound()));
        }
        TwoWindingJson {
            first,
            kind: "two-winding",
            second_winding: second,
            pair: r,
            pair_findings: r
                .findings
                .iter()
                .map(|f| Worded {
                    fact: f,
                    message: finding_words(r, f),
                })
                .collect(),
        }
    }

    fn sections(&self) -> Vec<Section> {
        let r = self.study.report();
        let mut s = vec![Section::Heading(self.title())];
        s.push(caution());
        s.extend(pair_sections(r));
        for (i, p) in r.windings.iter().enumerate() {
            s.push(Section::Heading(format!(
                "Winding {} of 2: {} poles, {}",
                i + 1,
                p.poles,
                place_words(p.position)
            )));
            let (_, own) = self.own(i);
            // The caution is printed once, at the top.
            s.extend(
                own.into_iter()
                    .filter(|x| !matches!(x, Section::Caution(_))),
            );
        }
        s
    }

    /// Each winding's own table of the view, one after the other, with the winding's
    /// number in front (the pair's table when the two have different columns); the audit's
    /// is every finding, each winding's and the pair's.
    fn main_table(&self) -> Table {
        if self.view == View::Audit {
            return self.findings_table();
        }
        let own = [self.own_table(0), self.own_table(1)];
        if own[0].headers != own[1].headers {
            return parts_table(self.study.report());
        }
        let mut t = Table::new(&[("winding", Align::Right)]);
        t.headers.extend(own[0].headers.iter().cloned());
        t.align.extend(own[0].align.iter().copied());
        for (i, o) in own.into_iter().enumerate() {
            for row in o.rows {
                let mut r = vec![(i + 1).to_string()];
                r.extend(row);
                t.push(r);
            }
        }
        t
    }
}

/// Write the view in `format`; CSV is the table of the two windings.
pub fn write(
    study: &TwoStudy,
    view: View,
    format: Format,
    out: &mut dyn std::io::Write,
) -> std::io::Result<()> {
    super::write(&TwoWindingView { study, view }, format, out)
}
