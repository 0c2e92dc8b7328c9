//! Connection order and the winding schedule: each phase's coil groups per parallel path
//! in connection (slot) order, the order current takes through a group, and where each
//! coil's finish is joined.
//!
//! Conventions (common practice): every group is wound the same way, start at its left
//! slot and finish at its right; a reversed group (coils reaching backwards from their go
//! sides) is connected finish first. Groups of one path are joined in slot order.
//!
//! A pole-changing winding's lanes are its halves, not its paths: each phase's reversed
//! groups and its forward groups, each run from the phase's tap as the coil list writes it
//! (the way the double star feeds them), to the phase's own end lead (the reversed half)
//! or on to the next phase's end or the star point (the forward half), as
//! [`super::pole_change::six_leads_halves`] joins them.

use serde::Serialize;

use super::pole_change::{Lead, six_leads_halves};
use super::{CoilGroup, Winding};
use crate::numbering::{CoilNo, GroupNo, PathNo, SlotNo};

/// The groups of one phase and path, in connection order.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Lane {
    /// Phase index.
    pub phase: usize,
    /// Path index, 0-based.
    pub path: usize,
    /// Indices into the coil-group list, in connection order.
    pub groups: Vec<usize>,
    /// Where the lane starts.
    pub start: LaneEnd,
    /// Where it finishes.
    pub finish: LaneEnd,
    /// On a pole-changing winding, whether this half is the reversed one (its current
    /// reverses between the speeds); `None` for a path.
    pub reversed_half: Option<bool>,
}

/// Where a lane starts or finishes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LaneEnd {
    /// Its path's own start or finish lead, named by the lead scheme.
    Path,
    /// One of a pole-changing winding's six leads.
    Six(Lead),
    /// The star point inside a series-star pole-changing winding.
    StarPoint,
}

/// Every lane: each phase, each path (each half of a pole-changing winding's phases).
pub fn lanes(w: &Winding, groups: &[CoilGroup]) -> Vec<Lane> {
    let mut out = Vec::new();
    if let Some(pc) = w.design.pole_change {
        for (phase, reversed, from, to) in six_leads_halves(pc) {
            let end = |l: Option<Lead>| l.map_or(LaneEnd::StarPoint, LaneEnd::Six);
            // Each half runs from its tap as the coil list writes it.
            let (start, finish) = if reversed { (to, from) } else { (from, to) };
            out.push(Lane {
                phase,
                path: 0,
                groups: groups
                    .iter()
                    .enumerate()
                    .filter(|(_, g)| g.phase == phase && (g.polarity < 0) == reversed)
                    .map(|(i, _)| i)
                    .collect(),
                start: end(start),
                finish: end(finish),
                reversed_half: Some(reversed),
            });
        }
        return out;
    }
    for phase in 0..w.geometry.phases {
        for path in 0..w.parallel_paths.max(1) {
            let gs: Vec<usize> = groups
                .iter()
                .enumerate()
                .filter(|(_, g)| g.phase == phase && w.coils[g.coils[0]].path == path)
                .map(|(i, _)| i)
                .collect();
            out.push(Lane {
                phase,
                path,
                groups: gs,
                start: LaneEnd::Path,
                finish: LaneEnd::Path,
                reversed_half: None,
            });
        }
    }
    out
}

/// Coils of a group in the order current flows through them.
pub fn current_order(g: &CoilGroup) -> Vec<usize> {
    if g.polarity > 0 {
        g.coils.clone()
    } else {
        g.coils.iter().rev().copied().collect()
    }
}

/// Slots (0-based) where current enters a group and where it leaves it.
pub fn group_ends(w: &Winding, g: &CoilGroup) -> (usize, usize) {
    let order = current_order(g);
    let first = order.first().map_or(0, |&c| w.coils[c].go);
    let last = order.last().map_or(0, |&c| w.coils[c].back);
    (first, last)
}

