//! Travelling-field analysis: the stepwise MMF a winding sets up along the gap, its exact
//! spatial spectrum split into forward and backward travelling waves, and the differential
//! (harmonic) leakage coefficient σ_d.
//!
//! Method (derivations and sources in `docs/theory.md`): each slot carries the phasor
//! sum C_k of its conductors' ampere-turns, `+N·I/a` for a go side and `−N·I/a` for a back
//! side. The MMF is the running sum of the slot currents along the gap (Ampère's law), a
//! staircase. Its Fourier coefficients are closed-form sums over the slots,
//! `Σ C_k e^{∓jνθ_k} / (jνπ·2p)`, so the spectrum has no sampling error; the mean square of
//! the staircase gives Σ over every wave of (F/F_1)² exactly (Parseval), hence σ_d without a
//! truncated series. A linear primary's MMF is a finite current sheet: its continuous
//! Fourier transform is the same slot sum at any wavenumber, read at multiples of the
//! synchronous wavenumber π/τ.
//!
//! Conventions: a phase current is `Re{I·e^{jωt}}`; in positive sequence V lags U by 120°.
//! A wave travels *forward* when it moves toward higher slot numbers. Positions along the
//! gap are in slot pitches, slot `k` (0-based) centred at `k + 0.5`, so the core spans
//! `[0, Z]`.

mod ends;
pub use ends::EndCurrents;

use crate::units::Length;
use num_complex::Complex64;
use serde::Serialize;
use std::f64::consts::PI;
use thiserror::Error;

use crate::factors;
use crate::linear::{self, Figures, Operating};
use crate::numbering::SlotNo;
use crate::plan::PhasorRow;
use crate::winding::{Elec, Mech, Topology, Winding};

/// Relative amplitude below which a wave is taken as absent.
pub const PRESENT: f64 = 1e-9;

/// Most mechanical orders one report lists (keeps output and memory bounded).
pub const MAX_ORDERS: u64 = 1_000_000;

/// Largest slot-opening width accepted, in slot pitches (openings must not overlap).
pub const MAX_OPENING: f64 = 1.0;

pub use crate::winding::star::Sequence;

/// Direction a wave moves along the gap.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "lowercase")]
pub enum Direction {
    /// Toward higher slot numbers.
    Forward,
    /// Toward lower slot numbers.
    Backward,
}

/// Why a field could not be computed, as typed facts. Their sentences are the presenters'
/// (`output::refusal_words`); the `Display` here only names the kind, for logs.
#[derive(Debug, Error, Clone, PartialEq)]
pub enum FieldError {
    /// The currents do not give one phasor per phase.
    #[error("not one current per phase")]
    CurrentCount {
        /// How many were given.
        given: usize,
        /// How many phases the winding has.
        phases: usize,
    },
    /// The slot-opening width, in slot pitches, is out of range.
    #[error("slot opening out of range")]
    SlotOpening(f64),
    /// Winding and currents make no fundamental wave to compare against.
    #[error("no working wave")]
    NoWorkingWave,
}

/// Balanced phase-current phasors of unit magnitude for `m` phases in `seq`.
pub fn balanced_currents(m: usize, seq: Sequence) -> Vec<Complex64> {
    (0..m)
        .map(|k| {
            let a = crate::winding::star::phase_operator(k, m);
            match seq {
                Sequence::Positive => a,
                Sequence::Negative => a.conj(),
            }
        })
        .collect()
}

/// The current sheet of a winding: the ampere-turn phasor in every slot and the MMF
/// staircase it makes. Everything else in this module is computed from it.
#[derive(Debug, Clone, PartialEq)]
pub struct CurrentSheet {
    /// Closed or open core.
    pub topology: Topology,
    /// Pole count 2p.
    pub poles: usize,
    /// Pole pitch τ in slot pitches.
    pub pole_pitch_slots: f64,
    /// Slot-opening width b in slot pitches (0: current concentrated at the slot centre).
    pub opening: f64,
    /// Ampere-turn phasor C_k of every slot (peak values for peak currents).
    pub slot_current: Vec<Complex64>,
    /// MMF phasor between slot k and slot k+1 (after slot k), mean removed on a rotary core.
    pub level: Vec<Complex64>,
    /// Slot angle per slot at order 1: exact integer reduction comes from the geometry.
    geometry: crate::winding::Geometry,
}

