//! The PDF hand-over document: from a job and its findings to a typesetting
//! sandbox (the filled `handover.typ` template as `main.typ`, the charts as
//! SVG, any shop images) and the compile options that make it reproducible.
//! Running typst on it is the caller's business ([`crate::typeset::compile`]).
//!
//! Nothing here reads the clock or the file system, except a shop's own
//! template folder when one is given, so the same job, tool and typst give
//! the same bytes.

mod charges;
mod context;
mod shop_block;

use std::path::Path;

use chrono::NaiveDate;
use minijinja::Value;
use sha2::{Digest, Sha256};

pub use charges::{ChargeRow, ChargesContext, TaxRow, charges_context};
pub use context::{
    AcceptedRow, AttentionContext, CapacitorRow, ChartFile, ContextInputs, CustomerInfo,
    DISSIPATION_PLOT, DocumentInfo, EntryRow, FOOTER_ID_CHARS, Footer, Glance, GlanceRow,
    HandoverContext, HeaterRow, HistoryRow, JobInfo, LineUpRow, MainsInfo, Method, ModFigureRow,
    ModRow, NodeRow, NotCheckedRow, PartRow, Plots, RESPONSE_PLOT, RatingRow, RectifierRow,
    ResistorRow, SUPPLY_PLOT, SafetyContext, SafetyRow, SetContext, SummaryContext, UnitInfo,
    ValveRow, WarmUpContext, WarmUpRow, WindowReading, WindowRow, build_context, chart_part_path,
    date_words, warm_up_plot,
};
pub use context::{
    BenchContext, GainRow, HumNoiseRow, NetworkRow, NetworkView, OscillatorRow, OscillatorView,
    OutputPowerRow, ResponsePointRow, ResponseRow, SuggestionOption, SuggestionRow,
};
pub(crate) use context::{glue_units, pct0, reflow, safety as safety_context, volts, yes_no};
pub use shop_block::{AcceptanceBlock, ShopBlock, WarrantyInfo, acceptance, paper};

use super::network_chart;
use super::plots::{self, PlotError};
use super::response_chart;
use crate::calc::Findings;
use crate::catalogue::{Arg, Catalogue};
use crate::job::Job;
use crate::shop::{Logo, ShopProfile};
use crate::typeset::{
    CompileOptions, InsideError, RequiredText, Sandbox, TemplateSource, TypesetError, font_rules,
    read_regular, template_environment, typst_markup,
};

/// The template the document is rendered from.
pub const TEMPLATE_NAME: &str = "handover.typ";

/// The generated source's name inside the sandbox.
pub const MAIN_SOURCE: &str = "main.typ";

/// Folder of a template override whose files are copied into the sandbox's
/// `images/` folder (a shop's logo, for instance).
pub const IMAGES_DIR: &str = "images";

/// The mains-safety notice and the deferral to local electrical codes: put
/// beside every generated source as built into the program, never taken
/// from a `--templates` folder, so no template can change its words.
pub const NOTICE_SOURCE: &str = "mains-safety.typ";

/// The notice's Typst source as a template: its words come from the
/// message catalogue ([`notice_source`]).
pub const NOTICE_TEMPLATE: &str = include_str!("../../../templates/mains-safety.typ");

/// The line a template must hold to place the notice.
pub const NOTICE_INCLUDE: &str = "#include \"mains-safety.typ\"";

/// What the finished PDF must show, checked in its text: the notice's
/// heading and opening sentence, and the deferral to local codes with its
/// closing sentence. A template that leaves the notice out, hides it or
/// rewrites it is refused. These are the English catalogue's words; a
/// document in another language is checked for its own
/// ([`notice_phrases`]).
pub const NOTICE_PHRASES: &[&str] = &[
    "MAINS SAFETY: READ BEFORE USING OR OPENING THIS UNIT",
    "This amplifier runs on voltages that can kill.",
    "Local electrical codes come first.",
    "Where those rules, or the practice of a licensed electrician, differ from anything in this document, follow them.",
];

/// The phrases of the notice the finished PDF must show, in the
/// catalogue's language: heading, opening sentence, the deferral's title
/// and its closing sentence.
pub fn notice_phrases(catalogue: &Catalogue) -> Vec<String> {
    [
        "notice-heading",
        "notice-check-opening",
        "notice-codes-title",
        "notice-check-closing",
    ]
    .iter()
    .map(|k| catalogue.text(k))
    .collect()
}

/// [`notice_phrases`] as compile options want them.
pub fn notice_required(catalogue: &Catalogue) -> RequiredText {
    RequiredText {
        what: crate::catalogue::Msg::new("cli-typst-notice"),
        phrases: notice_phrases(catalogue),
    }
}

/// The notice's Typst source with its words from `catalogue`, every word
/// escaped for Typst markup.
pub fn notice_source(catalogue: &Catalogue) -> Result<String, HandoverError> {
    let env = template_environment(TemplateSource::embedded(&[(
        NOTICE_SOURCE,
        NOTICE_TEMPLATE,
    )]));
    let fail = |e: minijinja::Error| HandoverError::Template {
        name: NOTICE_SOURCE.to_string(),
        detail: crate::typeset::template_error_msg(&e),
        from_override: false,
    };
    let words: std::collections::BTreeMap<String, String> = crate::catalogue::NOTICE_KEYS
        .iter()
        .map(|k| {
            let name = k.trim_start_matches("notice-").replace('-', "_");
            (name, catalogue.text(k))
        })
        .collect();
    env.get_template(NOTICE_SOURCE)
        .and_then(|t| {
            let title_words: Vec<&str> = words
                .iter()
                .filter(|(k, _)| k.ends_with("_title") && k.as_str() != "codes_title")
                .flat_map(|(_, v)| v.split_whitespace())
                .collect();
            t.render(minijinja::context! { n => words, title_words => title_words })
        })
        .map_err(fail)
}

