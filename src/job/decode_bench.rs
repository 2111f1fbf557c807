//! The bench tests of a measurement set: output power into a dummy load,
//! hum and noise, frequency response and gain. Decoding only; the figures
//! are worked out in `calc::bench`.

use crate::kdl_fast::{Node, Value};

use super::decode_error::{DecodeError, suggestion};
use super::model::*;
use super::reader::Reader;
use crate::catalogue::{Arg, Msg};
use crate::units::{Hertz, Ohms, QuantityKind as Q, Volts};

/// The bench-test nodes a measurement set may hold.
pub const BENCH_NODES: &[&str] = &["output-power", "hum-noise", "response", "gain"];

/// The frequency a bench reading is taken at when the job does not say.
pub const DEFAULT_FREQUENCY: Hertz = Hertz(1000.0);

/// Reads one bench-test node into `bench`.
pub(crate) fn decode_bench_node(child: Node<'_>, r: &mut Reader, bench: &mut BenchTests) {
    match child.name().value() {
        "output-power" => {
            r.no_children(child);
            if let Some(p) = output_power(child, r) {
                bench.output_power.push(p);
            }
        }
        "hum-noise" => {
            r.no_children(child);
            if let Some(h) = hum_noise(child, r) {
                bench.hum_noise.push(h);
            }
        }
        "response" => {
            if let Some(resp) = response(child, r) {
                bench.responses.push(resp);
            }
        }
        "gain" => {
            r.no_children(child);
            if let Some(g) = gain(child, r) {
                bench.gains.push(g);
            }
        }
        _ => {}
    }
}

/// A voltage above zero, with its span.
fn volts_above_zero(
    r: &mut Reader,
    v: Option<Spanned<f64>>,
    what: impl Into<Arg>,
) -> Option<Spanned<Volts>> {
    r.positive(v, what, false)
        .map(|v| Spanned::new(Volts(v.value), v.span))
}

fn frequency(r: &mut Reader, node: Node<'_>, key: &str) -> Option<Hertz> {
    let f = r.opt_prop_quantity(node, key, Q::Frequency);
    match f {
        None if Reader::prop(node, key).is_none() => Some(DEFAULT_FREQUENCY),
        f => r
            .positive(f, Msg::new("diag-bench-a-frequency"), false)
            .map(|f| Hertz(f.value)),
    }
}

fn load(r: &mut Reader, node: Node<'_>, example: &str) -> Option<Spanned<Ohms>> {
    let q = r.req_prop_quantity(node, "load", Q::Resistance, example);
    let q = r.positive(q, Msg::new("diag-bench-load-resistance"), false)?;
    plausible_load(r, q.value, q.span);
    Some(Spanned::new(Ohms(q.value), q.span))
}

fn opt_load(r: &mut Reader, node: Node<'_>) -> Option<Ohms> {
    let q = r.opt_prop_quantity(node, "load", Q::Resistance);
    let q = r.positive(q, Msg::new("diag-bench-load-resistance"), false)?;
    plausible_load(r, q.value, q.span);
    Some(Ohms(q.value))
}

/// Dummy loads are speaker impedances: 2 to 32 Ω covers every usual one.
fn plausible_load(r: &mut Reader, ohms: f64, span: miette::SourceSpan) {
    if !(1.0..=64.0).contains(&ohms) {
        r.push(
            DecodeError::warning(
                "job::implausible",
                span,
                Msg::new("diag-bench-unusual-load").arg("load", Ohms(ohms).to_string()),
                Msg::new("diag-unusual"),
            )
            .with_help(Msg::new("diag-bench-unusual-load-help")),
        );
    }
}

