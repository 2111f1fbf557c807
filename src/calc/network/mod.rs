//! A mod's network, worked out: the response at the load before and after
//! the mod's edits at each pot setting, swept from 20 Hz to 20 kHz, the
//! figures the document quotes, and the phase-shift oscillator's rate over
//! a speed pot's range. Pure: a network and the ratings in, findings out.

mod features;
mod findings;
mod mna;
mod oscillator;
mod sweep;
mod taper;

pub use features::{
    Corner, CornerKind, HALF_POWER_DB, SCOOP_MIN_DB, Scoop, bisect, corners, scoop,
};
pub use findings::*;
pub use mna::{Element, ElementKind, Resolved, Singular, Solver, db, degrees, resolve};
pub use oscillator::{Crossing, SEARCH_START_HZ, SEARCH_STOP_HZ, half_turn};
pub use sweep::{F_START, F_STOP, POINTS_PER_DECADE, SPOT_FREQUENCIES, audio_sweep, log_sweep};
pub use taper::{AUDIO_MIDPOINT, END_RESIDUAL, fraction, split};

use crate::calc::circuit::{gain_bypassed, gain_unbypassed, parallel};
use crate::catalogue::{Catalogue, Msg};
use crate::job::Job;
use crate::job::network::{Edit, Network, NetworkState, PartKind, Source, SourceImpedance};
use crate::ratings::RatingsTable;
use crate::units::{Ohms, QuantityKind as Q, format_engineering};

/// Which state of a mod's network.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum State {
    Before,
    After,
}

impl State {
    pub fn word(self) -> &'static str {
        match self {
            State::Before => "before",
            State::After => "after",
        }
    }
}

/// A state of `net`: before, or after its edits.
pub fn state(net: &Network, which: State) -> NetworkState {
    match which {
        State::Before => net.before.clone(),
        State::After => net.after(),
    }
}

/// The source's output impedance (none for an ideal source) and the
/// source in the words of `cat`, from the ratings table's μ and ra for a
/// valve stage; a problem is said in those words too.
pub fn source_figures(
    source: &Source,
    which: State,
    job: &Job,
    ratings: &RatingsTable,
    cat: &Catalogue,
) -> Result<SourceFindings, String> {
    let ohms = |r: f64| format_engineering(r, Q::Resistance);
    let node = source.node.value.clone();
    Ok(match &source.impedance {
        SourceImpedance::Ideal => SourceFindings {
            state: which.word(),
            node,
            description: cat.text("figure-network-ideal-source"),
            impedance_ohms: None,
            valve: None,
            stage_gain: None,
        },
        SourceImpedance::Given { ohms: z } => SourceFindings {
            state: which.word(),
            node,
            description: cat
                .say(&Msg::new("figure-network-source-impedance").arg("impedance", ohms(z.0))),
            impedance_ohms: Some(z.0),
            valve: None,
            stage_gain: None,
        },
        SourceImpedance::Valve {
            valve,
            plate_load,
            cathode,
        } => {
            let spec = job.valve(&valve.value).ok_or_else(|| {
                cat.say(&Msg::new("figure-network-not-in-line-up").arg("position", &valve.value))
            })?;
            let row = ratings.lookup(&spec.type_name.value).map_err(|_| {
                cat.say(
                    &Msg::new("figure-network-not-in-ratings").arg("type", &spec.type_name.value),
                )
            })?;
            let (Some(mu), Some(ra)) = (row.mu, row.plate_resistance) else {
                return Err(cat.say(
                    &Msg::new("figure-network-no-mu-ra")
                        .arg("position", &valve.value)
                        .arg("type", &row.name),
                ));
            };
            let (inner, gain, how) = match cathode {
                Some(rk) => (
                    Ohms(ra.0 + (mu + 1.0) * rk.0),
                    gain_unbypassed(mu, ra, *plate_load, *rk),
                    Msg::new("figure-network-unbypassed").arg("resistor", ohms(rk.0)),
                ),
                None => (
                    ra,
                    gain_bypassed(mu, ra, *plate_load),
                    Msg::new("figure-network-bypassed"),
                ),
            };
            let z = parallel(inner, *plate_load);
            SourceFindings {
                state: which.word(),
                node,
                description: cat.say(
                    &Msg::new("figure-network-valve-source")
                        .arg("position", &valve.value)
                        .arg("type", &row.name)
                        .arg("mu", mu.to_string())
                        .arg("ra", ohms(ra.0))
                        .arg("load", ohms(plate_load.0))
                        .arg("how", how)
                        .arg("impedance", ohms(z.0)),
                ),
                impedance_ohms: Some(z.0),
                valve: Some(valve.value.clone()),
                stage_gain: Some(gain),
            }
        }
    })
}

/// One state at one setting, ready for the solver or a netlist (whose
/// comments are English).
pub fn resolve_state(
    net: &Network,
    which: State,
    setting: usize,
    job: &Job,
    ratings: &RatingsTable,
) -> Result<(Resolved, SourceFindings), String> {
    let st = state(net, which);
    let source = source_figures(&st.source, which, job, ratings, Catalogue::english())?;
    Ok((resolve(&st, setting, source.impedance_ohms, &[]), source))
}

