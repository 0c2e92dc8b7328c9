//! The span tool's recommendation in words ([`Recommendation`]): the analysis states which
//! span and why in numbers; this is the one place that becomes a sentence (its `Display`,
//! and the JSON `reason` string).

use super::{Say, worded};
use std::fmt;

use itertools::Itertools;

use crate::numbering::num;
use crate::pitch::Recommendation;

impl fmt::Display for Say<'_, Recommendation> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.0 {
            Recommendation::LeastContent {
                span,
                span_over_pole_pitch,
                winding,
                floor,
                harmonics,
                orders,
                candidates,
            } => {
                let cuts = harmonics
                    .iter()
                    .map(|h| format!("k_w{} to {}", num(h.order.get(), 3), num(h.winding, 3)))
                    .join(", ");
                let named = orders.iter().map(|o| num(*o, 3)).join(", ");
                write!(
                    f,
                    "Span {span} ({} of a pole pitch) keeps k_w1 = {} at or above {} and brings \
                     {cuts}, the least content of orders {named} among the {candidates} spans \
                     that keep the floor.",
                    num(*span_over_pole_pitch, 3),
                    num(*winding, 3),
                    num(*floor, 3),
                )
            }
            Recommendation::HighestFundamental {
                floor,
                span,
                winding,
            } => write!(
                f,
                "No span reaches k_w1 = {}; span {span} has the highest fundamental ({}).",
                num(*floor, 3),
                num(*winding, 3)
            ),
            Recommendation::NoneBalanced => {
                f.write_str("No span gives a balanced winding on this core.")
            }
        }
    }
}

worded!(Recommendation);
