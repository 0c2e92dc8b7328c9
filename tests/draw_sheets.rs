//! Drawing every sheet of every example layout, and checking what is drawn against the
//! winding model: what a winder at the bench relies on.

use std::collections::{BTreeMap, BTreeSet};
use std::path::PathBuf;

use beltwright::draw::{self, Orientation, Page, PaperSize, Sheet, export};
use beltwright::layout;
use beltwright::winding::{self, Topology, Winding, coil_groups};
use resvg::tiny_skia;

const SHEETS: [Sheet; 7] = Sheet::ALL;

fn build(source: &str, name: &str) -> Winding {
    let spec = layout::parse(source, name).unwrap_or_else(|e| panic!("{name}: {e}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{name}: {e}"))
}

/// Every `layouts/*.toml` of the repository, whatever the lead has added.
fn example_layouts() -> Vec<(String, Winding)> {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("layouts");
    let mut out = Vec::new();
    for entry in std::fs::read_dir(&dir).expect("layouts/ exists") {
        let path = entry.expect("readable entry").path();
        if path.extension().and_then(|e| e.to_str()) == Some("toml") {
            let name = path.display().to_string();
            let source = std::fs::read_to_string(&path).expect("readable layout");
            out.push((name.clone(), build(&source, &name)));
            // A two-winding core's second winding is drawn on sheets of its own too.
            let spec = layout::parse(&source, &name).unwrap_or_else(|e| panic!("{name}: {e}"));
            if let Some(second) = spec.second {
                let w = winding::build(&second.spec).unwrap_or_else(|e| panic!("{name}: {e}"));
                out.push((format!("{name} (second winding)"), w));
            }
        }
    }
    assert!(!out.is_empty(), "no example layouts found");
    out.sort_by(|a, b| a.0.cmp(&b.0));
    out
}

/// An invented 360-slot mill-drive stator: the large core every sheet must still draw.
const BIG: &str = r#"
title = "Mill drive stator, 360 slots"
[machine]
topology = "rotary"
slots = 360
poles = 24
[winding]
layers = 2
pitch = 13
turns_per_coil = 3
[supply]
frequency_hz = 50.0
"#;

/// An invented small conveyor primary with an odd slot pitch and no supply given.
const SMALL_LINEAR: &str = r#"
title = "Test-rig primary"
[machine]
topology = "linear"
slots = 14
poles = 2
[winding]
layers = 2
pitch = 2
"#;

/// A 6-slot core: must not be blown up across the page.
const TINY: &str = r#"
[machine]
topology = "rotary"
slots = 6
poles = 2
[winding]
layers = 1
"#;

/// Invented odd cases that must still draw: five phases with own labels, and a rewind
/// record holding a single coil (unbalanced; most slots empty).
const FIVE_PHASE: &str = r#"
[machine]
topology = "rotary"
slots = 20
poles = 2
phases = 5
phase_labels = ["A", "B", "C", "D", "E"]
[winding]
layers = 1
"#;
const ONE_COIL: &str = r#"
title = "one coil found"
[machine]
topology = "rotary"
slots = 12
poles = 2
[winding]
layers = 2
[[coil]]
phase = "U"
go = 1
back = 6
"#;

#[test]
fn odd_windings_draw_and_count_right() {
    for (name, src) in [("five phases", FIVE_PHASE), ("one coil", ONE_COIL)] {
        let w = build(src, name);
        for sheet in SHEETS {
            check_sheet_renders(name, &w, sheet, &Page::default());
        }
        check_slot_counts(name, &w);
        check_connection_counts(name, &w);
    }
    // An unbalanced record gets no field arrow rather than a wrong one.
    let w = build(ONE_COIL, "one coil");
    let svg = &draw::draw(
        &beltwright::study::Study::new(&w, None),
        Sheet::Slots,
        &Page::default(),
    )[0];
    assert!(!svg.contains("field-arrow"));
    assert!(svg.contains("direction unclear"));
}

fn elements<'a>(doc: &'a roxmltree::Document, class: &str) -> Vec<roxmltree::Node<'a, 'a>> {
    doc.descendants()
        .filter(|n| n.attribute("class") == Some(class))
        .collect()
}

fn num_attr(n: &roxmltree::Node, name: &str) -> usize {
    n.attribute(name)
        .unwrap_or_else(|| panic!("missing {name}"))
        .parse()
        .unwrap_or_else(|_| panic!("{name} not a number"))
}

/// Ink boxes of the texts drawn upright, and whether everything lies on the paper.
struct Rendered {
    texts: Vec<(String, tiny_skia::Rect)>,
    outside: Vec<String>,
    /// Every text's height as printed, mm, with whether it is a title-block caption.
    sizes: Vec<(String, f32, bool)>,
}

