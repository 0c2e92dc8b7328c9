//! The data card sheet: the card's sections (wire, copper, leads, acceptance) set as tables
//! on the page, from the same sections the text presenter prints.

use super::page::Page;
use crate::output::Report;

/// The data card of `w`, over as many pages as it needs.
pub fn draw(s: &crate::study::Study, page: &Page) -> Vec<String> {
    super::tables::draw(s, "Data card", &s.card().sections(), page)
}
