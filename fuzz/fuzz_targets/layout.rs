//! Any bytes as a layout file: parsing refuses or accepts, never panics, and an accepted
//! layout is planned or refused with a message.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    if let Ok(spec) = beltwright::layout::parse(text, "fuzz.toml") {
        match beltwright::winding::build_lenient(&spec) {
            Ok(w) => assert!(w.coils.iter().all(|c| c.go < w.geometry.slots)),
            Err(e) => assert!(!e.to_string().is_empty() || spec.coils.is_empty()),
        }
    }
});