impl CurrentSheet {
    /// Slot currents of `w` for phase-current phasors `currents` (one per phase) and a
    /// slot opening of `opening` slot pitches. Go sides carry `+N·I/a`, back sides `−N·I/a`.
    pub fn new(w: &Winding, currents: &[Complex64], opening: f64) -> Result<Self, FieldError> {
        let m = w.geometry.phases;
        if currents.len() != m {
            return Err(FieldError::CurrentCount {
                given: currents.len(),
                phases: m,
            });
        }
        if !(opening.is_finite() && (0.0..MAX_OPENING).contains(&opening)) {
            return Err(FieldError::SlotOpening(opening));
        }
        let z = w.geometry.slots;
        let c = crate::winding::star::slot_currents(w, currents);
        let mut level = Vec::with_capacity(z);
        let mut run = Complex64::new(0.0, 0.0);
        for ck in &c {
            run += ck;
            level.push(run);
        }
        if w.geometry.topology == Topology::Rotary && z > 0 {
            // The mean of the staircase is the same with or without slot openings: each ramp
            // is symmetric about its slot centre, and the level sum is cyclic.
            let mean = level.iter().sum::<Complex64>() / z as f64;
            for l in &mut level {
                *l -= mean;
            }
        }
        Ok(CurrentSheet {
            topology: w.geometry.topology,
            poles: w.geometry.poles,
            pole_pitch_slots: w.geometry.pole_pitch_slots,
            opening,
            slot_current: c,
            level,
            geometry: w.geometry.clone(),
        })
    }

    /// Slot count Z.
    pub fn slots(&self) -> usize {
        self.slot_current.len()
    }

    /// Length over which amplitudes are referred: the periphery Z on a rotary core, the
    /// active length 2p·τ of a linear primary (slot pitches).
    pub fn reference_length(&self) -> f64 {
        match self.topology {
            Topology::Rotary => self.slots() as f64,
            Topology::Linear => self.pole_pitch_slots * self.poles as f64,
        }
    }

    /// Slot-opening factor k_o = sin(νπb/2τ)/(νπb/2τ) of electrical order ν: the Fourier
    /// transform of the slot current spread evenly over the opening b (T. A. Lipo,
    /// *Introduction to AC Machine Design*, 2017; the same pulse transform as the skew
    /// factor of Pyrhönen et al. 2014, eq. 2.34).
    pub fn opening_factor(&self, order: Elec) -> f64 {
        let x = order.get() * PI * self.opening / (2.0 * self.pole_pitch_slots);
        if x.abs() < 1e-12 { 1.0 } else { x.sin() / x }
    }

    /// Slot sums S±(ν) = Σ_k C_k·e^{±jνθ_k}, θ_k the slot's electrical angle (exact integer
    /// reduction on a rotary core).
    pub fn slot_sums(&self, order: Elec) -> (Complex64, Complex64) {
        let mut plus = Complex64::new(0.0, 0.0);
        let mut minus = Complex64::new(0.0, 0.0);
        for (k, ck) in self.slot_current.iter().enumerate() {
            let th = self.angle(k, order);
            let e = Complex64::from_polar(1.0, th);
            plus += ck * e;
            minus += ck * e.conj();
        }
        (plus, minus)
    }

    fn angle(&self, k: usize, order: Elec) -> f64 {
        match self.topology {
            Topology::Rotary => self.geometry.slot_angle(k, order),
            Topology::Linear => PI * order.get() * k as f64 / self.pole_pitch_slots,
        }
    }

    /// Amplitudes (ampere-turns, peak) of the forward and backward waves of electrical order
    /// ν: `|S±(ν)|·|k_o(ν)| / (π·ν·2p)`. On a linear primary these are the wavenumber
    /// spectrum at κ = ν·π/τ divided by the active length (the amplitude of a wave that would
    /// give the same transform over 2p pole pitches).
    pub fn wave(&self, order: Elec) -> (f64, f64) {
        let (plus, minus) = self.slot_sums(order);
        let scale = self.opening_factor(order).abs() / (PI * order.get() * self.poles as f64);
        (plus.norm() * scale, minus.norm() * scale)
    }

