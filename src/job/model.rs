//! The typed job: what a decoded job file holds. Every value that the
//! calculation pass may complain about keeps the span of its source text, so
//! a finding can point back at the line that caused it.

use chrono::NaiveDate;
use miette::SourceSpan;
use serde::Serialize;

use crate::units::{Amps, Farads, Hertz, Ohms, Volts, Watts};

/// A value with the place in the job file it came from.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Spanned<T> {
    pub value: T,
    #[serde(skip)]
    pub span: SourceSpan,
}

impl<T> Spanned<T> {
    pub fn new(value: T, span: SourceSpan) -> Self {
        Spanned { value, span }
    }
}

impl<T> std::ops::Deref for Spanned<T> {
    type Target = T;
    fn deref(&self) -> &T {
        &self.value
    }
}

/// One repair job, as written by the technician.
#[derive(Debug, Clone, Serialize)]
pub struct Job {
    /// The file name the job came from, for messages.
    pub source_name: String,
    pub format_version: u32,
    pub info: JobInfo,
    pub customer: Option<Customer>,
    pub unit: Unit,
    pub mains: Mains,
    pub complaint: Option<String>,
    /// The technician's findings in words; `private` keeps them out of
    /// the listing.
    pub findings: Option<Remark>,
    /// The work done in words; `private` keeps it out of the listing.
    pub work: Option<Remark>,
    pub valves: Vec<ValvePosition>,
    pub circuit: Circuit,
    pub measurements: Vec<MeasurementSet>,
    pub parts: Vec<PartChange>,
    pub mods: Vec<Modification>,
    pub safety: Option<Safety>,
    pub notes: Vec<Remark>,
    /// Photos of the unit, in file order.
    pub photos: Vec<Photo>,
    /// The bands in force: the defaults, overridden by the shop profile's
    /// `settings`, overridden by the job's own.
    pub settings: Settings,
    /// The `settings` children the job file itself gives ("fixed-bias-high" …).
    pub settings_given: Vec<String>,
    /// Labour and parts, when the job records them.
    pub charges: Option<super::charges::Charges>,
    /// The technician's judgement: findings accepted as they are, each
    /// with its reason, name and date.
    pub acceptances: Vec<Acceptance>,
}

impl Job {
    /// The valve at a position in the line-up, if there is one.
    pub fn valve(&self, position: &str) -> Option<&ValvePosition> {
        self.valves.iter().find(|v| v.position.value == position)
    }

    /// The valve at a position as fitted for a set: the line-up's entry,
    /// with the set's own type where the set gives one.
    pub fn valve_in(&self, set: &MeasurementSet, position: &str) -> Option<ValvePosition> {
        let mut v = self.valve(position)?.clone();
        if let Some(change) = set
            .valve_types
            .iter()
            .find(|c| c.position.value == position)
        {
            v.type_name = change.type_name.clone();
        }
        Some(v)
    }

    /// The circuit as it stood for a measurement set.
    pub fn circuit_for(&self, set: &MeasurementSet) -> std::borrow::Cow<'_, Circuit> {
        if set.circuit_changes.is_empty() {
            std::borrow::Cow::Borrowed(&self.circuit)
        } else {
            std::borrow::Cow::Owned(self.circuit.with_changes(&set.circuit_changes))
        }
    }

    /// The index of the set the unit is handed over in: the one marked
    /// `final`, else the last.
    pub fn final_set_index(&self) -> Option<usize> {
        self.measurements
            .iter()
            .position(|m| m.is_final)
            .or_else(|| self.measurements.len().checked_sub(1))
    }

    /// The circuit's declaration of a B+ node, if there is one.
    pub fn node(&self, name: &str) -> Option<&NodeSpec> {
        self.circuit.nodes.iter().find(|n| n.name.value == name)
    }
}

/// A piece of the technician's own text. A `private` one is the shop's
/// alone: the listing document never shows it (its context is built
/// without it).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Remark {
    pub text: String,
    pub private: bool,
}

/// A photo the job refers to, as written: the path is checked and the
/// file read only when a document is made (`crate::photo`).
#[derive(Debug, Clone, Serialize)]
pub struct Photo {
    /// The path as written, relative to the job file's folder.
    pub path: Spanned<String>,
    pub caption: Option<String>,
    /// Whether the listing document shows it (the hand-over shows every
    /// photo).
    pub listing: bool,
}

