//! Statuses are data: every derived figure says ok / caution / over (or
//! cold, for a fixed-bias valve idling below its aim), why, and against
//! which threshold.

use crate::catalogue::{Arg, Catalogue, Message};
use crate::units::{fixed, fixed_digits};
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

/// What [`SaidOnce::fixed_words`] keeps words by: the message key's and
/// the name's address and length, each figure's digits as `fixed` writes
/// them (the integer, then its decimals and sign; `u64::MAX` twice where
/// there is no such figure) and the other figures' bits.
type FixedKey = (usize, usize, usize, usize, [u64; 6]);

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
    /// Words made from figures as `fixed` writes them
    /// ([`SaidOnce::fixed_words`]).
    fixed: RefCell<FxHashMap<FixedKey, String>>,
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
            fixed: RefCell::default(),
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

    /// The words `say` makes from `figures`, each written as `fixed` writes
    /// it with its number of decimals (`fixed(figure, decimals)`, given to
    /// `say` in order), kept by those digits: a share such as "plate 79 %"
    /// or a part's "dissipation 0.45 W is 22 % of its 2 W rating" comes
    /// back to the same few dozen words set after set. `say` must depend on
    /// nothing but the words it is given, the message `key`, the `name` (a
    /// second fixed text, such as the message naming the figure, or ""),
    /// the `others` figures, the job's settings and the catalogue.
    ///
    /// The words are kept by what `fixed` writes ([`fixed_digits`]: the
    /// integer of its digits, its sign and decimals), so every figure kept
    /// with them is written the same. A figure `fixed` writes another way
    /// (near a tie, not finite) is said from the figures themselves, each
    /// time, as are more than two figures.
    pub(crate) fn fixed_words<const N: usize>(
        &self,
        key: &'static str,
        name: &'static str,
        figures: [(f64, usize); N],
        others: [f64; 2],
        say: impl FnOnce([String; N]) -> String,
    ) -> String {
        let mut digits = [u64::MAX; 6];
        digits[4] = others[0].to_bits();
        digits[5] = others[1].to_bits();
        for (i, (figure, decimals)) in figures.iter().enumerate() {
            match fixed_digits(*figure, *decimals) {
                Some((negative, n)) if i < 2 => {
                    digits[2 * i] = n;
                    digits[2 * i + 1] = (*decimals as u64) << 1 | u64::from(negative);
                }
                _ => return say(figures.map(|(f, d)| fixed(f, d))),
            }
        }
        let at = (
            key.as_ptr() as usize,
            key.len(),
            name.as_ptr() as usize,
            name.len(),
            digits,
        );
        if let Some(words) = self.fixed.borrow().get(&at) {
            return words.clone();
        }
        let words = say(figures.map(|(f, d)| fixed(f, d)));
        self.fixed.borrow_mut().insert(at, words.clone());
        words
    }

    /// [`SaidOnce::fixed_words`] of one figure in whole numbers
    /// (`fixed(figure, 0)`).
    pub(crate) fn whole_words(
        &self,
        key: &'static str,
        name: &'static str,
        figure: f64,
        others: [f64; 2],
        say: impl FnOnce(&str) -> String,
    ) -> String {
        self.fixed_words(key, name, [(figure, 0)], others, |[whole]| say(&whole))
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
/// (The program makes the threshold once a job and keeps the reasons by
/// their figures' words: [`under_rating_named`] and the resistors' own.)
#[cfg(test)]
pub fn under_rating(pct: f64, caution: f64, what: &str, rating: &str, cat: &Catalogue) -> Verdict {
    let threshold = under_rating_threshold(caution, rating, cat);
    let (status, key) = rating_band(pct, caution);
    let reason = rating_reason(cat.message(key), what, &fixed(pct, 0), rating, caution);
    Verdict::new(status, reason, threshold)
}

/// [`under_rating`] for a figure named by a message of its own
/// (`what`: "reason-screen-dissipation") against a rating of `rating_figure`
/// (`rating` in words): its reason depends on nothing else than the share
/// in whole percent, so it is said once for each ([`SaidOnce::whole_words`]).
pub(crate) fn under_rating_named(
    pct: f64,
    caution: f64,
    what: &'static str,
    rating_figure: f64,
    rating: &str,
    threshold: String,
    once: &SaidOnce,
) -> Verdict {
    let (status, key) = rating_band(pct, caution);
    let reason = once.whole_words(key, what, pct, [rating_figure, caution], |pct_words| {
        rating_reason(
            once.message(key),
            &once.text(what),
            pct_words,
            rating,
            caution,
        )
    });
    Verdict::new(status, reason, threshold)
}

/// The status of a share `pct` of a rating and the message of its reason.
pub(crate) fn rating_band(pct: f64, caution: f64) -> (Status, &'static str) {
    if pct > 100.0 {
        (Status::Over, "reason-of-rating")
    } else if pct > caution * 100.0 {
        (Status::Caution, "reason-of-rating-guide")
    } else {
        (Status::Ok, "reason-of-rating")
    }
}

/// "screen dissipation is 40 % of its 8 W rating" (with the guide's share
/// where the message says it).
pub(crate) fn rating_reason(
    message: Message,
    what: &str,
    pct_words: &str,
    rating: &str,
    caution: f64,
) -> String {
    let caution_words = if message.uses("caution") {
        fixed(caution * 100.0, 0)
    } else {
        String::new()
    };
    message.format_str(&[
        ("what", what),
        ("pct", pct_words),
        ("rating", rating),
        ("caution", caution_words.as_str()),
    ])
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

    /// Words kept by a figure's whole number are the words of the figure
    /// itself: shares of every size with every fraction, halves and the
    /// figures next to them, negatives, −0, huge and not finite ones.
    #[test]
    fn whole_words_are_the_figures_own() {
        let once = SaidOnce::new(Catalogue::english());
        let mut figures = vec![
            0.0,
            -0.0,
            -0.3,
            -0.7,
            0.5,
            1.5,
            2.5,
            -2.5,
            78.5,
            78.499_999_9,
            78.500_000_1,
            78.499_99,
            78.500_01,
            99.5,
            100.499_999,
            1e9 + 0.5,
            1e9 + 0.3,
            1e12 + 0.7,
            4_503_599_627_370_497.0,
            f64::MAX,
            f64::MIN_POSITIVE,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ];
        let mut next = crate::test_random::xorshift(0x5a1d_0ce5_0000_0001);
        for _ in 0..20_000 {
            let r = next();
            let whole = (r % 400) as f64 - 100.0;
            let fraction = (next() >> 11) as f64 / (1u64 << 53) as f64;
            figures.push(whole + fraction);
            figures.push(whole + 0.5 + ((r >> 40) % 2001) as f64 * 1e-9 - 1e-6);
        }
        for (i, figure) in figures.iter().enumerate() {
            // Two names, so some words are found kept and some made.
            let name = if i % 2 == 0 { "a" } else { "b" };
            let words = once.whole_words("k", name, *figure, [1.0, 2.0], |w| format!("<{w}>"));
            assert_eq!(words, format!("<{}>", fixed(*figure, 0)), "{figure:e}");
        }
    }

    /// Words kept by two figures' digits are those of the figures
    /// themselves, with every number of decimals: figures that `fixed`
    /// writes alike share them, and no others do.
    #[test]
    fn fixed_words_are_the_figures_own() {
        let once = SaidOnce::new(Catalogue::english());
        let mut next = crate::test_random::xorshift(0x0f1e_2d3c_4b5a_6978);
        let figure = |next: &mut dyn FnMut() -> u64| {
            let r = next();
            let size = [1.0, 10.0, 1e3, 1e9, 1e12][(r % 5) as usize];
            let sign = if r & 32 == 0 { 1.0 } else { -1.0 };
            let fraction = (next() >> 11) as f64 / (1u64 << 53) as f64;
            // Some on the halves of the second decimal, and next to them.
            match r % 7 {
                0 => sign * ((r >> 8) % 1000) as f64 / 100.0 + 0.005,
                1 => sign * (((r >> 8) % 1000) as f64 + 0.5),
                _ => sign * size * fraction,
            }
        };
        for _ in 0..20_000 {
            let a = figure(&mut next);
            let b = figure(&mut next);
            let (da, db) = ((next() % 4) as usize, (next() % 3) as usize);
            let words = once.fixed_words("k", "", [(a, da), (b, db)], [3.0, 0.0], |[x, y]| {
                format!("{x}|{y}")
            });
            assert_eq!(
                words,
                format!("{}|{}", fixed(a, da), fixed(b, db)),
                "{a:e} {b:e}"
            );
        }
        for special in [f64::NAN, f64::INFINITY, -0.0, 0.0, 2.5, -2.5] {
            let words =
                once.fixed_words("k", "", [(special, 0), (1.0, 0)], [3.0, 0.0], |[x, y]| {
                    format!("{x}|{y}")
                });
            assert_eq!(words, format!("{}|1", fixed(special, 0)));
        }
    }

    #[test]
    fn a_named_share_of_a_rating_says_what_under_rating_says() {
        for cat in [Catalogue::english(), &Catalogue::built_in("de").unwrap()] {
            let once = SaidOnce::new(cat);
            let what = once.text("reason-screen-dissipation");
            for pct in [
                12.3, 12.4, 49.5, 50.5, 64.0, 99.9, 100.4, 100.6, 196.2, 12.2,
            ] {
                for (max, rating) in [(8.0, "8 W"), (12.0, "12 W")] {
                    for caution in [0.5, 1.0] {
                        let threshold = under_rating_threshold(caution, rating, cat);
                        let named = under_rating_named(
                            pct,
                            caution,
                            "reason-screen-dissipation",
                            max,
                            rating,
                            threshold,
                            &once,
                        );
                        assert_eq!(named, under_rating(pct, caution, &what, rating, cat));
                    }
                }
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
