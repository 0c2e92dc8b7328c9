//! A flat primary's field from its own current sheet, by the layer (Fourier-transform)
//! method, beside the equivalent circuit of [`crate::thrust`].
//!
//! The finite primary's slot ampere-conductors form one current sheet K(x) on the face of
//! the primary iron (every slot of the coil list, half-filled end slots and odd pole counts
//! as they are). Its Fourier transform K̂(k) = ∫ K(x)·e^(jkx) dx splits it into travelling
//! waves e^(j(ωt − kx)), each meeting the moving secondary at its own slip
//! s_k = 1 − k·v/ω. For each wavenumber the layers across the gap are solved in closed form
//! and every figure is an integral over k (Parseval's theorem). Formulas and sources:
//!
//! - In a layer of permeability μ and conductivity σ moving at v, the vector potential
//!   A_z·e^(j(ωt − kx)) obeys ∂²A/∂y² = γ²·A, γ² = k² + jωμσ·s_k (the magnetic diffusion
//!   equation in the moving conductor; e.g. Yamamura, *Theory of Linear Induction Motors*,
//!   1979, ch. 2, from memory).
//! - The ratio R = H_x/A_z, continuous across every interface, is carried from the far
//!   side to the primary: through a layer of thickness t,
//!   R_below = (γ/μ)·(ρ − tanh γt)/(1 − ρ·tanh γt), ρ = μ·R_above/γ (the transfer relation
//!   of layered travelling-wave problems, Greig and Freeman, Proc. IEE 114, 1967, from
//!   memory; derived again in `docs/theory.md`). R = 0 on ideal iron; R = −|k|/μ0 under
//!   air reaching to infinity.
//! - At the primary face H_x(0+) = −K̂, so Â(0) = −K̂/R(0); B_x = −μ0·K̂, B_y = −jk·K̂/R.
//! - Phase inductance L_qp = (W/2π)·∫ (−1/R)·K̂_p·K̂_q* dk, W the stack width, K̂_p the
//!   sheet of unit current in phase p (flux linkage λ_q = W·Σ_j c_qj·A(x_j)).
//! - Thrust (Maxwell's stress on a plane in the gap, time-averaged, r.m.s. phasors)
//!   F = (W/2π)·∫ k·Re(−j/R)·|K̂|² dk; attraction N = (W/2π)·∫ (|B_y|² − |B_x|²)/(2μ0) dk.
//! - Each slot's ampere-conductors spread evenly over its opening: K̂ carries
//!   sin(k·b0/2)/(k·b0/2).
//! - Transverse edge effect: the plate's conductivity times the Russell–Norsworthy factor
//!   at each wave's own pole pitch π/|k| (the circuit's rule, per wavenumber).
//!
//! Assumptions (each stated in the report): the primary iron is infinitely permeable, its
//! magnetic potential floats so that its flux closes in it, and the face beyond its ends is
//! taken as unexcited iron (only the primary's sheet and its iron's potential are finite); slots
//! are smoothed by Carter's coefficient on the gap, as in the circuit (the air layer is the
//! circuit's effective gap less the plate); the backing steel is linear; a double-sided
//! pair is two equal primaries fed alike, whose field is mirror-symmetric about the plate's
//! mid-plane (B_x = 0 there: R = 0, half the plate for each primary).

use crate::units::Length;
use num_complex::Complex64 as C;
use serde::Serialize;
use std::f64::consts::PI;

use crate::thrust::{Feed, MU0, ThrustError, edge_factor};
use crate::winding::Winding;
use crate::winding::star::{phase_operator, slot_currents};

/// One operating point of the field model.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FieldRow {
    /// Slip s of the working wave.
    pub slip: f64,
    /// Secondary speed (1 − s)·v_s, m/s.
    pub speed_m_s: f64,
    /// Thrust on the plate, N (both primaries of a pair).
    pub thrust_n: f64,
    /// Normal force between a primary and the secondary, N, attraction positive.
    pub normal_force_n: f64,
    /// Each phase's current, A r.m.s. (unequal on an open primary fed from a voltage).
    pub phase_currents_a: Vec<f64>,
    /// Each phase's EMF from the gap field, V r.m.s.
    pub phase_emf_v: Vec<f64>,
    /// Electrical input, W (both primaries of a pair).
    pub input_w: f64,
    /// Copper loss in the primary, W.
    pub copper_loss_w: f64,
    /// Power crossing the gap, W.
    pub airgap_power_w: f64,
    /// Heat in the plate and backing, W: the gap power less the mechanical power.
    pub secondary_loss_w: f64,
    /// Input over the phases' apparent power Σ|V|·|I|.
    pub power_factor: f64,
    /// Mechanical output over input while motoring (0 ≤ s ≤ 1); null otherwise.
    pub efficiency: Option<f64>,
}

