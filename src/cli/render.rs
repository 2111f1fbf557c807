//! `ampreport render JOB`: the PDF hand-over document, or with `--listing`
//! the listing for a buyer (a PDF, and Markdown with its photos beside it).
//! Reads and derives the job, finds typst, fills the template, optionally
//! writes the generated source to a folder, and compiles the PDF
//! atomically; the listing's Markdown and photos are written after the PDF,
//! each atomically.
//!
//! Exit statuses: 1 when the job, a ratings file or a shop's own template
//! (`--templates`) is at fault; 2 when the output or the `--emit-source`
//! folder may not be written (it is an input, a link, a device, a folder
//! with other files in it); 3 when the set-up is (typst missing, too old,
//! unusable, crashing, hanging past `--timeout`, a folder that cannot be
//! written) or when typst rejects the built-in template, which is a fault
//! of the tool itself; 128 + N after signal N (SIGINT, SIGTERM, SIGHUP),
//! with the temporary files removed and typst stopped.

use std::io::IsTerminal;
use std::path::{Path, PathBuf};

use super::args::{RenderArgs, SerialArg};
use super::exit::Exit;
use super::{load, ui};
use crate::calc;
use crate::catalogue::Catalogue;
use crate::input_file::is_dash;
use crate::report::handover::{self, HandoverError, HandoverInput};
use crate::report::listing::{self, ListingInput, SerialShown};
use crate::typeset::{
    self, CompileOptions, FontsUsed, Input, TemplateSource, TypesetError, TypstProgram, interrupt,
};

