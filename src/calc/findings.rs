//! The derived figures: what the calculation pass hands to every report.
//! Serialised as the `calc --json` output, so field names are stable,
//! snake_case and end in their unit.

use serde::{Serialize, Serializer};

use super::status::{Status, Verdict};

/// JSON schema version of [`Findings`].
pub const SCHEMA: u32 = 3;

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
    /// The unit as the job describes it.
    pub unit: UnitFindings,
    pub mains: MainsFigures,
    pub settings: SettingsUsed,
    /// The label of the set the unit is handed over in (the one marked
    /// `final`, else the last); the at-a-glance panel and `--strict`
    /// judge it.
    pub final_set: Option<String>,
    pub sets: Vec<SetFindings>,
    pub safety: Vec<SafetyFinding>,
    /// The parts replaced, as the job lists them.
    pub parts: Vec<PartFindings>,
    /// Each modification with the circuit figures worked out for it.
    pub mods: Vec<ModFindings>,
    /// Worst status per check family that still counts (not ok and not
    /// accepted), for the final measurement set and the safety tests.
    pub at_a_glance: Vec<FamilyStatus>,
    /// Every figure that is not ok, and every data problem, in plain sentences.
    pub warnings: Vec<Warning>,
    /// Each valve type the job uses, with the source note of its ratings.
    pub ratings_used: Vec<RatingUsed>,
    /// The valve line-up, with any type a set fits instead.
    pub line_up: Vec<LineUpFindings>,
}

/// One position of the line-up.
#[derive(Debug, Clone, Serialize)]
pub struct LineUpFindings {
    pub position: String,
    /// The type as the line-up gives it.
    pub valve_type: String,
    /// The ratings row it resolved to.
    pub rating_name: Option<String>,
    pub role: String,
    pub channel: Option<String>,
    /// Sets that fit another type here, in file order.
    pub changes: Vec<TypeChangeFindings>,
}

