//! Printing quantities with engineering prefixes and sensible significant
//! figures: 12.4 W, 34.2 mA, 4.7 kΩ, 0.022 µF.

use super::kind::QuantityKind;

/// Powers of ten from 10^-30 to 10^30, the edges of [`decade`]'s table.
const DECADES: [f64; 61] = {
    let mut p = [0.0; 61];
    let mut i: usize = 0;
    while i < 61 {
        // About 10^(i - 30): only edges, each given a margin in `decade`,
        // so the last bit does not matter.
        let mut v = 1.0;
        let mut k = 0;
        let e = i.abs_diff(30);
        while k < e {
            v *= 10.0;
            k += 1;
        }
        p[i] = if i >= 30 { v } else { 1.0 / v };
        i += 1;
    }
    p
};

/// `value.abs().log10().floor() as i32`, the same number, without the
/// logarithm for a value of 10^-30 to 10^30 that is not within a
/// millionth of a percent of a power of ten: those are found between two
/// edges of a table (a figure's decade was worked out three or four
/// times for every figure printed, a twentieth of deriving a long job).
/// Near a power of ten, where the logarithm's rounding decides, and
/// outside the table, the logarithm is taken as before.
fn decade(value: f64) -> i32 {
    let a = value.abs();
    if (DECADES[0]..DECADES[60]).contains(&a) {
        // The edges at or below `a`: at least one. The binary exponent
        // gives the edge to a place or two (floor(e2 · log10 2), exact for
        // |e2| < 1,000), then the table decides, as a search of it would.
        let e2 = ((a.to_bits() >> 52) & 0x7ff) as i32 - 1023;
        let mut k = (((e2 * 78_913) >> 18) + 30).clamp(0, 60) as usize;
        while k > 0 && DECADES[k] > a {
            k -= 1;
        }
        while k + 1 < DECADES.len() && DECADES[k + 1] <= a {
            k += 1;
        }
        const MARGIN: f64 = 1e-8;
        let clear_below = a > DECADES[k] * (1.0 + MARGIN);
        let clear_above = k + 1 < DECADES.len() && a < DECADES[k + 1] * (1.0 - MARGIN);
        if clear_below && clear_above {
            return k as i32 - 30;
        }
    }
    value.abs().log10().floor() as i32
}

