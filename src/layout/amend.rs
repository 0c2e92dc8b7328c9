//! A layout file with a new winding written into it: the user's text kept (comments, order,
//! every other key), the winding's keys set, the old record's coils and readings removed.
//! `size -o` writes one; it reads back as the sized winding.

use toml_edit::{DocumentMut, Item, Table, value};

use crate::design::{Design, Insulation, Material, WireSize};

/// The layout text `source` with `d`'s winding written into it: `[winding]` pitch, turns
/// per coil, parallel paths and connection; `[supply]` voltage and frequency; `[wire]`
/// replaced by `d`'s wire. An explicit `[[coil]]` list and `[measured]` readings belong to
/// the old winding and are removed, with a comment that says so.
pub fn amend(source: &str, d: &Design) -> Result<String, toml_edit::TomlError> {
    let mut doc: DocumentMut = source.parse()?;
    let removed = doc.remove("coil").is_some() | doc.remove("measured").is_some();

    let mut winding = take(&mut doc, "winding");
    if let Some(y) = d.pitch {
        winding["pitch"] = value(y as i64);
    }
    winding["turns_per_coil"] = value(d.turns_per_coil as i64);
    winding["parallel_paths"] = value(d.parallel_paths as i64);
    winding["connection"] = value(d.connection.to_string());
    // A phase resistance stands in for a [wire] table; the parser takes one or the other.
    if d.wire.is_some() {
        winding.remove("phase_resistance_ohm");
    }
    doc.insert("winding", Item::Table(winding));

    let mut supply = take(&mut doc, "supply");
    if let Some(f) = d.supply.frequency_hz {
        supply["frequency_hz"] = value(f);
    }
    if let Some(v) = d.supply.line_voltage_v {
        supply["line_voltage_v"] = value(v);
    }
    doc.insert("supply", Item::Table(supply));

    if let Some(w) = &d.wire {
        let mut t = Table::new();
        match w.size {
            WireSize::Diameter(d) => t["diameter_mm"] = value(round_mm(d.mm())),
            WireSize::Awg(n) => t["awg"] = value(n as i64),
        }
        t["strands_in_hand"] = value(w.strands_in_hand as i64);
        match w.insulation {
            Insulation::Grade(g) => t["grade"] = value(g as i64),
            Insulation::Diameter(o) => t["insulated_diameter_mm"] = value(round_mm(o.mm())),
        }
        if w.material == Material::Aluminium {
            t["material"] = value("aluminium");
        }
        doc["wire"] = Item::Table(t);
    }

    // A rating the sizing set (a flat primary's current at its thrust point).
    let mut rated = false;
    if let Some(n) = &d.nameplate
        && let ([i], [v]) = (n.currents_a.as_slice(), n.voltages_v.as_slice())
    {
        let mut plate = take(&mut doc, "nameplate");
        if !plate.contains_key("current_a") {
            plate["current_a"] = value((i * 1e3).round() / 1e3);
            plate["voltage_v"] = value(*v);
            rated = true;
        }
        doc.insert("nameplate", Item::Table(plate));
    }
    let note = if removed {
        "# Winding keys, [supply] and [wire] set by `beltwright size`; the old record's\n\
         # [[coil]] list and [measured] readings were removed (they describe the old winding).\n"
    } else {
        "# Winding keys, [supply] and [wire] set by `beltwright size`.\n"
    };
    let rated_note = if rated {
        "# nameplate.current_a is the thrust model's line current at the slip sized for.\n"
    } else {
        ""
    };
    Ok(format!("{note}{rated_note}{doc}"))
}

/// The table `key` taken out of `doc` (it keeps its place when put back), or a new one.
fn take(doc: &mut DocumentMut, key: &str) -> Table {
    doc.remove(key)
        .and_then(|i| i.into_table().ok())
        .unwrap_or_default()
}

/// A size in millimetres written as a person would (0.85, not 0.8500000000000001) when that
/// is the same size to a nanometre; otherwise as it is.
fn round_mm(x: f64) -> f64 {
    let r = (x * 1e3).round() / 1e3;
    if (r - x).abs() <= 1e-6 { r } else { x }
}
