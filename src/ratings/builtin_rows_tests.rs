//! Holds `builtin_rows.rs` (the built-in ratings as Rust values) to what
//! the ratings-file reader makes of `ratings/valves.kdl`.

use super::rating::{Rating, RatingOrigin};
use super::table::{BUILTIN_NAME, BUILTIN_TEXT, RatingsTable};

/// The rows the reader makes of the built-in file.
fn read_rows() -> Vec<Rating> {
    RatingsTable::from_kdl_text(BUILTIN_NAME, BUILTIN_TEXT, RatingOrigin::Builtin)
        .expect("the built-in ratings file parses")
}

/// A number as a Rust literal of the same `f64` (Rust prints the shortest
/// text that reads back as the same value; the equality test below
/// checks it did).
fn number(value: f64) -> String {
    let text = format!("{value:?}");
    if text.contains(['.', 'e']) {
        text
    } else {
        format!("{text}.0")
    }
}

fn option(value: Option<f64>, unit: &str) -> String {
    match value {
        Some(v) if unit.is_empty() => format!("Some({})", number(v)),
        Some(v) => format!("Some({unit}({}))", number(v)),
        None => "None".to_owned(),
    }
}

/// The text of `builtin_rows.rs` for `rows`.
fn source(rows: &[Rating]) -> String {
    let mut out = String::new();
    out.push_str(
        "//! The built-in ratings (`ratings/valves.kdl`) as the ratings-file\n\
         //! reader makes them, written out as Rust values so that a run does\n\
         //! not parse the file. Generated: do not edit. After changing\n\
         //! `ratings/valves.kdl`, run\n\
         //! `AMPREPORT_WRITE_BUILTIN_ROWS=1 cargo test --lib builtin_rows`\n\
         //! to write it again; `builtin_rows_tests.rs` fails while it is not\n\
         //! the reader's rows.\n\n\
         use super::class::{RectifierHeating, ValveClass};\n\
         use super::rating::{Heater, Rating, RatingOrigin};\n\
         use crate::units::{Amps, Ohms, Volts, Watts};\n\n\
         /// The rows of the built-in ratings file, in file order.\n\
         pub(super) fn rows() -> Vec<Rating> {\n    vec![\n",
    );
    for r in rows {
        assert_eq!(r.origin, RatingOrigin::Builtin);
        let s = |t: &str| format!("{t:?}.to_owned()");
        let equivalents: Vec<String> = r.equivalents.iter().map(|e| s(e)).collect();
        let heater_parallel = match r.heater_parallel {
            Some(h) => format!(
                "Some(Heater {{ voltage: Volts({}), current: Amps({}) }})",
                number(h.voltage.0),
                number(h.current.0)
            ),
            None => "None".to_owned(),
        };
        let rectifier_heating = match r.rectifier_heating {
            Some(h) => format!("Some(RectifierHeating::{h:?})"),
            None => "None".to_owned(),
        };
        let fields = [
            ("name", s(&r.name)),
            ("equivalents", format!("vec![{}]", equivalents.join(", "))),
            ("class", format!("ValveClass::{:?}", r.class)),
            ("sections", r.sections.to_string()),
            (
                "plate_dissipation",
                option(r.plate_dissipation.map(|v| v.0), "Watts"),
            ),
            (
                "design_max_plate_dissipation",
                option(r.design_max_plate_dissipation.map(|v| v.0), "Watts"),
            ),
            (
                "screen_dissipation",
                option(r.screen_dissipation.map(|v| v.0), "Watts"),
            ),
            (
                "plate_voltage",
                option(r.plate_voltage.map(|v| v.0), "Volts"),
            ),
            (
                "screen_voltage",
                option(r.screen_voltage.map(|v| v.0), "Volts"),
            ),
            (
                "cathode_current",
                option(r.cathode_current.map(|v| v.0), "Amps"),
            ),
            (
                "output_current",
                option(r.output_current.map(|v| v.0), "Amps"),
            ),
            ("rectifier_heating", rectifier_heating),
            (
                "heater_voltage",
                format!("Volts({})", number(r.heater_voltage.0)),
            ),
            (
                "heater_current",
                format!("Amps({})", number(r.heater_current.0)),
            ),
            ("heater_parallel", heater_parallel),
            ("mu", option(r.mu, "")),
            ("mu_g1g2", option(r.mu_g1g2, "")),
            (
                "plate_resistance",
                option(r.plate_resistance.map(|v| v.0), "Ohms"),
            ),
            (
                "transconductance_ma_per_v",
                option(r.transconductance_ma_per_v, ""),
            ),
            ("source", s(&r.source)),
            ("origin", "RatingOrigin::Builtin".to_owned()),
        ];
        out.push_str("        Rating {\n");
        for (name, value) in fields {
            out.push_str(&format!("            {name}: {value},\n"));
        }
        out.push_str("        },\n");
    }
    out.push_str("    ]\n}\n");
    out
}

#[test]
fn builtin_rows_are_the_ratings_file_as_read() {
    let read = read_rows();
    assert!(read.len() > 20, "{} rows", read.len());
    // Field for field, numbers bit for bit (`Rating`'s equality compares
    // the `f64`s; none is NaN).
    assert_eq!(super::builtin_rows::rows(), read);
}

#[test]
fn builtin_rows_source_is_the_one_generated() {
    let want = source(&read_rows());
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("src/ratings/builtin_rows.rs");
    if std::env::var_os("AMPREPORT_WRITE_BUILTIN_ROWS").is_some() {
        std::fs::write(&path, &want).unwrap();
    }
    let have = std::fs::read_to_string(&path).unwrap();
    assert!(
        have == want,
        "src/ratings/builtin_rows.rs is not what ratings/valves.kdl reads as; \
         run AMPREPORT_WRITE_BUILTIN_ROWS=1 cargo test --lib builtin_rows"
    );
}
