//! What changed between two versions of a job, or between two measurement
//! sets of one job: each valve's voltages, current and dissipation, each
//! supply node, each stressed resistor and filter capacitor, the heaters,
//! the safety tests, and every status that moved, with the difference.
//!
//! The figures compared are the ones `calc --json` prints, taken from the
//! same serialised [`Findings`] (so they carry its six-figure rounding and
//! an unchanged figure never shows as a change); nothing here works a
//! figure out or decides a status.

use serde::Serialize;
use serde_json::Value;

use crate::calc::{Findings, SetFindings};
use crate::catalogue::{Catalogue, Msg};
use crate::report::{Align, TextTable};
use crate::units::format_sig;

/// The rows of a set compared, by the table they are in: the JSON array,
/// the field naming a row, and the figures compared.
pub const SET_TABLES: &[(&str, &str, &[&str])] = &[
    (
        "valves",
        "position",
        &[
            "plate_volts",
            "screen_volts",
            "cathode_volts",
            "grid_volts",
            "cathode_current_ma",
            "plate_current_ma",
            "screen_current_ma",
            "plate_dissipation_w",
            "plate_dissipation_pct",
            "high_line_plate_dissipation_pct",
            "screen_dissipation_w",
            "screen_dissipation_pct",
            "status",
        ],
    ),
    (
        "nodes",
        "name",
        &[
            "measured_volts",
            "corrected_volts",
            "deviation_pct",
            "high_line_volts",
            "status",
        ],
    ),
    ("droppers", "reference", RESISTOR_FIGURES),
    ("cathode_resistors", "reference", RESISTOR_FIGURES),
    ("screen_resistors", "reference", RESISTOR_FIGURES),
    (
        "filter_capacitors",
        "reference",
        &["measured_volts", "highest_volts", "margin_pct", "status"],
    ),
    (
        "heaters",
        "label",
        &["measured_volts", "deviation_pct", "status"],
    ),
];

/// The figures compared for a stressed resistor.
const RESISTOR_FIGURES: &[&str] = &[
    "voltage_volts",
    "current_ma",
    "power_w",
    "power_pct",
    "high_line_power_pct",
    "status",
];

/// The safety tests compared: the field naming one and the figures.
pub const SAFETY_FIELDS: (&str, &[&str]) = ("test", &["measured_value", "status"]);

/// One figure that differs.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Change {
    /// The set it is in on the new side (for two versions, the set's
    /// label; for two sets, the new set's label); none for a safety test.
    pub set: Option<String>,
    /// `valves`, `nodes`, `droppers`, …, `safety`, or `set` for the set's
    /// own mains reading.
    pub table: String,
    /// The valve position, node name, reference, heater label or test,
    /// with its channel in front when it has one ("left V3").
    pub subject: String,
    /// The JSON field: `plate_dissipation_w`, `status` …
    pub figure: String,
    /// The figure on each side (a number or a status word), null where
    /// that side has no such figure.
    pub old: Value,
    pub new: Value,
    /// new − old for two numbers, rounded to six significant figures.
    pub difference: Option<f64>,
}

/// A comparison: what each side is, and what changed.
#[derive(Debug, Clone, Serialize)]
pub struct Comparison {
    /// "job.kdl" or "HEAD:job.kdl", with the set for a set comparison.
    pub old: String,
    pub new: String,
    /// Sets on only one side (two versions).
    pub sets_only_old: Vec<String>,
    pub sets_only_new: Vec<String>,
    pub changes: Vec<Change>,
    /// For two sets of one job: the job and the two sets' labels, so the
    /// table's heading can quote them in the reader's language (the JSON
    /// keeps `old` and `new`).
    #[serde(skip)]
    pub sets: Option<(String, String, String)>,
}

fn round6(v: f64) -> f64 {
    crate::calc::tidy(v)
}

fn subject(row: &Value, id: &str) -> String {
    let name = match &row[id] {
        Value::String(s) => s.clone(),
        Value::Null => String::new(),
        v => v.to_string(),
    };
    match row.get("channel").and_then(Value::as_str) {
        Some(channel) => format!("{channel} {name}"),
        None => name,
    }
}

