//! Reading values as technicians write them: plain numbers, SI prefixes and
//! IEC 60062 RKM codes, with an optional unit symbol that must match the
//! quantity the field expects.

use super::kind::QuantityKind;
use std::fmt;

/// Why a value could not be read, with the byte range inside the text that
/// caused it (so a caller can underline it).
#[derive(Debug, Clone, PartialEq)]
pub struct UnitError {
    pub problem: UnitProblem,
    /// Byte offset of the offending part within the value text.
    pub offset: usize,
    /// Byte length of the offending part.
    pub len: usize,
}

/// The kinds of failure when reading a value.
#[derive(Debug, Clone, PartialEq)]
pub enum UnitProblem {
    Empty,
    NotANumber,
    WrongUnit {
        expected: QuantityKind,
        found: QuantityKind,
        symbol: String,
    },
    RkmOhmsOnly {
        expected: QuantityKind,
    },
    PrefixNotAllowed {
        expected: QuantityKind,
    },
    NotFinite,
}

impl fmt::Display for UnitError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match &self.problem {
            UnitProblem::Empty => write!(f, "the value is empty"),
            UnitProblem::NotANumber => write!(
                f,
                "this is not a number with an optional SI prefix or an RKM code"
            ),
            UnitProblem::WrongUnit {
                expected,
                found,
                symbol,
            } => write!(
                f,
                "\"{symbol}\" is the unit of {found}, but {expected} belongs here"
            ),
            UnitProblem::RkmOhmsOnly { expected } => write!(
                f,
                "the RKM letter R marks the decimal point of a resistance, but {expected} belongs here"
            ),
            UnitProblem::PrefixNotAllowed { expected } => {
                write!(f, "{expected} takes no SI prefix")
            }
            UnitProblem::NotFinite => write!(f, "the value is too large to be a measurement"),
        }
    }
}

impl UnitError {
    /// The problem as a message, said in the reader's language (the
    /// [`fmt::Display`] words are its English).
    pub fn msg(&self) -> crate::catalogue::Msg {
        use crate::catalogue::Msg;
        match &self.problem {
            UnitProblem::Empty => Msg::new("diag-unit-empty"),
            UnitProblem::NotANumber => Msg::new("diag-unit-not-a-number"),
            UnitProblem::WrongUnit {
                expected,
                found,
                symbol,
            } => Msg::new("diag-unit-wrong")
                .arg("symbol", symbol.as_str())
                .arg("found", found.noun_msg())
                .arg("expected", expected.noun_msg()),
            UnitProblem::RkmOhmsOnly { expected } => {
                Msg::new("diag-unit-rkm").arg("expected", expected.noun_msg())
            }
            UnitProblem::PrefixNotAllowed { expected } => {
                Msg::new("diag-unit-no-prefix").arg("expected", expected.noun_msg())
            }
            UnitProblem::NotFinite => Msg::new("diag-unit-not-finite"),
        }
    }
}

impl std::error::Error for UnitError {}

/// The multiplier of an SI prefix or RKM letter, if `c` is one.
fn multiplier(c: char) -> Option<f64> {
    Some(match c {
        'p' => 1e-12,
        'n' => 1e-9,
        'u' | 'µ' | 'μ' => 1e-6,
        'm' => 1e-3,
        'k' | 'K' => 1e3,
        'M' => 1e6,
        'G' => 1e9,
        'T' => 1e12,
        'R' => 1.0,
        _ => return None,
    })
}