/// `10f64.powi(n)` for n from -22 to 22, the same numbers: 10^0 … 10^22
/// are exact in an f64 and `powi` multiplies only exact powers on the way
/// to them, and for a negative n it divides one by the exact power, which
/// rounds as the literal does (held to `powi` by a test).
const POWERS: [f64; 45] = [
    1e-22, 1e-21, 1e-20, 1e-19, 1e-18, 1e-17, 1e-16, 1e-15, 1e-14, 1e-13, 1e-12, 1e-11, 1e-10,
    1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 1e-1, 1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7,
    1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// `10f64.powi(n)`, from [`POWERS`] where it holds n (a figure's scale is
/// worked out three or four times for every figure printed).
fn pow10(n: i32) -> f64 {
    if (-22..=22).contains(&n) {
        POWERS[(n + 22) as usize]
    } else {
        10f64.powi(n)
    }
}

/// Rounds to `sig` significant figures.
pub fn round_sig(value: f64, sig: i32) -> f64 {
    if value == 0.0 || !value.is_finite() {
        return value;
    }
    let magnitude = decade(value);
    let factor = pow10(sig - 1 - magnitude);
    let rounded = (value * factor).round() / factor;
    if rounded.is_finite() && factor.is_finite() && factor > 0.0 {
        rounded
    } else {
        // Near the ends of the f64 range the scale factor overflows or
        // underflows: round through the decimal text instead.
        let sig = sig.clamp(1, 17) as usize;
        format!("{value:.prec$e}", prec = sig - 1)
            .parse::<f64>()
            .ok()
            .filter(|r| r.is_finite())
            .unwrap_or(value)
    }
}

/// Formats a plain number to `sig` significant figures without trailing
/// zeros: 12.43 → "12.4", 4.70 → "4.7", 352.4 → "352".
pub fn format_sig(value: f64, sig: i32) -> String {
    let mut out = String::with_capacity(12);
    write_sig(&mut out, value, sig);
    out
}

/// [`format_sig`] appended to `out`, without a string of its own (figures
/// are printed by the hundred thousand in a long job).
fn write_sig(out: &mut String, value: f64, sig: i32) {
    if let Some((n, magnitude)) = sig_digits(value, sig)
        && (-8..=14).contains(&magnitude)
    {
        push_sig_digits(out, value < 0.0, n, sig, magnitude);
        return;
    }
    write_sig_steps(out, value, sig);
}

/// [`write_sig`] one step after another: round, find the decade of the
/// rounded value, write its digits, trim.
fn write_sig_steps(out: &mut String, value: f64, sig: i32) {
    if !value.is_finite() {
        out.push('–');
        return;
    }
    let rounded = round_sig(value, sig);
    if rounded == 0.0 {
        out.push('0');
        return;
    }
    let magnitude = decade(rounded);
    if !(-12..=15).contains(&magnitude) {
        // Far outside any reading: scientific notation keeps it short.
        use std::fmt::Write as _;
        let sig = sig.clamp(1, 17) as usize;
        let _ = write!(out, "{rounded:.prec$e}", prec = sig - 1);
        return;
    }
    let decimals = (sig - 1 - magnitude).max(0) as usize;
    let start = out.len();
    write_short_fixed(out, rounded, decimals);
    // Trailing zeros of the decimals go, then a bare point.
    if out[start..].contains('.') {
        let kept = out.trim_end_matches('0').trim_end_matches('.').len();
        out.truncate(kept.max(start));
    }
}

/// `value` with `decimals` decimals, for a value that already has no more
/// significant figures than it shows: the same text as
/// `format!("{value:.decimals$}")`, built from an integer's digits, which
/// avoids the slow exact path of float formatting (most of the time the
/// calculation pass spends writing its reasons). Large or tiny values take
/// `format!`. Appended to `out`.
fn write_short_fixed(out: &mut String, value: f64, decimals: usize) {
    let scaled = (value.abs() * pow10(decimals as i32)).round();
    if decimals > 15 || !scaled.is_finite() || scaled >= 1e15 {
        use std::fmt::Write as _;
        let _ = write!(out, "{value:.decimals$}");
        return;
    }
    if value < 0.0 && scaled > 0.0 {
        out.push('-');
    }
    // At most 15 digits.
    push_scaled(out, scaled as u64, decimals);
}

/// `n` ÷ 10^`decimals` written with exactly `decimals` decimals (`n` = 1234,
/// 2 decimals: "12.34"; `n` = 5, 2 decimals: "0.05"), for `decimals` ≤ 15
/// and `n` of at most 16 digits. Appended to `out`. The digits come from
/// `itoa` and go in as at most three pieces: pushing them one character
/// at a time cost a 1,000-set render some 12 M instructions more
/// (docs/performance.md).
fn push_scaled(out: &mut String, n: u64, decimals: usize) {
    let mut buffer = itoa::Buffer::new();
    let digits = buffer.format(n);
    if decimals == 0 {
        out.push_str(digits);
        return;
    }
    out.reserve(digits.len().max(decimals + 1) + 1);
    match digits.len().checked_sub(decimals) {
        Some(whole) if whole > 0 => {
            out.push_str(&digits[..whole]);
            out.push('.');
            out.push_str(&digits[whole..]);
        }
        // Fewer digits than decimals (or as many): "0." and zeros first.
        _ => {
            out.push_str("0.");
            for _ in digits.len()..decimals {
                out.push('0');
            }
            out.push_str(digits);
        }
    }
}

/// `format!("{value:.decimals$}")` (with `plus`, `format!("{value:+.decimals$}")`),
/// the same text, appended to `out`. The calculation pass writes every
/// percentage and figure of its reasons this way, some hundred per set:
/// Rust's float formatting takes the exact (big-number) path for a fixed
/// number of decimals, which was a fifth of deriving a long job.
///
/// The value times 10^decimals is worked out in floating point; below 10^9
/// that product is within 1.2 × 10^-7 of the exact one, so unless its
/// fraction lies within 10^-6 of one half the rounding goes the way the
/// exact decimal value's does, and the digits are an integer's. Values
/// near a tie, large, not finite or with more than six decimals take
/// `format!` as before. The sign is printed for every negative value,
/// -0.0 and those that round to zero included, as `format!` does.
pub fn write_fixed(out: &mut String, value: f64, decimals: usize, plus: bool) {
    if let Some((negative, n)) = fixed_digits(value, decimals) {
        if negative {
            out.push('-');
        } else if plus {
            out.push('+');
        }
        // At most 10 digits.
        push_scaled(out, n, decimals);
        return;
    }
    use std::fmt::Write as _;
    let _ = if plus {
        write!(out, "{value:+.decimals$}")
    } else {
        write!(out, "{value:.decimals$}")
    };
}

/// What [`write_fixed`] writes of `value` with `decimals` decimals, where
/// it writes an integer's digits: whether a minus comes first, and the
/// integer `n` (`value` × 10^`decimals`, rounded), written with `decimals`
/// decimals. `None` where it takes `format!`'s path instead (a value near
/// a tie, large, not finite, or more than six decimals). Two values with
/// the same answer are written the same, so words made from one are the
/// other's too.
pub fn fixed_digits(value: f64, decimals: usize) -> Option<(bool, u64)> {
    const SCALE: [f64; 7] = [1.0, 10.0, 100.0, 1e3, 1e4, 1e5, 1e6];
    let scale = SCALE.get(decimals)?;
    if !value.is_finite() {
        return None;
    }
    let scaled = value.abs() * scale;
    let whole = scaled.floor();
    let fraction = scaled - whole;
    if scaled < 1e9 && (fraction - 0.5).abs() > 1e-6 {
        Some((
            value.is_sign_negative(),
            whole as u64 + u64::from(fraction > 0.5),
        ))
    } else {
        None
    }
}

/// [`write_fixed`] as a string of its own: `format!("{value:.decimals$}")`.
pub fn fixed(value: f64, decimals: usize) -> String {
    let mut out = String::with_capacity(12);
    write_fixed(&mut out, value, decimals, false);
    out
}

/// [`write_fixed`] with the sign always shown: `format!("{value:+.decimals$}")`.
pub fn fixed_signed(value: f64, decimals: usize) -> String {
    let mut out = String::with_capacity(12);
    write_fixed(&mut out, value, decimals, true);
    out
}

/// [`fixed`] followed by `unit`: `format!("{value:.decimals$}{unit}")`.
pub fn fixed_with(value: f64, decimals: usize, unit: &str) -> String {
    let mut out = String::with_capacity(12 + unit.len());
    write_fixed(&mut out, value, decimals, false);
    out.push_str(unit);
    out
}

/// [`write_short_fixed`] as a string of its own.
#[cfg(test)]
fn short_fixed(value: f64, decimals: usize) -> String {
    let mut out = String::new();
    write_short_fixed(&mut out, value, decimals);
    out
}

/// Formats with a fixed number of decimals: (12.43, 1) → "12.4".
pub fn format_fixed(value: f64, decimals: usize) -> String {
    if !value.is_finite() {
        return "–".to_string();
    }
    // `format!("{value:.decimals$}")`, without its exact float path.
    let s = fixed(value, decimals);
    // Avoid "-0.0".
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        s.trim_start_matches('-').to_string()
    } else {
        s
    }
}

