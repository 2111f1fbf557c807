//! Everything that can go wrong between a finished Typst source and a PDF on
//! disk, sorted so the command line can tell a broken set-up (typst missing,
//! too old, not runnable) from a broken document or a full disk.

use std::io;
use std::path::PathBuf;

use super::version::{MIN_TYPST, TypstVersion};

/// The install command named in every "typst missing or too old" message:
/// the version the templates are tested with ([`MIN_TYPST`]), the one
/// `scripts/need-typst.sh` installs (a test holds the three in step).
pub const INSTALL_HINT: &str = "cargo install --locked typst-cli --version 0.15.1";

/// Why typesetting failed.
#[derive(Debug, thiserror::Error, miette::Diagnostic)]
pub enum TypesetError {
    /// No typst program at the given path, in `AMPREPORT_TYPST`, or on `PATH`.
    #[error("typst was not found: {looked}")]
    #[diagnostic(
        code(ampreport::typeset::typst_not_found),
        help(
            "install it with `{INSTALL_HINT}`, or name the program with \
             `--typst PATH` or the AMPREPORT_TYPST environment variable"
        )
    )]
    NotFound {
        /// Where the search went, in words, e.g. "no `typst` on PATH".
        looked: String,
    },

    /// A typst program was found but is older than [`MIN_TYPST`].
    #[error("{} is typst {found}, but ampreport needs typst {MIN_TYPST} or newer", path.display())]
    #[diagnostic(
        code(ampreport::typeset::typst_too_old),
        help("upgrade it with `{INSTALL_HINT}`, or point `--typst PATH` at a newer one")
    )]
    TooOld { path: PathBuf, found: TypstVersion },

    /// The program exists but could not be started, or `--version` did not
    /// answer like typst.
    #[error("could not run {} as typst: {problem}", path.display())]
    #[diagnostic(
        code(ampreport::typeset::typst_unusable),
        help(
            "check that this is the typst command-line program and that it runs; \
             a fresh one comes from `{INSTALL_HINT}`"
        )
    )]
    Unusable {
        path: PathBuf,
        problem: String,
        #[source]
        source: Option<io::Error>,
    },

    /// typst ran and rejected the document: it exited with status 1 and
    /// printed its reasons. The document (that is, its template) is at
    /// fault. typst's own diagnostics are kept verbatim in `diagnostics`.
    #[error("typst could not compile the document (it {status}):\n{diagnostics}")]
    #[diagnostic(
        code(ampreport::typeset::compile_failed),
        help(
            "the generated source was kept for inspection in {}; \
             file names in the messages above are relative to that folder",
            kept.display()
        )
    )]
    Compile {
        /// typst's standard error, trimmed.
        diagnostics: String,
        /// How typst ended, in words: "exited with status 1".
        status: String,
        /// The folder holding the generated source, left behind on purpose.
        kept: PathBuf,
        /// The main source file inside `kept`.
        main: PathBuf,
    },

    /// typst did not behave like typst: it crashed or was killed, exited
    /// with an unexpected status, or said it succeeded but wrote no file or
    /// an incomplete one. The typst program (or the machine) is at fault,
    /// not the job or the template.
    #[error("the typst program {} {what}{}", path.display(), said(diagnostics))]
    #[diagnostic(
        code(ampreport::typeset::typst_misbehaved),
        help(
            "this points at the typst program or the machine it runs on (memory, disk), \
             not at the job: try the same typst on the kept source in {}, or install a fresh one \
             with `{INSTALL_HINT}`",
            kept.display()
        )
    )]
    Misbehaved {
        path: PathBuf,
        /// What happened: "was killed by signal 11 (SIGSEGV)", "reported
        /// success but wrote no file".
        what: String,
        /// typst's standard error, trimmed and bounded; may be empty.
        diagnostics: String,
        /// The folder holding the generated source.
        kept: PathBuf,
    },

    /// typst did not finish within the time limit and was stopped.
    #[error("the typst program {} did not finish `{action}` within {seconds} s and was stopped{}", path.display(), said(diagnostics))]
    #[diagnostic(
        code(ampreport::typeset::timed_out),
        help(
            "a hand-over document takes a few seconds; a typst that hangs is at fault, or the \
             machine is very busy. Allow longer with `--timeout SECONDS` or AMPREPORT_TIMEOUT"
        )
    )]
    TimedOut {
        path: PathBuf,
        /// "--version" or "compile".
        action: &'static str,
        seconds: f64,
        diagnostics: String,
    },

    /// A stop signal came; the temporary files are gone and typst was
    /// stopped.
    #[error("stopped by {}; typst was stopped and the temporary files removed", signal_words(*signal))]
    #[diagnostic(code(ampreport::typeset::interrupted))]
    Interrupted { signal: i32 },

    /// The finished document lacks text it must carry (the mains-safety
    /// notice): the template left it out, hid it or changed it.
    #[error(
        "the finished document does not show {what}: {} missing from its text",
        quoted(missing)
    )]
    #[diagnostic(
        code(ampreport::typeset::required_text_missing),
        help(
            "the template must place {what} where it can be read; the generated source \
             was kept in {}",
            kept.display()
        )
    )]
    MissingText {
        what: String,
        missing: Vec<String>,
        kept: PathBuf,
    },

    /// The output path may not be written.
    #[error(transparent)]
    #[diagnostic(transparent)]
    Output(#[from] super::output::OutputRefused),

    /// A file in the sandbox has a name that would escape it or clash with the
    /// bundled fonts. This is a programming error in the caller or a job file
    /// naming an image badly.
    #[error("`{path}` cannot be placed in the typesetting folder: {reason}")]
    #[diagnostic(
        code(ampreport::typeset::bad_sandbox_path),
        help("use a plain relative path such as `plots/anode.svg`")
    )]
    BadSandboxPath { path: String, reason: &'static str },

    /// Reading or writing a file failed.
    #[error("could not {action} {}", path.display())]
    #[diagnostic(code(ampreport::typeset::io))]
    Io {
        /// What was being done, e.g. "write the PDF to".
        action: &'static str,
        path: PathBuf,
        #[source]
        source: io::Error,
    },
}

