//! Both speeds of a pole-changing winding (one winding, two speeds in the ratio 1:2 by
//! consequent poles): the factors, field, sequence and series turns at each pole count,
//! the ratio of gap flux densities between the speeds for its connection, and the lead
//! connections at each speed.
//!
//! The winding is laid out at the lower pole count 2p (the higher speed, double star); the
//! higher count 4p (the lower speed, series delta or star) is the same coils with the
//! reversed half of each phase turned back ([`pole_change::at_double_poles`]). With the
//! same line voltage U and frequency at both speeds, each phase's EMF E = √2·π·f·N·k_w1·Φ
//! (Say 1983, §4.3) and the mean gap density B = Φ·(poles)/(π·D·L) give the ratio of gap
//! densities, lower speed over higher:
//!   series delta / double star:  B_4p / B_2p = √3 · k_w1(2p) / k_w1(4p)
//!   series star / double star:   B_4p / B_2p = k_w1(2p) / k_w1(4p)
//! (at 4p all of a phase's N turns in series carry U (delta) or U/√3 (star); at 2p half of
//! them carry U/√3; the pole count doubles the density per flux and halves the flux).

use serde::Serialize;

use crate::design::PoleChange;
use crate::factors::{self, FactorRow};
use crate::field::{self, FieldOptions, WaveRow, balanced_currents};
use crate::header::{self, DesignHeader};
use crate::winding::pole_change::{self, Lead};
use crate::winding::star::Sequence;
use crate::winding::{Elec, Winding};

/// How the phases are joined at one speed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Joined {
    /// Both halves in series, the phases in delta.
    SeriesDelta,
    /// Both halves in series, the phases in star.
    SeriesStar,
    /// The halves in parallel (one reversed), the phases in star: double star.
    DoubleStar,
}

/// One speed of a pole-changing winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Speed {
    /// Poles at this speed.
    pub poles: usize,
    /// How the phases are joined.
    pub joined: Joined,
    /// Synchronous speed at the supply frequency, rpm (when the frequency is known).
    pub synchronous_rpm: Option<f64>,
    /// Fundamental factors at this pole count.
    pub fundamental: FactorRow,
    /// Phase EMFs equal and 120° apart at this pole count, in either sequence.
    pub balanced: bool,
    /// Their sequence with U, V, W in order (negative at the lower speed by nature: every
    /// angle doubles). Which way each board turns the field is its connection's
    /// `towards_rising_slots`.
    pub sequence: Option<Sequence>,
    /// Turns in series in one phase at this connection (both halves in series, or one).
    pub series_turns_per_phase: f64,
    /// Total harmonic distortion of the MMF at this pole count (currents in the winding's
    /// own sequence).
    pub thd: f64,
    /// Differential leakage σ_d at this pole count.
    pub differential_leakage: f64,
    /// The MMF's waves at this pole count, orders relative to its working wave (even orders
    /// included: a span other than the higher count's pole pitch leaves a second harmonic).
    pub rows: Vec<WaveRow>,
}

/// One supply line's place at one speed.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, schemars::JsonSchema)]
pub struct LineLead {
    /// Supply line: "L1", "L2", "L3".
    pub line: String,
    /// The lead it goes to.
    pub lead: String,
}

/// The connection at one speed: the lines on their leads, and what the other leads do.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SpeedConnection {
    /// Poles at this speed.
    pub poles: usize,
    /// The supply lines on their leads.
    pub lines: Vec<LineLead>,
    /// The leads joined together (the double star's star point), if any.
    pub joined: Vec<String>,
    /// The leads left open, each insulated apart.
    pub open: Vec<String>,
    /// True when two lines are exchanged at this speed so that both speeds turn the same way.
    pub lines_exchanged: bool,
    /// With L1, L2, L3 in positive sequence as given here, the field runs towards rising
    /// slot numbers (false: towards falling ones).
    pub towards_rising_slots: bool,
}

/// The standards' name of a pole-changing connection (IEC and NEMA usage, from memory).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Duty {
    /// Series delta / double star.
    ConstantTorque,
    /// Series star / double star.
    VariableTorque,
}

impl Duty {
    /// The name of connection `pc` (not derived from its flux ratio).
    pub fn of(pc: PoleChange) -> Duty {
        match pc {
            PoleChange::DeltaDoubleStar => Duty::ConstantTorque,
            PoleChange::StarDoubleStar => Duty::VariableTorque,
        }
    }
}

