//! Choosing a flat primary's plate, clearance and current: every combination of the plate
//! thicknesses, metals, clearances and currents asked, each by the field of the finite
//! primary (`layers`: skin effect in thick plates, end effects of the finite primary), with
//! standstill thrust, peak thrust and its speed, and the plate's heat at standstill.

use crate::units::{Conductivity, Length};
use rayon::prelude::*;
use serde::Serialize;

use crate::layers::field_model;
use crate::thrust::{Feed, Input, ThrustError};
use crate::winding::Winding;

/// A plate metal as asked: a tabulated one, or a conductivity.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case", tag = "kind")]
pub enum Metal {
    /// IEC 60889 aluminium, 35.4 MS/m at 20 °C, α = 0.00403/K.
    Aluminium,
    /// IEC 60028 annealed copper, 58 MS/m at 20 °C, α = 0.00393/K.
    Copper,
    /// A conductivity at 20 °C, MS/m (aluminium's temperature coefficient).
    Conductivity {
        /// MS/m.
        #[serde(rename = "ms_m", serialize_with = "crate::units::in_ms_m")]
        conductivity: Conductivity,
    },
}

impl Metal {
    /// Conductivity at 20 °C, S/m, and temperature coefficient, 1/K.
    fn constants(self) -> (f64, f64) {
        match self {
            Metal::Aluminium => (
                crate::wire::PLATE_ALUMINIUM_S_M,
                crate::wire::ALUMINIUM.alpha_per_k,
            ),
            Metal::Copper => (
                crate::wire::COPPER.conductivity_s_m(),
                crate::wire::COPPER.alpha_per_k,
            ),
            Metal::Conductivity { conductivity } => {
                (conductivity.s_m(), crate::wire::ALUMINIUM.alpha_per_k)
            }
        }
    }
}

/// What to compare; an empty list keeps the layout's own value.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct PlateQuery {
    /// Plate thicknesses.
    pub thickness: Vec<Length>,
    /// Plate metals.
    pub metal: Vec<Metal>,
    /// Mechanical clearances.
    pub clearance: Vec<Length>,
    /// Phase currents, A r.m.s. (empty: fed from the supply voltage).
    pub current_a: Vec<f64>,
}

/// Speeds of each choice's curve: 41 slips from standstill to synchronism.
const CURVE_STEPS: usize = 40;

/// One combination and what the field model gives for it.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PlateChoice {
    /// Plate thickness, mm.
    #[serde(rename = "thickness_mm", serialize_with = "crate::units::in_mm")]
    pub thickness: Length,
    /// The metal as asked (null: the layout's plate).
    pub metal: Option<Metal>,
    /// Conductivity used, at the plate's temperature, MS/m.
    #[serde(rename = "conductivity_ms_m", serialize_with = "crate::units::in_ms_m")]
    pub conductivity: Conductivity,
    /// Mechanical clearance, mm.
    #[serde(rename = "clearance_mm", serialize_with = "crate::units::in_mm")]
    pub clearance: Length,
    /// Phase current fed, A (null: fed from the supply voltage).
    pub current_a: Option<f64>,
    /// Thrust at standstill, N.
    pub standstill_thrust_n: f64,
    /// Largest thrust from standstill to synchronism, N.
    pub peak_thrust_n: f64,
    /// Speed of the largest thrust, m/s.
    pub peak_speed_m_s: f64,
    /// The plate's (and backing's) heat at standstill, W.
    pub standstill_heat_w: f64,
    /// The same per cm² of plate under the primary.
    pub standstill_heat_w_cm2: Option<f64>,
    /// Largest phase current at standstill, A.
    pub standstill_current_a: f64,
    /// Thrust against speed, (m/s, N), standstill to synchronism.
    pub curve: Vec<(f64, f64)>,
    /// What this choice breaks: a saturating backing, the primary's current density at
    /// standstill (the field model's largest phase current).
    #[serde(skip)]
    pub warnings: Vec<crate::assumption::Assumption>,
    /// True when the field model's wavenumbers were bounded for this choice (its window or
    /// range short of what the inputs ask: see the thrust report's `FieldGridBounded`).
    pub grid_bounded: bool,
}

/// The comparison.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PlatesReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Title of the layout.
    pub title: Option<String>,
    /// Synchronous speed, m/s.
    pub synchronous_speed_m_s: f64,
    /// Every combination, in the order asked (thickness, metal, clearance, current).
    pub choices: Vec<PlateChoice>,
    /// True for a plate between two primaries: thrust and heat of both.
    pub double_sided: bool,
}