fn output_power(node: Node<'_>, r: &mut Reader) -> Option<OutputPowerReading> {
    let example = "output-power rms=\"15.5V\" load=\"8R\" frequency=\"1kHz\" at=clipping";
    r.check_entries(
        node,
        &["rms", "peak-to-peak", "load", "frequency", "channel", "at"],
        0,
    );
    let rms = Reader::prop(node, "rms");
    let pp = Reader::prop(node, "peak-to-peak");
    let (entry, reading) = match (rms, pp) {
        (Some(e), None) => (e, AcReading::Rms),
        (None, Some(e)) => (e, AcReading::PeakToPeak),
        (Some(_), Some(e)) => {
            r.push(
                DecodeError::error(
                    "job::conflicting",
                    r.value_span(e),
                    Msg::new("diag-bench-rms-and-pp"),
                    Msg::new("diag-bench-one-reading"),
                )
                .with_help(Msg::new("diag-bench-rms-or-pp")),
            );
            return None;
        }
        (None, None) => {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(node),
                    Msg::new("diag-bench-power-needs-volts"),
                    Msg::new("diag-reading-missing"),
                )
                .with_help(Msg::new("diag-for-example").arg("example", example)),
            );
            return None;
        }
    };
    let v = r.quantity(entry, Q::Voltage, Msg::new("diag-bench-the-output-voltage"));
    let volts = volts_above_zero(r, v, Msg::new("diag-bench-an-output-voltage"));
    let load = load(r, node, example);
    let freq = frequency(r, node, "frequency");
    let channel = r.opt_prop_string(node, "channel");
    let condition = condition(node, r, example);
    if let (Some(volts), Some(load)) = (&volts, &load) {
        let rms = match reading {
            AcReading::Rms => volts.value.0,
            AcReading::PeakToPeak => volts.value.0 / (2.0 * 2f64.sqrt()),
        };
        let watts = rms * rms / load.value.0;
        if watts > 2000.0 {
            r.push(
                DecodeError::warning(
                    "job::implausible",
                    volts.span,
                    Msg::new("diag-bench-unusual-power")
                        .arg("volts", volts.value.to_string())
                        .arg("load", load.value.to_string())
                        .arg("watts", format!("{watts:.0}")),
                    Msg::new("diag-unusual"),
                )
                .with_help(Msg::new("diag-bench-unusual-power-help")),
            );
        }
    }
    Some(OutputPowerReading {
        volts: volts?,
        reading,
        load: load?,
        frequency: freq?,
        channel,
        condition: condition?,
    })
}

/// `at=clipping`, `at="5%"` (a stated distortion) or `at="0.5V"` (a stated
/// drive).
fn condition(node: Node<'_>, r: &mut Reader, example: &str) -> Option<PowerCondition> {
    let help = || Msg::new("diag-bench-at-help");
    let Some(entry) = Reader::prop(node, "at") else {
        r.push(
            DecodeError::error(
                "job::missing",
                Reader::name_span(node),
                Msg::new("diag-bench-needs-at"),
                Msg::new("diag-bench-condition-missing"),
            )
            .with_help(Msg::new("diag-two-hints").arg("first", help()).arg(
                "second",
                Msg::new("diag-for-example").arg("example", example),
            )),
        );
        return None;
    };
    let span = r.value_span(entry);
    let text = match entry.value() {
        Value::String(s) => s.trim().to_string(),
        other => other.to_string(),
    };
    if text == "clipping" {
        return Some(PowerCondition::Clipping);
    }
    if text.ends_with('%') {
        let p = r.quantity(entry, Q::Percent, Msg::new("diag-bench-the-distortion"))?;
        if !(p.value > 0.0 && p.value < 100.0) {
            r.push(DecodeError::error(
                "job::impossible-value",
                span,
                Msg::new("diag-bench-distortion-range"),
                Msg::new("diag-out-of-range"),
            ));
            return None;
        }
        return Some(PowerCondition::Distortion {
            fraction: p.value / 100.0,
        });
    }
    if text.ends_with('V') {
        let v = r.quantity(entry, Q::Voltage, Msg::new("diag-bench-the-input-drive"));
        let v = r.positive(v, Msg::new("diag-bench-an-input-drive"), false)?;
        return Some(PowerCondition::Drive {
            volts: Volts(v.value),
        });
    }
    r.push(
        DecodeError::error(
            "job::bad-value",
            span,
            Msg::new("diag-bench-bad-at").arg("found", text.as_str()),
            Msg::new("diag-bench-expected-at"),
        )
        .with_help(
            Msg::new("diag-two-hints")
                .arg("first", suggestion(&text, &["clipping"]))
                .arg("second", help()),
        ),
    );
    None
}

