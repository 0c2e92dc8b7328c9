//! The data card sheet: the card's sections (wire, copper, leads, acceptance) set as tables
//! on the page, from the same sections the text presenter prints.

use super::page::Page;
use crate::output::Report;
use crate::winding::Winding;

/// The data card of `w`, over as many pages as it needs.
pub fn draw(w: &Winding, page: &Page) -> Vec<String> {
    super::tables::draw(w, "Data card", &crate::card::card(w).sections(), page)
}
