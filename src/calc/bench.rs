//! Performance on the bench: output power into a dummy load, hum and noise,
//! frequency response with its −3 dB points, and gain. Formulas from the
//! domain notes ("Proving the amplifier on the bench"): P = V²rms / R,
//! Vrms = Vpp / (2√2) for a sine, dBV = 20·log10(V / 1 V), dB relative =
//! 20·log10(V / Vref).

use super::findings::{
    BenchFindings, GainFindings, HumNoiseFindings, OutputPowerFindings, ResponseFindings,
    ResponsePointFindings,
};
use super::status::{Status, Verdict};
use crate::catalogue::{Arg, Catalogue};
use crate::job::{
    AcReading, GainReading, HumNoiseReading, InputState, Job, MeasurementSet, OutputPowerReading,
    PowerCondition, ResponseReading, Settings,
};
use crate::units::{Hertz, Ohms, QuantityKind as Q, Volts, Watts, format_engineering};
use crate::units::{fixed, fixed_with};

/// RMS volts of a sine read peak to peak: Vrms = Vpp / (2√2).
pub fn rms_from_peak_to_peak(vpp: Volts) -> Volts {
    Volts(vpp.0 / (2.0 * std::f64::consts::SQRT_2))
}

/// Power of an RMS voltage across a load: P = V²rms / R.
pub fn power_into(vrms: Volts, load: Ohms) -> Watts {
    vrms.power_in(load)
}

/// The RMS voltage a power makes across a load: V = √(P·R).
pub fn volts_for_power(p: Watts, load: Ohms) -> Volts {
    Volts((p.0 * load.0).sqrt())
}

/// A level against 1 V: dBV = 20·log10(V / 1 V).
pub fn dbv(v: Volts) -> f64 {
    20.0 * v.0.log10()
}

/// One voltage against another in decibels: 20·log10(V / Vref).
pub fn db_relative(v: Volts, reference: Volts) -> f64 {
    20.0 * (v / reference).log10()
}

/// The frequencies where a response crosses −3 dB, below and above the
/// reference, interpolated linearly in dB on a logarithmic frequency axis
/// between the two readings that bracket the crossing. `points` are
/// (frequency, dB relative to the reference) in any order. Going outwards
/// from the reference, the first reading at or below −3 dB and the reading
/// before it give the crossing; `None` on a side where no reading falls to
/// −3 dB (the response stays within 3 dB as far as it was read).
pub fn minus_3db_points(
    points: &[(Hertz, f64)],
    reference: Hertz,
) -> (Option<Hertz>, Option<Hertz>) {
    let mut sorted: Vec<(Hertz, f64)> = points
        .iter()
        .copied()
        .filter(|(f, d)| f.0 > 0.0 && d.is_finite())
        .collect();
    sorted.sort_by(|a, b| a.0.0.total_cmp(&b.0.0));
    let below: Vec<(Hertz, f64)> = sorted
        .iter()
        .rev()
        .copied()
        .filter(|(f, _)| f.0 <= reference.0)
        .collect();
    let above: Vec<(Hertz, f64)> = sorted
        .iter()
        .copied()
        .filter(|(f, _)| f.0 >= reference.0)
        .collect();
    (crossing(&below), crossing(&above))
}

/// The first −3 dB crossing along `outward` (readings ordered away from
/// the reference).
fn crossing(outward: &[(Hertz, f64)]) -> Option<Hertz> {
    const LEVEL: f64 = -3.0;
    let i = outward.iter().position(|(_, d)| *d <= LEVEL)?;
    if i == 0 {
        // The reference itself is at 0 dB, so this only happens when the
        // reference is missing from the readings: no bracket.
        return None;
    }
    let (f1, d1) = outward[i - 1];
    let (f2, d2) = outward[i];
    let t = (LEVEL - d1) / (d2 - d1);
    let log_f = f1.0.log10() + t * (f2.0.log10() - f1.0.log10());
    Some(Hertz(10f64.powf(log_f)))
}

/// Gain in decibels: 20·log10(Vout / Vin).
pub fn gain_db(input: Volts, output: Volts) -> f64 {
    db_relative(output, input)
}

fn volts_words(v: f64) -> String {
    format_engineering(v, Q::Voltage)
}

