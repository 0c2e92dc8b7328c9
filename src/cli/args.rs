//! Argument values the command line offers, as clap enums mirroring the library's own, so
//! the library knows nothing of clap.

macro_rules! mirror {
    ($(#[$doc:meta])* $arg:ident => $lib:path { $($v:ident),* $(,)? }) => {
        $(#[$doc])*
        #[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
        pub enum $arg { $($v),* }
        impl From<$arg> for $lib {
            fn from(a: $arg) -> Self {
                match a { $($arg::$v => <$lib>::$v),* }
            }
        }
    };
}

mirror!(
    /// Output format.
    FormatArg => beltwright::output::Format { Text, Json, Csv }
);
mirror!(
    /// Order of the phase currents in time.
    SequenceArg => beltwright::field::Sequence { Positive, Negative }
);
mirror!(
    /// Which sheet to draw.
    SheetArg => beltwright::draw::Sheet { Slots, Connections, Star, Field, Card, Thrust }
);
mirror!(
    /// Paper size.
    PaperArg => beltwright::draw::PaperSize { A4, A3, Letter }
);
mirror!(
    /// Survey sort order.
    SortArg => beltwright::survey::SortKey { Slots, Poles, Winding, Leakage, Cogging }
);