/// Works out a mod's network, its words in English.
pub fn derive(net: &Network, job: &Job, ratings: &RatingsTable) -> NetworkFindings {
    derive_in(net, job, ratings, Catalogue::english())
}

/// [`derive`] with the source, the edits and any problem in the words of
/// `cat` (the shop's language).
pub fn derive_in(
    net: &Network,
    job: &Job,
    ratings: &RatingsTable,
    cat: &Catalogue,
) -> NetworkFindings {
    let freqs = audio_sweep();
    let mut out = NetworkFindings {
        label: net.label.clone(),
        points_per_decade: POINTS_PER_DECADE,
        frequencies_hz: freqs.clone(),
        sources: Vec::new(),
        load_node: net.before.load.node.value.clone(),
        load_ohms: net.before.load.resistance.map(|r| r.0),
        edits: edit_words(net, cat),
        curves: Vec::new(),
        changes: Vec::new(),
        oscillator: Vec::new(),
        problem: None,
    };
    if let Err(problem) = fill(net, job, ratings, &freqs, cat, &mut out) {
        out.curves.clear();
        out.changes.clear();
        out.oscillator.clear();
        out.problem = Some(problem);
    }
    out
}

fn fill(
    net: &Network,
    job: &Job,
    ratings: &RatingsTable,
    freqs: &[f64],
    cat: &Catalogue,
    out: &mut NetworkFindings,
) -> Result<(), String> {
    let states: &[State] = if net.has_after() {
        &[State::Before, State::After]
    } else {
        &[State::Before]
    };
    let singular = |e: Singular| {
        cat.say(
            &Msg::new("figure-network-singular").arg("frequency", format!("{:.4}", e.frequency_hz)),
        )
    };
    for &which in states {
        let st = state(net, which);
        let source = source_figures(&st.source, which, job, ratings, cat)?;
        let z = source.impedance_ohms;
        let same_source = out
            .sources
            .last()
            .is_some_and(|s| s.description == source.description && s.node == source.node);
        if !same_source {
            out.sources.push(source);
        }
        for k in 0..st.setting_count() {
            let resolved = resolve(&st, k, z, &[]);
            let solver = Solver::new(&resolved);
            out.curves
                .push(curve(&solver, which, k, &resolved, &st, freqs).map_err(singular)?);
        }
        if let Some(osc) = &net.oscillator {
            out.oscillator.push(
                oscillate(&st, which, z, osc.speed.as_ref().map(|s| s.value.as_str()))
                    .map_err(singular)?,
            );
        }
    }
    if net.has_after() {
        let before: Vec<&CurveFindings> =
            out.curves.iter().filter(|c| c.state == "before").collect();
        let after: Vec<&CurveFindings> = out.curves.iter().filter(|c| c.state == "after").collect();
        let n = before.len().max(after.len());
        for k in 0..n {
            let b = before[k.min(before.len() - 1)];
            let a = after[k.min(after.len() - 1)];
            out.changes.push(ChangeFindings {
                setting: k + 1,
                change_100hz_db: a.gain_100hz_db - b.gain_100hz_db,
                change_1khz_db: a.gain_1khz_db - b.gain_1khz_db,
                change_5khz_db: a.gain_5khz_db - b.gain_5khz_db,
            });
        }
    }
    Ok(())
}

fn curve(
    solver: &Solver,
    which: State,
    k: usize,
    resolved: &Resolved,
    st: &NetworkState,
    freqs: &[f64],
) -> Result<CurveFindings, Singular> {
    let label = |r: &str| {
        st.parts.iter().find_map(|p| match &p.kind {
            PartKind::Pot { label, .. } if p.reference.value == r => label.clone(),
            _ => None,
        })
    };
    let h = |f: f64| solver.response(f);
    let mut magnitude_db = Vec::with_capacity(freqs.len());
    let mut phase_deg = Vec::with_capacity(freqs.len());
    for &f in freqs {
        let v = h(f)?;
        magnitude_db.push(db(v));
        phase_deg.push(degrees(v));
    }
    let spot = |f: f64| h(f).map(db);
    let (top, top_at) =
        magnitude_db
            .iter()
            .zip(freqs)
            .fold((f64::NEG_INFINITY, 0.0), |(m, at), (&v, &f)| {
                if v > m { (v, f) } else { (m, at) }
            });
    Ok(CurveFindings {
        state: which.word(),
        setting: k + 1,
        pots: resolved
            .pots
            .iter()
            .map(|(r, s)| PotSetting {
                reference: r.clone(),
                label: label(r),
                setting: *s,
            })
            .collect(),
        gain_100hz_db: spot(SPOT_FREQUENCIES[0])?,
        gain_1khz_db: spot(SPOT_FREQUENCIES[1])?,
        gain_5khz_db: spot(SPOT_FREQUENCIES[2])?,
        max_db: top,
        max_hz: top_at,
        corners: corners(freqs, &magnitude_db, &h)?
            .into_iter()
            .map(|c| CornerFindings {
                frequency_hz: c.frequency_hz,
                kind: c.kind,
            })
            .collect(),
        scoop: scoop(freqs, &magnitude_db, &h)?.map(|s| ScoopFindings {
            frequency_hz: s.frequency_hz,
            gain_db: s.gain_db,
            depth_db: s.depth_db,
        }),
        magnitude_db,
        phase_deg,
    })
}