#[derive(Debug, Clone, Serialize)]
pub struct JobInfo {
    pub id: String,
    pub received: Option<NaiveDate>,
    pub completed: Option<NaiveDate>,
    pub technician: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct Customer {
    pub name: String,
    pub contacts: Vec<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct Unit {
    pub make: String,
    pub model: String,
    pub serial: Option<String>,
    pub year: Option<i32>,
    pub description: Option<String>,
    pub condition: Option<String>,
    /// The maker's rated output power of the unit, when the job gives it.
    pub rated_power: Option<Spanned<Watts>>,
}

/// The supply the unit runs from, and the supply its factory chart assumes.
#[derive(Debug, Clone, Serialize)]
pub struct Mains {
    /// Local nominal voltage (120 V, 230 V …).
    pub nominal: Spanned<Volts>,
    pub frequency: Option<Hertz>,
    /// Upper supply tolerance as a fraction (0.05 for +5 %), for the
    /// high-line projection.
    pub tolerance: Spanned<f64>,
    /// The mains voltage the unit's voltage chart was drawn at.
    pub design: Option<Spanned<Volts>>,
}

/// What a valve does in the circuit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Role {
    Preamp,
    PhaseInverter,
    Output,
    Rectifier,
    Tremolo,
    ReverbDriver,
    ReverbRecovery,
    Other,
}

impl Role {
    pub const NAMES: [&'static str; 8] = [
        "preamp",
        "phase-inverter",
        "output",
        "rectifier",
        "tremolo",
        "reverb-driver",
        "reverb-recovery",
        "other",
    ];

    pub fn from_name(name: &str) -> Option<Role> {
        Some(match name {
            "preamp" => Role::Preamp,
            "phase-inverter" => Role::PhaseInverter,
            "output" => Role::Output,
            "rectifier" => Role::Rectifier,
            "tremolo" => Role::Tremolo,
            "reverb-driver" => Role::ReverbDriver,
            "reverb-recovery" => Role::ReverbRecovery,
            "other" => Role::Other,
            _ => return None,
        })
    }