/// One span of a pole-changing winding at both pole counts.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SpanAtBoth {
    /// Span in slots.
    pub span: usize,
    /// Fundamental winding factor at the lower speed (twice the poles).
    pub low_speed_winding_factor: f64,
    /// Fundamental winding factor at the higher speed (the poles as laid out).
    pub high_speed_winding_factor: f64,
    /// The smaller of the two: what the span is chosen by.
    pub smaller: f64,
    /// The lower speed's MMF wave of order 2, per cent of its working wave:
    /// 100·|k_w2|/(2·|k_w1|) (a wave's amplitude goes as k_wν/ν; order 2 is no multiple of
    /// 3, so three balanced phases keep it). Zero at the lower speed's full pitch.
    pub low_speed_second_percent: f64,
    /// Mean gap flux density at the lower speed over that at the higher, for the
    /// connection, at this span; `None` where the lower speed has no fundamental.
    pub flux_ratio: Option<f64>,
}

/// Both speeds of a pole-changing winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SpeedsReport {
    /// The winding as laid out (the higher speed's pole count).
    pub design: DesignHeader,
    /// The connection.
    pub pole_change: PoleChange,
    /// Its name by the standards' usage (not derived from the flux ratio).
    pub duty: Duty,
    /// The lower speed: twice the poles, halves in series.
    pub low_speed: Speed,
    /// The higher speed: the poles as laid out, double star.
    pub high_speed: Speed,
    /// Mean gap flux density at the lower speed over that at the higher, at the same line
    /// voltage and frequency.
    pub flux_ratio: f64,
    /// The connection at each speed: lower speed first.
    pub connections: Vec<SpeedConnection>,
    /// Lead names as marked: IEC 60034-8 (1U ... 2W) or NEMA (T1 ... T6).
    pub marking: crate::design::Marking,
    /// Every span up to the higher speed's pole pitch, at both pole counts.
    pub spans: Vec<SpanAtBoth>,
    /// The span whose smaller k_w1 is largest (the shorter of equals: less copper), our
    /// criterion; `None` when no span can be laid out.
    pub best_span: Option<usize>,
}

/// Why a winding has no two speeds to report.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SpeedsError {
    /// The layout has no `winding.pole_change`.
    #[error("not a pole-changing winding")]
    NotPoleChanging,
    /// The phases are not balanced at one of the pole counts.
    #[error("unbalanced at {poles} poles")]
    Unbalanced {
        /// The pole count at which the phases are not balanced.
        poles: usize,
    },
}

fn speed(w: &Winding, joined: Joined, turns_in_series: f64) -> Result<Speed, SpeedsError> {
    let poles = w.geometry.poles;
    let sequence = w.balance();
    let Some(seq) = sequence else {
        return Err(SpeedsError::Unbalanced { poles });
    };
    let opts = FieldOptions {
        currents: balanced_currents(w.geometry.phases, seq),
        ..FieldOptions::balanced(w)
    };
    let f = field::field(w, &opts).map_err(|_| SpeedsError::Unbalanced { poles })?;
    let rpm = synchronous_rpm(w, poles);
    Ok(Speed {
        poles,
        joined,
        synchronous_rpm: rpm,
        fundamental: factors::factors_at(w, 0, Elec::FUNDAMENTAL),
        balanced: true,
        sequence,
        series_turns_per_phase: turns_in_series,
        thd: f.thd,
        differential_leakage: f.differential_leakage,
        rows: f.rows,
    })
}