/// The figure of `value` to `sig` significant figures as a whole number
/// `n` of exactly `sig` digits and the decade of its first digit (`value`
/// ≈ ± n × 10^(decade − sig + 1)), for the common case where
/// [`write_sig`]'s and [`format_engineering_sig`]'s steps (rounding, then
/// scaling to the prefix and rounding again, then the digits of the
/// scaled value) are bound to come back to those digits: `n` is the same
/// integer [`round_sig`] rounds to, it is not a power of ten (so neither
/// the rounded value nor its scaled form lies within 10^-8 of an edge of
/// [`decade`]'s table), and the decade leaves every power of ten used on
/// the way exact or correctly rounded, so each later step is within a few
/// units in the last place of `n`, far from a half. Anything else is
/// `None`, and the figure takes the steps one by one as before (held to
/// them by `fast_figures_are_what_the_steps_give`).
fn sig_digits(value: f64, sig: i32) -> Option<(u64, i32)> {
    if !(1..=6).contains(&sig) || value == 0.0 || !value.is_finite() {
        return None;
    }
    let magnitude = decade(value);
    if !(-20..=20).contains(&magnitude) {
        return None;
    }
    let n = (value.abs() * pow10(sig - 1 - magnitude)).round();
    if n > pow10(sig - 1) && n < pow10(sig) {
        Some((n as u64, magnitude))
    } else {
        None
    }
}