    /// Plain words for a page.
    pub fn words(self) -> &'static str {
        match self {
            Role::Preamp => "preamp",
            Role::PhaseInverter => "phase inverter",
            Role::Output => "output",
            Role::Rectifier => "rectifier",
            Role::Tremolo => "tremolo",
            Role::ReverbDriver => "reverb driver",
            Role::ReverbRecovery => "reverb recovery",
            Role::Other => "other",
        }
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct ValvePosition {
    pub position: Spanned<String>,
    /// The type as written ("6BQ5"); the ratings table resolves it.
    pub type_name: Spanned<String>,
    pub role: Role,
    /// The amplifier channel it belongs to, where the job groups valves so.
    pub channel: Option<String>,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum BiasKind {
    Cathode,
    Fixed,
}

/// Circuit facts the calculations need.
#[derive(Debug, Clone, Default, Serialize)]
pub struct Circuit {
    pub bias: Option<Spanned<BiasKind>>,
    pub cathode_resistors: Vec<CathodeResistor>,
    pub sense_resistors: Vec<SenseResistor>,
    pub screen_resistors: Vec<ScreenResistor>,
    pub half_primaries: Vec<HalfPrimary>,
    pub nodes: Vec<NodeSpec>,
    pub droppers: Vec<Dropper>,
    pub filter_capacitors: Vec<FilterCapacitor>,
    pub winding: Option<Winding>,
    pub rectifier: Option<Rectifier>,
}

impl Circuit {
    pub fn cathode_resistor_for(&self, position: &str) -> Option<&CathodeResistor> {
        self.cathode_resistors
            .iter()
            .find(|r| r.valves.iter().any(|v| v.value == position))
    }
    pub fn sense_resistor_for(&self, position: &str) -> Option<&SenseResistor> {
        self.sense_resistors
            .iter()
            .find(|r| r.valve.value == position)
    }
    pub fn screen_resistor_for(&self, position: &str) -> Option<&ScreenResistor> {
        self.screen_resistors
            .iter()
            .find(|r| r.valve.value == position)
    }
    pub fn half_primary_for(&self, position: &str) -> Option<&HalfPrimary> {
        self.half_primaries
            .iter()
            .find(|r| r.valves.iter().any(|v| v.value == position))
    }

    /// Whether the circuit holds no facts at all.
    pub fn is_empty(&self) -> bool {
        self.bias.is_none()
            && self.cathode_resistors.is_empty()
            && self.sense_resistors.is_empty()
            && self.screen_resistors.is_empty()
            && self.half_primaries.is_empty()
            && self.nodes.is_empty()
            && self.droppers.is_empty()
            && self.filter_capacitors.is_empty()
            && self.winding.is_none()
            && self.rectifier.is_none()
    }

    /// This circuit with `changes` laid over it: a fact in `changes`
    /// replaces the fact with the same reference (or, for resistors tied to
    /// one valve, the same valve; for the bias, winding and rectifier, the
    /// single fact).
    pub fn with_changes(&self, changes: &Circuit) -> Circuit {
        /// Each base fact replaced in place by its change; new facts last.
        fn merge<T: Clone>(base: &[T], changes: &[T], same: impl Fn(&T, &T) -> bool) -> Vec<T> {
            let mut out: Vec<T> = base
                .iter()
                .map(|b| changes.iter().find(|c| same(b, c)).unwrap_or(b).clone())
                .collect();
            out.extend(
                changes
                    .iter()
                    .filter(|c| !base.iter().any(|b| same(b, c)))
                    .cloned(),
            );
            out
        }
        fn names(v: &[Spanned<String>]) -> Vec<&str> {
            v.iter().map(|s| s.value.as_str()).collect()
        }
        Circuit {
            bias: changes.bias.clone().or_else(|| self.bias.clone()),
            cathode_resistors: merge(
                &self.cathode_resistors,
                &changes.cathode_resistors,
                |a, b| {
                    a.reference == b.reference
                        || names(&a.valves)
                            .iter()
                            .any(|v| names(&b.valves).contains(v))
                },
            ),
            sense_resistors: merge(&self.sense_resistors, &changes.sense_resistors, |a, b| {
                a.valve.value == b.valve.value
            }),
            screen_resistors: merge(&self.screen_resistors, &changes.screen_resistors, |a, b| {
                a.valve.value == b.valve.value
            }),
            half_primaries: merge(&self.half_primaries, &changes.half_primaries, |a, b| {
                names(&a.valves)
                    .iter()
                    .any(|v| names(&b.valves).contains(v))
            }),
            nodes: merge(&self.nodes, &changes.nodes, |a, b| {
                a.name.value == b.name.value
            }),
            droppers: merge(&self.droppers, &changes.droppers, |a, b| {
                a.reference == b.reference
            }),
            filter_capacitors: merge(
                &self.filter_capacitors,
                &changes.filter_capacitors,
                |a, b| a.reference == b.reference,
            ),
            winding: changes.winding.clone().or_else(|| self.winding.clone()),
            rectifier: changes.rectifier.clone().or_else(|| self.rectifier.clone()),
        }
    }
}

/// A cathode resistor, possibly shared by a push-pull pair.
#[derive(Debug, Clone, Serialize)]
pub struct CathodeResistor {
    pub reference: String,
    pub value: Spanned<Ohms>,
    pub rating: Option<Watts>,
    pub valves: Vec<Spanned<String>>,
    #[serde(skip)]
    pub span: SourceSpan,
}

/// A low-value resistor from cathode to ground fitted for bias checks.
#[derive(Debug, Clone, Serialize)]
pub struct SenseResistor {
    pub reference: Option<String>,
    pub value: Spanned<Ohms>,
    pub valve: Spanned<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ScreenResistor {
    pub reference: Option<String>,
    pub value: Spanned<Ohms>,
    pub rating: Option<Watts>,
    pub valve: Spanned<String>,
    /// The B+ node feeding the resistor.
    pub supply: Spanned<String>,
}

/// DC resistance of the half of the output transformer primary feeding a
/// valve's plate, measured cold with the power off.
#[derive(Debug, Clone, Serialize)]
pub struct HalfPrimary {
    /// The valves whose plates this half feeds (two for a parallel pair).
    pub valves: Vec<Spanned<String>>,
    pub resistance: Spanned<Ohms>,
}

/// A named node of the supply, with the factory chart's figure.
#[derive(Debug, Clone, Serialize)]
pub struct NodeSpec {
    pub name: Spanned<String>,
    pub chart: Option<Volts>,
    /// Tolerance as a fraction.
    pub tolerance: Option<f64>,
    pub label: Option<String>,
    /// The amplifier channel it feeds, where the job groups nodes so.
    pub channel: Option<String>,
}

/// A series resistor between two filter nodes.
#[derive(Debug, Clone, Serialize)]
pub struct Dropper {
    pub reference: String,
    pub value: Spanned<Ohms>,
    pub rating: Option<Watts>,
    pub from: Spanned<String>,
    pub to: Spanned<String>,
    #[serde(skip)]
    pub span: SourceSpan,
}

#[derive(Debug, Clone, Serialize)]
pub struct FilterCapacitor {
    pub reference: String,
    pub value: Option<Farads>,
    pub rating: Spanned<Volts>,
    pub node: Spanned<String>,
    #[serde(skip)]
    pub span: SourceSpan,
}

/// The power transformer's high-voltage winding.
#[derive(Debug, Clone, Serialize)]
pub struct Winding {
    /// RMS volts per side of a centre-tapped full-wave winding.
    pub rms: Spanned<Volts>,
    /// The primary voltage the winding's figure is rated at.
    pub primary: Spanned<Volts>,
}

#[derive(Debug, Clone, Serialize)]
pub enum RectifierKind {
    Silicon,
    /// A valve rectifier at a position in the line-up.
    Valve(Spanned<String>),
}

#[derive(Debug, Clone, Serialize)]
pub struct Rectifier {
    pub kind: RectifierKind,
    /// Forward drop at no load, if the job gives one.
    pub drop: Option<Volts>,
}

/// One round of readings: "as found", "as left" or any other label.
#[derive(Debug, Clone, Serialize)]
pub struct MeasurementSet {
    pub label: String,
    /// Marked `final=#true`: the state the unit is handed over in.
    pub is_final: bool,
    pub mains: Spanned<Volts>,
    pub date: Option<NaiveDate>,
    pub nodes: Vec<NodeReading>,
    pub valves: Vec<ValveReading>,
    pub heaters: Vec<HeaterReading>,
    /// Circuit facts that differ for this set (parts changed since the
    /// circuit block was written), laid over the job's circuit.
    pub circuit_changes: Circuit,
    /// Valves fitted with another type for this set (a rectifier or output
    /// valves swapped): the set's figures use the new type's ratings.
    pub valve_types: Vec<ValveTypeChange>,
    /// Readings taken at times during a warm-up.
    pub warm_up: Vec<WarmUpReading>,
    /// Where the bias controls were set.
    pub bias_controls: Vec<BiasControl>,
    /// Output power, hum and noise, response and gain read on the bench.
    pub bench: BenchTests,
    /// Whether the set asks for a cathode-resistor suggestion for every
    /// cathode-biased output valve (it appears by itself for one above the
    /// cathode-bias caution guide).
    pub suggest_cathode_resistor: bool,
    #[serde(skip)]
    pub span: SourceSpan,
}

/// A valve position fitted with another type in one set.
#[derive(Debug, Clone, Serialize)]
pub struct ValveTypeChange {
    pub position: Spanned<String>,
    pub type_name: Spanned<String>,
}

/// A valve read at a time since power-on, within one set.
#[derive(Debug, Clone, Serialize)]
pub struct WarmUpReading {
    /// Minutes since power-on.
    pub minutes: Spanned<f64>,
    pub reading: ValveReading,
}

/// A bias control's setting, as the technician describes it.
#[derive(Debug, Clone, Serialize)]
pub struct BiasControl {
    /// Which control, when there is more than one.
    pub label: Option<String>,
    /// "2 o'clock", "fully clockwise", "−36 V at the test point".
    pub position: String,
}

/// Readings taken on the bench into a dummy load, after the bias is set.
#[derive(Debug, Clone, Default, Serialize)]
pub struct BenchTests {
    pub output_power: Vec<OutputPowerReading>,
    pub hum_noise: Vec<HumNoiseReading>,
    pub responses: Vec<ResponseReading>,
    pub gains: Vec<GainReading>,
}

impl BenchTests {
    pub fn is_empty(&self) -> bool {
        self.output_power.is_empty()
            && self.hum_noise.is_empty()
            && self.responses.is_empty()
            && self.gains.is_empty()
    }
}

/// How an AC voltage across the load was read.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum AcReading {
    /// RMS volts (a true-RMS meter, or the scope's RMS figure).
    Rms,
    /// Peak-to-peak volts off the scope.
    PeakToPeak,
}

/// When an output-power reading was taken.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum PowerCondition {
    /// At the onset of visible clipping.
    Clipping,
    /// At a stated total harmonic distortion, as a fraction (0.05 for 5 %).
    Distortion { fraction: f64 },
    /// At a stated input drive.
    Drive { volts: Volts },
}

/// Output voltage across a dummy load, for the output power.
#[derive(Debug, Clone, Serialize)]
pub struct OutputPowerReading {
    pub volts: Spanned<Volts>,
    pub reading: AcReading,
    pub load: Spanned<Ohms>,
    pub frequency: Hertz,
    pub channel: Option<String>,
    pub condition: PowerCondition,
}

/// What the input was doing while hum and noise were read.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum InputState {
    Shorted,
    Open,
}

/// RMS volts across the load with no signal.
#[derive(Debug, Clone, Serialize)]
pub struct HumNoiseReading {
    pub volts: Spanned<Volts>,
    pub load: Spanned<Ohms>,
    pub input: InputState,
    /// The volume setting, as written ("0", "full", "5 of 10").
    pub volume: Option<String>,
    pub channel: Option<String>,
}

/// Output volts at several frequencies for a fixed input level.
#[derive(Debug, Clone, Serialize)]
pub struct ResponseReading {
    /// The frequency the others are compared with (1 kHz unless stated).
    pub reference: Spanned<Hertz>,
    pub load: Option<Ohms>,
    /// The fixed input level, when the job gives it.
    pub input: Option<Volts>,
    pub channel: Option<String>,
    /// In file order; at least one is at the reference frequency.
    pub points: Vec<ResponsePoint>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ResponsePoint {
    pub frequency: Spanned<Hertz>,
    pub volts: Spanned<Volts>,
}

/// Input volts needed for an output reading: the gain (or sensitivity).
#[derive(Debug, Clone, Serialize)]
pub struct GainReading {
    pub input: Spanned<Volts>,
    pub output: Spanned<Volts>,
    pub frequency: Hertz,
    pub load: Option<Ohms>,
    pub channel: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct NodeReading {
    pub name: Spanned<String>,
    pub volts: Spanned<Volts>,
    /// Chart figure and tolerance given on the reading itself; they take
    /// precedence over the circuit's node declaration.
    pub chart: Option<Volts>,
    pub tolerance: Option<f64>,
}

/// How a current was read directly.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum CurrentMethod {
    /// A bias probe under the valve: reads cathode current.
    Probe,
    /// An ammeter across half the output transformer primary: reads plate current.
    Shunt,
}

#[derive(Debug, Clone, Serialize)]
pub struct ValveReading {
    pub position: Spanned<String>,
    pub plate: Option<Spanned<Volts>>,
    pub screen: Option<Spanned<Volts>>,
    pub cathode: Option<Spanned<Volts>>,
    pub grid: Option<Spanned<Volts>>,
    /// Voltage across the valve's sense resistor.
    pub sense: Option<Spanned<Volts>>,
    /// Voltage across the half primary feeding the plate.
    pub primary_drop: Option<Spanned<Volts>>,
    pub current: Option<(Spanned<Amps>, CurrentMethod)>,
    #[serde(skip)]
    pub span: SourceSpan,
}

impl ValveReading {
    /// Whether anything was read (a line may give only the set's type).
    pub fn has_readings(&self) -> bool {
        self.plate.is_some()
            || self.screen.is_some()
            || self.cathode.is_some()
            || self.grid.is_some()
            || self.sense.is_some()
            || self.primary_drop.is_some()
            || self.current.is_some()
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct HeaterReading {
    pub volts: Spanned<Volts>,
    pub nominal: Volts,
    pub label: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct PartChange {
    /// The circuit reference ("C31"), when the part has one.
    pub reference: Option<String>,
    /// What the part is, for one without a reference ("mains cord").
    pub what: Option<String>,
    pub was: Option<String>,
    pub now: Option<String>,
    pub reason: Option<String>,
    pub original_kept: Option<bool>,
    /// The reason is the shop's alone: the listing names the part without it.
    pub private: bool,
}

#[derive(Debug, Clone, Serialize)]
pub struct Modification {
    pub what: String,
    pub why: Option<String>,
    pub reversible: Option<bool>,
    pub original_kept: Option<bool>,
    /// The reason is the shop's alone: the listing names the mod without it.
    pub private: bool,
    /// Circuit figures the technician wants worked out for this mod.
    pub figures: Vec<ModFigure>,
    /// The circuit network the mod changes, before and after.
    pub network: Option<super::network::Network>,
}

/// A textbook circuit figure attached to a modification.
#[derive(Debug, Clone, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum ModFigure {
    /// A first-order RC corner.
    RcCorner {
        r: Ohms,
        c: Farads,
        label: Option<String>,
    },
    /// The corner of a cathode bypass capacitor on a triode stage.
    CathodeBypass {
        valve: Spanned<String>,
        rk: Ohms,
        ck: Farads,
        load: Ohms,
    },
    /// The gain of a triode stage, bypassed or not.
    StageGain {
        valve: Spanned<String>,
        load: Ohms,
        rk: Option<Ohms>,
        bypassed: bool,
    },
    /// Three equal RC sections of a phase-shift oscillator.
    PhaseShift { r: Ohms, c: Farads },
}

/// Protection class of the unit under the safety-test rules.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum ProtectionClass {
    #[serde(rename = "I")]
    One,
    #[serde(rename = "II")]
    Two,
}

#[derive(Debug, Clone, Serialize)]
pub struct Safety {
    pub class: ProtectionClass,
    pub tests: Vec<SafetyTest>,
}

#[derive(Debug, Clone, Serialize)]
#[serde(tag = "test", rename_all = "snake_case")]
pub enum SafetyTest {
    /// Protective-earth continuity; passes at or below limit + cord.
    EarthContinuity {
        measured: Ohms,
        limit: Ohms,
        cord: Option<Ohms>,
    },
    /// Insulation resistance at a DC test voltage; passes at or above the
    /// minimum. `over_range` when the meter showed "more than" the figure.
    Insulation {
        measured: Ohms,
        over_range: bool,
        test_voltage: Volts,
        minimum: Ohms,
    },
    /// Leakage (touch) current; passes at or below the limit.
    Leakage { measured: Amps, limit: Amps },
}

/// What kind of thing an acceptance names.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum AcceptedKind {
    /// A valve position: its checks, or (for a valve rectifier) its load.
    Valve,
    /// A B+ node against the chart.
    Node,
    /// A resistor or capacitor by its circuit reference.
    Part,
    /// The heater supply (all heater readings, or the one with a label).
    Heater,
    /// A safety test by its name.
    Safety,
    /// A bench test (output power, hum and noise), of one channel or all.
    Bench,
}

impl AcceptedKind {
    /// The child-node names of the `accepted` block.
    pub const NAMES: [&'static str; 6] = ["valve", "node", "part", "heater", "safety", "bench"];

    pub fn from_name(name: &str) -> Option<AcceptedKind> {
        Some(match name {
            "valve" => AcceptedKind::Valve,
            "node" => AcceptedKind::Node,
            "part" => AcceptedKind::Part,
            "heater" => AcceptedKind::Heater,
            "safety" => AcceptedKind::Safety,
            "bench" => AcceptedKind::Bench,
            _ => return None,
        })
    }
}

/// A finding the technician has judged and accepted as it is: it keeps its
/// figures and its status, but no longer counts against the unit.
#[derive(Debug, Clone, Serialize)]
pub struct Acceptance {
    pub kind: AcceptedKind,
    /// The valve position, node, part reference, heater label or safety
    /// test; none for "every heater".
    pub name: Option<Spanned<String>>,
    /// One named check of a valve (`screen-voltage`); none for all.
    pub check: Option<Spanned<String>>,
    /// For a bench test, the channel it was read on; none for every one.
    pub channel: Option<Spanned<String>>,
    /// The measurement set it applies to; none for every set.
    pub set: Option<Spanned<String>>,
    pub reason: String,
    /// Who accepted it.
    pub by: String,
    pub date: NaiveDate,
    #[serde(skip)]
    pub span: SourceSpan,
}

impl PartChange {
    /// The reference, else what the part is.
    pub fn name(&self) -> &str {
        self.reference
            .as_deref()
            .or(self.what.as_deref())
            .unwrap_or("")
    }
}

impl SafetyTest {
    /// The test's name as written in a job file.
    pub fn name(&self) -> &'static str {
        match self {
            SafetyTest::EarthContinuity { .. } => "earth-continuity",
            SafetyTest::Insulation { .. } => "insulation",
            SafetyTest::Leakage { .. } => "leakage",
        }
    }
}

/// The guide bands and margins, with the documented defaults; a job may
/// override any of them in its `settings` block. All are fractions.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Settings {
    /// Fixed-bias aim, low end (below it: "cold"). Common practice: 50 %.
    pub fixed_bias_low: f64,
    /// Fixed-bias aim, high end (above it: caution). Common practice: 70 %.
    pub fixed_bias_high: f64,
    /// Cathode bias caution threshold. Common practice: 90 %.
    pub cathode_bias_caution: f64,
    /// Resistor derating: caution above this share of the rating. Common practice: 50 %.
    pub resistor_derating: f64,
    /// Capacitor margin: caution when less headroom than this. Common practice: 10 %.
    pub capacitor_margin: f64,
    /// Heater tolerance either side of nominal. Common practice: ±10 %.
    pub heater_tolerance: f64,
    /// Node tolerance against the chart when the job gives none. Common practice: ±10 %.
    pub node_tolerance: f64,
    /// Silicon rectifier forward drop at no load. Common practice: about 1 V.
    pub silicon_drop: Volts,
    /// How far above a published plate or screen voltage maximum a reading
    /// may go before it counts as over rather than caution. Common practice
    /// (this tool's default): 20 %, since guitar amplifiers often run output
    /// valves above the design-centre voltage maxima and plate dissipation,
    /// checked separately, governs valve life.
    pub voltage_over: f64,
    /// Output power at clipping or a stated distortion below this share of
    /// the unit's rated power is a caution. Common practice: 80 % (a
    /// healthy old unit reaches about 80 % of its rating or more).
    pub output_power_caution: f64,
    /// Hum and noise less than this many dB below full output is a
    /// caution. Common practice (this tool's default): 60 dB.
    pub hum_noise_caution_db: f64,
    /// The share of Pa(max) a cathode-resistor suggestion aims the plate
    /// dissipation at. Common practice: 85 %.
    pub cathode_bias_target: f64,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            fixed_bias_low: 0.50,
            fixed_bias_high: 0.70,
            cathode_bias_caution: 0.90,
            resistor_derating: 0.50,
            capacitor_margin: 0.10,
            heater_tolerance: 0.10,
            node_tolerance: 0.10,
            silicon_drop: Volts(1.0),
            voltage_over: 0.20,
            output_power_caution: 0.80,
            hum_noise_caution_db: 60.0,
            cathode_bias_target: 0.85,
        }
    }
}

/// What a shop profile lends a job before it is decoded: the job's own
/// entries still win. `calc` never sees where a figure came from, only the
/// merged result.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct JobDefaults {
    /// The bands the job's `settings` start from.
    pub settings: Settings,
    /// Limits a safety test may leave out.
    pub safety: SafetyDefaults,
    /// The technician when the job names none.
    pub technician: Option<String>,
    /// Currency and tax for the job's charges.
    pub charges: super::charges::ChargeTerms,
}

/// Default safety-test limits, so a job may write just the reading.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
pub struct SafetyDefaults {
    /// Protective-earth continuity limit (before the cord's resistance).
    pub earth_limit: Option<Ohms>,
    pub insulation_test_voltage: Option<Volts>,
    pub insulation_minimum: Option<Ohms>,
    pub leakage_limit: Option<Amps>,
}