    /// MMF phasor F̃(x) at position `x` in slot pitches (slot k centred at k + 0.5); the
    /// instantaneous MMF is `Re{F̃·e^{jωt}}`.
    pub fn mmf_phasor(&self, x: f64) -> Complex64 {
        let z = self.slots();
        if z == 0 {
            return Complex64::new(0.0, 0.0);
        }
        let before = |j: isize| -> Complex64 {
            if j < 0 {
                match self.topology {
                    Topology::Rotary => self.level[z - 1],
                    Topology::Linear => Complex64::new(0.0, 0.0),
                }
            } else {
                self.level[j as usize]
            }
        };
        let (x, outside) = match self.topology {
            Topology::Rotary => (x.rem_euclid(z as f64), false),
            Topology::Linear => (x, !(0.0..=z as f64).contains(&x)),
        };
        if outside {
            return Complex64::new(0.0, 0.0);
        }
        // Nearest slot centre k + 0.5 and the ramp across its opening.
        let k = (x - 0.5).round().clamp(0.0, (z - 1) as f64) as isize;
        let centre = k as f64 + 0.5;
        let half = self.opening / 2.0;
        let (lo, hi) = (before(k - 1), self.level[k as usize]);
        if x < centre - half {
            before(k - 1)
        } else if x >= centre + half {
            hi
        } else {
            lo + (hi - lo) * ((x - (centre - half)) / self.opening)
        }
    }

    /// Instantaneous MMF (ampere-turns) at position `x` (slot pitches) and electrical time
    /// angle ωt = `theta` radians.
    pub fn mmf(&self, x: f64, theta: f64) -> f64 {
        (self.mmf_phasor(x) * Complex64::from_polar(1.0, theta)).re
    }

    /// Mean over the reference length of |F̃|², exactly, from the staircase (with linear
    /// ramps across the slot openings). By Parseval this equals Σ over every travelling wave
    /// of its amplitude squared (forward and backward, every order, sub-harmonics included).
    pub fn mean_square(&self) -> f64 {
        let z = self.slots();
        if z == 0 {
            return 0.0;
        }
        let b = self.opening;
        let mut prev = match self.topology {
            Topology::Rotary => self.level[z - 1],
            Topology::Linear => Complex64::new(0.0, 0.0),
        };
        let mut sum = 0.0;
        for &g in &self.level {
            let flat = g.norm_sqr();
            let ramp = (prev.norm_sqr() + (prev * g.conj()).re + flat) / 3.0;
            sum += (1.0 - b) * flat + b * ramp;
            prev = g;
        }
        sum / self.reference_length()
    }

    /// Zero-wavenumber (uniform) part of a linear primary's MMF, ampere-turns: the mean of
    /// F̃ over the active length, `−Σ C_k·x_k / 2pτ`. It does not travel; it pulsates at
    /// supply frequency. Zero on a rotary core, whose MMF has no mean by definition.
    pub fn pulsating(&self) -> f64 {
        match self.topology {
            Topology::Rotary => 0.0,
            Topology::Linear => {
                let s: Complex64 = self
                    .slot_current
                    .iter()
                    .enumerate()
                    .map(|(k, c)| c * (k as f64 + 0.5))
                    .sum();
                s.norm() / self.reference_length()
            }
        }
    }

    /// A linear primary's sheet folded onto the shortest whole number of slot pitches that
    /// holds whole wavelengths 2τ (n slot pitches, d wavelengths): slot k adds into slot
    /// k mod n of a closed core with n slots and 2d poles. Since e^{jνπx/τ} repeats every
    /// 2τ, the folded sheet's slot sums equal the open primary's at every wavenumber
    /// ν·π/(d·τ); its staircase (mean removed) gives by Parseval the sum of those waves.
    /// A rotary sheet is returned unchanged.
    pub fn folded(&self) -> CurrentSheet {
        if self.topology == Topology::Rotary {
            return self.clone();
        }
        let g = &self.geometry;
        let k = crate::winding::gcd(g.angle_num, g.angle_den).max(1);
        let n = (g.angle_den / k).max(1) as usize;
        let d = (g.angle_num / k) as usize;
        let mut c = vec![Complex64::new(0.0, 0.0); n];
        for (i, ck) in self.slot_current.iter().enumerate() {
            c[i % n] += ck;
        }
        let mut level = Vec::with_capacity(n);
        let mut run = Complex64::new(0.0, 0.0);
        for ck in &c {
            run += ck;
            level.push(run);
        }
        let mean = level.iter().sum::<Complex64>() / n as f64;
        for l in &mut level {
            *l -= mean;
        }
        let geometry = crate::winding::Geometry::rotary(n, 2 * d, g.phases, g.layers);
        CurrentSheet {
            topology: Topology::Rotary,
            poles: 2 * d,
            pole_pitch_slots: geometry.pole_pitch_slots,
            opening: self.opening,
            slot_current: c,
            level,
            geometry,
        }
    }

