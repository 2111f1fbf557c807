//! The minijinja set-up for Typst templates, built so that a template cannot
//! print user text unescaped: every `{{ value }}` passes through
//! [`escape_markup`] on its way out. The only way around it is a value the
//! program itself wraps with [`typst_markup`], for Typst snippets it
//! generated; a template has no means to make one, so filters such as
//! minijinja's `safe` cannot switch escaping off.
//!
//! Templates come from a built-in list, with an optional folder whose files
//! take precedence (the `--templates DIR` option).

use std::fmt;
use std::path::{Path, PathBuf};
use std::sync::Arc;

use minijinja::value::{Object, Value};
use minijinja::{Environment, Error, ErrorKind, UndefinedBehavior};

use super::escape::{escape_markup, escape_string};

/// Where templates are read from.
#[derive(Debug, Clone, Default)]
pub struct TemplateSource {
    /// Built-in templates as (name, source).
    pub embedded: &'static [(&'static str, &'static str)],
    /// A folder whose files replace built-in templates of the same name and
    /// may add new ones.
    pub override_dir: Option<PathBuf>,
}

impl TemplateSource {
    pub fn embedded(embedded: &'static [(&'static str, &'static str)]) -> Self {
        Self {
            embedded,
            override_dir: None,
        }
    }

    pub fn with_override_dir(mut self, dir: impl Into<PathBuf>) -> Self {
        self.override_dir = Some(dir.into());
        self
    }
}

/// A piece of Typst source made by the program (a table built from figures,
/// a set rule), printed by templates as it is.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TypstMarkup(pub String);

