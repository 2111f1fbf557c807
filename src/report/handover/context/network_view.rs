//! A mod's network on the page: the response chart's place, the source and
//! load in words, the edits, the table of figures (gain at 100 Hz, 1 kHz
//! and 5 kHz, the corner or mid scoop, the change in dB) and the
//! phase-shift rates, all formatted here from `calc::network`'s findings.

use crate::catalogue::{Arg, Catalogue};
use serde::Serialize;

use super::{fixed, glue_units, minus, sentence};
use crate::calc::network::{CornerKind, CurveFindings, NetworkFindings};
use crate::report::network_chart::{response_chart, setting_words};
use crate::units::{QuantityKind as Q, format_engineering};

/// Where the response chart of the mod at `index` (from 0) goes in the
/// typesetting folder.
pub fn network_plot_path(index: usize) -> String {
    format!("plots/network-mod-{}.svg", index + 1)
}

#[derive(Debug, Clone, Serialize)]
pub struct NetworkView {
    /// "Tone network".
    pub label: String,
    /// The chart's path in the folder, when there is a chart.
    pub plot: Option<String>,
    /// The source in a sentence (two when the edits change it).
    pub sources: Vec<String>,
    /// Where the response is read, in a sentence.
    pub load: String,
    /// The edits in words.
    pub edits: Vec<String>,
    pub has_after: bool,
    /// Several pot settings are plotted.
    pub many_settings: bool,
    /// Some row names pot settings (the table's setting column is shown).
    pub show_settings: bool,
    pub rows: Vec<NetworkRow>,
    pub oscillator: Option<OscillatorView>,
    /// Why the network could not be worked out.
    pub problem: Option<String>,
}