/// Why a comparison cannot be made, as typed facts worded by the presenters.
#[derive(Debug, thiserror::Error, Clone, PartialEq)]
pub enum PlatesError {
    /// The flat-primary models refused the layout or a combination.
    #[error(transparent)]
    Thrust(#[from] ThrustError),
    /// More combinations than the comparison takes.
    #[error("too many combinations ({0})")]
    TooMany(usize),
}

/// The most combinations one comparison takes.
pub const MAX_CHOICES: usize = 200;

/// Compare every combination asked on the flat primary `w`.
pub fn plates(w: &Winding, q: &PlateQuery) -> Result<PlatesReport, PlatesError> {
    let d = &w.design;
    let own = d.secondary;
    let own_t = own.map(|s| s.thickness);
    let thicknesses: Vec<Length> = if q.thickness.is_empty() {
        vec![own_t.ok_or(ThrustError::Missing(Input::Secondary))?]
    } else {
        q.thickness.clone()
    };
    let metals: Vec<Option<Metal>> = if q.metal.is_empty() {
        own.ok_or(ThrustError::Missing(Input::Secondary))?;
        vec![None]
    } else {
        q.metal.iter().copied().map(Some).collect()
    };
    let clearances: Vec<Length> = if q.clearance.is_empty() {
        vec![d.airgap.ok_or(ThrustError::Missing(Input::Airgap))?]
    } else {
        q.clearance.clone()
    };
    let currents: Vec<Option<f64>> = if q.current_a.is_empty() {
        vec![None]
    } else {
        q.current_a.iter().copied().map(Some).collect()
    };
    let count = thicknesses.len() * metals.len() * clearances.len() * currents.len();
    if count > MAX_CHOICES {
        return Err(PlatesError::TooMany(count));
    }
    let mut combos = Vec::with_capacity(count);
    for t in &thicknesses {
        for m in &metals {
            for g in &clearances {
                for i in &currents {
                    combos.push((*t, *m, *g, *i));
                }
            }
        }
    }
    let slips: Vec<f64> = (0..=CURVE_STEPS)
        .map(|k| 1.0 - k as f64 / CURVE_STEPS as f64)
        .collect();
    let choices: Result<Vec<PlateChoice>, ThrustError> = combos
        .par_iter()
        .map(|&(t, metal, g, current)| {
            let mut w2 = w.clone();
            let mut sec = own.unwrap_or(crate::design::Secondary {
                conductivity_s_m: crate::wire::PLATE_ALUMINIUM_S_M,
                thickness: t,
                width: None,
                back_iron: true,
                temperature_c: 20.0,
                alpha_per_k: crate::wire::ALUMINIUM.alpha_per_k,
                backing: None,
            });
            sec.thickness = t;
            if let Some(m) = metal {
                (sec.conductivity_s_m, sec.alpha_per_k) = m.constants();
            }
            w2.design.secondary = Some(sec);
            w2.design.airgap = Some(g);
            let feed = match current {
                Some(i) => Feed::Current { phase_current_a: i },
                None => Feed::Voltage {
                    phase_voltage_v: d.connection.phase_voltage(
                        d.supply
                            .line_voltage_v
                            .ok_or(ThrustError::Missing(Input::LineVoltage))?,
                    ),
                },
            };
            let fm = field_model(&w2, feed, &slips)?;
            let still = &fm.rows[0];
            let largest = still.phase_currents_a.iter().copied().fold(0.0, f64::max);
            let md = crate::thrust::model(&w2)?;
            let warnings: Vec<crate::assumption::Assumption> =
                crate::thrust::backing_saturation(&w2, &md, feed)
                    .into_iter()
                    .chain(crate::thrust::current_density(&w2, largest, 1.0))
                    .collect();
            let vs = fm.rows.last().map_or(0.0, |r| r.speed_m_s);
            let area = crate::thrust::plate_area_under(&w2).filter(|a| a.m2() > 0.0);
            Ok(PlateChoice {
                thickness: t,
                metal,
                conductivity: Conductivity::from_s_m(sec.conductivity_hot_s_m()),
                clearance: g,
                current_a: current,
                standstill_thrust_n: still.thrust_n,
                peak_thrust_n: fm.max_thrust_n,
                peak_speed_m_s: (1.0 - fm.max_thrust_slip) * vs,
                standstill_heat_w: still.secondary_loss_w,
                standstill_heat_w_cm2: area.map(|a| still.secondary_loss_w / a.cm2()),
                standstill_current_a: still.phase_currents_a.iter().copied().fold(0.0, f64::max),
                warnings,
                grid_bounded: fm.window_wanted_m > fm.window_m * (1.0 + 1e-9),
                curve: fm.rows.iter().map(|r| (r.speed_m_s, r.thrust_n)).collect(),
            })
        })
        .collect();
    let choices = choices?;
    Ok(PlatesReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        synchronous_speed_m_s: w
            .pole_pitch()
            .map(Length::m)
            .zip(d.supply.frequency_hz)
            .map_or(0.0, |(tau, f)| 2.0 * f * tau),
        choices,
        double_sided: own.is_some_and(|s| !s.back_iron),
    })
}