/// " and said: …" with typst's first lines, or nothing.
fn said(diagnostics: &str) -> String {
    if diagnostics.is_empty() {
        String::new()
    } else {
        format!("; it said:\n{diagnostics}")
    }
}

fn quoted(phrases: &[String]) -> String {
    let list: Vec<String> = phrases.iter().map(|p| format!("\"{p}\"")).collect();
    format!(
        "{} {}",
        list.join(", "),
        if list.len() == 1 { "is" } else { "are" }
    )
}

fn signal_words(signal: i32) -> String {
    match super::interrupt::signal_name(signal) {
        Some(name) => format!("{name} (signal {signal})"),
        None => format!("signal {signal}"),
    }
}

impl TypesetError {
    /// True when the machine's set-up is at fault (typst missing, too old,
    /// unusable, misbehaving or hanging) rather than the document or the disk, so the command line
    /// can use a distinct exit status.
    pub fn is_environment(&self) -> bool {
        matches!(
            self,
            Self::NotFound { .. }
                | Self::TooOld { .. }
                | Self::Unusable { .. }
                | Self::Misbehaved { .. }
                | Self::TimedOut { .. }
        )
    }

    pub(crate) fn io(action: &'static str, path: impl Into<PathBuf>, source: io::Error) -> Self {
        Self::Io {
            action,
            path: path.into(),
            source,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use miette::Diagnostic;

    #[test]
    fn the_install_hint_pins_the_tested_version_the_install_script_installs() {
        assert!(
            INSTALL_HINT.ends_with(&format!("--version {MIN_TYPST}")),
            "{INSTALL_HINT}"
        );
        let script = include_str!("../../scripts/need-typst.sh");
        assert!(
            script.contains(&format!("want=\"{MIN_TYPST}\"")),
            "scripts/need-typst.sh installs another version than {MIN_TYPST}"
        );
    }

    #[test]
    fn environment_errors_are_marked() {
        let not_found = TypesetError::NotFound {
            looked: "no `typst` on PATH".into(),
        };
        assert!(not_found.is_environment());
        let help = not_found.help().unwrap().to_string();
        assert!(help.contains(INSTALL_HINT), "{help}");

        let old = TypesetError::TooOld {
            path: "/opt/typst".into(),
            found: TypstVersion::new(0, 1, 0),
        };
        assert!(old.is_environment());
        let text = old.to_string();
        assert!(
            text.contains("/opt/typst") && text.contains("0.1.0"),
            "{text}"
        );
        assert!(old.help().unwrap().to_string().contains(INSTALL_HINT));

        let compile = TypesetError::Compile {
            diagnostics: "error: unknown variable".into(),
            status: "exited with status 1".into(),
            kept: "/tmp/kept".into(),
            main: "/tmp/kept/main.typ".into(),
        };
        assert!(!compile.is_environment());
        assert!(compile.to_string().contains("unknown variable"));
        assert!(compile.help().unwrap().to_string().contains("/tmp/kept"));

        let io = TypesetError::io("write", "/x.pdf", io::Error::other("full"));
        assert!(!io.is_environment());
    }
}