/// The rows of `array`, by subject, in order.
fn rows<'a>(value: &'a Value, array: &str, id: &str) -> Vec<(String, &'a Value)> {
    value[array]
        .as_array()
        .map(|a| a.iter().map(|r| (subject(r, id), r)).collect())
        .unwrap_or_default()
}

/// The changes between the rows of two tables, old order first, then rows
/// only on the new side.
fn table_changes(
    set: Option<&str>,
    table: &str,
    old: &[(String, &Value)],
    new: &[(String, &Value)],
    fields: &[&str],
    out: &mut Vec<Change>,
) {
    let mut subjects: Vec<&String> = old.iter().map(|(s, _)| s).collect();
    for (s, _) in new {
        if !subjects.contains(&s) {
            subjects.push(s);
        }
    }
    for s in subjects {
        let o = old.iter().find(|(k, _)| k == s).map(|(_, v)| *v);
        let n = new.iter().find(|(k, _)| k == s).map(|(_, v)| *v);
        for field in fields {
            let ov = o.map(|r| r[*field].clone()).unwrap_or(Value::Null);
            let nv = n.map(|r| r[*field].clone()).unwrap_or(Value::Null);
            if ov == nv {
                continue;
            }
            let difference = match (ov.as_f64(), nv.as_f64()) {
                (Some(a), Some(b)) => Some(round6(b - a)),
                _ => None,
            };
            out.push(Change {
                set: set.map(str::to_string),
                table: table.to_string(),
                subject: s.clone(),
                figure: field.to_string(),
                old: ov,
                new: nv,
                difference,
            });
        }
    }
}

fn to_value<T: Serialize>(v: &T) -> Value {
    // Plain data with string keys always serialises.
    serde_json::to_value(v).unwrap_or(Value::Null)
}

/// The changes from set `old` to set `new`; `label` names the set the
/// changes are reported in.
pub fn set_changes(label: &str, old: &SetFindings, new: &SetFindings) -> Vec<Change> {
    let (o, n) = (to_value(old), to_value(new));
    let mut out = Vec::new();
    if o["mains_volts"] != n["mains_volts"] {
        table_changes(
            Some(label),
            "set",
            &[("mains".to_string(), &o)],
            &[("mains".to_string(), &n)],
            &["mains_volts"],
            &mut out,
        );
    }
    for (table, id, fields) in SET_TABLES {
        table_changes(
            Some(label),
            table,
            &rows(&o, table, id),
            &rows(&n, table, id),
            fields,
            &mut out,
        );
    }
    out
}

/// Two sets of one job.
pub fn compare_sets(source: &str, old: &SetFindings, new: &SetFindings) -> Comparison {
    Comparison {
        old: format!("{source} \u{201c}{}\u{201d}", old.label),
        new: format!("{source} \u{201c}{}\u{201d}", new.label),
        sets_only_old: Vec::new(),
        sets_only_new: Vec::new(),
        changes: set_changes(&new.label, old, new),
        sets: Some((source.to_owned(), old.label.clone(), new.label.clone())),
    }
}

/// Two versions of a job: each set matched by its label, then the safety
/// tests.
pub fn compare_versions(
    old_name: &str,
    old: &Findings,
    new_name: &str,
    new: &Findings,
) -> Comparison {
    let mut changes = Vec::new();
    for set in &new.sets {
        if let Some(before) = old.sets.iter().find(|s| s.label == set.label) {
            changes.extend(set_changes(&set.label, before, set));
        }
    }
    let (o, n) = (to_value(&old.safety), to_value(&new.safety));
    let wrap = |v: Value| serde_json::json!({ "safety": v });
    let (o, n) = (wrap(o), wrap(n));
    let (id, fields) = SAFETY_FIELDS;
    table_changes(
        None,
        "safety",
        &rows(&o, "safety", id),
        &rows(&n, "safety", id),
        fields,
        &mut changes,
    );
    let labels = |f: &Findings| f.sets.iter().map(|s| s.label.clone()).collect::<Vec<_>>();
    let (old_labels, new_labels) = (labels(old), labels(new));
    Comparison {
        old: old_name.to_string(),
        new: new_name.to_string(),
        sets_only_old: old_labels
            .iter()
            .filter(|l| !new_labels.contains(l))
            .cloned()
            .collect(),
        sets_only_new: new_labels
            .iter()
            .filter(|l| !old_labels.contains(l))
            .cloned()
            .collect(),
        changes,
        sets: None,
    }
}

