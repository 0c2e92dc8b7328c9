//! A single-phase stator's study: each winding's groups, factors and resistance, the
//! effective turns ratio, the field's forward and backward waves, the capacitor, the lead
//! tables and, for a recorded winding, the audit. Computed once
//! ([`crate::study::Study::single_phase`]) and read by every presenter.

pub mod capacitor;

use num_complex::Complex64;
use serde::Serialize;

use crate::card::coil_resistance_20c;
use crate::card::measured::FAR_PERCENT;
use crate::design::CapacitorDuty;
use crate::winding::single_phase::{AUX, MAIN, coil_middle, main_section};
use crate::winding::{Elec, Winding};
use crate::wire::{Wire, metal};
use capacitor::Motor;

/// The highest odd order the factor rows and spectrum list.
pub const TOP_ORDER: u32 = 15;

/// Slips at which the capacitor motor's running is tabulated (common practice: standstill,
/// pull-up region, and the working range).
pub const SLIPS: [f64; 9] = [1.0, 0.8, 0.6, 0.4, 0.25, 0.15, 0.1, 0.06, 0.03];

/// Quadrature error beyond which the audit reports the windings' axes, electrical degrees
/// (common practice: a slot pitch of a small core is 15–30°, so a few degrees is a layout
/// error, not rounding).
pub const QUADRATURE_TOLERANCE_DEG: f64 = 2.0;

/// One winding's factor at an odd order.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PartFactor {
    /// Electrical order ν.
    pub order: u32,
    /// Winding factor |Σ N·e| / Σ N over the winding's coils (turns-weighted).
    pub winding: f64,
}

/// One winding of the stator.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Part {
    /// "main" or "aux" (or the layout's labels).
    pub label: String,
    /// Coils per pole group (the first group's, for a record).
    pub coils_per_group: usize,
    /// Spans of a group's coils, largest first, slot pitches.
    pub spans: Vec<usize>,
    /// Turns of a group's coils, largest span first.
    pub turns: Vec<u32>,
    /// Turns of all its coils in series.
    pub series_turns: u32,
    /// Fundamental winding factor (turns-weighted).
    pub winding_factor: f64,
    /// Effective turns N·k_w1.
    pub effective_turns: f64,
    /// Electrical angle of its fundamental axis, degrees (main at 0 when synthesized).
    pub axis_deg: f64,
    /// Factors at odd orders up to [`TOP_ORDER`].
    pub factors: Vec<PartFactor>,
    /// Resistance at 20 °C across its leads, ohms (the main's sections in series).
    pub resistance_20c_ohm: Option<f64>,
    /// The main's sections at 20 °C when it has two, ohms.
    pub sections_20c_ohm: Vec<f64>,
    /// Wire, when known.
    pub wire: Option<Wire>,
    /// Conductor mass in the coils, kg.
    pub copper_kg: Option<f64>,
}

/// One order of the field's spectrum.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct WaveRow {
    /// Electrical order ν.
    pub order: u32,
    /// Wave travelling the working way, relative to the forward fundamental.
    pub forward: f64,
    /// Wave travelling against it.
    pub backward: f64,
}

/// What currents the spectrum is worked with.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Feed {
    /// The currents at the run slip with the run capacitor chosen.
    RunCapacitor,
    /// Ampere-turns in quadrature, equal effective: the windings' own harmonics in a
    /// circular field (no circuit given to work the currents out).
    Quadrature,
}

/// The running at one slip with the run capacitor (or the start connection at s = 1).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Running {
    /// Slip.
    pub slip: f64,
    /// Shaft speed, rpm.
    pub speed_rpm: f64,
    /// Torque, N·m.
    pub torque_nm: f64,
    /// Line current, A.
    pub line_current_a: f64,
    /// Main winding current, A.
    pub main_current_a: f64,
    /// Auxiliary current, A.
    pub aux_current_a: f64,
    /// Power factor.
    pub power_factor: f64,
    /// Backward over forward current (the field's imbalance), per cent.
    pub backward_percent: f64,
    /// Voltage across the capacitor, V.
    pub capacitor_v: f64,
}

/// A capacitor and what it does.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Choice {
    /// Capacitance, µF.
    pub microfarads: f64,
    /// The running it gives at its slip.
    pub at: Running,
}