/// The field model's figures beside the circuit's.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FieldModel {
    /// Operating points at the slips of the circuit's table.
    pub rows: Vec<FieldRow>,
    /// Largest thrust in the slip range, N.
    pub max_thrust_n: f64,
    /// Its slip.
    pub max_thrust_slip: f64,
    /// Field-model thrust over the circuit's at standstill (null without a standstill row).
    pub standstill_thrust_ratio: Option<f64>,
    /// Field-model largest thrust over the circuit's (null when the circuit's is zero).
    pub max_thrust_ratio: Option<f64>,
    /// Phase impedance matrix at standstill, ohms, row q column p as [re, im].
    pub standstill_impedance_ohm: Vec<Vec<[f64; 2]>>,
    /// Primary resistance per phase at the winding's temperature, ohms.
    pub r1_ohm: f64,
    /// Slot and end-winding leakage reactance per phase (the gap field holds the rest), ohms.
    pub x_leakage_ohm: f64,
    /// Wavenumbers integrated over.
    pub wavenumbers: usize,
    /// Largest wavenumber, 1/m.
    pub k_max_per_m: f64,
    /// The largest wavenumber the gap and slots asked for; beyond `k_max_per_m` when the
    /// wavenumbers were capped at `MAX_WAVENUMBERS`.
    pub k_max_wanted_per_m: f64,
    /// Length over which the field is resolved (2π/Δk), m.
    pub window_m: f64,
    /// The window the field's reach asked for; longer than `window_m` when the wavenumbers
    /// were capped at `MAX_WAVENUMBERS` (the field trailing further is not resolved).
    pub window_wanted_m: f64,
    /// True for a plate between two primaries (each primary's half solved by symmetry).
    pub double_sided: bool,
}

/// The far side of the plate, seen from the primary.
#[derive(Debug, Clone, Copy)]
pub enum Far {
    /// Ideal iron (or a pair's mirror plane): R = 0.
    Iron,
    /// Steel then air.
    Steel {
        /// Thickness, m.
        t: f64,
        /// Conductivity, S/m.
        sigma: f64,
        /// Permeability μ_r·μ0, H/m.
        mu: f64,
    },
}

/// Everything fixed before any slip: the sheet's spectrum and the layers.
pub struct Sheet {
    m: usize,
    /// The phases and, last, the primary iron's floating magnetic potential.
    sets: usize,
    ks: Vec<f64>,
    /// K̂_q*·K̂_p per wavenumber, at [i·m² + q·m + p].
    prod: Vec<C>,
    /// Russell–Norsworthy factor per wavenumber.
    edge: Vec<f64>,
    /// tanh(|k|·g_air) per wavenumber.
    th_air: Vec<f64>,
    /// W·Δk/(2π).
    scale: f64,
    omega: f64,
    vs: f64,
    plate_t: f64,
    air: f64,
    sigma: f64,
    far: Far,
    sides: f64,
    r1: f64,
    x_leak: f64,
    /// Phase voltage phasors when voltage-fed (None: current-fed).
    volts: Option<Vec<C>>,
    /// Current phasors when current-fed.
    amps: Vec<C>,
    star: bool,
    window: f64,
    wanted: f64,
    k_max: f64,
    wanted_k: f64,
}

/// Principal square root by the half-angle formulas: one hypot and two real roots, without
/// the polar form's atan2, sin and cos (the layers need one per wavenumber and slip).
#[inline]
fn sqrt_c(z: C) -> C {
    let r = z.norm();
    if r == 0.0 {
        return C::new(0.0, 0.0);
    }
    // The larger part from the sum that does not cancel, the other as y/(2·larger).
    if z.re >= 0.0 {
        let re = ((r + z.re) / 2.0).sqrt();
        C::new(re, z.im / (2.0 * re))
    } else {
        let im = ((r - z.re) / 2.0).sqrt().copysign(z.im);
        C::new(z.im / (2.0 * im), im)
    }
}

/// The wavenumbers a flat primary's sheet is resolved on, and its slots' spread.
struct Grid {
    ks: Vec<f64>,
    dk: f64,
    ts: f64,
    b0: f64,
    length: f64,
    k_max: f64,
    window: f64,
    /// The window the field's reach asks for (longer than `window` when capped).
    wanted: f64,
    /// The range the gap and slots ask for (beyond `k_max` when capped).
    wanted_k: f64,
}

/// The most wavenumbers a three-phase sheet is resolved on: 131 072 (its products about
/// 34 MB, some 10 ms a speed on one core). With more sets (phases, coils) fewer, so that
/// memory stays the same: see [`Grid::most_for`].
pub const MAX_WAVENUMBERS: usize = 1 << 17;

/// Where the grid was cut short of what the inputs ask.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GridCut {
    /// Window used, m.
    pub window_m: f64,
    /// Window asked for, m.
    pub wanted_m: f64,
    /// Largest wavenumber used, 1/m.
    pub k_max: f64,
    /// Largest wavenumber asked for, 1/m.
    pub wanted_k_max: f64,
}