fn hum_noise(node: Node<'_>, r: &mut Reader) -> Option<HumNoiseReading> {
    let example = "hum-noise \"4.2mV\" load=\"8R\" input=shorted volume=\"0\"";
    r.check_entries(node, &["load", "input", "volume", "channel"], 1);
    let v = match Reader::arg(node, 0) {
        Some(e) => r.quantity(e, Q::Voltage, Msg::new("diag-bench-the-hum-reading")),
        None => {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(node),
                    Msg::new("diag-bench-hum-needs-volts"),
                    Msg::new("diag-reading-missing"),
                )
                .with_help(Msg::new("diag-for-example").arg("example", example)),
            );
            None
        }
    };
    let volts = volts_above_zero(r, v, Msg::new("diag-bench-a-hum-reading"));
    if let Some(v) = &volts
        && v.value.0 > 5.0
    {
        r.push(
            DecodeError::warning(
                "job::implausible",
                v.span,
                Msg::new("diag-bench-hum-high").arg("volts", v.value.to_string()),
                Msg::new("diag-unusual"),
            )
            .with_help(Msg::new("diag-bench-hum-high-help")),
        );
    }
    let load = load(r, node, example);
    let input = match Reader::prop(node, "input").and_then(|e| r.name(e, "`input`")) {
        Some(name) => match name.value.as_str() {
            "shorted" => Some(InputState::Shorted),
            "open" => Some(InputState::Open),
            other => {
                r.push(
                    DecodeError::error(
                        "job::bad-value",
                        name.span,
                        Msg::new("diag-bench-bad-input").arg("found", other),
                        Msg::new("diag-bench-expected-input"),
                    )
                    .with_help(suggestion(other, &["shorted", "open"])),
                );
                None
            }
        },
        None => {
            if Reader::prop(node, "input").is_none() {
                r.push(
                    DecodeError::error(
                        "job::missing",
                        Reader::name_span(node),
                        Msg::new("diag-bench-hum-needs-input"),
                        Msg::new("diag-bench-input-missing"),
                    )
                    .with_help(Msg::new("diag-for-example").arg("example", example)),
                );
            }
            None
        }
    };
    let volume = volume_words(node, r);
    let channel = r.opt_prop_string(node, "channel");
    Some(HumNoiseReading {
        volts: volts?,
        load: load?,
        input: input?,
        volume,
        channel,
    })
}

/// A volume setting as written: text, or a plain number ("0", "10").
fn volume_words(node: Node<'_>, r: &mut Reader) -> Option<String> {
    let entry = Reader::prop(node, "volume")?;
    match entry.value() {
        Value::String(s) => Some(s.to_string()),
        Value::Integer(i) => Some(i.to_string()),
        Value::Float(f) if f.is_finite() => Some(f.to_string()),
        _ => r.string(entry, "`volume`").map(|s| s.value),
    }
}