/// The capacitor study.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct CapacitorStudy {
    /// What is in series with the auxiliary.
    pub duty: CapacitorDuty,
    /// Slip the run capacitor balances at.
    pub run_slip: f64,
    /// The run capacitor: the least backward field at the run slip.
    pub run: Option<Choice>,
    /// The start capacitor: auxiliary current 90° ahead of the main's at standstill.
    pub start: Option<Choice>,
    /// Turns ratio, capacitor and its voltage that would balance exactly at the run slip
    /// with an auxiliary of the main's copper scaled by a².
    pub balancing_ratio: f64,
    /// Capacitor of that exact balance, µF.
    pub balancing_microfarads: f64,
    /// Voltage on it, V.
    pub balancing_capacitor_v: f64,
    /// The running at [`SLIPS`] with the run capacitor (run duties) or the main alone
    /// after the start (start and split-phase duties; s = 1 with the start connection).
    pub slips: Vec<Running>,
    /// Main and auxiliary resistances used, at the winding temperature, ohms.
    pub resistances_ohm: [f64; 2],
}

/// Why the capacitor could not be worked out.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum CapacitorMissing {
    /// No `[circuit]`.
    Circuit,
    /// No supply voltage or frequency.
    Supply,
    /// No resistance of a winding (no wire and sizes, no resistance given).
    Resistance,
    /// No slip: neither `[capacitor] slip` nor a nameplate speed.
    Slip,
    /// The nameplate speed gives no working slip (0 < s < 0.5) at the core's poles and the
    /// supply's frequency: at or above synchronous speed, or below half of it.
    NameplateSpeed,
}

/// One row of a lead table: what goes to a line or is joined.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Board {
    /// The supply voltage this table is for: "single", "low" or "high".
    pub voltage: String,
    /// Rotation: the field travels toward rising slot numbers.
    pub towards_rising_slots: bool,
    /// Leads on L1.
    pub l1: Vec<String>,
    /// Leads on L2 (or N).
    pub l2: Vec<String>,
    /// Leads joined together and to nothing else.
    pub joined: Vec<String>,
    /// The auxiliary lead that goes to its line through the capacitor (in series with the
    /// auxiliary winding); `None` for a stator without one.
    pub through_capacitor: Option<String>,
}

/// A finding of the single-phase audit.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Finding {
    /// A coil whose EMF opposes its winding's: wound or connected backwards.
    CoilReversed {
        /// Coil number from 1.
        coil: usize,
        /// Its winding's label.
        winding: String,
        /// The slot its current enters, as recorded (from 1).
        go: usize,
        /// The slot it leaves (from 1).
        back: usize,
    },
    /// The axes of the windings are not 90 electrical degrees apart.
    NotInQuadrature {
        /// Angle between the axes, electrical degrees.
        angle_deg: f64,
    },
    /// A reading far from the card's figure at the same temperature.
    Resistance {
        /// Winding label.
        winding: String,
        /// Measured, ohms.
        measured_ohm: f64,
        /// Expected at the reading's temperature, ohms.
        expected_ohm: f64,
        /// Deviation, per cent.
        deviation_percent: f64,
    },
    /// The main's two sections oppose each other.
    SectionsOppose,
}

/// The single-phase study.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SinglePhaseReport {
    /// Slots.
    pub slots: usize,
    /// Poles.
    pub poles: usize,
    /// Slots per pole.
    pub slots_per_pole: f64,
    /// The main winding.
    pub main: Part,
    /// The auxiliary winding.
    pub aux: Part,
    /// Effective turns ratio a = N_a·k_wa / (N_m·k_wm) (per main section in parallel when
    /// the main has two sections: the lower voltage's connection).
    pub turns_ratio: f64,
    /// Angle by which the auxiliary's axis lies ahead of the main's toward rising slot
    /// numbers, electrical degrees.
    pub axis_shift_deg: f64,
    /// The field's waves at odd orders.
    pub spectrum: Vec<WaveRow>,
    /// With what currents.
    pub feed: Feed,
    /// The fundamental travels toward rising slot numbers with the feed above and the
    /// auxiliary's start lead on the main's start lead's line.
    pub towards_rising_slots: bool,
    /// The capacitor, when it can be worked out.
    pub capacitor: Option<CapacitorStudy>,
    /// Why it could not.
    pub capacitor_missing: Option<CapacitorMissing>,
    /// Lead tables for both rotations (and both voltages of a two-section main).
    pub boards: Vec<Board>,
    /// Lead names: main start and end (and the second section's), auxiliary start and end.
    pub leads: Vec<String>,
    /// Audit findings (empty: sound).
    pub findings: Vec<Finding>,
    /// The high-potential and insulation tests, at the highest rated voltage (the supply's
    /// or the nameplate's).
    pub acceptance: crate::card::Acceptance,
}

