//! A capacitor motor as an unsymmetrical two-phase machine, by the double revolving field
//! (symmetrical components of the two windings' currents referred to the main's turns):
//! Veinott, *Theory and Design of Small Induction Motors* (1959), and Fitzgerald, Kingsley
//! and Umans, *Electric Machinery*, 6th ed., §9.3–9.4 (from memory).
//!
//! With the auxiliary current referred to the main, I_a' = a·I_a (a the effective turns
//! ratio), the forward and backward currents are I_f = (I_m − j·I_a')/2 and
//! I_b = (I_m + j·I_a')/2; the gap EMFs are E_m = I_f·Z_f + I_b·Z_b and
//! E_a = j·a·(I_f·Z_f − I_b·Z_b), with Z_f = jX_m ∥ (R_2/s + jX_2) and Z_b the same at
//! slip 2 − s. The field is balanced (circular) when I_b = 0, the auxiliary's
//! ampere-turns leading the main's by 90°. Core loss, friction and windage are left out.

use crate::units::Capacitance;
use num_complex::Complex64;
use std::f64::consts::PI;

/// The motor as the solver sees it: supply, the windings' own impedances and the rotor
/// circuit referred to the main winding.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Motor {
    /// Supply voltage, V.
    pub volts: f64,
    /// Supply frequency, Hz.
    pub hz: f64,
    /// Pole pairs p.
    pub pole_pairs: f64,
    /// Main winding's resistance and leakage reactance, ohms.
    pub main: Complex64,
    /// Auxiliary winding's resistance and leakage reactance, ohms.
    pub aux: Complex64,
    /// Effective turns ratio a = N_a·k_wa / (N_m·k_wm).
    pub ratio: f64,
    /// Magnetizing reactance X_m, ohms.
    pub xm: f64,
    /// Rotor resistance R_2', ohms.
    pub r2: f64,
    /// Rotor leakage reactance X_2', ohms.
    pub x2: f64,
}

/// The motor's state at one slip with one impedance in series with the auxiliary.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct State {
    /// Main winding current phasor, A.
    pub main: Complex64,
    /// Auxiliary winding current phasor, A.
    pub aux: Complex64,
    /// Forward current (referred to the main), A.
    pub forward: Complex64,
    /// Backward current, A.
    pub backward: Complex64,
    /// Shaft torque from the gap powers, N·m (core and friction losses left out).
    pub torque_nm: f64,
    /// Power taken from the supply, W.
    pub input_w: f64,
    /// Voltage across the series impedance (the capacitor), V.
    pub capacitor_v: f64,
}

impl Motor {
    /// Rotor branch in parallel with the magnetizing reactance at slip `s`.
    fn gap(&self, s: f64) -> Complex64 {
        let s = if s.abs() < 1e-9 { 1e-9 } else { s };
        let rotor = Complex64::new(self.r2 / s, self.x2);
        let m = Complex64::new(0.0, self.xm);
        m * rotor / (m + rotor)
    }

    /// Forward and backward gap impedances Z_f, Z_b at slip `s`.
    pub fn gaps(&self, s: f64) -> (Complex64, Complex64) {
        (self.gap(s), self.gap(2.0 - s))
    }

    /// Mechanical synchronous speed, rad/s.
    pub fn synchronous_rad_s(&self) -> f64 {
        2.0 * PI * self.hz / self.pole_pairs
    }

    /// Reactance of a capacitor of `uf` microfarads at the supply frequency, ohms.
    pub fn capacitor_ohm(&self, uf: f64) -> f64 {
        1.0 / (2.0 * PI * self.hz * Capacitance::from_uf(uf).f())
    }

    /// Capacitance with reactance `x` ohms at the supply frequency, µF.
    pub fn microfarads(&self, x: f64) -> f64 {
        Capacitance::from_f(1.0 / (2.0 * PI * self.hz * x)).uf()
    }

