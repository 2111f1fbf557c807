//! The cells of the per-set tables as Typst code, written by the program
//! rather than by the template's loops ([`TypstRow`]): a long job has some
//! two hundred cells a set, and printing each through the template engine
//! (an attribute lookup, a filter call, an escape) was the largest part of
//! its own work.
//!
//! Each row writes exactly what the built-in template's loop over it wrote
//! (`templates/handover.typ` before the loops became `typst_rows`; kept in
//! the tests below as `LOOPS`, and the tests hold every row type to it on
//! hostile text): a cell printed with `typst_content` goes through
//! [`escape_content_into`], one printed as `{{ value }}` through
//! [`escape_markup_into`], one in a Typst string through
//! [`escape_string_into`]; `(x or "–")` takes the dash for a missing or
//! empty value, as the template's `or` did. The columns these cells fill
//! are declared beside `typst_rows` in the template: a change to one is a
//! change to the other.

use crate::typeset::{
    CountedText, TypstRow, escape_content_into, escape_markup_into, escape_string_into,
};

use super::{CapacitorRow, HeaterRow, NodeRow, ResistorRow, ValveRow, WindowRow};

/// The characters of a text field, as the `text_length` walk counts them
/// (`text.chars().count()`): the bytes that start a character, every
/// byte but a UTF-8 continuation byte (0x80–0xBF). Counted here in one
/// loop the compiler keeps inline, where the library's count of a short
/// text is a call of its own for every field of every row.
fn n(text: &str) -> usize {
    text.bytes().filter(|&b| !(0x80..0xC0).contains(&b)).count()
}

/// The characters of a field that may be missing (nothing when it is).
fn n_opt(text: &Option<String>) -> usize {
    text.as_deref().map_or(0, n)
}

/// A new row: a line of its own, indented as the template indented it.
fn row(out: &mut String) {
    out.push_str("\n  ");
}

/// `{{ text|typst_content }},` and a space.
fn content(out: &mut String, text: &str) {
    escape_content_into(text, out);
    out.push_str(", ");
}

/// `{{ value|typst_content }}, ` for a value that may be missing (an empty
/// content block).
fn content_opt(out: &mut String, value: &Option<String>) {
    match value {
        Some(text) => content(out, text),
        None => out.push_str("[], "),
    }
}

/// `{{ (value or "–")|typst_content }}, `.
fn content_or_dash(out: &mut String, value: &Option<String>) {
    content(out, truthy(value).unwrap_or("–"));
}

/// The text of a value the template would take as true (present and not
/// empty).
fn truthy(value: &Option<String>) -> Option<&str> {
    value.as_deref().filter(|t| !t.is_empty())
}

/// `status({{ status|typst_string }}, why: {{ why|typst_string }}),`.
fn status(out: &mut String, status: &str, why: &str) {
    out.push_str("status(\"");
    escape_string_into(status, out);
    out.push_str("\", why: \"");
    escape_string_into(why, out);
    out.push_str("\"),");
}

/// The heading row of a group of rows (a channel), spanning `columns`.
fn group(out: &mut String, group: &Option<String>, columns: &str) {
    if let Some(text) = truthy(group) {
        row(out);
        out.push_str("table.cell(colspan: ");
        out.push_str(columns);
        out.push_str(", fill: none, inset: (top: 5pt, bottom: 2pt, x: 3.5pt), kicker[");
        escape_markup_into(text, out);
        out.push_str("]),");
    }
}

impl TypstRow for NodeRow {
    fn text_length(&self) -> Option<usize> {
        Some(
            n(&self.name)
                + n_opt(&self.channel)
                + n_opt(&self.group)
                + n_opt(&self.label)
                + n(&self.measured)
                + n(&self.corrected)
                + n_opt(&self.expected)
                + n_opt(&self.deviation)
                + n(&self.tolerance)
                + n(&self.status)
                + n(&self.why)
                + self.reason.char_count(),
        )
    }

    fn write_cells(&self, out: &mut String) {
        group(out, &self.group, "8");
        row(out);
        content(out, &self.name);
        content_opt(out, &self.label);
        content(out, &self.measured);
        content(out, &self.corrected);
        content_or_dash(out, &self.expected);
        content_or_dash(out, &self.deviation);
        content(out, &self.tolerance);
        status(out, &self.status, &self.why);
    }
}

