//! Slot-by-slot and coil-by-coil comparison of a record with its intended design.

use serde::Serialize;

use super::{CoilAt, Fact, Finding, FindingKind};
use crate::numbering::{CoilNo, PathNo, SlotNo};
use crate::winding::Winding;

/// What one slot holds in the record and in the design: "+U" for current in, "-U" out.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SlotDifference {
    /// Slot number from 1.
    pub slot: SlotNo,
    /// Sides found, sorted.
    pub found: Vec<String>,
    /// Sides intended, sorted.
    pub intended: Vec<String>,
}

/// The comparison with the intended design.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Comparison {
    /// Slots whose contents differ.
    pub slot_differences: Vec<SlotDifference>,
    /// Coil-level findings (also listed among the audit's findings).
    #[serde(skip)]
    pub findings: Vec<Finding>,
}

/// What each slot holds, top layer first, then bottom: one order for record and design.
fn sides(w: &Winding) -> Vec<Vec<String>> {
    let mut s: Vec<Vec<(usize, String)>> = vec![Vec::new(); w.geometry.slots];
    for c in &w.coils {
        let l = w.label(c.phase);
        s[c.go].push((c.go_layer, format!("+{l}")));
        s[c.back].push((c.back_layer, format!("-{l}")));
    }
    s.into_iter()
        .map(|mut v| {
            v.sort();
            v.into_iter().map(|(_, t)| t).collect()
        })
        .collect()
}

/// Compare `found` with `design` slot by slot and coil by coil.
pub fn compare(found: &Winding, design: &Winding) -> Comparison {
    if found.geometry.slots != design.geometry.slots {
        return Comparison {
            slot_differences: Vec::new(),
            findings: vec![Finding {
                kind: FindingKind::DiffersFromIntended,
                coils: Vec::new(),
                slots: Vec::new(),
                phases: Vec::new(),
                detail: Fact::CoresDiffer {
                    design_slots: design.geometry.slots,
                    record_slots: found.geometry.slots,
                },
            }],
        };
    }
    let (a, b) = (sides(found), sides(design));
    let slot_differences = (0..a.len())
        .filter(|&k| a[k] != b[k])
        .map(|k| SlotDifference {
            slot: SlotNo::at(k),
            found: a[k].clone(),
            intended: b[k].clone(),
        })
        .collect();

    let pair = |go: usize, back: usize| (go.min(back), go.max(back));
    let mut used = vec![false; design.coils.len()];
    let mut findings = Vec::new();
    let same = |i: usize, j: usize| {
        let (c, d) = (&found.coils[i], &design.coils[j]);
        c.go == d.go && found.label(c.phase) == design.label(d.phase) && c.path == d.path
    };
    // Exact matches first, so that a reversed coil is not paired with a neighbour's slots.
    let mut partner = vec![None; found.coils.len()];
    for (i, c) in found.coils.iter().enumerate() {
        if let Some(j) = (0..design.coils.len()).find(|&j| {
            !used[j]
                && pair(design.coils[j].go, design.coils[j].back) == pair(c.go, c.back)
                && same(i, j)
        }) {
            used[j] = true;
            partner[i] = Some(j);
        }
    }
    for (i, c) in found.coils.iter().enumerate() {
        if partner[i].is_some() {
            continue;
        }
        let j = (0..design.coils.len()).find(|&j| {
            !used[j] && pair(design.coils[j].go, design.coils[j].back) == pair(c.go, c.back)
        });
        let coil = CoilAt {
            coil: CoilNo::at(i),
            phase: found.label(c.phase).to_string(),
            go: SlotNo::at(c.go),
            back: SlotNo::at(c.back),
        };
        let detail = match j {
            None => Fact::DiffersFromDesign {
                coil,
                path: PathNo::at(c.path),
                matched: false,
                phase: None,
                go: None,
                belongs_in_path: None,
            },
            Some(j) => {
                used[j] = true;
                let d = &design.coils[j];
                Fact::DiffersFromDesign {
                    coil,
                    path: PathNo::at(c.path),
                    matched: true,
                    phase: (found.label(c.phase) != design.label(d.phase))
                        .then(|| design.label(d.phase).to_string()),
                    go: (c.go != d.go).then_some(SlotNo::at(d.go)),
                    belongs_in_path: (c.path != d.path).then_some(PathNo::at(d.path)),
                }
            }
        };
        findings.push(Finding {
            kind: FindingKind::DiffersFromIntended,
            coils: vec![CoilNo::at(i)],
            slots: vec![SlotNo::at(c.go), SlotNo::at(c.back)],
            phases: vec![found.label(c.phase).to_string()],
            detail,
        });
    }
    for (j, d) in design.coils.iter().enumerate().filter(|(j, _)| !used[*j]) {
        let _ = j;
        findings.push(Finding {
            kind: FindingKind::DiffersFromIntended,
            coils: Vec::new(),
            slots: vec![SlotNo::at(d.go), SlotNo::at(d.back)],
            phases: vec![design.label(d.phase).to_string()],
            detail: Fact::MissingFromRecord {
                phase: design.label(d.phase).to_string(),
                go: SlotNo::at(d.go),
                back: SlotNo::at(d.back),
            },
        });
    }
    Comparison {
        slot_differences,
        findings,
    }
}