/// Turns-weighted EMF of a winding and of one section of the main.
fn emf(w: &Winding, part: usize, order: Elec, section: Option<usize>) -> Complex64 {
    match section {
        // One path: the phase EMF is the turns-weighted sum over the winding's coils.
        None => w.phase_emf(part, order),
        Some(sec) => w
            .coils
            .iter()
            .filter(|c| c.phase == part && main_section(w, c) == sec)
            .map(|c| w.coil_emf(c, order))
            .sum(),
    }
}

/// A winding's summary.
fn part(w: &Winding, p: usize, wire: Option<Wire>, given_ohm: Option<f64>, sections: u8) -> Part {
    let coils: Vec<_> = w.coils.iter().filter(|c| c.phase == p).collect();
    let series: u32 = coils.iter().map(|c| c.turns).sum();
    let kw = |nu: u32| emf(w, p, Elec(nu as f64), None).norm() / f64::from(series.max(1));
    // The first group: the coils sharing the first coil's middle.
    let mid = |c: &crate::winding::Coil| coil_middle(w, c);
    let mut first: Vec<(usize, u32)> = coils
        .first()
        .map(|c0| {
            coils
                .iter()
                .filter(|c| (mid(c) - mid(c0)).abs() < 1e-9)
                .map(|c| (w.span(c).unsigned_abs() as usize, c.turns))
                .collect()
        })
        .unwrap_or_default();
    first.sort_by_key(|x| std::cmp::Reverse(x.0));
    // A full-pitch coil of half a two-pole core lies in the same slots as the next group's:
    // one of each span.
    first.dedup_by_key(|x| x.0);
    let r_coils = |section: Option<usize>| -> Option<f64> {
        let wire = wire.as_ref()?;
        coils
            .iter()
            .filter(|c| section.is_none_or(|s| main_section(w, c) == s))
            .map(|c| coil_resistance_20c(w, c, wire))
            .sum()
    };
    let resistance = r_coils(None).or(given_ohm);
    let sections_20c_ohm = if p == MAIN && sections == 2 {
        match (r_coils(Some(0)), r_coils(Some(1))) {
            (Some(a), Some(b)) => vec![a, b],
            _ => resistance
                .map(|r| vec![r / 2.0, r / 2.0])
                .unwrap_or_default(),
        }
    } else {
        Vec::new()
    };
    let copper_kg = wire.as_ref().and_then(|wi| {
        let m = metal(wi.material);
        let ohm = r_coils(None)?;
        // Mass from resistance: m = R·A²·density/ρ (the same mean turns).
        let a = wi.conductor_area.m2();
        Some(ohm * a * a * m.density_kg_m3 / m.resistivity_ohm_m)
    });
    Part {
        label: w.label(p).to_string(),
        coils_per_group: first.len(),
        spans: first.iter().map(|x| x.0).collect(),
        turns: first.iter().map(|x| x.1).collect(),
        series_turns: series,
        winding_factor: kw(1),
        effective_turns: f64::from(series) * kw(1),
        axis_deg: emf(w, p, Elec::FUNDAMENTAL, None).arg().to_degrees(),
        factors: (1..=TOP_ORDER)
            .step_by(2)
            .map(|nu| PartFactor {
                order: nu,
                winding: kw(nu),
            })
            .collect(),
        resistance_20c_ohm: resistance,
        sections_20c_ohm,
        wire,
        copper_kg,
    }
}

/// Forward and backward amplitudes of order ν for winding currents `i` (main, aux): with
/// E_x the windings' EMF phasors (e^{−jθ} convention), the wave toward rising slots is
/// |Σ conj(E_x)·I_x|/ν and toward falling slots |Σ E_x·I_x|/ν (a standing wave per winding
/// split into its two travelling halves).
fn waves(w: &Winding, nu: u32, i: [Complex64; 2]) -> (f64, f64) {
    let e = [
        emf(w, MAIN, Elec(nu as f64), None),
        emf(w, AUX, Elec(nu as f64), None),
    ];
    let rising = (e[0].conj() * i[0] + e[1].conj() * i[1]).norm() / nu as f64;
    let falling = (e[0] * i[0] + e[1] * i[1]).norm() / nu as f64;
    (rising, falling)
}