impl Grid {
    /// The most wavenumbers for `sets` sets whose products are kept (`square`, the field
    /// model: N·sets² ≤ 16·MAX) or only whose spectra are (N·sets ≤ 4·MAX).
    fn most_for(sets: usize, square: bool) -> usize {
        let sets = sets.max(1);
        if square {
            MAX_WAVENUMBERS * 16 / (sets * sets)
        } else {
            MAX_WAVENUMBERS * 4 / sets
        }
        .clamp(256, MAX_WAVENUMBERS)
    }

    /// The cut, when window or range is short of what was asked.
    fn cut(&self) -> Option<GridCut> {
        (self.wanted > self.window * (1.0 + 1e-9)).then_some(GridCut {
            window_m: self.window,
            wanted_m: self.wanted,
            k_max: self.k_max,
            wanted_k_max: self.wanted_k,
        })
    }

    /// Midpoint wavenumbers ±(n + ½)·Δk: Δk = 2π/Λ with the window Λ = 2·L + 10·`reach`
    /// (the primary's length L twice, and ten times how far its field reaches beyond it),
    /// up to four slot-harmonic bands 4·2π/τ_s, at least 24·k_1 and at least `k_floor`
    /// (what the gap asks); both `refine` times.
    fn of(
        w: &Winding,
        reach: f64,
        k_floor: f64,
        refine: f64,
        most: usize,
    ) -> Result<Grid, ThrustError> {
        let ts = w
            .slot_pitch()
            .map(Length::m)
            .ok_or(ThrustError::Missing(crate::thrust::Input::SlotPitch))?;
        let d = &w.design;
        let k1 = PI / (ts * w.geometry.pole_pitch_slots);
        let length = w.geometry.slots as f64 * ts;
        let wanted = (2.0 * length + 10.0 * reach) * refine;
        // Four slot-harmonic bands either side: the sheet's spectrum beyond is under the
        // opening's sinc and the gap's e^(−|k|g) (the convergence test doubles it).
        let wanted_k = (4.0 * 2.0 * PI / ts).max(24.0 * k1).max(k_floor) * refine;
        // At most `most` wavenumbers (memory and time stay bounded whatever the plate):
        // window and range are both shortened by the same factor, and the report says so.
        let most = most.max(2);
        let shrink = (wanted_k * wanted / PI / most as f64).sqrt().max(1.0);
        let (window, k_max) = (wanted / shrink, wanted_k / shrink);
        let dk = 2.0 * PI / window;
        let half = ((k_max / dk).ceil() as usize).clamp(1, most / 2);
        let ks = (0..2 * half)
            .map(|i| (i as f64 + 0.5 - half as f64) * dk)
            .collect();
        let b0 = d
            .slot_opening
            .map(Length::m)
            .or(d.slot_size.map(|(b, h)| (b.m(), h.m())).map(|(b, _)| b))
            // Neither given: half the slot pitch (common practice for a slot's width;
            // a current filament of no width would have no finite inductance).
            .unwrap_or(ts / 2.0)
            .min(ts);
        Ok(Grid {
            ks,
            dk,
            ts,
            b0,
            length,
            k_max,
            window,
            wanted,
            wanted_k,
        })
    }

    /// K̂ of each set of slot conductors `sets[set][slot]` at every wavenumber, each slot's
    /// current spread over b0, and last the primary iron's floating potential: at
    /// `[i·(S + 1) + set]`.
    ///
    /// The primary iron ends at x = 0 and x = Z·τ_s; its magnetic potential floats, set so
    /// that no net flux leaves it through the gap (the flux closes in the primary core). A
    /// potential ψ on the primary iron against the iron beyond its ends is a step in the
    /// turns function there: a sheet ψ·[δ(x) − δ(x − Z·τ_s)], one more set, whose flux
    /// linkage must vanish; the step is spread over a slot pitch, the end tooth.
    fn spectra(&self, sets: &[Vec<f64>]) -> Vec<C> {
        let s = sets.len();
        let n = self.ks.len();
        let w = s + 1;
        let mut khat = vec![C::new(0.0, 0.0); n * w];
        let slots = sets.iter().map(Vec::len).max().unwrap_or(0);
        for j in 0..slots {
            if sets.iter().all(|u| u.get(j).is_none_or(|x| *x == 0.0)) {
                continue;
            }
            let x = (j as f64 + 0.5) * self.ts;
            let step = C::from_polar(1.0, self.dk * x);
            let mut e = C::new(0.0, 0.0);
            for (i, k) in self.ks.iter().enumerate() {
                // Exact every 256 steps, so the recurrence cannot drift.
                if i % 256 == 0 {
                    e = C::from_polar(1.0, k * x);
                }
                for (p, u) in sets.iter().enumerate() {
                    khat[i * w + p] += e * u.get(j).copied().unwrap_or(0.0);
                }
                e *= step;
            }
        }
        let sinc = |a: f64| if a.abs() < 1e-12 { 1.0 } else { a.sin() / a };
        for (i, k) in self.ks.iter().enumerate() {
            let spread = sinc(k * self.b0 / 2.0);
            for p in 0..s {
                khat[i * w + p] *= spread;
            }
            khat[i * w + s] = (1.0 - C::from_polar(1.0, k * self.length)) * sinc(k * self.ts / 2.0);
        }
        khat
    }
}