/// Speed-pot settings the oscillator table steps through.
pub const SPEED_STEPS: [f64; 11] = [0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0, 9.0, 10.0];

fn oscillate(
    st: &NetworkState,
    which: State,
    z: Option<f64>,
    speed: Option<&str>,
) -> Result<OscillatorFindings, Singular> {
    let mut points = Vec::new();
    let runs: Vec<(f64, Resolved)> = match speed {
        Some(pot) => SPEED_STEPS
            .iter()
            .map(|&s| (s, resolve(st, 0, z, &[(pot.to_string(), s)])))
            .collect(),
        None => (0..st.setting_count())
            .map(|k| ((k + 1) as f64, resolve(st, k, z, &[])))
            .collect(),
    };
    for (setting, resolved) in runs {
        let solver = Solver::new(&resolved);
        let crossing = half_turn(&|f| solver.response(f))?;
        points.push(OscillatorPoint {
            setting,
            frequency_hz: crossing.map(|c| c.frequency_hz),
            attenuation: crossing.map(|c| c.ratio),
            gain_needed: crossing.map(|c| 1.0 / c.ratio),
        });
    }
    Ok(OscillatorFindings {
        state: which.word(),
        speed_pot: speed.map(str::to_string),
        points,
    })
}

/// The mod's edits in the words of `cat`: "R5 100 kΩ → 56 kΩ", "C3
/// (250 pF) removed".
pub fn edit_words(net: &Network, cat: &Catalogue) -> Vec<String> {
    let value_words = |kind: &PartKind| match (kind.value(), kind.quantity()) {
        (Some(v), Some(q)) => format_engineering(v, q),
        _ => cat.text("figure-network-kind-link"),
    };
    let mut current = net.before.clone();
    let mut out = Vec::new();
    for edit in &net.edits {
        let find =
            |r: &str, st: &NetworkState| st.parts.iter().find(|p| p.reference.value == r).cloned();
        match edit {
            Edit::Change {
                reference,
                value,
                settings,
                taper,
                ..
            } => {
                let was = find(&reference.value, &current);
                let mut bits = Vec::new();
                if let (Some(v), Some(part)) = (value, &was)
                    && let Some(q) = part.kind.quantity()
                {
                    bits.push(format!(
                        "{} → {}",
                        value_words(&part.kind),
                        format_engineering(*v, q)
                    ));
                }
                if let Some(s) = settings {
                    let list: Vec<String> =
                        s.iter().map(|v| crate::units::format_sig(*v, 3)).collect();
                    bits.push(
                        cat.say(
                            &Msg::new("figure-network-set-to").arg("settings", list.join(", ")),
                        ),
                    );
                }
                if let Some(t) = taper {
                    bits.push(cat.text(&format!("figure-network-taper-{}", t.words())));
                }
                out.push(format!("{} {}", reference.value, bits.join("; ")));
            }
            Edit::Remove { reference, .. } => {
                let was = find(&reference.value, &current);
                out.push(
                    cat.say(&match was {
                        Some(p) if !matches!(p.kind, PartKind::Link { .. }) => {
                            Msg::new("figure-network-removed-value")
                                .arg("reference", &reference.value)
                                .arg("value", value_words(&p.kind))
                        }
                        _ => Msg::new("figure-network-removed").arg("reference", &reference.value),
                    }),
                );
            }
            Edit::Add(p) => {
                let nodes: Vec<&str> = p.nodes().iter().map(|n| n.value.as_str()).collect();
                out.push(
                    cat.say(&match &p.kind {
                        PartKind::Link { .. } => Msg::new("figure-network-added-link")
                            .arg("reference", &p.reference.value)
                            .arg("from", nodes.first().copied().unwrap_or_default())
                            .arg("to", nodes.get(1).copied().unwrap_or_default()),
                        kind => Msg::new("figure-network-added")
                            .arg("reference", &p.reference.value)
                            .arg(
                                "kind",
                                cat.text(&format!("figure-network-kind-{}", kind.node_name())),
                            )
                            .arg("value", value_words(kind))
                            .arg("nodes", cat.and_list(&nodes)),
                    }),
                );
            }
            Edit::Source(_) => out.push(cat.text("figure-network-source-changed")),
            Edit::Load(l) => out.push(
                cat.say(&match l.resistance {
                    Some(r) => Msg::new("figure-network-load-now")
                        .arg("load", format_engineering(r.0, Q::Resistance))
                        .arg("node", &l.node.value),
                    None => Msg::new("figure-network-unloaded").arg("node", &l.node.value),
                }),
            ),
        }
        // Apply this edit alone, so the next edit's "was" is current.
        let single = Network {
            label: None,
            before: current.clone(),
            edits: vec![edit.clone()],
            oscillator: None,
            span: net.span,
        };
        current = single.after();
    }
    out
}

#[cfg(test)]
mod tests;