fn walk(group: &usvg::Group, clipped: bool, frame: tiny_skia::Rect, out: &mut Rendered) {
    for node in group.children() {
        match node {
            usvg::Node::Group(g) => walk(g, clipped || g.clip_path().is_some(), frame, out),
            usvg::Node::Text(t) => {
                // Ink box of the glyph outlines, in canvas coordinates.
                let bbox = t
                    .flattened()
                    .bounding_box()
                    .transform(t.abs_transform())
                    .expect("finite text box");
                let content: String = t.chunks().iter().map(|c| c.text().to_string()).collect();
                if !inside(bbox, frame) {
                    out.outside.push(format!("text {content:?} at {bbox:?}"));
                }
                let tr = t.abs_transform();
                if tr.kx.abs() < 1e-6 && tr.ky.abs() < 1e-6 {
                    out.texts.push((content.clone(), bbox));
                }
                // Font size as printed: the span's size through the text's transform, in
                // mm (the sheets' user unit is 1 mm; usvg works in CSS px, 96 per inch).
                let scale = (tr.sx * tr.sy - tr.kx * tr.ky).abs().sqrt();
                let px_per_mm = 96.0 / 25.4;
                for chunk in t.chunks() {
                    for span in chunk.spans() {
                        let mm = span.font_size().get() * scale / px_per_mm;
                        out.sizes
                            .push((content.clone(), mm, t.id().starts_with("caption")));
                    }
                }
            }
            usvg::Node::Path(p) => {
                let bbox = p.abs_stroke_bounding_box();
                if !clipped && !inside(bbox, frame) {
                    out.outside.push(format!("path {} at {bbox:?}", p.id()));
                }
            }
            usvg::Node::Image(_) => {}
        }
    }
}

fn inside(b: tiny_skia::Rect, f: tiny_skia::Rect) -> bool {
    b.left() >= f.left() - 0.01
        && b.top() >= f.top() - 0.01
        && b.right() <= f.right() + 0.01
        && b.bottom() <= f.bottom() + 0.01
}

/// Parse with usvg and collect text boxes; everything but the white paper must lie
/// inside the drawing frame (10 mm margins).
fn rendered(svg: &str, page: &Page) -> Rendered {
    let tree = export::parse(svg).expect("usvg parses the sheet");
    let (w_mm, h_mm) = page.size_mm();
    let px = tree.size().width() / w_mm as f32;
    let m = 10.0 * px;
    let frame = tiny_skia::Rect::from_ltrb(
        m - 0.5 * px,
        m - 0.5 * px,
        (w_mm as f32 - 10.0) * px + 0.5 * px,
        (h_mm as f32 - 10.0) * px + 0.5 * px,
    )
    .expect("frame");
    let mut out = Rendered {
        texts: Vec::new(),
        outside: Vec::new(),
        sizes: Vec::new(),
    };
    walk(tree.root(), false, frame, &mut out);
    // The first path is the white paper itself, which fills the page edge to edge.
    let paper = out.outside.iter().position(|o| o.starts_with("path"));
    if let Some(i) = paper {
        out.outside.remove(i);
    }
    assert!(!out.texts.is_empty(), "no text found on the sheet");
    out
}

/// Pairs of upright texts whose ink overlaps (by more than a hair).
fn overlaps(texts: &[(String, tiny_skia::Rect)]) -> Vec<String> {
    let mut idx: Vec<usize> = (0..texts.len()).collect();
    idx.sort_by(|&a, &b| texts[a].1.left().total_cmp(&texts[b].1.left()));
    let mut found = Vec::new();
    for (n, &i) in idx.iter().enumerate() {
        let a = texts[i].1;
        for &j in &idx[n + 1..] {
            let b = texts[j].1;
            if b.left() >= a.right() {
                break;
            }
            let dx = a.right().min(b.right()) - a.left().max(b.left());
            let dy = a.bottom().min(b.bottom()) - a.top().max(b.top());
            if dx > 0.3 && dy > 0.3 {
                found.push(format!("{:?} and {:?}", texts[i].0, texts[j].0));
            }
        }
    }
    found
}

fn ink_fraction(png: &[u8]) -> f64 {
    let pix = tiny_skia::Pixmap::decode_png(png).expect("PNG decodes");
    let dark = pix
        .pixels()
        .iter()
        .filter(|p| u16::from(p.red()) + u16::from(p.green()) + u16::from(p.blue()) < 600)
        .count();
    dark as f64 / pix.pixels().len() as f64
}

