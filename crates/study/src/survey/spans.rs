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
//!   σ_d = mean square / (2·F_p²) − 1 (the rule of [`crate::leakage::sigma`]).
//!   Slot k lies on ray k·p mod Z of the star; each of the Z/t rays (t = gcd(Z, p)) holds t
//!   slots, so R(d) = t·A((d·p mod Z)/t) with A the rays' autocorrelation, which the belts'
//!   runs give from prefix sums in O(m) per lag.

use crate::winding::star::{belt, roots_of_unity};

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
    /// The inverse of p/t modulo the ray count: slot k·inverse lies on ray k.
    inverse: usize,
    /// Belt current of each ray, in angle order.
    ray: Vec<f64>,
    /// Prefix sums of `ray` over the doubled ring.
    prefix: Vec<f64>,
    /// cos(2πk/m) for the phases (the phase currents at ωt = 0).
    cos: Vec<f64>,
    /// Runs of equal belt current along the rays: (start, end, value).
    runs: Vec<(usize, usize, f64)>,
    /// Scores of the last combination, span 1 first.
    pub spans: Vec<SpanScore>,
}

/// Score spans 1..=`longest` of a feasible double-layer winding of Z slots, p pole pairs
/// and m phases into `s.spans`.
pub fn score(z: usize, p: usize, m: usize, longest: usize, s: &mut Scratch) {
    // Combinations come in slot order, so the roots table usually carries over.
    if s.roots.len() != z {
        roots_of_unity(z, &mut s.roots);
    }
    if s.cos.len() != m {
        s.cos = (0..m)
            .map(|k| (2.0 * std::f64::consts::PI * k as f64 / m as f64).cos())
            .collect();
    }
    // The rays of the star in angle order: ray j at angle index j·t, each the angle of t
    // slots. Every sum over slots is t times the sum over rays. Indices advance by integer
    // steps: no division or trigonometry per ray.
    let t = crate::winding::gcd(z as u64, p as u64) as usize;
    let l = z / t;
    let tf = t as f64;
    s.ray.clear();
    let (mut cre, mut cim) = (0.0, 0.0);
    // Belt b of angle index a: b·z ≤ 2m·a < (b + 1)·z. Phase 1's belts (+U is belt 0, −U
    // belt m) are runs of rays, kept for the distribution factors below.
    let (mut belt_no, mut twice) = (0usize, 0usize);
    let (mut plus, mut minus) = ((0usize, 0usize), (l, l));
    for j in 0..l {
        let a = j * t;
        while belt_no + 1 < 2 * m && twice >= (belt_no + 1) * z {
            belt_no += 1;
        }
        let (phase, positive) = belt(belt_no, m);
        let sign = if positive { 1.0 } else { -1.0 };
        let c = sign * s.cos[phase];
        s.ray.push(c);
        let (rc, rs) = s.roots[a];
        cre += c * rc;
        cim -= c * rs;
        if belt_no == 0 {
            plus.1 = j + 1;
        } else if belt_no == m {
            minus.0 = minus.0.min(j);
            minus.1 = j + 1;
        }
        twice += 2 * m * t;
    }
    // k_dν: phase 1's belt sum Σ_(+U) w^j − Σ_(−U) w^j over its rays, w = e^(−j2πνt/Z), each a
    // geometric series (w^(j0) − w^(j1))/(1 − w), or the ray count where w = 1.
    let roots = &s.roots;
    let power = |nu: usize, j: usize| {
        let (c, s) = roots[(nu * t % z) * j % z];
        (c, -s)
    };
    let series = |nu: usize, (j0, j1): (usize, usize)| -> (f64, f64) {
        if j1 <= j0 {
            return (0.0, 0.0);
        }
        if (nu * t).is_multiple_of(z) {
            return ((j1 - j0) as f64, 0.0);
        }
        let (a, b) = power(nu, j0);
        let (c, d) = power(nu, j1);
        let (w, v) = power(nu, 1);
        let (nr, ni) = (a - c, b - d);
        let (dr, di) = (1.0 - w, -v);
        let den = dr * dr + di * di;
        ((nr * dr + ni * di) / den, (ni * dr - nr * di) / den)
    };
    let kd = ORDERS.map(|nu| {
        let (pr, pi) = series(nu, plus);
        let (mr, mi) = series(nu, minus);
        ((pr - mr), (pi - mi))
    });
    let per_phase = (z / m) as f64;
    let kd: [f64; 5] = kd.map(|(re, im)| tf * (re * re + im * im).sqrt() / per_phase);
    let working_sum = tf * (cre * cre + cim * cim).sqrt();
    // Slot k lies on ray k·p/t (mod L); the sub-harmonic search needs the inverse step.
    s.inverse = inverse_mod((p % z) / t, l);

    // Autocorrelation R(d) = t·A((d·p mod Z)/t), A the rays' cyclic autocorrelation. The
    // belt currents are constant along each belt, so A(σ) = Σ_runs v·(P[end+σ] − P[start+σ])
    // with P the prefix sums over the doubled ring: O(m) per lag instead of O(Z).
    s.prefix.clear();
    let mut run = 0.0;
    s.prefix.push(run);
    for &c in s.ray.iter().chain(s.ray.iter()) {
        run += c;
        s.prefix.push(run);
    }
    s.runs.clear();
    let mut start = 0;
    for j in 1..=l {
        if j == l || s.ray[j] != s.ray[start] {
            s.runs.push((start, j, s.ray[start]));
            start = j;
        }
    }
    let autocorrelation = |sigma: usize| -> f64 {
        s.runs
            .iter()
            .map(|&(a, b, v)| v * (s.prefix[b + sigma] - s.prefix[a + sigma]))
            .sum::<f64>()
            * tf
    };
    let mean: f64 = s.ray.iter().sum::<f64>() / l as f64;
    let x = std::f64::consts::PI * p as f64 / z as f64;
    let mut rec = ORDERS.map(|nu| {
        let a = nu as f64 * x;
        (2.0 * a.cos(), 0.0, a.sin())
    });
    let mut spans = std::mem::take(&mut s.spans);
    spans.clear();
    let r0 = autocorrelation(0);
    let (mut q, mut prefix) = (0.0f64, 0.0f64);
    let mut lag = 0usize; // (d·p mod Z)/t for d = y − 1
    let lag_step = (p % z) / t;
    for y in 1..=longest {
        if y > 1 {
            lag += lag_step;
            if lag >= l {
                lag -= l;
            }
            prefix += autocorrelation(lag);
        }
        // Σ_k W_y² = Σ_k W_(y−1)² + R(0) + 2·Σ_(d=1..y−1) R(d).
        q += r0 + 2.0 * prefix;
        let ms = q / z as f64 - (y as f64 * mean).powi(2);
        let pf = |i: usize| rec[i].2.abs();
        let kw1 = kd[0] * pf(0);
        let content = if kw1 > 0.0 {
            let inv = 1.0 / kw1;
            (1..5).map(|i| (kd[i] * pf(i) * inv).powi(2)).sum()
        } else {
            f64::INFINITY
        };
        let f = working_sum * pf(0) / (std::f64::consts::PI * p as f64);
        let sigma_d = crate::leakage::sigma(ms, 2.0 * f * f);
        spans.push(SpanScore {
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
    s.spans = spans;
}

/// MMF amplitude (up to a constant) of mechanical order n for double-layer coils of span y
/// over the belt currents of the last [`score`]: |Ĉ_n|·2|sin(πny/Z)|/n, with no sum over
/// slots. The slot currents repeat every L = Z/t slots, so Ĉ_n vanishes unless t divides n,
/// and then Ĉ_n = t·Σ_r ray_r·ω^(f·r), ω = e^(−j2π/L), f = (n/t)·q mod L with q the inverse
/// of p/t modulo L (slot k lies on ray k·p/t). The rays are constant along each belt's run,
/// so the sum is one geometric series per run: O(m) per order instead of O(Z).
pub fn order_amplitude(s: &Scratch, n: usize, y: usize) -> f64 {
    let (z, l) = (s.roots.len(), s.ray.len());
    if z == 0 || l == 0 || n == 0 || !z.is_multiple_of(l) {
        return 0.0;
    }
    let t = z / l;
    if !n.is_multiple_of(t) {
        return 0.0;
    }
    let f = ((n / t) % l) * s.inverse % l;
    // ω^x = e^(−j2πx/L) = e^(−j2π·x·t/Z): the roots table at x·t, conjugated.
    let omega = |x: usize| {
        let (c, sn) = s.roots[(x % l) * t % z];
        (c, -sn)
    };
    let (mut re, mut im) = (0.0, 0.0);
    if f == 0 {
        for &(a, b, v) in &s.runs {
            re += v * (b - a) as f64;
        }
    } else {
        let (w, u) = omega(f);
        let (dr, di) = (1.0 - w, -u);
        let den = dr * dr + di * di;
        for &(a, b, v) in &s.runs {
            let (ar, ai) = omega(f * a);
            let (br, bi) = omega(f * b);
            let (nr, ni) = (ar - br, ai - bi);
            re += v * (nr * dr + ni * di) / den;
            im += v * (ni * dr - nr * di) / den;
        }
    }
    let amplitude = t as f64 * (re * re + im * im).sqrt() / n as f64;
    let chord = (std::f64::consts::PI * ((n * y) % (2 * z)) as f64 / z as f64)
        .sin()
        .abs();
    amplitude * 2.0 * chord
}

/// The inverse of `a` modulo `m` (a and m coprime; 0 when m ≤ 1).
fn inverse_mod(a: usize, m: usize) -> usize {
    if m <= 1 {
        return 0;
    }
    let (mut r0, mut r1) = (m as i64, (a % m) as i64);
    let (mut t0, mut t1) = (0i64, 1i64);
    while r1 != 0 {
        let q = r0 / r1;
        (r0, r1) = (r1, r0 - q * r1);
        (t0, t1) = (t1, t0 - q * t1);
    }
    t0.rem_euclid(m as i64) as usize
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::winding::star::{belt_of_index, order_amplitude as slot_sum_amplitude};

    /// The run-by-run geometric series gives the same amplitude as the plain sum over the
    /// slots' belt currents, at every order below the working wave, on integral and
    /// fractional-slot cores (two derivations of one DFT).
    #[test]
    fn run_series_equals_the_sum_over_slots() {
        let mut s = Scratch::default();
        for (z, p) in [
            (36, 2),
            (45, 4),
            (54, 8),
            (27, 4),
            (51, 10),
            (48, 20),
            (360, 48),
        ] {
            let m = 3;
            if !crate::winding::double_layer_rotary_feasible(z, 2 * p, m) {
                continue;
            }
            let y = (z / (2 * p)).max(1);
            score(z, p, m, y, &mut s);
            // Slot currents directly from the belt rule, slot by slot.
            let currents: Vec<f64> = (0..z)
                .map(|k| {
                    let a = (k * p) % z;
                    let (phase, positive) = belt_of_index(a as u64, z as u64, m);
                    let c = (2.0 * std::f64::consts::PI * phase as f64 / m as f64).cos();
                    if positive { c } else { -c }
                })
                .collect();
            let mut roots = Vec::new();
            roots_of_unity(z, &mut roots);
            for n in 1..=p {
                let chord = (std::f64::consts::PI * ((n * y) % (2 * z)) as f64 / z as f64)
                    .sin()
                    .abs();
                let direct = slot_sum_amplitude(&currents, &roots, n) * 2.0 * chord;
                let series = order_amplitude(&s, n, y);
                assert!(
                    (direct - series).abs() < 1e-9 * direct.max(1.0),
                    "Z={z} p={p} n={n}: {direct} vs {series}"
                );
            }
        }
    }
}
