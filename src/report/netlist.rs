//! A mod's network as a plain SPICE netlist with an `.ac dec` analysis over
//! the same sweep the document uses, so anyone can check the solver's
//! curves in a general-purpose circuit simulator. Written from the same
//! resolved elements the solver stamps, so the two cannot describe
//! different circuits.
//!
//! SPICE names are case-insensitive and their first letter says what an
//! element is; node and part names from the job file are mapped to safe,
//! unique names and the mapping is listed in comments.

use std::collections::HashSet;

use crate::calc::network::{
    ElementKind, F_START, F_STOP, POINTS_PER_DECADE, Resolved, SourceFindings,
};

/// What the netlist's heading says about where it came from.
#[derive(Debug, Clone)]
pub struct NetlistHeading<'a> {
    pub job_id: &'a str,
    /// The mod's number in the job (from 1) and what it is.
    pub mod_number: usize,
    pub mod_what: &'a str,
    pub label: Option<&'a str>,
    /// "before" or "after".
    pub state: &'a str,
    /// The network setting (from 1).
    pub setting: usize,
}

/// The element names the netlist gives the source and its impedance.
pub const SOURCE_NAME: &str = "VSOURCE";
pub const SOURCE_IMPEDANCE_NAME: &str = "RSOURCE";

/// Unique SPICE-safe names, compared without regard to case.
struct Names {
    taken: HashSet<String>,
}

impl Names {
    fn new() -> Self {
        Names {
            taken: HashSet::new(),
        }
    }

    /// `wanted` made safe (letters, digits, `_`), starting with `letter`
    /// when given, and unique.
    fn claim(&mut self, wanted: &str, letter: Option<char>) -> String {
        let mut base: String = wanted
            .chars()
            .map(|c| {
                if c.is_ascii_alphanumeric() || c == '_' {
                    c
                } else {
                    '_'
                }
            })
            .collect();
        if base.is_empty() {
            base.push('n');
        }
        if let Some(l) = letter
            && !base.starts_with(|c: char| c.eq_ignore_ascii_case(&l))
        {
            base.insert(0, l);
        }
        let mut name = base.clone();
        let mut k = 2;
        while !self.taken.insert(name.to_ascii_lowercase()) {
            name = format!("{base}_{k}");
            k += 1;
        }
        name
    }
}

/// Formats a value so SPICE reads it back exactly (shortest round-trip
/// scientific notation, no unit letters: `m` would be milli and `M` too).
fn value(v: f64) -> String {
    format!("{v:e}")
}

/// The SPICE netlist of one resolved network state.
pub fn spice(heading: &NetlistHeading<'_>, net: &Resolved, source: &SourceFindings) -> String {
    let mut out = String::new();
    let line = |out: &mut String, s: &str| {
        out.push_str(s);
        out.push('\n');
    };
    // The first line of a SPICE file is its title.
    line(
        &mut out,
        &format!(
            "* network{} of job {}, mod {}: {}",
            heading
                .label
                .map(|l| format!(" \"{}\"", comment(l)))
                .unwrap_or_default(),
            comment(heading.job_id),
            heading.mod_number,
            comment(heading.mod_what)
        ),
    );
    line(
        &mut out,
        &format!(
            "* written by ampreport {}: the network {} the mod, setting {}",
            env!("CARGO_PKG_VERSION"),
            heading.state,
            heading.setting
        ),
    );
    if !net.pots.is_empty() {
        let pots: Vec<String> = net
            .pots
            .iter()
            .map(|(r, s)| format!("{} at {}", comment(r), crate::units::format_sig(*s, 3)))
            .collect();
        line(
            &mut out,
            &format!("* pot settings (0-10): {}", pots.join(", ")),
        );
    }
    line(
        &mut out,
        &format!("* source: {}", comment(&source.description)),
    );

    let mut names = Names::new();
    let mut nodes = Names::new();
    nodes.taken.insert("0".into());
    let mut node_names = vec!["0".to_string()];
    for n in net.nodes.iter().skip(1) {
        node_names.push(nodes.claim(n, None));
    }
    let renamed: Vec<String> = net
        .nodes
        .iter()
        .zip(&node_names)
        .skip(1)
        .filter(|(a, b)| a != b)
        .map(|(a, b)| format!("{} = {b}", comment(a)))
        .collect();
    line(&mut out, "* node ground = 0");
    if !renamed.is_empty() {
        line(
            &mut out,
            &format!("* nodes renamed: {}", renamed.join(", ")),
        );
    }
    let src = &node_names[net.source_node];
    let vs = names.claim(SOURCE_NAME, Some('V'));
    match net.source_ohms {
        Some(z) => {
            let inner = nodes.claim("source_emf", None);
            line(&mut out, &format!("{vs} {inner} 0 DC 0 AC 1"));
            let rs = names.claim(SOURCE_IMPEDANCE_NAME, Some('R'));
            line(&mut out, &format!("{rs} {inner} {src} {}", value(z)));
        }
        None => line(&mut out, &format!("{vs} {src} 0 DC 0 AC 1")),
    }
    for e in &net.elements {
        let (letter, text) = match e.kind {
            ElementKind::Resistor(r) => ('R', value(r)),
            ElementKind::Capacitor(c) => ('C', value(c)),
            ElementKind::Inductor(l) => ('L', value(l)),
            ElementKind::Short => ('V', "DC 0".to_string()),
        };
        let name = names.claim(&e.name, Some(letter));
        line(
            &mut out,
            &format!("{name} {} {} {text}", node_names[e.a], node_names[e.b]),
        );
    }
    let load = &node_names[net.load_node];
    if let Some(r) = net.load_ohms {
        let rl = names.claim("RLOAD", Some('R'));
        line(&mut out, &format!("{rl} {load} 0 {}", value(r)));
    }
    line(
        &mut out,
        &format!(
            ".ac dec {POINTS_PER_DECADE} {} {}",
            value(F_START),
            value(F_STOP)
        ),
    );
    line(
        &mut out,
        "* the response at the load per volt of source EMF; ngspice prints vp() in radians",
    );
    line(&mut out, &format!(".print ac vdb({load}) vp({load})"));
    line(&mut out, ".end");
    out
}