fn check_sheet_renders(name: &str, w: &Winding, sheet: Sheet, page: &Page) {
    let pages = draw::draw(&beltwright::study::Study::new(w, None), sheet, page);
    assert!(!pages.is_empty());
    for (n, svg) in pages.iter().enumerate() {
        let r = rendered(svg, page);
        assert!(
            r.outside.is_empty(),
            "{name} {sheet:?} page {}: off the frame: {:?}",
            n + 1,
            &r.outside[..r.outside.len().min(5)]
        );
        let o = overlaps(&r.texts);
        assert!(
            o.is_empty(),
            "{name} {sheet:?} page {}: overlapping text: {:?}",
            n + 1,
            &o[..o.len().min(8)]
        );
        // ISO 3098 / common drafting practice: text at least 2.5 mm high as printed; the
        // title block's small captions at least 1.8 mm.
        let small: Vec<String> = r
            .sizes
            .iter()
            .filter(|(_, mm, caption)| *mm < if *caption { 1.8 - 1e-3 } else { 2.5 - 1e-3 })
            .map(|(t, mm, _)| format!("{t:?} {mm:.2} mm"))
            .collect();
        assert!(
            small.is_empty(),
            "{name} {sheet:?} page {}: text under 2.5 mm: {:?}",
            n + 1,
            &small[..small.len().min(8)]
        );
        let png = export::to_png(svg, 40.0).expect("renders");
        let ink = ink_fraction(&png);
        assert!(ink > 0.01, "{name} {sheet:?}: only {ink} of the page inked");
    }
}

#[test]
fn every_sheet_of_every_example_layout_parses_renders_and_stays_on_the_page() {
    for (name, w) in example_layouts() {
        for sheet in SHEETS {
            check_sheet_renders(&name, &w, sheet, &Page::default());
        }
    }
}

#[test]
fn a_two_speed_connection_sheet_fits_beside_a_long_schedule() {
    // Larger two-speed windings need more schedule columns: the drawing (at printed size
    // only) must then take the room it needs, never overprint the schedule or run off the
    // frame, on every paper and both orientations.
    for (slots, poles, pitch) in [(48, 4, 7), (72, 4, 11), (72, 2, 22)] {
        let text = format!(
            "title = \"Invented two-speed test motor\"\n[machine]\ntopology = \"rotary\"\n\
             slots = {slots}\npoles = {poles}\n[winding]\nlayers = 2\npitch = {pitch}\n\
             turns_per_coil = 12\npole_change = \"delta-double-star\"\n"
        );
        let name = format!("{slots}/{poles} two-speed");
        let spec = layout::parse(&text, &name).unwrap_or_else(|e| panic!("{name}: {e}"));
        let w = winding::build(&spec).unwrap_or_else(|e| panic!("{name}: {e}"));
        for size in [PaperSize::A4, PaperSize::A3, PaperSize::Letter] {
            for orientation in [Orientation::Landscape, Orientation::Portrait] {
                let page = Page { size, orientation };
                check_sheet_renders(&name, &w, Sheet::Connections, &page);
            }
        }
    }
}

#[test]
fn sheets_fit_portrait_a3_and_letter_too() {
    for (name, w) in example_layouts() {
        for size in [PaperSize::A4, PaperSize::A3, PaperSize::Letter] {
            let page = Page {
                size,
                orientation: Orientation::Portrait,
            };
            for sheet in SHEETS {
                check_sheet_renders(&name, &w, sheet, &page);
            }
        }
    }
}

#[test]
fn a_360_slot_core_wraps_onto_rows_and_stays_legible() {
    let w = build(BIG, "big");
    for size in [PaperSize::A4, PaperSize::A3] {
        let page = Page {
            size,
            orientation: Orientation::Landscape,
        };
        for sheet in SHEETS {
            check_sheet_renders("big", &w, sheet, &page);
        }
        let pages = draw::draw(
            &beltwright::study::Study::new(&w, None),
            Sheet::Slots,
            &page,
        );
        let svg = &pages[0];
        let doc = roxmltree::Document::parse(svg).expect("XML");
        // Never shrunk as a whole (more pages instead), several rows a page, and slot
        // numbers no smaller than 2.5 mm (ISO 3098 lettering).
        let core = &elements(&doc, "core")[0];
        assert!(
            !core.attribute("transform").unwrap_or("").contains("scale"),
            "{:?}",
            core.attribute("transform")
        );
        let all = format!("<pages>{}</pages>", pages.concat());
        let all = roxmltree::Document::parse(&all).expect("XML");
        assert_eq!(elements(&all, "slot-no").len(), 360);
        let rows: BTreeSet<String> = elements(&doc, "slot")
            .iter()
            .map(|n| n.attribute("y").unwrap_or("").to_string())
            .collect();
        assert!(rows.len() >= 3, "{} rows", rows.len());
        for n in elements(&doc, "slot-no") {
            let size: f64 = n
                .attribute("font-size")
                .unwrap_or("0")
                .parse()
                .unwrap_or(0.0);
            assert!(size >= 2.5, "slot number at {size} mm");
        }
    }
}