/// Both speeds of `w`, a pole-changing winding (`design.pole_change`).
pub fn speeds(w: &Winding) -> Result<SpeedsReport, SpeedsError> {
    crate::runs::count(crate::runs::Analysis::Speeds);
    let pc = w.design.pole_change.ok_or(SpeedsError::NotPoleChanging)?;
    let low = pole_change::at_double_poles(w);
    let phase_turns: f64 = w
        .coils
        .iter()
        .filter(|c| c.phase == 0)
        .map(|c| f64::from(c.turns))
        .sum();
    let joined_low = match pc {
        PoleChange::DeltaDoubleStar => Joined::SeriesDelta,
        PoleChange::StarDoubleStar => Joined::SeriesStar,
    };
    let duty = Duty::of(pc);
    let low_speed = speed(&low, joined_low, phase_turns)?;
    let high_speed = speed(w, Joined::DoubleStar, phase_turns / 2.0)?;
    let kw = |s: &Speed| s.fundamental.winding.abs();
    let flux_ratio = flux_ratio(pc, kw(&low_speed), kw(&high_speed));
    let spans = spans_at_both(w);
    let best_span = best_span(&spans);
    let marking = w.design.leads.marking;
    // Which way each board turns the field: the winding's sequence at that pole count, and
    // whether the board feeds the phases in order. The standards' tables turn both speeds
    // the same way; if a winding ever made them differ, two lines are exchanged at the
    // lower speed so that both turn as the higher speed does.
    let rising = |board: &pole_change::Board, seq: Option<Sequence>| {
        (seq == Some(Sequence::Positive)) == pole_change::feeds_in_order(board)
    };
    let low_rising = rising(&pole_change::LOW_SPEED, low_speed.sequence);
    let high_rising = rising(&pole_change::HIGH_SPEED, high_speed.sequence);
    let exchange = low_rising != high_rising;
    let on_board = |board: &pole_change::Board, poles: usize, exchanged: bool, rising: bool| {
        let order = if exchanged { [0, 2, 1] } else { [0, 1, 2] };
        let lines = order
            .iter()
            .enumerate()
            .map(|(l, &k)| LineLead {
                line: format!("L{}", l + 1),
                lead: board.lines[k].name(marking),
            })
            .collect();
        let used: Vec<Lead> = board.lines.iter().chain(board.linked).copied().collect();
        let open = (0..3)
            .flat_map(|p| [Lead::end(p), Lead::tap(p)])
            .filter(|l| !used.contains(l))
            .map(|l| l.name(marking))
            .collect::<Vec<_>>();
        SpeedConnection {
            poles,
            lines,
            joined: board.linked.iter().map(|l| l.name(marking)).collect(),
            open,
            lines_exchanged: exchanged,
            towards_rising_slots: rising != exchanged,
        }
    };
    let connections = vec![
        on_board(
            &pole_change::LOW_SPEED,
            low_speed.poles,
            exchange,
            low_rising,
        ),
        on_board(
            &pole_change::HIGH_SPEED,
            high_speed.poles,
            false,
            high_rising,
        ),
    ];
    Ok(SpeedsReport {
        design: header::of(w),
        pole_change: pc,
        duty,
        low_speed,
        high_speed,
        flux_ratio,
        connections,
        marking,
        spans,
        best_span,
    })
}

/// B(4p)/B(2p) for the connection from the fundamental factors at 4p (`low`) and 2p
/// (`high`): √3·k_w1(2p)/k_w1(4p) for series delta, k_w1(2p)/k_w1(4p) for series star.
pub fn flux_ratio(pc: PoleChange, low: f64, high: f64) -> f64 {
    let ratio = high / low;
    match pc {
        PoleChange::DeltaDoubleStar => 3f64.sqrt() * ratio,
        PoleChange::StarDoubleStar => ratio,
    }
}

/// Every span from 1 to the higher speed's pole pitch (whole slots), each synthesized at
/// the poles as laid out and judged there and at twice the poles; spans the synthesis
/// refuses are left out.
pub fn spans_at_both(w: &Winding) -> Vec<SpanAtBoth> {
    let Some(pc) = w.design.pole_change else {
        return Vec::new();
    };
    let pitch = w.geometry.slots / w.geometry.poles.max(1);
    (1..=pitch)
        .filter_map(|y| {
            let high = crate::winding::with_span(w, y).ok()?;
            let low = pole_change::at_double_poles(&high);
            let kh = factors::factors_at(&high, 0, Elec::FUNDAMENTAL)
                .winding
                .abs();
            let kl = factors::factors_at(&low, 0, Elec::FUNDAMENTAL)
                .winding
                .abs();
            let k2 = factors::factors_at(&low, 0, Elec(2.0)).winding.abs();
            Some(SpanAtBoth {
                span: y,
                low_speed_winding_factor: kl,
                high_speed_winding_factor: kh,
                smaller: kl.min(kh),
                low_speed_second_percent: if kl > 1e-9 {
                    100.0 * k2 / (2.0 * kl)
                } else {
                    0.0
                },
                flux_ratio: (kl > 1e-9).then(|| flux_ratio(pc, kl, kh)),
            })
        })
        .collect()
}

/// The span whose smaller k_w1 is largest; the shorter of equals (within 1e-12).
pub fn best_span(spans: &[SpanAtBoth]) -> Option<usize> {
    let mut best: Option<&SpanAtBoth> = None;
    for s in spans {
        if best.is_none_or(|b| s.smaller > b.smaller + 1e-12) {
            best = Some(s);
        }
    }
    best.map(|b| b.span)
}

/// Synchronous speed of `poles` poles at the supply's (or nameplate's) frequency, rpm:
/// n_s = 120·f/2p (common practice).
pub fn synchronous_rpm(w: &Winding, poles: usize) -> Option<f64> {
    w.design
        .supply
        .frequency_hz
        .or_else(|| w.design.nameplate.as_ref().and_then(|n| n.frequency_hz))
        .map(|hz| 120.0 * hz / poles as f64)
}