/// One row of the figures table.
#[derive(Debug, Clone, Serialize)]
pub struct NetworkRow {
    /// "before", "after" or "change".
    pub kind: String,
    /// "1: VR1 3, VR2 7", or empty.
    pub setting: String,
    pub at_100hz: String,
    pub at_1khz: String,
    pub at_5khz: String,
    /// "scoop 420 Hz, 8.1 dB deep", "low cut 72 Hz", "flat within 3 dB".
    pub feature: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct OscillatorView {
    /// What the first column steps through: "VR1 (speed)" or "setting".
    pub column: String,
    pub has_after: bool,
    pub rows: Vec<OscillatorRow>,
}

#[derive(Debug, Clone, Serialize)]
pub struct OscillatorRow {
    pub setting: String,
    pub before_rate: String,
    pub before_gain: String,
    pub after_rate: String,
    pub after_gain: String,
}

fn db(v: f64) -> String {
    format!("{}\u{a0}dB", fixed(v, 1))
}

fn signed_db(v: f64) -> String {
    let text = fixed(v, 1);
    if v >= 0.05 {
        format!("+{text}\u{a0}dB")
    } else if text == "−0.0" {
        "0.0\u{a0}dB".to_string()
    } else {
        format!("{text}\u{a0}dB")
    }
}

fn hz(v: f64) -> String {
    glue_units(&minus(format_engineering(v, Q::Frequency)))
}

/// The curve's corner or scoop in words.
fn feature(c: &CurveFindings, cat: &Catalogue) -> String {
    if let Some(s) = &c.scoop {
        return cat.format(
            "doc-network-scoop",
            &[
                ("frequency", Arg::from(hz(s.frequency_hz))),
                (
                    "depth",
                    Arg::from(db(s.depth_db).trim_start_matches('−').to_string()),
                ),
            ],
        );
    }
    if c.corners.is_empty() {
        return glue_units(&cat.text("doc-network-flat"));
    }
    c.corners
        .iter()
        .map(|k| {
            cat.format(
                match k.kind {
                    CornerKind::LowCut => "doc-network-low-cut",
                    CornerKind::HighCut => "doc-network-high-cut",
                },
                &[("frequency", Arg::from(hz(k.frequency_hz)))],
            )
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// The view of a mod's network.
pub fn network_view(index: usize, net: &NetworkFindings, cat: &Catalogue) -> NetworkView {
    let count = net.curves.iter().map(|c| c.setting).max().unwrap_or(1);
    let many = count > 1;
    let has_after = net.curves.iter().any(|c| c.state == "after");
    let setting_of = |c: &CurveFindings| {
        let words = setting_words(&c.pots);
        match (many, words.is_empty()) {
            (true, _) => format!("{}: {words}", c.setting),
            (false, false) => words,
            (false, true) => String::new(),
        }
    };
    let mut rows = Vec::new();
    for k in 1..=count {
        for state in ["before", "after"] {
            if let Some(c) = net
                .curves
                .iter()
                .find(|c| c.state == state && c.setting == k)
            {
                rows.push(NetworkRow {
                    kind: if has_after { state } else { "response" }.to_string(),
                    setting: setting_of(c),
                    at_100hz: db(c.gain_100hz_db),
                    at_1khz: db(c.gain_1khz_db),
                    at_5khz: db(c.gain_5khz_db),
                    feature: feature(c, cat),
                });
            }
        }
        if let Some(d) = net.changes.iter().find(|d| d.setting == k) {
            rows.push(NetworkRow {
                kind: "change".to_string(),
                setting: String::new(),
                at_100hz: signed_db(d.change_100hz_db),
                at_1khz: signed_db(d.change_1khz_db),
                at_5khz: signed_db(d.change_5khz_db),
                feature: String::new(),
            });
        }
    }
    let load = match net.load_ohms {
        Some(r) => cat.format(
            "doc-network-loaded",
            &[
                ("node", Arg::from(&net.load_node)),
                (
                    "ohms",
                    Arg::from(glue_units(&format_engineering(r, Q::Resistance))),
                ),
            ],
        ),
        None => cat.format(
            "doc-network-unloaded",
            &[("node", Arg::from(&net.load_node))],
        ),
    };
    let sources = net
        .sources
        .iter()
        .map(|s| {
            let state = if net.sources.len() > 1 {
                cat.text(&format!("doc-row-{}", s.state))
            } else {
                String::new()
            };
            let driven = cat.format(
                if state.is_empty() {
                    "doc-network-driven"
                } else {
                    "doc-network-driven-when"
                },
                &[
                    ("node", Arg::from(&s.node)),
                    ("state", Arg::from(state)),
                    ("source", Arg::from(&s.description)),
                ],
            );
            match s.stage_gain {
                Some(g) => glue_units(&format!(
                    "{driven} {}",
                    cat.format("doc-network-own-gain", &[("gain", Arg::from(fixed(g, 0)))])
                )),
                None => glue_units(&driven),
            }
        })
        .collect();
    let oscillator = oscillator_view(net, cat);
    NetworkView {
        label: sentence(
            &net.label
                .clone()
                .unwrap_or_else(|| cat.text("doc-network-default-label")),
        )
        .trim_end_matches('.')
        .to_string(),
        plot: response_chart(net, cat).map(|_| network_plot_path(index)),
        sources,
        load,
        edits: net.edits.iter().map(|e| glue_units(e)).collect(),
        has_after,
        many_settings: many,
        show_settings: rows.iter().any(|r| !r.setting.is_empty()),
        rows,
        oscillator,
        problem: net.problem.as_ref().map(|p| sentence(p)),
    }
}

fn oscillator_view(net: &NetworkFindings, cat: &Catalogue) -> Option<OscillatorView> {
    let before = net.oscillator.iter().find(|o| o.state == "before")?;
    let after = net.oscillator.iter().find(|o| o.state == "after");
    let rate =
        |p: Option<&crate::calc::network::OscillatorPoint>| match p.and_then(|p| p.frequency_hz) {
            Some(f) => hz(f),
            None => cat.text("doc-network-never"),
        };
    let gain =
        |p: Option<&crate::calc::network::OscillatorPoint>| match p.and_then(|p| p.gain_needed) {
            Some(g) => format!("{}×", fixed(g, 1)),
            None => "–".to_string(),
        };
    let rows = before
        .points
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let a = after.and_then(|o| o.points.get(i));
            OscillatorRow {
                setting: crate::units::format_sig(p.setting, 3),
                before_rate: rate(Some(p)),
                before_gain: gain(Some(p)),
                after_rate: if after.is_some() {
                    rate(a)
                } else {
                    String::new()
                },
                after_gain: if after.is_some() {
                    gain(a)
                } else {
                    String::new()
                },
            }
        })
        .collect();
    Some(OscillatorView {
        column: match &before.speed_pot {
            Some(p) => cat.format("doc-network-pot-setting", &[("pot", Arg::from(p))]),
            None => cat.text("doc-network-setting"),
        },
        has_after: after.is_some(),
        rows,
    })
}