fn response(node: Node<'_>, r: &mut Reader) -> Option<ResponseReading> {
    let example =
        "response reference=\"1kHz\" input=\"100mV\" load=\"8R\" { point \"100Hz\" \"3.9V\" }";
    r.check_entries(node, &["reference", "load", "input", "channel"], 0);
    let reference = match Reader::prop(node, "reference") {
        Some(e) => {
            let q = r.quantity(e, Q::Frequency, "`reference`");
            r.positive(q, Msg::new("diag-bench-a-frequency"), false)
                .map(|q| Spanned::new(Hertz(q.value), q.span))
        }
        None => Some(Spanned::new(DEFAULT_FREQUENCY, Reader::name_span(node))),
    };
    let load = opt_load(r, node);
    let input = r.opt_prop_quantity(node, "input", Q::Voltage);
    let input = r
        .positive(input, Msg::new("diag-bench-an-input-level"), false)
        .map(|q| Volts(q.value));
    let channel = r.opt_prop_string(node, "channel");
    let mut points: Vec<ResponsePoint> = Vec::new();
    let children = r.children(node.children(), &["point"], "`response`");
    let written = !children.is_empty();
    for child in children {
        r.check_entries(child, &[], 2);
        r.no_children(child);
        let point_example = "point \"100Hz\" \"3.9V\"";
        let (Some(fe), Some(ve)) = (Reader::arg(child, 0), Reader::arg(child, 1)) else {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(child),
                    Msg::new("diag-bench-point-needs"),
                    Msg::new("diag-reading-missing"),
                )
                .with_help(Msg::new("diag-for-example").arg("example", point_example)),
            );
            continue;
        };
        let f = r.quantity(fe, Q::Frequency, Msg::new("diag-bench-the-frequency"));
        let f = r.positive(f, Msg::new("diag-bench-a-frequency"), false);
        let v = r.quantity(ve, Q::Voltage, Msg::new("diag-bench-the-output-voltage"));
        let v = r.positive(v, Msg::new("diag-bench-response-voltage"), false);
        let (Some(f), Some(v)) = (f, v) else { continue };
        if points.iter().any(|p| p.frequency.value.0 == f.value) {
            r.push(DecodeError::error(
                "job::repeated-reading",
                f.span,
                Msg::new("diag-bench-point-twice").arg("frequency", Hertz(f.value).to_string()),
                Msg::new("diag-repeated-here"),
            ));
            continue;
        }
        points.push(ResponsePoint {
            frequency: Spanned::new(Hertz(f.value), f.span),
            volts: Spanned::new(Volts(v.value), v.span),
        });
    }
    let reference = reference?;
    if points.is_empty() && !written {
        r.push(
            DecodeError::error(
                "job::missing",
                Reader::name_span(node),
                Msg::new("diag-bench-response-empty"),
                Msg::new("diag-bench-no-points"),
            )
            .with_help(Msg::new("diag-for-example").arg("example", example)),
        );
        return None;
    }
    if points.is_empty() {
        // Each broken reading is already reported.
        return None;
    }
    if !points
        .iter()
        .any(|p| (p.frequency.value.0 - reference.value.0).abs() <= 1e-9 * reference.value.0)
    {
        r.push(
            DecodeError::error(
                "job::missing",
                reference.span,
                Msg::new("diag-bench-no-reference-point")
                    .arg("frequency", reference.value.to_string()),
                Msg::new("diag-bench-no-point-here"),
            )
            .with_help(Msg::new("diag-bench-no-reference-point-help")),
        );
        return None;
    }
    Some(ResponseReading {
        reference,
        load,
        input,
        channel,
        points,
    })
}

fn gain(node: Node<'_>, r: &mut Reader) -> Option<GainReading> {
    let example = "gain input=\"120mV\" output=\"15.5V\" frequency=\"1kHz\"";
    r.check_entries(
        node,
        &["input", "output", "frequency", "load", "channel"],
        0,
    );
    let input = r.req_prop_quantity(node, "input", Q::Voltage, example);
    let input = volts_above_zero(r, input, Msg::new("diag-bench-an-input-voltage"));
    let output = r.req_prop_quantity(node, "output", Q::Voltage, example);
    let output = volts_above_zero(r, output, Msg::new("diag-bench-an-output-voltage"));
    let freq = frequency(r, node, "frequency");
    let load = opt_load(r, node);
    let channel = r.opt_prop_string(node, "channel");
    Some(GainReading {
        input: input?,
        output: output?,
        frequency: freq?,
        load,
        channel,
    })
}

#[cfg(test)]
mod tests {
    use crate::job::{
        AcReading, InputState, Job, JobDiagnostics, PowerCondition, decode, line_column,
    };

