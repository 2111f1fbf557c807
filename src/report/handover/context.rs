//! The template context of the hand-over document: every figure the page
//! shows, already formatted as text (units, decimals, signs), taken from the
//! job and its [`Findings`]. Templates only lay it out; they decide nothing
//! and compute nothing, so a shop's own template cannot get a figure wrong.
//!
//! All strings here are plain text. They reach the Typst source only through
//! the escaping template environment.

mod bench;
mod cells;

use chrono::NaiveDate;
use serde::Serialize;

pub use bench::{
    BenchContext, GainRow, HumNoiseRow, OutputPowerRow, ResponsePointRow, ResponseRow,
    SuggestionOption, SuggestionRow,
};

use crate::calc::{
    CapacitorFindings, CurrentMethod, Findings, HeaterFindings, ModFigureFindings, ModFindings,
    NodeFindings, RectifierFindings, ResistorFindings, SetFindings, Status, ValveFindings,
    resistor_power_words,
};
use crate::catalogue::{Arg, Catalogue};
use crate::job::{Job, ProtectionClass};
use crate::shop::ShopProfile;
use crate::typeset::{CountedText, Rows, serialize_counted_text};

use super::charges::{ChargesContext, charges_context};
use super::shop_block::{AcceptanceBlock, ShopBlock, acceptance, paper};
use crate::report::attention::{self, Attention};
use crate::report::photos::PhotoRow;
use crate::report::summary::Summary;

mod network_view;
use crate::units::{QuantityKind as Q, format_engineering, format_sig, write_fixed};
pub use network_view::{
    NetworkRow, NetworkView, OscillatorRow, OscillatorView, network_plot_path, network_view,
};

/// The footer shows at most this much of the job id (the header has it all).
pub const FOOTER_ID_CHARS: usize = 40;

/// Paths of the charts inside the typesetting folder.
pub const DISSIPATION_PLOT: &str = "plots/plate-dissipation.svg";
pub const SUPPLY_PLOT: &str = "plots/supply-chain.svg";
pub const RESPONSE_PLOT: &str = "plots/frequency-response.svg";

/// The path of part `index` (from 0) of a chart that a long job cuts into
/// several: the first keeps the chart's own name (`base`), the others get
/// `-2`, `-3` … before the extension.
pub fn chart_part_path(base: &str, index: usize) -> String {
    if index == 0 {
        return base.to_string();
    }
    match base.strip_suffix(".svg") {
        Some(stem) => format!("{stem}-{}.svg", index + 1),
        None => format!("{base}-{}", index + 1),
    }
}

/// One chart file of the document and, when a long job's chart is cut
/// into several, which share of the figures it shows in words.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct ChartFile {
    pub path: String,
    pub part: Option<String>,
}

/// The path of set `index`'s warm-up chart (counting from 0).
pub fn warm_up_plot(index: usize) -> String {
    format!("plots/warm-up-{}.svg", index + 1)
}

/// Everything a hand-over template is given (besides `font_rules`).
#[derive(Debug, Clone, Serialize)]
pub struct HandoverContext {
    pub document: DocumentInfo,
    pub shop: ShopBlock,
    pub job: JobInfo,
    pub unit: UnitInfo,
    pub customer: Option<CustomerInfo>,
    pub mains: MainsInfo,
    /// What was wrong, what was done and the state now, in plain words.
    pub summary: SummaryContext,
    pub glance: Glance,
    /// What needs attention, grouped: the final set's open findings, the
    /// accepted ones, job-wide ones, then one line per part or valve for
    /// each earlier set.
    pub attention: AttentionContext,
    pub complaint: Option<String>,
    pub findings: Option<String>,
    pub work: Option<String>,
    pub valves: Vec<LineUpRow>,
    pub parts: Vec<PartRow>,
    pub mods: Vec<ModRow>,
    pub notes: Vec<String>,
    /// Every photo of the job, in file order.
    pub photos: Vec<PhotoRow>,
    pub sets: crate::typeset::OnDemand<SetContext>,
    pub plots: Plots,
    pub safety: SafetyContext,
    pub method: Method,
    pub footer: Footer,
    /// Who hands the unit over, the warranty, the terms and the lines to sign.
    pub acceptance: AcceptanceBlock,
    /// The job's charges, or none (no `charges` block, or `--no-charges`).
    /// Only the hand-over's context carries them.
    pub charges: Option<ChargesContext>,
    /// The catalogue the template's `t()` and `tm()` look words up in.
    #[serde(skip)]
    pub catalogue: Catalogue,
}