    /// Points of the MMF polyline at ωt = `theta` radians, from x = 0 to x = Z.
    pub fn snapshot(&self, theta: f64) -> Vec<MmfPoint> {
        let z = self.slots();
        let rot = Complex64::from_polar(1.0, theta);
        let start = match self.topology {
            Topology::Rotary if z > 0 => self.level[z - 1],
            _ => Complex64::new(0.0, 0.0),
        };
        let half = self.opening / 2.0;
        let mut pts = Vec::with_capacity(2 * z + 2);
        let mut prev = start;
        pts.push(MmfPoint {
            x: 0.0,
            mmf: (prev * rot).re,
        });
        for (k, &g) in self.level.iter().enumerate() {
            let c = k as f64 + 0.5;
            pts.push(MmfPoint {
                x: c - half,
                mmf: (prev * rot).re,
            });
            pts.push(MmfPoint {
                x: c + half,
                mmf: (g * rot).re,
            });
            prev = g;
        }
        pts.push(MmfPoint {
            x: z as f64,
            mmf: (prev * rot).re,
        });
        pts
    }
}

/// One corner of the MMF staircase.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct MmfPoint {
    /// Position along the gap in slot pitches (slot n, counted from 1, centred at n − 0.5).
    pub x: f64,
    /// MMF in ampere-turns (peak currents in, peak MMF out).
    pub mmf: f64,
}

/// The MMF at one instant.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Snapshot {
    /// Electrical time angle ωt in degrees.
    pub at_deg: f64,
    /// Corners of the staircase, left to right.
    pub points: Vec<MmfPoint>,
    /// Crest position of the working wave at this instant, slot pitches.
    pub crest_x: f64,
}

/// One harmonic order of the spectrum.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct WaveRow {
    /// Electrical order ν (ν = n/p on a rotary core; κ/(π/τ) on a linear primary).
    pub order: Elec,
    /// Mechanical order n = ν·p (wave count around a rotary gap).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mech_order: Option<Mech>,
    /// Forward wave amplitude relative to the working wave.
    pub forward: f64,
    /// Backward wave amplitude relative to the working wave.
    pub backward: f64,
}

/// Figures only a linear primary has.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct LinearField {
    /// Synchronous wavenumber π/τ, radians per metre (None without a slot pitch).
    pub synchronous_wavenumber_rad_m: Option<f64>,
    /// Synchronous wavenumber π/τ, radians per slot pitch.
    pub synchronous_wavenumber_rad_slot: f64,
    /// Forward wave at π/τ relative to the working wave.
    pub forward_wave: f64,
    /// Backward wave at π/τ relative to the working wave.
    pub backward_wave: f64,
    /// Uniform pulsating component the open ends add (zero wavenumber), relative to the
    /// working wave.
    pub pulsating: f64,
    /// Field speed v_s = 2·f·τ, m/s.
    pub field_speed_m_s: Option<f64>,
    /// Secondary speed (1 − s)·v_s at the given slip, m/s.
    pub secondary_speed_m_s: Option<f64>,
    /// The finite current sheet's continuous wavenumber spectrum, sampled finely (a quarter
    /// of the lobe width 1/(2p) in order) from 0 to the highest order listed: forward and
    /// backward amplitudes relative to the working wave. A finite primary has components
    /// between the whole orders, which its ends (entry and exit) put there.
    pub continuous: Vec<ContinuumPoint>,
    /// The largest component at least a quarter order from every whole order: a primary of
    /// finite length spreads each wave over neighbouring wavenumbers (its transform is a
    /// sinc-like lobe 1/p wide in order), or `None`.
    pub strongest_between_orders: Option<ContinuumPoint>,
    /// The entry and exit ends' own components (`None` for a primary shorter than one
    /// period of its slot pattern).
    pub ends: Option<EndComponents>,
}