/// True when a line of `source`, trimmed, is [`NOTICE_INCLUDE`]: the
/// same answer as `source.lines().any(|l| l.trim() == NOTICE_INCLUDE)`,
/// found by searching for the line's text rather than walking every line
/// of a long job's source (5.9 MB and 95,000 lines for a 1,000-set job,
/// where the walk cost two percent of the render).
pub(crate) fn includes_notice(source: &str) -> bool {
    memchr::memmem::find_iter(source.as_bytes(), NOTICE_INCLUDE).any(|at| {
        // The include starts and ends with a character other than
        // whitespace, and matches never overlap (its `#` appears once), so
        // the line is the include when what stands beside it on its line
        // is whitespace only.
        let start = source[..at].rfind('\n').map_or(0, |i| i + 1);
        let after = at + NOTICE_INCLUDE.len();
        let end = source[after..]
            .find('\n')
            .map_or(source.len(), |i| after + i);
        source[start..at].trim().is_empty() && source[after..end].trim().is_empty()
    })
}

/// The built-in templates, for [`TemplateSource::embedded`].
pub static EMBEDDED_TEMPLATES: &[(&str, &str)] = &[
    (
        TEMPLATE_NAME,
        include_str!("../../../templates/handover.typ"),
    ),
    (
        SET_TEMPLATE_NAME,
        include_str!("../../../templates/handover-set.typ"),
    ),
    (
        HISTORY_TEMPLATE_NAME,
        include_str!("../../../templates/handover-history.typ"),
    ),
];

/// The template of one measurement set's section, which [`TEMPLATE_NAME`]
/// fills once for each set (`fill_each`).
pub const SET_TEMPLATE_NAME: &str = "handover-set.typ";

/// The template of what one earlier set showed (under "What needs
/// attention"), which [`TEMPLATE_NAME`] fills once for each earlier set.
pub const HISTORY_TEMPLATE_NAME: &str = "handover-history.typ";

/// The creation date stamped into the PDF when the job gives neither a
/// completion nor a received date: a fixed day, so the bytes still do not
/// depend on when the document was made.
pub const FALLBACK_DATE: (i32, u32, u32) = (2000, 1, 1);