#[test]
fn small_cores_are_not_blown_up() {
    let w = build(TINY, "tiny");
    let svg = &draw::draw(
        &beltwright::study::Study::new(&w, None),
        Sheet::Slots,
        &Page::default(),
    )[0];
    let doc = roxmltree::Document::parse(svg).expect("XML");
    let slots = elements(&doc, "slot");
    assert_eq!(slots.len(), 6);
    for s in slots {
        let width: f64 = s.attribute("width").unwrap_or("0").parse().unwrap_or(0.0);
        // The drawing uses the page (issue: sheets a trainee can wind from), but a slot is
        // never drawn wider than 0.9 of the 18 mm largest pitch.
        assert!(width > 0.0 && width <= 16.2, "slot drawn {width} mm wide");
    }
}

/// The slot sheet shows exactly the model: one marked side per filled slot layer with its
/// direction, one span per coil, every group, slots 1..Z, and the empty layers.
fn check_slot_counts(name: &str, w: &Winding) {
    // A large core runs over several pages: count over all of them.
    let svg = format!(
        "<pages>{}</pages>",
        draw::draw(
            &beltwright::study::Study::new(w, None),
            Sheet::Slots,
            &Page::default()
        )
        .concat()
    );
    let doc = roxmltree::Document::parse(&svg).expect("XML");
    let mut drawn = BTreeMap::new();
    for n in elements(&doc, "side") {
        let key = (num_attr(&n, "data-slot"), num_attr(&n, "data-layer"));
        let coil = num_attr(&n, "data-coil");
        let dir = n.attribute("data-dir").unwrap_or("").to_string();
        assert!(
            drawn.insert(key, (coil, dir)).is_none(),
            "{name}: slot layer {key:?} drawn twice"
        );
    }
    let mut expected = BTreeMap::new();
    for (i, c) in w.coils.iter().enumerate() {
        expected.insert((c.go + 1, c.go_layer.min(1)), (i + 1, "go".to_string()));
        expected.insert(
            (c.back + 1, c.back_layer.min(1)),
            (i + 1, "back".to_string()),
        );
    }
    assert_eq!(drawn, expected, "{name}: coil sides");
    assert_eq!(drawn.len(), 2 * w.coils.len());
    let spans: Vec<usize> = elements(&doc, "span")
        .iter()
        .map(|n| num_attr(n, "data-coil"))
        .collect();
    let unique: BTreeSet<usize> = spans.iter().copied().collect();
    assert_eq!(spans.len(), w.coils.len(), "{name}: one span per coil");
    assert_eq!(unique, (1..=w.coils.len()).collect(), "{name}: spans");
    let slot_nos: Vec<(usize, String)> = elements(&doc, "slot-no")
        .iter()
        .map(|n| {
            (
                num_attr(n, "data-slot"),
                n.text().unwrap_or("").trim().to_string(),
            )
        })
        .collect();
    assert_eq!(slot_nos.len(), w.geometry.slots, "{name}: slot numbers");
    for (k, (slot, text)) in slot_nos.iter().enumerate() {
        assert_eq!(
            (*slot, text.as_str()),
            (k + 1, (k + 1).to_string().as_str())
        );
    }
    let groups = elements(&doc, "group");
    assert_eq!(groups.len(), coil_groups(w).len(), "{name}: group brackets");
    let empty: BTreeSet<(usize, usize)> = elements(&doc, "empty-layer")
        .iter()
        .map(|n| (num_attr(n, "data-slot"), num_attr(n, "data-layer")))
        .collect();
    let fill = w.slot_fill();
    let want: BTreeSet<(usize, usize)> = (0..w.geometry.slots)
        .flat_map(|k| (0..w.geometry.layers.min(2)).map(move |l| (k, l)))
        .filter(|&(k, l)| fill[k][l].is_none())
        .map(|(k, l)| (k + 1, l))
        .collect();
    assert_eq!(empty, want, "{name}: empty layers");
    if w.geometry.topology == Topology::Linear && w.geometry.layers == 2 {
        // Design brief: N coils at span y on an open primary leave y half-filled slots at each end.
        let half: BTreeSet<usize> = empty.iter().map(|e| e.0).collect();
        assert_eq!(half.len(), 2 * w.pitch, "{name}: half-filled end slots");
    }
}

