//! Everything that can go wrong between a finished Typst source and a PDF on
//! disk, sorted so the command line can tell a broken set-up (typst missing,
//! too old, not runnable) from a broken document or a full disk.

use std::fmt;
use std::io;
use std::path::PathBuf;

use miette::Diagnostic;

use super::version::{MIN_TYPST, TypstVersion};
use crate::catalogue::{Arg, Catalogue, Msg};

/// The install command named in every "typst missing or too old" message:
/// the version the templates are tested with ([`MIN_TYPST`]), the one
/// `scripts/need-typst.sh` installs (a test holds the three in step).
pub const INSTALL_HINT: &str = "cargo install --locked typst-cli --version 0.15.1";

/// Why typesetting failed. Its words are the catalogue's (`cli-typst-…`):
/// `Display` and the diagnostic's help say them in English, and
/// [`TypesetError::in_language`] says them in the reader's.
#[derive(Debug)]
pub enum TypesetError {
    /// No typst program at the given path, in `AMPREPORT_TYPST`, or on `PATH`.
    NotFound {
        /// Where the search went, in words, e.g. "no `typst` on PATH".
        looked: Msg,
    },

    /// A typst program was found but is older than [`MIN_TYPST`].
    TooOld { path: PathBuf, found: TypstVersion },

    /// The program exists but could not be started, or `--version` did not
    /// answer like typst.
    Unusable {
        path: PathBuf,
        problem: Msg,
        source: Option<io::Error>,
    },

    /// typst ran and rejected the document: it exited with status 1 and
    /// printed its reasons. The document (that is, its template) is at
    /// fault. typst's own diagnostics are kept verbatim in `diagnostics`.
    Compile {
        /// typst's standard error, trimmed.
        diagnostics: String,
        /// How typst ended, in words: "exited with status 1".
        status: Msg,
        /// The folder holding the generated source, left behind on purpose.
        kept: PathBuf,
        /// The main source file inside `kept`.
        main: PathBuf,
    },

    /// typst did not behave like typst: it crashed or was killed, exited
    /// with an unexpected status, or said it succeeded but wrote no file or
    /// an incomplete one. The typst program (or the machine) is at fault,
    /// not the job or the template.
    Misbehaved {
        path: PathBuf,
        /// What happened: "was killed by signal 11 (SIGSEGV)", "reported
        /// success but wrote no file".
        what: Msg,
        /// typst's standard error, trimmed and bounded; may be empty.
        diagnostics: String,
        /// The folder holding the generated source.
        kept: PathBuf,
    },

    /// typst did not finish within the time limit and was stopped.
    TimedOut {
        path: PathBuf,
        /// "--version" or "compile".
        action: &'static str,
        seconds: f64,
        diagnostics: String,
    },

    /// A stop signal came; the temporary files are gone and typst was
    /// stopped.
    Interrupted { signal: i32 },

    /// The finished document lacks text it must carry (the mains-safety
    /// notice): the template left it out, hid it or changed it.
    MissingText {
        what: Msg,
        missing: Vec<String>,
        kept: PathBuf,
    },

    /// The output path may not be written.
    Output(super::output::OutputRefused),