/// Conductors of every slot per ampere of each phase's current (each path carrying 1/a of
/// it), `[phase][slot]`: the slot-current rule (`star::slot_currents`) for unit currents.
pub fn phase_sets(w: &Winding) -> Vec<Vec<f64>> {
    let m = w.geometry.phases;
    (0..m)
        .map(|p| {
            let mut cur = vec![C::new(0.0, 0.0); m];
            cur[p] = C::new(1.0, 0.0);
            slot_currents(w, &cur).iter().map(|x| x.re).collect()
        })
        .collect()
}

/// The gap's inductance matrix, H, of conductor sets `sets[set][slot]` (conductors per
/// ampere of the set's current) on a flat primary, with no current in the secondary (the
/// plate as a non-conductor, as at rest on direct current): the layer method's
/// L_ij = (W/2π)·∫ μ0·coth(|k|·g_e)/|k| · K̂_i*·K̂_j dk over the effective gap g_e on ideal
/// iron, the primary's floating potential eliminated (L_ij − L_iψ·L_ψj/L_ψψ). The one
/// phase matrix of `inductance` and of the field model with the plate at rest.
pub fn gap_inductances(
    w: &Winding,
    sets: &[Vec<f64>],
) -> Result<(Vec<Vec<f64>>, Option<GridCut>), ThrustError> {
    let ge = crate::thrust::gap(w)?.effective_m;
    let width = w
        .design
        .core
        .stack
        .map(Length::m)
        .ok_or(ThrustError::Missing(crate::thrust::Input::Stack))?;
    // The field model's grid rule, its air layer above a plate of that thickness (the
    // same wavenumbers reach the plate's face).
    let air = w.design.secondary.map_or(ge, |s| {
        let sides = if s.back_iron { 1.0 } else { 2.0 };
        (ge - s.thickness.m() / sides).max(1e-6)
    });
    let grid = Grid::of(
        w,
        4.0 * air,
        8.0 / air,
        1.0,
        Grid::most_for(sets.len() + 1, false),
    )?;
    let khat = grid.spectra(sets);
    let n = sets.len() + 1;
    let mut l = vec![vec![0.0; n]; n];
    for (i, k) in grid.ks.iter().enumerate() {
        // The one layer rule with nothing conducting: −1/R = μ0·coth(|k|·g_e)/|k|.
        let wk = (-1.0 / face_ratio(*k, 0.0, 0.0, 0.0, (k.abs() * ge).tanh(), Far::Iron)).re;
        let row = &khat[i * n..(i + 1) * n];
        for a in 0..n {
            for b in 0..=a {
                l[a][b] += wk * (row[a].conj() * row[b]).re;
            }
        }
    }
    let scale = width * grid.dk / (2.0 * PI);
    // Filled below the diagonal; read symmetrically.
    let at = |a: usize, b: usize| l[a.max(b)][a.min(b)] * scale;
    let e = n - 1;
    let matrix = (0..e)
        .map(|a| {
            (0..e)
                .map(|b| at(a, b) - at(a, e) * at(e, b) / at(e, e))
                .collect()
        })
        .collect();
    Ok((matrix, grid.cut()))
}

/// Complex tanh that neither overflows nor loses the sign for large real parts.
fn tanh_c(z: C) -> C {
    if z.re < 0.0 {
        return -tanh_c(-z);
    }
    let e = (-2.0 * z).exp();
    (1.0 - e) / (1.0 + e)
}

/// R below a layer of thickness `t` from R above it (module notes).
#[inline]
fn through(r_above: C, gamma: C, mu: f64, th: C) -> C {
    let rho = r_above * mu / gamma;
    gamma / mu * (rho - th) / (1.0 - rho * th)
}

impl Sheet {
    /// The primary's sheet and the secondary's layers; `slips` sets how far the field must
    /// be followed behind the primary (the window).
    pub fn new(w: &Winding, feed: Feed, slips: &[f64]) -> Result<Sheet, ThrustError> {
        Sheet::with_grid(w, feed, slips, 1.0)
    }