#[derive(Debug, Clone, Serialize)]
pub struct DocumentInfo {
    pub title: String,
    /// The technician, else the shop's name.
    pub author: String,
    /// Every author for the PDF's metadata: the technician and the shop.
    pub authors: Vec<String>,
    /// A sentence for the PDF's metadata.
    pub description: String,
    /// Typst paper name: "a4" or "us-letter".
    pub paper: String,
    /// The document's language for Typst (hyphenation, quotes): "en".
    pub lang: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct JobInfo {
    pub id: String,
    /// Dates in words, e.g. "9 November 2026".
    pub received: Option<String>,
    pub completed: Option<String>,
    pub technician: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct UnitInfo {
    pub make: String,
    pub model: String,
    pub serial: Option<String>,
    pub year: Option<String>,
    pub description: Option<String>,
    pub condition: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct CustomerInfo {
    pub name: String,
    pub contacts: Vec<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct MainsInfo {
    /// "120 V".
    pub nominal: String,
    pub frequency: Option<String>,
    /// "+5 %".
    pub tolerance: String,
    pub high_line: String,
    /// The mains the factory chart was drawn at, when the job gives it.
    pub design: Option<String>,
}

/// The at-a-glance panel.
#[derive(Debug, Clone, Serialize)]
pub struct Glance {
    /// Which readings the panel speaks for, in words.
    pub basis: String,
    pub families: Vec<GlanceRow>,
    /// The worst status over all families.
    pub overall: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct GlanceRow {
    pub title: String,
    /// ok, cold, caution, over, accepted (every figure off its limit was
    /// accepted), or none when nothing was measured.
    pub status: String,
    /// The worst figure that still counts in words, or what was accepted.
    pub worst: String,
}

/// The plain-words summary at the head of page 1.
#[derive(Debug, Clone, Serialize)]
pub struct SummaryContext {
    /// What the first readings showed.
    pub found: Vec<String>,
    /// What was done.
    pub done: Vec<String>,
    /// The state the unit leaves in.
    pub now: Vec<String>,
    /// True when nothing still counts against the unit.
    pub healthy: bool,
}

/// What needs attention, grouped.
#[derive(Debug, Clone, Serialize)]
pub struct AttentionContext {
    /// The final set's label.
    pub final_label: Option<String>,
    /// Open findings of the final set, one entry per part or valve.
    pub open: Vec<EntryRow>,
    /// Findings the technician accepted.
    pub accepted: Vec<AcceptedRow>,
    /// Findings of no set (safety tests, the sign-off, the data).
    pub job_wide: Vec<EntryRow>,
    /// Earlier sets: what was found, one line per part or valve.
    pub history: crate::typeset::OnDemand<HistoryRow>,
}

/// One part or valve and what is wrong with it.
#[derive(Debug, Clone, Serialize)]
pub struct EntryRow {
    pub subject: String,
    pub status: String,
    /// Sentences (final set) or short figures (earlier sets), joined.
    pub text: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct AcceptedRow {
    /// "V3 (6V6GT) screen voltage".
    pub subject: String,
    /// The status the figure keeps.
    pub status: String,
    /// The deciding figure: "Vg2 111 % of max".
    pub figure: String,
    /// Why it is off its limit.
    pub reason: String,
    /// Why the technician accepted it.
    pub accepted_reason: String,
    pub by: String,
    /// In words.
    pub date: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct HistoryRow {
    pub label: String,
    pub entries: Vec<EntryRow>,
}

#[derive(Debug, Clone, Serialize)]
pub struct LineUpRow {
    pub position: String,
    pub type_name: String,
    pub role: String,
    /// The ratings row the type resolved to, when it differs or is known.
    pub rated_as: Option<String>,
    pub channel: Option<String>,
    /// Other types fitted in some sets: "5AR4 in “as left”".
    pub changes: Vec<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct PartRow {
    /// The circuit reference, or none for a part without one.
    pub reference: Option<String>,
    /// What the part is ("mains cord"), when the job says.
    pub what: Option<String>,
    pub was: Option<String>,
    pub now: Option<String>,
    pub reason: Option<String>,
    /// "yes", "no" or none when the job does not say.
    pub original_kept: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ModRow {
    pub what: String,
    pub why: Option<String>,
    pub reversible: Option<String>,
    pub original_kept: Option<String>,
    /// Textbook circuit figures worked out for the modification.
    pub figures: Vec<ModFigureRow>,
    /// The network the mod changes: its response before and after.
    pub network: Option<NetworkView>,
}

/// One worked-out figure of a modification.
#[derive(Debug, Clone, Serialize)]
pub struct ModFigureRow {
    /// What kind of figure, in words: "cathode-bypass corner", "stage gain" …
    pub kind: String,
    /// The figure in a sentence, with its inputs ("V1 (12AX7, μ 100, …):
    /// … corner 302 Hz.").
    pub description: String,
    /// The formula used, in plain text.
    pub formula: String,
    /// The figure alone: "302 Hz", or a gain such as "62".
    pub value: Option<String>,
}

/// One measurement set, formatted.
#[derive(Debug, Clone, Serialize)]
pub struct SetContext {
    pub label: String,
    /// The state the unit is handed over in.
    pub is_final: bool,
    /// Where the bias controls were set: "V3, V4 bias: 2 o'clock".
    pub bias_controls: Vec<String>,
    /// Valves fitted with another type in this set: "V5: 5AR4 (line-up:
    /// 5Y3GT)".
    pub type_changes: Vec<String>,
    /// Whether any valve or node of the set names a channel (the tables
    /// then group their rows by channel).
    pub has_channels: bool,
    /// Idle current during the warm-up, or none.
    pub warm_up: Option<WarmUpContext>,
    pub date: Option<String>,
    /// "124 V".
    pub mains: String,
    /// "0.968".
    pub factor: String,
    pub nominal: String,
    pub nodes: Rows<NodeRow>,
    pub valves: Rows<ValveRow>,
    /// True when some valve's plate current includes its screen current.
    pub conservative: bool,
    /// How the idle currents were found, one line per method.
    pub methods: Vec<String>,
    pub windows: Rows<WindowRow>,
    pub resistors: Rows<ResistorRow>,
    pub capacitors: Rows<CapacitorRow>,
    /// A valve rectifier's load against its rating, where it can be judged.
    pub rectifier: Option<RectifierRow>,
    pub heaters: Rows<HeaterRow>,
    /// Droppers (`kind` "dropper") and filter capacitors (`kind`
    /// "filter capacitor") these readings cannot check, and why.
    pub not_checked: Vec<NotCheckedRow>,
    /// Cathode resistors that would bring the valves to the target share
    /// of their rating (estimates).
    pub suggestions: Vec<SuggestionRow>,
    /// Output power, hum and noise, response and gain, when read.
    pub bench: Option<BenchContext>,
}

/// Idle currents at times during a warm-up: a row per time, a column per
/// valve.
#[derive(Debug, Clone, Serialize)]
pub struct WarmUpContext {
    pub valves: Vec<String>,
    pub rows: Vec<WarmUpRow>,
    /// "Ik" when some current includes the screen current, else "Ia".
    pub current_kind: String,
    /// The chart's path, or none.
    pub plot: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct WarmUpRow {
    /// "5 min", "30 s".
    pub time: String,
    /// mA to 0.1 per valve, "–" where that valve was not read then.
    pub currents: Vec<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct NotCheckedRow {
    pub reference: String,
    pub kind: String,
    pub place: String,
    /// "B+3 not measured".
    pub reason: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct NodeRow {
    pub name: String,
    pub channel: Option<String>,
    /// As [`ValveRow::group`].
    pub group: Option<String>,
    pub label: Option<String>,
    pub measured: String,
    pub corrected: String,
    pub expected: Option<String>,
    /// "−1.3 %".
    pub deviation: Option<String>,
    /// "±10 %".
    pub tolerance: String,
    /// ok, cold, caution, over or accepted.
    pub status: String,
    /// When not ok, the deciding figure in a few words.
    pub why: String,
    /// The deciding check's reason as a sentence (not printed by the
    /// built-in template; counted in the table's text length).
    pub reason: Sentence,
}

#[derive(Debug, Clone, Serialize)]
pub struct ValveRow {
    pub position: String,
    pub channel: Option<String>,
    /// On the first row of a channel's group, when the set names channels:
    /// the group's heading ("Channel: left", "Shared").
    pub group: Option<String>,
    pub type_name: String,
    pub role: String,
    pub bias: String,
    pub plate: Option<String>,
    pub screen: Option<String>,
    pub cathode: Option<String>,
    pub grid: Option<String>,
    /// "Ik" when the plate current is taken as the cathode current
    /// (includes the screen current), "Ia" otherwise.
    pub current_kind: String,
    /// The current used for the plate dissipation, mA to 0.1.
    pub current: Option<String>,
    /// Plate dissipation, W to 0.1.
    pub pa: Option<String>,
    pub pa_max: Option<String>,
    pub pa_pct: Option<String>,
    /// % of the rating after correcting to nominal mains.
    pub pa_nominal_pct: Option<String>,
    pub pa_high_line_pct: Option<String>,
    /// Screen dissipation, W to 0.1.
    pub pg2: Option<String>,
    pub pg2_pct: Option<String>,
    /// The worst state that still counts, or accepted.
    pub status: String,
    /// When not ok, the deciding figures in a few words ("screen 196 %").
    pub why: String,
    /// The worst check's reason.
    /// The deciding check's reason as a sentence (not printed by the
    /// built-in template; counted in the table's text length).
    pub reason: Sentence,
}

/// The fixed-bias target window of one valve, as the technician adjusts it.
#[derive(Debug, Clone, Serialize)]
pub struct WindowRow {
    pub position: String,
    /// "50–70 %".
    pub aim: String,
    /// Plate current aim, "19.1–26.8 mA".
    pub plate_current: String,
    /// Plate current now.
    pub plate_current_now: Option<String>,
    /// What to read and where, with today's reading.
    pub readings: Vec<WindowReading>,
    /// "inside", "above" or "below".
    pub place: String,
    /// The grid voltage estimated for the middle of the window, "−22.5 V".
    pub grid_middle: Option<String>,
    /// The grid voltage read now.
    pub grid_now: Option<String>,
    /// Why there is no grid estimate, in the job's language.
    pub grid_unknown: Option<String>,
    /// The note under the readings, as the catalogue says it: the grid
    /// voltage for the middle of the window, else why there is none. Only
    /// for the cells the program writes (`typst_rows`); not a template
    /// value, so it counts nothing in the table's text length.
    #[serde(skip)]
    pub(crate) grid_note: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct WindowReading {
    /// "21.7–29.3 mV".
    pub range: String,
    /// "across the 1 Ω sense resistor R40".
    pub across: String,
    /// Today's reading, when the job has it.
    pub now: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ResistorRow {
    pub reference: String,
    /// dropper, cathode resistor or screen resistor.
    pub kind: String,
    pub place: String,
    pub resistance: String,
    pub rating: Option<String>,
    pub voltage: String,
    pub power: String,
    pub power_pct: Option<String>,
    pub high_line_power: String,
    pub high_line_pct: Option<String>,
    /// ok, cold, caution, over or accepted.
    pub status: String,
    /// When not ok, the deciding figure in a few words.
    pub why: String,
    /// The deciding check's reason as a sentence (not printed by the
    /// built-in template; counted in the table's text length).
    pub reason: Sentence,
}

#[derive(Debug, Clone, Serialize)]
pub struct CapacitorRow {
    pub reference: String,
    pub node: String,
    pub capacitance: Option<String>,
    pub rating: String,
    pub measured: Option<String>,
    pub high_line: Option<String>,
    pub cold_start: Option<String>,
    pub highest: String,
    /// Headroom left on the rating, "15.8 %".
    pub margin: String,
    /// ok, cold, caution, over or accepted.
    pub status: String,
    /// When not ok, the deciding figure in a few words.
    pub why: String,
    /// The deciding check's reason as a sentence (not printed by the
    /// built-in template; counted in the table's text length).
    pub reason: Sentence,
}

/// A valve rectifier's DC load: the output valves' cathode currents summed,
/// so a lower bound of the real load.
#[derive(Debug, Clone, Serialize)]
pub struct RectifierRow {
    pub position: String,
    pub type_name: String,
    /// Whose currents were summed: "cathode currents of V3, V4".
    pub counted: String,
    /// The lower bound, mA to 0.1: "89.2 mA".
    pub load: String,
    /// The rated output current: "150 mA".
    pub rating: String,
    /// "59".
    pub load_pct: String,
    pub status: String,
    pub why: String,
    pub reason: String,
    /// The rule that decided the status, as a sentence.
    pub threshold: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct HeaterRow {
    pub label: Option<String>,
    /// The catalogue's word for a heater without a label, for the cells
    /// the program writes (`typst_rows`); empty when it has a label. Not a
    /// template value.
    #[serde(skip)]
    pub(crate) unnamed: String,
    pub measured: String,
    pub nominal: String,
    pub deviation: String,
    pub corrected: String,
    pub corrected_deviation: String,
    /// ok, cold, caution, over or accepted.
    pub status: String,
    /// When not ok, the deciding figure in a few words.
    pub why: String,
    /// The deciding check's reason as a sentence (not printed by the
    /// built-in template; counted in the table's text length).
    pub reason: Sentence,
}

/// Paths of the charts in the typesetting folder, when there is something
/// to draw.
#[derive(Debug, Clone, Default, Serialize)]
pub struct Plots {
    /// The first (usually the only) dissipation chart.
    pub dissipation: Option<String>,
    /// The first (usually the only) supply chart.
    pub supply: Option<String>,
    /// Every dissipation chart: one, or for a long job one per group of
    /// at most 8 sets and 12 valves, each saying which.
    pub dissipation_charts: Vec<ChartFile>,
    /// Every supply chart, cut like `dissipation_charts`.
    pub supply_charts: Vec<ChartFile>,
    /// Every response chart, at most 8 curves each.
    pub response_charts: Vec<ChartFile>,
    /// The guide drawn on the dissipation chart, in words.
    pub dissipation_guide: Option<String>,
    /// The nominal mains the supply chart is corrected to.
    pub supply_nominal: String,
    /// The frequency-response chart.
    pub response: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct SafetyContext {
    /// Whether the job records a safety block at all.
    pub recorded: bool,
    /// "Class I (protectively earthed)".
    pub class: Option<String>,
    pub tests: Vec<SafetyRow>,
}

#[derive(Debug, Clone, Serialize)]
pub struct SafetyRow {
    pub test: String,
    pub measured: String,
    pub limit: String,
    /// "pass" or "fail".
    pub result: String,
    pub status: String,
}

/// What the method appendix needs beyond its fixed text.
#[derive(Debug, Clone, Serialize)]
pub struct Method {
    /// Which bands the shop profile and the job set, as a sentence, or none
    /// when all are the built-in defaults.
    pub bands_from: Option<String>,
    pub nominal: String,
    pub tolerance: String,
    pub high_line: String,
    pub design: Option<String>,
    pub fixed_bias_low: String,
    pub fixed_bias_high: String,
    pub cathode_bias_caution: String,
    pub resistor_derating: String,
    pub capacitor_margin: String,
    pub heater_tolerance: String,
    pub node_tolerance: String,
    pub silicon_drop: String,
    /// How far above a voltage maximum counts as over ("20 %").
    pub voltage_over: String,
    /// The bench-test bands: "80 %", "60 dB".
    pub output_power_caution: String,
    pub hum_noise_caution: String,
    /// The share of Pa(max) a cathode-resistor suggestion aims at, "85 %".
    pub cathode_bias_target: String,
    /// Whether any set has bench tests, cathode-resistor suggestions, or a
    /// fixed-bias grid estimate.
    pub uses_bench: bool,
    pub uses_resistor_suggestion: bool,
    pub uses_grid_estimate: bool,
    /// Which assumptions this job's figures lean on.
    pub uses_conservative_rule: bool,
    pub uses_shared_cathode: bool,
    pub uses_shared_half_primary: bool,
    pub uses_fixed_bias: bool,
    pub uses_cathode_bias: bool,
    pub uses_cold_start: bool,
    pub ratings: Vec<RatingRow>,
}

#[derive(Debug, Clone, Serialize)]
pub struct RatingRow {
    pub name: String,
    pub equivalents: Vec<String>,
    pub class: String,
    pub positions: Vec<String>,
    /// "Pa 12 W, Pg2 2 W" where the document used them.
    pub limits: Option<String>,
    pub source: String,
    /// "built in" or the shop file.
    pub origin: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct Footer {
    /// The shop's name, cut to [`FOOTER_ID_CHARS`], or none without a profile.
    pub shop: Option<String>,
    /// The job id on one line, cut to [`FOOTER_ID_CHARS`].
    pub job_id: String,
    pub tool_version: String,
    pub typst_version: String,
    /// The first 12 hex digits of the job file's SHA-256.
    pub job_digest: String,
    /// The commit that last changed the job file, when it is in git
    /// (the footer then shows it in place of the digest).
    pub commit: Option<String>,
    /// The job file differs from that commit.
    pub uncommitted_changes: bool,
}

/// Inputs of [`build_context`] that do not come from the job.
#[derive(Debug, Clone)]
pub struct ContextInputs<'a> {
    pub shop: ShopBlock,
    /// The shop profile in use, if any.
    pub profile: Option<&'a ShopProfile>,
    /// Whether the job's charges are shown.
    pub include_charges: bool,
    pub tool_version: &'a str,
    pub typst_version: &'a str,
    pub job_digest: &'a str,
    /// The dissipation charts drawn (none when there was nothing to draw).
    pub dissipation_charts: Vec<ChartFile>,
    /// The supply charts drawn.
    pub supply_charts: Vec<ChartFile>,
    /// Where the job file stands in git, if it is in a repository.
    pub revision: Option<&'a crate::git::Revision>,
    /// Every photo of the job.
    pub photos: Vec<PhotoRow>,
    /// The sets (by index, in ascending order) that have a warm-up chart.
    pub warm_up_plots: Vec<usize>,
    /// The frequency-response charts drawn.
    pub response_charts: Vec<ChartFile>,
    /// The fixed words, in the document's language.
    pub catalogue: &'a Catalogue,
}

/// A valve's role in words ("output", "rectifier"), from its name in the
/// findings.
fn role_words(role: &str, cat: &Catalogue) -> String {
    cat.try_format(&format!("role-{}", role.replace([' ', '_'], "-")), &[])
        .unwrap_or_else(|| role.to_string())
}

/// A date in words in English: "9 November 2026" (see
/// [`Catalogue::date`] for other languages).
pub fn date_words(d: NaiveDate) -> String {
    d.format("%-d %B %Y").to_string()
}

/// A number with a typographic minus sign.
fn minus(mut s: String) -> String {
    if s.starts_with('-') {
        s.replace_range(..1, "\u{2212}");
    }
    s
}

/// Three significant figures, no unit: volts in tables.
fn sig3(v: f64) -> String {
    minus(format_sig(v, 3))
}

/// `v` to `decimals` decimals with a typographic minus sign,
/// `minus(format_fixed(v, decimals))`.
fn fixed(v: f64, decimals: usize) -> String {
    let mut out = String::with_capacity(12);
    push_fixed(&mut out, v, decimals);
    out
}

/// [`fixed`] appended to `out`, so that a cell of several figures and
/// words ("26.8–37.6 mA") is written into one string, without a string
/// of its own for each figure and `format!` to join them: the same text
/// as `minus(format_fixed(v, decimals))` (a test holds the two equal).
fn push_fixed(out: &mut String, v: f64, decimals: usize) {
    if !v.is_finite() {
        out.push('–');
        return;
    }
    if let Some(n) = scaled_figure(v, decimals) {
        // A negative value that rounds to zero prints as zero.
        if n > 0 && v.is_sign_negative() {
            out.push('\u{2212}');
        }
        push_decimal(out, n, decimals);
        return;
    }
    let start = out.len();
    write_fixed(out, v, decimals, false);
    if out[start..].starts_with('-') {
        if out[start + 1..].bytes().all(|b| b == b'0' || b == b'.') {
            // A negative value that rounds to zero prints as zero.
            out.remove(start);
        } else {
            out.replace_range(start..start + 1, "\u{2212}");
        }
    }
}

/// The size of `v` to `decimals` decimals (0 to 3) as a whole number n,
/// |v| ≈ n ÷ 10^decimals, found by the same arithmetic as the fast path
/// of [`write_fixed`], where that path takes `v`: a finite value below
/// 10^9 once scaled whose fraction is not within 10^-6 of one half. For
/// any other value `None`, and the figure is written by `write_fixed`.
///
/// The tables' figures are some 80,000 on a 1,000-set job; `write_fixed`
/// wrote each through `itoa` and three pieces, after its own scaling
/// (the floor a library call on this target), at about 200 instructions
/// a figure, where the few digits of a table's figure take a fraction of
/// that written here. `figures_written_in_place_are_the_formatted_ones`
/// holds the two to each other.
fn scaled_figure(v: f64, decimals: usize) -> Option<u64> {
    const SCALE: [f64; 4] = [1.0, 10.0, 100.0, 1e3];
    let scaled = v.abs() * SCALE.get(decimals)?;
    if !scaled.is_finite() || scaled >= 1e9 {
        return None;
    }
    // The floor of a value from 0 to 10^9, exactly (through i64, which
    // the processor converts in one step).
    let whole = scaled as i64;
    let fraction = scaled - whole as f64;
    ((fraction - 0.5).abs() > 1e-6).then(|| whole.unsigned_abs() + u64::from(fraction > 0.5))
}

/// `n` ÷ 10^`decimals` with exactly `decimals` decimals ("12.34" for
/// 1234 and 2, "0.05" for 5 and 2), for `n` below 10^10 and `decimals`
/// at most 3, as `write_fixed` writes the digits.
fn push_decimal(out: &mut String, n: u64, decimals: usize) {
    // Ten digits, the point and no more than three zeros before them.
    let mut digits = [0u8; 16];
    let mut at = digits.len();
    let mut rest = n;
    let mut written = 0;
    loop {
        if written == decimals && decimals > 0 {
            at -= 1;
            digits[at] = b'.';
        }
        at -= 1;
        digits[at] = b'0' + (rest % 10) as u8;
        rest /= 10;
        written += 1;
        if rest == 0 && written > decimals {
            break;
        }
    }
    let digits = &digits[at..];
    out.reserve(digits.len());
    for &b in digits {
        out.push(char::from(b));
    }
}

/// [`fixed`] and a unit after a space: "40.8 mA".
fn fixed_unit(v: f64, decimals: usize, unit: &str) -> String {
    let mut out = String::with_capacity(12 + unit.len());
    push_fixed(&mut out, v, decimals);
    out.push(' ');
    out.push_str(unit);
    out
}

/// Two figures of [`fixed`] joined by a dash, and a unit after a space:
/// "26.8–37.6 mA", "50–70 %".
fn fixed_range(a: f64, b: f64, decimals: usize, unit: &str) -> String {
    let mut out = String::with_capacity(24 + unit.len());
    push_fixed(&mut out, a, decimals);
    out.push('–');
    push_fixed(&mut out, b, decimals);
    out.push(' ');
    out.push_str(unit);
    out
}

/// [`format_sig`] to three figures, then `words` after it: "100 µF".
fn sig3_then(v: f64, words: &str) -> String {
    let mut out = format_sig(v, 3);
    out.push_str(words);
    out
}

/// A whole-number percentage without the sign: "121".
pub(crate) fn pct0(v: f64) -> String {
    fixed(v, 0)
}

/// A signed percentage to 0.1: "+1.2 %", "−2.9 %".
fn signed_pct(v: f64) -> String {
    let mut out = String::with_capacity(14);
    // The size to 0.1, as `format_fixed(v.abs(), 1)` writes it (never
    // with a minus: `abs` clears the sign).
    push_fixed(&mut out, v.abs(), 1);
    if !out.bytes().all(|b| b == b'0' || b == b'.') {
        out.insert_str(0, if v < 0.0 { "\u{2212}" } else { "+" });
    }
    out.push_str(" %");
    out
}

pub(crate) fn volts(v: f64) -> String {
    minus(format_engineering(v, Q::Voltage))
}

pub(crate) fn yes_no(b: Option<bool>, cat: &Catalogue) -> Option<String> {
    b.map(|b| cat.text(if b { "doc-yes" } else { "doc-no" }))
}

pub(crate) fn status(s: Status) -> String {
    s.word().to_string()
}

/// Capital first letter, full stop at the end.
fn sentence(s: &str) -> String {
    let s = glue_units(s);
    let mut c = s.chars();
    let mut out = match c.next() {
        Some(f) => f.to_uppercase().collect::<String>() + c.as_str(),
        None => String::new(),
    };
    if !out.is_empty() && !out.ends_with('.') {
        out.push('.');
    }
    out
}

/// A checker's reason for a table row as [`sentence`] words it, made only
/// when a template reads it. The built-in template never prints a row's
/// reason, but its characters count in the table's text length, which
/// decides whether the table is kept whole: that count is worked out from
/// the reason as the checker wrote it ([`CountedText::char_count`]), the
/// same number as the sentence's characters (a test holds the two equal).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Sentence(String);

impl Sentence {
    /// The reason as the checker wrote it.
    pub fn new(reason: &str) -> Self {
        Sentence(reason.to_owned())
    }
}

impl CountedText for Sentence {
    fn text(&self) -> String {
        sentence(&self.0)
    }

    fn char_count(&self) -> usize {
        // `sentence` changes only spaces into no-break spaces (one
        // character for one, never the last), the first letter into its
        // capital (which may be more than one character) and adds a full
        // stop where there is none.
        let mut chars = self.0.chars();
        match chars.next() {
            None => 0,
            Some(first) => {
                // An ASCII letter's capital is one character.
                let capital = if first.is_ascii() {
                    1
                } else {
                    first.to_uppercase().count()
                };
                capital + chars.count() + usize::from(!self.0.ends_with('.'))
            }
        }
    }
}

impl Serialize for Sentence {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serialize_counted_text(self, serializer)
    }
}

/// Joins the lines of hand-wrapped text. Technicians wrap long fields by
/// hand in the job file; on the page a single line break inside a paragraph
/// becomes a space, an empty line still separates paragraphs, and a line
/// that starts like a list item (`- `, `* `, `• `, `1. `, `2) `) keeps its
/// break. Only whitespace changes.
pub fn reflow(text: &str) -> String {
    let text = text.replace("\r\n", "\n").replace('\r', "\n");
    let mut out = String::with_capacity(text.len());
    let mut blank_run = false;
    for line in text.split('\n') {
        let trimmed = line.trim();
        if trimmed.is_empty() {
            blank_run = !out.is_empty();
            continue;
        }
        if out.is_empty() {
            out.push_str(trimmed);
        } else if blank_run {
            out.push_str("\n\n");
            out.push_str(trimmed);
        } else if looks_like_list_item(trimmed) {
            out.push('\n');
            out.push_str(trimmed);
        } else {
            out.push(' ');
            out.push_str(trimmed);
        }
        blank_run = false;
    }
    out
}

fn looks_like_list_item(line: &str) -> bool {
    if ["- ", "* ", "• ", "– ", "+ "]
        .iter()
        .any(|m| line.starts_with(m))
    {
        return true;
    }
    let digits = line.chars().take_while(char::is_ascii_digit).count();
    digits > 0 && (line[digits..].starts_with(". ") || line[digits..].starts_with(") "))
}

/// Unit symbols that should stay on the line of their number.
const UNIT_WORDS: &[&str] = &[
    "V", "mV", "kV", "W", "mW", "A", "mA", "µA", "Ω", "mΩ", "kΩ", "MΩ", "µF", "nF", "pF", "Hz", "%",
];

/// Puts a no-break space between a number and its unit in a sentence the
/// program wrote ("349 V"), so a line never breaks between them.
pub fn glue_units(text: &str) -> String {
    glued(text).unwrap_or_else(|| text.to_owned())
}

/// [`glue_units`], or nothing when the text has no unit to glue (the
/// caller keeps the text it has rather than a copy).
fn glued(text: &str) -> Option<String> {
    let mut out: Option<String> = None;
    let mut copied = 0;
    // Byte by byte: the texts are short, where a search for each space
    // cost more than the loop. A space byte is a whole character, and so
    // is an ASCII digit before it: every byte of a longer UTF-8 character
    // is ≥ 0x80.
    let bytes = text.as_bytes();
    for i in 1..bytes.len() {
        if bytes[i] != b' ' || !bytes[i - 1].is_ascii_digit() {
            continue;
        }
        let rest = &text[i + 1..];
        let word = &rest[..rest.find(char::is_whitespace).unwrap_or(rest.len())];
        if UNIT_WORDS.contains(&word.trim_end_matches(['.', ',', ';', ':', ')', '('])) {
            let out = out.get_or_insert_with(|| String::with_capacity(text.len() + 8));
            out.push_str(&text[copied..i]);
            out.push('\u{a0}');
            copied = i + 1;
        }
    }
    let mut out = out?;
    out.push_str(&text[copied..]);
    Some(out)
}

/// `typographic_minus(&glue_units(&text))`, taking the text: one that
/// needs neither change is handed back as it is, not copied twice.
fn tidy_words(text: String) -> String {
    let text = glued(&text).unwrap_or(text);
    if text.contains('-') {
        typographic_minus(&text)
    } else {
        text
    }
}

/// From this many measurement sets on, the sets' contexts are made in
/// parallel (see docs/performance.md, "Seventh pass").
const PARALLEL_SETS: usize = 32;

/// Builds the context for `job` and its findings.
pub fn build_context(
    job: &Job,
    findings: &Findings,
    inputs: &ContextInputs<'_>,
) -> HandoverContext {
    let unit = &job.unit;
    let cat = inputs.catalogue;
    let date_words = |d: NaiveDate| cat.date(d);
    let title = cat.format(
        "doc-title",
        &[
            ("id", Arg::from(&job.info.id)),
            ("make", Arg::from(&unit.make)),
            ("model", Arg::from(&unit.model)),
        ],
    );
    let m = &findings.mains;
    let mains = MainsInfo {
        nominal: volts(m.nominal_volts),
        frequency: m.frequency_hz.map(|f| format!("{} Hz", format_sig(f, 3))),
        tolerance: format!("+{} %", format_sig(m.tolerance_pct, 3)),
        high_line: volts(m.high_line_volts),
        design: m.design_volts.map(volts),
    };
    let part_words = PartWords::of(findings);
    let one_set = |(i, set): (usize, &SetFindings)| {
        // The sets with a warm-up chart, listed in set order.
        let plot = inputs
            .warm_up_plots
            .binary_search(&i)
            .is_ok()
            .then(|| warm_up_plot(i));
        set_context(findings, set, plot, &part_words, cat)
    };
    // Each set's context depends on the findings alone: a long job's are
    // made on every core (in the order of the sets, as before); a short
    // job's on this thread, where handing them out would cost more.
    let sets: Vec<SetContext> = if findings.sets.len() >= PARALLEL_SETS {
        use rayon::prelude::*;
        findings.sets.par_iter().enumerate().map(one_set).collect()
    } else {
        findings.sets.iter().enumerate().map(one_set).collect()
    };
    let mut authors: Vec<String> = job.info.technician.iter().cloned().collect();
    if !inputs.shop.neutral {
        authors.push(inputs.shop.name.clone());
    }
    let description = if inputs.shop.neutral {
        cat.format("doc-description", &[("id", Arg::from(&job.info.id))])
    } else {
        cat.format(
            "doc-description-shop",
            &[
                ("id", Arg::from(&job.info.id)),
                ("shop", Arg::from(&inputs.shop.name)),
            ],
        )
    };
    HandoverContext {
        document: DocumentInfo {
            title,
            author: job
                .info
                .technician
                .clone()
                .unwrap_or_else(|| inputs.shop.name.clone()),
            authors,
            description,
            paper: paper(inputs.profile, job).typst_name().to_string(),
            lang: cat.language().to_string(),
        },
        shop: inputs.shop.clone(),
        job: JobInfo {
            id: job.info.id.clone(),
            received: job.info.received.map(date_words),
            completed: job.info.completed.map(date_words),
            technician: job.info.technician.clone(),
        },
        unit: UnitInfo {
            make: unit.make.clone(),
            model: unit.model.clone(),
            serial: unit.serial.clone(),
            year: unit.year.map(|y| y.to_string()),
            description: unit.description.as_deref().map(reflow),
            condition: unit.condition.as_deref().map(reflow),
        },
        customer: job.customer.as_ref().map(|c| CustomerInfo {
            name: c.name.clone(),
            contacts: c.contacts.clone(),
        }),
        mains,
        summary: summary_context(&crate::report::summary::summary(job, findings, cat)),
        glance: glance(findings, cat),
        attention: attention_context(&attention::attention(findings, cat), cat),
        complaint: job.complaint.as_deref().map(reflow),
        findings: job.findings.as_ref().map(|r| reflow(&r.text)),
        work: job.work.as_ref().map(|r| reflow(&r.text)),
        valves: findings
            .line_up
            .iter()
            .map(|v| LineUpRow {
                position: v.position.clone(),
                type_name: v.valve_type.clone(),
                role: role_words(&v.role, cat),
                rated_as: v.rating_name.clone(),
                channel: v.channel.clone(),
                changes: v
                    .changes
                    .iter()
                    .map(|c| {
                        cat.format(
                            "doc-type-in-set",
                            &[
                                ("type", Arg::from(&c.valve_type)),
                                ("set", Arg::from(&c.set)),
                            ],
                        )
                    })
                    .collect(),
            })
            .collect(),
        parts: job
            .parts
            .iter()
            .map(|p| PartRow {
                reference: p.reference.clone(),
                what: p.what.clone(),
                was: p.was.as_deref().map(glue_units),
                now: p.now.as_deref().map(glue_units),
                reason: p.reason.as_deref().map(|r| glue_units(&reflow(r))),
                original_kept: yes_no(p.original_kept, cat),
            })
            .collect(),
        mods: job
            .mods
            .iter()
            .enumerate()
            .map(|(i, m)| ModRow {
                what: glue_units(&reflow(&m.what)),
                why: m.why.as_deref().map(|w| glue_units(&reflow(w))),
                reversible: yes_no(m.reversible, cat),
                original_kept: yes_no(m.original_kept, cat),
                // Findings list the mods in job order, one each.
                figures: findings
                    .mods
                    .get(i)
                    .filter(|f| f.what == m.what)
                    .map(|f| mod_figures(f, cat))
                    .unwrap_or_default(),
                network: findings
                    .mods
                    .get(i)
                    .filter(|f| f.what == m.what)
                    .and_then(|f| f.network.as_ref())
                    .map(|n| network_view(i, n, cat)),
            })
            .collect(),
        notes: job.notes.iter().map(|n| reflow(&n.text)).collect(),
        photos: inputs.photos.clone(),
        sets: crate::typeset::OnDemand::new(sets),
        plots: plots(findings, inputs),
        safety: safety(job, findings, cat),
        method: method(findings, job, inputs.profile, cat),
        acceptance: acceptance(job, inputs.profile, cat),
        charges: job
            .charges
            .as_ref()
            .filter(|_| inputs.include_charges)
            .and_then(|c| charges_context(c, cat)),
        footer: Footer {
            shop: (!inputs.shop.neutral)
                .then(|| crate::report::plots::label_text(&inputs.shop.name, FOOTER_ID_CHARS)),
            job_id: crate::report::plots::label_text(&job.info.id, FOOTER_ID_CHARS),
            tool_version: inputs.tool_version.to_string(),
            typst_version: inputs.typst_version.to_string(),
            job_digest: inputs.job_digest.to_string(),
            commit: inputs.revision.map(|r| r.commit.clone()),
            uncommitted_changes: inputs.revision.is_some_and(|r| r.uncommitted_changes),
        },
        catalogue: cat.clone(),
    }
}

fn glance(findings: &Findings, cat: &Catalogue) -> Glance {
    let basis = match findings.sets.iter().find(|s| s.is_final) {
        Some(set) => {
            let date = set
                .date
                .as_deref()
                .and_then(|d| NaiveDate::parse_from_str(d, "%Y-%m-%d").ok())
                .map(|d| cat.date(d));
            let mut words = cat.format(
                "doc-glance-basis",
                &[
                    ("label", Arg::from(&set.label)),
                    ("mains", Arg::from(volts(set.mains_volts))),
                ],
            );
            if let Some(d) = date {
                words.push_str(&format!(", {d}"));
            }
            words
        }
        None => cat.text("doc-glance-none"),
    };
    let mut overall = Status::Ok;
    let families = findings
        .at_a_glance
        .iter()
        .map(|f| {
            overall = overall.worst(f.status);
            let state = if f.status == Status::Ok && !f.accepted.is_empty() {
                "accepted".to_string()
            } else if f.measured || f.status != Status::Ok {
                status(f.status)
            } else {
                "none".to_string()
            };
            GlanceRow {
                title: f.title.to_string(),
                status: state,
                worst: sentence(&f.worst),
            }
        })
        .collect();
    Glance {
        basis,
        families,
        overall: status(overall),
    }
}

/// The channels in the order the line-up first names them; rows without a
/// channel come first.
fn channel_order(findings: &Findings, channel: &Option<String>) -> usize {
    match channel {
        None => 0,
        Some(c) => {
            1 + findings
                .line_up
                .iter()
                .filter_map(|v| v.channel.as_ref())
                .position(|x| x == c)
                .unwrap_or(usize::MAX - 1)
        }
    }
}

/// A time in minutes as a technician writes it: "30 s", "5 min", "1.5 h".
fn minutes_words(m: f64) -> String {
    if m < 1.0 {
        format!("{} s", format_sig(m * 60.0, 3))
    } else if m < 120.0 {
        format!("{} min", format_sig(m, 3))
    } else {
        format!("{} h", format_sig(m / 60.0, 3))
    }
}

fn warm_up_context(set: &SetFindings, plot: Option<String>) -> Option<WarmUpContext> {
    if set.warm_up.is_empty() {
        return None;
    }
    let mut valves: Vec<String> = Vec::new();
    let mut times: Vec<f64> = Vec::new();
    for p in &set.warm_up {
        if !valves.contains(&p.position) {
            valves.push(p.position.clone());
        }
        if !times.iter().any(|t| (t - p.minutes).abs() < 1e-9) {
            times.push(p.minutes);
        }
    }
    times.sort_by(f64::total_cmp);
    let rows = times
        .iter()
        .map(|t| WarmUpRow {
            time: minutes_words(*t),
            currents: valves
                .iter()
                .map(|v| {
                    set.warm_up
                        .iter()
                        .find(|p| &p.position == v && (p.minutes - t).abs() < 1e-9)
                        .and_then(|p| p.current_ma)
                        .map(|i| fixed(i, 1))
                        .unwrap_or_else(|| "–".to_string())
                })
                .collect(),
        })
        .collect();
    Some(WarmUpContext {
        valves,
        rows,
        current_kind: if set.warm_up.iter().any(|p| p.includes_screen) {
            "Ik".into()
        } else {
            "Ia".into()
        },
        plot,
    })
}

fn set_context(
    findings: &Findings,
    set: &SetFindings,
    warm_up_plot: Option<String>,
    part_words: &PartWords,
    cat: &Catalogue,
) -> SetContext {
    let nominal = findings.mains.nominal_volts;
    let date = set
        .date
        .as_deref()
        .and_then(|d| NaiveDate::parse_from_str(d, "%Y-%m-%d").ok())
        .map(|d| cat.date(d));
    let mut methods: Vec<(CurrentMethod, Vec<String>)> = Vec::new();
    for v in &set.valves {
        if let Some(m) = v.method {
            match methods.iter_mut().find(|(k, _)| *k == m) {
                Some((_, list)) => list.push(v.position.clone()),
                None => methods.push((m, vec![v.position.clone()])),
            }
        }
    }
    let windows = set
        .valves
        .iter()
        .filter_map(|v| window_row(v, cat))
        .collect();
    let kind = |key: &str| cat.text(key);
    let resistors = set
        .droppers
        .iter()
        .map(|r| resistor_row(r, &kind("doc-kind-dropper"), part_words))
        .chain(
            set.cathode_resistors
                .iter()
                .map(|r| resistor_row(r, &kind("doc-kind-cathode-resistor"), part_words)),
        )
        .chain(
            set.screen_resistors
                .iter()
                .map(|r| resistor_row(r, &kind("doc-kind-screen-resistor"), part_words)),
        )
        .collect();
    let mut valves: Vec<ValveRow> = set.valves.iter().map(valve_row).collect();
    valves.sort_by_key(|v| channel_order(findings, &v.channel));
    let mut nodes: Vec<NodeRow> = set.nodes.iter().map(node_row).collect();
    nodes.sort_by_key(|n| channel_order(findings, &n.channel));
    let has_channels =
        valves.iter().any(|v| v.channel.is_some()) || nodes.iter().any(|n| n.channel.is_some());
    if has_channels {
        let heading = |c: &Option<String>| match c {
            Some(c) => cat.format("doc-group-channel", &[("channel", Arg::from(c))]),
            None => cat.text("doc-group-shared"),
        };
        for i in 0..valves.len() {
            if i == 0 || valves[i].channel != valves[i - 1].channel {
                valves[i].group = Some(heading(&valves[i].channel));
            }
        }
        for i in 0..nodes.len() {
            if i == 0 || nodes[i].channel != nodes[i - 1].channel {
                nodes[i].group = Some(heading(&nodes[i].channel));
            }
        }
    }
    let type_changes = set
        .valves
        .iter()
        .map(|v| (&v.position, &v.valve_type))
        .chain(findings.line_up.iter().flat_map(|l| {
            l.changes
                .iter()
                .filter(|c| c.set == set.label)
                .map(move |c| (&l.position, &c.valve_type))
        }))
        .filter_map(|(pos, t)| {
            let l = findings.line_up.iter().find(|l| &l.position == pos)?;
            (&l.valve_type != t).then(|| {
                cat.format(
                    "doc-type-change",
                    &[
                        ("position", Arg::from(pos)),
                        ("type", Arg::from(t)),
                        ("line_up", Arg::from(&l.valve_type)),
                    ],
                )
            })
        })
        .fold(Vec::new(), |mut acc: Vec<String>, x| {
            if !acc.contains(&x) {
                acc.push(x);
            }
            acc
        });
    SetContext {
        label: set.label.clone(),
        is_final: set.is_final,
        bias_controls: set
            .bias_controls
            .iter()
            .map(|b| match &b.label {
                Some(l) => format!("{l}: {}", b.position),
                None => b.position.clone(),
            })
            .collect(),
        type_changes,
        has_channels,
        warm_up: warm_up_context(set, warm_up_plot),
        date,
        mains: volts(set.mains_volts),
        factor: crate::units::fixed(set.correction_factor, 3),
        nominal: volts(nominal),
        nodes: nodes.into(),
        valves: valves.into(),
        conservative: set
            .valves
            .iter()
            .any(|v| v.plate_current_includes_screen && v.plate_current_ma.is_some()),
        methods: methods
            .into_iter()
            .map(|(m, positions)| format!("{} ({})", cat.text(m.key()), positions.join(", ")))
            .collect(),
        windows,
        resistors,
        capacitors: set.filter_capacitors.iter().map(capacitor_row).collect(),
        rectifier: set.rectifier.as_ref().map(|r| rectifier_row(r, set, cat)),
        heaters: set.heaters.iter().map(|h| heater_row(h, cat)).collect(),
        suggestions: set
            .cathode_resistor_suggestions
            .iter()
            .map(|s| bench::suggestion_row(s, findings.settings.cathode_bias_caution_pct, cat))
            .collect(),
        bench: bench::bench_context(&set.bench, cat),
        not_checked: set
            .not_checked
            .iter()
            .map(|n| NotCheckedRow {
                reference: n.reference.clone(),
                kind: cat
                    .try_format(&format!("doc-kind-{}", n.kind.replace('_', "-")), &[])
                    .unwrap_or_else(|| n.kind.replace('_', " ")),
                place: n.place.clone(),
                reason: n.reason.clone(),
            })
            .collect(),
    }
}

/// A figure's few words of why, with a typographic minus.
fn why(v: &crate::calc::Verdict) -> String {
    tidy_words(attention::why(v))
}

/// Turns a hyphen that stands for a minus sign (before a digit, at the
/// start or after a space or bracket) into U+2212.
fn typographic_minus(s: &str) -> String {
    if !s.contains('-') {
        return s.to_owned();
    }
    let mut out = String::with_capacity(s.len() + 4);
    let mut before = None;
    let mut chars = s.chars().peekable();
    while let Some(c) = chars.next() {
        let before_ok = before.is_none_or(|b| matches!(b, ' ' | '\u{a0}' | '('));
        let digit_after = chars.peek().is_some_and(char::is_ascii_digit);
        if c == '-' && before_ok && digit_after {
            out.push('\u{2212}');
        } else {
            out.push(c);
        }
        before = Some(c);
    }
    out
}

fn summary_context(s: &Summary) -> SummaryContext {
    let tidy = |v: &Vec<String>| v.iter().map(|l| glue_units(l)).collect();
    SummaryContext {
        found: tidy(&s.found),
        done: tidy(&s.done),
        now: tidy(&s.now),
        healthy: s.healthy,
    }
}

fn attention_context(a: &Attention, cat: &Catalogue) -> AttentionContext {
    let entry = |e: &attention::Entry, joiner: &str| EntryRow {
        subject: e.subject.clone(),
        status: status(e.status),
        text: tidy_words(e.lines.join(joiner)),
    };
    AttentionContext {
        final_label: a.final_label.clone(),
        open: a.open.iter().map(|e| entry(e, " ")).collect(),
        accepted: a
            .accepted
            .iter()
            .map(|e| AcceptedRow {
                subject: e.subject.clone(),
                status: status(e.status),
                figure: typographic_minus(&glue_units(&e.brief)),
                reason: glue_units(&e.reason),
                accepted_reason: glue_units(&e.accepted_reason),
                by: e.by.clone(),
                date: NaiveDate::parse_from_str(&e.date, "%Y-%m-%d")
                    .map(|d| cat.date(d))
                    .unwrap_or_else(|_| e.date.clone()),
            })
            .collect(),
        job_wide: a.job_wide.iter().map(|e| entry(e, " ")).collect(),
        history: crate::typeset::OnDemand::new(
            a.history
                .iter()
                .map(|h| HistoryRow {
                    label: h.label.clone(),
                    entries: h.entries.iter().map(|e| entry(e, ", ")).collect(),
                })
                .collect(),
        ),
    }
}

fn node_row(n: &NodeFindings) -> NodeRow {
    NodeRow {
        name: n.name.clone(),
        channel: n.channel.clone(),
        group: None,
        label: n.label.clone(),
        measured: sig3(n.measured_volts),
        corrected: sig3(n.corrected_volts),
        expected: n.expected_volts.map(sig3),
        deviation: n.deviation_pct.map(signed_pct),
        tolerance: {
            let mut band = String::with_capacity(16);
            band.push('±');
            band.push_str(&format_sig(n.tolerance_pct, 3));
            band.push_str(" %");
            band
        },
        status: attention::state(&n.verdict).to_string(),
        why: why(&n.verdict),
        reason: Sentence::new(&n.verdict.reason),
    }
}

fn valve_row(v: &ValveFindings) -> ValveRow {
    let worst = v
        .checks
        .iter()
        .fold(None, |best: Option<&crate::calc::Check>, c| {
            if best.is_none_or(|b| c.verdict.status.rank() > b.verdict.status.rank()) {
                Some(c)
            } else {
                best
            }
        });
    ValveRow {
        position: v.position.clone(),
        channel: v.channel.clone(),
        group: None,
        type_name: v.valve_type.clone(),
        role: v.role.replace('_', " "),
        bias: v.bias.clone(),
        plate: v.plate_volts.map(sig3),
        screen: v.screen_volts.map(sig3),
        cathode: v.cathode_volts.map(sig3),
        grid: v.grid_volts.map(sig3),
        current_kind: if v.plate_current_includes_screen {
            "Ik".into()
        } else {
            "Ia".into()
        },
        current: v.plate_current_ma.map(|i| fixed(i, 1)),
        pa: v.plate_dissipation_w.map(|w| fixed(w, 1)),
        pa_max: v.plate_dissipation_max_w.map(|w| format_sig(w, 3)),
        pa_pct: v.plate_dissipation_pct.map(pct0),
        pa_nominal_pct: v.corrected_plate_dissipation_pct.map(pct0),
        pa_high_line_pct: v.high_line_plate_dissipation_pct.map(pct0),
        pg2: v.screen_dissipation_w.map(|w| fixed(w, 1)),
        pg2_pct: v.screen_dissipation_pct.map(pct0),
        status: attention::valve_state(v).to_string(),
        why: tidy_words(attention::valve_why(v)),
        reason: worst
            .map(|c| Sentence::new(&c.verdict.reason))
            .unwrap_or_default(),
    }
}

fn window_row(v: &ValveFindings, cat: &Catalogue) -> Option<WindowRow> {
    let w = v.target_window.as_ref()?;
    let mut readings = Vec::new();
    if let (Some(a), Some(b)) = (w.sense_low_mv, w.sense_high_mv) {
        let across = match (w.sense_resistor_ohms, &w.sense_resistor_reference) {
            (Some(ohms), Some(reference)) => cat.format(
                "doc-across-sense-named",
                &[
                    ("ohms", Arg::from(format_engineering(ohms, Q::Resistance))),
                    ("reference", Arg::from(reference)),
                ],
            ),
            (Some(ohms), None) => cat.format(
                "doc-across-sense-value",
                &[("ohms", Arg::from(format_engineering(ohms, Q::Resistance)))],
            ),
            _ => cat.text("doc-across-sense"),
        };
        readings.push(WindowReading {
            range: fixed_range(a, b, 1, "mV"),
            across,
            now: w.sense_now_mv.map(|mv| fixed_unit(mv, 1, "mV")),
        });
    }
    if let (Some(a), Some(b)) = (w.primary_drop_low_volts, w.primary_drop_high_volts) {
        let across = match w.half_primary_ohms {
            Some(ohms) => {
                let value = format_engineering(ohms, Q::Resistance);
                if w.half_primary_shared_with.is_empty() {
                    cat.format("doc-across-primary-value", &[("ohms", Arg::from(value))])
                } else {
                    cat.format(
                        "doc-across-primary-shared",
                        &[
                            ("ohms", Arg::from(value)),
                            ("others", Arg::from(w.half_primary_shared_with.join(", "))),
                        ],
                    )
                }
            }
            None => cat.text("doc-across-primary"),
        };
        readings.push(WindowReading {
            range: fixed_range(a, b, 2, "V"),
            across,
            now: w.primary_drop_now_volts.map(|d| fixed_unit(d, 2, "V")),
        });
    }
    if readings.is_empty()
        && let (Some(a), Some(b)) = (w.probe_low_ma, w.probe_high_ma)
    {
        let now = v.cathode_current_ma.map(|i| fixed_unit(i, 1, "mA"));
        readings.push(WindowReading {
            range: fixed_range(a, b, 1, "mA"),
            across: cat.text("doc-across-probe"),
            now,
        });
    }
    let grid_middle = w.grid_for_middle_volts.map(volts);
    let grid_unknown = w.grid_for_middle_unknown_reason.clone();
    Some(WindowRow {
        position: v.position.clone(),
        aim: fixed_range(w.low_pct, w.high_pct, 0, "%"),
        plate_current: fixed_range(w.plate_current_low_ma, w.plate_current_high_ma, 1, "mA"),
        plate_current_now: v.plate_current_ma.map(|i| fixed_unit(i, 1, "mA")),
        readings,
        place: cat
            .try_format(&format!("doc-window-{}", w.place), &[])
            .unwrap_or_else(|| w.place.to_string()),
        grid_note: grid_note(&grid_middle, &grid_unknown, cat),
        grid_middle,
        grid_unknown,
        grid_now: v.grid_volts.map(volts),
    })
}

/// The note under a target window's readings, as the template said it
/// (`doc-grid-middle` when there is an estimate, else `doc-grid-unknown`
/// when there is a reason; an empty text counts as none).
fn grid_note(middle: &Option<String>, unknown: &Option<String>, cat: &Catalogue) -> Option<String> {
    let present = |t: &Option<String>| t.clone().filter(|t| !t.is_empty());
    if let Some(volts) = present(middle) {
        Some(cat.format("doc-grid-middle", &[("volts", Arg::from(volts))]))
    } else {
        present(unknown).map(|why| cat.format("doc-grid-unknown", &[("why", Arg::from(why))]))
    }
}

/// The words of a resistor's value and power rating, the circuit's
/// figures rather than the readings': a job's sets repeat them (a
/// 1,000-set job names the same few values 7,000 times), so each
/// distinct one is written once for the job, before the sets' contexts
/// are made, and copied from here. Written anew they cost some 550
/// instructions each, twice that for a power of ten such as "1 kΩ",
/// which `format_engineering` takes through its slower steps.
///
/// A figure is found by its bits, so a copy is the text
/// `format_engineering` gives for that very value; a value not here (a
/// job of more distinct values than [`PartWords::MOST`]) is written as
/// before.
struct PartWords {
    resistances: Vec<(u64, String)>,
    ratings: Vec<(u64, String)>,
}

impl PartWords {
    /// The most distinct values of each kind kept: enough for any real
    /// circuit, and few enough that a look-up is a short scan.
    const MOST: usize = 32;

    fn of(findings: &Findings) -> Self {
        let mut words = PartWords {
            resistances: Vec::new(),
            ratings: Vec::new(),
        };
        let resistors = findings.sets.iter().flat_map(|set| {
            set.droppers
                .iter()
                .chain(&set.cathode_resistors)
                .chain(&set.screen_resistors)
        });
        for r in resistors {
            learn(&mut words.resistances, r.resistance_ohms, Q::Resistance);
            if let Some(w) = r.rating_w {
                learn(&mut words.ratings, w, Q::Power);
            }
        }
        words
    }

    /// `format_engineering(ohms, Q::Resistance)`.
    fn resistance(&self, ohms: f64) -> String {
        known(&self.resistances, ohms).unwrap_or_else(|| format_engineering(ohms, Q::Resistance))
    }

    /// `format_engineering(watts, Q::Power)`.
    fn rating(&self, watts: f64) -> String {
        known(&self.ratings, watts).unwrap_or_else(|| format_engineering(watts, Q::Power))
    }
}

/// Adds `value`'s words to `list` when they are not there and there is
/// room.
fn learn(list: &mut Vec<(u64, String)>, value: f64, kind: Q) {
    let bits = value.to_bits();
    if list.len() < PartWords::MOST && !list.iter().any(|(b, _)| *b == bits) {
        list.push((bits, format_engineering(value, kind)));
    }
}

/// A copy of `value`'s words in `list`, if they are there.
fn known(list: &[(u64, String)], value: f64) -> Option<String> {
    let bits = value.to_bits();
    list.iter()
        .find(|(b, _)| *b == bits)
        .map(|(_, words)| words.clone())
}

fn resistor_row(r: &ResistorFindings, kind: &str, part_words: &PartWords) -> ResistorRow {
    ResistorRow {
        reference: r.reference.clone(),
        kind: kind.to_string(),
        place: r.place.clone(),
        resistance: part_words.resistance(r.resistance_ohms),
        rating: r.rating_w.map(|w| part_words.rating(w)),
        voltage: volts(r.voltage_volts),
        power: resistor_power_words(r.power_w),
        power_pct: r.power_pct.map(pct0),
        high_line_power: resistor_power_words(r.high_line_power_w),
        high_line_pct: r.high_line_power_pct.map(pct0),
        status: attention::state(&r.verdict).to_string(),
        why: why(&r.verdict),
        reason: Sentence::new(&r.verdict.reason),
    }
}

fn capacitor_row(c: &CapacitorFindings) -> CapacitorRow {
    CapacitorRow {
        reference: c.reference.clone(),
        node: c.node.clone(),
        capacitance: c.capacitance_uf.map(|u| sig3_then(u, " µF")),
        rating: sig3(c.rating_volts),
        measured: c.measured_volts.map(sig3),
        high_line: c.high_line_volts.map(sig3),
        cold_start: c.cold_start_peak_volts.map(sig3),
        highest: sig3(c.highest_volts),
        margin: fixed_unit(c.margin_pct, 1, "%"),
        status: attention::state(&c.verdict).to_string(),
        why: why(&c.verdict),
        reason: Sentence::new(&c.verdict.reason),
    }
}

fn rectifier_row(r: &RectifierFindings, set: &SetFindings, cat: &Catalogue) -> RectifierRow {
    let outputs: Vec<&str> = set
        .valves
        .iter()
        .filter(|v| v.is_output)
        .map(|v| v.position.as_str())
        .collect();
    RectifierRow {
        position: r.position.clone(),
        type_name: r.valve_type.clone(),
        counted: if outputs.is_empty() {
            cat.text("doc-counted-outputs")
        } else {
            cat.format(
                "doc-counted-of",
                &[("valves", Arg::from(outputs.join(", ")))],
            )
        },
        load: fixed_unit(r.load_at_least_ma, 1, "mA"),
        rating: format!("{} mA", format_sig(r.rating_ma, 3)),
        load_pct: pct0(r.load_pct),
        status: attention::state(&r.verdict).to_string(),
        why: why(&r.verdict),
        reason: sentence(&r.verdict.reason),
        threshold: sentence(&r.verdict.threshold),
    }
}

/// The figures of one modification, formatted.
fn mod_figures(m: &ModFindings, cat: &Catalogue) -> Vec<ModFigureRow> {
    m.figures.iter().map(|f| mod_figure_row(f, cat)).collect()
}

fn mod_figure_row(f: &ModFigureFindings, cat: &Catalogue) -> ModFigureRow {
    let kind = cat
        .try_format(&format!("doc-figure-{}", f.kind.replace('_', "-")), &[])
        .unwrap_or_else(|| f.kind.to_string());
    let kind = kind.as_str();
    let value = match (f.frequency_hz, f.gain) {
        (Some(hz), _) => Some(minus(format_engineering(hz, Q::Frequency))),
        (None, Some(gain)) => Some(fixed(gain, 0)),
        (None, None) => None,
    };
    ModFigureRow {
        kind: kind.replace('_', " "),
        description: sentence(&f.description),
        formula: f.formula.to_string(),
        value,
    }
}

fn heater_row(h: &HeaterFindings, cat: &Catalogue) -> HeaterRow {
    HeaterRow {
        label: h.label.clone(),
        unnamed: if h.label.as_deref().is_some_and(|l| !l.is_empty()) {
            String::new()
        } else {
            cat.text("doc-heater")
        },
        measured: volts(h.measured_volts),
        nominal: volts(h.nominal_volts),
        deviation: signed_pct(h.deviation_pct),
        corrected: minus(format_engineering_3(h.corrected_volts)),
        corrected_deviation: signed_pct(h.corrected_deviation_pct),
        status: attention::state(&h.verdict).to_string(),
        why: why(&h.verdict),
        reason: Sentence::new(&h.verdict.reason),
    }
}

/// Heater volts need three figures even below 10 V ("6.29 V").
fn format_engineering_3(v: f64) -> String {
    sig3_then(v, " V")
}

fn plots(findings: &Findings, inputs: &ContextInputs<'_>) -> Plots {
    let s = &findings.settings;
    let kinds: Vec<&str> = findings
        .sets
        .iter()
        .flat_map(|set| {
            set.valves
                .iter()
                .filter(|v| v.is_output)
                .map(|v| v.bias.as_str())
        })
        .collect();
    let guide = if kinds.is_empty() {
        None
    } else if kinds.iter().all(|k| *k == "fixed") {
        Some(inputs.catalogue.format(
            "doc-chart-band-fixed",
            &[
                ("low", Arg::from(pct0(s.fixed_bias_low_pct))),
                ("high", Arg::from(pct0(s.fixed_bias_high_pct))),
            ],
        ))
    } else if kinds.iter().all(|k| *k == "cathode") {
        Some(inputs.catalogue.format(
            "doc-chart-band-cathode",
            &[("caution", Arg::from(pct0(s.cathode_bias_caution_pct)))],
        ))
    } else {
        None
    };
    let first = |charts: &[ChartFile]| charts.first().map(|c| c.path.clone());
    Plots {
        dissipation: first(&inputs.dissipation_charts),
        supply: first(&inputs.supply_charts),
        dissipation_charts: inputs.dissipation_charts.clone(),
        supply_charts: inputs.supply_charts.clone(),
        response_charts: inputs.response_charts.clone(),
        dissipation_guide: guide,
        supply_nominal: volts(findings.mains.nominal_volts),
        response: first(&inputs.response_charts),
    }
}

pub(crate) fn safety(job: &Job, findings: &Findings, cat: &Catalogue) -> SafetyContext {
    SafetyContext {
        recorded: job.safety.is_some(),
        class: job.safety.as_ref().map(|s| match s.class {
            ProtectionClass::One => cat.text("doc-class-one"),
            ProtectionClass::Two => cat.text("doc-class-two"),
        }),
        tests: findings
            .safety
            .iter()
            .map(|t| SafetyRow {
                test: cat
                    .try_format(&format!("doc-test-{}", t.test.replace('_', "-")), &[])
                    .unwrap_or_else(|| {
                        sentence(&t.test.replace('_', " "))
                            .trim_end_matches('.')
                            .to_string()
                    }),
                measured: glue_units(&t.measured),
                limit: glue_units(&t.limit),
                result: cat.text(if t.passed { "doc-pass" } else { "doc-fail" }),
                status: attention::state(&t.verdict).to_string(),
            })
            .collect(),
    }
}

/// Which bands the shop profile and the job set, in words, or none when
/// every band is the built-in default.
fn bands_from(job: &Job, profile: Option<&ShopProfile>, cat: &Catalogue) -> Option<String> {
    let words = |names: &[String]| {
        names
            .iter()
            .map(|n| n.replace('-', " "))
            .collect::<Vec<_>>()
            .join(", ")
    };
    let from_shop: Vec<String> = profile
        .map(|p| {
            p.settings_given
                .iter()
                .filter(|n| !job.settings_given.contains(n))
                .cloned()
                .collect()
        })
        .unwrap_or_default();
    let mut parts = Vec::new();
    if !from_shop.is_empty() {
        parts.push(cat.format("doc-bands-shop", &[("names", Arg::from(words(&from_shop)))]));
    }
    if !job.settings_given.is_empty() {
        parts.push(cat.format(
            "doc-bands-job",
            &[("names", Arg::from(words(&job.settings_given)))],
        ));
    }
    if parts.is_empty() {
        return None;
    }
    Some(sentence(&cat.format(
        "doc-bands-defaults",
        &[("sets", Arg::from(parts.join("; ")))],
    )))
}

fn method(
    findings: &Findings,
    job: &Job,
    profile: Option<&ShopProfile>,
    cat: &Catalogue,
) -> Method {
    let s = &findings.settings;
    let valves = || findings.sets.iter().flat_map(|set| set.valves.iter());
    // μg1g2 is listed where a bias estimate used it.
    let estimates = findings.sets.iter().any(|set| {
        !set.cathode_resistor_suggestions.is_empty()
            || set.valves.iter().any(|v| {
                v.target_window
                    .as_ref()
                    .is_some_and(|w| w.grid_for_middle_volts.is_some())
            })
    });
    let mut ratings: Vec<RatingRow> = findings
        .ratings_used
        .iter()
        .map(|r| {
            let used = valves().find(|v| v.rating_name == r.name);
            let mut limits = Vec::new();
            if let Some(p) = used.and_then(|v| v.plate_dissipation_max_w) {
                limits.push(format!("Pa {}", format_engineering(p, Q::Power)));
            }
            if let Some(p) = used.and_then(|v| v.screen_dissipation_max_w) {
                limits.push(format!("Pg2 {}", format_engineering(p, Q::Power)));
            }
            if let Some(mu) = r.mu_g1g2.filter(|_| estimates) {
                limits.push(format!("μg1g2 {}", format_sig(mu, 3)));
            }
            RatingRow {
                name: r.name.clone(),
                equivalents: r.equivalents.clone(),
                class: cat
                    .try_format(
                        &format!("doc-valve-class-{}", r.class.replace(' ', "-")),
                        &[],
                    )
                    .unwrap_or_else(|| r.class.clone()),
                positions: r.positions.clone(),
                limits: (!limits.is_empty()).then(|| limits.join(", ")),
                source: r.source.clone(),
                origin: if r.origin == "built in" {
                    cat.text("doc-built-in")
                } else {
                    r.origin.clone()
                },
            }
        })
        .collect();
    ratings.sort_by(|a, b| a.name.cmp(&b.name));
    Method {
        bands_from: bands_from(job, profile, cat),
        nominal: volts(findings.mains.nominal_volts),
        tolerance: format!("+{} %", format_sig(findings.mains.tolerance_pct, 3)),
        high_line: volts(findings.mains.high_line_volts),
        design: findings.mains.design_volts.map(volts),
        fixed_bias_low: format!("{} %", pct0(s.fixed_bias_low_pct)),
        fixed_bias_high: format!("{} %", pct0(s.fixed_bias_high_pct)),
        cathode_bias_caution: format!("{} %", pct0(s.cathode_bias_caution_pct)),
        resistor_derating: format!("{} %", pct0(s.resistor_derating_pct)),
        capacitor_margin: format!("{} %", pct0(s.capacitor_margin_pct)),
        heater_tolerance: format!("±{} %", pct0(s.heater_tolerance_pct)),
        node_tolerance: format!("±{} %", pct0(s.node_tolerance_pct)),
        silicon_drop: volts(s.silicon_drop_volts),
        voltage_over: format!("{} %", pct0(s.voltage_over_pct)),
        output_power_caution: format!("{} %", pct0(s.output_power_caution_pct)),
        hum_noise_caution: format!("{} dB", format_sig(s.hum_noise_caution_db, 3)),
        cathode_bias_target: format!("{} %", pct0(s.cathode_bias_target_pct)),
        uses_bench: findings.sets.iter().any(|set| !set.bench.is_empty()),
        uses_resistor_suggestion: findings
            .sets
            .iter()
            .any(|set| !set.cathode_resistor_suggestions.is_empty()),
        uses_grid_estimate: valves().any(|v| {
            v.target_window
                .as_ref()
                .is_some_and(|w| w.grid_for_middle_volts.is_some())
        }),
        uses_conservative_rule: valves()
            .any(|v| v.plate_current_includes_screen && v.plate_current_ma.is_some()),
        uses_shared_cathode: valves()
            .any(|v| v.method == Some(CurrentMethod::SharedCathodeResistor)),
        uses_shared_half_primary: valves().any(|v| {
            v.method == Some(CurrentMethod::TransformerResistance)
                && !v.current_shared_with.is_empty()
        }),
        uses_fixed_bias: valves().any(|v| v.is_output && v.bias == "fixed"),
        uses_cathode_bias: valves().any(|v| v.is_output && v.bias == "cathode"),
        uses_cold_start: findings.sets.iter().any(|set| {
            set.filter_capacitors
                .iter()
                .any(|c| c.cold_start_peak_volts.is_some())
        }),
        ratings,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::format_fixed;

    #[test]
    fn a_reason_counts_the_characters_of_its_sentence() {
        // Letters whose capitals are longer (ß, ŉ, ǰ, ﬁ) or shorter in
        // bytes, titlecase letters, figures before units (glued with a
        // no-break space), full stops anywhere, spaces at the ends.
        let pool: Vec<char> = "aZ09 .,;µΩ%ßŉǰﬁǅéİıVmAkW\u{A0}\u{2009}\n()-–"
            .chars()
            .collect();
        let mut next = crate::test_random::xorshift(0x51_7cc1_b727_220au64);
        let mut texts: Vec<String> = ["", ".", "ß", "ﬁ.", " ", "12 V", "x 12 mA.", "ǅ 3 %"]
            .map(String::from)
            .to_vec();
        for _ in 0..20_000 {
            let len = (next() % 24) as usize;
            texts.push(
                (0..len)
                    .map(|_| pool[(next() % pool.len() as u64) as usize])
                    .collect(),
            );
        }
        for text in texts {
            let reason = Sentence::new(&text);
            assert_eq!(reason.text(), sentence(&text), "{text:?}");
            assert_eq!(
                reason.char_count(),
                sentence(&text).chars().count(),
                "{text:?}"
            );
        }
    }

    // The first versions of `glue_units` and `typographic_minus`, which
    // copied the text into a vector of characters; the present ones must
    // give the same text.
    fn glue_units_by_chars(text: &str) -> String {
        let chars: Vec<char> = text.chars().collect();
        let mut out = String::with_capacity(text.len() + 8);
        for (i, &c) in chars.iter().enumerate() {
            if c == ' ' && i > 0 && chars[i - 1].is_ascii_digit() {
                let rest: String = chars[i + 1..]
                    .iter()
                    .take_while(|c| !c.is_whitespace())
                    .collect();
                let word = rest.trim_end_matches(['.', ',', ';', ':', ')', '(']);
                if UNIT_WORDS.contains(&word) {
                    out.push('\u{a0}');
                    continue;
                }
            }
            out.push(c);
        }
        out
    }

    fn typographic_minus_by_chars(s: &str) -> String {
        let chars: Vec<char> = s.chars().collect();
        let mut out = String::with_capacity(s.len());
        for (i, &c) in chars.iter().enumerate() {
            let before_ok = i == 0 || matches!(chars[i - 1], ' ' | '\u{a0}' | '(');
            let digit_after = chars.get(i + 1).is_some_and(char::is_ascii_digit);
            if c == '-' && before_ok && digit_after {
                out.push('\u{2212}');
            } else {
                out.push(c);
            }
        }
        out
    }

    #[test]
    fn unit_gluing_and_minus_signs_are_the_character_by_character_ones() {
        let pieces = [
            "1", "23", " ", "V", "mV", "kΩ", "µF", "%", "-", "−", "(", ")", ".", ",", "at", "Ω",
            "\u{a0}", "\n", "ü", "x-1", " -2", "\t", "Hz;", "W.", "mA)",
        ];
        let mut x: u64 = 0x9e37_79b9_7f4a_7c15;
        for _ in 0..20_000 {
            let mut text = String::new();
            for _ in 0..(x % 12) {
                x ^= x << 13;
                x ^= x >> 7;
                x ^= x << 17;
                text.push_str(pieces[(x % pieces.len() as u64) as usize]);
            }
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            assert_eq!(glue_units(&text), glue_units_by_chars(&text), "{text:?}");
            assert_eq!(
                typographic_minus(&text),
                typographic_minus_by_chars(&text),
                "{text:?}"
            );
            assert_eq!(
                tidy_words(text.clone()),
                typographic_minus(&glue_units(&text)),
                "{text:?}"
            );
        }
        assert_eq!(glue_units("349 V at 12 mA."), "349\u{a0}V at 12\u{a0}mA.");
        assert_eq!(typographic_minus("(-3 V) x-1 -a"), "(\u{2212}3 V) x-1 -a");
    }

    #[test]
    fn figures_written_in_place_are_the_formatted_ones() {
        // Values at and around every rounding edge of 0 to 3 decimals,
        // negative ones that round to zero, large, tiny and not finite.
        let mut values = vec![
            0.0,
            -0.0,
            0.05,
            -0.05,
            -0.049,
            -0.0004,
            0.5,
            -0.5,
            1.5,
            2.5,
            -2.5,
            9.995,
            -9.995,
            1e12,
            -1e12,
            1e20,
            -3.7e-9,
            999_999_999.4,
            999_999_999.6,
            -99_999_999.96,
            0.0005,
            0.0015,
            0.00049999,
            1e9,
            4.35,
            -4.35,
            1.005,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::MAX,
            f64::MIN_POSITIVE,
        ];
        let mut next = crate::test_random::xorshift(0x3c6e_f372_fe94_f82bu64);
        for _ in 0..100_000 {
            let scale = [1.0, 10.0, 100.0, 1000.0, 1e6][(next() % 5) as usize];
            let raw = (next() % 2_000_001) as f64 / 1000.0 - 1000.0;
            values.push(raw * scale / 100.0);
            // Exact halves at the last decimal kept.
            values.push(((next() % 20_001) as f64 - 10_000.0) / 200.0);
        }
        // How often the digits are written here rather than by `write_fixed`.
        let mut in_place = 0;
        for &v in &values {
            for decimals in 0..6 {
                in_place += usize::from(v.is_finite() && scaled_figure(v, decimals).is_some());
                let old = match format_fixed(v, decimals).strip_prefix('-') {
                    Some(rest) => format!("\u{2212}{rest}"),
                    None => format_fixed(v, decimals),
                };
                assert_eq!(fixed(v, decimals), old, "{v:?} to {decimals}");
                assert_eq!(
                    fixed_unit(v, decimals, "mA"),
                    format!("{old} mA"),
                    "{v:?} to {decimals}"
                );
                assert_eq!(
                    fixed_range(v, -v, decimals, "%"),
                    format!("{old}–{} %", fixed(-v, decimals)),
                    "{v:?} to {decimals}"
                );
            }
            let s = format_fixed(v.abs(), 1);
            let old = if s.chars().all(|c| c == '0' || c == '.') {
                format!("{s} %")
            } else if v < 0.0 {
                format!("\u{2212}{s} %")
            } else {
                format!("+{s} %")
            };
            assert_eq!(signed_pct(v), old, "{v:?}");
            assert_eq!(sig3_then(v, " µF"), format!("{} µF", format_sig(v, 3)));
            let old = match format_sig(v, 3).strip_prefix('-') {
                Some(rest) => format!("\u{2212}{rest}"),
                None => format_sig(v, 3),
            };
            assert_eq!(sig3(v), old, "{v:?}");
        }
        assert!(in_place > 500_000, "{in_place} figures written in place");
    }

    #[test]
    fn a_parts_words_are_the_formatted_ones() {
        // Values of every kind of decade, powers of ten, their neighbours
        // by one bit, zero and its negative, more distinct values than
        // are kept, and values not seen when the words were made.
        let mut values = vec![0.0, -0.0, 1.0, 1000.0, 10e3, 4.7e3, 0.5, 2.0, f64::NAN];
        for k in -3..7 {
            let p = 10f64.powi(k);
            values.extend([
                p,
                f64::from_bits(p.to_bits() + 1),
                f64::from_bits(p.to_bits() - 1),
            ]);
            values.extend([2.2 * p, 4.7 * p, 6.8 * p, 9.995 * p]);
        }
        let mut words = PartWords {
            resistances: Vec::new(),
            ratings: Vec::new(),
        };
        for &v in &values[..values.len() / 2] {
            learn(&mut words.resistances, v, Q::Resistance);
            learn(&mut words.ratings, v, Q::Power);
        }
        assert_eq!(words.resistances.len(), PartWords::MOST);
        for &v in &values {
            assert_eq!(
                words.resistance(v),
                format_engineering(v, Q::Resistance),
                "{v:?}"
            );
            assert_eq!(words.rating(v), format_engineering(v, Q::Power), "{v:?}");
        }
    }

    #[test]
    fn numbers_read_like_a_page() {
        assert_eq!(signed_pct(-1.26), "\u{2212}1.3 %");
        assert_eq!(signed_pct(2.2), "+2.2 %");
        assert_eq!(signed_pct(-0.01), "0.0 %");
        assert_eq!(sig3(-32.0), "\u{2212}32");
        assert_eq!(fixed(14.56, 1), "14.6");
        assert_eq!(
            date_words(NaiveDate::from_ymd_opt(2026, 11, 9).unwrap()),
            "9 November 2026"
        );
        assert_eq!(sentence("heater: 6.4 V"), "Heater: 6.4\u{a0}V.");
        assert_eq!(sentence(""), "");
        assert_eq!(
            glue_units("is 344 V, 115 % of 300 V."),
            "is 344\u{a0}V, 115\u{a0}% of 300\u{a0}V."
        );
        assert_eq!(glue_units("V3 2 valves"), "V3 2 valves");
    }

    #[test]
    fn hand_wrapped_text_flows_and_lists_keep_their_lines() {
        assert_eq!(
            reflow("one line\nwrapped here\n\nnew para"),
            "one line wrapped here\n\nnew para"
        );
        assert_eq!(reflow("Did:\n- a\n- b\n2. c"), "Did:\n- a\n- b\n2. c");
        assert_eq!(reflow("\n  lead\r\n  trail  \n"), "lead trail");
        assert_eq!(reflow(""), "");
        assert_eq!(reflow("one\n\ntwo\r\n\r\nthree"), "one\n\ntwo\n\nthree");
    }
}