/// One sample of a flat primary's continuous spectrum.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct ContinuumPoint {
    /// Electrical order ν = κ/(π/τ), any real value.
    pub order: Elec,
    /// Forward amplitude relative to the working wave.
    pub forward: f64,
    /// Backward amplitude relative to the working wave.
    pub backward: f64,
    /// Forward amplitude of the entry end's component alone (see [`EndComponents`]).
    pub entry_forward: f64,
    /// Backward amplitude of the entry end's component alone.
    pub entry_backward: f64,
    /// Forward amplitude of the exit end's component alone.
    pub exit_forward: f64,
    /// Backward amplitude of the exit end's component alone.
    pub exit_backward: f64,
}

/// What a flat primary's two ends add to its field: the slot currents by which each end
/// differs from the winding's periodic pattern, and each end's own waves at π/τ (every
/// sample of them is in [`ContinuumPoint`]). The spectrum is the body's (the working waves
/// cut off at the ends) plus these two. Near zero wavenumber each end's net current makes an
/// MMF step whose transform grows as 1/ν; the two steps cancel in the sum, whose remainder
/// the `pulsating` figure gives.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct EndComponents {
    /// Slots (from 1) whose current differs from the pattern, at the entry end: the end the
    /// secondary enters under (slot 1's end for a field towards rising slot numbers).
    pub entry_slots: Vec<SlotNo>,
    /// Such slots at the exit end.
    pub exit_slots: Vec<SlotNo>,
    /// Entry end's forward component at the synchronous wavenumber π/τ, relative to the
    /// working wave.
    pub entry_forward_at_1: f64,
    /// Entry end's backward component at π/τ: where the sheet's backward wave is nil, the
    /// two ends' backward components cancel there.
    pub entry_backward_at_1: f64,
    /// Exit end's forward component at π/τ.
    pub exit_forward_at_1: f64,
    /// Exit end's backward component at π/τ.
    pub exit_backward_at_1: f64,
}

/// Most samples of a continuous spectrum given.
pub const MAX_CONTINUUM: usize = 4000;

/// Inputs of the field analysis besides the winding.
#[derive(Debug, Clone, PartialEq)]
pub struct FieldOptions {
    /// Phase-current phasors, one per phase.
    pub currents: Vec<Complex64>,
    /// Slot-opening width, slot pitches.
    pub opening: f64,
    /// Highest electrical order listed.
    pub upto: f64,
    /// Instant of the snapshot, electrical degrees.
    pub at_deg: f64,
    /// Slip for the secondary speed.
    pub slip: Option<f64>,
}

impl FieldOptions {
    /// Balanced positive-sequence unit currents, no slot opening, orders to 25, ωt = 0.
    pub fn balanced(w: &Winding) -> Self {
        FieldOptions {
            currents: balanced_currents(w.geometry.phases, Sequence::Positive),
            opening: 0.0,
            upto: 25.0,
            at_deg: 0.0,
            slip: None,
        }
    }
}

/// The travelling-field report.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FieldReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Free text title.
    pub title: Option<String>,
    /// Core kind.
    pub topology: Topology,
    /// Slots Z.
    pub slots: usize,
    /// Poles 2p.
    pub poles: usize,
    /// Phases m.
    #[serde(rename = "phase_count")]
    pub phases: usize,
    /// Layers.
    pub layers: usize,
    /// Design span.
    pub pitch: usize,
    /// Fundamental winding factor of the first phase.
    pub winding_factor: f64,
    /// Phase currents used.
    pub currents: Vec<PhasorRow>,
    /// Slot-opening width, slot pitches.
    pub slot_opening: f64,
    /// Which way the working wave (the stronger fundamental) travels.
    pub working_wave: Direction,
    /// Peak amplitude of the working wave, ampere-turns (for the current magnitudes given).
    pub working_wave_amplitude: f64,
    /// Highest electrical order listed.
    pub upto: f64,
    /// Every present order up to `upto`, amplitudes relative to the working wave.
    pub rows: Vec<WaveRow>,
    /// σ_d = Σ (F/F_w)² over every wave except the working wave, exact (Parseval).
    pub differential_leakage: f64,
    /// MMF total harmonic distortion √σ_d (all waves but the working one, r.m.s.).
    pub thd: f64,
    /// MMF snapshot at `--at-deg`.
    pub snapshot: Snapshot,
    /// Linear primaries only.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub linear: Option<LinearField>,
    /// Speeds from the core sizes and supply.
    pub figures: Figures,
    /// Designs a winder should not build (contract: a `warnings` array).
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub warnings: Vec<crate::warnings::DesignWarning>,
}