pub fn run(args: &RenderArgs) -> Exit {
    // From here a stop signal is noted rather than fatal: each step below
    // that makes temporary files or waits on typst ends cleanly on it.
    if let Err(e) = interrupt::install() {
        ui::warn(format!(
            "warning: stop signals will end ampreport without clean-up: {e}"
        ));
    }
    let output = match output_path(args) {
        Ok(o) => o,
        Err(e) => return e,
    };
    // typst answers `--version` while the job is read; a problem with the
    // job is still reported first.
    let pending = typeset::start_locate(args.typst.as_deref());
    let loaded = match load::job(&args.job) {
        Ok(l) => l,
        Err(e) => return e,
    };
    let job = &loaded.decoded.job;
    let photos = match load::photos(&args.job.job, &loaded) {
        Ok(p) => p,
        Err(e) => return e,
    };
    let mut findings = calc::derive(job, &loaded.ratings);
    load::stamp(&args.job.job, &loaded, &mut findings);
    for warning in undrawable_text(&load::job_name(&args.job.job), &loaded.text) {
        ui::warn(warning);
    }

    let templates = match template_source(args.templates.as_deref(), args.listing) {
        Ok(t) => t,
        Err(e) => return e,
    };

    let program = match pending.finish_within(args.timeout) {
        Ok(p) => p,
        Err(e) => return report_typeset_error(e, &templates, None),
    };
    ui::read(
        "typst",
        format!("{} (version {})", program.path.display(), program.version),
    );
    if let Some(warning) = program.version_warning() {
        ui::warn(format!("warning: {warning}"));
    }

    let catalogue = loaded
        .shop
        .as_ref()
        .map_or(Catalogue::english(), |s| &s.catalogue);
    let document = if args.listing {
        let markdown_path = output.with_extension("md");
        let input = ListingInput {
            job,
            findings: &findings,
            job_text: &loaded.text,
            typst_version: program.version.to_string(),
            shop: loaded.shop.as_ref().map(|s| &s.profile),
            logo: loaded.shop.as_ref().and_then(|s| s.logo.as_ref()),
            catalogue,
            serial: match args.serial {
                SerialArg::Shown => SerialShown::Shown,
                SerialArg::Masked => SerialShown::Masked,
                SerialArg::Hidden => SerialShown::Hidden,
            },
            photos: &photos,
            markdown_stem: markdown_path
                .file_stem()
                .map(|s| s.to_string_lossy().into_owned())
                .unwrap_or_default(),
        };
        match listing::build(&input, &templates) {
            Ok(d) => {
                let folder = markdown_path.parent().unwrap_or(Path::new(""));
                let mut extra: Vec<(PathBuf, Vec<u8>)> = d
                    .photo_files
                    .into_iter()
                    .map(|(name, bytes)| (folder.join(name), bytes))
                    .collect();
                extra.push((markdown_path, d.markdown.into_bytes()));
                Built {
                    sandbox: d.sandbox,
                    main: d.main,
                    options: d.options,
                    extra,
                }
            }
            Err(e) => return report_build_error(e),
        }
    } else {
        let input = HandoverInput {
            job,
            findings: &findings,
            job_text: &loaded.text,
            typst_version: program.version.to_string(),
            shop: loaded.shop.as_ref().map(|s| &s.profile),
            logo: loaded.shop.as_ref().and_then(|s| s.logo.as_ref()),
            include_charges: !args.no_charges,
            catalogue,
            revision: findings.job.git.clone(),
            photos: &photos,
        };
        match handover::build(&input, &templates) {
            Ok(d) => Built {
                sandbox: d.sandbox,
                main: d.main,
                options: d.options,
                extra: Vec::new(),
            },
            Err(e) => return report_build_error(e),
        }
    };

    let mut inputs = inputs_read(args, &program, loaded.shop.as_ref());
    inputs.extend(
        photos
            .iter()
            .map(|p| Input::new(&p.source, "a photo of the job")),
    );
    if document.extra.iter().any(|(p, _)| *p == output) {
        eprintln!(
            "error: the listing's PDF {} would be written over by its own Markdown; name the PDF with .pdf",
            output.display()
        );
        return Exit::Usage;
    }
    for path in std::iter::once(&output).chain(document.extra.iter().map(|(p, _)| p)) {
        if let Err(e) = typeset::check_output(path, &inputs) {
            eprintln!("{:?}", miette::Report::new(e));
            return Exit::Usage;
        }
    }

    if let Some(dir) = &args.emit_source {
        if let Err(e) = typeset::check_emit_folder(dir, &inputs, &output, args.force) {
            eprintln!("{:?}", miette::Report::new(e));
            return Exit::Usage;
        }
        let written = if args.force {
            typeset::emit_source_replacing(&document.sandbox, dir)
        } else {
            typeset::emit_source(&document.sandbox, dir)
        };
        if let Some(signal) = interrupt::received() {
            return report_typeset_error(TypesetError::Interrupted { signal }, &templates, None);
        }
        if let Err(e) = written {
            eprintln!(
                "error: could not write the generated source to {}: {e}",
                dir.display()
            );
            return Exit::Environment;
        }
        ui::warn(format!("wrote the generated source to {}", dir.display()));
        ui::warn(format!(
            "  the same PDF comes from: {}",
            handover::compile_command(dir, &document.options, &dir.join("handover.pdf"))
        ));
    }

    let options = CompileOptions {
        timeout: args.timeout,
        ..document.options.clone()
    };
    match typeset::compile(
        &program,
        &document.sandbox,
        document.main,
        &options,
        &output,
    ) {
        Ok(outcome) => {
            match &outcome.fonts {
                FontsUsed::Cache(dir) => ui::read("fonts", format!("{} (cache)", dir.display())),
                FontsUsed::Sandbox => ui::read(
                    "fonts",
                    "embedded in the program, written for this run (no usable cache folder)",
                ),
            }
            if !outcome.warnings.is_empty() {
                ui::warn(format!("typst warned:\n{}", outcome.warnings));
            }
            if is_dash(&output) {
                if ui::verbose() {
                    eprintln!("wrote the PDF to standard output");
                }
            } else {
                ui::wrote(format!("wrote {}", output.display()));
            }
            // The listing's photos, then its Markdown: each file is written
            // whole or not at all.
            for (path, bytes) in &document.extra {
                if let Err(e) = typeset::place(bytes, path) {
                    return report_typeset_error(e, &templates, Some(path));
                }
                ui::wrote(format!("wrote {}", path.display()));
            }
            Exit::Success
        }
        Err(e) => report_typeset_error(e, &templates, Some(&output)),
    }
}

