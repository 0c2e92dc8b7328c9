//! Winding factors against published values. Each check names its source.

use beltwright::factors::{closed, factor_table, factors_at};
use beltwright::layout::parse;
use beltwright::winding::{Elec, Winding, build};

fn winding(
    topology: &str,
    slots: usize,
    poles: usize,
    layers: usize,
    pitch: Option<usize>,
) -> Winding {
    let pitch = pitch.map(|y| format!("pitch = {y}\n")).unwrap_or_default();
    let src = format!(
        "[machine]\ntopology = \"{topology}\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = {layers}\n{pitch}"
    );
    let spec = parse(&src, "test.toml").expect("valid layout");
    build(&spec).expect("feasible winding")
}

/// Published factors are given to three decimals; they hold to half a unit in the last place.
fn close3(got: f64, published: f64) {
    assert!(
        (got - published).abs() <= 5e-4,
        "got {got:.5}, published {published}"
    );
}

#[test]
fn thirty_six_slots_four_poles_span_seven_ninths() {
    // Closed-form distribution and pitch factors, q = 3, α = 20°, y/τ = 7/9:
    // k_d1 = sin(30°)/(3·sin 10°) = 0.960, k_p1 = sin(70°) = 0.940, k_w1 = 0.902
    // (M. G. Say, Alternating Current Machines, 5th ed., 1983, §4.4; Pyrhönen et al.,
    // Design of Rotating Electrical Machines, 2nd ed., 2014, eqs. 2.29 and 2.32).
    let w = winding("rotary", 36, 4, 2, Some(7));
    let f = factors_at(&w, 0, Elec(1.0));
    close3(f.distribution, 0.960);
    close3(f.pitch, 0.940);
    close3(f.winding, 0.902);
    // The phasor sums reproduce the closed forms to rounding.
    let alpha = 20f64.to_radians();
    assert!((f.distribution - closed::distribution(3, 1.0, alpha)).abs() < 1e-12);
    assert!((f.pitch - closed::pitch(7.0 / 9.0, 1.0)).abs() < 1e-12);
}

#[test]
fn twenty_four_slots_four_poles_span_five_sixths() {
    // 5/6 chording on q = 2: k_w1 = 0.933, k_w5 = k_w7 = 0.067 (Say 1983, §4.4 tables;
    // closed forms k_d5 = sin 150°/(2 sin 75°), k_p5 = sin(5·75°)).
    let w = winding("rotary", 24, 4, 2, Some(5));
    close3(factors_at(&w, 0, Elec(1.0)).winding, 0.933);
    close3(factors_at(&w, 0, Elec(5.0)).winding, 0.067);
    close3(factors_at(&w, 0, Elec(7.0)).winding, 0.067);
}

#[test]
fn tooth_coil_combinations_match_published_tables() {
    // Fractional-slot concentrated windings, fundamental winding factors as tabulated by
    // J. Cros and P. Viarouge, "Synthesis of high performance PM motors with concentrated
    // windings", IEEE Trans. Energy Conversion 17(2), 2002, table of k_w1 (values from
    // memory of that table; they agree with F. Meier, KTH 2008, and with the closed forms).
    close3(
        factors_at(&winding("rotary", 12, 10, 2, None), 0, Elec(1.0)).winding,
        0.933,
    );
    close3(
        factors_at(&winding("rotary", 12, 10, 1, None), 0, Elec(1.0)).winding,
        0.966,
    );
    close3(
        factors_at(&winding("rotary", 9, 8, 2, None), 0, Elec(1.0)).winding,
        0.945,
    );
    close3(
        factors_at(&winding("rotary", 12, 14, 2, None), 0, Elec(1.0)).winding,
        0.933,
    );
}

#[test]
fn nine_slot_eight_pole_has_the_published_sub_harmonics() {
    // 9/8: p = 4, t = 1, so mechanical orders n = 1, 2, … all exist as ν = n/4, and the
    // working wave n = 4 has k_w = sin(80°)·(1 + 2 cos 20°)/3 = 0.945 (closed form for
    // q = 3/8 tooth coils, Cros & Viarouge 2002).
    let w = winding("rotary", 9, 8, 2, None);
    let t = factor_table(&w, 2.0);
    let orders: Vec<f64> = t.rows.iter().map(|r| r.order.get()).collect();
    assert!(
        orders.contains(&0.25),
        "sub-harmonic ν = 1/4 listed: {orders:?}"
    );
    let kw1 = (80f64.to_radians().sin()) * (1.0 + 2.0 * 20f64.to_radians().cos()) / 3.0;
    let fund = t
        .rows
        .iter()
        .find(|r| r.order == Elec::FUNDAMENTAL)
        .map(|r| r.winding);
    assert!((fund.unwrap_or(0.0) - kw1).abs() < 1e-12);
}

#[test]
fn skew_of_one_slot_pitch_matches_closed_form() {
    // Skew factor k_s = sin(νσ/2)/(νσ/2) (Pyrhönen et al. 2014, eq. 2.34); 36 slots, 4
    // poles, one slot pitch of skew: σ = 20° electrical, k_s1 = 0.99493.
    let src = "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
               [winding]\nlayers = 2\npitch = 9\nskew = 1.0\n";
    let w = build(&parse(src, "t").expect("valid")).expect("feasible");
    let f = factors_at(&w, 0, Elec(1.0));
    let sigma = 20f64.to_radians();
    assert!((f.skew - (sigma / 2.0).sin() / (sigma / 2.0)).abs() < 1e-12);
    assert!((f.skew - 0.99493).abs() < 5e-6);
    // Slot harmonics 2mq ± 1 = 17, 19 are strongly reduced by one slot pitch of skew.
    assert!(factors_at(&w, 0, Elec(17.0)).skew < 0.06);
}

#[test]
fn linear_primary_has_the_rotary_factors_of_its_belts() {
    // An open primary of whole q has the same belt and chord factors as the closed core of
    // the same q and span: 24 coils, q = 2, span 5 gives k_w1 = 0.933 (Say 1983, §4.4).
    let w = winding("linear", 29, 4, 2, Some(5));
    close3(factors_at(&w, 0, Elec(1.0)).winding, 0.933);
}