/// The unit of a figure, from the end of its JSON name.
fn unit(figure: &str) -> &'static str {
    for (suffix, unit) in [
        ("_volts", " V"),
        ("_ma", " mA"),
        ("_w", " W"),
        ("_pct", " %"),
        ("_value", ""),
    ] {
        if figure.ends_with(suffix) {
            return unit;
        }
    }
    ""
}

/// A figure in words: "14.6 W", "over", "–".
fn shown(v: &Value, figure: &str) -> String {
    match v {
        Value::Null => "–".to_string(),
        Value::Number(n) => match n.as_f64() {
            // The same minus sign as the change column.
            Some(x) if x < 0.0 => format!("\u{2212}{}{}", format_sig(-x, 4), unit(figure)),
            Some(x) => format!("{}{}", format_sig(x, 4), unit(figure)),
            None => n.to_string(),
        },
        Value::String(s) => s.clone(),
        v => v.to_string(),
    }
}

/// "+1.25 W", "−0.3 %".
fn signed(d: f64, figure: &str) -> String {
    let sign = if d > 0.0 {
        "+"
    } else if d < 0.0 {
        "\u{2212}"
    } else {
        ""
    };
    format!("{sign}{}{}", format_sig(d.abs(), 4), unit(figure))
}

/// "plate_dissipation_w" → "plate dissipation" (the catalogue's
/// `cli-compare-figure-…` message, named after the JSON field); a field
/// the catalogue has no words for is shown as its name in words.
fn figure_words(figure: &str, cat: &Catalogue) -> String {
    cat.try_format(
        &format!("cli-compare-figure-{}", figure.replace('_', "-")),
        &[],
    )
    .unwrap_or_else(|| figure.replace('_', " "))
}

/// A figure's value in words: a status word in the reader's language
/// ("over", "zu hoch"), else the number with its unit.
fn value_words(v: &Value, figure: &str, cat: &Catalogue) -> String {
    match v {
        Value::String(s) if figure == "status" => cat
            .try_format(&format!("term-word-{s}"), &[])
            .unwrap_or_else(|| s.clone()),
        v => shown(v, figure),
    }
}

/// What a change is about, in words: a safety test by its name, the set's
/// own mains reading as "mains", anything else as the job names it.
fn subject_words(ch: &Change, cat: &Catalogue) -> String {
    match ch.table.as_str() {
        "safety" => crate::calc::safety_test_words(&ch.subject, cat),
        "set" => cat.text("cli-compare-mains"),
        _ => ch.subject.clone(),
    }
}