/// A document ready to compile, and the files written beside it.
struct Built {
    sandbox: typeset::Sandbox,
    main: &'static str,
    options: CompileOptions,
    /// Written after the PDF, in order: the listing's photos, then its
    /// Markdown.
    extra: Vec<(PathBuf, Vec<u8>)>,
}

/// Every path the render reads, for the output checks: an output may be
/// none of them, and the `--emit-source` folder may hold none of them.
fn inputs_read(
    args: &RenderArgs,
    program: &TypstProgram,
    shop: Option<&load::LoadedShop>,
) -> Vec<Input> {
    let mut inputs = Vec::new();
    if !is_dash(&args.job.job) {
        inputs.push(Input::new(&args.job.job, "the job file"));
    }
    inputs.extend(
        args.job
            .ratings
            .iter()
            .map(|r| Input::new(r, "a ratings file")),
    );
    if let Some(dir) = &args.templates {
        inputs.push(Input::new(dir, "the template folder"));
    }
    if let Some(shop) = shop {
        inputs.push(Input::new(shop.path(), "the shop profile"));
        if let Some(logo) = &shop.logo {
            inputs.push(Input::new(&logo.source, "the shop's logo"));
        }
        if let Some(translation) = &shop.translation {
            inputs.push(Input::new(translation, "the shop's translation file"));
        }
    }
    inputs.push(Input::new(&program.path, "the typst program"));
    inputs
}

/// Prints a typesetting failure with whose fault it likely is, and gives
/// the exit status: 1 when a shop's template is at fault, 2 for an output
/// that may not be written, 3 for typst or the machine (and for the
/// built-in template, a fault of ampreport itself), 128 + N for signal N.
fn report_typeset_error(
    e: TypesetError,
    templates: &TemplateSource,
    output: Option<&Path>,
) -> Exit {
    let shop = templates.override_dir.as_deref();
    let status = match &e {
        TypesetError::Interrupted { signal } => Exit::Interrupted(*signal),
        TypesetError::Output(_) => Exit::Usage,
        TypesetError::Compile { .. } | TypesetError::MissingText { .. } => match shop {
            Some(dir) => {
                eprintln!(
                    "note: the document from the shop templates in {} failed; the templates are at fault, not the job",
                    dir.display()
                );
                Exit::InvalidInput
            }
            None => {
                eprintln!(
                    "note: the built-in template failed; this is a fault in ampreport, please report it"
                );
                Exit::Environment
            }
        },
        _ => Exit::Environment,
    };
    eprintln!("{:?}", miette::Report::new(e));
    if let Some(output) = output
        && output.exists()
    {
        eprintln!("note: {} was left as it was", output.display());
    }
    status
}

/// A warning for each text value of the job holding characters the
/// bundled fonts cannot draw, naming the field and where it is; the
/// document prints those characters as the placeholder.
fn undrawable_text(file: &str, text: &str) -> Vec<String> {
    fn walk(doc: &kdl::KdlDocument, file: &str, text: &str, out: &mut Vec<String>) {
        for node in doc.nodes() {
            for entry in node.entries() {
                let kdl::KdlValue::String(value) = entry.value() else {
                    continue;
                };
                let lacking = typeset::undrawable(value);
                if lacking.is_empty() {
                    continue;
                }
                let field = match entry.name() {
                    Some(key) => format!("`{}` of `{}`", key.value(), node.name().value()),
                    None => format!("`{}`", node.name().value()),
                };
                let (line, column) = crate::job::line_column(text, entry.span().offset());
                let chars: Vec<String> = lacking
                    .iter()
                    .take(5)
                    .map(|c| format!("U+{:04X}", u32::from(*c)))
                    .collect();
                out.push(format!(
                    "warning: {file}:{line}:{column}: the text of {field} holds characters the document's fonts cannot draw ({}{}); they print as {}",
                    chars.join(", "),
                    if lacking.len() > 5 { ", …" } else { "" },
                    typeset::placeholder()
                ));
            }
            if let Some(children) = node.children() {
                walk(children, file, text, out);
            }
        }
    }
    let mut out = Vec::new();
    if let Ok(doc) = crate::kdl_fast::parse_document(text) {
        walk(&doc, file, text, &mut out);
    }
    out
}

