//! A mod's circuit network: named nodes, resistors, capacitors, inductors,
//! links and potentiometers between them, a source with its output
//! impedance and a load. The network as it was (*before*) is written in
//! full; the network as left (*after*) is written as edits of it, so a mod
//! states its difference once. Decoding is in [`decode`], the structural
//! checks (every node reaches ground, no loop of ideal sources) in
//! [`check`]; the response is worked out by `calc::network`.

pub(crate) mod check;
pub(crate) mod decode;

use miette::SourceSpan;
use serde::Serialize;

use super::model::Spanned;
use crate::units::{Farads, Henries, Ohms};

/// The reserved name of the reference node.
pub const GROUND: &str = "ground";

/// The wiper settings of a pot run from 0 (wiper at the `ccw` end) to this
/// (wiper at the `cw` end).
pub const SETTING_MAX: f64 = 10.0;

/// The most settings a network may list (each is one curve per state).
pub const MAX_SETTINGS: usize = 6;

/// A network attached to a modification.
#[derive(Debug, Clone, Serialize)]
pub struct Network {
    /// What the network is, in words ("tone stack").
    pub label: Option<String>,
    /// The network as it was before the mod.
    pub before: NetworkState,
    /// The edits that make the network as left; empty when the mod leaves
    /// the network as written (only one curve per setting is drawn).
    pub edits: Vec<Edit>,
    /// Find where the network's phase reaches 180°: a phase-shift ladder
    /// that feeds back a stage.
    pub oscillator: Option<Oscillator>,
    #[serde(skip)]
    pub span: SourceSpan,
}

impl Network {
    /// Whether the mod changes the network (an `after` block with edits).
    pub fn has_after(&self) -> bool {
        !self.edits.is_empty()
    }

    /// The network as left: the edits applied in order to `before`. Edits
    /// that name a part the network lacks were reported when the job was
    /// read and are skipped here.
    pub fn after(&self) -> NetworkState {
        let mut state = self.before.clone();
        for edit in &self.edits {
            match edit {
                Edit::Change {
                    reference,
                    value,
                    settings,
                    taper,
                    ..
                } => {
                    if let Some(part) = state
                        .parts
                        .iter_mut()
                        .find(|p| p.reference.value == reference.value)
                    {
                        if let Some(v) = value {
                            part.kind.set_value(*v);
                        }
                        if let PartKind::Pot {
                            settings: s,
                            taper: t,
                            ..
                        } = &mut part.kind
                        {
                            if let Some(new) = settings {
                                *s = new.clone();
                            }
                            if let Some(new) = taper {
                                *t = *new;
                            }
                        }
                        part.edited = Some(edit_span(edit));
                    }
                }
                Edit::Remove { reference, .. } => {
                    state.parts.retain(|p| p.reference.value != reference.value);
                }
                Edit::Add(part) => {
                    let mut part = part.clone();
                    part.edited = Some(part.span);
                    state.parts.push(part);
                }
                Edit::Source(source) => state.source = source.clone(),
                Edit::Load(load) => state.load = load.clone(),
            }
        }
        state
    }

    /// The source before, and any new source the edits give.
    pub fn sources(&self) -> impl Iterator<Item = &Source> {
        std::iter::once(&self.before.source).chain(self.edits.iter().filter_map(|e| match e {
            Edit::Source(s) => Some(s),
            _ => None,
        }))
    }

    /// A pot of the network before, or one the edits add.
    pub fn pot(&self, reference: &str) -> Option<&Part> {
        self.before
            .parts
            .iter()
            .chain(self.edits.iter().filter_map(|e| match e {
                Edit::Add(p) => Some(p),
                _ => None,
            }))
            .find(|p| p.reference.value == reference && matches!(p.kind, PartKind::Pot { .. }))
    }
}

fn edit_span(edit: &Edit) -> SourceSpan {
    match edit {
        Edit::Change { span, .. } | Edit::Remove { span, .. } => *span,
        Edit::Add(p) => p.span,
        Edit::Source(s) => s.span,
        Edit::Load(l) => l.span,
    }
}