#[derive(Debug, Clone, Serialize)]
pub struct TypeChangeFindings {
    pub set: String,
    pub valve_type: String,
    pub rating_name: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct JobSummary {
    pub id: String,
    /// The job file's name, without the folders it was given with.
    pub source: String,
    pub format_version: u32,
    /// The SHA-256 of the job file's bytes, in hex; set by the command
    /// that read the file (none when the findings were made from text).
    pub file_sha256: Option<String>,
    /// Where the job file stands in git, when it is in a repository.
    pub git: Option<crate::git::Revision>,
}

/// The unit, as the job describes it.
#[derive(Debug, Clone, Serialize)]
pub struct UnitFindings {
    pub make: String,
    pub model: String,
    pub serial: Option<String>,
    pub year: Option<i32>,
    pub description: Option<String>,
    pub condition: Option<String>,
    #[serde(serialize_with = "round6_opt")]
    pub rated_power_w: Option<f64>,
}

/// A part replaced, as the job lists it.
#[derive(Debug, Clone, Serialize)]
pub struct PartFindings {
    pub reference: Option<String>,
    pub what: Option<String>,
    pub was: Option<String>,
    pub now: Option<String>,
    pub reason: Option<String>,
    pub original_kept: Option<bool>,
    /// The reason is the shop's alone (never in a listing).
    pub private: bool,
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
    #[serde(serialize_with = "round6")]
    pub fixed_bias_low_pct: f64,
    #[serde(serialize_with = "round6")]
    pub fixed_bias_high_pct: f64,
    #[serde(serialize_with = "round6")]
    pub cathode_bias_caution_pct: f64,
    #[serde(serialize_with = "round6")]
    pub resistor_derating_pct: f64,
    #[serde(serialize_with = "round6")]
    pub capacitor_margin_pct: f64,
    #[serde(serialize_with = "round6")]
    pub heater_tolerance_pct: f64,
    #[serde(serialize_with = "round6")]
    pub node_tolerance_pct: f64,
    #[serde(serialize_with = "round6")]
    pub silicon_drop_volts: f64,
    #[serde(serialize_with = "round6")]
    pub voltage_over_pct: f64,
    #[serde(serialize_with = "round6")]
    pub output_power_caution_pct: f64,
    #[serde(serialize_with = "round6")]
    pub hum_noise_caution_db: f64,
    #[serde(serialize_with = "round6")]
    pub cathode_bias_target_pct: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct SetFindings {
    pub label: String,
    /// The state the unit is handed over in.
    pub is_final: bool,
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
    /// Droppers and filter capacitors that could not be checked in this
    /// set, and why ("B+3 not measured").
    pub not_checked: Vec<NotChecked>,
    /// Where the bias controls were set.
    pub bias_controls: Vec<crate::job::BiasControl>,
    /// Idle current at times during a warm-up, by valve then time.
    pub warm_up: Vec<WarmUpPoint>,
    /// Output power, hum and noise, response and gain read on the bench.
    pub bench: BenchFindings,
    /// Cathode resistors that would bring the plate dissipation to the
    /// target share, estimated from the three-halves power law.
    pub cathode_resistor_suggestions: Vec<CathodeResistorSuggestion>,
}

/// A valve's idle current at a time since power-on.
#[derive(Debug, Clone, Serialize)]
pub struct WarmUpPoint {
    pub position: String,
    #[serde(serialize_with = "round6")]
    pub minutes: f64,
    /// The current used for the plate dissipation (plate current, or the
    /// cathode current when `includes_screen`).
    #[serde(serialize_with = "round6_opt")]
    pub current_ma: Option<f64>,
    pub includes_screen: bool,
    #[serde(serialize_with = "round6_opt")]
    pub plate_dissipation_pct: Option<f64>,
}

/// A part whose figures this set's readings cannot give.
#[derive(Debug, Clone, Serialize)]
pub struct NotChecked {
    pub reference: String,
    /// `dropper` or `filter_capacitor`.
    pub kind: &'static str,
    /// Where it sits: "B+2 to B+3", "B+3".
    pub place: String,
    /// Why: "B+3 not measured".
    pub reason: String,
}

/// The bench tests of one measurement set.
#[derive(Debug, Clone, Default, Serialize)]
pub struct BenchFindings {
    pub output_power: Vec<OutputPowerFindings>,
    pub hum_noise: Vec<HumNoiseFindings>,
    pub responses: Vec<ResponseFindings>,
    pub gains: Vec<GainFindings>,
}

impl BenchFindings {
    pub fn is_empty(&self) -> bool {
        self.output_power.is_empty()
            && self.hum_noise.is_empty()
            && self.responses.is_empty()
            && self.gains.is_empty()
    }
}

/// Output power into a dummy load: P = V²rms / R.
#[derive(Debug, Clone, Serialize)]
pub struct OutputPowerFindings {
    pub channel: Option<String>,
    /// How the voltage was read: `rms` or `peak_to_peak`.
    pub reading: crate::job::AcReading,
    /// The voltage as read.
    #[serde(serialize_with = "round6")]
    pub reading_volts: f64,
    /// RMS volts (Vpp / (2√2) for a peak-to-peak reading of a sine).
    #[serde(serialize_with = "round6")]
    pub rms_volts: f64,
    #[serde(serialize_with = "round6")]
    pub load_ohms: f64,
    #[serde(serialize_with = "round6")]
    pub frequency_hz: f64,
    /// `clipping`, `distortion` or `drive`.
    pub condition: &'static str,
    #[serde(serialize_with = "round6_opt")]
    pub distortion_pct: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub drive_volts: Option<f64>,
    /// "at the onset of clipping", "at 5 % distortion", "with 500 mV drive".
    pub condition_words: String,
    #[serde(serialize_with = "round6")]
    pub output_power_w: f64,
    #[serde(serialize_with = "round6_opt")]
    pub rated_power_w: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub output_power_pct_of_rated: Option<f64>,
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// Hum and noise across the load with no signal.
#[derive(Debug, Clone, Serialize)]
pub struct HumNoiseFindings {
    pub channel: Option<String>,
    /// `shorted` or `open`.
    pub input: &'static str,
    pub volume: Option<String>,
    #[serde(serialize_with = "round6")]
    pub load_ohms: f64,
    #[serde(serialize_with = "round6")]
    pub hum_noise_mv: f64,
    /// 20·log10(V / 1 V).
    #[serde(serialize_with = "round6")]
    pub hum_noise_dbv: f64,
    /// The full output compared with, as RMS volts across this load.
    #[serde(serialize_with = "round6_opt")]
    pub full_output_volts: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub full_output_w: Option<f64>,
    /// `measured` (an output-power reading of the set) or `rated`.
    pub full_output_from: Option<&'static str>,
    /// −20·log10(Vnoise / Vfull): positive when the noise is below full output.
    #[serde(serialize_with = "round6_opt")]
    pub hum_noise_db_below_full: Option<f64>,
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// A frequency response against its reference frequency.
#[derive(Debug, Clone, Serialize)]
pub struct ResponseFindings {
    pub channel: Option<String>,
    #[serde(serialize_with = "round6_opt")]
    pub load_ohms: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub input_volts: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub reference_hz: f64,
    #[serde(serialize_with = "round6")]
    pub reference_volts: f64,
    #[serde(serialize_with = "round6")]
    pub lowest_hz: f64,
    #[serde(serialize_with = "round6")]
    pub highest_hz: f64,
    /// In order of frequency.
    pub points: Vec<ResponsePointFindings>,
    /// Where the response crosses −3 dB below and above the reference,
    /// interpolated on a log-frequency axis; null when the readings do not
    /// fall to −3 dB on that side.
    #[serde(serialize_with = "round6_opt")]
    pub minus_3db_low_hz: Option<f64>,
    #[serde(serialize_with = "round6_opt")]
    pub minus_3db_high_hz: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ResponsePointFindings {
    #[serde(serialize_with = "round6")]
    pub frequency_hz: f64,
    #[serde(serialize_with = "round6")]
    pub output_volts: f64,
    /// 20·log10(V / Vref).
    #[serde(serialize_with = "round6")]
    pub response_db: f64,
}

/// Input volts for an output reading.
#[derive(Debug, Clone, Serialize)]
pub struct GainFindings {
    pub channel: Option<String>,
    #[serde(serialize_with = "round6")]
    pub frequency_hz: f64,
    #[serde(serialize_with = "round6_opt")]
    pub load_ohms: Option<f64>,
    #[serde(serialize_with = "round6")]
    pub input_volts: f64,
    #[serde(serialize_with = "round6")]
    pub output_volts: f64,
    /// Vout / Vin.
    #[serde(serialize_with = "round6")]
    pub gain_times: f64,
    /// 20·log10(Vout / Vin).
    #[serde(serialize_with = "round6")]
    pub gain_db: f64,
}

/// A cathode resistor that would put the plate dissipation at the target
/// share of its rating: an estimate from the three-halves power law,
/// calibrated at one measured point.
#[derive(Debug, Clone, Serialize)]
pub struct CathodeResistorSuggestion {
    pub reference: String,
    /// The valves sharing the resistor.
    pub valves: Vec<String>,
    /// The valve whose readings calibrate the law (the hottest on the
    /// resistor).
    pub calibrated_on: String,
    pub valve_type: String,
    /// `asked` (the set asks for it) or `above_guide` (a valve on the
    /// resistor is above the cathode-bias caution guide).
    pub why: &'static str,
    /// The grid-to-screen amplification factor used (the triode μ for a
    /// power triode).
    #[serde(serialize_with = "round6")]
    pub mu_g1g2: f64,
    /// K in Ik = K·(Vg2k/μg1g2 + Vgk)^(3/2), in mA per V^(3/2).
    #[serde(serialize_with = "round6")]
    pub law_constant_ma_per_v1_5: f64,
    #[serde(serialize_with = "round6")]
    pub present_ohms: f64,
    #[serde(serialize_with = "round6")]
    pub present_cathode_volts: f64,
    #[serde(serialize_with = "round6")]
    pub present_cathode_current_ma: f64,
    #[serde(serialize_with = "round6")]
    pub present_plate_dissipation_w: f64,
    #[serde(serialize_with = "round6")]
    pub present_plate_dissipation_pct: f64,
    #[serde(serialize_with = "round6")]
    pub target_pct: f64,
    #[serde(serialize_with = "round6")]
    pub target_plate_dissipation_w: f64,
    /// The resistance the law gives for the target; null when no cathode
    /// resistor can bring the valve up to it.
    #[serde(serialize_with = "round6_opt")]
    pub exact_ohms: Option<f64>,
    /// True when the plate current is taken as the cathode current.
    pub plate_current_includes_screen: bool,
    /// The nearest E12 and E24 values and what each would give.
    pub options: Vec<CathodeResistorOption>,
}

/// One preferred value for a cathode resistor and its estimated result.
#[derive(Debug, Clone, Serialize)]
pub struct CathodeResistorOption {
    /// `E12` or `E24`.
    pub series: String,
    #[serde(serialize_with = "round6")]
    pub resistance_ohms: f64,
    #[serde(serialize_with = "round6")]
    pub cathode_volts: f64,
    /// Per valve.
    #[serde(serialize_with = "round6")]
    pub cathode_current_ma: f64,
    #[serde(serialize_with = "round6")]
    pub plate_dissipation_w: f64,
    #[serde(serialize_with = "round6")]
    pub plate_dissipation_pct: f64,
    /// Vk² / Rk.
    #[serde(serialize_with = "round6")]
    pub resistor_power_w: f64,
    /// At least twice the power (common practice).
    #[serde(serialize_with = "round6")]
    pub resistor_rating_at_least_w: f64,
    /// The smallest usual power rating at or above that.
    #[serde(serialize_with = "round6")]
    pub resistor_rating_w: f64,
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
    /// The catalogue key of the method in words.
    pub fn key(self) -> &'static str {
        match self {
            CurrentMethod::SharedCathodeResistor => "method-shared-cathode-resistor",
            CurrentMethod::OwnCathodeResistor => "method-own-cathode-resistor",
            CurrentMethod::SenseResistor => "method-sense-resistor",
            CurrentMethod::TransformerResistance => "method-transformer-resistance",
            CurrentMethod::Shunt => "method-shunt",
            CurrentMethod::Probe => "method-probe",
        }
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct ValveFindings {
    pub position: String,
    /// The type as written in the job (the set's own type where it fits
    /// another).
    pub valve_type: String,
    /// The amplifier channel, where the job gives one.
    pub channel: Option<String>,
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
    /// The worst of the checks that still count (not accepted).
    pub open_status: Status,
    pub checks: Vec<Check>,
}

impl ValveFindings {
    /// Works `open_status` out again after checks were accepted.
    pub(crate) fn refresh_open_status(&mut self) {
        self.open_status = super::status::worst_open(self.checks.iter().map(|c| &c.verdict));
    }
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
    #[serde(serialize_with = "round6")]
    pub low_pct: f64,
    #[serde(serialize_with = "round6")]
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
    /// Plate current at the middle of the window.
    #[serde(serialize_with = "round6")]
    pub plate_current_middle_ma: f64,
    /// The grid voltage to ground estimated to bring the current to the
    /// middle of the window (three-halves power law calibrated at the
    /// measured point); null without a grid reading or μg1g2.
    #[serde(serialize_with = "round6_opt")]
    pub grid_for_middle_volts: Option<f64>,
    /// Why there is no grid estimate for the middle (no grid reading, no
    /// μg1g2 for the type, readings at cut-off), in the job's language;
    /// null when there is one.
    pub grid_for_middle_unknown_reason: Option<String>,
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
    pub channel: Option<String>,
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
    /// Which figure decides the status: `working_high_line` (the working
    /// voltage projected to high line) or `cold_start_peak`.
    pub deciding: &'static str,
    #[serde(serialize_with = "round6")]
    pub deciding_volts: f64,
    /// The margin the deciding figure leaves on the rating.
    #[serde(serialize_with = "round6")]
    pub deciding_margin_pct: f64,
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
    BenchTests,
    SafetyTests,
}

impl Family {
    pub const ALL: [Family; 6] = [
        Family::OutputValves,
        Family::SupplyVoltages,
        Family::StressedParts,
        Family::Heater,
        Family::BenchTests,
        Family::SafetyTests,
    ];