    /// The state at slip `s` with `series` in the auxiliary's branch (`None`: the
    /// auxiliary open, the main alone). Main: V = I_m·A11 + I_a·A12; auxiliary:
    /// V = I_m·A21 + I_a·A22 (module doc), solved by Cramer's rule.
    pub fn state(&self, s: f64, series: Option<Complex64>) -> State {
        let (zf, zb) = self.gaps(s);
        let j = Complex64::i();
        let a = self.ratio;
        let v = Complex64::new(self.volts, 0.0);
        let a11 = self.main + (zf + zb) / 2.0;
        let (im, ia) = match series {
            None => (v / a11, Complex64::new(0.0, 0.0)),
            Some(zc) => {
                let a12 = j * a * (zb - zf) / 2.0;
                let a21 = j * a * (zf - zb) / 2.0;
                let a22 = self.aux + zc + a * a * (zf + zb) / 2.0;
                let det = a11 * a22 - a12 * a21;
                ((v * a22 - a12 * v) / det, (a11 * v - a21 * v) / det)
            }
        };
        let referred = ia * a;
        let forward = (im - j * referred) / 2.0;
        let backward = (im + j * referred) / 2.0;
        let gap_w = 2.0 * (forward.norm_sqr() * zf.re - backward.norm_sqr() * zb.re);
        State {
            main: im,
            aux: ia,
            forward,
            backward,
            torque_nm: gap_w / self.synchronous_rad_s(),
            input_w: (v * (im + ia).conj()).re,
            capacitor_v: series.map_or(0.0, |z| (ia * z).norm()),
        }
    }

    /// The state with a capacitor of `uf` µF in the auxiliary's branch.
    pub fn with_capacitor(&self, s: f64, uf: f64) -> State {
        self.state(s, Some(Complex64::new(0.0, -self.capacitor_ohm(uf))))
    }

    /// The capacitor that leaves the least backward field at slip `s`, µF: a scan over
    /// 0.1 µF to 1 mF in equal ratios, then golden-section search between the best point's
    /// neighbours.
    pub fn least_backward_uf(&self, s: f64) -> f64 {
        let ratio = |uf: f64| {
            let st = self.with_capacitor(s, uf);
            st.backward.norm() / st.forward.norm().max(f64::MIN_POSITIVE)
        };
        let (lo, hi, n) = (0.1f64.ln(), 1000.0f64.ln(), 400);
        let at = |k: usize| (lo + (hi - lo) * k as f64 / n as f64).exp();
        let best = (0..=n)
            .min_by(|&x, &y| ratio(at(x)).total_cmp(&ratio(at(y))))
            .unwrap_or(0);
        let (mut a, mut b) = (at(best.saturating_sub(1)), at((best + 1).min(n)));
        let g = (5f64.sqrt() - 1.0) / 2.0;
        for _ in 0..100 {
            let c = b - g * (b - a);
            let d = a + g * (b - a);
            if ratio(c) < ratio(d) {
                b = d;
            } else {
                a = c;
            }
        }
        (a + b) / 2.0
    }

    /// The capacitor that puts the auxiliary current 90° ahead of the main's at standstill,
    /// µF: at s = 1 the windings do not couple (Z_f = Z_b), so X_C = X_a + R_a·cot φ_m
    /// with Z_a = R_a + jX_a the auxiliary branch's own impedance and φ_m the main's
    /// angle (Fitzgerald et al., *Electric Machinery*, 6th ed., Example 9.1, from memory).
    /// `None` when no positive reactance does it.
    pub fn quadrature_at_start_uf(&self) -> Option<f64> {
        let (zf, _) = self.gaps(1.0);
        let zm = self.main + zf;
        let za = self.aux + zf * self.ratio * self.ratio;
        let xc = za.im + za.re * (zm.re / zm.im);
        (xc.is_finite() && xc > 0.0).then(|| self.microfarads(xc))
    }

    /// The turns ratio and capacitor that balance the field exactly at slip `s` when the
    /// auxiliary is the main's copper scaled by a² (Z_1a = a²·Z_1m): a = tan φ and
    /// X_C = a·|Z|/cos φ, the capacitor then at V/cos φ, with Z = R + jX the main's
    /// impedance in the balanced state (Veinott 1959, from memory; follows from the
    /// module's equations with I_b = 0).
    pub fn balancing_design(&self, s: f64) -> (f64, f64, f64) {
        let (zf, _) = self.gaps(s);
        let z = self.main + zf;
        let a = z.im / z.re;
        let cos = z.re / z.norm();
        let xc = a * z.norm() / cos;
        (a, self.microfarads(xc), self.volts / cos)
    }
}
