//! `ampreport tubes [TYPE]`: the ratings table, or one type in full.

use super::args::TubesArgs;
use super::exit::Exit;
use super::load;
use crate::ratings::{Rating, RatingOrigin};
use crate::report::{Align, TextTable};
use crate::units::{QuantityKind as Q, format_engineering};

fn q(v: Option<f64>, kind: Q) -> String {
    v.map(|v| format_engineering(v, kind))
        .unwrap_or_else(|| "–".into())
}

pub fn run(args: &TubesArgs) -> Exit {
    let table = match load::ratings(&args.ratings) {
        Ok(t) => t,
        Err(e) => return e,
    };
    match &args.valve_type {
        Some(name) => match table.lookup(name) {
            Ok(r) => {
                print!("{}", detail(r));
                Exit::Success
            }
            Err(unknown) => {
                eprintln!("error: {unknown}");
                Exit::InvalidInput
            }
        },
        None => {
            let mut t = TextTable::new(&[
                ("type", Align::Left),
                ("also", Align::Left),
                ("class", Align::Left),
                ("Pa max", Align::Right),
                ("Pg2 max", Align::Right),
                ("Va max", Align::Right),
                ("I max", Align::Right),
                ("heater", Align::Right),
                ("from", Align::Left),
            ]);
            for r in table.iter() {
                t.row(vec![
                    r.name.clone(),
                    r.equivalents.join(" "),
                    r.class.to_string(),
                    q(r.plate_dissipation.map(|w| w.0), Q::Power),
                    q(r.screen_dissipation.map(|w| w.0), Q::Power),
                    q(r.plate_voltage.map(|v| v.0), Q::Voltage),
                    q(
                        r.cathode_current.or(r.output_current).map(|a| a.0),
                        Q::Current,
                    ),
                    format!(
                        "{} {}",
                        format_engineering(r.heater_voltage.0, Q::Voltage),
                        format_engineering(r.heater_current.0, Q::Current)
                    ),
                    origin(r),
                ]);
            }
            print!("{}", t.render(0));
            println!(
                "\n{} types. I max: cathode current, or a rectifier's DC output current. `ampreport tubes TYPE` shows one with its source note.",
                table.len()
            );
            Exit::Success
        }
    }
}

fn origin(r: &Rating) -> String {
    match &r.origin {
        RatingOrigin::Builtin => "built in".into(),
        RatingOrigin::Shop(p) => format!("shop file {}", p.display()),
    }
}

fn detail(r: &Rating) -> String {
    let mut lines = vec![format!("{} ({})", r.name, r.class)];
    let mut row = |label: &str, value: String| lines.push(format!("  {label:<28}{value}"));
    if !r.equivalents.is_empty() {
        row("equivalents", r.equivalents.join(", "));
    }
    if r.sections > 1 {
        row(
            "sections",
            format!("{} (plate figures are per section)", r.sections),
        );
    }
    let fields: [(&str, Option<f64>, Q); 7] = [
        (
            "plate dissipation max",
            r.plate_dissipation.map(|w| w.0),
            Q::Power,
        ),
        (
            "design-max plate dissipation",
            r.design_max_plate_dissipation.map(|w| w.0),
            Q::Power,
        ),
        (
            "screen dissipation max",
            r.screen_dissipation.map(|w| w.0),
            Q::Power,
        ),
        (
            "plate voltage max",
            r.plate_voltage.map(|v| v.0),
            Q::Voltage,
        ),
        (
            "screen voltage max",
            r.screen_voltage.map(|v| v.0),
            Q::Voltage,
        ),
        (
            "cathode current max",
            r.cathode_current.map(|a| a.0),
            Q::Current,
        ),
        (
            "rectifier output current max",
            r.output_current.map(|a| a.0),
            Q::Current,
        ),
    ];
    for (label, v, kind) in fields {
        if let Some(v) = v {
            row(label, format_engineering(v, kind));
        }
    }
    if let Some(h) = r.rectifier_heating {
        row("rectifier heating", format!("{h:?}").to_lowercase());
    }
    row(
        "heater",
        format!(
            "{} at {}",
            format_engineering(r.heater_voltage.0, Q::Voltage),
            format_engineering(r.heater_current.0, Q::Current)
        ),
    );
    if let Some(h) = &r.heater_parallel {
        row(
            "heater (halves in parallel)",
            format!(
                "{} at {}",
                format_engineering(h.voltage.0, Q::Voltage),
                format_engineering(h.current.0, Q::Current)
            ),
        );
    }
    if let Some(mu) = r.mu {
        row("amplification factor μ", format!("{mu} (typical)"));
    }
    if let Some(mu) = r.mu_g1g2 {
        row("grid-to-screen μg1g2", format!("{mu} (typical)"));
    }
    if let Some(ra) = r.plate_resistance {
        row(
            "plate resistance ra",
            format!("{} (typical)", format_engineering(ra.0, Q::Resistance)),
        );
    }
    if let Some(gm) = r.transconductance_ma_per_v {
        row("transconductance gm", format!("{gm} mA/V (typical)"));
    }
    row("source", r.source.clone());
    row("from", origin(r));
    lines.join("\n") + "\n"
}
