//! The KDL parser's words in the catalogue's: the `kdl` crate reports a
//! broken file with English messages, labels and help of its own. Those
//! this program knows (the parser's fixed sentences, and "Expected X" /
//! "not X" for the things it expects) are said from the catalogue
//! (`diag-kdl-…`), so a German shop reads them in German; any other is
//! quoted as the parser wrote it.

use crate::catalogue::{Arg, Msg};

use super::decode_error::Text;

/// The parser's fixed sentences and the catalogue's key for each.
const SENTENCES: &[(&str, &str)] = &[
    ("Expected end of document", "diag-kdl-end-of-document"),
    (
        "Closing '}' was not found after nodes",
        "diag-kdl-no-closing-brace",
    ),
    (
        "No closing '}' for child block",
        "diag-kdl-no-closing-brace",
    ),
    (
        "Unexpected newline in single-line quoted string",
        "diag-kdl-newline-in-string",
    ),
    ("missing string closing quote", "diag-kdl-no-closing-quote"),
    (
        "missing multiline string closing quotes",
        "diag-kdl-no-closing-quotes",
    ),
    (
        "matching multiline string prefix",
        "diag-kdl-multiline-prefix",
    ),
    ("Found invalid node name", "diag-kdl-bad-node-name"),
    (
        "Found child block instead of node name",
        "diag-kdl-block-without-name",
    ),
    (
        "Non-digit character found after the '.' of a float",
        "diag-kdl-bad-fraction",
    ),
    (
        "Non-digit character found in the exponent part of a float",
        "diag-kdl-bad-exponent",
    ),
    (
        "invalid contents inside type annotation",
        "diag-kdl-bad-type-annotation",
    ),
    (
        "Single-line raw strings cannot look like multi-line ones",
        "diag-kdl-raw-string-shape",
    ),
    (
        "Tried to parse a negative number as an unsigned integer",
        "diag-kdl-negative-unsigned",
    ),
];

/// The things the parser says it expected, and the catalogue's words.
const THINGS: &[(&str, &str)] = &[
    ("node name", "diag-kdl-thing-node-name"),
    ("identifier string", "diag-kdl-thing-identifier"),
    ("quoted string", "diag-kdl-thing-quoted-string"),
    ("raw string", "diag-kdl-thing-raw-string"),
    ("multi-line string", "diag-kdl-thing-multiline-string"),
    (
        "multi-line quoted string",
        "diag-kdl-thing-multiline-string",
    ),
    ("property value", "diag-kdl-thing-property-value"),
    ("type name", "diag-kdl-thing-type-name"),
    ("keyword", "diag-kdl-thing-keyword"),
    ("integer", "diag-kdl-thing-integer"),
    ("float", "diag-kdl-thing-float"),
    ("binary", "diag-kdl-thing-binary"),
    ("binary number", "diag-kdl-thing-binary"),
    ("octal", "diag-kdl-thing-octal"),
    ("octal number", "diag-kdl-thing-octal"),
    ("hexadecimal", "diag-kdl-thing-hexadecimal"),
    ("hexadecimal number", "diag-kdl-thing-hexadecimal"),
    ("newline", "diag-kdl-thing-newline"),
    ("EOF", "diag-kdl-thing-end"),
    (
        "closing of multi-line comment",
        "diag-kdl-thing-comment-end",
    ),
    ("raw string closing quotes", "diag-kdl-thing-closing-quotes"),
    (
        "multiline raw string closing quotes",
        "diag-kdl-thing-closing-quotes",
    ),
    ("unicode escape char", "diag-kdl-thing-unicode-escape"),
];

/// The parser's help texts and the catalogue's key for each.
const HELP: &[(&str, &str)] = &[
    (
        "Did you forget to escape something?",
        "diag-kdl-help-escape",
    ),
    (
        "Did you forget to add the node name itself? Or perhaps terminated the node before its child block?",
        "diag-kdl-help-node-name",
    ),
    (
        "A valid value was partially parsed, but was not followed by a value terminator. Did you want a space here?",
        "diag-kdl-help-terminator",
    ),
    (
        "Floats with exponent parts should look like '2.0e123', or '43.3E-4'.",
        "diag-kdl-help-exponent",
    ),
    (
        "This can be any string type, including a quoted, raw, or multiline string, as well as a plain identifier string.",
        "diag-kdl-help-string",
    ),
];

fn key_of(table: &[(&str, &'static str)], text: &str) -> Option<&'static str> {
    table.iter().find(|(t, _)| *t == text).map(|(_, k)| *k)
}

/// The catalogue's words for a thing the parser expected.
fn thing(text: &str) -> Option<Msg> {
    key_of(THINGS, text.trim()).map(Msg::new)
}

/// The parser's message: a sentence the catalogue has, "expected X",
/// else the parser's own words.
pub(crate) fn message(text: &str) -> Arg {
    let text = text.trim();
    if let Some(key) = key_of(SENTENCES, text) {
        return Msg::new(key).into();
    }
    if let Some(what) = text.strip_prefix("Expected ").and_then(thing) {
        return Msg::new("diag-kdl-expected").arg("what", what).into();
    }
    text.into()
}

/// The parser's label: "not X" in the catalogue's words, else its own.
pub(crate) fn label(text: &str) -> Text {
    match text.trim().strip_prefix("not ").and_then(thing) {
        Some(what) => Msg::new("diag-kdl-not").arg("what", what).into(),
        None => text.into(),
    }
}

/// The parser's help in the catalogue's words, else its own.
pub(crate) fn help(text: &str) -> Text {
    match key_of(HELP, text.trim()) {
        Some(key) => Msg::new(key).into(),
        None => text.into(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::catalogue::Catalogue;

    #[test]
    fn the_parsers_words_are_the_catalogues_where_known() {
        let de = Catalogue::built_in("de").unwrap();
        let said = |a: Arg| match a {
            Arg::Message(m) => de.say(&m),
            Arg::Text(t) => t,
            Arg::Number(n) => n.to_string(),
        };
        assert_eq!(
            said(message("No closing '}' for child block")),
            "der Block der Unterknoten wird nicht mit `}` geschlossen"
        );
        assert_eq!(
            said(message("Expected quoted string")),
            "erwartet: eine Zeichenkette in Anführungszeichen"
        );
        // Words the program does not know are quoted as the parser wrote
        // them.
        assert_eq!(said(message("Something new")), "Something new");
        let Text::Said(not) = label("not node name") else {
            panic!("a known label")
        };
        assert_eq!(de.say(&not), "hier gehört ein Knotenname hin");
        assert!(matches!(label("not anything else"), Text::Plain(_)));
        assert!(matches!(
            help("Did you forget to escape something?"),
            Text::Said(_)
        ));
    }

    /// Every sentence, thing and help of the tables reads in every built-in
    /// catalogue.
    #[test]
    fn every_key_of_the_tables_is_in_every_catalogue() {
        for (tag, _) in crate::catalogue::BUILT_IN {
            let c = Catalogue::built_in(tag).unwrap();
            for (_, key) in SENTENCES.iter().chain(THINGS).chain(HELP) {
                assert!(c.has(key), "{tag}: {key}");
            }
        }
    }
}
