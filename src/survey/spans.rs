//! The double-layer rotary kernel: every span of one slot/pole combination scored from the
//! star of slots, with no `Winding` built, no allocation once the scratch space has grown
//! and no trigonometry per slot.
//!
//! - Belt currents c_k = ±cos(2πφ/m) of the 60° belts (φ the belt's phase, at ωt = 0).
//! - Distribution factors k_dν from phase 1's belt sum with a table of the Z roots of unity
//!   stepped by integer index; pitch factors |sin(ν·y·x)|, x = πp/Z, by the Chebyshev
//!   recurrence sin((y+1)x) = 2cos x·sin(yx) − sin((y−1)x).
//! - σ_d for every span y at once: double-layer coils of span y make slot currents
//!   c_k − c_(k−y), whose MMF staircase is the cyclic window sum W_y(k) = Σ_(j=k−y+1..k) c_j.
//!   Its mean square follows from the autocorrelation R(d) = Σ_k c_k·c_(k+d):
//!   Σ_k W_y² = Σ_k W_(y−1)² + R(0) + 2·Σ_(d=1..y−1) R(d). The working wave is
//!   |Ĉ_p|·2|sin(πpy/Z)|/(2πp) with Ĉ_p = Σ c_k e^(−j2πpk/Z), and Parseval gives
//!   σ_d = mean square / (2·F_p²) − 1 (as in [`crate::leakage::staircase_leakage`]).
//!   c repeats every Z/t slots (t = gcd(Z, p)), so R is summed over one period.

use crate::winding::star::{belt_of_index, roots_of_unity};

/// The fundamental and the orders whose content the span objective weighs (as `pitch`
/// recommends).
const ORDERS: [usize; 5] = [1, 5, 7, 11, 13];

/// One span's figures.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct SpanScore {
    /// Span y in slot pitches.
    pub span: usize,
    /// Fundamental winding factor.
    pub kw1: f64,
    /// Winding factor of order 5.
    pub kw5: f64,
    /// Winding factor of order 7.
    pub kw7: f64,
    /// Σ (k_wν/k_w1)² over orders 5, 7, 11 and 13 (infinite when k_w1 = 0).
    pub content: f64,
    /// Differential leakage σ_d, exact (`None` without a working wave).
    pub sigma_d: Option<f64>,
}

/// Scratch space reused from one combination to the next.
#[derive(Debug, Default)]
pub struct Scratch {
    roots: Vec<(f64, f64)>,
    belt: Vec<f64>,
    /// Scores of the last combination, span 1 first.
    pub spans: Vec<SpanScore>,
}

/// Score spans 1..=`longest` of a feasible double-layer winding of Z slots, p pole pairs
/// and m phases into `s.spans`.
pub fn score(z: usize, p: usize, m: usize, longest: usize, s: &mut Scratch) {
    roots_of_unity(z, &mut s.roots);
    let cos: Vec<f64> = (0..m)
        .map(|k| (2.0 * std::f64::consts::PI * k as f64 / m as f64).cos())
        .collect();
    s.belt.clear();
    let step = p % z;
    let mut a = 0usize;
    let orders = ORDERS;
    let mut kd = [(0.0f64, 0.0f64); 5];
    let (mut cre, mut cim) = (0.0, 0.0);
    for _ in 0..z {
        let (phase, positive) = belt_of_index(a as u64, z as u64, m);
        let sign = if positive { 1.0 } else { -1.0 };
        let c = sign * cos[phase];
        s.belt.push(c);
        let (rc, rs) = s.roots[a];
        cre += c * rc;
        cim -= c * rs;
        if phase == 0 {
            for (acc, nu) in kd.iter_mut().zip(orders) {
                let (rc, rs) = s.roots[(nu * a) % z];
                acc.0 += sign * rc;
                acc.1 -= sign * rs;
            }
        }
        a += step;
        if a >= z {
            a -= z;
        }
    }
    let per_phase = (z / m) as f64;
    let kd: [f64; 5] = kd.map(|(re, im)| (re * re + im * im).sqrt() / per_phase);
    let working_sum = (cre * cre + cim * cim).sqrt();

    // Autocorrelation over one period of the belt pattern.
    let t = crate::winding::gcd(z as u64, p as u64) as usize;
    let period = z / t;
    let mean: f64 = s.belt.iter().sum::<f64>() / z as f64;
    let x = std::f64::consts::PI * p as f64 / z as f64;
    let mut rec = orders.map(|nu| {
        let a = nu as f64 * x;
        (2.0 * a.cos(), 0.0, a.sin())
    });
    s.spans.clear();
    let (mut q, mut prefix) = (0.0f64, 0.0f64);
    let mut r0 = 0.0;
    for y in 1..=longest {
        let d = y - 1;
        let belt = &s.belt[..period];
        let shift = d % period;
        let mut acc = 0.0;
        for (k, &ck) in belt.iter().enumerate() {
            let j = k + shift;
            acc += ck * belt[if j >= period { j - period } else { j }];
        }
        let r = acc * t as f64;
        if d == 0 {
            r0 = r;
        } else {
            prefix += r;
        }
        q += r0 + 2.0 * if d == 0 { 0.0 } else { prefix };
        let ms = q / z as f64 - (y as f64 * mean).powi(2);
        let pf = |i: usize| rec[i].2.abs();
        let kw1 = kd[0] * pf(0);
        let content = if kw1 > 0.0 {
            (1..5).map(|i| (kd[i] * pf(i) / kw1).powi(2)).sum()
        } else {
            f64::INFINITY
        };
        let f = working_sum * pf(0) / (std::f64::consts::PI * p as f64);
        let working = 2.0 * f * f;
        let sigma_d = (working > 1e-300 * ms.abs().max(1.0)).then(|| (ms / working - 1.0).max(0.0));
        s.spans.push(SpanScore {
            span: y,
            kw1,
            kw5: kd[1] * pf(1),
            kw7: kd[2] * pf(2),
            content,
            sigma_d,
        });
        for r in &mut rec {
            (r.1, r.2) = (r.2, r.0 * r.2 - r.1);
        }
    }
}

/// MMF amplitude (up to a constant) of mechanical order n for double-layer coils of span y
/// over the belt currents of the last [`score`]: |Ĉ_n|·2|sin(πny/Z)|/n.
pub fn order_amplitude(s: &Scratch, n: usize, y: usize) -> f64 {
    let z = s.belt.len();
    if z == 0 || n == 0 {
        return 0.0;
    }
    let (mut re, mut im) = (0.0, 0.0);
    let step = n % z;
    let mut a = 0usize;
    for &c in &s.belt {
        let (rc, rs) = s.roots[a];
        re += c * rc;
        im -= c * rs;
        a += step;
        if a >= z {
            a -= z;
        }
    }
    let chord = (std::f64::consts::PI * ((n * y) % (2 * z)) as f64 / z as f64)
        .sin()
        .abs();
    (re * re + im * im).sqrt() * 2.0 * chord / n as f64
}