/// The lead tables. With the auxiliary's start on the main's start's line the field
/// travels `same_way_rising`; exchanging the auxiliary's leads reverses it. A two-section
/// main: the sections in parallel with the auxiliary on the line at the lower voltage; in
/// series at the higher, the auxiliary across the second section (the same voltage as
/// at the lower).
fn boards(leads: &[String], same_way_rising: bool, capacitor: bool) -> Vec<Board> {
    let l = |i: usize| leads[i].clone();
    let mut out = Vec::new();
    for swap in [false, true] {
        let rising = same_way_rising != swap;
        let n = leads.len();
        let (za, zb) = if swap {
            (l(n - 1), l(n - 2))
        } else {
            (l(n - 2), l(n - 1))
        };
        if n == 4 {
            out.push(Board {
                voltage: "single".into(),
                towards_rising_slots: rising,
                l1: vec![l(0), za],
                l2: vec![l(1), zb.clone()],
                joined: Vec::new(),
                through_capacitor: capacitor.then(|| zb.clone()),
            });
        } else {
            out.push(Board {
                voltage: "low".into(),
                towards_rising_slots: rising,
                l1: vec![l(0), l(2), za.clone()],
                l2: vec![l(1), l(3), zb.clone()],
                joined: Vec::new(),
                through_capacitor: capacitor.then(|| zb.clone()),
            });
            out.push(Board {
                voltage: "high".into(),
                towards_rising_slots: rising,
                l1: vec![l(0)],
                l2: vec![l(3), zb.clone()],
                joined: vec![l(1), l(2), za],
                through_capacitor: capacitor.then(|| zb.clone()),
            });
        }
    }
    out
}

/// The single-phase study of `w` (a winding whose design has `single_phase`); `None`
/// otherwise.
pub fn study(w: &Winding) -> Option<SinglePhaseReport> {
    let sp = w.design.single_phase.as_ref()?;
    crate::runs::count(crate::runs::Analysis::SinglePhase);
    let main_wire = w.design.wire.as_ref().map(Wire::of);
    let aux_wire = sp
        .aux_wire
        .as_ref()
        .map(Wire::of)
        .or_else(|| main_wire.clone());
    let main = part(
        w,
        MAIN,
        main_wire,
        w.design.phase_resistance_ohm,
        sp.main_sections,
    );
    let aux = part(w, AUX, aux_wire, sp.aux_resistance_ohm, 1);
    let parallel = f64::from(sp.main_sections);
    let ratio = aux.effective_turns / (main.effective_turns / parallel).max(f64::MIN_POSITIVE);
    let e_main = emf(w, MAIN, Elec::FUNDAMENTAL, None);
    let e_aux = emf(w, AUX, Elec::FUNDAMENTAL, None);
    // e^{−jθ}: an axis further on toward rising slots has a more negative angle.
    let shift = {
        let d = (e_main.arg() - e_aux.arg()).to_degrees();
        (d + 540.0).rem_euclid(360.0) - 180.0
    };
    let motor = motor(w, &main, &aux, ratio, parallel);
    let (cap, missing) = match motor.and_then(|m| capacitor_study(w, &m)) {
        Ok(c) => (Some(c), None),
        Err(m) => (None, Some(m)),
    };
    // Currents for the spectrum: per unit of the main's, the auxiliary's as the run
    // capacitor makes it, or in exact quadrature (I_a·a = j·I_m, the aux ahead).
    let quadrature = Complex64::i() / ratio / parallel;
    let (feed, i_aux) = match (&motor, cap.as_ref().and_then(|c| c.run.as_ref())) {
        (Ok(m), Some(run)) => {
            let st = m.with_capacitor(run.at.slip, run.microfarads);
            (Feed::RunCapacitor, st.aux / st.main / parallel)
        }
        _ => (Feed::Quadrature, quadrature),
    };
    // A main of two sections in parallel carries half its current in each: per unit main
    // current, each coil of the main carries 1/parallel.
    let i = [Complex64::new(1.0 / parallel, 0.0), i_aux];
    let (r1, f1) = waves(w, 1, i);
    let towards_rising = r1 >= f1;
    let working = r1.max(f1).max(f64::MIN_POSITIVE);
    let spectrum = (1..=TOP_ORDER)
        .step_by(2)
        .map(|nu| {
            let (r, f) = waves(w, nu, i);
            let (fw, bw) = if towards_rising { (r, f) } else { (f, r) };
            WaveRow {
                order: nu,
                forward: fw / working,
                backward: bw / working,
            }
        })
        .collect();
    // With the aux current ahead of the main's (a capacitor, or a split-phase's resistive
    // auxiliary) and the aux's start on the main's start's line, the field goes from the
    // aux axis toward the main's.
    let same_way_rising = shift < 0.0;
    let leads: Vec<String> =
        crate::winding::single_phase::lead_names(w.design.leads.marking, sp.main_sections)
            .iter()
            .map(|s| s.to_string())
            .collect();
    let mut findings = audit(w, shift, &main, &aux, sp.main_sections);
    findings.sort_by_key(|f| matches!(f, Finding::Resistance { .. }));
    Some(SinglePhaseReport {
        slots: w.geometry.slots,
        poles: w.geometry.poles,
        slots_per_pole: w.geometry.slots as f64 / w.geometry.poles as f64,
        boards: boards(
            &leads,
            same_way_rising,
            sp.capacitor != crate::design::CapacitorDuty::None,
        ),
        leads,
        main,
        aux,
        turns_ratio: ratio,
        axis_shift_deg: shift,
        spectrum,
        feed,
        towards_rising_slots: towards_rising,
        capacitor: cap,
        capacitor_missing: missing,
        findings,
        acceptance: crate::card::acceptance(
            crate::card::test_voltage(w, w.design.supply.line_voltage_v),
            None,
        ),
    })
}