/// Beside the job file, same name, `.pdf`.
fn default_output(job: &Path) -> PathBuf {
    job.with_extension("pdf")
}

/// Beside the job file, same name, `.listing.pdf`.
fn default_listing_output(job: &Path) -> PathBuf {
    job.with_extension("listing.pdf")
}

/// Where the PDF goes: `-o FILE`, `-o -` (standard output, which must not
/// be a terminal), else beside the job file; a job from standard input has
/// no file to sit beside, so it needs `-o`.
fn output_path(args: &RenderArgs) -> Result<PathBuf, Exit> {
    match &args.output {
        Some(o) if is_dash(o) && std::io::stdout().is_terminal() => {
            eprintln!(
                "error: `-o -` writes the PDF to standard output, which is a terminal here; \
                 send it to a file or a program (`-o - > job.pdf`, `-o - | lpr`)"
            );
            Err(Exit::Usage)
        }
        Some(o) if is_dash(o) && args.listing => {
            eprintln!(
                "error: the listing is a PDF and Markdown beside it, so it needs a file: name it with `-o FILE.pdf`"
            );
            Err(Exit::Usage)
        }
        Some(o) => Ok(o.clone()),
        None if is_dash(&args.job.job) => {
            eprintln!(
                "error: a job read from standard input has no file to put the PDF beside; \
                 name the output with `-o FILE`, or `-o -` for standard output"
            );
            Err(Exit::Usage)
        }
        None if args.listing => Ok(default_listing_output(&args.job.job)),
        None => Ok(default_output(&args.job.job)),
    }
}

/// The built-in templates, overridden by `--templates DIR` when given.
fn template_source(dir: Option<&Path>, listing: bool) -> Result<TemplateSource, Exit> {
    let embedded = if listing {
        listing::EMBEDDED_TEMPLATES
    } else {
        handover::EMBEDDED_TEMPLATES
    };
    let source = TemplateSource::embedded(embedded);
    for (name, _) in embedded {
        let shop = dir.map(|d| d.join(name)).filter(|p| p.is_file());
        match shop {
            Some(path) => ui::read("template", format!("{} (shop folder)", path.display())),
            None => ui::read(
                "template",
                format!("{name} (built in, embedded in the program)"),
            ),
        }
    }
    match dir {
        None => Ok(source),
        Some(dir) if dir.is_dir() => Ok(source.with_override_dir(dir)),
        Some(dir) => {
            eprintln!(
                "error: the template folder {} does not exist or is not a folder",
                dir.display()
            );
            Err(Exit::InvalidInput)
        }
    }
}

fn report_build_error(e: HandoverError) -> Exit {
    let status = match &e {
        HandoverError::Template {
            from_override: true,
            ..
        }
        | HandoverError::Image { .. }
        | HandoverError::Refused(_) => Exit::InvalidInput,
        HandoverError::Template {
            from_override: false,
            ..
        } => {
            eprintln!(
                "note: the built-in template failed; this is a fault in ampreport, please report it"
            );
            Exit::Environment
        }
        HandoverError::Plot(_) | HandoverError::Sandbox(_) => Exit::Environment,
    };
    eprintln!("error: {e}");
    status
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn text_the_fonts_cannot_draw_is_named_with_its_place() {
        let text = "job id=\"J1\"\nparts {\n    part R1 reason=\"hot 🔥\"\n}\nnotes {\n    note \"ก\"\n}\n";
        let warnings = undrawable_text("j.kdl", text);
        assert_eq!(warnings.len(), 2, "{warnings:?}");
        assert!(warnings[0].starts_with("warning: j.kdl:3:13: the text of `reason` of `part`"));
        assert!(warnings[0].contains("U+1F525"));
        assert!(warnings[1].contains("j.kdl:6:10: the text of `note`"));
    }

    #[test]
    fn output_sits_beside_the_job() {
        assert_eq!(
            default_output(Path::new("jobs/a.kdl")),
            PathBuf::from("jobs/a.pdf")
        );
        assert_eq!(default_output(Path::new("a")), PathBuf::from("a.pdf"));
    }
}