    /// [`Sheet::new`] with the window and the wavenumber range both `refine` times the
    /// model's own (the convergence test's handle; 1 is the model).
    pub fn with_grid(
        w: &Winding,
        feed: Feed,
        slips: &[f64],
        refine: f64,
    ) -> Result<Sheet, ThrustError> {
        let md = crate::thrust::model(w)?;
        let c = md.circuit;
        let d = &w.design;
        let sec = d
            .secondary
            .ok_or(ThrustError::Missing(crate::thrust::Input::Secondary))?;
        let ts = w
            .slot_pitch()
            .map(Length::m)
            .ok_or(ThrustError::Missing(crate::thrust::Input::SlotPitch))?;
        let m = w.geometry.phases;
        let z = w.geometry.slots;
        let tau = c.pole_pitch_m;
        let k1 = PI / tau;
        let sides = if sec.back_iron { 1.0 } else { 2.0 };
        // Per primary: the circuit's gap (already per primary for a pair) less its plate.
        let plate_t = sec.thickness.m() / sides;
        let air = (md.ge - plate_t).max(1e-6);
        // How far the plate's reaction trails the primary: the entry wave's length
        // τ·G·|1 − s|/π (the end-effect length of Duncan's Q), at the slowest decay asked.
        let reach_slip = slips.iter().map(|s| (1.0 - s).abs()).fold(0.0f64, f64::max);
        let reach = tau * (c.xm_ohm / c.r2_ohm) * reach_slip.max(0.05) / PI + 4.0 * air;
        // Every wave that still reaches the plate: e^(−2|k|·g_air) below e^(−16) beyond.
        let grid = Grid::of(w, reach, 8.0 / air, refine, Grid::most_for(m + 1, true))?;
        let (ks, k_max, window) = (grid.ks.clone(), grid.k_max, grid.window);
        let (wanted, wanted_k) = (grid.wanted, grid.wanted_k);
        let dk = grid.dk;
        let n = ks.len();
        // Conductors per slot for unit current in each phase (per path).
        let unit = phase_sets(w);
        let khat = grid.spectra(&unit);
        let sets = m + 1;
        let mut prod = vec![C::new(0.0, 0.0); n * sets * sets];
        for i in 0..n {
            let row = &khat[i * sets..(i + 1) * sets];
            for q in 0..sets {
                for p in 0..sets {
                    prod[i * sets * sets + q * sets + p] = row[q].conj() * row[p];
                }
            }
        }
        let stack = c.width_m;
        let plate_w = sec.width.map(Length::m).unwrap_or(stack).max(stack);
        let edge = ks
            .iter()
            .map(|k| edge_factor(stack / 2.0, plate_w / 2.0, PI / k.abs()))
            .collect();
        let th_air = ks.iter().map(|k| (k.abs() * air).tanh()).collect();
        let far = match (sec.back_iron, sec.backing) {
            (true, Some(b)) => Far::Steel {
                t: b.thickness.m(),
                sigma: b.conductivity_s_m,
                mu: MU0 * b.relative_permeability,
            },
            _ => Far::Iron,
        };
        // The field runs the way the winding sends it under positive-sequence currents;
        // a winding laid the other way round is fed in the other order, so that thrust
        // is positive along the working wave, as in the circuit.
        let op = |p: usize| phase_operator(p, m);
        let ahead: f64 = {
            let wave = |sign: f64| -> f64 {
                let mut s = C::new(0.0, 0.0);
                for j in 0..z {
                    let x = (j as f64 + 0.5) * ts;
                    for (p, u) in unit.iter().enumerate() {
                        s += op(p) * u[j] * C::from_polar(1.0, sign * k1 * x);
                    }
                }
                s.norm()
            };
            wave(1.0) - wave(-1.0)
        };
        let seq = |p: usize| if ahead >= 0.0 { op(p) } else { op(p).conj() };
        let star = d.connection == crate::design::Connection::Star;
        let (volts, amps) = match feed {
            Feed::Voltage { phase_voltage_v } => (
                Some((0..m).map(|p| seq(p) * phase_voltage_v).collect()),
                Vec::new(),
            ),
            Feed::Current { phase_current_a } => {
                (None, (0..m).map(|p| seq(p) * phase_current_a).collect())
            }
        };
        Ok(Sheet {
            m,
            sets,
            ks,
            prod,
            edge,
            th_air,
            scale: stack * dk / (2.0 * PI),
            omega: c.omega,
            vs: md.vs,
            plate_t,
            air,
            sigma: sec.conductivity_hot_s_m(),
            far,
            sides,
            r1: c.r1_ohm,
            x_leak: c.x_slot_ohm + c.x_end_ohm,
            volts,
            amps,
            star,
            window,
            wanted,
            k_max,
            wanted_k,
        })
    }

    /// R(0) at the primary face for wavenumber `i` with the secondary at speed `v`.
    #[inline]
    fn face(&self, i: usize, v: f64) -> C {
        let k = self.ks[i];
        face_ratio(
            k,
            self.omega - k * v,
            self.sigma * self.edge[i],
            self.plate_t,
            self.th_air[i],
            self.far,
        )
    }

    /// The gap's phase inductance matrix (complex: the secondary's reaction included) and
    /// the thrust and attraction matrices, at secondary speed `v`.
    fn matrices(&self, v: f64) -> [Vec<C>; 3] {
        let mm = self.sets * self.sets;
        let mut l = vec![C::new(0.0, 0.0); mm];
        let mut fx = vec![C::new(0.0, 0.0); mm];
        let mut fy = vec![C::new(0.0, 0.0); mm];
        for (i, k) in self.ks.iter().enumerate() {
            let r = -1.0 / self.face(i, v);
            let wf = -k * r.im;
            let wn = (k * k * r.norm_sqr() - MU0 * MU0) / (2.0 * MU0);
            let pr = &self.prod[i * mm..(i + 1) * mm];
            for e in 0..mm {
                l[e] += r * pr[e];
                fx[e] += pr[e] * wf;
                fy[e] += pr[e] * wn;
            }
        }
        for x in l.iter_mut().chain(fx.iter_mut()).chain(fy.iter_mut()) {
            *x *= self.scale;
        }
        [l, fx, fy]
    }