impl TypstRow for ValveRow {
    fn text_length(&self) -> Option<usize> {
        Some(
            n(&self.position)
                + n_opt(&self.channel)
                + n_opt(&self.group)
                + n(&self.type_name)
                + n(&self.role)
                + n(&self.bias)
                + n_opt(&self.plate)
                + n_opt(&self.screen)
                + n_opt(&self.cathode)
                + n_opt(&self.grid)
                + n(&self.current_kind)
                + n_opt(&self.current)
                + n_opt(&self.pa)
                + n_opt(&self.pa_max)
                + n_opt(&self.pa_pct)
                + n_opt(&self.pa_nominal_pct)
                + n_opt(&self.pa_high_line_pct)
                + n_opt(&self.pg2)
                + n_opt(&self.pg2_pct)
                + n(&self.status)
                + n(&self.why)
                + self.reason.char_count(),
        )
    }

    fn write_cells(&self, out: &mut String) {
        group(out, &self.group, "13");
        row(out);
        content(out, &self.position);
        content(out, &self.type_name);
        content_or_dash(out, &self.plate);
        content_or_dash(out, &self.screen);
        // The template's line ended in a comma without a space.
        escape_content_into(truthy(&self.cathode).unwrap_or("–"), out);
        out.push(',');
        row(out);
        match truthy(&self.current) {
            Some(current) if self.current_kind == "Ik" => {
                out.push('[');
                escape_markup_into(current, out);
                out.push_str("#text(size: 0.8em, fill: quiet)[ Ik]]");
            }
            current => escape_content_into(current.unwrap_or("–"), out),
        }
        out.push(',');
        row(out);
        content_or_dash(out, &self.pa);
        content_or_dash(out, &self.pa_pct);
        content_or_dash(out, &self.pa_nominal_pct);
        content_or_dash(out, &self.pa_high_line_pct);
        content_or_dash(out, &self.pg2);
        escape_content_into(truthy(&self.pg2_pct).unwrap_or("–"), out);
        out.push(',');
        row(out);
        status(out, &self.status, &self.why);
    }
}

impl TypstRow for WindowRow {
    fn text_length(&self) -> Option<usize> {
        let readings: usize = self
            .readings
            .iter()
            .map(|r| n(&r.range) + n(&r.across) + n_opt(&r.now))
            .sum();
        // `grid_note` is not a template value.
        Some(
            n(&self.position)
                + n(&self.aim)
                + n(&self.plate_current)
                + n_opt(&self.plate_current_now)
                + readings
                + n(&self.place)
                + n_opt(&self.grid_middle)
                + n_opt(&self.grid_now)
                + n_opt(&self.grid_unknown),
        )
    }

    fn write_cells(&self, out: &mut String) {
        row(out);
        content(out, &self.position);
        content(out, &self.aim);
        content(out, &self.plate_current);
        escape_content_into(truthy(&self.plate_current_now).unwrap_or("–"), out);
        out.push(',');
        row(out);
        out.push('[');
        for (i, r) in self.readings.iter().enumerate() {
            if i > 0 {
                out.push_str(" \\ ");
            }
            escape_markup_into(&r.range, out);
            out.push(' ');
            escape_markup_into(&r.across, out);
        }
        if let Some(note) = &self.grid_note {
            out.push_str(" \\ #text(fill: quiet)[");
            escape_markup_into(note, out);
            out.push(']');
        }
        out.push_str("],");
        row(out);
        out.push('[');
        for (i, r) in self.readings.iter().enumerate() {
            if i > 0 {
                out.push_str(" \\ ");
            }
            if let Some(now) = &r.now {
                escape_markup_into(now, out);
            }
        }
        if truthy(&self.grid_middle).is_some() {
            out.push_str(" \\ #text(fill: quiet)[");
            if let Some(now) = &self.grid_now {
                escape_markup_into(now, out);
            }
            out.push(']');
        }
        out.push_str("],");
        row(out);
        escape_content_into(&self.place, out);
        out.push(',');
    }
}