/// Why the document could not be put together.
#[derive(Debug, thiserror::Error)]
pub enum HandoverError {
    /// The template did not render (syntax error, unknown variable …).
    #[error("the template {name} could not be filled: {}", .detail.english())]
    Template {
        name: String,
        /// What went wrong, in catalogue words
        /// ([`crate::typeset::template_error_msg`]).
        detail: crate::catalogue::Msg,
        /// True when the template came from a `--templates` folder.
        from_override: bool,
    },
    #[error(transparent)]
    Plot(#[from] PlotError),
    #[error(transparent)]
    Sandbox(#[from] TypesetError),
    #[error("could not read the shop image {path}: {source}")]
    Image {
        path: String,
        #[source]
        source: std::io::Error,
    },
    /// A file of the template folder that may not be used (a link, a FIFO).
    #[error("refused a file of the template folder: {0}")]
    Refused(#[from] InsideError),
}

/// What the document is made from besides the job itself.
#[derive(Debug, Clone)]
pub struct HandoverInput<'a> {
    pub job: &'a Job,
    pub findings: &'a Findings,
    /// The job file's text, for the footer's checksum.
    pub job_text: &'a str,
    /// The version of the typst that will compile it, for the footer.
    pub typst_version: String,
    /// The shop profile in use, if any.
    pub shop: Option<&'a ShopProfile>,
    /// The profile's checked logo, if it has one.
    pub logo: Option<&'a Logo>,
    /// Whether the job's charges are shown (`--no-charges` leaves them out).
    pub include_charges: bool,
    /// The fixed words of the document, in the shop's language.
    pub catalogue: &'a Catalogue,
    /// Where the job file stands in git, for the footer.
    pub revision: Option<crate::git::Revision>,
    /// The job's photos, checked and prepared ([`crate::photo::prepare`]).
    pub photos: &'a [crate::photo::PreparedPhoto],
}

impl<'a> HandoverInput<'a> {
    /// The input for a job without a shop profile, charges shown.
    pub fn new(
        job: &'a Job,
        findings: &'a Findings,
        job_text: &'a str,
        typst_version: impl Into<String>,
    ) -> Self {
        HandoverInput {
            job,
            findings,
            job_text,
            typst_version: typst_version.into(),
            shop: None,
            logo: None,
            include_charges: true,
            catalogue: Catalogue::english(),
            revision: None,
            photos: &[],
        }
    }
}

/// A ready-to-compile document.
#[derive(Debug, Clone)]
pub struct Document {
    pub sandbox: Sandbox,
    /// The main source inside the sandbox ([`MAIN_SOURCE`]).
    pub main: &'static str,
    pub options: CompileOptions,
    /// The context the template was filled with.
    pub context: HandoverContext,
}

/// The date stamped into the PDF: the job's completion date, else its
/// received date, else [`FALLBACK_DATE`].
pub fn creation_date(job: &Job) -> NaiveDate {
    job.info.completed.or(job.info.received).unwrap_or_else(|| {
        let (y, m, d) = FALLBACK_DATE;
        NaiveDate::from_ymd_opt(y, m, d).expect("the fallback date exists")
    })
}

/// The first 12 hex digits of the SHA-256 of the job file's text.
pub fn job_digest(text: &str) -> String {
    let digest = Sha256::digest(text.as_bytes());
    digest.iter().take(6).map(|b| format!("{b:02x}")).collect()
}

/// [`job_digest`] of `text`, the job file's text the findings were made
/// from: taken from the findings' SHA-256 of the file when the command
/// that read it stamped them (`cli::load::stamp_from`, from the same
/// text), else worked out. A long job's text hashed a second time was
/// about 2 % of a 1,000-set render's own instructions.
pub(crate) fn job_digest_of(findings: &crate::calc::Findings, text: &str) -> String {
    match findings.job.file_sha256.as_deref() {
        Some(full) if full.len() == 64 && full.is_ascii() => full[..12].to_string(),
        _ => job_digest(text),
    }
}

/// The `typst compile` command that turns a folder written by
/// [`crate::typeset::emit_source`] into the same PDF ampreport makes.
pub fn compile_command(dir: &Path, options: &CompileOptions, output: &Path) -> String {
    let d = dir.display();
    let mut cmd = format!(
        "typst compile --root {d} --font-path {d}/fonts{} --ignore-system-fonts --ignore-embedded-fonts \
         --creation-timestamp {}",
        if options.cjk {
            format!(" --font-path {d}/fonts-cjk")
        } else {
            String::new()
        },
        options.creation_timestamp()
    );
    if let Some(threads) = options.threads {
        cmd.push_str(&format!(" --jobs {threads}"));
    }
    if let Some(standard) = &options.pdf_standard {
        cmd.push_str(&format!(" --pdf-standard {standard}"));
    }
    cmd.push_str(&format!(" {d}/{MAIN_SOURCE} {}", output.display()));
    cmd
}

/// `draw` of each part of a chart, in order: on every core (rayon) when
/// there are several, on this thread when there is one, as for a short
/// job, where handing it out would start rayon's pool of threads (each
/// with its own heap and its idle spinning) for nothing. Each thread
/// draws its parts with one `plots::ChartCache`.
fn each_part<P: Sync, T: Send, E: Send>(
    parts: &[P],
    draw: impl Fn(&mut plots::ChartCache, &P) -> Result<T, E> + Sync + Send,
) -> Result<Vec<T>, E> {
    use rayon::prelude::*;
    if parts.len() > 1 {
        parts
            .par_iter()
            .map_init(plots::ChartCache::default, draw)
            .collect()
    } else {
        let mut cache = plots::ChartCache::default();
        parts.iter().map(|part| draw(&mut cache, part)).collect()
    }
}

/// Builds the context and the charts, fills the template and lays out the
/// sandbox.
pub fn build(
    input: &HandoverInput<'_>,
    templates: &TemplateSource,
) -> Result<Document, HandoverError> {
    let mut sandbox = Sandbox::new();
    // A long job's charts come in many parts (a few sets each), each drawn
    // on its own: they are drawn on every core and put in the sandbox in
    // their order, the same files as one after the other.
    let mut dissipation_charts = Vec::new();
    if let Some(chart) = plots::dissipation_chart(input.findings, input.catalogue) {
        let parts = plots::split_dissipation(&chart);
        let svgs = each_part(&parts, |cache, part| {
            let svg = plots::dissipation_svg_with(&part.chart, cache)?;
            Ok::<_, PlotError>((svg, cache.last_plain()))
        })?;
        for (i, (part, (svg, plain))) in parts.into_iter().zip(svgs).enumerate() {
            let path = chart_part_path(DISSIPATION_PLOT, i);
            sandbox.insert_plain_chart(&path, svg, plain)?;
            dissipation_charts.push(ChartFile {
                path,
                part: part.part,
            });
        }
    }
    let mut supply_charts = Vec::new();
    if let Some(chart) = plots::supply_chart(input.findings, input.catalogue) {
        let parts = plots::split_supply(&chart);
        let svgs = each_part(&parts, |cache, part| {
            let svg = plots::supply_svg_with(&part.chart, cache)?;
            Ok::<_, PlotError>((svg, cache.last_plain()))
        })?;
        for (i, (part, (svg, plain))) in parts.into_iter().zip(svgs).enumerate() {
            let path = chart_part_path(SUPPLY_PLOT, i);
            sandbox.insert_plain_chart(&path, svg, plain)?;
            supply_charts.push(ChartFile {
                path,
                part: part.part,
            });
        }
    }
    let mut response_charts = Vec::new();
    if let Some(chart) = response_chart::response_chart(input.findings, input.catalogue) {
        for (i, part) in response_chart::split_response(&chart)
            .into_iter()
            .enumerate()
        {
            let path = chart_part_path(RESPONSE_PLOT, i);
            sandbox.insert(&path, response_chart::response_svg(&part.chart)?)?;
            response_charts.push(ChartFile {
                path,
                part: part.part,
            });
        }
    }
    for (i, m) in input.findings.mods.iter().enumerate() {
        if let Some(chart) = m
            .network
            .as_ref()
            .and_then(|n| network_chart::response_chart(n, input.catalogue))
        {
            sandbox.insert(
                context::network_plot_path(i),
                network_chart::response_svg(&chart)?,
            )?;
        }
    }
    let mut warm_up_plots = Vec::new();
    for (i, set) in input.findings.sets.iter().enumerate() {
        if let Some(chart) = plots::warm_up_chart(set, input.catalogue) {
            sandbox.insert(warm_up_plot(i), plots::warm_up_svg(&chart)?)?;
            warm_up_plots.push(i);
        }
    }
    let digest = job_digest_of(input.findings, input.job_text);
    let shop = match input.shop {
        Some(profile) => ShopBlock::from_profile(profile, input.logo),
        None => ShopBlock::default(),
    };
    if let (Some(logo), Some(_)) = (input.logo, input.shop) {
        sandbox.insert(logo.sandbox_path(), logo.bytes.clone())?;
    }
    for photo in input.photos {
        sandbox.insert(photo.sandbox_path.clone(), photo.bytes.clone())?;
    }
    let inputs = ContextInputs {
        shop,
        profile: input.shop,
        include_charges: input.include_charges,
        tool_version: env!("CARGO_PKG_VERSION"),
        typst_version: &input.typst_version,
        job_digest: &digest,
        dissipation_charts,
        supply_charts,
        revision: input.revision.as_ref(),
        photos: crate::report::photos::photo_rows(input.photos),
        warm_up_plots,
        response_charts,
        catalogue: input.catalogue,
    };
    let context = build_context(input.job, input.findings, &inputs);
    let source = render_template(&context, templates)?;
    if !includes_notice(&source) {
        return Err(HandoverError::Template {
            name: TEMPLATE_NAME.to_string(),
            detail: crate::catalogue::Msg::new("cli-template-no-notice")
                .arg("what", "document")
                .arg("line", NOTICE_INCLUDE),
            from_override: templates.from_override(TEMPLATE_NAME),
        });
    }
    sandbox.insert(MAIN_SOURCE, source)?;
    sandbox.insert(NOTICE_SOURCE, notice_source(input.catalogue)?)?;
    if let Some(dir) = &templates.override_dir {
        add_shop_images(&mut sandbox, &dir.join(IMAGES_DIR))?;
    }
    let cjk = crate::typeset::fit_fonts(&mut sandbox, MAIN_SOURCE)?;
    Ok(Document {
        sandbox,
        main: MAIN_SOURCE,
        options: CompileOptions {
            cjk,
            required_text: Some(notice_required(input.catalogue)),
            ..CompileOptions::new(creation_date(input.job))
        },
        context,
    })
}

/// Fills [`TEMPLATE_NAME`] with `context`. The template also gets
/// `font_rules`, the set rules selecting the bundled fonts.
pub fn render_template(
    context: &HandoverContext,
    templates: &TemplateSource,
) -> Result<String, HandoverError> {
    let room = FILL_ROOM_BASE + FILL_ROOM_PER_SET * context.sets.len();
    fill_template(TEMPLATE_NAME, context, &context.catalogue, templates, room)
}

/// Room made for the filled hand-over before the fill starts: the built-in
/// template writes some 40–50 KiB for a demo job and about 6 KiB more per
/// measurement set (5.9 MB for 1,000 sets). Growing the text by doubling
/// instead copied it again at each step into memory touched for the first
/// time (about a sixth of a 1,000-set render's page faults); room a
/// shop's longer template needs beyond this is still made by doubling.
/// Memory reserved and never written costs no page.
const FILL_ROOM_BASE: usize = 64 * 1024;
/// See [`FILL_ROOM_BASE`].
const FILL_ROOM_PER_SET: usize = 8 * 1024;

/// The room of a fill from which [`fill_template`] lets the template's
/// values go on a pool thread: a hand-over of
/// [`PARALLEL_PARTS`](crate::typeset::PARALLEL_PARTS) sets
/// or more, the length from which its sets are filled on every core too.
const LET_GO_ELSEWHERE_FROM: usize =
    FILL_ROOM_BASE + crate::typeset::PARALLEL_PARTS * FILL_ROOM_PER_SET;

/// Fills the template `name` (built in, or from a `--templates` folder)
/// with `context`, `font_rules` and the catalogue's `t` and `tm`; shared by the hand-over and the
/// listing. `room`: the bytes to make room for before the fill starts
/// (the text grows beyond it as needed).
pub(crate) fn fill_template(
    name: &str,
    context: &impl serde::Serialize,
    catalogue: &Catalogue,
    templates: &TemplateSource,
    room: usize,
) -> Result<String, HandoverError> {
    let from_override = templates.from_override(name);
    let env = template_environment(templates.clone());
    let fail = |e: minijinja::Error| HandoverError::Template {
        name: name.to_string(),
        detail: crate::typeset::template_error_msg(&e),
        from_override,
    };
    let template = env.get_template(name).map_err(fail)?;
    let (t, tm) = catalogue_functions(catalogue);
    let base = minijinja::context! {
        font_rules => typst_markup(font_rules()),
        t => t,
        tm => tm,
        ..Value::from_serialize(context)
    };
    let ctx = minijinja::context! {
        fill_each => crate::typeset::fill_each(base.clone()),
        ..base
    };
    let mut filled = Vec::new();
    // Only asked for: a hostile job of half a million empty sets would
    // ask for gigabytes, which a process under a memory limit cannot
    // have; the text then grows as it is written.
    let _ = filled.try_reserve_exact(room);
    template
        .render_captured_to(&ctx, &mut filled)
        .map_err(fail)?;
    // A long document's template values (a 1,000-set job's are a million
    // small pieces, some 20 million instructions to free) are let go on a
    // pool thread, idle by now, rather than before the document can go
    // on; a short one's are let go here, without starting the pool.
    if room >= LET_GO_ELSEWHERE_FROM {
        rayon::spawn(move || drop(ctx));
    } else {
        drop(ctx);
    }
    // minijinja writes only `&str` pieces, so the bytes are text; checked
    // all the same rather than assumed (a long text in pieces on every
    // core).
    crate::typeset::text_from_bytes(filled).map_err(|e| {
        fail(minijinja::Error::new(
            minijinja::ErrorKind::WriteFailure,
            format!("the filled template is not UTF-8: {e}"),
        ))
    })
}

/// `value.as_i64()`, asked only of the kinds that can give a number (a
/// number or a boolean): for any other kind `as_i64` builds an error to
/// throw away, and a long job's sentences pass thousands of strings.
fn whole_number(value: &Value) -> Option<i64> {
    match value.kind() {
        minijinja::value::ValueKind::Number | minijinja::value::ValueKind::Bool => value.as_i64(),
        _ => None,
    }
}

/// The template functions that look words up in the catalogue:
///
/// * `t("key", name=value, …)`: the message as text, escaped for Typst
///   like any other value, so a translation can never inject markup;
/// * `tm("key", …)`: the same, except that `*…*` in the message itself
///   (never in an argument) marks strong text.
///
/// A key the catalogue lacks is a template error naming it.
pub fn catalogue_functions(catalogue: &Catalogue) -> (Value, Value) {
    fn lookup(
        catalogue: &Catalogue,
        key: &str,
        kwargs: &minijinja::value::Kwargs,
        placeholders: bool,
    ) -> Result<(String, Vec<String>), minijinja::Error> {
        let mut args = Vec::new();
        let mut values = Vec::new();
        // Every argument is read here, so none can go unused: `peek`
        // rather than `get`, which notes each name in a set of its own to
        // be checked afterwards (a long job asks for thousands of
        // sentences with arguments).
        for name in kwargs.args() {
            let value: Value = kwargs.peek(name)?;
            // A string's text as it is, without the formatting machinery.
            let text = |value: &Value| match value.as_str() {
                Some(s) => s.to_owned(),
                None => value.to_string(),
            };
            let arg = if placeholders {
                values.push(text(&value));
                Arg::Text(format!("QzqArg{}Qzq", values.len() - 1))
            } else if let Some(n) = whole_number(&value) {
                Arg::Number(n as f64)
            } else {
                Arg::Text(text(&value))
            };
            args.push((name, arg));
        }
        match catalogue.try_format(key, &args) {
            Some(words) => Ok((words, values)),
            None => Err(crate::typeset::refusal(
                minijinja::ErrorKind::InvalidOperation,
                crate::catalogue::Msg::new("cli-template-no-message")
                    .arg("language", catalogue.language())
                    .arg("origin", catalogue.origin())
                    .arg("key", key),
            )),
        }
    }
    let plain = catalogue.clone();
    // A message without arguments says the same every time: a long job's
    // tables ask for each column heading once per set, so each is worked
    // out once and kept.
    // (kept as template values, which share their text when copied).
    let said: std::sync::Mutex<std::collections::HashMap<String, Value>> = Default::default();
    let t = Value::from_function(
        move |key: &str, kwargs: minijinja::value::Kwargs| -> Result<Value, minijinja::Error> {
            let plain_key = kwargs.args().next().is_none();
            if plain_key && let Some(words) = said.lock().ok().and_then(|m| m.get(key).cloned()) {
                return Ok(words);
            }
            let words = Value::from(lookup(&plain, key, &kwargs, false).map(|(words, _)| words)?);
            if plain_key && let Ok(mut m) = said.lock() {
                m.insert(key.to_string(), words.clone());
            }
            Ok(words)
        },
    );
    let strong = catalogue.clone();
    let tm = Value::from_function(
        move |key: &str, kwargs: minijinja::value::Kwargs| -> Result<Value, minijinja::Error> {
            let (words, values) = lookup(&strong, key, &kwargs, true)?;
            let mut markup = crate::typeset::escape_markup(&words).replace("\\*", "*");
            for (i, v) in values.iter().enumerate() {
                markup =
                    markup.replace(&format!("QzqArg{i}Qzq"), &crate::typeset::escape_markup(v));
            }
            Ok(typst_markup(markup))
        },
    );
    (t, tm)
}

/// Copies the files of a shop's `images/` folder into the sandbox, in name
/// order. A missing folder is not an error; sub-folders are not copied. A
/// symbolic link, a FIFO or a device is refused by name, so nothing from
/// outside the template folder reaches the document.
fn add_shop_images(sandbox: &mut Sandbox, dir: &Path) -> Result<(), HandoverError> {
    let image_error = |path: &Path, source: std::io::Error| HandoverError::Image {
        path: path.display().to_string(),
        source,
    };
    match std::fs::symlink_metadata(dir) {
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Ok(()),
        Err(e) => return Err(image_error(dir, e)),
        Ok(meta) if meta.file_type().is_symlink() => {
            return Err(HandoverError::Refused(InsideError::Link {
                path: dir.to_path_buf(),
            }));
        }
        Ok(_) => {}
    }
    let entries = std::fs::read_dir(dir).map_err(|e| image_error(dir, e))?;
    let mut files: Vec<(String, std::path::PathBuf)> = Vec::new();
    for entry in entries {
        let entry = entry.map_err(|e| image_error(dir, e))?;
        let path = entry.path();
        let kind = entry.file_type().map_err(|e| image_error(&path, e))?;
        if kind.is_dir() {
            continue;
        }
        let Some(name) = path.file_name().and_then(|n| n.to_str()) else {
            continue;
        };
        if kind.is_symlink() {
            return Err(HandoverError::Refused(InsideError::Link { path }));
        }
        if !kind.is_file() {
            return Err(HandoverError::Refused(InsideError::NotAFile { path }));
        }
        files.push((name.to_string(), path));
    }
    files.sort();
    for (name, path) in files {
        let bytes = read_regular(&path)?;
        sandbox
            .insert(format!("{IMAGES_DIR}/{name}"), bytes)
            .map_err(|e| image_error(&path, std::io::Error::other(e.to_string())))?;
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::Family;
    use crate::ratings::RatingsTable;

    #[test]
    fn a_whole_number_is_what_as_i64_gives() {
        use std::collections::BTreeMap;
        let mut values = vec![
            Value::from(0),
            Value::from(-17),
            Value::from(i64::MAX),
            Value::from(u64::MAX),
            Value::from(i128::MIN),
            Value::from(3.0),
            Value::from(3.5),
            Value::from(-0.0),
            Value::from(f64::NAN),
            Value::from(1e300),
            Value::from(true),
            Value::from(false),
            Value::from(()),
            Value::UNDEFINED,
            Value::from(vec![1, 2]),
            Value::from(BTreeMap::from([("a", 1)])),
            Value::from_bytes(b"12".to_vec()),
            Value::from_safe_string("5".into()),
        ];
        for text in ["", "12", "-3", "1.0", "V3", " 4", "0x10", "true"] {
            values.push(Value::from(text));
        }
        for value in &values {
            assert_eq!(whole_number(value), value.as_i64(), "{value:?}");
        }
    }

    /// A demo job decoded and derived, with its text.
    fn demo(name: &str) -> (Job, Findings, String) {
        let path = Path::new(env!("CARGO_MANIFEST_DIR"))
            .join("jobs")
            .join(name);
        let text = std::fs::read_to_string(path).unwrap();
        let ratings = RatingsTable::builtin();
        let job = crate::job::decode_with_ratings(name, &text, &ratings)
            .unwrap()
            .job;
        let findings = crate::calc::derive(&job, &ratings);
        (job, findings, text)
    }

    fn document(job: &Job, findings: &Findings, text: &str) -> Document {
        let input = HandoverInput::new(job, findings, text, "0.15.1");
        build(&input, &TemplateSource::embedded(EMBEDDED_TEMPLATES)).unwrap()
    }

    #[test]
    fn the_context_carries_the_calculated_figures() {
        let (job, findings, text) = demo("combo-el84-cathode.kdl");
        let doc = document(&job, &findings, &text);
        let ctx = &doc.context;
        for (set, found) in ctx.sets.iter().zip(&findings.sets) {
            for (row, v) in set.valves.iter().zip(&found.valves) {
                assert_eq!(row.pa, v.plate_dissipation_w.map(|w| format!("{w:.1}")));
            }
        }
        // Pa = (Va − Vk) · Ik = (338 − 11.6) V × 11.6 V / (2 × 130 Ω) = 14.56 W
        // (Joule's and Ohm's laws; the demo job's readings).
        assert_eq!(ctx.sets[0].valves[0].pa.as_deref(), Some("14.6"));
        assert_eq!(ctx.sets[0].valves[0].current_kind, "Ik");
        assert!(ctx.sets[0].conservative);
        assert!(ctx.method.uses_shared_cathode && ctx.method.uses_cathode_bias);
        assert_eq!(ctx.glance.families.len(), Family::ALL.len());
        assert_eq!(ctx.footer.job_digest, job_digest(&text));
        // Completed 2026-11-09.
        assert_eq!(
            doc.options.creation,
            NaiveDate::from_ymd_opt(2026, 11, 9).unwrap()
        );
        let names: Vec<&str> = doc.sandbox.files().map(|(p, _)| p).collect();
        assert_eq!(
            names,
            [
                MAIN_SOURCE,
                NOTICE_SOURCE,
                RESPONSE_PLOT,
                DISSIPATION_PLOT,
                SUPPLY_PLOT
            ]
        );
        let notice = notice_source(Catalogue::english()).unwrap();
        assert_eq!(doc.sandbox.get(NOTICE_SOURCE), Some(notice.as_bytes()));
    }

    #[test]
    fn mod_figures_and_the_rectifier_load_reach_the_context_and_the_source() {
        let (job, findings, text) = demo("combo-6v6-fixed.kdl");
        let doc = document(&job, &findings, &text);
        let ctx = &doc.context;
        assert_eq!(ctx.mods.len(), 3);
        assert!(ctx.mods[0].figures.is_empty());
        assert!(ctx.mods[1].network.is_none());
        let figures = &ctx.mods[1].figures;
        assert_eq!(figures.len(), 3);
        // fc = 1 / (2π · (Rk ∥ (ra + RL)/(μ + 1)) · Ck) with Rk 1.5 kΩ, RL 100 kΩ,
        // Ck 0.68 µF and the 12AX7's μ 100, ra 62.5 kΩ: 1/(2π · 776.2 Ω · 0.68 µF)
        // = 301.5 Hz (textbook cathode-bypass corner; valve figures from memory
        // of manufacturer data).
        assert_eq!(figures[0].kind, "cathode-bypass corner");
        assert_eq!(figures[0].value.as_deref(), Some("302 Hz"));
        assert!(
            figures[0].description.contains("302\u{a0}Hz"),
            "{}",
            figures[0].description
        );
        // A = μ·RL/(RL + ra) = 100 × 100k / 162.5k = 61.5; unbypassed
        // A = μ·RL/(RL + ra + (μ + 1)·Rk) = 31.8 (textbook stage gain).
        assert_eq!(figures[1].value.as_deref(), Some("62"));
        assert_eq!(figures[2].value.as_deref(), Some("32"));
        assert_eq!(figures[2].formula, "A = μ·RL / (RL + ra + (μ + 1)·Rk)");

        // As found: 38.5 mV and 37.9 mV across 1 Ω sense resistors are
        // 38.5 + 37.9 = 76.4 mA of cathode current (Ohm's law); the 5Y3GT is
        // rated 125 mA (from memory of manufacturer data).
        let r = ctx.sets[0].rectifier.as_ref().expect("a valve rectifier");
        assert_eq!(
            (r.position.as_str(), r.load.as_str(), r.rating.as_str()),
            ("V5", "76.4 mA", "125 mA")
        );
        assert_eq!(r.load_pct, "61");
        assert_eq!(r.counted, "cathode currents of V3, V4");
        assert_eq!(r.status, "ok");
        assert!(ctx.sets[1].rectifier.is_some());

        // The filled template carries all of it (escaped for Typst).
        let source = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        for f in figures {
            let formula = crate::typeset::escape_markup(&f.formula);
            assert!(source.contains(&formula), "formula {formula} missing");
            let description = crate::typeset::escape_markup(&f.description);
            assert!(source.contains(&description), "{description} missing");
        }
        assert!(source.contains("Worked figures"));
        // Table cells holding one value are string literals where that
        // prints the same (`typst_content`).
        assert!(source.contains("\"76.4 mA\"") && source.contains("\"53.6 mA\""));
        assert!(source.contains(&crate::typeset::escape_content(
            "cathode currents of V3, V4"
        )));

        // A job whose rectifier is silicon has no rectifier row.
        let (job, findings, text) = demo("head-el34-quad.kdl");
        let doc = document(&job, &findings, &text);
        assert!(doc.context.sets.iter().all(|s| s.rectifier.is_none()));
    }

    #[test]
    fn a_mods_network_reaches_the_document_with_its_chart_and_figures() {
        let (job, findings, text) = demo("combo-6v6-fixed.kdl");
        let doc = document(&job, &findings, &text);
        let view = doc.context.mods[2]
            .network
            .as_ref()
            .expect("the tone network");
        let net = findings.mods[2].network.as_ref().unwrap();
        assert_eq!(view.plot.as_deref(), Some("plots/network-mod-3.svg"));
        let svg = doc
            .sandbox
            .get("plots/network-mod-3.svg")
            .expect("the chart");
        assert!(String::from_utf8_lossy(svg).contains("before the mod"));
        // Two settings, each a before, an after and a change row.
        assert_eq!(view.rows.len(), 6);
        let kinds: Vec<&str> = view.rows.iter().map(|r| r.kind.as_str()).collect();
        assert_eq!(
            kinds,
            ["before", "after", "change", "before", "after", "change"]
        );
        // The figures are calc's, to one decimal.
        let one = |v: f64| {
            format!(
                "{}\u{a0}dB",
                crate::units::format_fixed(v, 1).replace('-', "\u{2212}")
            )
        };
        assert_eq!(view.rows[0].at_1khz, one(net.curves[0].gain_1khz_db));
        assert_eq!(view.rows[4].at_5khz, one(net.curves[3].gain_5khz_db));
        assert!(
            view.rows[2].at_100hz.starts_with('+'),
            "{}",
            view.rows[2].at_100hz
        );
        assert_eq!(view.rows[0].setting, "1: treble 4, bass 6, middle 5");
        assert_eq!(
            view.edits,
            [
                "C5 250\u{a0}pF → 470\u{a0}pF",
                "R5 100\u{a0}kΩ → 56\u{a0}kΩ"
            ]
        );
        let source = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        assert!(source.contains("plots/network-mod-3.svg"));
        assert!(
            source.contains("Pot settings \\(0–10\\)") || source.contains("Pot settings (0–10)")
        );
        assert!(source.contains(&crate::typeset::escape_content(&view.rows[3].feature)));
    }

    #[test]
    fn charges_reach_the_hand_over_only_when_asked_for() {
        let (job, findings, text) = demo("combo-6v6-fixed.kdl");
        let doc = document(&job, &findings, &text);
        let c = doc
            .context
            .charges
            .as_ref()
            .expect("the demo job has charges");
        // By hand: labour 1.5 h × 48.00 = 72.00, 0.75 h × 48.00 = 36.00,
        // fixed 15.00 → 123.00; parts 7.85 + 1.20 + 2.35 = 11.40; subtotal
        // 134.40. Decoded without the shop profile, so no tax: total 134.40.
        assert_eq!(c.currency, "GBP");
        assert_eq!(
            c.labour
                .iter()
                .map(|l| l.amount.as_str())
                .collect::<Vec<_>>(),
            ["72.00", "36.00", "15.00"]
        );
        assert_eq!(c.labour[0].quantity.as_deref(), Some("1.5 h"));
        assert_eq!(c.labour[0].rate.as_deref(), Some("48.00 per hour"));
        assert_eq!(c.labour[2].quantity, None);
        assert_eq!(
            (c.labour_total.as_str(), c.parts_total.as_str()),
            ("123.00", "11.40")
        );
        assert_eq!(
            (c.subtotal.as_str(), c.total.as_str()),
            ("134.40", "134.40")
        );
        assert!(c.tax.is_none());
        let source = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        assert!(source.contains("134\\.40") && source.contains("= Charges"));

        // --no-charges: nothing of them in the context or the source.
        let input = HandoverInput {
            include_charges: false,
            ..HandoverInput::new(&job, &findings, &text, "0.15.1")
        };
        let doc = build(&input, &TemplateSource::embedded(EMBEDDED_TEMPLATES)).unwrap();
        assert!(doc.context.charges.is_none());
        let source = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        assert!(!source.contains("134\\.40") && !source.contains("= Charges"));
    }

    #[test]
    fn user_text_reaches_the_source_only_escaped() {
        let (mut job, _, text) = demo("combo-6v6-fixed.kdl");
        job.complaint = Some("#read(\"/etc/passwd\") $x$ <l> @r // c".into());
        job.unit.model = "*bold* #include \"x\"".into();
        let ratings = RatingsTable::builtin();
        let findings = crate::calc::derive(&job, &ratings);
        let doc = document(&job, &findings, &text);
        let source = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        assert!(
            source.contains("\\#read\\(\\\"\\/etc\\/passwd\\\"\\)"),
            "escaped complaint missing"
        );
        assert!(!source.contains("#read("));
        assert!(!source.contains("#include \"x\""));
        assert!(source.contains("\\*bold\\* \\#include"));
    }

    #[test]
    fn the_creation_date_falls_back_to_received_then_a_fixed_day() {
        let (mut job, _, _) = demo("combo-6v6-fixed.kdl");
        assert_eq!(
            creation_date(&job),
            NaiveDate::from_ymd_opt(2026, 11, 12).unwrap()
        );
        job.info.completed = None;
        assert_eq!(
            creation_date(&job),
            NaiveDate::from_ymd_opt(2026, 11, 5).unwrap()
        );
        job.info.received = None;
        assert_eq!(
            creation_date(&job),
            NaiveDate::from_ymd_opt(2000, 1, 1).unwrap()
        );
    }

    #[test]
    fn a_broken_shop_template_is_the_shops_fault() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(dir.path().join(TEMPLATE_NAME), "{{ no_such_thing }}").unwrap();
        let (job, findings, text) = demo("combo-el84-cathode.kdl");
        let input = HandoverInput::new(&job, &findings, &text, "0.15.1");
        let source = TemplateSource::embedded(EMBEDDED_TEMPLATES).with_override_dir(dir.path());
        match build(&input, &source) {
            Err(HandoverError::Template {
                from_override,
                detail,
                ..
            }) => {
                assert!(from_override);
                let detail = detail.english();
                assert!(
                    detail.contains("no_such_thing") || detail.contains("undefined"),
                    "{detail}"
                );
            }
            other => panic!("expected a template error, got {other:?}"),
        }
    }

    #[test]
    fn the_checked_phrases_are_the_notices_own_words() {
        // The English catalogue's notice is the one the stand-in typst
        // programs of the fault tests print.
        assert_eq!(notice_phrases(Catalogue::english()), NOTICE_PHRASES);
        for tag in ["en", "de"] {
            let catalogue = Catalogue::built_in(tag).unwrap();
            let source = notice_source(&catalogue).unwrap();
            for phrase in notice_phrases(&catalogue) {
                // Each phrase is in the notice's source, escaped for Typst.
                let escaped = crate::typeset::escape_markup(&phrase);
                assert!(
                    source.contains(&escaped),
                    "{tag}: {phrase} is not in the notice"
                );
            }
            // Every part of the notice is filled.
            for key in crate::catalogue::NOTICE_KEYS
                .iter()
                .filter(|k| !k.ends_with("-opening") && !k.ends_with("-closing"))
            {
                let words = crate::typeset::escape_markup(&catalogue.text(key));
                assert!(source.contains(&words), "{tag}: {key} missing");
            }
        }
        assert!(!notice_source(Catalogue::english()).unwrap().contains("{{"));
    }

    #[test]
    fn a_german_catalogue_fills_the_template_and_the_notice() {
        let (job, findings, text) = demo("combo-6v6-fixed.kdl");
        let german = Catalogue::built_in("de").unwrap();
        let input = HandoverInput {
            catalogue: &german,
            ..HandoverInput::new(&job, &findings, &text, "0.15.1")
        };
        let doc = build(&input, &TemplateSource::embedded(EMBEDDED_TEMPLATES)).unwrap();
        let source = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        assert!(source.contains("lang: \"de\""));
        for words in [
            "Röhrenbestückung",
            "Methode und Annahmen",
            "Übergabe",
            "Zwischensumme",
        ] {
            assert!(source.contains(words), "{words} missing");
        }
        // Completed 12 November 2026, in German.
        assert_eq!(
            doc.context.job.completed.as_deref(),
            Some("12. November 2026")
        );
        for english in ["Valve line-up", "Method and assumptions", "Subtotal"] {
            assert!(!source.contains(english), "{english} left in English");
        }
        let notice = String::from_utf8(doc.sandbox.get(NOTICE_SOURCE).unwrap().to_vec()).unwrap();
        assert!(notice.contains("NETZSICHERHEIT"));
        assert_eq!(
            doc.options.required_text.as_ref().unwrap().phrases,
            notice_phrases(&german)
        );
    }

    #[test]
    fn a_template_asking_for_an_unknown_message_is_refused_naming_it() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(
            dir.path().join(TEMPLATE_NAME),
            "{{ t(\"doc-no-such-label\") }}\n#include \"mains-safety.typ\"\n",
        )
        .unwrap();
        let (job, findings, text) = demo("combo-el84-cathode.kdl");
        let input = HandoverInput::new(&job, &findings, &text, "0.15.1");
        let source = TemplateSource::embedded(EMBEDDED_TEMPLATES).with_override_dir(dir.path());
        match build(&input, &source) {
            Err(HandoverError::Template { detail, .. }) => {
                let detail = detail.english();
                assert!(
                    detail.contains("no message `doc-no-such-label`"),
                    "{detail}"
                );
            }
            other => panic!("expected a template error, got {other:?}"),
        }
    }

    #[test]
    fn a_shops_set_section_replaces_the_built_in_one_for_every_set() {
        // Only `handover-set.typ` in the folder: the built-in hand-over
        // fills the shop's section once for each set, in order, with the
        // heading words handover.typ passes, and an error in it names it.
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(
            dir.path().join(SET_TEMPLATE_NAME),
            "\n\n= Shop set {{ set.label }} ({{ w_supply }}, {{ unit.model }})",
        )
        .unwrap();
        let (job, findings, text) = demo("head-el34-quad.kdl");
        let input = HandoverInput::new(&job, &findings, &text, "0.15.1");
        let source = TemplateSource::embedded(EMBEDDED_TEMPLATES).with_override_dir(dir.path());
        let doc = build(&input, &source).unwrap();
        let main = String::from_utf8(doc.sandbox.get(MAIN_SOURCE).unwrap().to_vec()).unwrap();
        let labels: Vec<&str> = doc.context.sets.iter().map(|s| s.label.as_str()).collect();
        assert!(labels.len() >= 2, "{labels:?}");
        let mut from = 0;
        for label in &labels {
            let line = format!("= Shop set {label} (Supply voltages, ");
            let at = main[from..]
                .find(&line)
                .unwrap_or_else(|| panic!("{line} missing or out of order"));
            from += at + line.len();
        }
        assert!(
            !main.contains("== Supply voltages"),
            "the built-in section is still there"
        );
        std::fs::write(
            dir.path().join(SET_TEMPLATE_NAME),
            "ok\n{{ set.no_such_field.deeper }}",
        )
        .unwrap();
        match build(&input, &source) {
            Err(HandoverError::Template {
                detail,
                from_override,
                ..
            }) => {
                let detail = detail.english();
                assert!(detail.contains("handover-set.typ"), "{detail}");
                // The shop's part failed, not the program's template.
                assert!(from_override);
            }
            other => panic!("expected a template error, got {other:?}"),
        }
    }

    #[test]
    fn digest_is_twelve_hex_digits_of_sha256() {
        // FIPS 180-2 test vector: SHA-256("abc") = ba7816bf8f01cfea…
        assert_eq!(job_digest("abc"), "ba7816bf8f01");
        assert_eq!(job_digest("abc").len(), 12);
    }

    /// The footer's digest is the same whether the findings carry the
    /// file's SHA-256 (as a render stamps them) or not.
    #[test]
    fn the_digest_taken_from_stamped_findings_is_the_one_worked_out() {
        let (_, mut findings, text) = demo("combo-el84-cathode.kdl");
        assert_eq!(findings.job.file_sha256, None);
        let worked_out = job_digest_of(&findings, &text);
        assert_eq!(worked_out, job_digest(&text));
        // SHA-256 of the text, in full, as `cli::load::stamp_from` writes it.
        let full: String = Sha256::digest(text.as_bytes())
            .iter()
            .map(|b| format!("{b:02x}"))
            .collect();
        findings.job.file_sha256 = Some(full.clone());
        assert_eq!(job_digest_of(&findings, &text), worked_out);
        // What is taken is the stamp: its first twelve digits.
        findings.job.file_sha256 = Some(format!("0123456789ab{}", &full[12..]));
        assert_eq!(job_digest_of(&findings, &text), "0123456789ab");
    }

    #[test]
    fn command_names_every_flag() {
        // 2026-11-09 00:00 UTC is 1794182400 s after the Unix epoch (`date -u -d 2026-11-09 +%s`).
        let opts = CompileOptions::new(NaiveDate::from_ymd_opt(2026, 11, 9).unwrap());
        let cmd = compile_command(Path::new("/tmp/src"), &opts, Path::new("out.pdf"));
        assert_eq!(
            cmd,
            "typst compile --root /tmp/src --font-path /tmp/src/fonts --font-path /tmp/src/fonts-cjk \
             --ignore-system-fonts --ignore-embedded-fonts \
             --creation-timestamp 1794182400 --pdf-standard a-2b /tmp/src/main.typ out.pdf"
        );
        // A document that does not need the CJK font names only the one folder.
        let lean = CompileOptions {
            cjk: false,
            ..opts.clone()
        };
        assert!(
            compile_command(Path::new("/s"), &lean, Path::new("o.pdf"))
                .starts_with("typst compile --root /s --font-path /s/fonts --ignore-system-fonts ")
        );
        // typst held to one thread (a batch's worker) shows it; the PDF is
        // the same either way.
        let held = CompileOptions {
            threads: std::num::NonZeroUsize::new(1),
            ..opts
        };
        assert!(
            compile_command(Path::new("/s"), &held, Path::new("o.pdf")).contains(
                " --creation-timestamp 1794182400 --jobs 1 --pdf-standard a-2b /s/main.typ"
            )
        );
    }

    /// The notice's line is found as walking the lines finds it, on random
    /// texts made of the include, pieces of it, line ends (also `\r\n`
    /// and a lone `\r`), spaces, tabs, no-break and other Unicode spaces
    /// and other text.
    #[test]
    fn the_notice_is_found_where_walking_the_lines_finds_it() {
        let pieces = [
            NOTICE_INCLUDE,
            NOTICE_INCLUDE,
            "#include",
            " \"mains-safety.typ\"",
            "\n",
            "\n",
            "\r\n",
            "\r",
            " ",
            "\t",
            "\u{a0}",
            "\u{2028}",
            "\u{3000}",
            "x",
            "é",
            "//",
            "#",
        ];
        let mut x: u64 = 0x2f6b_11d3_9a0c_5e47;
        let mut found = 0;
        for _ in 0..60_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let mut text = String::new();
            for k in 0..(x % 9) {
                text.push_str(pieces[((x >> (6 + 5 * k)) % pieces.len() as u64) as usize]);
            }
            let walked = text.lines().any(|l| l.trim() == NOTICE_INCLUDE);
            assert_eq!(includes_notice(&text), walked, "{text:?}");
            found += usize::from(walked);
        }
        // Both answers came up often.
        assert!(found > 2_000, "{found}");
        assert!(includes_notice(&format!("a\n  {NOTICE_INCLUDE}\t\r\nb")));
        assert!(!includes_notice(&format!("a {NOTICE_INCLUDE}\n")));
        assert!(!includes_notice(""));
    }
}