    /// The impedance matrix of the phases and the floating potential: jω·L from the field,
    /// plus R1 + jX_σ on the phases' diagonal.
    fn impedance(&self, l: &[C]) -> Vec<C> {
        let n = self.sets;
        let mut z: Vec<C> = l.iter().map(|x| C::new(0.0, self.omega) * x).collect();
        for q in 0..self.m {
            z[q * n + q] += C::new(self.r1, self.x_leak);
        }
        z
    }

    /// The phase currents and, last, the floating potential, for impedance matrix `z`;
    /// an error when the equations have no single solution.
    fn drive(&self, z: &[C], slip: f64) -> Result<Vec<C>, ThrustError> {
        let (m, n) = (self.m, self.sets);
        let x = match &self.volts {
            Some(vs) => solve(z, vs, m, self.star),
            None => {
                let own = z[m * n + m];
                (own.norm() > 0.0).then(|| {
                    let mut x = self.amps.clone();
                    let linked: C = (0..m).map(|p| z[m * n + p] * x[p]).sum();
                    x.push(-linked / own);
                    x
                })
            }
        };
        x.filter(|x| x.iter().all(|c| c.re.is_finite() && c.im.is_finite()))
            .ok_or(ThrustError::NoSolution { slip })
    }

    /// The operating point at slip `s`.
    pub fn point(&self, s: f64) -> Result<FieldRow, ThrustError> {
        let v = (1.0 - s) * self.vs;
        let [l, fx, fy] = self.matrices(v);
        let z = self.impedance(&l);
        let (m, n) = (self.m, self.sets);
        let amps = self.drive(&z, s)?;
        let quad = |a: &[C]| -> C {
            let mut t = C::new(0.0, 0.0);
            for q in 0..n {
                for p in 0..n {
                    t += amps[q].conj() * a[q * n + p] * amps[p];
                }
            }
            t
        };
        let volts: Vec<C> = (0..m)
            .map(|q| (0..n).map(|p| z[q * n + p] * amps[p]).sum())
            .collect();
        let emf: Vec<f64> = (0..m)
            .map(|q| {
                (0..n)
                    .map(|p| C::new(0.0, self.omega) * l[q * n + p] * amps[p])
                    .sum::<C>()
                    .norm()
            })
            .collect();
        let input: f64 = (0..m).map(|q| (volts[q] * amps[q].conj()).re).sum();
        let apparent: f64 = (0..m).map(|q| volts[q].norm() * amps[q].norm()).sum();
        let copper: f64 = amps[..m].iter().map(|i| i.norm_sqr() * self.r1).sum();
        let thrust = quad(&fx).re * self.sides;
        let gap = (C::new(0.0, self.omega) * quad(&l)).re * self.sides;
        let input = input * self.sides;
        let copper = copper * self.sides;
        let out = thrust * v;
        Ok(FieldRow {
            slip: s,
            speed_m_s: v,
            thrust_n: thrust,
            normal_force_n: quad(&fy).re,
            phase_currents_a: amps[..m].iter().map(|i| i.norm()).collect(),
            phase_emf_v: emf,
            input_w: input,
            copper_loss_w: copper,
            airgap_power_w: gap,
            secondary_loss_w: gap - out,
            power_factor: if apparent > 0.0 {
                input * self.sides.recip() / apparent
            } else {
                1.0
            },
            efficiency: crate::thrust::efficiency(s, input, out),
        })
    }

    /// The phase impedance matrix at slip `s` as the terminals see it, ohms (row q, column
    /// p): the floating potential eliminated, Z_qp − Z_qψ·Z_ψp/Z_ψψ.
    pub fn impedance_at(&self, s: f64) -> Vec<Vec<C>> {
        let [l, _, _] = self.matrices((1.0 - s) * self.vs);
        let z = self.impedance(&l);
        let (m, n) = (self.m, self.sets);
        (0..m)
            .map(|q| {
                (0..m)
                    .map(|p| {
                        let own = z[m * n + m];
                        if own.norm() > 0.0 {
                            z[q * n + p] - z[q * n + m] * z[m * n + p] / own
                        } else {
                            z[q * n + p]
                        }
                    })
                    .collect()
            })
            .collect()
    }

