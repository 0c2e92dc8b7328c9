//! Speeds, lengths and forces from the core sizes and the supply.
//!
//! Linear primary: pole pitch τ, synchronous speed v_s = 2·f·τ, speed v = (1 − s)·v_s and
//! thrust F = P_airgap / v_s (S. A. Nasar, I. Boldea, *Linear Electric Motors*, 1987, ch. 2;
//! I. Boldea, *Linear Electric Machines, Drives and MAGLEVs Handbook*, 2013, ch. 1). Rotary
//! core: n_s = 120·f / 2p rpm and torque T = P_airgap / ω_s (Say 1983, ch. 7).

use crate::units::Length;
use serde::Serialize;
use std::f64::consts::PI;

use crate::winding::{Topology, Winding};

/// Operating point supplied on the command line.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Operating {
    /// Slip s of the secondary (0 = synchronous, 1 = standstill).
    pub slip: Option<f64>,
    /// Air-gap power in watts.
    pub airgap_power_w: Option<f64>,
}

/// Figures the core sizes and supply allow; absent ones are `None`.
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Figures {
    /// Pole pitch τ in metres.
    pub pole_pitch_m: Option<f64>,
    /// Synchronous speed of the travelling field, m/s (rotary: at the bore).
    pub synchronous_speed_m_s: Option<f64>,
    /// Synchronous speed, rpm (rotary only).
    pub synchronous_speed_rpm: Option<f64>,
    /// Slip used for the speed figures.
    pub slip: Option<f64>,
    /// Secondary speed (1 − s)·v_s, m/s.
    pub speed_m_s: Option<f64>,
    /// Rotor speed (1 − s)·n_s, rpm (rotary only).
    pub speed_rpm: Option<f64>,
    /// Thrust P_airgap / v_s, newtons (linear only).
    pub thrust_n: Option<f64>,
    /// Torque P_airgap / ω_s, newton-metres (rotary only).
    pub torque_nm: Option<f64>,
    /// Active length 2p·τ of a linear primary, metres.
    pub active_length_m: Option<f64>,
    /// Total length Z·slot pitch of a linear primary, metres.
    pub total_length_m: Option<f64>,
}

/// Compute every figure the winding's sizes and supply and the operating point allow.
pub fn figures(w: &Winding, op: Operating) -> Figures {
    let g = &w.geometry;
    let f = w.design.supply.frequency_hz;
    let tau = w.pole_pitch().map(Length::m);
    let vs = tau.zip(f).map(|(t, f)| 2.0 * f * t);
    let linear = g.topology == Topology::Linear;
    let ns = f.filter(|_| !linear).map(|f| 120.0 * f / g.poles as f64);
    let speed = |v: Option<f64>| v.zip(op.slip).map(|(v, s)| (1.0 - s) * v);
    Figures {
        pole_pitch_m: tau,
        synchronous_speed_m_s: vs,
        synchronous_speed_rpm: ns,
        slip: op.slip,
        speed_m_s: speed(vs),
        speed_rpm: speed(ns),
        thrust_n: vs
            .filter(|_| linear)
            .zip(op.airgap_power_w)
            .map(|(v, p)| p / v),
        torque_nm: ns
            .zip(op.airgap_power_w)
            .map(|(n, p)| p / (2.0 * PI * n / 60.0)),
        active_length_m: tau.filter(|_| linear).map(|t| t * g.poles as f64),
        total_length_m: w
            .slot_pitch()
            .map(Length::m)
            .filter(|_| linear)
            .map(|s| s * g.slots as f64),
    }
}
