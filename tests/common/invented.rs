//! Invented rotary motors for filling a record book in tests and the benchmark: demo data
//! only, never a check value. Each number gives one layout, the same every run.

/// Cores that plan balanced at two layers: (slots, poles).
const CORES: [(u32, u32); 10] = [
    (24, 2),
    (24, 4),
    (36, 2),
    (36, 4),
    (36, 6),
    (48, 4),
    (48, 8),
    (72, 4),
    (72, 6),
    (72, 8),
];

const FRAMES: [&str; 8] = [
    "90L", "100L", "112M", "132S", "132M", "160M", "160L", "180M",
];
const POWERS_KW: [f64; 10] = [1.1, 1.5, 2.2, 3.0, 4.0, 5.5, 7.5, 11.0, 15.0, 18.5];
const VOLTS: [u32; 4] = [230, 400, 460, 690];
const CUSTOMERS: [&str; 6] = [
    "Riverside Pumps",
    "Northgate Mill",
    "Harbour Cranes",
    "Valley Dairy",
    "Eastfield Fans",
    "Quarry Works",
];

/// A small deterministic mix of `n` (splitmix64), so neighbouring numbers differ.
fn mix(n: u64) -> u64 {
    let mut z = n.wrapping_add(0x9E37_79B9_7F4A_7C15);
    z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
    z ^ (z >> 31)
}

/// The invented layout number `n`: a rotary stator with nameplate and job.
pub fn layout(n: u64) -> String {
    let r = mix(n);
    let pick = |k: u32, len: usize| ((r >> k) as usize) % len;
    let (slots, poles) = CORES[pick(0, CORES.len())];
    let frame = FRAMES[pick(8, FRAMES.len())];
    let power = POWERS_KW[pick(16, POWERS_KW.len())];
    let volts = VOLTS[pick(24, VOLTS.len())];
    let customer = CUSTOMERS[pick(32, CUSTOMERS.len())];
    let bore = 80.0 + 10.0 * pick(40, 12) as f64;
    let stack = 60.0 + 5.0 * pick(44, 20) as f64;
    let turns = 8 + pick(50, 40);
    let wire = 0.5 + 0.05 * pick(56, 20) as f64;
    let delta = r >> 63 == 1;
    format!(
        "title = \"Invented {power} kW motor no. {n}\"\n\
         [machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = 2\nturns_per_coil = {turns}\nconnection = \"{}\"\n\
         [core]\nbore_mm = {bore}\nstack_mm = {stack}\n\
         [wire]\ndiameter_mm = {wire:.2}\n\
         [nameplate]\npower_kw = {power}\nvoltage_v = {volts}\nfrequency_hz = 50\nframe = \"{frame}\"\n\
         [job]\nnumber = \"J-{n}\"\ncustomer = \"{customer}\"\nnotes = \"invented for a test, bench copy {n}\"\n",
        if delta { "delta" } else { "star" }
    )
}

/// The invented layout number `n` as a book entry (record `n`, entry `n`), its figures
/// worked out by the library as `book add` does: for loading many at once.
pub fn entry(n: u64) -> beltwright::record::Entry {
    let text = layout(n);
    let spec = beltwright::layout::parse(&text, "invented").expect("the invented layout parses");
    let w = beltwright::winding::build(&spec).expect("the invented layout plans");
    let h = beltwright::header::of(&w);
    let c = beltwright::card::card(&w);
    let id = i64::try_from(n).expect("small");
    beltwright::record::Entry {
        id,
        record: id,
        stage: beltwright::record::Stage::Design,
        version: 1,
        supersedes: None,
        added_at: "2026-01-01T00:00:00Z".into(),
        added_by: "bench".into(),
        remark: None,
        content_hash: beltwright::book::content_hash(&text),
        figures: beltwright::record::figures(&w, &h, &c),
        layout: text,
        readings: None,
    }
}

/// Invented entries `from..to` as a `book dump` backup (JSON lines).
pub fn backup(from: u64, to: u64) -> String {
    let mut s = String::new();
    for n in from..to {
        s.push_str(&serde_json::to_string(&entry(n)).expect("serialises"));
        s.push('\n');
    }
    s
}
