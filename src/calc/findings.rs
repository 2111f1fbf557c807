//! The derived figures: what the calculation pass hands to every report.
//! Serialised as the `calc --json` output, so field names are stable,
//! snake_case and end in their unit.

use serde::{Serialize, Serializer};

use super::status::{Status, Verdict};

/// JSON schema version of [`Findings`].
pub const SCHEMA: u32 = 1;

/// Rounds a figure for output so float noise does not reach the JSON.
pub(crate) fn round6<S: Serializer>(v: &f64, s: S) -> Result<S::Ok, S::Error> {
    s.serialize_f64(tidy(*v))
}

pub(crate) fn round6_opt<S: Serializer>(v: &Option<f64>, s: S) -> Result<S::Ok, S::Error> {
    match v {
        Some(v) => s.serialize_some(&tidy(*v)),
        None => s.serialize_none(),
    }
}

/// Six significant figures.
pub fn tidy(v: f64) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    crate::units::round_sig(v, 6)
}

#[derive(Debug, Clone, Serialize)]
pub struct Findings {
    pub schema: u32,
    pub job: JobSummary,
    pub mains: MainsFigures,
    pub settings: SettingsUsed,
    pub sets: Vec<SetFindings>,
    pub safety: Vec<SafetyFinding>,
    /// Each modification with the circuit figures worked out for it.
    pub mods: Vec<ModFindings>,
    /// Worst status per check family, for the last measurement set and the
    /// safety tests.
    pub at_a_glance: Vec<FamilyStatus>,
    /// Every figure that is not ok, and every data problem, in plain sentences.
    pub warnings: Vec<Warning>,
    /// Each valve type the job uses, with the source note of its ratings.
    pub ratings_used: Vec<RatingUsed>,
}

#[derive(Debug, Clone, Serialize)]
pub struct JobSummary {
    pub id: String,
    pub source: String,
    pub format_version: u32,
}