impl TypstRow for ResistorRow {
    fn text_length(&self) -> Option<usize> {
        Some(
            n(&self.reference)
                + n(&self.kind)
                + n(&self.place)
                + n(&self.resistance)
                + n_opt(&self.rating)
                + n(&self.voltage)
                + n(&self.power)
                + n_opt(&self.power_pct)
                + n(&self.high_line_power)
                + n_opt(&self.high_line_pct)
                + n(&self.status)
                + n(&self.why)
                + self.reason.char_count(),
        )
    }

    fn write_cells(&self, out: &mut String) {
        row(out);
        content(out, &self.reference);
        content(out, &self.kind);
        content(out, &self.place);
        content(out, &self.resistance);
        content_or_dash(out, &self.rating);
        content(out, &self.power);
        content_or_dash(out, &self.power_pct);
        content(out, &self.high_line_power);
        content_or_dash(out, &self.high_line_pct);
        status(out, &self.status, &self.why);
    }
}

impl TypstRow for CapacitorRow {
    fn text_length(&self) -> Option<usize> {
        Some(
            n(&self.reference)
                + n(&self.node)
                + n_opt(&self.capacitance)
                + n(&self.rating)
                + n_opt(&self.measured)
                + n_opt(&self.high_line)
                + n_opt(&self.cold_start)
                + n(&self.highest)
                + n(&self.margin)
                + n(&self.status)
                + n(&self.why)
                + self.reason.char_count(),
        )
    }

    fn write_cells(&self, out: &mut String) {
        row(out);
        content(out, &self.reference);
        content(out, &self.node);
        content_or_dash(out, &self.capacitance);
        content(out, &self.rating);
        content_or_dash(out, &self.measured);
        content_or_dash(out, &self.high_line);
        content_or_dash(out, &self.cold_start);
        content(out, &self.highest);
        content(out, &self.margin);
        status(out, &self.status, &self.why);
    }
}

impl TypstRow for HeaterRow {
    fn text_length(&self) -> Option<usize> {
        // `unnamed` is not a template value.
        Some(
            n_opt(&self.label)
                + n(&self.measured)
                + n(&self.nominal)
                + n(&self.deviation)
                + n(&self.corrected)
                + n(&self.corrected_deviation)
                + n(&self.status)
                + n(&self.why)
                + self.reason.char_count(),
        )
    }

    fn write_cells(&self, out: &mut String) {
        row(out);
        out.push('[');
        match truthy(&self.label) {
            Some(label) => escape_markup_into(label, out),
            None => escape_markup_into(&self.unnamed, out),
        }
        out.push_str("], ");
        content(out, &self.measured);
        content(out, &self.nominal);
        content(out, &self.deviation);
        content(out, &self.corrected);
        content(out, &self.corrected_deviation);
        status(out, &self.status, &self.why);
    }
}

#[cfg(test)]
mod tests {
    use minijinja::Value;

    use super::super::{Sentence, WindowReading, grid_note};
    use super::*;
    use crate::catalogue::Catalogue;
    use crate::report::handover::catalogue_functions;
    use crate::typeset::{Rows, TemplateSource, template_environment};

    /// The template's loops over each table, before they became `typst_rows`.
    const LOOPS: &str = include_str!("table_loops.typ");

    #[test]
    fn a_fields_characters_are_counted_as_chars_counts_them() {
        let mut hostile = Hostile(0x5DEE_CE66_D1CE_4E5B);
        for _ in 0..50_000 {
            let text = hostile.text();
            assert_eq!(n(&text), text.chars().count(), "{text:?}");
        }
        for text in [
            "",
            "a",
            "–",
            "Ω µF",
            "\u{10FFFF}\u{7F}\u{80}\u{7FF}\u{800}\u{FFFF}\u{10000}",
        ] {
            assert_eq!(n(text), text.chars().count(), "{text:?}");
        }
    }

    /// Random text from characters every escape treats differently:
    /// markup sigils, quotes and backslashes, spaces at the ends and in
    /// pairs, line ends, controls, variant marks, drawable and undrawable
    /// non-ASCII, and a long run now and then.
    struct Hostile(u64);

    impl Hostile {
        fn next(&mut self) -> u64 {
            self.0 ^= self.0 << 13;
            self.0 ^= self.0 >> 7;
            self.0 ^= self.0 << 17;
            self.0
        }