/// The motor as the capacitor solver sees it.
fn motor(
    w: &Winding,
    main: &Part,
    aux: &Part,
    ratio: f64,
    parallel: f64,
) -> Result<Motor, CapacitorMissing> {
    let sp = w
        .design
        .single_phase
        .as_ref()
        .ok_or(CapacitorMissing::Circuit)?;
    let k = sp.circuit.ok_or(CapacitorMissing::Circuit)?;
    let volts = w
        .design
        .supply
        .line_voltage_v
        .ok_or(CapacitorMissing::Supply)?;
    let hz = w
        .design
        .supply
        .frequency_hz
        .ok_or(CapacitorMissing::Supply)?;
    let hot = |r: f64, wire: &Option<Wire>| {
        let m = metal(
            wire.as_ref()
                .map_or(crate::design::Material::Copper, |x| x.material),
        );
        m.at_temperature(r, w.design.winding_temperature_c)
    };
    let rm = main
        .resistance_20c_ohm
        .ok_or(CapacitorMissing::Resistance)?;
    let ra = aux.resistance_20c_ohm.ok_or(CapacitorMissing::Resistance)?;
    // Two sections in parallel: a quarter of the series resistance.
    let rm = hot(rm, &main.wire) / (parallel * parallel);
    let ra = hot(ra, &aux.wire);
    Ok(Motor {
        volts,
        hz,
        pole_pairs: w.geometry.pole_pairs(),
        main: Complex64::new(rm, k.main_leakage_reactance_ohm),
        aux: Complex64::new(
            ra,
            k.aux_leakage_reactance_ohm
                .unwrap_or(ratio * ratio * k.main_leakage_reactance_ohm),
        ),
        ratio,
        xm: k.magnetizing_reactance_ohm,
        r2: k.rotor_resistance_ohm,
        x2: k.rotor_reactance_ohm,
    })
}

/// The running of `m` at slip `s` with `series` in the auxiliary.
fn running(m: &Motor, s: f64, series: Option<Complex64>) -> Running {
    let st = m.state(s, series);
    let line = st.main + st.aux;
    Running {
        slip: s,
        speed_rpm: (1.0 - s) * 60.0 * m.hz / m.pole_pairs,
        torque_nm: st.torque_nm,
        line_current_a: line.norm(),
        main_current_a: st.main.norm(),
        aux_current_a: st.aux.norm(),
        power_factor: st.input_w / (m.volts * line.norm()).max(f64::MIN_POSITIVE),
        backward_percent: 100.0 * st.backward.norm() / st.forward.norm().max(f64::MIN_POSITIVE),
        capacitor_v: st.capacitor_v,
    }
}

