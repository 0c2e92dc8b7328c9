//! The safety caution every report, sheet and page carries: windings run at mains voltage;
//! the tool plans and checks, it does not certify.

/// Beside the card's acceptance figures: whose procedures govern.
pub const ACCEPTANCE_NOTE: &str = "acceptance figures to compare against; the shop's own \
procedures, the machine maker's data and local codes govern";

/// Caution printed on every report and sheet.
pub const CAUTION: &str = "CAUTION: windings run at mains voltage. Work on them only \
de-energised and isolated; test insulation before energising; follow local electrical codes \
and have the work done or checked by qualified persons. beltwright plans, it does not certify.";