fn ohms_words(r: f64) -> String {
    format_engineering(r, Q::Resistance)
}

/// A measured power: one decimal from 10 W up, two below.
fn watts_words(p: f64) -> String {
    if p >= 10.0 {
        fixed_with(p, 1, " W")
    } else {
        fixed_with(p, 2, " W")
    }
}

/// A rated power as the maker gives it: "15 W", "0.5 W".
fn rated_words(p: f64) -> String {
    format_engineering(p, Q::Power)
}

/// The condition of an output-power reading in words: "at the onset of
/// clipping", "at 5 % distortion", "with 500 mV drive".
pub fn condition_words(c: &PowerCondition, cat: &Catalogue) -> String {
    match c {
        PowerCondition::Clipping => cat.text("bench-at-clipping"),
        PowerCondition::Distortion { fraction } => cat.format(
            "bench-at-distortion",
            &[(
                "pct",
                Arg::from(crate::units::format_sig(fraction * 100.0, 3)),
            )],
        ),
        PowerCondition::Drive { volts } => cat.format(
            "bench-with-drive",
            &[("volts", Arg::from(volts_words(volts.0)))],
        ),
    }
}

/// Every bench figure of a measurement set.
pub(crate) fn findings(
    job: &Job,
    set: &MeasurementSet,
    settings: &Settings,
    cat: &Catalogue,
) -> BenchFindings {
    let rated = job.unit.rated_power.as_ref().map(|p| p.value);
    let output_power: Vec<OutputPowerFindings> = set
        .bench
        .output_power
        .iter()
        .map(|r| output_power(r, rated, settings, cat))
        .collect();
    let hum_noise = set
        .bench
        .hum_noise
        .iter()
        .map(|h| hum_noise(h, &output_power, rated, settings, cat))
        .collect();
    BenchFindings {
        output_power,
        hum_noise,
        responses: set.bench.responses.iter().map(response).collect(),
        gains: set.bench.gains.iter().map(gain).collect(),
    }
}

fn output_power(
    r: &OutputPowerReading,
    rated: Option<Watts>,
    settings: &Settings,
    cat: &Catalogue,
) -> OutputPowerFindings {
    let rms = match r.reading {
        AcReading::Rms => r.volts.value,
        AcReading::PeakToPeak => rms_from_peak_to_peak(r.volts.value),
    };
    let p = power_into(rms, r.load.value);
    let full_output = !matches!(r.condition, PowerCondition::Drive { .. });
    let pct = rated.map(|rated| p / rated * 100.0);
    let guide = settings.output_power_caution * 100.0;
    let words = cat.format(
        "bench-power-into",
        &[
            ("watts", Arg::from(watts_words(p.0))),
            ("load", Arg::from(ohms_words(r.load.value.0))),
            ("condition", Arg::from(condition_words(&r.condition, cat))),
        ],
    );
    let args = |rated: Option<Watts>, pct: f64| {
        [
            ("power", Arg::from(&words)),
            ("pct", Arg::from(fixed(pct, 0))),
            ("guide", Arg::from(fixed(guide, 0))),
            (
                "rated",
                Arg::from(rated.map(|w| rated_words(w.0)).unwrap_or_default()),
            ),
        ]
    };
    let verdict = match (rated, pct) {
        _ if !full_output => Verdict::ok(
            cat.format("bench-power-at-drive", &args(rated, 0.0)),
            cat.text("threshold-power-at-drive"),
        ),
        (Some(rated), Some(pct)) => {
            let args = args(Some(rated), pct);
            let threshold = cat.format("threshold-power", &args);
            if pct < guide {
                Verdict::new(
                    Status::Caution,
                    cat.format("bench-power-below-guide", &args),
                    threshold,
                )
            } else {
                Verdict::ok(cat.format("bench-power-of-rated", &args), threshold)
            }
        }
        _ => Verdict::ok(
            cat.format("bench-power-no-rating", &args(None, 0.0)),
            cat.text("threshold-power-no-rating"),
        ),
    };
    let (condition, distortion_pct, drive_volts) = match r.condition {
        PowerCondition::Clipping => ("clipping", None, None),
        PowerCondition::Distortion { fraction } => ("distortion", Some(fraction * 100.0), None),
        PowerCondition::Drive { volts } => ("drive", None, Some(volts.0)),
    };
    OutputPowerFindings {
        channel: r.channel.clone(),
        reading: r.reading,
        reading_volts: r.volts.value.0,
        rms_volts: rms.0,
        load_ohms: r.load.value.0,
        frequency_hz: r.frequency.0,
        condition,
        distortion_pct,
        drive_volts,
        condition_words: condition_words(&r.condition, cat),
        output_power_w: p.0,
        rated_power_w: rated.map(|w| w.0),
        output_power_pct_of_rated: pct,
        verdict,
    }
}