impl Object for TypstMarkup {
    fn render(self: &Arc<Self>, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

/// Wraps program-generated Typst source so the template prints it without
/// escaping. Never pass user text here: escape it first with
/// [`escape_markup`].
pub fn typst_markup(source: impl Into<String>) -> Value {
    Value::from_object(TypstMarkup(source.into()))
}

/// A minijinja environment for Typst templates.
///
/// * every printed value is escaped for Typst markup, except
///   [`typst_markup`] values; `none` and undefined print nothing;
/// * `{{ x|typst_string }}` prints a complete Typst string literal, quotes
///   included, for use in code (`#set document(title: {{ t|typst_string }})`);
/// * the `safe`, `escape` and `e` filters are removed: they would suggest an
///   opt-out that does not exist here;
/// * an undefined variable is an error, so a misspelt name does not quietly
///   print nothing.
pub fn template_environment(templates: TemplateSource) -> Environment<'static> {
    let mut env = Environment::new();
    env.set_undefined_behavior(UndefinedBehavior::Strict);
    env.set_keep_trailing_newline(true);
    env.set_auto_escape_callback(|_| minijinja::AutoEscape::None);
    for name in ["safe", "escape", "e"] {
        env.remove_filter(name);
    }
    env.add_filter("typst_string", typst_string);
    env.set_formatter(|out, _state, value| {
        if let Some(markup) = value.downcast_object_ref::<TypstMarkup>() {
            out.write_str(&markup.0)?;
        } else if !(value.is_none() || value.is_undefined()) {
            out.write_str(&escape_markup(&value.to_string()))?;
        }
        Ok(())
    });
    let TemplateSource {
        embedded,
        override_dir,
    } = templates;
    env.set_loader(move |name| {
        if let Some(dir) = &override_dir
            && let Some(source) = load_from_dir(dir, name)?
        {
            return Ok(Some(source));
        }
        Ok(embedded
            .iter()
            .find(|(n, _)| *n == name)
            .map(|(_, source)| (*source).to_owned()))
    });
    env
}

/// The `typst_string` filter: the value as a quoted Typst string literal.
fn typst_string(value: Value) -> Value {
    let text = if value.is_none() || value.is_undefined() {
        String::new()
    } else {
        value.to_string()
    };
    typst_markup(format!("\"{}\"", escape_string(&text)))
}

/// Reads template `name` from `dir`, if the file exists there. Names must be
/// plain relative paths with `/` between folders.
fn load_from_dir(dir: &Path, name: &str) -> Result<Option<String>, Error> {
    let bad = name.is_empty()
        || name.starts_with('/')
        || name.contains('\\')
        || name.contains(':')
        || name
            .split('/')
            .any(|p| p.is_empty() || p == "." || p == "..");
    if bad {
        return Err(Error::new(
            ErrorKind::TemplateNotFound,
            format!("template name `{name}` is not a plain relative path"),
        ));
    }
    let path = name
        .split('/')
        .fold(dir.to_path_buf(), |acc, p| acc.join(p));
    match std::fs::read_to_string(&path) {
        Ok(source) => Ok(Some(source)),
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => Ok(None),
        Err(e) => Err(Error::new(
            ErrorKind::InvalidOperation,
            format!("could not read template {}", path.display()),
        )
        .with_source(e)),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use minijinja::context;

    static BUILT_IN: &[(&str, &str)] = &[
        ("page.typ", "= {{ title }}\n{{ body }}\n"),
        ("other.typ", "built-in other"),
    ];

    fn env() -> Environment<'static> {
        template_environment(TemplateSource::embedded(BUILT_IN))
    }

    fn render(source: &str, ctx: Value) -> Result<String, Error> {
        env().render_str(source, ctx)
    }

    #[test]
    fn every_value_is_escaped() {
        let out = env()
            .get_template("page.typ")
            .unwrap()
            .render(context! { title => "#read(\"x\")", body => "*b* $m$" })
            .unwrap();
        assert_eq!(out, "= \\#read\\(\\\"x\\\"\\)\n\\*b\\* \\$m\\$\n");
    }

    #[test]
    fn numbers_lists_and_none() {
        let out = render(
            "{{ n }}|{{ xs }}|{{ nothing }}|",
            context! { n => -1.5, xs => vec!["a_b"], nothing => () },
        )
        .unwrap();
        assert_eq!(out, "\\-1\\.5|\\[\\\"a\\_b\\\"\\]||");
    }

    #[test]
    fn program_markup_is_printed_as_is() {
        let out = render(
            "{{ table }} {{ name }}",
            context! { table => typst_markup("#table(columns: 2)[a][b]"), name => "#x" },
        )
        .unwrap();
        assert_eq!(out, "#table(columns: 2)[a][b] \\#x");
    }

    #[test]
    fn a_template_cannot_opt_out() {
        for source in ["{{ x|safe }}", "{{ x|e }}", "{{ x|escape }}"] {
            assert!(render(source, context! { x => "#x" }).is_err(), "{source}");
        }
        // Filters that return strings give strings, which are escaped again.
        let out = render("{{ x|upper }}{{ x|trim }}", context! { x => "#x" }).unwrap();
        assert_eq!(out, "\\#X\\#x");
        // A wrapped value that passes through a filter loses its wrapping.
        let out = render("{{ m|lower }}", context! { m => typst_markup("#A") }).unwrap();
        assert_eq!(out, "\\#a");
        // Autoescape blocks change nothing.
        let out = render(
            "{% autoescape 'html' %}{{ x }}{% endautoescape %}",
            context! { x => "<#>" },
        )
        .unwrap();
        assert_eq!(out, "\\<\\#\\>");
    }

    #[test]
    fn typst_string_gives_a_whole_literal() {
        let out = render(
            "#set document(title: {{ t|typst_string }})",
            context! { t => "a \"b\"\\\nc" },
        )
        .unwrap();
        assert_eq!(out, "#set document(title: \"a \\\"b\\\"\\\\\\nc\")");
        let out = render("{{ n|typst_string }}", context! { n => () }).unwrap();
        assert_eq!(out, "\"\"");
    }

    #[test]
    fn undefined_is_an_error() {
        assert!(render("{{ missing }}", context! {}).is_err());
    }

    #[test]
    fn override_folder_wins_and_falls_back() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(dir.path().join("page.typ"), "shop page {{ title }}").unwrap();
        std::fs::create_dir(dir.path().join("parts")).unwrap();
        std::fs::write(dir.path().join("parts").join("new.typ"), "new").unwrap();
        let env =
            template_environment(TemplateSource::embedded(BUILT_IN).with_override_dir(dir.path()));
        let page = env.get_template("page.typ").unwrap();
        assert_eq!(
            page.render(context! { title => "_" }).unwrap(),
            "shop page \\_"
        );
        let other = env.get_template("other.typ").unwrap();
        assert_eq!(other.render(()).unwrap(), "built-in other");
        assert_eq!(
            env.get_template("parts/new.typ")
                .unwrap()
                .render(())
                .unwrap(),
            "new"
        );
        assert!(env.get_template("missing.typ").is_err());
        assert!(env.get_template("../secret").is_err());
    }
}