/// Finds the longest unit symbol (of any kind) that ends `text`.
fn trailing_symbol(text: &str) -> Option<(QuantityKind, &'static str)> {
    let mut best: Option<(QuantityKind, &'static str)> = None;
    for kind in QuantityKind::ALL {
        for sym in kind.symbols() {
            if text.ends_with(sym) && best.is_none_or(|(_, b)| sym.len() > b.len()) {
                best = Some((kind, sym));
            }
        }
    }
    best
}

/// Reads a value written as text, returning it in the base SI unit (for
/// [`QuantityKind::Percent`], in percent).
///
/// Accepted forms: `352`, `352V`, `38.5 mV`, `470k`, `4k7`, `4R7`, `R47`,
/// `2M2`, `0.0047u`, `4n7`, `p68`, `22µF` (µ U+00B5, μ U+03BC or `u`).
pub fn parse_quantity(text: &str, expected: QuantityKind) -> Result<f64, UnitError> {
    if let Some(v) = plain_reading(text, expected) {
        return Ok(v);
    }
    parse_quantity_steps(text, expected)
}

/// The form most readings take, `465.5V` or `38`: ASCII digits, at most
/// one `.` with digits on both sides, then nothing or the one-character
/// symbol of the expected kind (a symbol no longer symbol of any kind
/// ends with). What [`parse_quantity_steps`] gives for such a text is the
/// standard library's reading of the digits, so that is returned at once;
/// anything else (space, a sign, a prefix, RKM, another unit, a value too
/// large to be finite) is `None` and takes the steps.
fn plain_reading(text: &str, expected: QuantityKind) -> Option<f64> {
    let bytes = text.as_bytes();
    let symbol = match expected {
        QuantityKind::Voltage => b'V',
        QuantityKind::Current => b'A',
        QuantityKind::Power => b'W',
        QuantityKind::Capacitance => b'F',
        QuantityKind::Inductance => b'H',
        QuantityKind::Percent => b'%',
        QuantityKind::Resistance | QuantityKind::Frequency => 0,
    };
    let digits = match bytes.last() {
        Some(&b) if b == symbol && symbol != 0 => &bytes[..bytes.len() - 1],
        _ => bytes,
    };
    let mut dot = None;
    for (i, &b) in digits.iter().enumerate() {
        match b {
            b'0'..=b'9' => {}
            b'.' if dot.is_none() => dot = Some(i),
            _ => return None,
        }
    }
    if digits.is_empty() || dot.is_some_and(|d| d == 0 || d + 1 == digits.len()) {
        return None;
    }
    // Only ASCII digits and a dot: a str, and a decimal `f64::from_str` reads.
    let number = std::str::from_utf8(digits).ok()?;
    let v: f64 = number.parse().ok()?;
    v.is_finite().then_some(v)
}

/// [`parse_quantity`] step by step: the symbol, then the SI prefix or RKM
/// code, each checked.
fn parse_quantity_steps(text: &str, expected: QuantityKind) -> Result<f64, UnitError> {
    let lead = text.len() - text.trim_start().len();
    let body = text.trim();
    if body.is_empty() {
        return Err(UnitError {
            problem: UnitProblem::Empty,
            offset: 0,
            len: text.len(),
        });
    }

    // 1. A trailing unit symbol, checked against the expected kind.
    let mut number = body;
    if let Some((kind, sym)) = trailing_symbol(body) {
        let sym_start = body.len() - sym.len();
        let before = &body[..sym_start];
        // "470R" ends in R: that is a resistance symbol only when something
        // numeric precedes it; "R" alone is not a value.
        let is_symbol = !before.trim().is_empty();
        if is_symbol {
            if kind != expected {
                // "4k7R" style: an RKM 'R' after a full value still means ohms.
                return Err(UnitError {
                    problem: UnitProblem::WrongUnit {
                        expected,
                        found: kind,
                        symbol: sym.to_string(),
                    },
                    offset: lead + sym_start,
                    len: sym.len(),
                });
            }
            number = before.trim_end();
        }
    }

    let value = parse_si(number)
        .or_else(|| parse_rkm(number))
        .ok_or(UnitError {
            problem: UnitProblem::NotANumber,
            offset: lead,
            len: body.len(),
        })?;

    let (value, letter) = value;
    if let Some(letter) = letter {
        if letter == 'R' && expected != QuantityKind::Resistance {
            return Err(UnitError {
                problem: UnitProblem::RkmOhmsOnly { expected },
                offset: lead,
                len: body.len(),
            });
        }
        if expected == QuantityKind::Percent {
            return Err(UnitError {
                problem: UnitProblem::PrefixNotAllowed { expected },
                offset: lead,
                len: body.len(),
            });
        }
    }
    if !value.is_finite() {
        return Err(UnitError {
            problem: UnitProblem::NotFinite,
            offset: lead,
            len: body.len(),
        });
    }
    Ok(value)
}

/// `[sign] digits [. digits] [e exp] [space] [prefix]`. Returns the value and
/// the prefix letter used, if any.
fn parse_si(text: &str) -> Option<(f64, Option<char>)> {
    let mut chars = text.char_indices().peekable();
    let mut end = 0;
    // sign
    if let Some(&(_, c)) = chars.peek()
        && (c == '+' || c == '-')
    {
        chars.next();
        end = c.len_utf8();
    }
    let mut digits = 0;
    let mut seen_dot = false;
    while let Some(&(i, c)) = chars.peek() {
        if c.is_ascii_digit() {
            digits += 1;
        } else if c == '.' && !seen_dot {
            seen_dot = true;
        } else {
            break;
        }
        end = i + 1;
        chars.next();
    }
    if digits == 0 {
        return None;
    }
    // exponent
    let rest = &text[end..];
    let mut exp_len = 0;
    if let Some(after_e) = rest.strip_prefix(['e', 'E']) {
        let after_sign = after_e.strip_prefix(['+', '-']).unwrap_or(after_e);
        let exp_digits = after_sign
            .chars()
            .take_while(|c| c.is_ascii_digit())
            .count();
        if exp_digits > 0 {
            exp_len = 1 + (after_e.len() - after_sign.len()) + exp_digits;
        }
    }
    let mantissa_end = end + exp_len;
    let mantissa: f64 = text[..mantissa_end].parse().ok()?;
    let tail = text[mantissa_end..].trim_start();
    let mut tail_chars = tail.chars();
    match (tail_chars.next(), tail_chars.next()) {
        (None, _) => Some((mantissa, None)),
        (Some(c), None) if c != 'R' => multiplier(c).map(|m| (mantissa * m, Some(c))),
        (Some('R'), None) => Some((mantissa, Some('R'))),
        _ => None,
    }
}

/// IEC 60062 RKM code: the letter stands for the decimal point and the
/// multiplier (`4k7`, `4R7`, `R47`, `2M2`, `4n7`, `p68`).
fn parse_rkm(text: &str) -> Option<(f64, Option<char>)> {
    let (pos, letter) = text.char_indices().find(|&(_, c)| !c.is_ascii_digit())?;
    let mult = multiplier(letter)?;
    let whole = &text[..pos];
    let frac = &text[pos + letter.len_utf8()..];
    if !frac.chars().all(|c| c.is_ascii_digit()) || (whole.is_empty() && frac.is_empty()) {
        return None;
    }
    let joined = format!(
        "{}.{}",
        if whole.is_empty() { "0" } else { whole },
        if frac.is_empty() { "0" } else { frac }
    );
    let v: f64 = joined.parse().ok()?;
    Some((v * mult, Some(letter)))
}

#[cfg(test)]
mod tests {
    use super::*;
    use QuantityKind::*;

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs().max(1e-15)
    }

    #[track_caller]
    fn ok(text: &str, kind: QuantityKind, want: f64) {
        let got = parse_quantity(text, kind).unwrap_or_else(|e| panic!("{text:?}: {e}"));
        assert!(close(got, want), "{text:?} gave {got}, want {want}");
    }

    #[test]
    fn iec_60062_rkm_examples() {
        // IEC 60062 (RKM code) examples for resistance: the letter is the decimal point.
        ok("R47", Resistance, 0.47); // IEC 60062: R47 = 0.47 Ω
        ok("4R7", Resistance, 4.7); // IEC 60062: 4R7 = 4.7 Ω
        ok("470R", Resistance, 470.0); // IEC 60062: 470R = 470 Ω
        ok("4k7", Resistance, 4_700.0); // IEC 60062: 4K7 = 4.7 kΩ
        ok("4K7", Resistance, 4_700.0); // IEC 60062: 4K7 = 4.7 kΩ
        ok("47k", Resistance, 47_000.0); // IEC 60062: 47K = 47 kΩ
        ok("2M2", Resistance, 2_200_000.0); // IEC 60062: 2M2 = 2.2 MΩ
        ok("1G0", Resistance, 1e9); // IEC 60062: 1G0 = 1 GΩ
        // IEC 60062 examples for capacitance.
        ok("p68", Capacitance, 0.68e-12); // IEC 60062: p68 = 0.68 pF
        ok("4n7", Capacitance, 4.7e-9); // IEC 60062: 4n7 = 4.7 nF
        ok("2u2", Capacitance, 2.2e-6); // IEC 60062: 2µ2 = 2.2 µF
        ok("2µ2", Capacitance, 2.2e-6); // IEC 60062: 2µ2 = 2.2 µF
        ok("6m8", Capacitance, 6.8e-3); // IEC 60062: 6m8 = 6.8 mF
    }

    #[test]
    fn si_prefixes_and_symbols() {
        ok("470k", Resistance, 470e3); // SI prefix k = 10³ (SI Brochure, 9th ed.)
        ok("0.0047u", Capacitance, 4.7e-9); // SI prefix µ = 10⁻⁶
        ok("4.7nF", Capacitance, 4.7e-9); // SI prefix n = 10⁻⁹
        ok("22µF", Capacitance, 22e-6); // µ is U+00B5 MICRO SIGN
        ok("22μF", Capacitance, 22e-6); // μ is U+03BC GREEK SMALL LETTER MU
        ok("22uF", Capacitance, 22e-6); // u is the ASCII stand-in for micro
        ok("1.5A", Current, 1.5);
        ok("38.5mV", Voltage, 38.5e-3); // SI prefix m = 10⁻³
        ok("34mA", Current, 34e-3);
        ok("352 V", Voltage, 352.0);
        ok("352", Voltage, 352.0);
        ok("-52V", Voltage, -52.0);
        ok("4.7 k\u{3a9}", Resistance, 4700.0); // U+03A9 GREEK CAPITAL OMEGA
        ok("4.7k\u{2126}", Resistance, 4700.0); // U+2126 OHM SIGN
        ok("1 ohm", Resistance, 1.0);
        ok("2.2MΩ", Resistance, 2.2e6); // SI prefix M = 10⁶
        ok("60Hz", Frequency, 60.0);
        ok("1e3", Resistance, 1000.0);
        ok("5%", Percent, 5.0);
        ok("10", Percent, 10.0);
        ok("275Vrms", Voltage, 275.0);
        ok("100pF", Capacitance, 100e-12); // SI prefix p = 10⁻¹²
    }

    #[test]
    fn unit_mismatch_is_an_error_that_points_at_the_symbol() {
        let e = parse_quantity("38.5mA", Voltage).unwrap_err();
        assert_eq!(e.offset, 5);
        assert_eq!(e.len, 1);
        assert!(matches!(
            e.problem,
            UnitProblem::WrongUnit {
                expected: Voltage,
                found: Current,
                ..
            }
        ));
        assert!(e.to_string().contains("a current"), "{e}");

        let e = parse_quantity("22µF", Resistance).unwrap_err();
        assert!(matches!(
            e.problem,
            UnitProblem::WrongUnit {
                found: Capacitance,
                ..
            }
        ));
        let e = parse_quantity("470R", Voltage).unwrap_err();
        assert!(matches!(
            e.problem,
            UnitProblem::WrongUnit {
                found: Resistance,
                ..
            }
        ));
        let e = parse_quantity("4R7", Voltage).unwrap_err();
        assert!(matches!(e.problem, UnitProblem::RkmOhmsOnly { .. }));
        let e = parse_quantity("5k%", Percent).unwrap_err();
        assert!(matches!(e.problem, UnitProblem::PrefixNotAllowed { .. }));
    }

    #[test]
    fn rubbish_is_not_a_number() {
        for bad in [
            "", "  ", "abc", "4k7k", "k", "R", "1..2", "4 k 7", "--3", "1e", "nan", "inf", "4x7",
            "µ",
        ] {
            assert!(
                parse_quantity(bad, Resistance).is_err(),
                "{bad:?} should be rejected"
            );
        }
        assert!(parse_quantity("1e400", Voltage).is_err());
    }

    /// The plain reading's shortcut gives what the steps give, to the bit
    /// and error for error, over texts built from the pieces readings are
    /// made of (digits, dots, signs, exponents, spaces, prefixes, RKM
    /// letters, every kind's symbols and stray characters) and random ones.
    #[test]
    fn plain_readings_are_read_as_the_steps_read_them() {
        // No symbol of any kind is longer and ends with one the shortcut
        // takes: it would win as the longest symbol.
        for short in ["V", "A", "W", "F", "H", "%"] {
            for kind in QuantityKind::ALL {
                for sym in kind.symbols() {
                    assert!(
                        *sym == short || !sym.ends_with(short),
                        "{sym} ends with {short}"
                    );
                }
            }
        }
        let same = |text: &str| {
            for kind in QuantityKind::ALL {
                let fast = parse_quantity(text, kind);
                let slow = parse_quantity_steps(text, kind);
                match (&fast, &slow) {
                    (Ok(a), Ok(b)) => assert_eq!(a.to_bits(), b.to_bits(), "{text:?} {kind:?}"),
                    _ => assert_eq!(fast, slow, "{text:?} {kind:?}"),
                }
            }
        };
        let numbers = [
            "",
            "0",
            "7",
            "38",
            "465.5",
            "0.001",
            ".5",
            "5.",
            "1.2.3",
            "007",
            "-3",
            "+4.5",
            "1e3",
            "2.5E-2",
            "1e400",
            "12345678901234567890.123456789",
            &"9".repeat(320),
        ];
        let tails = [
            "", "V", "A", "W", "F", "H", "%", "Hz", "R", "\u{3a9}", "ohm", "Vdc", "VAC", "k", "m",
            "u", "\u{b5}", "kV", "mA", " V", "V ", "x", "VV", "AV", "z", "7", "k7", ".",
        ];
        for n in numbers {
            for t in tails {
                same(&format!("{n}{t}"));
                same(&format!(" {n}{t}"));
                same(&format!("{t}{n}"));
            }
        }
        // Random texts over the characters readings use.
        let alphabet: Vec<char> = "0123456789.VAWFH%zRkmuµ e+-Ω ".chars().collect();
        let mut state = 0x2545_f491_4f6c_dd1du64;
        for _ in 0..30_000 {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            let len = (state % 9) as usize;
            let mut text = String::new();
            let mut bits = state;
            for _ in 0..len {
                bits = bits.rotate_left(7) ^ 0x9e37_79b9_7f4a_7c15;
                text.push(alphabet[(bits % alphabet.len() as u64) as usize]);
            }
            same(&text);
        }
    }
}