/// Working wave of a sheet: the stronger fundamental wave and its direction.
fn working(sheet: &CurrentSheet) -> Result<(Direction, f64), FieldError> {
    let (f, b) = sheet.wave(Elec::FUNDAMENTAL);
    let (dir, a) = if f >= b {
        (Direction::Forward, f)
    } else {
        (Direction::Backward, b)
    };
    let total: f64 = sheet.slot_current.iter().map(|c| c.norm()).sum();
    if a.is_nan() || a <= 1e-12 * total {
        return Err(FieldError::NoWorkingWave);
    }
    Ok((dir, a))
}

/// σ_d from a sheet and its working-wave amplitude (the one rule, [`crate::leakage::sigma`]).
fn leakage_of(sheet: &CurrentSheet, amplitude: f64) -> Result<f64, FieldError> {
    crate::leakage::sigma(sheet.mean_square(), amplitude * amplitude)
        .ok_or(FieldError::NoWorkingWave)
}

/// σ_d of a sheet: on a rotary core from its own staircase; on a linear primary from the
/// sheet folded onto whole wavelengths ([`CurrentSheet::folded`]), i.e. the sum over the
/// open primary's spectrum at the harmonic wavenumbers, its uniform (pulsating) part
/// excluded and reported apart.
fn sigma_of(sheet: &CurrentSheet) -> Result<f64, FieldError> {
    match sheet.topology {
        Topology::Rotary => {
            let (_, a) = working(sheet)?;
            leakage_of(sheet, a)
        }
        Topology::Linear => {
            let f = sheet.folded();
            let (_, a) = working(&f)?;
            leakage_of(&f, a)
        }
    }
}

/// σ_d of a winding under balanced positive-sequence currents and no slot opening: the one
/// σ_d that `field` (with those currents), `pitch`, `survey`, `thrust` and `inductance`
/// report. A flat primary is folded onto whole wavelengths ([`CurrentSheet::folded`]), so
/// odd pole counts have one too. `None` when there is no working wave.
pub fn differential_leakage(w: &Winding) -> Option<f64> {
    if w.geometry.topology == Topology::Rotary && !w.from_coil_list {
        // A synthesized rotary winding is balanced (synthesis checks it), so the real
        // staircase at one instant gives the same σ_d without the complex sheet
        // (`tests/one_fact.rs` holds the two equal).
        let mut buf = Vec::with_capacity(w.geometry.slots);
        crate::winding::star::balanced_slot_currents(w, &mut buf);
        return crate::leakage::staircase_leakage(&buf, (w.geometry.poles / 2) as u64);
    }
    let currents = balanced_currents(w.geometry.phases, Sequence::Positive);
    let sheet = CurrentSheet::new(w, &currents, 0.0).ok()?;
    sigma_of(&sheet).ok()
}

/// MMF total harmonic distortion √σ_d of [`differential_leakage`].
pub fn thd(w: &Winding) -> Option<f64> {
    differential_leakage(w).map(f64::sqrt)
}

/// Forward and backward amplitudes of every mechanical order 1..=`top` of a rotary sheet,
/// by one inverse FFT of the slot currents: S±(n) depends on n only modulo Z, so all orders
/// cost O(Z log Z) and no trigonometry beyond the FFT's own.
pub fn rotary_spectrum(sheet: &CurrentSheet, top: u64) -> Vec<(Mech, f64, f64)> {
    let z = sheet.slots();
    if z == 0 || sheet.topology != Topology::Rotary {
        return Vec::new();
    }
    let p = sheet.poles as f64 / 2.0;
    // e[m] = Σ_k C_k·e^{+j2πmk/Z} = S+(n) for n ≡ m (mod Z); S−(n) = e[(−n) mod Z]: one
    // unnormalised inverse DFT of the slot currents, by FFT in O(Z log Z).
    let mut e: Vec<rustfft::num_complex::Complex<f64>> = sheet
        .slot_current
        .iter()
        .map(|c| rustfft::num_complex::Complex::new(c.re, c.im))
        .collect();
    rustfft::FftPlanner::new()
        .plan_fft_inverse(z)
        .process(&mut e);
    let e: Vec<Complex64> = e.iter().map(|c| Complex64::new(c.re, c.im)).collect();
    let mut out = Vec::with_capacity(top as usize);
    for n in 1..=top {
        let nu = Mech(n).electrical(p);
        let r = (n % z as u64) as usize;
        let scale = sheet.opening_factor(nu).abs() / (PI * nu.get() * sheet.poles as f64);
        let plus = e[r].norm() * scale;
        let minus = e[(z - r) % z].norm() * scale;
        out.push((Mech(n), plus, minus));
    }
    out
}