/// The full output a hum reading is compared with: the largest output
/// power read at clipping or a stated distortion in the same set (on the
/// same channel when both name one), else the unit's rated power; as RMS
/// volts across the hum reading's load.
fn full_output(
    h: &HumNoiseReading,
    measured: &[OutputPowerFindings],
    rated: Option<Watts>,
) -> Option<(Volts, Watts, &'static str)> {
    let full: Vec<&OutputPowerFindings> =
        measured.iter().filter(|p| p.condition != "drive").collect();
    let same_channel: Vec<&OutputPowerFindings> = full
        .iter()
        .copied()
        .filter(|p| h.channel.is_some() && p.channel == h.channel)
        .collect();
    let pool = if same_channel.is_empty() {
        full
    } else {
        same_channel
    };
    let best = pool
        .iter()
        .max_by(|a, b| a.output_power_w.total_cmp(&b.output_power_w));
    match (best, rated) {
        (Some(p), _) => {
            let w = Watts(p.output_power_w);
            Some((volts_for_power(w, h.load.value), w, "measured"))
        }
        (None, Some(w)) => Some((volts_for_power(w, h.load.value), w, "rated")),
        (None, None) => None,
    }
}

fn hum_noise(
    h: &HumNoiseReading,
    measured: &[OutputPowerFindings],
    rated: Option<Watts>,
    settings: &Settings,
    cat: &Catalogue,
) -> HumNoiseFindings {
    let v = h.volts.value;
    let full = full_output(h, measured, rated);
    let below = full.map(|(vfull, _, _)| -db_relative(v, vfull));
    let guide = settings.hum_noise_caution_db;
    let input = match h.input {
        InputState::Shorted => "shorted",
        InputState::Open => "open",
    };
    let level = cat.format(
        if h.input == InputState::Shorted {
            "bench-hum-level-shorted"
        } else {
            "bench-hum-level-open"
        },
        &[
            ("volts", Arg::from(format_engineering(v.0, Q::Voltage))),
            ("dbv", Arg::from(fixed(dbv(v), 1))),
        ],
    );
    let guide_words = Arg::from(fixed(guide, 0));
    let verdict = match (full, below) {
        (Some((_, w, from)), Some(below)) => {
            let threshold = cat.format("threshold-hum", &[("guide", guide_words.clone())]);
            let against = match from {
                "rated" => cat.format(
                    "bench-rated-full-output",
                    &[("watts", Arg::from(rated_words(w.0)))],
                ),
                _ => cat.format(
                    "bench-measured-full-output",
                    &[("watts", Arg::from(watts_words(w.0)))],
                ),
            };
            let args = [
                ("level", Arg::from(&level)),
                ("db", Arg::from(fixed(below, 1))),
                ("against", Arg::from(against)),
                ("guide", guide_words),
            ];
            if below < guide {
                Verdict::new(
                    Status::Caution,
                    cat.format("bench-hum-below-guide", &args),
                    threshold,
                )
            } else {
                Verdict::ok(cat.format("bench-hum-below", &args), threshold)
            }
        }
        _ => Verdict::ok(
            cat.format("bench-hum-no-full", &[("level", Arg::from(&level))]),
            cat.text("threshold-hum-no-full"),
        ),
    };
    HumNoiseFindings {
        channel: h.channel.clone(),
        input,
        volume: h.volume.clone(),
        load_ohms: h.load.value.0,
        hum_noise_mv: v.0 * 1e3,
        hum_noise_dbv: dbv(v),
        full_output_volts: full.map(|(vf, _, _)| vf.0),
        full_output_w: full.map(|(_, w, _)| w.0),
        full_output_from: full.map(|(_, _, from)| from),
        hum_noise_db_below_full: below,
        verdict,
    }
}