/// The comparison as a table for the terminal, in the words of `cat`.
pub fn render_text(c: &Comparison, cat: &Catalogue) -> String {
    let set = |label: &str| cat.say(&Msg::new("cli-compare-set-name").arg("label", label));
    let mut out = match &c.sets {
        Some((source, old, new)) => {
            // One job's two sets: its name once, and no set column below.
            format!("{source}: {} \u{2192} {}\n", set(old), set(new))
        }
        None => format!("{} \u{2192} {}\n", c.old, c.new),
    };
    let only = |label: &str, side: &str| {
        cat.say(
            &Msg::new("cli-compare-set-only-in")
                .arg("label", label)
                .arg("side", side),
        )
    };
    for l in &c.sets_only_old {
        out.push_str(&format!("{}\n", only(l, &c.old)));
    }
    for l in &c.sets_only_new {
        out.push_str(&format!("{}\n", only(l, &c.new)));
    }
    if c.changes.is_empty() {
        out.push_str(&format!("{}\n", cat.text("cli-compare-nothing-changed")));
        return out;
    }
    let one_job = c.sets.is_some();
    let headers: Vec<(String, Align)> = [
        ("cli-compare-col-set", Align::Left),
        ("cli-compare-col-what", Align::Left),
        ("cli-compare-col-figure", Align::Left),
        ("cli-compare-col-old", Align::Right),
        ("cli-compare-col-new", Align::Right),
        ("cli-compare-col-change", Align::Right),
    ]
    .into_iter()
    .skip(usize::from(one_job))
    .map(|(key, align)| (cat.text(key), align))
    .collect();
    let headers: Vec<(&str, Align)> = headers.iter().map(|(w, a)| (w.as_str(), *a)).collect();
    let mut table = TextTable::new(&headers);
    for ch in &c.changes {
        let set = (!one_job).then(|| {
            ch.set
                .clone()
                .unwrap_or_else(|| cat.text("cli-compare-safety"))
        });
        table.row(
            set.into_iter()
                .chain([
                    subject_words(ch, cat),
                    figure_words(&ch.figure, cat),
                    value_words(&ch.old, &ch.figure, cat),
                    value_words(&ch.new, &ch.figure, cat),
                    ch.difference
                        .map(|d| signed(d, &ch.figure))
                        .unwrap_or_default(),
                ])
                .collect(),
        );
    }
    out.push_str(&table.render(0));
    out.push_str(&format!(
        "{}\n",
        cat.say(&Msg::new("cli-compare-changed").arg("count", c.changes.len()))
    ));
    out
}

/// The comparison as JSON, with a trailing newline.
pub fn render_json(c: &Comparison) -> String {
    let mut s =
        serde_json::to_string_pretty(c).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"));
    s.push('\n');
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn figures_are_named_in_words_with_their_units() {
        let en = Catalogue::english();
        assert_eq!(figure_words("plate_dissipation_w", en), "plate dissipation");
        assert_eq!(
            figure_words("plate_dissipation_pct", en),
            "plate dissipation %"
        );
        // Every figure compared has its words in the catalogue.
        let mut figures: Vec<&str> = SET_TABLES
            .iter()
            .flat_map(|(_, _, f)| f.iter())
            .copied()
            .collect();
        figures.extend(SAFETY_FIELDS.1);
        figures.push("mains_volts");
        let de = Catalogue::built_in("de").unwrap();
        for figure in figures {
            let key = format!("cli-compare-figure-{}", figure.replace('_', "-"));
            assert!(en.has(&key) && de.has(&key), "{key}");
        }
        assert_eq!(
            figure_words("plate_dissipation_pct", &de),
            "Anodenverlustleistung %"
        );
        assert_eq!(
            value_words(&serde_json::json!("over"), "status", &de),
            "zu hoch"
        );
        assert_eq!(
            shown(&serde_json::json!(14.5625), "plate_dissipation_w"),
            "14.56 W"
        );
        assert_eq!(signed(-4.5, "power_pct"), "\u{2212}4.5 %");
        assert_eq!(
            shown(&serde_json::json!(-1.31), "deviation_pct"),
            "\u{2212}1.31 %"
        );
        assert_eq!(
            shown(&serde_json::json!(344.5), "corrected_volts"),
            "344.5 V"
        );
        assert_eq!(shown(&Value::Null, "x_w"), "–");
    }

    #[test]
    fn a_row_on_one_side_only_shows_as_null_on_the_other() {
        let old = serde_json::json!({"valves": [{"position": "V1", "plate_volts": 300.0}]});
        let new = serde_json::json!({"valves": [
            {"position": "V1", "plate_volts": 300.0},
            {"position": "V2", "plate_volts": 250.0, "channel": "left"}
        ]});
        let mut out = Vec::new();
        table_changes(
            Some("s"),
            "valves",
            &rows(&old, "valves", "position"),
            &rows(&new, "valves", "position"),
            &["plate_volts"],
            &mut out,
        );
        assert_eq!(out.len(), 1);
        assert_eq!(out[0].subject, "left V2");
        assert_eq!(out[0].old, Value::Null);
        assert_eq!(out[0].new, serde_json::json!(250.0));
        assert_eq!(out[0].difference, None);
    }
}