/// Spectrum rows relative to `amplitude`, present orders only, up to electrical `upto`
/// (at most [`MAX_ORDERS`] orders).
fn rows_of(sheet: &CurrentSheet, upto: f64, amplitude: f64) -> Vec<WaveRow> {
    let keep = |r: &WaveRow| r.forward.max(r.backward) > PRESENT;
    match sheet.topology {
        Topology::Rotary => {
            let p = sheet.poles as f64 / 2.0;
            let top = ((upto * p + 1e-9).floor().max(0.0) as u64).min(MAX_ORDERS);
            let spectrum = rotary_spectrum(sheet, top);
            // Refer every row to the working wave as this same transform gives it, so the
            // working row reads exactly 1 (the direct slot sum differs in the last bits).
            let amplitude = spectrum
                .iter()
                .find(|r| r.0.get() as f64 == p)
                .map(|r| r.1.max(r.2))
                .filter(|a| *a > 0.0)
                .unwrap_or(amplitude);
            spectrum
                .into_iter()
                .map(|(n, f, b)| WaveRow {
                    order: n.electrical(p),
                    mech_order: Some(n),
                    forward: f / amplitude,
                    backward: b / amplitude,
                })
                .filter(keep)
                .collect()
        }
        Topology::Linear => (1..=((upto + 1e-9).floor().max(0.0) as u64).min(MAX_ORDERS))
            .map(|n| {
                let (f, b) = sheet.wave(Elec(n as f64));
                WaveRow {
                    order: Elec(n as f64),
                    mech_order: None,
                    forward: f / amplitude,
                    backward: b / amplitude,
                }
            })
            .filter(keep)
            .collect(),
    }
}

/// Crest position (slot pitches) of the working wave at ωt = `theta` radians.
fn crest(sheet: &CurrentSheet, dir: Direction, theta: f64) -> f64 {
    // Forward part of Re{F̃e^{jωt}} at order 1 is Re{c·e^{j(ωt − κx')}} with
    // c = j·S+·k_o/(π·2p) and x' = x − 0.5; backward: Re{c'·e^{j(ωt + κx')}}, c' = −j·S−·k_o/(..).
    let (plus, minus) = sheet.slot_sums(Elec::FUNDAMENTAL);
    let kappa = PI / sheet.pole_pitch_slots;
    let ko = sheet.opening_factor(Elec::FUNDAMENTAL);
    let x = match dir {
        Direction::Forward => (theta + (Complex64::i() * plus * ko).arg()) / kappa,
        Direction::Backward => -(theta + (-Complex64::i() * minus * ko).arg()) / kappa,
    };
    let period = 2.0 * sheet.pole_pitch_slots;
    (x + 0.5).rem_euclid(period)
}

/// The MMF snapshot at electrical time angle `at_deg`.
pub fn snapshot(sheet: &CurrentSheet, dir: Direction, at_deg: f64) -> Snapshot {
    let th = at_deg.to_radians();
    Snapshot {
        at_deg,
        points: sheet.snapshot(th),
        crest_x: crest(sheet, dir, th),
    }
}