#[test]
fn slot_sheet_counts_match_the_model() {
    for (name, w) in example_layouts() {
        check_slot_counts(&name, &w);
    }
    check_slot_counts("big", &build(BIG, "big"));
    check_slot_counts("small linear", &build(SMALL_LINEAR, "small linear"));
    check_slot_counts("tiny", &build(TINY, "tiny"));
}

fn check_connection_counts(name: &str, w: &Winding) {
    let pages = draw::draw(
        &beltwright::study::Study::new(w, None),
        Sheet::Connections,
        &Page::default(),
    );
    let m = w.geometry.phases;
    // A pole-changing winding's sheet has no one-speed diagram (boards, lanes, group
    // boxes) but its halves and speed boards (tests/two_speed_sheet.rs); its schedule is
    // checked here.
    let diagram = w.design.pole_change.is_none();
    let mut schedule = Vec::new();
    for (n, svg) in pages.iter().enumerate() {
        let doc = roxmltree::Document::parse(svg).expect("XML");
        if n == 0 && m == 3 && diagram {
            // Every board shows every lead brought out exactly once: on a line or in a
            // joined group (the network test in connection_network.rs checks the wiring).
            let leads = match w.design.leads.count {
                3 => 3,
                6 => 6,
                9 => 9,
                _ => 12,
            };
            let boards = elements(&doc, "board");
            assert!(!boards.is_empty(), "{name}: no terminal board");
            for b in &boards {
                let mut seen: Vec<String> = b
                    .descendants()
                    .filter(|t| t.attribute("class") == Some("board-terminal"))
                    .map(|t| t.attribute("data-lead").unwrap_or("").to_string())
                    .collect();
                seen.sort();
                let n_seen = seen.len();
                seen.dedup();
                assert_eq!(n_seen, seen.len(), "{name}: a lead twice on one board");
                assert_eq!(n_seen, leads, "{name}: leads on a board: {seen:?}");
            }
        }
        if n == 0 && diagram {
            assert_eq!(
                elements(&doc, "lane").len(),
                m * w.parallel_paths,
                "{name}: lanes"
            );
            let boxes: BTreeSet<usize> = elements(&doc, "coil-group")
                .iter()
                .map(|g| num_attr(g, "data-group"))
                .collect();
            assert_eq!(
                boxes,
                (1..=coil_groups(w).len()).collect(),
                "{name}: group boxes"
            );
        }
        // (A single-phase stator's board is its lead tables and circuit:
        // `tests/single_phase.rs`.)
        if n == 0 && m != 3 && w.design.single_phase.is_none() {
            let terminals: BTreeSet<(usize, usize)> = elements(&doc, "terminal")
                .iter()
                .map(|t| (num_attr(t, "data-phase"), num_attr(t, "data-end")))
                .collect();
            assert_eq!(
                elements(&doc, "terminal").len(),
                2 * m,
                "{name}: one terminal pair per phase"
            );
            let want: BTreeSet<(usize, usize)> = (0..m).flat_map(|k| [(k, 1), (k, 2)]).collect();
            assert_eq!(terminals, want, "{name}: terminals");
            // Delta: m links down the board; star: one bar across it.
            let links = elements(&doc, "link").len();
            match w.design.connection {
                winding::Connection::Delta => assert_eq!(links, m),
                winding::Connection::Star => assert_eq!(links, 1),
            }
        }
        schedule.extend(
            elements(&doc, "schedule-row")
                .iter()
                .map(|r| num_attr(r, "data-coil")),
        );
    }
    let set: BTreeSet<usize> = schedule.iter().copied().collect();
    assert_eq!(schedule.len(), w.coils.len(), "{name}: schedule rows");
    assert_eq!(
        set,
        (1..=w.coils.len()).collect(),
        "{name}: every coil in the schedule"
    );
}

#[test]
fn connection_sheet_counts_match_the_model() {
    for (name, w) in example_layouts() {
        check_connection_counts(&name, &w);
    }
    let big = build(BIG, "big");
    check_connection_counts("big", &big);
    assert!(
        draw::draw(
            &beltwright::study::Study::new(&big, None),
            Sheet::Connections,
            &Page::default()
        )
        .len()
            > 1,
        "360 coils continue on more pages"
    );
}

