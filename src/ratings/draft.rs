//! A row as written in a ratings file, before it is known whether it adds a
//! new valve type or corrects an existing one. A new type must give every
//! required field; a correction gives only the fields it changes and is laid
//! over the existing row.

use miette::SourceSpan;

use super::class::{RectifierHeating, ValveClass};
use super::diagnostic::RatingProblem;
use super::rating::{Heater, Rating, RatingOrigin};
use crate::units::{Amps, Ohms, Volts, Watts};

/// The figures a `valve` node gave, each `None` when the node left it out.
#[derive(Debug, Clone)]
pub(crate) struct Draft {
    pub name: String,
    /// Where the designation is written (the argument of `valve`).
    pub name_span: SourceSpan,
    pub equivalents: Vec<(String, SourceSpan)>,
    pub class: Option<ValveClass>,
    pub sections: Option<u8>,
    pub plate_dissipation: Option<Watts>,
    pub design_max_plate_dissipation: Option<Watts>,
    pub screen_dissipation: Option<Watts>,
    pub plate_voltage: Option<Volts>,
    pub screen_voltage: Option<Volts>,
    pub cathode_current: Option<Amps>,
    pub output_current: Option<Amps>,
    pub rectifier_heating: Option<RectifierHeating>,
    pub heater: Option<Heater>,
    pub heater_parallel: Option<Heater>,
    pub mu: Option<f64>,
    pub mu_g1g2: Option<f64>,
    pub plate_resistance: Option<Ohms>,
    pub transconductance_ma_per_v: Option<f64>,
    pub source: Option<String>,
    /// The field nodes given, in file order, with the span of each node's
    /// name: used to point at the field a consistency problem is about.
    pub given: Vec<(&'static str, SourceSpan)>,
}

impl Draft {
    /// A draft for `name` that gives no fields yet.
    pub fn new(name: String, name_span: SourceSpan) -> Draft {
        Draft {
            name,
            name_span,
            equivalents: Vec::new(),
            class: None,
            sections: None,
            plate_dissipation: None,
            design_max_plate_dissipation: None,
            screen_dissipation: None,
            plate_voltage: None,
            screen_voltage: None,
            cathode_current: None,
            output_current: None,
            rectifier_heating: None,
            heater: None,
            heater_parallel: None,
            mu: None,
            mu_g1g2: None,
            plate_resistance: None,
            transconductance_ma_per_v: None,
            source: None,
            given: Vec::new(),
        }
    }
}

/// The fields a new valve type cannot do without.
const REQUIRED: [&str; 3] = ["class", "heater", "source"];

impl Draft {
    /// Where to point a problem about `field`: at that field if this node
    /// gave it, otherwise at the designation.
    pub fn span_of(&self, field: &str) -> SourceSpan {
        self.given
            .iter()
            .find(|(f, _)| *f == field)
            .map_or(self.name_span, |(_, s)| *s)
    }

    /// The field words this node gave, in file order, for source notes.
    fn given_words(&self) -> Vec<&'static str> {
        self.given
            .iter()
            .map(|(f, _)| *f)
            .filter(|f| *f != "source")
            .collect()
    }

    /// Turns the draft into a complete new row.
    pub fn into_new_rating(self, origin: RatingOrigin) -> Result<Rating, RatingProblem> {
        let missing: Vec<&str> = REQUIRED
            .into_iter()
            .filter(|f| match *f {
                "class" => self.class.is_none(),
                "heater" => self.heater.is_none(),
                _ => self.source.is_none(),
            })
            .collect();
        let (Some(class), Some(heater), Some(source)) =
            (self.class, self.heater, self.source.clone())
        else {
            return Err(RatingProblem::new(
                format!("valve type {} is new here but has no {}", self.name, missing.join(", no ")),
                self.name_span,
                "not a type already in the table",
            )
            .with_help(format!(
                "a new valve type needs at least class, heater and source; to correct a listed type \
                 instead, check the spelling of \"{}\"",
                self.name
            )));
        };
        Ok(Rating {
            name: self.name,
            equivalents: self.equivalents.into_iter().map(|(e, _)| e).collect(),
            class,
            sections: self.sections.unwrap_or(1),
            plate_dissipation: self.plate_dissipation,
            design_max_plate_dissipation: self.design_max_plate_dissipation,
            screen_dissipation: self.screen_dissipation,
            plate_voltage: self.plate_voltage,
            screen_voltage: self.screen_voltage,
            cathode_current: self.cathode_current,
            output_current: self.output_current,
            rectifier_heating: self.rectifier_heating,
            heater_voltage: heater.voltage,
            heater_current: heater.current,
            heater_parallel: self.heater_parallel,
            mu: self.mu,
            mu_g1g2: self.mu_g1g2,
            plate_resistance: self.plate_resistance,
            transconductance_ma_per_v: self.transconductance_ma_per_v,
            source,
            origin,
        })
    }

