//! Choosing the plate, clearance and current of a flat primary: the comparison reads the
//! field model of `thrust`, combines every value asked, and refuses what it cannot do.

mod common;

use beltwright::layout;
use beltwright::plates::{MAX_CHOICES, Metal, PlateQuery, PlatesError, plates};
use beltwright::thrust::{ThrustQuery, thrust};
use beltwright::units::Length;
use beltwright::winding::{self, Winding};

fn shuttle() -> Winding {
    let text = std::fs::read_to_string("layouts/pallet-shuttle.toml").expect("example");
    let spec = layout::parse(&text, "pallet-shuttle.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{e}"))
}

// One fact: with nothing varied, the one choice is the layout's own plate, and its
// standstill thrust, heat and peak are the thrust report's field model (the same model on
// the same grid: standstill to 1e-9; the peak found by two searches over different slip
// tables: to 1e-6).
#[test]
fn the_layouts_own_plate_is_the_thrust_reports_field_model() {
    let w = shuttle();
    let r = plates(&w, &PlateQuery::default()).expect("plates");
    assert_eq!(r.choices.len(), 1);
    let c = &r.choices[0];
    let t = thrust(
        &w,
        &ThrustQuery {
            current_a: None,
            slip_from: 0.0,
            slip_to: 1.0,
            steps: 20,
            end_effect: true,
        },
    )
    .expect("thrust");
    let still = t.field_model.rows.last().expect("rows");
    assert_eq!(still.slip, 1.0);
    assert!((c.standstill_thrust_n / still.thrust_n - 1.0).abs() < 1e-9);
    assert!((c.standstill_heat_w / still.secondary_loss_w - 1.0).abs() < 1e-9);
    assert!((c.peak_thrust_n / t.field_model.max_thrust_n - 1.0).abs() < 1e-6);
    let v = (1.0 - t.field_model.max_thrust_slip) * t.synchronous_speed_m_s;
    assert!((c.peak_speed_m_s - v).abs() < 1e-3 * t.synchronous_speed_m_s);
}

// Every combination, in the order asked; a copper plate of the same thickness conducts
// 58/35.4 times better (IEC 60028 against IEC 60889), the conductivity reported is that.
#[test]
fn every_combination_is_compared_in_order() {
    let w = shuttle();
    let q = PlateQuery {
        thickness: vec![Length::from_mm(3.0), Length::from_mm(5.0)],
        metal: vec![Metal::Aluminium, Metal::Copper],
        clearance: vec![Length::from_mm(2.0), Length::from_mm(4.0)],
        current_a: vec![10.0],
    };
    let r = plates(&w, &q).expect("plates");
    assert_eq!(r.choices.len(), 8);
    let order: Vec<(f64, f64)> = r
        .choices
        .iter()
        .map(|c| (c.thickness.mm(), c.clearance.mm()))
        .collect();
    assert_eq!(
        order,
        [
            (3.0, 2.0),
            (3.0, 4.0),
            (3.0, 2.0),
            (3.0, 4.0),
            (5.0, 2.0),
            (5.0, 4.0),
            (5.0, 2.0),
            (5.0, 4.0)
        ]
    );
    let ratio = r.choices[2].conductivity.s_m() / r.choices[0].conductivity.s_m();
    assert!((ratio - 58.0 / 35.381).abs() < 1e-3, "{ratio}");
    // A wider clearance lowers the standstill thrust at the same current (less field).
    assert!(r.choices[1].standstill_thrust_n < r.choices[0].standstill_thrust_n);
}

#[test]
fn too_many_combinations_are_refused() {
    let w = shuttle();
    let q = PlateQuery {
        thickness: (1..=15).map(|t| Length::from_mm(t.into())).collect(),
        clearance: (1..=15).map(|g| Length::from_mm(g.into())).collect(),
        ..PlateQuery::default()
    };
    assert_eq!(plates(&w, &q), Err(PlatesError::TooMany(225)));
    const { assert!(225 > MAX_CHOICES) };
}

// At the edge: a bad metal or chart name exits 2 naming the option; a chart is written.
#[test]
fn the_command_refuses_bad_input_and_draws_its_chart() {
    let out = common::run(&["plates", "layouts/pallet-shuttle.toml", "--metal", "brass"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("--metal"));
    let dir = tempfile::tempdir().expect("temp dir");
    let bad = dir.path().join("plates.txt");
    let out = common::run(&[
        "plates",
        "layouts/pallet-shuttle.toml",
        "--chart",
        bad.to_str().expect("path"),
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("--chart"));
    assert!(!bad.exists());
    let svg = dir.path().join("plates.svg");
    let out = common::run(&[
        "plates",
        "layouts/pallet-shuttle.toml",
        "--thickness-mm",
        "3,5",
        "--chart",
        svg.to_str().expect("path"),
    ]);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let text = std::fs::read_to_string(&svg).expect("chart written");
    assert!(text.contains("Thrust against speed for each choice") && text.contains("CAUTION"));
}