/// Text made safe for a comment line: one line, printable.
fn comment(s: &str) -> String {
    s.chars()
        .map(|c| if c.is_control() { ' ' } else { c })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::network::{Element, Resolved};

    fn source() -> SourceFindings {
        SourceFindings {
            state: "before",
            node: "in".into(),
            description: "a source of 10 kΩ output impedance".into(),
            impedance_ohms: Some(10e3),
            valve: None,
            stage_gain: None,
        }
    }

    #[test]
    fn names_are_safe_unique_and_typed() {
        let net = Resolved {
            nodes: vec![
                "ground".into(),
                "in".into(),
                "B+1".into(),
                "b+1".into(),
                "IN".into(),
            ],
            elements: vec![
                Element {
                    name: "VR1.ccw".into(),
                    kind: ElementKind::Resistor(1e5),
                    a: 1,
                    b: 2,
                },
                Element {
                    name: "C3".into(),
                    kind: ElementKind::Capacitor(2.5e-10),
                    a: 2,
                    b: 0,
                },
                Element {
                    name: "S1".into(),
                    kind: ElementKind::Short,
                    a: 3,
                    b: 4,
                },
                Element {
                    name: "r1".into(),
                    kind: ElementKind::Inductor(0.5),
                    a: 4,
                    b: 0,
                },
            ],
            source_node: 1,
            source_ohms: Some(10e3),
            load_node: 3,
            load_ohms: Some(1e6),
            pots: vec![("VR1".into(), 5.0)],
        };
        let heading = NetlistHeading {
            job_id: "J-1",
            mod_number: 2,
            mod_what: "treble eased",
            label: Some("tone stack"),
            state: "after",
            setting: 1,
        };
        let text = spice(&heading, &net, &source());
        let body: Vec<&str> = text.lines().filter(|l| !l.starts_with('*')).collect();
        assert_eq!(
            body,
            [
                "VSOURCE source_emf 0 DC 0 AC 1",
                "RSOURCE source_emf in 1e4",
                "RVR1_ccw in B_1 1e5",
                "C3 B_1 0 2.5e-10",
                "VS1 b_1_2 IN_2 DC 0",
                "Lr1 IN_2 0 5e-1",
                "RLOAD b_1_2 0 1e6",
                ".ac dec 40 2e1 2e4",
                ".print ac vdb(b_1_2) vp(b_1_2)",
                ".end",
            ]
        );
        assert!(text.starts_with("* network \"tone stack\" of job J-1, mod 2: treble eased\n"));
        assert!(text.contains("* pot settings (0-10): VR1 at 5\n"));
        assert!(text.contains("B+1 = B_1, b+1 = b_1_2, IN = IN_2"));
    }
}