#[test]
fn star_sheet_numbers_every_slot_once() {
    for (name, w) in example_layouts()
        .into_iter()
        .chain([("big".to_string(), build(BIG, "big"))])
    {
        let svg = &draw::draw(
            &beltwright::study::Study::new(&w, None),
            Sheet::Star,
            &Page::default(),
        )[0];
        let doc = roxmltree::Document::parse(svg).expect("XML");
        let mut slots = Vec::new();
        for ray in elements(&doc, "ray") {
            slots.extend(
                ray.attribute("data-slots")
                    .unwrap_or("")
                    .split(' ')
                    .map(|s| s.parse::<usize>().expect("slot")),
            );
        }
        slots.sort_unstable();
        assert_eq!(slots, (1..=w.geometry.slots).collect::<Vec<_>>(), "{name}");
        assert_eq!(elements(&doc, "sector").len(), 2 * w.geometry.phases);
        assert_eq!(elements(&doc, "phasor").len(), w.geometry.phases);
    }
}

/// Position (in slot pitches) of the crest of the fundamental MMF wave at time ωt, from the
/// slot currents: F(x) = Σ_k N_k i_k, fundamental by the Fourier sum over slots
/// (closed-form MMF of a polyphase winding; Pyrhönen et al. 2014, §2.2).
fn mmf_crest(w: &Winding, wt: f64) -> f64 {
    let m = w.geometry.phases as f64;
    let tau = w.geometry.pole_pitch_slots;
    let mut re = 0.0;
    let mut im = 0.0;
    for c in &w.coils {
        let i = (wt - 2.0 * std::f64::consts::PI * c.phase as f64 / m).cos() * f64::from(c.turns);
        for (slot, s) in [(c.go, 1.0), (c.back, -1.0)] {
            // Slot conductor current density; the MMF is its integral (a 90° shift that
            // is the same at every instant, so it does not change the direction).
            let a = std::f64::consts::PI * slot as f64 / tau;
            re += s * i * a.cos();
            im += s * i * a.sin();
        }
    }
    im.atan2(re) * tau / std::f64::consts::PI
}

fn arrow_direction(w: &Winding) -> String {
    let svg = &draw::draw(
        &beltwright::study::Study::new(w, None),
        Sheet::Slots,
        &Page::default(),
    )[0];
    let doc = roxmltree::Document::parse(svg).expect("XML");
    elements(&doc, "field-arrow")[0]
        .attribute("data-direction")
        .unwrap_or("")
        .to_string()
}

#[test]
fn field_arrow_points_the_way_the_mmf_travels() {
    let shuttle = r#"
[machine]
topology = "linear"
slots = 29
poles = 4
[winding]
layers = 2
pitch = 5
"#;
    let w = build(shuttle, "shuttle");
    // Crest moves by a small positive step in a short time for a forward-travelling wave.
    let step = mmf_crest(&w, 0.1) - mmf_crest(&w, 0.0);
    assert!(step > 0.0, "MMF crest moved {step}");
    assert_eq!(arrow_direction(&w), "forward");
    // Swap V and W in an explicit coil list: the field must reverse.
    let mut list = String::from(
        "[machine]\ntopology = \"rotary\"\nslots = 12\npoles = 2\n[winding]\nlayers = 1\n",
    );
    let forward = build(TINY.replace("slots = 6", "slots = 12").as_str(), "t12");
    for c in &forward.coils {
        let phase = ["U", "W", "V"][c.phase];
        list.push_str(&format!(
            "[[coil]]\nphase = \"{phase}\"\ngo = {}\nback = {}\n",
            c.go + 1,
            c.back + 1
        ));
    }
    let swapped = build(&list, "swapped");
    let step = mmf_crest(&swapped, 0.1) - mmf_crest(&swapped, 0.0);
    assert!(step < 0.0, "MMF crest moved {step}");
    assert_eq!(arrow_direction(&swapped), "backward");
    assert_eq!(arrow_direction(&forward), "forward");
}

#[test]
fn hostile_title_is_escaped_and_still_parses() {
    let src = "title = \"<script>alert(\\\"x\\\")</script> & 'quoted' \\u0001 end\"\n\
               [machine]\ntopology = \"rotary\"\nslots = 12\npoles = 2\n[winding]\nlayers = 1\n";
    let w = build(src, "hostile");
    for sheet in SHEETS {
        for svg in draw::draw(
            &beltwright::study::Study::new(&w, None),
            sheet,
            &Page::default(),
        ) {
            assert!(!svg.contains("<script"), "{sheet:?}: raw script tag");
            assert!(
                svg.contains("&lt;script&gt;"),
                "{sheet:?}: title not escaped"
            );
            assert!(svg.contains("&amp;"), "{sheet:?}: ampersand not escaped");
            let doc = roxmltree::Document::parse(&svg).expect("well-formed XML");
            let title = doc
                .descendants()
                .find(|n| n.has_tag_name("title"))
                .and_then(|n| n.text())
                .unwrap_or("")
                .trim();
            assert!(
                title.starts_with("<script>alert(\"x\")</script> & 'quoted'"),
                "{title:?}"
            );
            export::parse(&svg).expect("usvg parses");
            export::to_pdf(&[svg]).expect("PDF");
        }
    }
}