/// Writes `n` (of `sig` digits, from [`sig_digits`]) times ten to the
/// power `decade` − `sig` + 1, with a minus for `negative`, as
/// [`write_sig`] writes it: all its digits, no trailing zeros after the
/// point, no bare point. `decade` is from −8 to 14.
fn push_sig_digits(out: &mut String, negative: bool, n: u64, sig: i32, decade: i32) {
    if negative {
        out.push('-');
    }
    let decimals = sig - 1 - decade;
    if decimals > 0 {
        let start = out.len();
        push_scaled(out, n, decimals as usize);
        // There is a point: its trailing zeros go, then a bare point.
        let kept = out.trim_end_matches('0').trim_end_matches('.').len();
        out.truncate(kept.max(start));
    } else {
        // At most 6 + 14 digits would not fit; `decade` ≤ 14 and n < 10^6
        // give n × 10^(decade − sig + 1) < 10^15.
        push_scaled(out, n * 10u64.pow((-decimals) as u32), 0);
    }
}

const PREFIXES: [(i32, &str); 9] = [
    (-12, "p"),
    (-9, "n"),
    (-6, "µ"),
    (-3, "m"),
    (0, ""),
    (3, "k"),
    (6, "M"),
    (9, "G"),
    (12, "T"),
];

/// Formats a value in its base SI unit with an engineering prefix, three
/// significant figures and the unit symbol, e.g. `0.0342, Current` →
/// "34.2 mA". Capacitance follows the bench habit of microfarads from 1 nF
/// up ("0.022 µF", "220 µF") and picofarads below.
pub fn format_engineering(value: f64, kind: QuantityKind) -> String {
    format_engineering_sig(value, kind, 3)
}