/// One state of a network: its source, load and parts.
#[derive(Debug, Clone, Serialize)]
pub struct NetworkState {
    pub source: Source,
    pub load: Load,
    pub parts: Vec<Part>,
}

impl NetworkState {
    /// How many settings the state has: the length of the longest pot
    /// settings list (lists of one hold in every setting), at least 1.
    pub fn setting_count(&self) -> usize {
        self.parts
            .iter()
            .filter_map(|p| match &p.kind {
                PartKind::Pot { settings, .. } => Some(settings.len()),
                _ => None,
            })
            .max()
            .unwrap_or(1)
            .max(1)
    }

    /// The wiper setting of each pot in setting `index` (0-based).
    pub fn pot_settings(&self, index: usize) -> Vec<(String, f64)> {
        self.parts
            .iter()
            .filter_map(|p| match &p.kind {
                PartKind::Pot { settings, .. } => {
                    Some((p.reference.value.clone(), pick_setting(settings, index)))
                }
                _ => None,
            })
            .collect()
    }
}

/// Setting `index` of a pot's list: a list of one holds in every setting.
pub fn pick_setting(settings: &[f64], index: usize) -> f64 {
    match settings {
        [] => 0.0,
        [one] => *one,
        many => many[index.min(many.len() - 1)],
    }
}

/// The signal source driving the network: an EMF of 1 (the curves are
/// relative to the source's open-circuit voltage) behind its output
/// impedance, between `node` and ground.
#[derive(Debug, Clone, Serialize)]
pub struct Source {
    pub node: Spanned<String>,
    pub impedance: SourceImpedance,
    #[serde(skip)]
    pub span: SourceSpan,
}

#[derive(Debug, Clone, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum SourceImpedance {
    /// An ideal voltage source (zero output impedance).
    Ideal,
    /// A given output resistance.
    Given { ohms: Ohms },
    /// A common-cathode valve stage at a line-up position: ra ∥ RL with
    /// the cathode bypassed, (ra + (μ + 1)·Rk) ∥ RL with `cathode` given
    /// (unbypassed), μ and ra from the ratings table.
    Valve {
        valve: Spanned<String>,
        plate_load: Ohms,
        cathode: Option<Ohms>,
    },
}

/// Where the response is read, and what loads it there.
#[derive(Debug, Clone, Serialize)]
pub struct Load {
    pub node: Spanned<String>,
    /// The next stage's input resistance to ground (a grid resistor), or
    /// none for an unloaded output.
    pub resistance: Option<Ohms>,
    #[serde(skip)]
    pub span: SourceSpan,
}

/// One part of a network.
#[derive(Debug, Clone, Serialize)]
pub struct Part {
    pub reference: Spanned<String>,
    pub kind: PartKind,
    /// The span of the node that wrote the part.
    #[serde(skip)]
    pub span: SourceSpan,
    /// In the network as left: the edit that added or changed it.
    #[serde(skip)]
    pub edited: Option<SourceSpan>,
}

impl Part {
    /// The nodes the part connects, each with its span in the job file.
    pub fn nodes(&self) -> Vec<&Spanned<String>> {
        match &self.kind {
            PartKind::Resistor { a, b, .. }
            | PartKind::Capacitor { a, b, .. }
            | PartKind::Inductor { a, b, .. }
            | PartKind::Link { a, b } => vec![a, b],
            PartKind::Pot { ccw, wiper, cw, .. } => ccw
                .iter()
                .chain(std::iter::once(wiper))
                .chain(cw.iter())
                .collect(),
        }
    }

    /// Where a message about this part should point: the edit that made it
    /// what it is, else its own node.
    pub fn blame(&self) -> SourceSpan {
        self.edited.unwrap_or(self.span)
    }
}