#[test]
fn pdf_is_a_pdf_with_embedded_text() {
    let (_, w) = example_layouts().remove(0);
    let pages = draw::draw(
        &beltwright::study::Study::new(&w, None),
        Sheet::Connections,
        &Page::default(),
    );
    let pdf = export::to_pdf(&pages).expect("PDF");
    assert!(pdf.starts_with(b"%PDF-"));
    let text = String::from_utf8_lossy(&pdf);
    assert!(text.contains("/FontFile2"), "TrueType font embedded");
    assert!(text.contains("DejaVuSans"), "the bundled font");
    assert!(text.contains("/ToUnicode"), "text extractable");
    assert!(text.trim_end().ends_with("%%EOF"));
    let big = draw::draw(
        &beltwright::study::Study::new(&build(BIG, "big"), None),
        Sheet::Connections,
        &Page::default(),
    );
    let pdf = export::to_pdf(&big).expect("PDF");
    assert!(String::from_utf8_lossy(&pdf).contains(&format!("/Count {}", big.len())));
}

#[test]
fn pdf_text_reads_back_with_pdftotext_when_installed() {
    let Ok(probe) = std::process::Command::new("pdftotext").arg("-v").output() else {
        eprintln!("pdftotext not installed; skipped");
        return;
    };
    let _ = probe;
    let w = build(BIG, "big");
    let pdf = export::to_pdf(&draw::draw(
        &beltwright::study::Study::new(&w, None),
        Sheet::Slots,
        &Page::default(),
    ))
    .expect("PDF");
    let dir = tempfile::tempdir().expect("tempdir");
    let path = dir.path().join("s.pdf");
    std::fs::write(&path, pdf).expect("write");
    let out = std::process::Command::new("pdftotext")
        .arg(&path)
        .arg("-")
        .output()
        .expect("runs");
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("Mill drive stator, 360 slots"), "{text}");
    assert!(text.contains("CAUTION"));
    assert!(text.contains("360"));
}

#[test]
fn the_page_checks_catch_overlap_and_overflow() {
    // Negative control for the checks above: two texts on top of each other and a line
    // running off the frame must both be reported.
    let svg = r##"<svg xmlns="http://www.w3.org/2000/svg" width="297mm" height="210mm" viewBox="0 0 297 210" font-family="DejaVu Sans">
<rect width="297" height="210" fill="#FFFFFF"/>
<g><text x="50" y="50" font-size="3">Slot 12</text><text x="51" y="50.5" font-size="3">Slot 13</text>
<text x="150" y="50" font-size="3">apart</text>
<line x1="100" y1="100" x2="295" y2="100" stroke="#000" stroke-width="0.3"/></g></svg>"##;
    let r = rendered(svg, &Page::default());
    assert_eq!(overlaps(&r.texts).len(), 1, "{:?}", r.texts);
    assert_eq!(r.outside.len(), 1, "{:?}", r.outside);
}

