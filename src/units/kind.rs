//! The kinds of quantity a job file can hold, with their unit symbols.

use serde::Serialize;
use std::fmt;

/// What a value in a job file measures. Decides which unit symbols are
/// accepted and how the value is printed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum QuantityKind {
    Voltage,
    Current,
    Resistance,
    Power,
    Capacitance,
    Inductance,
    Frequency,
    /// A plain ratio written in percent (`"5%"` or `5`).
    Percent,
}

impl QuantityKind {
    /// The unit symbol printed after a value.
    pub fn symbol(self) -> &'static str {
        match self {
            QuantityKind::Voltage => "V",
            QuantityKind::Current => "A",
            QuantityKind::Resistance => "Ω",
            QuantityKind::Power => "W",
            QuantityKind::Capacitance => "F",
            QuantityKind::Inductance => "H",
            QuantityKind::Frequency => "Hz",
            QuantityKind::Percent => "%",
        }
    }

    /// A noun for messages: "a voltage", "a resistance".
    pub fn noun(self) -> &'static str {
        match self {
            QuantityKind::Voltage => "a voltage",
            QuantityKind::Current => "a current",
            QuantityKind::Resistance => "a resistance",
            QuantityKind::Power => "a power",
            QuantityKind::Capacitance => "a capacitance",
            QuantityKind::Inductance => "an inductance",
            QuantityKind::Frequency => "a frequency",
            QuantityKind::Percent => "a percentage",
        }
    }

    /// An example value for hints in error messages.
    pub fn example(self) -> &'static str {
        match self {
            QuantityKind::Voltage => "\"352V\", \"38.5mV\" or 352",
            QuantityKind::Current => "\"34mA\", \"1.5A\" or 0.034",
            QuantityKind::Resistance => "\"470k\", \"4k7\", \"1R\" or 470000",
            QuantityKind::Power => "\"5W\", \"0.5W\" or 5",
            QuantityKind::Capacitance => "\"22µF\", \"0.022u\", \"4n7\" or 22e-6",
            QuantityKind::Inductance => "\"500mH\", \"1.5H\" or 0.5",
            QuantityKind::Frequency => "\"60Hz\" or 50",
            QuantityKind::Percent => "\"10%\" or 10",
        }
    }

    /// Every spelling of a unit symbol accepted for this kind.
    pub(crate) fn symbols(self) -> &'static [&'static str] {
        match self {
            QuantityKind::Voltage => &["V", "Vdc", "VDC", "Vac", "VAC", "Vrms", "VRMS"],
            QuantityKind::Current => &["A"],
            QuantityKind::Resistance => &["\u{3a9}", "\u{2126}", "ohm", "ohms", "Ohm", "Ohms", "R"],
            QuantityKind::Power => &["W"],
            QuantityKind::Capacitance => &["F"],
            QuantityKind::Inductance => &["H"],
            QuantityKind::Frequency => &["Hz"],
            QuantityKind::Percent => &["%"],
        }
    }

    /// All kinds, for recognising a symbol that belongs elsewhere.
    pub const ALL: [QuantityKind; 8] = [
        QuantityKind::Voltage,
        QuantityKind::Current,
        QuantityKind::Resistance,
        QuantityKind::Power,
        QuantityKind::Capacitance,
        QuantityKind::Inductance,
        QuantityKind::Frequency,
        QuantityKind::Percent,
    ];
}

impl fmt::Display for QuantityKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.noun())
    }
}