#[derive(Debug, Clone, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum PartKind {
    Resistor {
        value: Ohms,
        a: Spanned<String>,
        b: Spanned<String>,
    },
    Capacitor {
        value: Farads,
        a: Spanned<String>,
        b: Spanned<String>,
    },
    Inductor {
        value: Henries,
        a: Spanned<String>,
        b: Spanned<String>,
    },
    /// A wire or a closed switch: an ideal short between two nodes.
    Link {
        a: Spanned<String>,
        b: Spanned<String>,
    },
    /// A potentiometer: a track of `value` from `ccw` to `cw` and a wiper.
    /// An end left out is not connected (a pot wired as a variable
    /// resistor).
    Pot {
        value: Ohms,
        taper: Taper,
        ccw: Option<Spanned<String>>,
        wiper: Spanned<String>,
        cw: Option<Spanned<String>>,
        /// Wiper settings 0–10, one per network setting (a single setting
        /// holds in all).
        settings: Vec<f64>,
        /// What the knob is called on the panel ("treble").
        label: Option<String>,
    },
}

impl PartKind {
    /// The node name of the kind, as written in a job file.
    pub fn node_name(&self) -> &'static str {
        match self {
            PartKind::Resistor { .. } => "resistor",
            PartKind::Capacitor { .. } => "capacitor",
            PartKind::Inductor { .. } => "inductor",
            PartKind::Link { .. } => "link",
            PartKind::Pot { .. } => "pot",
        }
    }

    /// The part's value in its base SI unit (none for a link).
    pub fn value(&self) -> Option<f64> {
        match self {
            PartKind::Resistor { value, .. } | PartKind::Pot { value, .. } => Some(value.0),
            PartKind::Capacitor { value, .. } => Some(value.0),
            PartKind::Inductor { value, .. } => Some(value.0),
            PartKind::Link { .. } => None,
        }
    }

    fn set_value(&mut self, v: f64) {
        match self {
            PartKind::Resistor { value, .. } | PartKind::Pot { value, .. } => *value = Ohms(v),
            PartKind::Capacitor { value, .. } => *value = Farads(v),
            PartKind::Inductor { value, .. } => *value = Henries(v),
            PartKind::Link { .. } => {}
        }
    }

    /// The kind of quantity the value is.
    pub fn quantity(&self) -> Option<crate::units::QuantityKind> {
        use crate::units::QuantityKind as Q;
        match self {
            PartKind::Resistor { .. } | PartKind::Pot { .. } => Some(Q::Resistance),
            PartKind::Capacitor { .. } => Some(Q::Capacitance),
            PartKind::Inductor { .. } => Some(Q::Inductance),
            PartKind::Link { .. } => None,
        }
    }
}

/// How a pot's resistance follows its rotation.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Taper {
    /// Resistance from `ccw` to the wiper in proportion to the rotation.
    Linear,
    /// Log ("audio") taper, approximated by two straight segments meeting
    /// at 10 % of the track at half rotation (common practice).
    Audio,
}

impl Taper {
    pub const NAMES: [&'static str; 2] = ["linear", "audio"];

    pub fn from_name(name: &str) -> Option<Taper> {
        match name {
            "linear" => Some(Taper::Linear),
            "audio" => Some(Taper::Audio),
            _ => None,
        }
    }

    pub fn words(self) -> &'static str {
        match self {
            Taper::Linear => "linear",
            Taper::Audio => "audio",
        }
    }
}

/// One edit in a mod's `after` block.
#[derive(Debug, Clone, Serialize)]
#[serde(tag = "edit", rename_all = "snake_case")]
pub enum Edit {
    /// A part's value, a pot's settings or taper changed.
    Change {
        reference: Spanned<String>,
        /// The new value, in the part's base SI unit.
        value: Option<f64>,
        settings: Option<Vec<f64>>,
        taper: Option<Taper>,
        #[serde(skip)]
        span: SourceSpan,
    },
    /// A part taken out.
    Remove {
        reference: Spanned<String>,
        #[serde(skip)]
        span: SourceSpan,
    },
    /// A part fitted.
    Add(Part),
    /// A new source.
    Source(Source),
    /// A new load.
    Load(Load),
}

/// The phase-shift search: the frequency where the network's phase is
/// 180° and its attenuation there, over the range of a speed pot.
#[derive(Debug, Clone, Serialize)]
pub struct Oscillator {
    /// The pot swept over 0–10, if any.
    pub speed: Option<Spanned<String>>,
    #[serde(skip)]
    pub span: SourceSpan,
}
