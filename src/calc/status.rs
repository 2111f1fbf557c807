//! Statuses are data: every derived figure says ok / caution / over (or
//! cold, for a fixed-bias valve idling below its aim), why, and against
//! which threshold.

use crate::catalogue::{Arg, Catalogue, Message};
use crate::units::fixed;
use rustc_hash::FxHashMap;
use serde::Serialize;
use std::cell::RefCell;
use std::fmt;

/// How a figure stands against its limit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Status {
    Ok,
    /// A fixed-bias valve idling below its aim (crossover distortion risk).
    Cold,
    Caution,
    Over,
}

impl Status {
    /// Severity for ordering: over > caution > cold > ok.
    pub fn rank(self) -> u8 {
        match self {
            Status::Ok => 0,
            Status::Cold => 1,
            Status::Caution => 2,
            Status::Over => 3,
        }
    }

    /// The word printed on pages and in the terminal.
    pub fn word(self) -> &'static str {
        match self {
            Status::Ok => "ok",
            Status::Cold => "cold",
            Status::Caution => "caution",
            Status::Over => "over",
        }
    }

    /// The worse of two statuses.
    pub fn worst(self, other: Status) -> Status {
        if other.rank() > self.rank() {
            other
        } else {
            self
        }
    }
}

impl fmt::Display for Status {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.word())
    }
}

/// A status with its reason in words and the threshold that decided it,
/// and whether the technician has accepted it as it is.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Verdict {
    pub status: Status,
    pub reason: String,
    pub threshold: String,
    /// The deciding figure in a few words ("screen 196 %"), for a table's
    /// status column.
    pub brief: String,
    /// The technician judged this figure and accepted it: it keeps its
    /// status but no longer counts against the unit.
    pub accepted: bool,
    pub accepted_reason: Option<String>,
    pub accepted_by: Option<String>,
    /// ISO 8601 date.
    pub accepted_date: Option<String>,
}

impl Verdict {
    pub fn new(status: Status, reason: impl Into<String>, threshold: impl Into<String>) -> Self {
        Verdict {
            status,
            reason: reason.into(),
            threshold: threshold.into(),
            brief: String::new(),
            accepted: false,
            accepted_reason: None,
            accepted_by: None,
            accepted_date: None,
        }
    }

    /// Not ok and not accepted: a finding that still counts.
    pub fn is_open(&self) -> bool {
        self.status != Status::Ok && !self.accepted
    }

    /// Marks the verdict accepted, when there is something to accept.
    /// Returns whether it did.
    pub fn accept(&mut self, reason: &str, by: &str, date: &str) -> bool {
        if self.status == Status::Ok {
            return false;
        }
        self.accepted = true;
        self.accepted_reason = Some(reason.to_string());
        self.accepted_by = Some(by.to_string());
        self.accepted_date = Some(date.to_string());
        true
    }

    pub fn ok(reason: impl Into<String>, threshold: impl Into<String>) -> Self {
        Verdict::new(Status::Ok, reason, threshold)
    }
}

/// The worst status among the verdicts that still count (ok when every
/// figure is ok or accepted).
pub fn worst_open<'a>(verdicts: impl IntoIterator<Item = &'a Verdict>) -> Status {
    verdicts
        .into_iter()
        .filter(|v| v.is_open())
        .fold(Status::Ok, |a, v| a.worst(v.status))
}

/// The verdict with the worst status among several (the first of equals).
pub fn worst_of<'a>(verdicts: impl IntoIterator<Item = &'a Verdict>) -> Option<&'a Verdict> {
    let mut best: Option<&Verdict> = None;
    for v in verdicts {
        if best.is_none_or(|b| v.status.rank() > b.status.rank()) {
            best = Some(v);
        }
    }
    best
}

/// What [`SaidOnce`] keeps words by: the name's address and length, and
/// the figures' bits.
type SaidKey = (usize, usize, [u64; 3]);

/// Words that are the same in every set of a job: a threshold depends
/// only on the job's settings and a rating ("caution above 50 % of 5 W,
/// over above 100 %"), and a long job said each of them again in every
/// set, some forty a set. Each is worked out the first time it is asked
/// for and copied after that, so the words are those it would say each
/// time.
///
/// One lives for a run of sets on one thread (it is not shared between
/// threads), with one catalogue: its words are that catalogue's.
///
/// It also keeps each message the sets say looked up in the catalogue
/// ([`SaidOnce::say`]): a long job's sets say the same hundred or so
/// messages some hundred times a set, and finding a message's part and
/// pattern by its key was a quarter of saying it.
pub(crate) struct SaidOnce<'c> {
    cat: &'c Catalogue,
    /// By what is said (a message key or a name of the words: where its
    /// text is and how long it is, as a `&'static str` never changes; the
    /// same name at two places is only kept twice) and every figure the
    /// words are made from, as bits.
    said: RefCell<FxHashMap<SaidKey, String>>,
    /// The messages looked up, by where their key is and how long it is.
    messages: RefCell<FxHashMap<(usize, usize), Message<'c>>>,
}