    /// The catalogue key of the family's title.
    pub fn key(self) -> &'static str {
        match self {
            Family::OutputValves => "family-output-valves",
            Family::SupplyVoltages => "family-supply-voltages",
            Family::StressedParts => "family-stressed-parts",
            Family::Heater => "family-heater",
            Family::BenchTests => "family-bench-tests",
            Family::SafetyTests => "family-safety-tests",
        }
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct FamilyStatus {
    pub family: Family,
    pub title: String,
    /// The worst status that still counts: accepted findings leave it.
    pub status: Status,
    /// The worst figure that still counts in words, or why there is none.
    pub worst: String,
    /// Whether anything in this family was measured.
    pub measured: bool,
    /// The findings of this family the technician accepted.
    pub accepted: Vec<AcceptedFinding>,
}

/// A finding the technician accepted, for summaries.
#[derive(Debug, Clone, Serialize)]
pub struct AcceptedFinding {
    /// "V3 (6V6GT)", "C30".
    pub subject: String,
    /// For a valve, the check in words ("screen voltage").
    pub check: Option<String>,
    pub status: Status,
    pub reason: String,
    pub accepted_reason: String,
    pub accepted_by: String,
    pub accepted_date: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct Warning {
    /// The measurement set, or none for job-wide warnings.
    pub set: Option<String>,
    /// Whether `set` is the final set (the state the unit leaves in).
    pub in_final_set: bool,
    /// What it is about: "V3 (EL84)", "R24", "B+1", "safety".
    pub subject: String,
    /// For a valve, which check (`screen_voltage` …); none otherwise.
    pub check: Option<&'static str>,
    pub status: Status,
    pub message: String,
    /// The reason the figure is off, without the subject (for grouping).
    pub reason: String,
    /// The deciding figure in a few words ("screen 196 %"); empty for a
    /// note about the data.
    pub brief: String,
    pub accepted: bool,
    pub accepted_reason: Option<String>,
    pub accepted_by: Option<String>,
    pub accepted_date: Option<String>,
}

impl Warning {
    /// A warning about the data (not a figure's verdict): never accepted.
    pub fn note(
        set: Option<&str>,
        in_final_set: bool,
        subject: &str,
        status: Status,
        message: String,
    ) -> Self {
        Warning {
            set: set.map(str::to_string),
            in_final_set,
            subject: subject.to_string(),
            check: None,
            status,
            reason: message.clone(),
            brief: String::new(),
            message,
            accepted: false,
            accepted_reason: None,
            accepted_by: None,
            accepted_date: None,
        }
    }

    /// Not accepted: still counts against the unit.
    pub fn is_open(&self) -> bool {
        !self.accepted
    }
}

/// Which sets `check --strict` judges.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StrictScope {
    /// The final set and the safety tests (the unit as it leaves).
    Final,
    /// Every set, as found included.
    All,
}

impl Findings {
    /// The over-limit findings that make `check --strict` fail: not
    /// accepted, and in the final set (or job-wide, like a failed safety
    /// test) unless `scope` is [`StrictScope::All`].
    pub fn strict_failures(&self, scope: StrictScope) -> Vec<&Warning> {
        self.warnings
            .iter()
            .filter(|w| w.status == Status::Over && w.is_open())
            .filter(|w| scope == StrictScope::All || w.set.is_none() || w.in_final_set)
            .collect()
    }
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
    /// The grid-to-screen amplification factor the bias estimates use,
    /// when the row gives one.
    #[serde(serialize_with = "round6_opt")]
    pub mu_g1g2: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ModFindings {
    pub what: String,
    pub why: Option<String>,
    pub reversible: Option<bool>,
    pub original_kept: Option<bool>,
    /// The reason is the shop's alone (never in a listing).
    pub private: bool,
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
