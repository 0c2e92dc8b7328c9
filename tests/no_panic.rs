//! Whatever a user asks for, the planner answers or refuses; it never panics, and what it
//! answers is balanced and survives every analysis.

use beltwright::design::{Design, Style, Topology};
use beltwright::layout::{Spec, parse};
use beltwright::linear::Operating;
use beltwright::winding::build;
use beltwright::{factors, field, pitch, plan};
use proptest::prelude::*;

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    #[test]
    fn any_request_is_planned_or_refused(
        linear in any::<bool>(),
        slots in 3usize..=120,
        poles in 1usize..=40,
        layers in 1usize..=2,
        pitch in proptest::option::of(1usize..=60),
        concentric in any::<bool>(),
        paths in 1usize..=6,
    ) {
        let topology = if linear { Topology::Linear } else { Topology::Rotary };
        prop_assume!(linear || poles % 2 == 0);
        prop_assume!(pitch.is_none_or(|y| y < slots));
        prop_assume!(!concentric || layers == 1);
        let spec = Spec::of(Design {
            pitch,
            style: if concentric { Style::Concentric } else { Style::Lap },
            parallel_paths: paths,
            turns_per_coil: 7,
            ..Design::basic(topology, slots, poles, layers)
        });
        match build(&spec) {
            Err(e) => prop_assert!(!e.to_string().is_empty()),
            Ok(w) => {
                prop_assert!(w.is_balanced());
                let p = plan::plan(&w, Operating::default());
                prop_assert!(p.winding_factor <= 1.0 + 1e-12);
                let _ = factors::factor_table(&w, 13.0);
                let _ = field::differential_leakage(&w);
                let _ = field::field(&w, &field::FieldOptions::balanced(&w));
                let _ = pitch::compare(&w, &pitch::PitchGoal::default());
            }
        }
    }

    #[test]
    fn any_text_is_parsed_or_refused(text in "\\PC{0,200}") {
        let _ = parse(&text, "fuzz.toml");
    }

    #[test]
    fn any_numbers_in_a_layout_are_parsed_or_refused(
        slots in any::<i64>(), poles in any::<i64>(), layers in any::<i64>(),
        pitch in any::<i64>(), skew in any::<f64>(), go in any::<i64>(), back in any::<i64>(),
    ) {
        let skew = if skew.is_finite() { format!("{skew:?}") } else { "0.0".into() };
        let src = format!(
            "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
             [winding]\nlayers = {layers}\npitch = {pitch}\nskew = {skew}\n\
             [[coil]]\nphase = \"U\"\ngo = {go}\nback = {back}\n"
        );
        if let Ok(spec) = parse(&src, "fuzz.toml") {
            let _ = build(&spec);
        }
    }
}