    /// Lays the fields this draft gives over `base`. Equivalents are added
    /// to the existing list, never removed. The source note keeps the old
    /// note and says which fields the correction changed.
    pub fn correct(&self, base: &Rating, origin: RatingOrigin) -> Rating {
        let mut row = base.clone();
        for (e, _) in &self.equivalents {
            let key = super::designation::designation_key(e);
            if !row
                .designations()
                .any(|d| super::designation::designation_key(d) == key)
            {
                row.equivalents.push(e.clone());
            }
        }
        fn over<T: Copy>(slot: &mut T, given: Option<T>) {
            if let Some(v) = given {
                *slot = v;
            }
        }
        fn over_opt<T: Copy>(slot: &mut Option<T>, given: Option<T>) {
            if given.is_some() {
                *slot = given;
            }
        }
        over(&mut row.class, self.class);
        over(&mut row.sections, self.sections);
        over_opt(&mut row.plate_dissipation, self.plate_dissipation);
        over_opt(
            &mut row.design_max_plate_dissipation,
            self.design_max_plate_dissipation,
        );
        over_opt(&mut row.screen_dissipation, self.screen_dissipation);
        over_opt(&mut row.plate_voltage, self.plate_voltage);
        over_opt(&mut row.screen_voltage, self.screen_voltage);
        over_opt(&mut row.cathode_current, self.cathode_current);
        over_opt(&mut row.output_current, self.output_current);
        over_opt(&mut row.rectifier_heating, self.rectifier_heating);
        if let Some(h) = self.heater {
            row.heater_voltage = h.voltage;
            row.heater_current = h.current;
        }
        over_opt(&mut row.heater_parallel, self.heater_parallel);
        over_opt(&mut row.mu, self.mu);
        over_opt(&mut row.mu_g1g2, self.mu_g1g2);
        over_opt(&mut row.plate_resistance, self.plate_resistance);
        over_opt(
            &mut row.transconductance_ma_per_v,
            self.transconductance_ma_per_v,
        );
        let fields = self.given_words();
        let changed = if fields.is_empty() {
            "no figures".to_string()
        } else {
            fields.join(", ")
        };
        row.source = match &self.source {
            Some(note) => format!("{}; shop correction of {changed}: {note}", base.source),
            None => format!(
                "{}; shop correction of {changed}: no source given",
                base.source
            ),
        };
        row.origin = origin;
        row
    }
}

/// Checks that a finished row hangs together, pointing each problem at the
/// field of `draft` it is about.
pub(crate) fn check_row(row: &Rating, draft: &Draft) -> Vec<RatingProblem> {
    let mut out = Vec::new();
    let mut need = |present: bool, field: &str, why: &str, example: &str| {
        if !present {
            out.push(
                RatingProblem::new(
                    format!("{} {} has no {field}", row.class, row.name),
                    draft.span_of("class"),
                    why.to_string(),
                )
                .with_help(format!("add {example} inside the braces")),
            );
        }
    };
    if row.class.is_output() {
        need(
            row.plate_dissipation.is_some(),
            "plate-dissipation",
            "output valves are checked against their plate dissipation",
            "plate-dissipation \"25W\"",
        );
        need(
            row.plate_voltage.is_some(),
            "plate-voltage",
            "output valves are checked against their plate voltage",
            "plate-voltage \"500V\"",
        );
    }
    if row.class.is_rectifier() {
        need(
            row.output_current.is_some(),
            "output-current",
            "rectifiers are checked against their output current",
            "output-current \"250mA\"",
        );
        need(
            row.rectifier_heating.is_some(),
            "rectifier-heating",
            "the cold-start check needs to know how the rectifier warms up",
            "rectifier-heating \"direct\" (or \"indirect\")",
        );
    }
    if row.class == ValveClass::PreampTriode {
        need(
            row.mu.is_some(),
            "mu",
            "gain figures need the amplification factor",
            "mu 100",
        );
        need(
            row.plate_resistance.is_some(),
            "plate-resistance",
            "gain figures need the plate resistance",
            "plate-resistance \"62.5k\"",
        );
        need(
            row.transconductance_ma_per_v.is_some(),
            "transconductance",
            "the table lists transconductance for every preamp triode",
            "transconductance \"1.6mA/V\"",
        );
    }

    let mut only = |present: bool, field: &'static str, allowed: bool, who: &str| {
        if present && !allowed {
            let given_here = draft.given.iter().any(|(f, _)| *f == field);
            let (span, help) = if given_here {
                (draft.span_of(field), "remove it, or correct the class")
            } else {
                (
                    draft.span_of("class"),
                    "the listed row has this figure, so check the class given here",
                )
            };
            out.push(
                RatingProblem::new(
                    format!("{field} does not apply to {} {}", row.class, row.name),
                    span,
                    format!("only {who} have this"),
                )
                .with_help(help),
            );
        }
    };
    let rect = row.class.is_rectifier();
    only(
        row.output_current.is_some(),
        "output-current",
        rect,
        "rectifiers",
    );
    only(
        row.rectifier_heating.is_some(),
        "rectifier-heating",
        rect,
        "rectifiers",
    );
    let screen = row.class.has_screen();
    only(
        row.screen_dissipation.is_some(),
        "screen-dissipation",
        screen,
        "pentodes and tetrodes",
    );
    only(
        row.screen_voltage.is_some(),
        "screen-voltage",
        screen,
        "pentodes and tetrodes",
    );
    only(
        row.mu_g1g2.is_some(),
        "mu-g1g2",
        screen,
        "pentodes and tetrodes",
    );

    if let Some(design) = row.design_max_plate_dissipation {
        match row.plate_dissipation {
            None => out.push(
                RatingProblem::new(
                    format!("{} has a design-max plate dissipation but no plate dissipation", row.name),
                    draft.span_of("design-max-plate-dissipation"),
                    "this is extra to the usual rating",
                )
                .with_help("give plate-dissipation as well"),
            ),
            Some(pa) if design < pa => out.push(
                RatingProblem::new(
                    format!("{}: design-max plate dissipation {design} is below the plate dissipation {pa}", row.name),
                    draft.span_of("design-max-plate-dissipation"),
                    "should be at least the plate dissipation",
                )
                .with_help("check which figure is which on the data sheet"),
            ),
            Some(_) => {}
        }
    }
    out
}
