//! Shop-floor drawings: the developed slot layout, the coil-connection diagram with its
//! winding schedule, and the star of slots, as SVG pages (exported to PDF and PNG by
//! [`export`]).
//!
//! Every sheet is a pure function of a winding's study (`Study`: the winding and its reports,
//! each worked out once) and a [`Page`] returning SVG text; shared
//! helpers give the paper ([`page`]), the title block and caution ([`title`]) and the phase
//! colours and dash patterns ([`palette`]). Elements a test (or a person) may want to count
//! carry a `class` and `data-` attributes; user text only ever appears in text nodes, which
//! the `svg` crate escapes.

pub mod board;
pub mod card;
pub mod chart;
pub mod connections;
pub mod export;
pub mod field;
pub mod page;
pub mod palette;
pub mod plates;
pub mod section;
pub mod single_phase;
pub mod slots;
pub mod span;
pub mod star;
pub mod tables;
mod text;
pub mod thrust;
pub mod title;
pub mod two_speed;

pub use export::{ExportError, FileKind};
pub use page::{Orientation, Page, PaperSize};
pub use text::BUNDLED_FONT;

/// The sheets beltwright draws.
///
/// A new sheet is a variant here, a file beside the others with
/// `pub fn draw(s: &Study, page: &Page)`, and one arm in [`draw`]; the CLI, exporters and
/// `plan --out` need no other change.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Sheet {
    /// The core unrolled flat: slots, coil sides, spans, groups and phase belts.
    Slots,
    /// Coil groups in connection order, jumpers, leads and the winding schedule.
    Connections,
    /// The star of slots with phase sectors and phase EMF phasors.
    Star,
    /// The travelling field: MMF snapshots over a period, its travel, and its spectrum.
    Field,
    /// The winding data card: wire, copper, resistances, leads and acceptance figures.
    Card,
    /// A flat primary's thrust, normal force and current against speed.
    Thrust,
    /// The fullest slot to scale with its wires, the fill and the core's loadings.
    Section,
}

impl Sheet {
    /// Every sheet, in the order a report prints them.
    pub const ALL: [Sheet; 7] = [
        Sheet::Slots,
        Sheet::Connections,
        Sheet::Star,
        Sheet::Field,
        Sheet::Card,
        Sheet::Thrust,
        Sheet::Section,
    ];

    /// Whether the sheet has something to show for this winding (the performance sheet
    /// needs a flat primary with its plate and gap); a report leaves out those that do not.
    pub fn applies(self, s: &crate::study::Study) -> bool {
        match self {
            // A single-phase stator's slot and connection sheets speak of its main and
            // auxiliary windings and lead tables; its card and field are its own pages
            // (`single_phase_report::SHEET_VIEWS`), and the star of slots and slot section
            // speak of a polyphase winding's phases and card.
            Sheet::Slots | Sheet::Connections if s.single_phase().is_some() => true,
            _ if s.single_phase().is_some() => false,
            Sheet::Thrust => thrust::applies(s),
            Sheet::Section => section::applies(s),
            _ => true,
        }
    }
}

impl Sheet {
    /// Name used in file names and the title block.
    pub fn name(self) -> &'static str {
        match self {
            Sheet::Slots => "slots",
            Sheet::Connections => "connections",
            Sheet::Star => "star",
            Sheet::Field => "field",
            Sheet::Card => "card",
            Sheet::Thrust => "thrust",
            Sheet::Section => "section",
        }
    }
}

/// What a sheet's ids carry besides its own name and page, so that the same sheet of the
/// two windings of one core can sit side by side on a page: "" for a machine of one
/// winding, "-speed1" or "-speed2" for a winding of a two-winding motor.
pub fn id_scope(w: &crate::winding::Winding) -> String {
    match w.design.leads.speed {
        0 => String::new(),
        n => format!("-speed{n}"),
    }
}

/// Draw one sheet of a winding: one SVG document per page (the connection sheet continues
/// its schedule on further pages when a winding has many coils).
pub fn draw(s: &crate::study::Study, sheet: Sheet, page: &Page) -> Vec<String> {
    match sheet {
        Sheet::Slots => slots::draw(s, page),
        Sheet::Connections => connections::draw(s, page),
        Sheet::Star => vec![star::draw(s, page)],
        Sheet::Field => vec![field::draw(s, page)],
        Sheet::Card => card::draw(s, page),
        Sheet::Thrust => vec![thrust::draw(s, page)],
        Sheet::Section => vec![section::draw(s, page)],
    }
}