fn capacitor_study(w: &Winding, m: &Motor) -> Result<CapacitorStudy, CapacitorMissing> {
    let sp = w
        .design
        .single_phase
        .as_ref()
        .ok_or(CapacitorMissing::Circuit)?;
    let slip = match sp.slip {
        Some(s) => s,
        None => {
            let n = w
                .design
                .nameplate
                .as_ref()
                .and_then(|n| n.speed_rpm)
                .ok_or(CapacitorMissing::Slip)?;
            let ns = 60.0 * m.hz / m.pole_pairs;
            let s = 1.0 - n / ns;
            if !(s > 0.0 && s < 0.5) {
                return Err(CapacitorMissing::NameplateSpeed);
            }
            s
        }
    };
    let cap = |uf: f64| Some(Complex64::new(0.0, -m.capacitor_ohm(uf)));
    let runs = matches!(
        sp.capacitor,
        CapacitorDuty::Run | CapacitorDuty::StartAndRun
    );
    let starts = matches!(
        sp.capacitor,
        CapacitorDuty::Start | CapacitorDuty::StartAndRun
    );
    let run = runs.then(|| {
        let uf = m.least_backward_uf(slip);
        Choice {
            microfarads: uf,
            at: running(m, slip, cap(uf)),
        }
    });
    let start = if starts {
        m.quadrature_at_start_uf().map(|uf| Choice {
            microfarads: uf,
            at: running(m, 1.0, cap(uf)),
        })
    } else {
        None
    };
    let (balancing_ratio, balancing_microfarads, balancing_capacitor_v) = m.balancing_design(slip);
    let slips = SLIPS
        .iter()
        .map(|&s| match (&run, &start, sp.capacitor) {
            (Some(r), _, _) => running(m, s, cap(r.microfarads)),
            // After the start the auxiliary is cut out: the main alone; at standstill the
            // start connection.
            (None, Some(st), _) if s >= 1.0 => running(m, s, cap(st.microfarads)),
            (None, _, CapacitorDuty::None) if s >= 1.0 => {
                running(m, s, Some(Complex64::new(0.0, 0.0)))
            }
            _ => running(m, s, None),
        })
        .collect();
    Ok(CapacitorStudy {
        duty: sp.capacitor,
        run_slip: slip,
        run,
        start,
        balancing_ratio,
        balancing_microfarads,
        balancing_capacitor_v,
        slips,
        resistances_ohm: [m.main.re, m.aux.re],
    })
}

/// The audit of a single-phase winding: coils against their winding, the axes'
/// quadrature, the main's sections against each other, and readings against the card.
fn audit(w: &Winding, shift: f64, main: &Part, aux: &Part, sections: u8) -> Vec<Finding> {
    let mut out = Vec::new();
    for p in [MAIN, AUX] {
        let total = emf(w, p, Elec::FUNDAMENTAL, None);
        let sec = |c: &crate::winding::Coil| {
            (p == MAIN && sections == 2)
                .then(|| emf(w, MAIN, Elec::FUNDAMENTAL, Some(main_section(w, c))))
        };
        for (i, c) in w.coils.iter().enumerate().filter(|(_, c)| c.phase == p) {
            // Against its own section where the main has two (a whole section reversed is
            // the sections opposing, found below).
            let reference = sec(c).unwrap_or(total);
            if (w.coil_emf(c, Elec::FUNDAMENTAL) * reference.conj()).re < 0.0 {
                out.push(Finding::CoilReversed {
                    coil: i + 1,
                    winding: w.label(p).to_string(),
                    go: c.go + 1,
                    back: c.back + 1,
                });
            }
        }
    }
    if sections == 2 {
        let a = emf(w, MAIN, Elec::FUNDAMENTAL, Some(0));
        let b = emf(w, MAIN, Elec::FUNDAMENTAL, Some(1));
        if (a * b.conj()).re < 0.0 {
            out.push(Finding::SectionsOppose);
        }
    }
    if (shift.abs() - 90.0).abs() > QUADRATURE_TOLERANCE_DEG {
        out.push(Finding::NotInQuadrature {
            angle_deg: shift.abs(),
        });
    }
    if let Some(m) = &w.design.measured {
        for (part, reading) in [(main, m.main_resistance_ohm), (aux, m.aux_resistance_ohm)] {
            let (Some(r), Some(r20)) = (reading, part.resistance_20c_ohm) else {
                continue;
            };
            let mat = part
                .wire
                .as_ref()
                .map_or(crate::design::Material::Copper, |x| x.material);
            let expected = metal(mat).at_temperature(r20, m.temperature_c);
            let dev = 100.0 * (r - expected) / expected;
            if dev.abs() > FAR_PERCENT {
                out.push(Finding::Resistance {
                    winding: part.label.clone(),
                    measured_ohm: r,
                    expected_ohm: expected,
                    deviation_percent: dev,
                });
            }
        }
    }
    out
}