/// Where a coil's finish is joined.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(tag = "to", rename_all = "snake_case")]
pub enum FinishTo {
    /// The start of the next coil of its group.
    Coil {
        /// That coil, from 1.
        coil: CoilNo,
    },
    /// The start of the next group of its path (a jumper).
    Group {
        /// That group, from 1.
        group: GroupNo,
        /// Its first coil in current order, from 1.
        coil: CoilNo,
    },
    /// The finish lead of its path.
    Lead,
    /// One of a pole-changing winding's six leads, as marked (its half ends there).
    SixLead {
        /// The lead: 1U, 1V, 1W (T1, T2, T3 under NEMA).
        lead: String,
    },
    /// The star point inside a series-star pole-changing winding.
    StarPoint,
}

/// One coil of the winding schedule, in connection order.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, schemars::JsonSchema)]
pub struct ScheduleRow {
    /// Coil, from 1.
    pub coil: CoilNo,
    /// Slot where current enters, from 1.
    pub go: SlotNo,
    /// Slot where current leaves, from 1.
    pub back: SlotNo,
    /// Turns.
    pub turns: u32,
    /// Phase label.
    pub phase: String,
    /// Phase index (0-based), for presenters.
    #[serde(skip)]
    #[schemars(skip)]
    pub phase_index: usize,
    /// Parallel path, from 1.
    pub path: PathNo,
    /// Coil group, from 1 (groups numbered in slot order).
    pub group: GroupNo,
    /// Where the coil's finish is joined.
    pub finish_to: FinishTo,
}

/// The winding schedule: every coil in connection order, phase by phase, path by path.
pub fn schedule(w: &Winding, groups: &[CoilGroup]) -> Vec<ScheduleRow> {
    let mut out = Vec::with_capacity(w.coils.len());
    for lane in lanes(w, groups) {
        for (n, &gi) in lane.groups.iter().enumerate() {
            let order = current_order(&groups[gi]);
            for (j, &c) in order.iter().enumerate() {
                let finish_to = if let Some(&next) = order.get(j + 1) {
                    FinishTo::Coil {
                        coil: CoilNo::at(next),
                    }
                } else if let Some(&next) = lane.groups.get(n + 1) {
                    FinishTo::Group {
                        group: GroupNo::at(next),
                        coil: CoilNo::at(current_order(&groups[next])[0]),
                    }
                } else {
                    match lane.finish {
                        LaneEnd::Path => FinishTo::Lead,
                        LaneEnd::Six(l) => FinishTo::SixLead {
                            lead: l.name(w.design.leads.marking),
                        },
                        LaneEnd::StarPoint => FinishTo::StarPoint,
                    }
                };
                let coil = &w.coils[c];
                out.push(ScheduleRow {
                    coil: CoilNo::at(c),
                    go: SlotNo::at(coil.go),
                    back: SlotNo::at(coil.back),
                    turns: coil.turns,
                    phase: w.label(lane.phase).to_string(),
                    phase_index: lane.phase,
                    path: PathNo::at(lane.path),
                    group: GroupNo::at(gi),
                    finish_to,
                });
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::{Design, Topology};
    use crate::spec::Spec;

    // A series path passes through every coil once, start to finish lead (common
    // practice): each row's finish names the next row's coil, and each lane ends at a lead.
    #[test]
    fn schedule_walks_every_coil_once_from_lead_to_lead() {
        for (z, poles, layers, paths) in
            [(36, 4, 2, 2), (24, 4, 1, 1), (27, 6, 2, 1), (48, 8, 2, 4)]
        {
            let spec = Spec::of(Design {
                parallel_paths: paths,
                ..Design::basic(Topology::Rotary, z, poles, layers)
            });
            let w = crate::winding::build(&spec).expect("builds");
            let groups = crate::winding::coil_groups(&w);
            let rows = schedule(&w, &groups);
            let mut seen: Vec<usize> = rows.iter().map(|r| r.coil.get()).collect();
            seen.sort_unstable();
            assert_eq!(seen, (1..=w.coils.len()).collect::<Vec<_>>());
            let leads = rows
                .iter()
                .filter(|r| r.finish_to == FinishTo::Lead)
                .count();
            assert_eq!(leads, w.geometry.phases * paths, "Z={z}");
            for pair in rows.windows(2) {
                match &pair[0].finish_to {
                    FinishTo::Coil { coil } | FinishTo::Group { coil, .. } => {
                        assert_eq!(*coil, pair[1].coil)
                    }
                    FinishTo::Lead | FinishTo::SixLead { .. } | FinishTo::StarPoint => {}
                }
            }
        }
    }
}