    /// The plate's and the backing's heat at slip `s` under phase currents `amps`, W, by
    /// integrating σ·|s_k·ω·A|² through each layer: independent of the gap power, for the
    /// energy balance. Per primary.
    pub fn layer_losses(&self, s: f64, amps: &[C]) -> (f64, f64) {
        let v = (1.0 - s) * self.vs;
        let m = self.sets;
        let mm = m * m;
        let (mut plate, mut back) = (0.0, 0.0);
        for (i, &k) in self.ks.iter().enumerate() {
            let sw = self.omega - k * v;
            let pr = &self.prod[i * mm..(i + 1) * mm];
            let mut ksq = 0.0;
            for q in 0..m {
                for p in 0..m {
                    ksq += (amps[q].conj() * pr[q * m + p] * amps[p]).re;
                }
            }
            let ak = k.abs();
            let air_top = C::new(-ak / MU0, 0.0);
            let plate_top = match self.far {
                Far::Iron => C::new(0.0, 0.0),
                Far::Steel { t, sigma, mu } => {
                    let g = sqrt_c(C::new(k * k, mu * sigma * sw));
                    through(air_top, g, mu, tanh_c(g * t))
                }
            };
            let sig_p = self.sigma * self.edge[i];
            let gp = sqrt_c(C::new(k * k, MU0 * sig_p * sw));
            let plate_bottom = through(plate_top, gp, MU0, tanh_c(gp * self.plate_t));
            // A at the face per unit K̂, then up through the air to the plate.
            let a0 = -1.0
                / through(
                    plate_bottom,
                    C::new(ak, 0.0),
                    MU0,
                    C::new(self.th_air[i], 0.0),
                );
            let (_, a_plate) = layer(a0, plate_bottom, C::new(ak, 0.0), MU0, self.air);
            let (ip, a_steel) = layer(a_plate, plate_top, gp, MU0, self.plate_t);
            plate += sig_p * sw * sw * ip * ksq;
            if let Far::Steel { t, sigma, mu } = self.far {
                let g = sqrt_c(C::new(k * k, mu * sigma * sw));
                let (ib, _) = layer(a_steel, air_top, g, mu, t);
                back += sigma * sw * sw * ib * ksq;
            }
        }
        (plate * self.scale, back * self.scale)
    }

    /// The current phasors the model drives at slip `s` (solved when voltage-fed), and
    /// last the primary iron's floating potential.
    pub fn currents_at(&self, s: f64) -> Result<Vec<C>, ThrustError> {
        let [l, _, _] = self.matrices((1.0 - s) * self.vs);
        self.drive(&self.impedance(&l), s)
    }

    /// Wavenumbers, the largest and the largest asked for, the window and the window
    /// asked for.
    pub fn grid(&self) -> (usize, f64, f64, f64, f64) {
        (
            self.ks.len(),
            self.k_max,
            self.wanted_k,
            self.window,
            self.wanted,
        )
    }

    /// True for a double-sided pair.
    pub fn double_sided(&self) -> bool {
        self.sides > 1.0
    }

    /// Primary resistance and leakage reactance per phase, ohms.
    pub fn r1_x_leak(&self) -> (f64, f64) {
        (self.r1, self.x_leak)
    }
}

/// R = H_x/A_z at the primary face for wavenumber `k` at slip frequency `sw` = s_k·ω:
/// from the far side (ideal iron, or steel then air) through the plate of conductivity
/// `sigma` and thickness `plate_t`, then the air layer (`th_air` = tanh(|k|·g_air)).
#[inline]
pub fn face_ratio(k: f64, sw: f64, sigma: f64, plate_t: f64, th_air: f64, far: Far) -> C {
    let ak = k.abs();
    let mut r = match far {
        Far::Iron => C::new(0.0, 0.0),
        Far::Steel { t, sigma, mu } => {
            let g = sqrt_c(C::new(k * k, mu * sigma * sw));
            through(C::new(-ak / MU0, 0.0), g, mu, tanh_c(g * t))
        }
    };
    let g = sqrt_c(C::new(k * k, MU0 * sigma * sw));
    r = through(r, g, MU0, tanh_c(g * plate_t));
    through(r, C::new(ak, 0.0), MU0, C::new(th_air, 0.0))
}

/// Sech of a complex argument without overflow.
fn sech_c(z: C) -> C {
    let z = if z.re < 0.0 { -z } else { z };
    let e = (-z).exp();
    2.0 * e / (1.0 + e * e)
}