/// Travelling-field analysis of a winding.
pub fn field(w: &Winding, opts: &FieldOptions) -> Result<FieldReport, FieldError> {
    crate::runs::count(crate::runs::Analysis::Field);
    let sheet = CurrentSheet::new(w, &opts.currents, opts.opening)?;
    let (dir, amp) = working(&sheet)?;
    let rows = rows_of(&sheet, opts.upto, amp);
    let sigma = sigma_of(&sheet)?;
    let g = &w.geometry;
    let figures = linear::figures(
        w,
        Operating {
            slip: opts.slip,
            airgap_power_w: None,
        },
    );
    let linear = (g.topology == Topology::Linear).then(|| {
        let (f, b) = sheet.wave(Elec::FUNDAMENTAL);
        // Samples at a quarter of the lobe width 1/(2p), capped in number.
        let step = (1.0 / (8.0 * g.poles.max(1) as f64)).max(opts.upto / MAX_CONTINUUM as f64);
        let n = (opts.upto / step).floor() as usize;
        let sides = w.slot_sides();
        let full: Vec<bool> = sides.iter().map(|&n| n >= g.layers).collect();
        let end_currents = sheet.end_currents(&full, dir);
        let none = EndCurrents::default();
        let parts = end_currents.as_ref().unwrap_or(&none);
        let continuous: Vec<ContinuumPoint> = (1..=n)
            .map(|k| {
                let order = Elec(k as f64 * step);
                let (cf, cb) = sheet.wave(order);
                let (ef, eb) = sheet.wave_of(&parts.entry, order);
                let (xf, xb) = sheet.wave_of(&parts.exit, order);
                ContinuumPoint {
                    order,
                    forward: cf / amp,
                    backward: cb / amp,
                    entry_forward: ef / amp,
                    entry_backward: eb / amp,
                    exit_forward: xf / amp,
                    exit_backward: xb / amp,
                }
            })
            .collect();
        let ends = end_currents.as_ref().map(|e| {
            let (ef, eb) = sheet.wave_of(&e.entry, Elec::FUNDAMENTAL);
            let (xf, xb) = sheet.wave_of(&e.exit, Elec::FUNDAMENTAL);
            EndComponents {
                entry_forward_at_1: ef / amp,
                entry_backward_at_1: eb / amp,
                exit_forward_at_1: xf / amp,
                exit_backward_at_1: xb / amp,
                entry_slots: e.entry.iter().map(|&(k, _)| SlotNo::at(k)).collect(),
                exit_slots: e.exit.iter().map(|&(k, _)| SlotNo::at(k)).collect(),
            }
        });
        let strongest_between_orders = continuous
            .iter()
            .filter(|p| (p.order.get() - p.order.get().round()).abs() >= 0.25 - 1e-9)
            .copied()
            .max_by(|a, b| {
                a.forward
                    .max(a.backward)
                    .total_cmp(&b.forward.max(b.backward))
            });
        LinearField {
            continuous,
            strongest_between_orders,
            ends,
            synchronous_wavenumber_rad_m: w.pole_pitch().map(Length::m).map(|t| PI / t),
            synchronous_wavenumber_rad_slot: PI / g.pole_pitch_slots,
            forward_wave: f / amp,
            backward_wave: b / amp,
            pulsating: sheet.pulsating() / amp,
            field_speed_m_s: figures.synchronous_speed_m_s,
            secondary_speed_m_s: figures.speed_m_s,
        }
    });
    Ok(FieldReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        topology: g.topology,
        slots: g.slots,
        poles: g.poles,
        phases: g.phases,
        layers: g.layers,
        pitch: w.pitch,
        winding_factor: factors::fundamental(w).winding,
        currents: opts
            .currents
            .iter()
            .enumerate()
            .map(|(k, c)| PhasorRow {
                phase: w.label(k).to_string(),
                magnitude: c.norm(),
                angle_deg: tidy(c.arg().to_degrees()),
            })
            .collect(),
        slot_opening: opts.opening,
        working_wave: dir,
        working_wave_amplitude: amp,
        upto: opts.upto,
        rows,
        differential_leakage: sigma,
        thd: sigma.sqrt(),
        snapshot: snapshot(&sheet, dir, opts.at_deg),
        warnings: {
            let mut v = crate::warnings::design_warnings(w);
            if let Some(l) = &linear
                && g.layers == 1
                && l.pulsating > 1.0
            {
                v.push(crate::warnings::DesignWarning::PulsatingExceedsWorking {
                    ratio: l.pulsating,
                });
            }
            v
        },
        linear,
        figures,
    })
}

/// Snapshots at `count` instants evenly spread over one period, for drawing.
pub fn snapshots(
    w: &Winding,
    opts: &FieldOptions,
    count: usize,
) -> Result<Vec<Snapshot>, FieldError> {
    crate::runs::count(crate::runs::Analysis::FieldSnapshots);
    let sheet = CurrentSheet::new(w, &opts.currents, opts.opening)?;
    let (dir, _) = working(&sheet)?;
    Ok((0..count)
        .map(|i| snapshot(&sheet, dir, 360.0 * i as f64 / count.max(1) as f64))
        .collect())
}

/// Angle in (−180, 180] degrees with rounding dust removed.
fn tidy(a: f64) -> f64 {
    let r = (a * 1e9).round() / 1e9;
    if r <= -180.0 { r + 360.0 } else { r + 0.0 }
}