#[derive(Debug, Clone, Serialize)]
pub struct MainsFigures {
    #[serde(serialize_with = "round6")]
    pub nominal_volts: f64,
    #[serde(serialize_with = "round6")]
    pub tolerance_pct: f64,
    #[serde(serialize_with = "round6")]
    pub high_line_volts: f64,
    #[serde(serialize_with = "round6_opt")]
    pub design_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub frequency_hz: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct SettingsUsed {
    pub fixed_bias_low_pct: f64,
    pub fixed_bias_high_pct: f64,
    pub cathode_bias_caution_pct: f64,
    pub resistor_derating_pct: f64,
    pub capacitor_margin_pct: f64,
    pub heater_tolerance_pct: f64,
    pub node_tolerance_pct: f64,
    pub silicon_drop_volts: f64,
    pub voltage_over_pct: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct SetFindings {
    pub label: String,
    #[serde(serialize_with = "round6")]
    pub mains_volts: f64,
    /// Vn / Vm, the factor applied to voltages for the corrected figures.
    #[serde(serialize_with = "round6")]
    pub correction_factor: f64,
    pub date: Option<String>,
    pub valves: Vec<ValveFindings>,
    pub nodes: Vec<NodeFindings>,
    pub droppers: Vec<ResistorFindings>,
    pub cathode_resistors: Vec<ResistorFindings>,
    pub screen_resistors: Vec<ResistorFindings>,
    pub filter_capacitors: Vec<CapacitorFindings>,
    /// A valve rectifier's load against its rating, where it can be judged.
    pub rectifier: Option<RectifierFindings>,
    pub heaters: Vec<HeaterFindings>,
}

/// A valve rectifier's DC load. Only the output valves' cathode currents
/// are summed, so the figure is a lower bound of the real load.
#[derive(Debug, Clone, Serialize)]
pub struct RectifierFindings {
    pub position: String,
    pub valve_type: String,
    #[serde(serialize_with = "round6")]
    pub load_at_least_ma: f64,
    #[serde(serialize_with = "round6")]
    pub rating_ma: f64,
    #[serde(serialize_with = "round6")]
    pub load_pct: f64,
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// How the idle current was found.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum CurrentMethod {
    SharedCathodeResistor,
    OwnCathodeResistor,
    SenseResistor,
    TransformerResistance,
    Shunt,
    Probe,
}

impl CurrentMethod {
    pub fn words(self) -> &'static str {
        match self {
            CurrentMethod::SharedCathodeResistor => "shared cathode resistor",
            CurrentMethod::OwnCathodeResistor => "own cathode resistor",
            CurrentMethod::SenseResistor => "sense resistor",
            CurrentMethod::TransformerResistance => "transformer resistance",
            CurrentMethod::Shunt => "shunt across half primary",
            CurrentMethod::Probe => "bias probe",
        }
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct ValveFindings {
    pub position: String,
    /// The type as written in the job.
    pub valve_type: String,
    /// The ratings row it resolved to.
    pub rating_name: String,
    pub role: String,
    pub is_output: bool,
    /// "cathode" or "fixed".
    pub bias: String,
    pub method: Option<CurrentMethod>,
    /// The other valves sharing the cathode resistor or half primary the
    /// current was found from (the matched-valve assumption applies).
    pub current_shared_with: Vec<String>,
    #[serde(serialize_with = "round6_opt")]
    pub plate_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub screen_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub cathode_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub grid_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub cathode_current_ma: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub screen_current_ma: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub plate_current_ma: Option<f64>,
    /// True when the plate current includes the screen current (Ia = Ik):
    /// the dissipation figure is then on the high side.
    pub plate_current_includes_screen: bool,
    #[serde(serialize_with = "round6_opt")]
    pub plate_dissipation_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub plate_dissipation_max_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub plate_dissipation_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub corrected_plate_dissipation_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub corrected_plate_dissipation_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub high_line_plate_dissipation_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub high_line_plate_dissipation_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub screen_dissipation_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub screen_dissipation_max_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub screen_dissipation_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub plate_voltage_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub screen_voltage_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub cathode_current_pct: Option<f64>,
    /// The fixed-bias target window, where it applies.
    pub target_window: Option<TargetWindow>,
    /// The worst of `checks`.
    pub status: Status,
    pub checks: Vec<Check>,
}

/// One named check of a figure against a limit.
#[derive(Debug, Clone, Serialize)]
pub struct Check {
    pub check: &'static str,
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// The idle current that puts a fixed-bias valve inside its aim, as the
/// technician reads it.
#[derive(Debug, Clone, Serialize)]
pub struct TargetWindow {
    pub low_pct: f64,
    pub high_pct: f64,
    #[serde(serialize_with = "round6")]
    pub plate_current_low_ma: f64,
    #[serde(serialize_with = "round6")]
    pub plate_current_high_ma: f64,
    /// Millivolts across the sense resistor (includes the screen current
    /// where it is known).
    #[serde(serialize_with = "round6_opt")]
    pub sense_low_mv: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub sense_high_mv: Option<f64>,
    /// Volts across the half primary feeding this valve (and any valve
    /// sharing it).
    #[serde(serialize_with = "round6_opt")]
    pub primary_drop_low_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub primary_drop_high_volts: Option<f64>,
    /// Cathode current for a bias probe.
    #[serde(serialize_with = "round6_opt")]
    pub probe_low_ma: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub probe_high_ma: Option<f64>,
    /// Whether the current is inside the window now.
    pub inside: bool,
    /// "inside", "above" or "below" the window.
    pub place: &'static str,
    /// The sense resistor the millivolt figures are read across, and the
    /// millivolts it shows now.
    #[serde(serialize_with = "round6_opt")]
    pub sense_resistor_ohms: Option<f64>,
    pub sense_resistor_reference: Option<String>,
    #[serde(serialize_with = "round6_opt")]
    pub sense_now_mv: Option<f64>,
    /// The half primary the drop figures are read across, the other valves
    /// it feeds, and the drop it shows now.
    #[serde(serialize_with = "round6_opt")]
    pub half_primary_ohms: Option<f64>,
    pub half_primary_shared_with: Vec<String>,
    #[serde(serialize_with = "round6_opt")]
    pub primary_drop_now_volts: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct NodeFindings {
    pub name: String,
    pub label: Option<String>,
    #[serde(serialize_with = "round6")]
    pub measured_volts: f64,
    #[serde(serialize_with = "round6")]
    pub corrected_volts: f64,
    #[serde(serialize_with = "round6_opt")]
    pub chart_volts: Option<f64>,
    /// The chart figure referred to nominal mains.
    #[serde(serialize_with = "round6_opt")]
    pub expected_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub deviation_pct: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub tolerance_pct: f64,
    #[serde(serialize_with = "round6")]
    pub high_line_volts: f64,
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// A resistor's dissipation: droppers, cathode and screen resistors.
#[derive(Debug, Clone, Serialize)]
pub struct ResistorFindings {
    pub reference: String,
    /// What it sits between, in words ("B+1 to B+2", "V3, V4 cathodes").
    pub place: String,
    #[serde(serialize_with = "round6")]
    pub resistance_ohms: f64,
    #[serde(serialize_with = "round6_opt")]
    pub rating_w: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub voltage_volts: f64,
    #[serde(serialize_with = "round6")]
    pub current_ma: f64,
    #[serde(serialize_with = "round6")]
    pub power_w: f64,
    #[serde(serialize_with = "round6_opt")]
    pub power_pct: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub high_line_power_w: f64,
    #[serde(serialize_with = "round6_opt")]
    pub high_line_power_pct: Option<f64>,
    #[serde(flatten)]
    pub verdict: Verdict,
}

#[derive(Debug, Clone, Serialize)]
pub struct CapacitorFindings {
    pub reference: String,
    pub node: String,
    #[serde(serialize_with = "round6_opt")]
    pub capacitance_uf: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub rating_volts: f64,
    #[serde(serialize_with = "round6_opt")]
    pub measured_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub high_line_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub cold_start_peak_volts: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub highest_volts: f64,
    #[serde(serialize_with = "round6")]
    pub margin_pct: f64,
    #[serde(flatten)]
    pub verdict: Verdict,
}

#[derive(Debug, Clone, Serialize)]
pub struct HeaterFindings {
    pub label: Option<String>,
    #[serde(serialize_with = "round6")]
    pub measured_volts: f64,
    #[serde(serialize_with = "round6")]
    pub nominal_volts: f64,
    #[serde(serialize_with = "round6")]
    pub corrected_volts: f64,
    #[serde(serialize_with = "round6")]
    pub deviation_pct: f64,
    #[serde(serialize_with = "round6")]
    pub corrected_deviation_pct: f64,
    #[serde(flatten)]
    pub verdict: Verdict,
}

#[derive(Debug, Clone, Serialize)]
pub struct SafetyFinding {
    pub test: &'static str,
    /// The reading in words with its unit ("0.08 Ω").
    pub measured: String,
    pub limit: String,
    #[serde(serialize_with = "round6")]
    pub measured_value: f64,
    #[serde(serialize_with = "round6")]
    pub limit_value: f64,
    /// SI unit of the two values.
    pub unit: &'static str,
    pub passed: bool,
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// Check families shown at a glance.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Family {
    OutputValves,
    SupplyVoltages,
    StressedParts,
    Heater,
    SafetyTests,
}

impl Family {
    pub const ALL: [Family; 5] = [
        Family::OutputValves,
        Family::SupplyVoltages,
        Family::StressedParts,
        Family::Heater,
        Family::SafetyTests,
    ];

    pub fn words(self) -> &'static str {
        match self {
            Family::OutputValves => "Output valves against their ratings",
            Family::SupplyVoltages => "Supply voltages against the chart",
            Family::StressedParts => "Stressed resistors, capacitors and rectifier",
            Family::Heater => "Heater supply",
            Family::SafetyTests => "Electrical safety tests",
        }
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct FamilyStatus {
    pub family: Family,
    pub title: &'static str,
    pub status: Status,
    /// The worst figure in words, or why there is none.
    pub worst: String,
    /// Whether anything in this family was measured.
    pub measured: bool,
}

#[derive(Debug, Clone, Serialize)]
pub struct Warning {
    /// The measurement set, or none for job-wide warnings.
    pub set: Option<String>,
    /// What it is about: "V3", "R24", "B+1", "safety".
    pub subject: String,
    pub status: Status,
    pub message: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct RatingUsed {
    pub name: String,
    pub equivalents: Vec<String>,
    pub class: String,
    pub source: String,
    /// "built in" or the shop file's path.
    pub origin: String,
    pub positions: Vec<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ModFindings {
    pub what: String,
    pub figures: Vec<ModFigureFindings>,
    /// The mod's network worked out, if it has one.
    pub network: Option<super::network::NetworkFindings>,
}

/// One worked-out figure for a modification, with the formula used.
#[derive(Debug, Clone, Serialize)]
pub struct ModFigureFindings {
    /// `rc_corner`, `cathode_bypass`, `stage_gain`, `phase_shift`.
    pub kind: &'static str,
    /// The figure in words, for a page.
    pub description: String,
    pub formula: &'static str,
    #[serde(serialize_with = "round6_opt")]
    pub frequency_hz: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub gain: Option<f64>,
}