    const HEAD: &str = "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\" rated-power=\"15W\"\nmains nominal=\"120V\"\n";

    fn job(set: &str) -> Result<Job, JobDiagnostics> {
        let text = format!("{HEAD}measurements \"x\" mains=\"120V\" {{\n{set}\n}}\n");
        decode("t.kdl", &text).map(|d| d.job)
    }

    /// The (line, column) of the `skip`-th occurrence of `needle` in the
    /// job text built from `set`, worked out from the text itself.
    fn at(set: &str, needle: &str) -> (usize, usize) {
        let text = format!("{HEAD}measurements \"x\" mains=\"120V\" {{\n{set}\n}}\n");
        let offset = text.find(needle).expect("needle in text");
        let before = &text[..offset];
        let line = before.matches('\n').count() + 1;
        let col = before.rsplit('\n').next().unwrap_or("").chars().count() + 1;
        (line, col)
    }

    fn problems(set: &str) -> Vec<(String, (usize, usize))> {
        let text = format!("{HEAD}measurements \"x\" mains=\"120V\" {{\n{set}\n}}\n");
        match decode("t.kdl", &text) {
            Ok(_) => Vec::new(),
            Err(d) => d
                .problems
                .iter()
                .map(|p| (p.message.clone(), line_column(&text, p.span.offset())))
                .collect(),
        }
    }

    #[test]
    fn every_bench_reading_decodes() {
        let j = job(concat!(
            "output-power rms=\"10.6V\" load=\"8R\" frequency=\"1kHz\" at=clipping channel=\"bright\"\n",
            "output-power peak-to-peak=\"30V\" load=\"8R\" at=\"5%\"\n",
            "output-power rms=\"9V\" load=\"16R\" at=\"0.5V\"\n",
            "hum-noise \"3.1mV\" load=\"8R\" input=shorted volume=0\n",
            "hum-noise \"5mV\" load=\"8R\" input=open volume=\"full\"\n",
            "gain input=\"95mV\" output=\"10.6V\"\n",
            "response input=\"40mV\" { point \"100Hz\" \"3.7V\"; point \"1k\" \"4V\" }\n",
            "suggest-cathode-resistor\n",
        ))
        .unwrap();
        let set = &j.measurements[0];
        let b = &set.bench;
        assert_eq!(j.unit.rated_power.as_ref().unwrap().value.0, 15.0);
        assert!(set.suggest_cathode_resistor);
        assert_eq!(b.output_power.len(), 3);
        assert_eq!(b.output_power[0].reading, AcReading::Rms);
        assert_eq!(b.output_power[0].condition, PowerCondition::Clipping);
        assert_eq!(b.output_power[0].channel.as_deref(), Some("bright"));
        assert_eq!(b.output_power[1].reading, AcReading::PeakToPeak);
        assert_eq!(b.output_power[1].frequency.0, 1000.0); // the default
        assert_eq!(
            b.output_power[1].condition,
            PowerCondition::Distortion { fraction: 0.05 }
        );
        assert_eq!(
            b.output_power[2].condition,
            PowerCondition::Drive {
                volts: crate::units::Volts(0.5)
            }
        );
        assert_eq!(b.hum_noise[0].input, InputState::Shorted);
        assert_eq!(b.hum_noise[0].volume.as_deref(), Some("0"));
        assert_eq!(b.hum_noise[1].input, InputState::Open);
        assert_eq!(b.gains[0].input.value.0, 0.095);
        assert_eq!(b.responses[0].reference.value.0, 1000.0);
        assert_eq!(b.responses[0].points.len(), 2);
    }