        fn text(&mut self) -> String {
            const POOL: &str = "aZ09 .%-+#\\*_[]()\"'~$@<>=/`\t\n\r\u{B}\u{7}\u{A0}\u{2009}\u{2028}–−±Ω“”µ\u{200B}\u{AD}\u{FE0F}\u{1F600}\u{10FFFF}\u{4E2D}";
            let pool: Vec<char> = POOL.chars().collect();
            let len = match self.next() % 10 {
                0 => 0,
                1 => 40,
                _ => (self.next() % 12) as usize,
            };
            // Most texts plain, as figures and names are.
            let narrow = self.next() % 3 != 0;
            (0..len)
                .map(|_| {
                    let k = (self.next() % pool.len() as u64) as usize;
                    if narrow { pool[k % 10] } else { pool[k] }
                })
                .collect()
        }

        /// Missing, empty or some text.
        fn maybe(&mut self) -> Option<String> {
            match self.next() % 8 {
                0 | 1 => None,
                2 => Some(String::new()),
                _ => Some(self.text()),
            }
        }

        fn pick<'a>(&mut self, words: &[&'a str]) -> &'a str {
            words[(self.next() % words.len() as u64) as usize]
        }
    }

    fn node(h: &mut Hostile) -> NodeRow {
        NodeRow {
            name: h.text(),
            channel: h.maybe(),
            group: h.maybe(),
            label: h.maybe(),
            measured: h.text(),
            corrected: h.text(),
            expected: h.maybe(),
            deviation: h.maybe(),
            tolerance: h.text(),
            status: h.text(),
            why: h.text(),
            reason: Sentence::new(&h.text()),
        }
    }

    fn valve(h: &mut Hostile) -> ValveRow {
        ValveRow {
            position: h.text(),
            channel: h.maybe(),
            group: h.maybe(),
            type_name: h.text(),
            role: h.text(),
            bias: h.text(),
            plate: h.maybe(),
            screen: h.maybe(),
            cathode: h.maybe(),
            grid: h.maybe(),
            current_kind: h.pick(&["Ik", "Ia", "ik", ""]).to_string(),
            current: h.maybe(),
            pa: h.maybe(),
            pa_max: h.maybe(),
            pa_pct: h.maybe(),
            pa_nominal_pct: h.maybe(),
            pa_high_line_pct: h.maybe(),
            pg2: h.maybe(),
            pg2_pct: h.maybe(),
            status: h.text(),
            why: h.text(),
            reason: Sentence::new(&h.text()),
        }
    }

    fn window(h: &mut Hostile, cat: &Catalogue) -> WindowRow {
        let readings = (0..h.next() % 4)
            .map(|_| WindowReading {
                range: h.text(),
                across: h.text(),
                now: h.maybe(),
            })
            .collect();
        let grid_middle = h.maybe();
        let grid_unknown = h.maybe();
        WindowRow {
            position: h.text(),
            aim: h.text(),
            plate_current: h.text(),
            plate_current_now: h.maybe(),
            readings,
            place: h.text(),
            grid_note: grid_note(&grid_middle, &grid_unknown, cat),
            grid_middle,
            grid_now: h.maybe(),
            grid_unknown,
        }
    }

    fn resistor(h: &mut Hostile) -> ResistorRow {
        ResistorRow {
            reference: h.text(),
            kind: h.text(),
            place: h.text(),
            resistance: h.text(),
            rating: h.maybe(),
            voltage: h.text(),
            power: h.text(),
            power_pct: h.maybe(),
            high_line_power: h.text(),
            high_line_pct: h.maybe(),
            status: h.text(),
            why: h.text(),
            reason: Sentence::new(&h.text()),
        }
    }

    fn capacitor(h: &mut Hostile) -> CapacitorRow {
        CapacitorRow {
            reference: h.text(),
            node: h.text(),
            capacitance: h.maybe(),
            rating: h.text(),
            measured: h.maybe(),
            high_line: h.maybe(),
            cold_start: h.maybe(),
            highest: h.text(),
            margin: h.text(),
            status: h.text(),
            why: h.text(),
            reason: Sentence::new(&h.text()),
        }
    }

    fn heater(h: &mut Hostile, cat: &Catalogue) -> HeaterRow {
        let label = h.maybe();
        HeaterRow {
            unnamed: if label.as_deref().is_some_and(|l| !l.is_empty()) {
                String::new()
            } else {
                cat.text("doc-heater")
            },
            label,
            measured: h.text(),
            nominal: h.text(),
            deviation: h.text(),
            corrected: h.text(),
            corrected_deviation: h.text(),
            status: h.text(),
            why: h.text(),
            reason: Sentence::new(&h.text()),
        }
    }

    static TEMPLATES: &[(&str, &str)] = &[("loops", LOOPS), ("rows", "{{ rows|typst_rows }}")];

    /// The template environment with the old loops, and the catalogue's `t`.
    fn setting(cat: &Catalogue) -> (minijinja::Environment<'static>, Value) {
        let env = template_environment(TemplateSource::embedded(TEMPLATES));
        (env, catalogue_functions(cat).0)
    }

    /// What the old loop printed for `rows` and what `typst_rows` prints.
    fn both<T>(
        (env, t): &(minijinja::Environment<'static>, Value),
        table: &str,
        rows: Vec<T>,
    ) -> (String, String)
    where
        T: serde::Serialize + TypstRow + std::fmt::Debug + Send + Sync + 'static,
    {
        let ctx = minijinja::context! {
            table => table,
            rows => Value::from_serialize(Rows::from(rows)),
            t => t.clone(),
        };
        let render = |name: &str| env.get_template(name).unwrap().render(&ctx).unwrap();
        (render("loops"), render("rows"))
    }

    #[test]
    fn every_table_writes_what_its_template_loop_wrote_for_hostile_text() {
        for language in ["en", "de"] {
            let cat = Catalogue::built_in(language).unwrap();
            let setting = setting(&cat);
            let mut h = Hostile(0x853c_49e6_748f_ea9b ^ language.len() as u64);
            for round in 0..300 {
                let n = (round % 5) as u64;
                macro_rules! check {
                    ($table:literal, $make:expr) => {{
                        let rows: Vec<_> = (0..n).map(|_| $make).collect();
                        let (old, new) = both(&setting, $table, rows.clone());
                        assert_eq!(new, old, "{} {:?}", $table, rows);
                        // The length the list carries (reasons counted, not
                        // made) is the filter's walk of the rows made.
                        let lengths = setting
                            .0
                            .render_str(
                                "{{ rows|text_length }} {{ plain|text_length }}",
                                minijinja::context! {
                                    rows => Value::from_serialize(Rows::from(rows.clone())),
                                    plain => Value::from_serialize(&rows),
                                },
                            )
                            .unwrap();
                        let (carried, walked) = lengths.split_once(' ').unwrap();
                        assert_eq!(carried, walked, "{} {:?}", $table, rows);
                    }};
                }
                check!("nodes", node(&mut h));
                check!("valves", valve(&mut h));
                check!("windows", window(&mut h, &cat));
                check!("resistors", resistor(&mut h));
                check!("capacitors", capacitor(&mut h));
                check!("heaters", heater(&mut h, &cat));
            }
        }
    }

    #[test]
    fn the_cells_of_ordinary_rows_read_as_expected() {
        let cat = Catalogue::english();
        let mut h = Hostile(7);
        let mut n = node(&mut h);
        n.group = None;
        n.name = "B+1".into();
        n.label = None;
        n.measured = "472".into();
        n.corrected = "469".into();
        n.expected = Some("460".into());
        n.deviation = None;
        n.tolerance = "±10 %".into();
        n.status = "ok".into();
        n.why = "say \"why\"".into();
        let (old, new) = both(&setting(cat), "nodes", vec![n]);
        assert_eq!(
            new,
            "\n  \"B+1\", [], \"472\", \"469\", \"460\", \"–\", \"±10 %\", status(\"ok\", why: \"say \\\"why\\\"\"),"
        );
        assert_eq!(new, old);
    }

    #[test]
    fn rows_of_another_kind_are_refused() {
        let env = template_environment(TemplateSource::embedded(TEMPLATES));
        let ctx = minijinja::context! { rows => vec!["a", "b"] };
        let err = env.get_template("rows").unwrap().render(ctx).unwrap_err();
        assert_eq!(
            crate::typeset::template_error_msg(&err).key,
            "cli-template-place"
        );
        assert!(format!("{err:#}").contains("typst_rows"), "{err:#}");
    }
}