#[test]
fn hostile_phase_labels_and_own_colours_come_through_safely() {
    // Phase labels are user text too; the layout's [drawing] colours replace the defaults.
    let src = "[machine]\ntopology = \"rotary\"\nslots = 12\npoles = 2\n\
               phase_labels = [\"<a>\", \"B&\", \"C\\\"\"]\n[winding]\nlayers = 1\n\
               [drawing]\ncolours = [\"#112233\", \"#445566\", \"#778899\"]\n";
    let w = build(src, "labels");
    for sheet in SHEETS {
        for svg in draw::draw(
            &beltwright::study::Study::new(&w, None),
            sheet,
            &Page::default(),
        ) {
            let doc = roxmltree::Document::parse(&svg).expect("well-formed XML");
            let texts: Vec<&str> = doc
                .descendants()
                .filter_map(|n| n.text())
                .map(str::trim)
                .collect();
            export::parse(&svg).expect("usvg parses");
            if sheet == Sheet::Card
                || sheet == Sheet::Thrust
                || sheet == Sheet::Field
                || sheet == Sheet::Section
            {
                // The data card is tables in black over pages; its leads name the phase
                // inside a longer text (checked below, over all its pages). The performance
                // and field sheets plot whole-winding figures and name no phase. The slot
                // section needs the slot's sizes, which this layout does not give.
                continue;
            }
            if sheet == Sheet::Field {
                // The field plot names phases only in its current line and colours its
                // snapshots by instant, not by phase, so phase colours do not apply.
                assert!(
                    texts.iter().any(|t| t.contains("<a>")),
                    "{sheet:?}: label lost"
                );
                continue;
            }
            assert!(texts.contains(&"<a>"), "{sheet:?}: label lost");
            assert!(texts.iter().any(|t| t.contains("C\"")), "{sheet:?}");
            for own in ["#112233", "#445566", "#778899"] {
                assert!(svg.contains(own), "{sheet:?}: colour {own} unused");
            }
            assert!(
                !svg.contains("#D55E00"),
                "{sheet:?}: default colour despite override"
            );
        }
    }
    let card = draw::draw(
        &beltwright::study::Study::new(&w, None),
        Sheet::Card,
        &Page::default(),
    )
    .concat();
    assert!(
        card.contains("(&lt;a&gt; 1 start)"),
        "card: label lost or unescaped"
    );
    // Without an override the Okabe–Ito vermillion, blue and bluish green are used.
    let plain = build(
        &src.replace(
            "[drawing]\ncolours = [\"#112233\", \"#445566\", \"#778899\"]\n",
            "",
        ),
        "plain",
    );
    let svg = &draw::draw(
        &beltwright::study::Study::new(&plain, None),
        Sheet::Slots,
        &Page::default(),
    )[0];
    for c in ["#D55E00", "#0072B2", "#009E73"] {
        assert!(svg.contains(c), "default {c} missing");
    }
}

// The connection sheet of every lead scheme (3, 6, 9, 12 leads; IEC and NEMA; star and
// delta) on A4 and A3, landscape and portrait: no text overlaps other text and nothing
// leaves the frame (the wiring itself is checked in connection_network.rs).
#[test]
fn connection_sheets_of_every_lead_scheme_stay_clear() {
    for leads in [3u8, 6, 9, 12] {
        for marking in ["iec", "nema"] {
            for connection in ["star", "delta"] {
                let paths = if leads >= 9 { 2 } else { 1 };
                let src = format!(
                    "title = \"Invented {leads}-lead motor\"\n[machine]\ntopology = \"rotary\"\n\
                     slots = 48\npoles = 4\n[winding]\nlayers = 2\npitch = 10\n\
                     turns_per_coil = 9\nparallel_paths = {paths}\nconnection = \"{connection}\"\n\
                     leads = {leads}\nmarking = \"{marking}\"\n[supply]\nfrequency_hz = 60.0\n\
                     line_voltage_v = 230.0\n[nameplate]\npower_hp = 10\nvoltage_v = [230, 460]\n\
                     frame = \"215T\"\n[job]\nnumber = 77\ncustomer = \"Invented Mill\"\n"
                );
                let name = format!("{leads}-{marking}-{connection}");
                let w = build(&src, &name);
                for page in [
                    Page::default(),
                    Page {
                        size: PaperSize::A3,
                        orientation: Orientation::Portrait,
                    },
                ] {
                    check_sheet_renders(&name, &w, Sheet::Connections, &page);
                }
            }
        }
    }
}

#[test]
fn the_slot_section_draws_every_wire_of_the_fullest_slot_in_its_phase() {
    // A 36-slot core with parallel-sided teeth: 2 layers of 10 turns, one strand of 0.8 mm.
    let src = "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
               [winding]\nlayers = 2\npitch = 7\nturns_per_coil = 10\n\
               [core]\nbore_mm = 130.0\nstack_mm = 110.0\nslot_depth_mm = 16.5\n\
               tooth_width_mm = 5.4\n[wire]\ndiameter_mm = 0.8\n";
    let w = build(src, "section");
    let study = beltwright::study::Study::new(&w, None);
    assert!(Sheet::Section.applies(&study));
    let svg = draw::draw(&study, Sheet::Section, &Page::default()).remove(0);
    let doc = roxmltree::Document::parse(&svg).expect("well-formed XML");
    let wires: Vec<_> = doc
        .descendants()
        .filter(|n| n.attribute("class") == Some("wire"))
        .collect();
    // 20 conductors in a full slot of this winding (2 coil sides × 10 turns × 1 strand).
    assert_eq!(wires.len(), 20);
    // Each wire's phase is one of the slot's two coil sides' phases.
    assert!(wires.iter().all(|n| n.attribute("data-phase").is_some()));
    // The two coil sides of a double-layer slot sit apart, over one separator.
    let separators = doc
        .descendants()
        .filter(|n| n.attribute("class") == Some("separator"))
        .count();
    assert_eq!(separators, 1);
}