impl<'c> SaidOnce<'c> {
    /// Nothing said yet, in the words of `cat`.
    pub(crate) fn new(cat: &'c Catalogue) -> Self {
        SaidOnce {
            cat,
            said: RefCell::default(),
            messages: RefCell::default(),
        }
    }

    /// The catalogue whose words these are.
    pub(crate) fn catalogue(&self) -> &'c Catalogue {
        self.cat
    }

    /// The message `key` of the catalogue, looked up the first time it is
    /// asked for.
    pub(crate) fn message(&self, key: &'static str) -> Message<'c> {
        let at = (key.as_ptr() as usize, key.len());
        if let Some(message) = self.messages.borrow().get(&at) {
            return *message;
        }
        let message = self.cat.message(key);
        self.messages.borrow_mut().insert(at, message);
        message
    }

    /// What [`Catalogue::format_str`] says, the message looked up once.
    pub(crate) fn say(&self, key: &'static str, args: &[(&str, &str)]) -> String {
        self.message(key).format_str(args)
    }

    /// The words `say` makes, which must depend on nothing but `what`,
    /// `figures`, the job's settings and the catalogue.
    pub(crate) fn words(
        &self,
        what: &'static str,
        figures: [f64; 3],
        say: impl FnOnce() -> String,
    ) -> String {
        let key = (
            what.as_ptr() as usize,
            what.len(),
            figures.map(f64::to_bits),
        );
        if let Some(words) = self.said.borrow().get(&key) {
            return words.clone();
        }
        let words = say();
        self.said.borrow_mut().insert(key, words.clone());
        words
    }

    /// A message without arguments.
    pub(crate) fn text(&self, key: &'static str) -> String {
        self.words(key, [0.0; 3], || self.say(key, &[]))
    }
}

/// The threshold of [`under_rating`]: "caution above 50 % of 5 W, over
/// above 100 %" (its message is given `caution` and `rating` only; a
/// translation may use no other argument).
pub fn under_rating_threshold(caution: f64, rating: &str, cat: &Catalogue) -> String {
    cat.format(
        "threshold-under-rating",
        &[
            ("rating", Arg::from(rating)),
            ("caution", Arg::from(fixed(caution * 100.0, 0))),
        ],
    )
}

/// Bands for a figure that must stay under a rating: caution above
/// `caution` (a fraction of the rating), over above 100 %. `what` names the
/// figure with its value ("dissipation 0.62 W"); the words are `cat`'s.
/// (The program makes the threshold once a job: [`under_rating_judged`].)
#[cfg(test)]
pub fn under_rating(pct: f64, caution: f64, what: &str, rating: &str, cat: &Catalogue) -> Verdict {
    let threshold = under_rating_threshold(caution, rating, cat);
    under_rating_judged(pct, caution, what, rating, threshold, &SaidOnce::new(cat))
}