/// As [`format_engineering`] with a chosen number of significant figures.
pub fn format_engineering_sig(value: f64, kind: QuantityKind, sig: i32) -> String {
    let symbol = kind.symbol();
    if !value.is_finite() {
        return format!("– {symbol}");
    }
    if kind == QuantityKind::Percent {
        let mut out = String::with_capacity(12);
        write_sig(&mut out, value, sig);
        out.push_str(" %");
        return out;
    }
    if let Some((n, magnitude)) = sig_digits(value, sig) {
        // The prefix as the steps below choose it: the rounded value's
        // decade is `magnitude` (n is not a power of ten).
        let exp = if kind == QuantityKind::Capacitance {
            Some(if magnitude >= -9 { -6 } else { -12 })
        } else {
            (-12..=14)
                .contains(&magnitude)
                .then(|| magnitude.div_euclid(3) * 3)
        };
        if let Some(exp) = exp
            && (-8..=14).contains(&(magnitude - exp))
            && let Some((_, prefix)) = PREFIXES.iter().find(|(e, _)| *e == exp)
        {
            let mut out = String::with_capacity(16);
            push_sig_digits(&mut out, value < 0.0, n, sig, magnitude - exp);
            out.push(' ');
            out.push_str(prefix);
            out.push_str(symbol);
            return out;
        }
    }
    let rounded = round_sig(value, sig);
    if rounded == 0.0 {
        return format!("0 {symbol}");
    }
    let exp = if kind == QuantityKind::Capacitance {
        if rounded.abs() >= 1e-9 { -6 } else { -12 }
    } else {
        let magnitude = decade(rounded);
        (magnitude.div_euclid(3) * 3).clamp(-12, 12)
    };
    let prefix = PREFIXES
        .iter()
        .find(|(e, _)| *e == exp)
        .map(|(_, p)| *p)
        .unwrap_or("");
    let scaled = rounded / pow10(exp);
    let mut out = String::with_capacity(16);
    write_sig(&mut out, scaled, sig);
    out.push(' ');
    out.push_str(prefix);
    out.push_str(symbol);
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use QuantityKind::*;

    #[test]
    fn engineering_prefixes_and_significant_figures() {
        assert_eq!(format_engineering(12.43, Power), "12.4 W");
        assert_eq!(format_engineering(0.03421, Current), "34.2 mA");
        assert_eq!(format_engineering(4700.0, Resistance), "4.7 kΩ");
        assert_eq!(format_engineering(0.022e-6, Capacitance), "0.022 µF");
        assert_eq!(format_engineering(0.0047e-6, Capacitance), "0.0047 µF");
        assert_eq!(format_engineering(220e-6, Capacitance), "220 µF");
        assert_eq!(format_engineering(680e-12, Capacitance), "680 pF");
        assert_eq!(format_engineering(352.4, Voltage), "352 V");
        assert_eq!(format_engineering(0.0385, Voltage), "38.5 mV");
        assert_eq!(format_engineering(999.7, Voltage), "1 kV");
        assert_eq!(format_engineering(2.2e6, Resistance), "2.2 MΩ");
        assert_eq!(format_engineering(1.0, Resistance), "1 Ω");
        assert_eq!(format_engineering(0.0, Voltage), "0 V");
        assert_eq!(format_engineering(-52.0, Voltage), "-52 V");
        assert_eq!(format_engineering(85.27, Percent), "85.3 %");
    }

    #[test]
    fn powers_of_ten_are_what_powi_gives() {
        for n in -400..=400 {
            assert_eq!(pow10(n).to_bits(), 10f64.powi(n).to_bits(), "10^{n}");
        }
        assert_eq!(pow10(i32::MIN).to_bits(), 10f64.powi(i32::MIN).to_bits());
        assert_eq!(pow10(i32::MAX).to_bits(), 10f64.powi(i32::MAX).to_bits());
    }

    #[test]
    fn decade_is_the_floor_of_the_logarithm() {
        let reference = |v: f64| v.abs().log10().floor() as i32;
        let mut x: u64 = 0x2545_f491_4f6c_dd1d;
        let check = |v: f64| {
            assert_eq!(decade(v), reference(v), "{v:e}");
            assert_eq!(decade(v.next_up()), reference(v.next_up()), "{v:e} up");
            assert_eq!(
                decade(v.next_down()),
                reference(v.next_down()),
                "{v:e} down"
            );
        };
        // Every power of ten the table holds and beyond it, both signs,
        // with their neighbours and values a hair either side.
        for e in -40..=40 {
            let p = 10f64.powi(e);
            for v in [
                p,
                p * (1.0 + 1e-8),
                p * (1.0 - 1e-8),
                p * (1.0 + 1e-12),
                p * (1.0 - 1e-12),
            ] {
                check(v);
                check(-v);
            }
            let literal: f64 = format!("1e{e}").parse().unwrap_or(p);
            check(literal);
        }
        for v in [
            0.0,
            -0.0,
            f64::MIN_POSITIVE,
            f64::MAX,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::NAN,
        ] {
            assert_eq!(decade(v), reference(v), "{v:e}");
        }
        for i in 0..300_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let v = match i % 3 {
                // Readings over many decades, both signs.
                0 => {
                    let mantissa = (x % 1_000_000) as f64 / 100_000.0 + 1.0;
                    let exp = ((x >> 20) % 71) as i32 - 35;
                    let sign = if x & (1 << 60) == 0 { 1.0 } else { -1.0 };
                    sign * mantissa * 10f64.powi(exp)
                }
                // Rounded figures, as the formatters pass them.
                1 => round_sig(
                    ((x % 2_000_001) as f64 - 1e6) / 997.0,
                    ((x >> 40) % 7) as i32 + 1,
                ),
                // Any bit pattern.
                _ => f64::from_bits(x),
            };
            check(v);
        }
    }

    #[test]
    fn short_fixed_writes_what_format_writes() {
        // Values as format_sig hands them over: rounded to 1…6 significant
        // figures, over many decades and both signs.
        let mut x: u64 = 0x2545_f491_4f6c_dd1d;
        for _ in 0..200_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let mantissa = (x % 1_000_000) as f64 / 100_000.0 + 1.0;
            let exp = ((x >> 20) % 31) as i32 - 15;
            let sign = if x & (1 << 60) == 0 { 1.0 } else { -1.0 };
            let sig = ((x >> 40) % 6) as i32 + 1;
            let rounded = round_sig(sign * mantissa * 10f64.powi(exp), sig);
            let magnitude = rounded.abs().log10().floor() as i32;
            let decimals = (sig - 1 - magnitude).max(0) as usize;
            assert_eq!(
                short_fixed(rounded, decimals),
                format!("{rounded:.decimals$}"),
                "{rounded} at {decimals} decimals"
            );
        }
        assert_eq!(short_fixed(0.0385, 4), "0.0385");
        assert_eq!(short_fixed(-52.0, 0), "-52");
        assert_eq!(short_fixed(1e300, 0), format!("{:.0}", 1e300));
    }

    #[test]
    fn every_finite_number_prints_short_and_finite() {
        for v in [
            5e-324,
            -1e-320,
            1e-300,
            2.5e-13,
            9.99e15,
            1e308,
            f64::MAX,
            f64::MIN,
            f64::MIN_POSITIVE,
        ] {
            for sig in 1..=6 {
                let text = format_sig(v, sig);
                assert!(
                    !text.contains("NaN") && !text.contains("inf") && text.len() < 30,
                    "{v} to {sig}: {text}"
                );
                assert!(round_sig(v, sig).is_finite(), "{v} to {sig}");
            }
            let text = format_engineering(v, QuantityKind::Resistance);
            assert!(!text.contains("NaN") && text.len() < 40, "{v}: {text}");
        }
        assert_eq!(format_sig(1e-320, 3), "1.00e-320");
        assert_eq!(format_sig(1.234e300, 3), "1.23e300");
    }

    /// [`push_scaled`] as it was first written: every digit pushed, zero
    /// padded to `decimals` + 1 digits.
    fn push_scaled_by_digits(n: u64, decimals: usize) -> String {
        let digits = format!("{n:0width$}", width = decimals + 1);
        let (whole, fraction) = digits.split_at(digits.len() - decimals);
        if decimals == 0 {
            whole.to_string()
        } else {
            format!("{whole}.{fraction}")
        }
    }

    #[test]
    fn scaled_integers_are_written_as_digit_by_digit() {
        let mut x: u64 = 0x51_7cc1_b727_220a;
        let mut cases: Vec<u64> = vec![
            0,
            1,
            9,
            10,
            99,
            100,
            101,
            999_999,
            10u64.pow(15),
            9_999_999_999_999_999,
        ];
        for _ in 0..100_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            // Any number of digits up to 16.
            cases.push(x % 10u64.pow(((x >> 58) % 17) as u32));
        }
        for n in cases {
            for decimals in 0..=15 {
                let mut out = String::from("x");
                push_scaled(&mut out, n, decimals);
                assert_eq!(
                    out[1..],
                    push_scaled_by_digits(n, decimals),
                    "{n} at {decimals}"
                );
            }
        }
    }

    #[test]
    fn fixed_writes_what_format_writes() {
        // Random readings over many decades, both signs, values on and
        // next to the ties of each number of decimals, and the edges.
        let mut x: u64 = 0x9e37_79b9_7f4a_7c15;
        let mut values = vec![
            0.0,
            -0.0,
            0.5,
            1.5,
            2.5,
            -0.5,
            0.25,
            0.35,
            0.125,
            -0.04,
            0.05,
            0.15,
            1e9,
            999_999_999.5,
            1e-7,
            5e-324,
            1e300,
            f64::MAX,
            f64::MIN,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ];
        for _ in 0..30_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let sign = if x & (1 << 63) == 0 { 1.0 } else { -1.0 };
            let v = match x % 4 {
                // A reading with up to 6 decimals, often exactly on a tie.
                0 => sign * ((x >> 8) % 100_000_000) as f64 / 10f64.powi(((x >> 40) % 7) as i32),
                // Halves at each number of decimals.
                1 => {
                    sign * (((x >> 8) % 2_000_000) as f64 + 0.5)
                        / 10f64.powi(((x >> 40) % 7) as i32)
                }
                // Arbitrary magnitudes.
                2 => {
                    sign * ((x >> 11) as f64 / (1u64 << 53) as f64)
                        * 10f64.powi(((x >> 2) % 24) as i32 - 12)
                }
                // Any bit pattern.
                _ => f64::from_bits(x),
            };
            values.push(v);
            values.push(v.next_up());
            values.push(v.next_down());
        }
        for v in values {
            for d in 0..=7 {
                assert_eq!(fixed(v, d), format!("{v:.d$}"), "{v:e} at {d}");
                assert_eq!(
                    fixed_signed(v, d),
                    format!("{v:+.d$}"),
                    "{v:e} at {d}, signed"
                );
            }
            assert_eq!(fixed_with(v, 1, " %"), format!("{v:.1} %"));
        }
    }

    #[test]
    fn plain_numbers() {
        assert_eq!(format_sig(12.43, 3), "12.4");
        assert_eq!(format_sig(0.000123456, 3), "0.000123");
        assert_eq!(format_sig(123456.0, 3), "123000");
        assert_eq!(format_fixed(12.449, 1), "12.4");
        assert_eq!(format_fixed(-0.01, 1), "0.0");
    }

    /// `format_sig` and `format_engineering_sig` as they were written
    /// before they wrote into one string: `format!` for each piece.
    mod before {
        use super::super::{PREFIXES, QuantityKind, round_sig};

        fn short_fixed(value: f64, decimals: usize) -> String {
            let scaled = (value.abs() * 10f64.powi(decimals as i32)).round();
            if decimals > 15 || !scaled.is_finite() || scaled >= 1e15 {
                return format!("{value:.decimals$}");
            }
            let digits = format!("{:0>width$}", scaled as u64, width = decimals + 1);
            let (whole, fraction) = digits.split_at(digits.len() - decimals);
            let sign = if value < 0.0 && scaled > 0.0 { "-" } else { "" };
            if decimals == 0 {
                format!("{sign}{whole}")
            } else {
                format!("{sign}{whole}.{fraction}")
            }
        }

        fn trim_zeros(s: String) -> String {
            if s.contains('.') {
                s.trim_end_matches('0').trim_end_matches('.').to_string()
            } else {
                s
            }
        }

        pub fn format_sig(value: f64, sig: i32) -> String {
            if !value.is_finite() {
                return "–".to_string();
            }
            let rounded = round_sig(value, sig);
            if rounded == 0.0 {
                return "0".to_string();
            }
            let magnitude = rounded.abs().log10().floor() as i32;
            if !(-12..=15).contains(&magnitude) {
                let sig = sig.clamp(1, 17) as usize;
                return format!("{rounded:.prec$e}", prec = sig - 1);
            }
            let decimals = (sig - 1 - magnitude).max(0) as usize;
            trim_zeros(short_fixed(rounded, decimals))
        }

        pub fn format_engineering_sig(value: f64, kind: QuantityKind, sig: i32) -> String {
            let symbol = kind.symbol();
            if !value.is_finite() {
                return format!("– {symbol}");
            }
            if kind == QuantityKind::Percent {
                return format!("{} %", format_sig(value, sig));
            }
            let rounded = round_sig(value, sig);
            if rounded == 0.0 {
                return format!("0 {symbol}");
            }
            let exp = if kind == QuantityKind::Capacitance {
                if rounded.abs() >= 1e-9 { -6 } else { -12 }
            } else {
                let magnitude = rounded.abs().log10().floor() as i32;
                (magnitude.div_euclid(3) * 3).clamp(-12, 12)
            };
            let prefix = PREFIXES
                .iter()
                .find(|(e, _)| *e == exp)
                .map(|(_, p)| *p)
                .unwrap_or("");
            let scaled = rounded / 10f64.powi(exp);
            format!("{} {prefix}{symbol}", format_sig(scaled, sig))
        }
    }

    #[test]
    fn fast_figures_are_what_the_steps_give() {
        let kinds = [Voltage, Current, Resistance, Power, Capacitance, Percent];
        let check = |v: f64| {
            for sig in 1..=7 {
                assert_eq!(
                    format_sig(v, sig),
                    before::format_sig(v, sig),
                    "{v:e} to {sig}"
                );
                let mut steps = String::new();
                write_sig_steps(&mut steps, v, sig);
                assert_eq!(format_sig(v, sig), steps, "{v:e} to {sig}, steps");
                for kind in kinds {
                    assert_eq!(
                        format_engineering_sig(v, kind, sig),
                        before::format_engineering_sig(v, kind, sig),
                        "{v:e} {kind:?} to {sig}"
                    );
                }
            }
        };
        // Around every edge the fast path must leave to the steps: powers
        // of ten, the halves that round up to one (9.995, 99.95 …), ties
        // of each number of figures, the prefixes' steps and the
        // capacitance's switch at 1 nF; with their neighbours.
        for e in -26..=26 {
            let p = 10f64.powi(e);
            for sig in 0..=7 {
                let unit = 10f64.powi(-sig);
                for m in [
                    1.0,
                    1.0 + unit,
                    1.0 - unit,
                    1.0 + unit / 2.0,
                    1.0 - unit / 2.0,
                    1.0 + unit * 1.5,
                    10.0 - unit * 5.0,
                    10.0 - unit * 4.999,
                    10.0 - unit * 5.001,
                    1.25,
                    2.5,
                    4.75,
                    9.5,
                ] {
                    for v in [m * p, -(m * p)] {
                        check(v);
                        check(v.next_up());
                        check(v.next_down());
                    }
                }
            }
        }
        // Readings over many decades, to many figures, both signs.
        let mut x: u64 = 0x2545_f491_4f6c_dd1d;
        for i in 0..60_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let sign = if x & (1 << 60) == 0 { 1.0 } else { -1.0 };
            let v = match i % 3 {
                0 => {
                    let mantissa = (x % 10_000_000) as f64 / 1_000_000.0 + 1.0;
                    sign * mantissa * 10f64.powi(((x >> 24) % 53) as i32 - 26)
                }
                // Halves of a figure of 1 to 7 digits: ties.
                1 => {
                    let digits = ((x >> 24) % 7) as i32 + 1;
                    let n = (x >> 32) % 10u64.pow(digits as u32);
                    sign * (n as f64 + 0.5) * 10f64.powi(((x >> 8) % 41) as i32 - 20 - digits)
                }
                _ => f64::from_bits(x),
            };
            check(v);
        }
    }

    #[test]
    fn figures_written_into_one_string_are_what_they_were() {
        let mut x: u64 = 0x9e37_79b9_7f4a_7c15;
        let kinds = [Voltage, Current, Resistance, Power, Capacitance, Percent];
        for i in 0..200_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let value = match i % 4 {
                // Readings over many decades, both signs.
                0 | 1 => {
                    let mantissa = (x % 1_000_000) as f64 / 100_000.0 + 1.0;
                    let exp = ((x >> 20) % 41) as i32 - 20;
                    let sign = if x & (1 << 60) == 0 { 1.0 } else { -1.0 };
                    sign * mantissa * 10f64.powi(exp)
                }
                // Whole numbers and halves, where rounding ties.
                2 => ((x % 20_001) as f64 - 10_000.0) / 2.0,
                // Any bit pattern: tiny, huge, infinite, not a number.
                _ => f64::from_bits(x),
            };
            let sig = ((x >> 40) % 7) as i32 + 1;
            assert_eq!(
                format_sig(value, sig),
                before::format_sig(value, sig),
                "{value:e} to {sig}"
            );
            let kind = kinds[(x >> 50) as usize % kinds.len()];
            assert_eq!(
                format_engineering_sig(value, kind, sig),
                before::format_engineering_sig(value, kind, sig),
                "{value:e} {kind:?} to {sig}"
            );
        }
    }
}
