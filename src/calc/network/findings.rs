//! What the network pass hands to the reports: the sampled curves, the
//! quoted figures and the phase-shift rates, serialised into `calc --json`
//! under each mod's `network`. Field names end in their unit.

use serde::{Serialize, Serializer};

use super::features::CornerKind;
use crate::calc::findings::{round6, round6_opt, tidy};

fn round6_vec<S: Serializer>(v: &[f64], s: S) -> Result<S::Ok, S::Error> {
    s.collect_seq(v.iter().map(|x| tidy(*x)))
}

/// A mod's network worked out.
#[derive(Debug, Clone, Serialize)]
pub struct NetworkFindings {
    pub label: Option<String>,
    /// Points per decade of the sweep.
    pub points_per_decade: u32,
    /// The sweep's frequencies; every curve is sampled at these.
    #[serde(serialize_with = "round6_vec")]
    pub frequencies_hz: Vec<f64>,
    /// The source as it drives the network before (and after, if the mod
    /// changes it).
    pub sources: Vec<SourceFindings>,
    pub load_node: String,
    #[serde(serialize_with = "round6_opt")]
    pub load_ohms: Option<f64>,
    /// The mod's edits, in words.
    pub edits: Vec<String>,
    /// One curve per state and setting: before first, then after.
    pub curves: Vec<CurveFindings>,
    /// After minus before at the spot frequencies, per setting.
    pub changes: Vec<ChangeFindings>,
    /// The phase-shift rate per state, when the network asks for it.
    pub oscillator: Vec<OscillatorFindings>,
    /// Why the network could not be worked out, if it could not.
    pub problem: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct SourceFindings {
    /// "before" or "after".
    pub state: &'static str,
    pub node: String,
    /// The source in words, with how its impedance was found.
    pub description: String,
    /// Output impedance; none for an ideal source.
    #[serde(serialize_with = "round6_opt")]
    pub impedance_ohms: Option<f64>,
    pub valve: Option<String>,
    /// The valve stage's own gain (not included in the curves, which are
    /// relative to the stage's open-circuit output).
    #[serde(serialize_with = "round6_opt")]
    pub stage_gain: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct PotSetting {
    pub reference: String,
    /// The knob's name on the panel, when the job gives one.
    pub label: Option<String>,
    #[serde(serialize_with = "round6")]
    pub setting: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct CurveFindings {
    /// "before" or "after".
    pub state: &'static str,
    /// The network setting, counted from 1.
    pub setting: usize,
    pub pots: Vec<PotSetting>,
    /// Magnitude at the load per volt of source EMF, dB (floored at −300).
    #[serde(serialize_with = "round6_vec")]
    pub magnitude_db: Vec<f64>,
    /// Phase at the load, degrees in (−180, 180].
    #[serde(serialize_with = "round6_vec")]
    pub phase_deg: Vec<f64>,
    #[serde(serialize_with = "round6")]
    pub gain_100hz_db: f64,
    #[serde(serialize_with = "round6")]
    pub gain_1khz_db: f64,
    #[serde(serialize_with = "round6")]
    pub gain_5khz_db: f64,
    /// The highest point of the sweep.
    #[serde(serialize_with = "round6")]
    pub max_db: f64,
    #[serde(serialize_with = "round6")]
    pub max_hz: f64,
    /// Where the curve crosses 3.01 dB below its highest point.
    pub corners: Vec<CornerFindings>,
    /// The deepest dip of at least 2 dB below both shoulders.
    pub scoop: Option<ScoopFindings>,
}

#[derive(Debug, Clone, Serialize)]
pub struct CornerFindings {
    #[serde(serialize_with = "round6")]
    pub frequency_hz: f64,
    pub kind: CornerKind,
}

#[derive(Debug, Clone, Serialize)]
pub struct ScoopFindings {
    #[serde(serialize_with = "round6")]
    pub frequency_hz: f64,
    #[serde(serialize_with = "round6")]
    pub gain_db: f64,
    #[serde(serialize_with = "round6")]
    pub depth_db: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct ChangeFindings {
    /// The after setting compared (the before setting is the same, or the
    /// only one).
    pub setting: usize,
    #[serde(serialize_with = "round6")]
    pub change_100hz_db: f64,
    #[serde(serialize_with = "round6")]
    pub change_1khz_db: f64,
    #[serde(serialize_with = "round6")]
    pub change_5khz_db: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct OscillatorFindings {
    /// "before" or "after".
    pub state: &'static str,
    /// The pot swept over 0–10, if the network names one.
    pub speed_pot: Option<String>,
    pub points: Vec<OscillatorPoint>,
}

#[derive(Debug, Clone, Serialize)]
pub struct OscillatorPoint {
    /// The speed pot's setting, or the network setting (from 1) when
    /// there is no speed pot.
    #[serde(serialize_with = "round6")]
    pub setting: f64,
    /// Where the phase is 180°; none when it never gets there.
    #[serde(serialize_with = "round6_opt")]
    pub frequency_hz: Option<f64>,
    /// |H| there, as a ratio.
    #[serde(serialize_with = "round6_opt")]
    pub attenuation: Option<f64>,
    /// The gain the stage needs to keep the loop going: 1 / attenuation.
    #[serde(serialize_with = "round6_opt")]
    pub gain_needed: Option<f64>,
}