    /// A file in the sandbox has a name that would escape it or clash with the
    /// bundled fonts. This is a programming error in the caller or a job file
    /// naming an image badly. `reason` is a catalogue key.
    BadSandboxPath { path: String, reason: &'static str },

    /// Reading or writing a file failed.
    Io {
        /// What was being done: a catalogue key whose message takes the
        /// `path` ("could not write the PDF to { $path }").
        action: &'static str,
        path: PathBuf,
        source: io::Error,
    },
}

impl From<super::output::OutputRefused> for TypesetError {
    fn from(e: super::output::OutputRefused) -> Self {
        TypesetError::Output(e)
    }
}

/// A path as a message argument.
fn shown(path: &std::path::Path) -> String {
    path.display().to_string()
}

/// "; it said:" and typst's first lines, or nothing.
fn said(diagnostics: &str) -> Arg {
    if diagnostics.is_empty() {
        Arg::from("")
    } else {
        Msg::new("cli-typst-it-said")
            .arg("diagnostics", diagnostics)
            .into()
    }
}

fn quoted(phrases: &[String]) -> String {
    let list: Vec<String> = phrases.iter().map(|p| format!("\"{p}\"")).collect();
    list.join(", ")
}

fn signal_words(signal: i32) -> Msg {
    match super::interrupt::signal_name(signal) {
        Some(name) => Msg::new("cli-typst-signal-named")
            .arg("name", name)
            .arg("number", signal.to_string()),
        None => Msg::new("cli-typst-signal").arg("number", signal.to_string()),
    }
}

impl TypesetError {
    /// The message and its help, not yet said; none for a refused output
    /// (its own diagnostic speaks for it).
    fn words(&self) -> Option<(Msg, Option<Msg>)> {
        let install = || Arg::from(INSTALL_HINT);
        Some(match self {
            Self::NotFound { looked } => (
                Msg::new("cli-typst-not-found").arg("looked", looked.clone()),
                Some(Msg::new("cli-typst-not-found-help").arg("install", install())),
            ),
            Self::TooOld { path, found } => (
                Msg::new("cli-typst-too-old")
                    .arg("path", shown(path))
                    .arg("found", found.to_string())
                    .arg("needed", MIN_TYPST.to_string()),
                Some(Msg::new("cli-typst-too-old-help").arg("install", install())),
            ),
            Self::Unusable { path, problem, .. } => (
                Msg::new("cli-typst-unusable")
                    .arg("path", shown(path))
                    .arg("problem", problem.clone()),
                Some(Msg::new("cli-typst-unusable-help").arg("install", install())),
            ),
            Self::Compile {
                diagnostics,
                status,
                kept,
                ..
            } => (
                Msg::new("cli-typst-compile-failed")
                    .arg("status", status.clone())
                    .arg("diagnostics", diagnostics),
                Some(Msg::new("cli-typst-compile-failed-help").arg("kept", shown(kept))),
            ),
            Self::Misbehaved {
                path,
                what,
                diagnostics,
                kept,
            } => (
                Msg::new("cli-typst-misbehaved")
                    .arg("path", shown(path))
                    .arg("what", what.clone())
                    .arg("said", said(diagnostics)),
                Some(
                    Msg::new("cli-typst-misbehaved-help")
                        .arg("kept", shown(kept))
                        .arg("install", install()),
                ),
            ),
            Self::TimedOut {
                path,
                action,
                seconds,
                diagnostics,
            } => (
                Msg::new("cli-typst-timed-out")
                    .arg("path", shown(path))
                    .arg("action", *action)
                    .arg("seconds", seconds.to_string())
                    .arg("said", said(diagnostics)),
                Some(Msg::new("cli-typst-timed-out-help")),
            ),
            Self::Interrupted { signal } => (
                Msg::new("cli-typst-interrupted").arg("signal", signal_words(*signal)),
                None,
            ),
            Self::MissingText {
                what,
                missing,
                kept,
            } => (
                Msg::new("cli-typst-missing-text")
                    .arg("what", what.clone())
                    .arg("missing", quoted(missing))
                    .arg("count", missing.len()),
                Some(
                    Msg::new("cli-typst-missing-text-help")
                        .arg("what", what.clone())
                        .arg("kept", shown(kept)),
                ),
            ),
            Self::Output(_) => return None,
            Self::BadSandboxPath { path, reason } => (
                Msg::new("cli-typst-bad-sandbox-path")
                    .arg("path", path)
                    .arg("reason", Msg::new(reason)),
                Some(Msg::new("cli-typst-bad-sandbox-path-help")),
            ),
            Self::Io { action, path, .. } => (Msg::new(action).arg("path", shown(path)), None),
        })
    }

    /// The diagnostic's code.
    fn code_words(&self) -> &'static str {
        match self {
            Self::NotFound { .. } => "ampreport::typeset::typst_not_found",
            Self::TooOld { .. } => "ampreport::typeset::typst_too_old",
            Self::Unusable { .. } => "ampreport::typeset::typst_unusable",
            Self::Compile { .. } => "ampreport::typeset::compile_failed",
            Self::Misbehaved { .. } => "ampreport::typeset::typst_misbehaved",
            Self::TimedOut { .. } => "ampreport::typeset::timed_out",
            Self::Interrupted { .. } => "ampreport::typeset::interrupted",
            Self::MissingText { .. } => "ampreport::typeset::required_text_missing",
            Self::Output(_) => "",
            Self::BadSandboxPath { .. } => "ampreport::typeset::bad_sandbox_path",
            Self::Io { .. } => "ampreport::typeset::io",
        }
    }

    /// The same problem said in the words of `catalogue`, with the same
    /// code, for printing as a diagnostic.
    pub fn in_language(self, catalogue: &Catalogue) -> InLanguage {
        // The operating system's answer under a failed file operation, in
        // the same words.
        let cause = match &self {
            Self::Io { source, .. } => Some(CauseInLanguage(
                catalogue.say(&crate::catalogue::os_error(source)),
            )),
            _ => None,
        };
        InLanguage {
            error: self,
            catalogue: catalogue.clone(),
            cause,
        }
    }

    /// The message alone in the words of `catalogue`.
    pub fn message_in(&self, catalogue: &Catalogue) -> String {
        match (self, self.words()) {
            (_, Some((message, _))) => catalogue.say(&message),
            (Self::Output(e), None) => e.message_in(catalogue),
            (_, None) => String::new(),
        }
    }

    fn help_in(&self, catalogue: &Catalogue) -> Option<String> {
        match (self, self.words()) {
            (_, Some((_, help))) => help.map(|h| catalogue.say(&h)),
            (Self::Output(e), None) => Some(e.help_in(catalogue)),
            (_, None) => None,
        }
    }
}

impl fmt::Display for TypesetError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message_in(Catalogue::english()))
    }
}