/// [`under_rating`] with its threshold in words already made.
pub(crate) fn under_rating_judged(
    pct: f64,
    caution: f64,
    what: &str,
    rating: &str,
    threshold: String,
    once: &SaidOnce,
) -> Verdict {
    let (status, key) = if pct > 100.0 {
        (Status::Over, "reason-of-rating")
    } else if pct > caution * 100.0 {
        (Status::Caution, "reason-of-rating-guide")
    } else {
        (Status::Ok, "reason-of-rating")
    };
    let message = once.message(key);
    // The guide's share in words only for a message that says it.
    let caution_words = if message.uses("caution") {
        fixed(caution * 100.0, 0)
    } else {
        String::new()
    };
    let pct_words = fixed(pct, 0);
    let reason = message.format_str(&[
        ("what", what),
        ("pct", pct_words.as_str()),
        ("rating", rating),
        ("caution", caution_words.as_str()),
    ]);
    Verdict::new(status, reason, threshold)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn worst_orders_by_severity() {
        assert_eq!(Status::Ok.worst(Status::Cold), Status::Cold);
        assert_eq!(Status::Caution.worst(Status::Cold), Status::Caution);
        assert_eq!(Status::Over.worst(Status::Caution), Status::Over);
        let v = [
            Verdict::ok("a", ""),
            Verdict::new(Status::Caution, "b", ""),
            Verdict::new(Status::Caution, "c", ""),
        ];
        assert_eq!(worst_of(&v).map(|v| v.reason.as_str()), Some("b"));
    }

    #[test]
    fn words_said_once_are_the_words_said_each_time() {
        let once = SaidOnce::new(Catalogue::english());
        let mut made = 0;
        let mut say = |what: &'static str, figures: [f64; 3]| {
            once.words(what, figures, || {
                made += 1;
                format!("{what} {figures:?}")
            })
        };
        assert_eq!(say("a", [1.0, 2.0, 3.0]), "a [1.0, 2.0, 3.0]");
        assert_eq!(say("a", [1.0, 2.0, 3.0]), "a [1.0, 2.0, 3.0]");
        // Another figure, another name, or −0 against 0: other words.
        assert_eq!(say("a", [1.0, 2.0, 4.0]), "a [1.0, 2.0, 4.0]");
        assert_eq!(say("b", [1.0, 2.0, 3.0]), "b [1.0, 2.0, 3.0]");
        assert_eq!(say("a", [-0.0, 0.0, 0.0]), "a [-0.0, 0.0, 0.0]");
        assert_eq!(say("a", [0.0, 0.0, 0.0]), "a [0.0, 0.0, 0.0]");
        assert_eq!(say("a", [1.0, 2.0, 3.0]), "a [1.0, 2.0, 3.0]");
        assert_eq!(made, 5);
        // Words that need words said once inside them; kept by the name
        // (one text, wherever it is used).
        let inner: &'static str = "inner";
        let nested = once.words("outer", [0.0; 3], || {
            format!("<{}>", once.words(inner, [0.0; 3], || "in".into()))
        });
        assert_eq!(nested, "<in>");
        assert_eq!(once.words(inner, [0.0; 3], || "other".into()), "in");
        // A name that is another's beginning is another name.
        let both = "inner-most";
        assert_eq!(once.words(&both[..5], [0.0; 3], || "in".into()), "in");
        assert_eq!(once.words(both, [0.0; 3], || "most".into()), "most");
    }

    #[test]
    fn messages_looked_up_once_say_what_the_catalogue_says() {
        for cat in [Catalogue::english(), &Catalogue::built_in("de").unwrap()] {
            let once = SaidOnce::new(cat);
            for _ in 0..2 {
                for (key, args) in [
                    (
                        "reason-voltage-of-max",
                        &[
                            ("what", "plate voltage"),
                            ("volts", "453 V"),
                            ("pct", "107"),
                            ("max", "425 V"),
                        ][..],
                    ),
                    ("brief-plate", &[("pct", "79 %")][..]),
                    ("place-between", &[("from", "B+1"), ("to", "B+2")][..]),
                    ("reason-no-chart", &[][..]),
                    ("no-such-key", &[("x", "y")][..]),
                ] {
                    assert_eq!(once.say(key, args), cat.format_str(key, args), "{key}");
                }
                assert_eq!(
                    once.text("reason-inside-aim"),
                    cat.text("reason-inside-aim")
                );
            }
        }
    }

    #[test]
    fn the_threshold_made_apart_is_the_one_under_rating_makes() {
        for cat in [Catalogue::english(), &Catalogue::built_in("de").unwrap()] {
            for (pct, caution, rating) in [
                (49.0, 0.5, "1 W"),
                (75.0, 0.6, "5 W"),
                (130.0, 1.0, "250 mW"),
            ] {
                let v = under_rating(pct, caution, "x", rating, cat);
                assert_eq!(v.threshold, under_rating_threshold(caution, rating, cat));
                // The threshold's message is given every argument of the
                // reason's before; it uses only these two.
                let all = cat.format(
                    "threshold-under-rating",
                    &[
                        ("what", Arg::from("x")),
                        ("pct", Arg::from(fixed(pct, 0))),
                        ("rating", Arg::from(rating)),
                        ("caution", Arg::from(fixed(caution * 100.0, 0))),
                    ],
                );
                assert_eq!(v.threshold, all);
            }
        }
    }

    #[test]
    fn bands_under_a_rating() {
        let en = Catalogue::english();
        // Common practice: 50 % derating for resistors; over above 100 %.
        assert_eq!(under_rating(49.0, 0.5, "x", "1 W", en).status, Status::Ok);
        assert_eq!(under_rating(50.0, 0.5, "x", "1 W", en).status, Status::Ok);
        assert_eq!(
            under_rating(50.1, 0.5, "x", "1 W", en).status,
            Status::Caution
        );
        assert_eq!(
            under_rating(100.0, 0.5, "x", "1 W", en).status,
            Status::Caution
        );
        assert_eq!(
            under_rating(100.1, 0.5, "x", "1 W", en).status,
            Status::Over
        );
    }
}