    #[test]
    fn bench_mistakes_point_at_their_place() {
        let set = "output-power load=\"8R\" at=clipping";
        let p = problems(set);
        assert_eq!(p.len(), 1, "{p:?}");
        assert!(p[0].0.contains("RMS or peak-to-peak"), "{p:?}");
        assert_eq!(p[0].1, at(set, "output-power"));

        let set = "output-power rms=\"10V\" peak-to-peak=\"28V\" load=\"8R\" at=clipping";
        let p = problems(set);
        assert!(p[0].0.contains("both"), "{p:?}");
        assert_eq!(p[0].1, at(set, "\"28V\""));

        let set = "output-power rms=\"10V\" load=\"8R\" at=clippin";
        let p = problems(set);
        assert!(
            p[0].0.contains("clipping, a distortion or a drive"),
            "{p:?}"
        );
        assert_eq!(p[0].1, at(set, "clippin"));

        let set = "output-power rms=\"10V\" load=\"8R\"";
        assert!(problems(set)[0].0.contains("condition it was read at"));

        let set = "output-power rms=\"10mA\" load=\"8R\" at=clipping";
        let p = problems(set);
        assert_eq!(p[0].1, at(set, "A\""), "{p:?}");

        let set = "hum-noise \"3mV\" load=\"8R\" input=shortd";
        let p = problems(set);
        assert!(p[0].0.contains("shorted or open"), "{p:?}");
        assert_eq!(p[0].1, at(set, "shortd"));

        let set = "hum-noise \"3mV\" load=\"8R\"";
        assert!(problems(set)[0].0.contains("shorted or open"));

        let set =
            "response reference=\"1kHz\" {\n point \"100Hz\" \"3V\"\n point \"10kHz\" \"3V\"\n}";
        let p = problems(set);
        assert!(p[0].0.contains("no reading at its reference"), "{p:?}");
        assert_eq!(p[0].1, at(set, "\"1kHz\""));

        let set = "response {\n point \"1kHz\" \"3V\"\n point \"1000Hz\" \"3.1V\"\n}";
        let p = problems(set);
        assert!(p[0].0.contains("read twice"), "{p:?}");
        assert_eq!(p[0].1, at(set, "\"1000Hz\""));

        let set = "response {\n point \"1kHz\" \"0V\"\n}";
        let p = problems(set);
        assert!(p[0].0.contains("cannot be zero"), "{p:?}");

        let set = "gain input=\"95mV\"";
        let p = problems(set);
        assert!(p[0].0.contains("`output`"), "{p:?}");
        assert_eq!(p[0].1, at(set, "gain"));

        let set = "output-power rms=\"10V\" load=\"-8R\" at=clipping";
        let p = problems(set);
        assert!(p[0].0.contains("cannot be negative"), "{p:?}");
        assert_eq!(p[0].1, at(set, "\"-8R\""));

        let set = "suggest-cathode-resistor R24";
        assert_eq!(problems(set)[0].1, at(set, "R24"));
    }

    #[test]
    fn unusual_loads_are_warnings_not_errors() {
        let text = format!(
            "{HEAD}measurements \"x\" mains=\"120V\" {{\noutput-power rms=\"10V\" load=\"800R\" at=clipping\n}}\n"
        );
        let d = decode("t.kdl", &text).expect("a warning does not stop the decode");
        assert!(
            d.diagnostics
                .problems
                .iter()
                .any(|p| p.message.contains("dummy load"))
        );
    }

    #[test]
    fn bench_settings_decode() {
        let text = format!(
            "{HEAD}settings {{\n output-power-caution \"75%\"\n hum-noise-caution \"55dB\"\n cathode-bias-target 80\n}}\n"
        );
        let j = decode("t.kdl", &text).unwrap().job;
        assert_eq!(j.settings.output_power_caution, 0.75);
        assert_eq!(j.settings.hum_noise_caution_db, 55.0);
        assert_eq!(j.settings.cathode_bias_target, 0.80);
        let text = format!("{HEAD}settings {{\n hum-noise-caution \"loud\"\n}}\n");
        assert!(decode("t.kdl", &text).is_err());
        let text = format!("{HEAD}settings {{\n hum-noise-caution 400\n}}\n");
        assert!(decode("t.kdl", &text).is_err());
    }
}
