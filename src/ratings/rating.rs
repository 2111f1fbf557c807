//! One row of the ratings table: the published limits and typical figures
//! of a valve type, with a note saying where they came from.

use serde::Serialize;
use std::path::PathBuf;

use super::class::{RectifierHeating, ValveClass};
use crate::units::{Amps, Ohms, Volts, Watts};

/// Where a row came from: the table built into the program, or a shop's own
/// ratings file (which added the row or corrected some of its figures).
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum RatingOrigin {
    Builtin,
    Shop(PathBuf),
}

/// A heater supply: the voltage it wants and the current it draws there.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Heater {
    pub voltage: Volts,
    pub current: Amps,
}

/// The ratings of one valve type.
///
/// Limits are the published absolute or design maximum figures; `mu`,
/// `plate_resistance` and `transconductance_ma_per_v` are typical figures at
/// a usual operating point. For multi-section valves (`sections` > 1) the
/// plate figures are per section.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Rating {
    /// The designation the row is listed under, e.g. `EL84`.
    pub name: String,
    /// Other designations for the same type, e.g. `6BQ5`.
    pub equivalents: Vec<String>,
    pub class: ValveClass,
    /// Identical valve units in one envelope (2 for a dual triode).
    pub sections: u8,
    /// Maximum plate dissipation, per section.
    pub plate_dissipation: Option<Watts>,
    /// A higher design-maximum plate dissipation some data gives beside the
    /// usual rating (the 6V6GT's 14 W).
    pub design_max_plate_dissipation: Option<Watts>,
    pub screen_dissipation: Option<Watts>,
    pub plate_voltage: Option<Volts>,
    pub screen_voltage: Option<Volts>,
    /// Maximum cathode current.
    pub cathode_current: Option<Amps>,
    /// Maximum DC output current of a rectifier.
    pub output_current: Option<Amps>,
    pub rectifier_heating: Option<RectifierHeating>,
    /// The heater as usually listed (for a centre-tapped heater, the two
    /// halves in series).
    pub heater_voltage: Volts,
    pub heater_current: Amps,
    /// A centre-tapped heater with its two halves in parallel (12AX7: 6.3 V
    /// 0.3 A), when the type has one.
    pub heater_parallel: Option<Heater>,
    /// Amplification factor μ (typical).
    pub mu: Option<f64>,
    /// Grid-to-screen amplification factor μg1g2 of a pentode or tetrode
    /// (typical; about the μ of the valve connected as a triode). The
    /// three-halves power law uses it for bias estimates.
    pub mu_g1g2: Option<f64>,
    /// Plate resistance ra (typical).
    pub plate_resistance: Option<Ohms>,
    /// Transconductance gm in mA/V (typical).
    pub transconductance_ma_per_v: Option<f64>,
    /// Where the figures came from, in the words of whoever wrote the row.
    pub source: String,
    pub origin: RatingOrigin,
}

impl Rating {
    /// The listed name followed by every equivalent designation.
    pub fn designations(&self) -> impl Iterator<Item = &str> {
        std::iter::once(self.name.as_str()).chain(self.equivalents.iter().map(String::as_str))
    }

    /// The listed heater as a [`Heater`].
    pub fn heater(&self) -> Heater {
        Heater {
            voltage: self.heater_voltage,
            current: self.heater_current,
        }
    }
}
