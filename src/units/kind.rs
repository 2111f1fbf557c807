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

    /// [`QuantityKind::noun`] as a message, said in the reader's language.
    pub fn noun_msg(self) -> crate::catalogue::Msg {
        crate::catalogue::Msg::new(match self {
            QuantityKind::Voltage => "diag-kind-voltage",
            QuantityKind::Current => "diag-kind-current",
            QuantityKind::Resistance => "diag-kind-resistance",
            QuantityKind::Power => "diag-kind-power",
            QuantityKind::Capacitance => "diag-kind-capacitance",
            QuantityKind::Inductance => "diag-kind-inductance",
            QuantityKind::Frequency => "diag-kind-frequency",
            QuantityKind::Percent => "diag-kind-percent",
        })
    }

    /// [`QuantityKind::range_words`] as a message ("1 µV to 100 kV").
    pub fn range_msg(self) -> crate::catalogue::Msg {
        let words = self.range_words();
        let (low, high) = words.split_once(" to ").unwrap_or((words, ""));
        crate::catalogue::Msg::new("diag-range")
            .arg("low", low)
            .arg("high", high)
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

    /// The magnitudes a value of this kind may have, `(smallest, largest)`
    /// in the base unit; zero is a separate question that each field
    /// answers. Everything outside is not a reading or a part, so it is
    /// refused where it is written, and every figure worked out from values
    /// inside stays a finite number. The reasons (docs/job-format.md):
    ///
    /// - voltage 1 µV … 100 kV: no bench meter resolves less than a
    ///   microvolt; an insulation tester gives at most 5 kV and nothing in a
    ///   valve amplifier comes near 100 kV;
    /// - current 1 nA … 100 A: below a leakage tester's resolution, above
    ///   any mains fuse of the equipment;
    /// - resistance 1 mΩ … 1 TΩ: the resolution of a low-ohm (earth
    ///   continuity) meter, and the top of an insulation tester's range;
    /// - power 1 mW … 10 kW: the smallest resistor rating made, and far
    ///   above any part of an amplifier;
    /// - capacitance 1 fF … 10 F: below a stray capacitance, above any
    ///   electrolytic;
    /// - inductance 1 nH … 10 kH: a wire's own inductance, above any
    ///   choke or transformer winding;
    /// - frequency 1 Hz … 1 MHz: mains and audio with room to spare;
    /// - percent 0 … 1,000 %: tolerances, bands and margins.
    pub fn accepted_range(self) -> (f64, f64) {
        match self {
            QuantityKind::Voltage => (1e-6, 1e5),
            QuantityKind::Current => (1e-9, 100.0),
            QuantityKind::Resistance => (1e-3, 1e12),
            QuantityKind::Power => (1e-3, 1e4),
            QuantityKind::Capacitance => (1e-15, 10.0),
            QuantityKind::Inductance => (1e-9, 1e4),
            QuantityKind::Frequency => (1.0, 1e6),
            QuantityKind::Percent => (0.0, 1000.0),
        }
    }

    /// Whether `value` may be written for this kind: finite, and zero or
    /// with a magnitude inside [`accepted_range`](Self::accepted_range).
    /// Signs are each field's business.
    pub fn accepts(self, value: f64) -> bool {
        let (lo, hi) = self.accepted_range();
        value == 0.0 || (lo..=hi).contains(&value.abs())
    }

    /// The accepted range in words: "1 mΩ to 1 TΩ".
    pub fn range_words(self) -> &'static str {
        match self {
            QuantityKind::Voltage => "1 µV to 100 kV",
            QuantityKind::Current => "1 nA to 100 A",
            QuantityKind::Resistance => "1 mΩ to 1 TΩ",
            QuantityKind::Power => "1 mW to 10 kW",
            QuantityKind::Capacitance => "1 fF to 10 F",
            QuantityKind::Inductance => "1 nH to 10 kH",
            QuantityKind::Frequency => "1 Hz to 1 MHz",
            QuantityKind::Percent => "0 % to 1000 %",
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
