//! beltwright's model: what a winding is. The design ([`design::Design`]: core, supply,
//! wire, secondary, the designer's choices), the validated layout ([`spec::Spec`]), the
//! winding built from it ([`winding::Winding`]: the design plus its coils, by synthesis or
//! as recorded), the star-of-slots kernel ([`winding::star`], [`factors`]), slot and coil
//! numbering, label cleaning and the standard wire tables.
//!
//! Nothing here knows the analyses, the presenters, TOML or the file system: the crates
//! above depend on this one, never the other way round.

pub mod design;
pub mod factors;
pub mod iron;
pub mod network;
pub mod numbering;
pub mod sanitize;
pub mod spec;
pub mod units;
pub mod winding;
pub mod wire;
