//! `ampreport render JOB`: the PDF hand-over document. Reads and derives the
//! job, finds typst, fills the template, optionally writes the generated
//! source to a folder, and compiles the PDF atomically.
//!
//! Exit statuses: 1 when the job, a ratings file or a shop's own template
//! (`--templates`) is at fault; 3 when the set-up is (typst missing, too old
//! or unusable, a folder that cannot be written) or when typst rejects the
//! built-in template, which is a fault of the tool itself.

use std::path::{Path, PathBuf};

use super::args::RenderArgs;
use super::exit::Exit;
use super::load;
use crate::calc;
use crate::report::handover::{self, HandoverError, HandoverInput};
use crate::typeset::{self, TemplateSource, TypesetError};

pub fn run(args: &RenderArgs) -> Exit {
    // typst answers `--version` while the job is read; a problem with the
    // job is still reported first.
    let pending = typeset::start_locate(args.typst.as_deref());
    let loaded = match load::job(&args.job) {
        Ok(l) => l,
        Err(e) => return e,
    };
    let job = &loaded.decoded.job;
    let findings = calc::derive(job, &loaded.ratings);

    let templates = match template_source(args.templates.as_deref()) {
        Ok(t) => t,
        Err(e) => return e,
    };

    let program = match pending.finish() {
        Ok(p) => p,
        Err(e) => {
            eprintln!("{:?}", miette::Report::new(e));
            return Exit::Environment;
        }
    };
    if let Some(warning) = program.version_warning() {
        eprintln!("warning: {warning}");
    }

    let input = HandoverInput {
        job,
        findings: &findings,
        job_text: &loaded.text,
        typst_version: program.version.to_string(),
        shop: loaded.shop.as_ref().map(|s| &s.profile),
        logo: loaded.shop.as_ref().and_then(|s| s.logo.as_ref()),
        include_charges: !args.no_charges,
    };
    let document = match handover::build(&input, &templates) {
        Ok(d) => d,
        Err(e) => return report_build_error(e),
    };

    let output = args
        .output
        .clone()
        .unwrap_or_else(|| default_output(&args.job.job));

    if let Some(shop) = &loaded.shop {
        let mut inputs = vec![shop.path().to_path_buf()];
        inputs.extend(shop.logo.as_ref().map(|l| l.source.clone()));
        if let Some(input) = inputs.iter().find(|i| same_place(&output, i)) {
            eprintln!(
                "error: the output {} is the shop's own file {}; choose another output with -o",
                output.display(),
                input.display()
            );
            return Exit::InvalidInput;
        }
    }

    if let Some(dir) = &args.emit_source {
        if let Err(e) = typeset::emit_source(&document.sandbox, dir) {
            eprintln!(
                "error: could not write the generated source to {}: {e}",
                dir.display()
            );
            return Exit::Environment;
        }
        eprintln!("wrote the generated source to {}", dir.display());
        eprintln!(
            "  the same PDF comes from: {}",
            handover::compile_command(dir, &document.options, &dir.join("handover.pdf"))
        );
    }

    match typeset::compile(
        &program,
        &document.sandbox,
        document.main,
        &document.options,
        &output,
    ) {
        Ok(outcome) => {
            if !outcome.warnings.is_empty() {
                eprintln!("typst warned:\n{}", outcome.warnings);
            }
            println!("wrote {}", output.display());
            Exit::Success
        }
        Err(e) => {
            let status = match &e {
                TypesetError::Compile { .. } if templates.override_dir.is_some() => {
                    Exit::InvalidInput
                }
                _ => Exit::Environment,
            };
            if matches!(e, TypesetError::Compile { .. }) && templates.override_dir.is_none() {
                eprintln!(
                    "note: the built-in template failed to compile; this is a fault in ampreport, please report it"
                );
            }
            eprintln!("{:?}", miette::Report::new(e));
            if output.exists() {
                eprintln!("note: {} was left as it was", output.display());
            }
            status
        }
    }
}

/// Whether `output` names the existing file `input` (links followed).
fn same_place(output: &Path, input: &Path) -> bool {
    match (output.canonicalize(), input.canonicalize()) {
        (Ok(a), Ok(b)) => a == b,
        _ => false,
    }
}

/// Beside the job file, same name, `.pdf`.
fn default_output(job: &Path) -> PathBuf {
    job.with_extension("pdf")
}

/// The built-in templates, overridden by `--templates DIR` when given.
fn template_source(dir: Option<&Path>) -> Result<TemplateSource, Exit> {
    let source = TemplateSource::embedded(handover::EMBEDDED_TEMPLATES);
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
        | HandoverError::Image { .. } => Exit::InvalidInput,
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
    fn output_sits_beside_the_job() {
        assert_eq!(
            default_output(Path::new("jobs/a.kdl")),
            PathBuf::from("jobs/a.pdf")
        );
        assert_eq!(default_output(Path::new("a")), PathBuf::from("a.pdf"));
    }
}