fn response(r: &ResponseReading) -> ResponseFindings {
    let reference = r.reference.value;
    // Decoding guarantees a reading at the reference frequency.
    let vref = r
        .points
        .iter()
        .find(|p| (p.frequency.value.0 - reference.0).abs() <= 1e-9 * reference.0)
        .map(|p| p.volts.value)
        .unwrap_or(Volts(1.0));
    let mut points: Vec<ResponsePointFindings> = r
        .points
        .iter()
        .map(|p| ResponsePointFindings {
            frequency_hz: p.frequency.value.0,
            output_volts: p.volts.value.0,
            response_db: db_relative(p.volts.value, vref),
        })
        .collect();
    points.sort_by(|a, b| a.frequency_hz.total_cmp(&b.frequency_hz));
    let pairs: Vec<(Hertz, f64)> = points
        .iter()
        .map(|p| (Hertz(p.frequency_hz), p.response_db))
        .collect();
    let (low, high) = minus_3db_points(&pairs, reference);
    ResponseFindings {
        channel: r.channel.clone(),
        load_ohms: r.load.map(|o| o.0),
        input_volts: r.input.map(|v| v.0),
        reference_hz: reference.0,
        reference_volts: vref.0,
        lowest_hz: points
            .first()
            .map(|p| p.frequency_hz)
            .unwrap_or(reference.0),
        highest_hz: points.last().map(|p| p.frequency_hz).unwrap_or(reference.0),
        points,
        minus_3db_low_hz: low.map(|f| f.0),
        minus_3db_high_hz: high.map(|f| f.0),
    }
}

