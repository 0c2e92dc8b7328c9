//! Differential (harmonic) leakage of a winding, exactly, by Parseval's theorem on the MMF
//! staircase rather than by a truncated harmonic series.
//!
//! With slot currents I_k at mechanical angles x_k = 2πk/Z the air-gap MMF is a staircase
//! whose Fourier coefficients are F_n = Σ_k I_k·e^(−jn·x_k) / (2πjn). Parseval: the mean
//! square of the (zero-mean) staircase equals Σ_(n≠0) |F_n|². The working wave (n = ±p)
//! carries 2|F_p|², so σ_d = mean square / (2|F_p|²) − 1 = Σ_(ν≠1) (F_ν/F_1)². For a
//! balanced winding every order travels one way only, so the spatial mean square does not
//! depend on the instant and one instant (ωt = 0) is exact. The series form
//! σ_d = Σ (k_wν / (ν·k_w1))² is the one tabulated by Vogt (1996) and Pyrhönen et al.
//! (2014, §4.3, from memory); the closed result for q = 1, full pitch is π²/9 − 1.

/// The one rule for σ_d (Parseval): the mean square of the MMF over the working wave's
/// mean square, less one; `None` when there is no working wave to compare against. Every
/// σ_d the tool reports comes through here: from any phasor currents (`field`, whose
/// `differential_leakage` is the balanced σ_d every command reports), and for every span at once
/// from the belt currents' autocorrelation (`survey`).
pub fn sigma(mean_square: f64, working_square: f64) -> Option<f64> {
    (working_square > 1e-300 * mean_square.abs().max(1.0))
        .then(|| (mean_square / working_square - 1.0).max(0.0))
}

/// σ_d of a periodic staircase of real slot currents whose working wave has `order`
/// periods round the `currents.len()` slots, allocation-free (one pass for the staircase,
/// one recurrence for the working wave). For a balanced winding under balanced currents
/// every order travels one way, so one instant is exact and this equals the complex
/// sheet's value (`field::differential_leakage` uses it for synthesized rotary windings,
/// which are balanced by construction). `None` without a working wave.
pub fn staircase_leakage(currents: &[f64], order: u64) -> Option<f64> {
    use std::f64::consts::PI;
    let z = currents.len();
    if z == 0 || order == 0 {
        return None;
    }
    // Working-wave sum Σ I_k e^(−j·order·2πk/Z), the phasor advanced by exact reduction
    // every 64 slots so rounding cannot build up on large cores.
    let step = 2.0 * PI * (order % z as u64) as f64 / z as f64;
    let (ws, wc) = (-step).sin_cos();
    let (mut re, mut im) = (0.0, 0.0);
    let (mut cr, mut ci) = (1.0, 0.0);
    let (mut sum, mut sum_sq, mut s) = (0.0, 0.0, 0.0);
    for (k, &i) in currents.iter().enumerate() {
        if k % 64 == 0 {
            let a = -2.0 * PI * ((order as u128 * k as u128) % z as u128) as f64 / z as f64;
            (ci, cr) = a.sin_cos();
        }
        re += i * cr;
        im += i * ci;
        (cr, ci) = (cr * wc - ci * ws, cr * ws + ci * wc);
        s += i;
        sum += s;
        sum_sq += s * s;
    }
    let mean = sum / z as f64;
    let mean_square = sum_sq / z as f64 - mean * mean;
    let f = (re * re + im * im).sqrt() / (2.0 * PI * order as f64);
    sigma(mean_square, 2.0 * f * f)
}