/// Through a layer of thickness `t` (propagation γ, permeability μ) whose bottom carries
/// A = `a_b` and whose top has the ratio R = `r_top`: ∫₀ᵗ |A(u)|² du, and A at the top.
/// A(t) = A(0)·sech γt/(1 − ρ_t·tanh γt), ρ_t = μ·R_top/γ (from the layer's cosh/sinh
/// solution); the integral in closed form, written in decaying exponentials when the
/// layer is thick so that nothing overflows.
fn layer(a_b: C, r_top: C, g: C, mu: f64, t: f64) -> (f64, C) {
    let g = if g.re < 0.0 { -g } else { g };
    let gt = g * t;
    let th = tanh_c(gt);
    let a_t = a_b * sech_c(gt) / (1.0 - r_top * mu / g * th);
    let (al, be) = (g.re, g.im);
    let expint = |c: f64| -> f64 {
        if (c * t).abs() < 1e-9 {
            t * (1.0 + c * t / 2.0)
        } else {
            (c * t).exp_m1() / c
        }
    };
    let osc = {
        let x = 2.0 * be;
        if (x * t).abs() < 1e-9 {
            C::new(t, x * t * t / 2.0)
        } else {
            (C::new(0.0, x * t).exp() - 1.0) / C::new(0.0, x)
        }
    };
    let integral = if gt.re < 1.0 {
        // A = p·e^(γu) + q·e^(−γu) from A(0) and A(t).
        let (e1, e2) = (gt.exp(), (-gt).exp());
        let det = e2 - e1;
        let p = (a_b * e2 - a_t) / det;
        let q = (a_t - a_b * e1) / det;
        p.norm_sqr() * expint(2.0 * al)
            + q.norm_sqr() * expint(-2.0 * al)
            + 2.0 * (p * q.conj() * osc).re
    } else {
        // A = P·e^(−γ(t−u)) + Q·e^(−γu), |e^(−γt)| ≤ 1/e.
        let e = (-gt).exp();
        let det = 1.0 - e * e;
        let p = (a_t - e * a_b) / det;
        let q = (a_b - e * a_t) / det;
        let decay = -(-2.0 * al * t).exp_m1() / (2.0 * al);
        p.norm_sqr() * decay + q.norm_sqr() * decay + 2.0 * (p * q.conj() * e * osc).re
    };
    (integral, a_t)
}

/// Phase currents and the floating potential from phase voltages `v` through the
/// impedance matrix `z` of the m phases and the potential (last, with no voltage): a star
/// with its point floating (Σ I = 0, the star point's voltage an unknown) or a delta (each
/// phase on its line voltage). `None` when the system is singular.
fn solve(z: &[C], v: &[C], m: usize, star: bool) -> Option<Vec<C>> {
    let sets = m + 1;
    let n = if star { sets + 1 } else { sets };
    let w = n + 1;
    let mut a = vec![C::new(0.0, 0.0); n * w];
    for q in 0..sets {
        for p in 0..sets {
            a[q * w + p] = z[q * sets + p];
        }
        if q < m {
            if star {
                a[q * w + sets] = C::new(1.0, 0.0);
            }
            a[q * w + n] = v[q];
        }
    }
    if star {
        for p in 0..m {
            a[sets * w + p] = C::new(1.0, 0.0);
        }
    }
    // Gauss–Jordan elimination with partial pivoting.
    for col in 0..n {
        let piv =
            (col..n).max_by(|x, y| a[x * w + col].norm().total_cmp(&a[y * w + col].norm()))?;
        if a[piv * w + col].norm() == 0.0 {
            return None;
        }
        if piv != col {
            for c in 0..w {
                a.swap(piv * w + c, col * w + c);
            }
        }
        for r in 0..n {
            if r != col {
                let f = a[r * w + col] / a[col * w + col];
                for c in col..w {
                    let t = a[col * w + c];
                    a[r * w + c] -= f * t;
                }
            }
        }
    }
    Some((0..sets).map(|p| a[p * w + n] / a[p * w + p]).collect())
}

/// The field model over the slips of the circuit's table, with its largest thrust.
pub fn field_model(w: &Winding, feed: Feed, slips: &[f64]) -> Result<FieldModel, ThrustError> {
    if slips.is_empty() {
        return Err(ThrustError::NoSolution { slip: f64::NAN });
    }
    let sheet = Sheet::new(w, feed, slips)?;
    let rows = slips
        .iter()
        .map(|s| sheet.point(*s))
        .collect::<Result<Vec<FieldRow>, ThrustError>>()?;
    // The largest thrust: the table's best row, then golden-section refinement between its
    // neighbours (a point without a solution counts as no thrust there).
    let best = (0..rows.len())
        .max_by(|x, y| rows[*x].thrust_n.total_cmp(&rows[*y].thrust_n))
        .unwrap_or(0);
    let (n0, n1) = (
        slips[best.saturating_sub(1)],
        slips[(best + 1).min(rows.len() - 1)],
    );
    let at = |s: f64| sheet.point(s).map_or(f64::NEG_INFINITY, |r| r.thrust_n);
    let s_max = crate::thrust::golden_max(&at, n0, n1, 40);
    let (n, k_max, wanted_k, window, wanted) = sheet.grid();
    let (r1, x_leak) = sheet.r1_x_leak();
    let refined = at(s_max);
    let (max_thrust_n, max_thrust_slip) = if refined >= rows[best].thrust_n {
        (refined, s_max)
    } else {
        (rows[best].thrust_n, rows[best].slip)
    };
    Ok(FieldModel {
        max_thrust_n,
        max_thrust_slip,
        rows,
        standstill_thrust_ratio: None,
        max_thrust_ratio: None,
        standstill_impedance_ohm: sheet
            .impedance_at(1.0)
            .iter()
            .map(|r| r.iter().map(|x| [x.re, x.im]).collect())
            .collect(),
        r1_ohm: r1,
        x_leakage_ohm: x_leak,
        wavenumbers: n,
        k_max_per_m: k_max,
        window_m: window,
        window_wanted_m: wanted,
        k_max_wanted_per_m: wanted_k,
        double_sided: sheet.double_sided(),
    })
}