fn gain(g: &GainReading) -> GainFindings {
    GainFindings {
        channel: g.channel.clone(),
        frequency_hz: g.frequency.0,
        load_ohms: g.load.map(|o| o.0),
        input_volts: g.input.value.0,
        output_volts: g.output.value.0,
        gain_times: g.output.value / g.input.value,
        gain_db: gain_db(g.input.value, g.output.value),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol
    }

    #[test]
    fn power_into_a_dummy_load() {
        // Joule's law P = V²/R (textbook): 15.5 V rms across 8 Ω → 240.25 / 8 = 30.03125 W.
        assert!(close(power_into(Volts(15.5), Ohms(8.0)).0, 30.03125, 1e-12));
        // 10.95 V rms across 8 Ω → 119.9025 / 8 = 14.9878 W (textbook).
        assert!(close(
            power_into(Volts(10.95), Ohms(8.0)).0,
            14.987_812_5,
            1e-12
        ));
        // And back: V = √(P·R) (textbook): √(15 W × 8 Ω) = √120 = 10.954 V.
        assert!(close(
            volts_for_power(Watts(15.0), Ohms(8.0)).0,
            10.954_451,
            1e-6
        ));
    }

    #[test]
    fn peak_to_peak_to_rms_for_a_sine() {
        // For a sine, Vrms = Vpk/√2 = Vpp/(2√2) (textbook): 44 Vpp → 44 / 2.828427 = 15.556 V.
        assert!(close(
            rms_from_peak_to_peak(Volts(44.0)).0,
            15.556_349,
            1e-6
        ));
        // 2√2 Vpp is exactly 1 V rms (textbook).
        assert!(close(
            rms_from_peak_to_peak(Volts(2.0 * std::f64::consts::SQRT_2)).0,
            1.0,
            1e-15
        ));
    }

    #[test]
    fn decibel_figures() {
        // dBV = 20·log10(V/1 V) (textbook): 1 V → 0 dBV, 10 mV → −40 dBV, 4.2 mV → 20·log10(0.0042) = −47.535 dBV.
        assert!(close(dbv(Volts(1.0)), 0.0, 1e-12));
        assert!(close(dbv(Volts(0.01)), -40.0, 1e-12));
        assert!(close(dbv(Volts(0.0042)), -47.5350, 1e-4));
        // dB below full output, 20·log10(Vnoise/Vfull) (textbook): 4.2 mV against 10.954 V → 20·log10(3.834e-4) = −68.327 dB.
        assert!(close(
            db_relative(Volts(0.0042), Volts(10.954_451)),
            -68.3268,
            1e-4
        ));
        // Half the voltage is −6.0206 dB; √½ of it is −3.0103 dB (textbook).
        assert!(close(db_relative(Volts(0.5), Volts(1.0)), -6.0206, 1e-4));
        assert!(close(
            db_relative(Volts(0.5f64.sqrt()), Volts(1.0)),
            -3.0103,
            1e-4
        ));
        // Gain = 20·log10(Vout/Vin) (textbook): 120 mV in, 12 V out → ×100 → 40 dB.
        assert!(close(gain_db(Volts(0.12), Volts(12.0)), 40.0, 1e-12));
    }

    #[test]
    fn minus_3db_points_by_interpolation_on_a_log_axis() {
        // Worked by hand (linear in dB against log10 f, textbook interpolation):
        // low side, 50 Hz at −4 dB and 100 Hz at −2 dB: t = (−3 − (−2)) / (−4 − (−2)) = 0.5,
        // so f = 10^(log10 100 + 0.5·(log10 50 − log10 100)) = √(50 × 100) = 70.711 Hz.
        // High side, 10 kHz at −1 dB and 20 kHz at −7 dB: t = (−3 + 1)/(−7 + 1) = 1/3,
        // so f = 10 kHz × 2^(1/3) = 12.599 kHz.
        let points = [
            (Hertz(20.0), -9.0),
            (Hertz(50.0), -4.0),
            (Hertz(100.0), -2.0),
            (Hertz(1000.0), 0.0),
            (Hertz(10_000.0), -1.0),
            (Hertz(20_000.0), -7.0),
        ];
        let (low, high) = minus_3db_points(&points, Hertz(1000.0));
        assert!(close(low.unwrap().0, 70.710_678, 1e-5));
        assert!(close(high.unwrap().0, 12_599.21, 1e-2));
        // Order of the readings does not matter.
        let mut shuffled = points;
        shuffled.reverse();
        assert_eq!(minus_3db_points(&shuffled, Hertz(1000.0)), (low, high));
        // A reading exactly at −3 dB is the point itself.
        let (low, _) =
            minus_3db_points(&[(Hertz(40.0), -3.0), (Hertz(1000.0), 0.0)], Hertz(1000.0));
        assert!(close(low.unwrap().0, 40.0, 1e-9));
    }

    #[test]
    fn no_minus_3db_point_where_the_readings_do_not_reach_it() {
        // Flat within 3 dB to the last reading on both sides: no bracket, no figure.
        let points = [
            (Hertz(40.0), -2.5),
            (Hertz(1000.0), 0.0),
            (Hertz(15_000.0), -1.0),
        ];
        assert_eq!(minus_3db_points(&points, Hertz(1000.0)), (None, None));
        // A dip below −3 dB further out counts from the first crossing only.
        let points = [
            (Hertz(30.0), -1.0),
            (Hertz(60.0), -4.0),
            (Hertz(120.0), -1.0),
            (Hertz(1000.0), 0.0),
        ];
        let (low, high) = minus_3db_points(&points, Hertz(1000.0));
        // Between 120 Hz (−1 dB) and 60 Hz (−4 dB): t = 2/3, f = 120 × 2^(−2/3) = 75.595 Hz.
        assert!(close(low.unwrap().0, 75.5953, 1e-3));
        assert_eq!(high, None);
    }

    /// Derives a one-set job with `unit` properties and `set` readings.
    fn derive(unit: &str, set: &str) -> crate::calc::Findings {
        let text = format!(
            "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\" {unit}\nmains nominal=\"120V\"\n\
             measurements \"x\" mains=\"120V\" {{\n{set}\n}}\n"
        );
        let ratings = crate::ratings::RatingsTable::builtin();
        let job = crate::job::decode_with_ratings("t.kdl", &text, &ratings)
            .unwrap_or_else(|d| panic!("{:?}", d.problems))
            .job;
        crate::calc::derive(&job, &ratings)
    }

    #[test]
    fn output_power_against_the_rating() {
        // P = V²/R (textbook): 9.8 V rms into 8 Ω = 12.005 W; against a rated 15 W that is 80.03 %,
        // just above the 80 % guide (common practice).
        let f = derive(
            "rated-power=\"15W\"",
            "output-power rms=\"9.8V\" load=\"8R\" at=clipping",
        );
        let p = &f.sets[0].bench.output_power[0];
        assert!(close(p.output_power_w, 12.005, 1e-9));
        assert!(close(p.output_power_pct_of_rated.unwrap(), 80.0333, 1e-3));
        assert_eq!(p.verdict.status, Status::Ok);
        assert_eq!(p.verdict.threshold, "caution below 80 % of the rated 15 W");
        // 9.7 V → 11.761 W = 78.4 % of 15 W: below the guide, a caution with a warning.
        let f = derive(
            "rated-power=\"15W\"",
            "output-power rms=\"9.7V\" load=\"8R\" at=\"5%\"",
        );
        let p = &f.sets[0].bench.output_power[0];
        assert_eq!(p.verdict.status, Status::Caution);
        assert!(
            p.verdict.reason.contains("78 % of the rated 15 W"),
            "{}",
            p.verdict.reason
        );
        assert!(f.warnings.iter().any(|w| w.subject == "output power"));
        // A peak-to-peak reading: 28 Vpp = 9.8995 V rms (Vpp/(2√2), textbook) → 12.25 W into 8 Ω.
        let f = derive(
            "",
            "output-power peak-to-peak=\"28V\" load=\"8R\" at=clipping",
        );
        let p = &f.sets[0].bench.output_power[0];
        assert!(close(p.rms_volts, 9.899_495, 1e-6));
        assert!(close(p.output_power_w, 12.25, 1e-9));
        // No rated power: shown, not judged.
        assert_eq!(p.verdict.status, Status::Ok);
        assert_eq!(p.output_power_pct_of_rated, None);
        assert!(p.verdict.threshold.starts_with("none"));
        // At a stated drive it is not full output, so not judged either.
        let f = derive(
            "rated-power=\"50W\"",
            "output-power rms=\"2V\" load=\"8R\" at=\"0.1V\"",
        );
        assert_eq!(f.sets[0].bench.output_power[0].verdict.status, Status::Ok);
    }

    #[test]
    fn hum_and_noise_against_full_output() {
        // Against the measured output: 10.6 V at clipping; 3.1 mV is 20·log10(10.6/0.0031) = 70.68 dB below (textbook).
        let f = derive(
            "rated-power=\"15W\"",
            "output-power rms=\"10.6V\" load=\"8R\" at=clipping\nhum-noise \"3.1mV\" load=\"8R\" input=shorted",
        );
        let h = &f.sets[0].bench.hum_noise[0];
        assert_eq!(h.full_output_from, Some("measured"));
        assert!(close(h.hum_noise_db_below_full.unwrap(), 70.6789, 1e-3));
        assert!(close(h.hum_noise_dbv, -50.1728, 1e-3)); // 20·log10(0.0031) = −50.17 dBV (textbook)
        assert_eq!(h.verdict.status, Status::Ok);
        // Against the rating when nothing was measured: √(15 W × 8 Ω) = 10.954 V (textbook);
        // 12 mV is 20·log10(10.954/0.012) = 59.21 dB below: under the 60 dB guide (common practice), a caution.
        let f = derive(
            "rated-power=\"15W\"",
            "hum-noise \"12mV\" load=\"8R\" input=open",
        );
        let h = &f.sets[0].bench.hum_noise[0];
        assert_eq!(h.full_output_from, Some("rated"));
        assert!(close(h.full_output_volts.unwrap(), 10.954_451, 1e-6));
        assert!(close(h.hum_noise_db_below_full.unwrap(), 59.2080, 1e-3));
        assert_eq!(h.verdict.status, Status::Caution);
        let glance = f
            .at_a_glance
            .iter()
            .find(|g| g.family == crate::calc::Family::BenchTests)
            .unwrap();
        assert_eq!(glance.status, Status::Caution);
        // Nothing to compare with: shown in mV and dBV only.
        let f = derive("", "hum-noise \"12mV\" load=\"8R\" input=open");
        assert_eq!(f.sets[0].bench.hum_noise[0].hum_noise_db_below_full, None);
    }
}