impl std::error::Error for TypesetError {
    fn source(&self) -> Option<&(dyn std::error::Error + 'static)> {
        match self {
            Self::Unusable {
                source: Some(source),
                ..
            } => Some(source),
            Self::Io { source, .. } => Some(source),
            Self::Output(e) => e.source(),
            _ => None,
        }
    }
}

/// The diagnostic of a refused output is its own, whole; the others have
/// their code and their help in English.
impl Diagnostic for TypesetError {
    fn code<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        match self {
            Self::Output(e) => e.code(),
            other => Some(Box::new(other.code_words())),
        }
    }

    fn help<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        self.help_in(Catalogue::english())
            .map(|h| Box::new(h) as Box<dyn fmt::Display>)
    }

    fn severity(&self) -> Option<miette::Severity> {
        match self {
            Self::Output(e) => e.severity(),
            _ => None,
        }
    }

    fn url<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        match self {
            Self::Output(e) => e.url(),
            _ => None,
        }
    }

    fn source_code(&self) -> Option<&dyn miette::SourceCode> {
        match self {
            Self::Output(e) => e.source_code(),
            _ => None,
        }
    }

    fn labels(&self) -> Option<Box<dyn Iterator<Item = miette::LabeledSpan> + '_>> {
        match self {
            Self::Output(e) => e.labels(),
            _ => None,
        }
    }

    fn related<'a>(&'a self) -> Option<Box<dyn Iterator<Item = &'a dyn Diagnostic> + 'a>> {
        match self {
            Self::Output(e) => e.related(),
            _ => None,
        }
    }

    fn diagnostic_source(&self) -> Option<&dyn Diagnostic> {
        match self {
            Self::Output(e) => e.diagnostic_source(),
            _ => None,
        }
    }
}

/// A typesetting problem said in a reader's language
/// ([`TypesetError::in_language`]): the same code and cause, the message
/// and help in that language's words. A refused output stays as its own
/// diagnostic says it.
#[derive(Debug)]
pub struct InLanguage {
    error: TypesetError,
    catalogue: Catalogue,
    cause: Option<CauseInLanguage>,
}

/// The cause of a failed file operation in the reader's words.
#[derive(Debug)]
struct CauseInLanguage(String);

impl fmt::Display for CauseInLanguage {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

impl std::error::Error for CauseInLanguage {}

impl fmt::Display for InLanguage {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.error.message_in(&self.catalogue))
    }
}

impl std::error::Error for InLanguage {
    fn source(&self) -> Option<&(dyn std::error::Error + 'static)> {
        match &self.cause {
            Some(cause) => Some(cause),
            None => std::error::Error::source(&self.error),
        }
    }
}

impl Diagnostic for InLanguage {
    fn code<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        self.error.code()
    }

    fn help<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        self.error
            .help_in(&self.catalogue)
            .map(|h| Box::new(h) as Box<dyn fmt::Display>)
    }

    fn severity(&self) -> Option<miette::Severity> {
        self.error.severity()
    }

    fn url<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        self.error.url()
    }

    fn source_code(&self) -> Option<&dyn miette::SourceCode> {
        self.error.source_code()
    }

    fn labels(&self) -> Option<Box<dyn Iterator<Item = miette::LabeledSpan> + '_>> {
        self.error.labels()
    }

    fn related<'a>(&'a self) -> Option<Box<dyn Iterator<Item = &'a dyn Diagnostic> + 'a>> {
        self.error.related()
    }

    fn diagnostic_source(&self) -> Option<&dyn Diagnostic> {
        self.error.diagnostic_source()
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

    /// A file operation that failed; `action` is the catalogue key of
    /// what was being done (its message takes the `path`).
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
            looked: Msg::new("cli-typst-looked-path").arg("program", "typst"),
        };
        assert_eq!(
            not_found.to_string(),
            "typst was not found: no `typst` on PATH"
        );
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
            status: Msg::new("cli-program-exited").arg("code", "1"),
            kept: "/tmp/kept".into(),
            main: "/tmp/kept/main.typ".into(),
        };
        assert!(!compile.is_environment());
        assert!(compile.to_string().contains("unknown variable"));
        assert!(compile.help().unwrap().to_string().contains("/tmp/kept"));

        assert!(
            compile
                .to_string()
                .starts_with("typst could not compile the document (it exited with status 1):\n")
        );
        let de = Catalogue::built_in("de").unwrap();
        let german = compile.in_language(&de);
        assert_eq!(
            german.code().unwrap().to_string(),
            "ampreport::typeset::compile_failed"
        );
        assert!(german.to_string().contains("unknown variable"), "{german}");
        assert!(
            !german.to_string().contains("could not compile"),
            "{german}"
        );
        assert!(german.help().unwrap().to_string().contains("/tmp/kept"));

        let io = TypesetError::io("cli-typst-io-write", "/x.pdf", io::Error::other("full"));
        assert!(!io.is_environment());
        assert_eq!(io.to_string(), "could not write /x.pdf");
    }
}
