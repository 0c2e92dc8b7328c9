//! Phase colours and line patterns.
//!
//! Default colours are taken from the colour-blind-safe palette of M. Okabe and K. Ito,
//! "Color Universal Design (CUD): how to make figures and presentations that are friendly
//! to colorblind people", 2008 (J*Fly). Because sheets are often printed in black and white,
//! every phase also has its own dash pattern, and every coil side carries its phase letter.

/// Okabe–Ito colours in the order we hand them to phases: vermillion, blue, bluish green,
/// reddish purple, orange, sky blue, black, yellow.
pub const OKABE_ITO: [&str; 8] = [
    "#D55E00", "#0072B2", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#000000", "#F0E442",
];

/// Dash patterns (mm) per phase; the first phase is drawn solid.
pub const DASHES: [&str; 8] = [
    "none",
    "1.8 0.9",
    "0.45 0.65",
    "2.4 0.7 0.45 0.7",
    "1.2 1.2",
    "3 0.8 0.45 0.8 0.45 0.8",
    "0.9 0.5",
    "4 1",
];

/// Colours and patterns of every phase of one winding.
#[derive(Debug, Clone, PartialEq)]
pub struct Palette {
    strokes: Vec<String>,
}

impl Palette {
    /// The layout's `[drawing] colours` when given (already checked to be `#rrggbb`, one per
    /// phase), else the Okabe–Ito defaults.
    pub fn new(phases: usize, overrides: Option<&[String]>) -> Self {
        let strokes = match overrides {
            Some(c) if c.len() == phases && c.iter().all(|s| hex(s).is_some()) => c.to_vec(),
            _ => (0..phases)
                .map(|k| OKABE_ITO[k % OKABE_ITO.len()].to_string())
                .collect(),
        };
        Palette { strokes }
    }

    /// Line colour of a phase.
    pub fn stroke(&self, phase: usize) -> &str {
        &self.strokes[phase % self.strokes.len()]
    }

    /// Light tint of the phase colour (a quarter strength over white) for shading belts.
    pub fn tint(&self, phase: usize) -> String {
        let (r, g, b) = hex(self.stroke(phase)).unwrap_or((128, 128, 128));
        let mix = |c: u8| 255 - ((255 - u32::from(c)) * 22 / 100) as u8;
        format!("#{:02X}{:02X}{:02X}", mix(r), mix(g), mix(b))
    }

    /// Dash pattern of a phase (`none` for solid).
    pub fn dash(&self, phase: usize) -> &'static str {
        DASHES[phase % DASHES.len()]
    }
}

fn hex(s: &str) -> Option<(u8, u8, u8)> {
    if s.len() != 7 || !s.starts_with('#') {
        return None;
    }
    let p = |i: usize| u8::from_str_radix(s.get(i..i + 2)?, 16).ok();
    Some((p(1)?, p(3)?, p(5)?))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn defaults_are_okabe_ito_and_overrides_win() {
        // Okabe & Ito 2008: vermillion (213, 94, 0), blue (0, 114, 178), bluish green (0, 158, 115)
        // (RGB triples from memory of the published table).
        let p = Palette::new(3, None);
        assert_eq!(hex(p.stroke(0)), Some((213, 94, 0)));
        assert_eq!(hex(p.stroke(1)), Some((0, 114, 178)));
        assert_eq!(hex(p.stroke(2)), Some((0, 158, 115)));
        let own = vec!["#112233".to_string(), "#445566".into(), "#778899".into()];
        assert_eq!(Palette::new(3, Some(&own)).stroke(2), "#778899");
    }

    #[test]
    fn phases_differ_in_dash_as_well_as_colour() {
        let p = Palette::new(6, None);
        let d: std::collections::HashSet<_> = (0..6).map(|k| p.dash(k)).collect();
        assert_eq!(d.len(), 6);
        assert_eq!(p.tint(6 % 6), p.tint(0));
        assert_eq!(p.tint(0).len(), 7);
    }
}
