//! The job's charges, as written: labour lines (hours at a rate, or a fixed
//! amount) and parts lines (a quantity at a unit price), with the money
//! kept as exact decimals ([`rust_decimal::Decimal`]) read from the text of
//! the file, never through a binary float. Decoding only reads them; the
//! hand-over document's context works out the totals.

use crate::kdl_fast::{Entry, Node, Value};
use miette::SourceSpan;
use rust_decimal::Decimal;
use serde::Serialize;

use super::decode_error::DecodeError;
use super::model::Spanned;
use super::reader::Reader;
use crate::catalogue::Msg;

/// The largest amount, rate, price, quantity or hours a charges line may
/// hold (a billion): far above any bench job, and low enough that every
/// product and sum stays exact in a `Decimal`.
pub const MONEY_LIMIT: i64 = 1_000_000_000;

/// At most this many decimal places in a written amount.
pub const MONEY_PLACES: u32 = 6;

/// The `charges` block of a job, with the currency and tax settled: the
/// job's own, else the shop profile's.
#[derive(Debug, Clone, Serialize)]
pub struct Charges {
    pub lines: Vec<ChargeLine>,
    pub currency: String,
    /// Tax rate in percent, 0 when no tax is charged.
    pub tax_rate_pct: Decimal,
    /// What the tax is called ("VAT", "sales tax"); "tax" by default.
    pub tax_name: String,
    #[serde(skip)]
    pub span: SourceSpan,
}

/// Currency and tax a shop profile lends a job's `charges` block.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
pub struct ChargeTerms {
    pub currency: Option<String>,
    /// Percent, 0–100.
    pub tax_rate_pct: Option<Decimal>,
    /// What the tax is called on the document ("VAT", "sales tax").
    pub tax_name: Option<String>,
}

/// Places kept in every amount on the page, and in the totals: money is
/// rounded to the cent (or penny) line by line.
pub const CENT_PLACES: u32 = 2;

/// The worked-out charges: every line's amount, the subtotals, the tax and
/// the total, exact.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ChargeTotals {
    /// Each line's amount, in the job's order.
    pub lines: Vec<Decimal>,
    pub labour: Decimal,
    pub parts: Decimal,
    pub subtotal: Decimal,
    pub tax: Decimal,
    pub total: Decimal,
}

/// Rounds to the cent, halves away from zero (0.125 → 0.13), the usual
/// commercial rule.
pub fn to_cents(v: Decimal) -> Decimal {
    v.round_dp_with_strategy(
        CENT_PLACES,
        rust_decimal::RoundingStrategy::MidpointAwayFromZero,
    )
}

impl Charges {
    /// The amounts: each line (hours × rate, quantity × price, or the fixed
    /// amount) rounded to the cent; labour and parts summed; the tax is the
    /// rate applied to the subtotal, rounded to the cent; the total is the
    /// subtotal plus the tax. `None` only if a sum would not fit a
    /// `Decimal` (the decoder refuses such a job).
    pub fn totals(&self) -> Option<ChargeTotals> {
        let mut lines = Vec::with_capacity(self.lines.len());
        let (mut labour, mut parts) = (Decimal::ZERO, Decimal::ZERO);
        for line in &self.lines {
            let amount = match &line.amount {
                LineAmount::Hours { hours, rate } => hours.checked_mul(*rate)?,
                LineAmount::Quantity { quantity, price } => quantity.checked_mul(*price)?,
                LineAmount::Fixed { amount } => *amount,
            };
            let amount = to_cents(amount);
            match line.kind {
                ChargeKind::Labour => labour = labour.checked_add(amount)?,
                ChargeKind::Part => parts = parts.checked_add(amount)?,
            }
            lines.push(amount);
        }
        let subtotal = labour.checked_add(parts)?;
        let tax = to_cents(
            subtotal
                .checked_mul(self.tax_rate_pct)?
                .checked_div(Decimal::ONE_HUNDRED)?,
        );
        let total = subtotal.checked_add(tax)?;
        Some(ChargeTotals {
            lines,
            labour,
            parts,
            subtotal,
            tax,
            total,
        })
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum ChargeKind {
    Labour,
    Part,
}

/// One line of the charges.
#[derive(Debug, Clone, Serialize)]
pub struct ChargeLine {
    pub kind: ChargeKind,
    pub description: String,
    pub amount: LineAmount,
}

/// How a line's amount is made up.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "basis", rename_all = "snake_case")]
pub enum LineAmount {
    /// Labour: hours at an hourly rate.
    Hours { hours: Decimal, rate: Decimal },
    /// Parts: a quantity at a unit price.
    Quantity { quantity: Decimal, price: Decimal },
    /// A fixed amount.
    Fixed { amount: Decimal },
}

/// The child nodes of `charges`.
pub const CHARGE_NODES: &[&str] = &["labour", "part"];

pub(crate) fn decode_charges(
    node: Node<'_>,
    terms: &ChargeTerms,
    r: &mut Reader,
) -> Option<Charges> {
    r.check_entries(node, &["currency", "tax-rate", "tax-name"], 0);
    let currency = match Reader::prop(node, "currency") {
        Some(e) => currency(r, e).map(|c| c.value),
        None => match &terms.currency {
            Some(c) => Some(c.clone()),
            None => {
                r.push(
                    DecodeError::error(
                        "job::missing",
                        Reader::name_span(node),
                        Msg::new("diag-charges-currency"),
                        Msg::new("diag-currency-missing"),
                    )
                    .with_help(Msg::new("diag-charges-currency-help")),
                );
                None
            }
        },
    };
    let tax_rate_pct = match Reader::prop(node, "tax-rate") {
        Some(e) => tax_rate(r, e).map(|t| t.value),
        None => Some(terms.tax_rate_pct.unwrap_or(Decimal::ZERO)),
    };
    let tax_name = r
        .opt_prop_string(node, "tax-name")
        .or_else(|| terms.tax_name.clone())
        .unwrap_or_else(|| "tax".to_string());
    let mut lines = Vec::new();
    for child in r.children(node.children(), CHARGE_NODES, "`charges`") {
        r.no_children(child);
        let kind = if child.name().value() == "labour" {
            ChargeKind::Labour
        } else {
            ChargeKind::Part
        };
        let (props, example): (&[&str], &str) = match kind {
            ChargeKind::Labour => (
                &["hours", "rate", "amount"],
                "labour \"Fault-finding\" hours=\"1.5\" rate=\"48.00\"",
            ),
            ChargeKind::Part => (
                &["quantity", "price", "amount"],
                "part \"Filter capacitor 47 µF 500 V\" quantity=2 price=\"6.40\"",
            ),
        };
        r.check_entries(child, props, 1);
        let description = r.req_arg_string(child, Msg::new("diag-what-description"), example);
        let amount = line_amount(child, kind, example, r);
        if let (Some(description), Some(amount)) = (description, amount) {
            lines.push(ChargeLine {
                kind,
                description: description.value,
                amount,
            });
        }
    }
    let charges = Charges {
        lines,
        currency: currency?,
        tax_rate_pct: tax_rate_pct?,
        tax_name,
        span: node.span(),
    };
    if charges.totals().is_none() {
        r.push(DecodeError::error(
            "job::impossible-value",
            Reader::name_span(node),
            Msg::new("diag-charges-too-large"),
            Msg::new("diag-these-charges"),
        ));
        return None;
    }
    Some(charges)
}

fn line_amount(
    node: Node<'_>,
    kind: ChargeKind,
    example: &str,
    r: &mut Reader,
) -> Option<LineAmount> {
    let (count_key, price_key) = match kind {
        ChargeKind::Labour => ("hours", "rate"),
        ChargeKind::Part => ("quantity", "price"),
    };
    let count = Reader::prop(node, count_key);
    let price = Reader::prop(node, price_key);
    let fixed = Reader::prop(node, "amount");
    if let Some(fixed) = fixed {
        if let Some(other) = count.or(price) {
            r.push(
                DecodeError::error(
                    "job::charge-both",
                    other.span(),
                    Msg::new("diag-charge-both")
                        .arg("count", count_key)
                        .arg("price", price_key),
                    Msg::new("diag-charge-both-label"),
                )
                .with_help(
                    Msg::new("diag-charge-both-help")
                        .arg("count", count_key)
                        .arg("price", price_key),
                ),
            );
            return None;
        }
        let amount = money(r, fixed, "`amount`")?;
        return Some(LineAmount::Fixed { amount });
    }
    match (kind, count, price) {
        (ChargeKind::Labour, Some(h), Some(p)) => {
            let hours = money(r, h, "`hours`");
            let rate = money(r, p, "`rate`");
            let hours = nonzero(r, h, hours, "`hours`");
            Some(LineAmount::Hours {
                hours: hours?,
                rate: rate?,
            })
        }
        (ChargeKind::Part, quantity, Some(p)) => {
            let q = match quantity {
                Some(q) => {
                    let value = money(r, q, "`quantity`");
                    nonzero(r, q, value, "`quantity`")
                }
                None => Some(Decimal::ONE),
            };
            let price = money(r, p, "`price`");
            Some(LineAmount::Quantity {
                quantity: q?,
                price: price?,
            })
        }
        _ => {
            let want = Msg::new(match kind {
                ChargeKind::Labour => "diag-labour-needs",
                ChargeKind::Part => "diag-part-needs",
            });
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(node),
                    Msg::new("diag-missing")
                        .arg("node", node.name().value())
                        .arg("what", want),
                    Msg::new("diag-amount-missing"),
                )
                .with_help(Msg::new("diag-for-example").arg("example", example)),
            );
            None
        }
    }
}

fn nonzero(r: &mut Reader, entry: &Entry<'_>, v: Option<Decimal>, what: &str) -> Option<Decimal> {
    let v = v?;
    if v.is_zero() {
        r.push(DecodeError::error(
            "job::impossible-value",
            r.value_span(entry),
            Msg::new("diag-cannot-be-zero").arg("what", what),
            Msg::new("diag-more-than-zero"),
        ));
        return None;
    }
    Some(v)
}

/// A currency code or sign: short text such as "GBP", "EUR", "$".
pub(crate) fn currency(r: &mut Reader, entry: &Entry<'_>) -> Option<Spanned<String>> {
    let text = r.string(entry, "`currency`")?;
    let trimmed = text.value.trim();
    if trimmed.is_empty() || trimmed.chars().count() > 8 || trimmed.chars().any(char::is_control) {
        r.push(
            DecodeError::error(
                "job::bad-value",
                text.span,
                Msg::new("diag-currency-code"),
                Msg::new("diag-expected-currency"),
            )
            .with_help(Msg::new("diag-currency-help")),
        );
        return None;
    }
    Some(Spanned::new(trimmed.to_string(), text.span))
}

/// A tax rate in percent, 0 to 100: `"20%"`, `20` or `"8.875%"`.
pub(crate) fn tax_rate(r: &mut Reader, entry: &Entry<'_>) -> Option<Spanned<Decimal>> {
    let span = r.value_span(entry);
    let text = decimal_text(r, entry)?;
    let digits = text.trim().trim_end_matches('%').trim_end();
    match parse_decimal(digits) {
        Some(v) if v >= Decimal::ZERO && v <= Decimal::ONE_HUNDRED => Some(Spanned::new(v, span)),
        _ => {
            r.push(
                DecodeError::error(
                    "job::bad-value",
                    span,
                    Msg::new("diag-tax-rate").arg("found", text.trim()),
                    Msg::new("diag-expected-percentage"),
                )
                .with_help(Msg::new("diag-tax-rate-help")),
            );
            None
        }
    }
}

/// An amount of money, a rate, hours or a quantity: zero or more, exact,
/// from a plain number (read from its text in the file) or text such as
/// `"48.00"`.
pub(crate) fn money(r: &mut Reader, entry: &Entry<'_>, what: &str) -> Option<Decimal> {
    let span = r.value_span(entry);
    let text = decimal_text(r, entry)?;
    let value = parse_decimal(text.trim());
    match value {
        Some(v) if v.is_sign_negative() && !v.is_zero() => {
            r.push(
                DecodeError::error(
                    "job::impossible-value",
                    span,
                    Msg::new("diag-cannot-be-negative").arg("what", what),
                    Msg::new("diag-zero-or-more"),
                )
                .with_help(Msg::new("diag-charges-no-sign")),
            );
            None
        }
        Some(v) if v >= Decimal::from(MONEY_LIMIT) => {
            r.push(DecodeError::error(
                "job::impossible-value",
                span,
                Msg::new("diag-money-too-large")
                    .arg("what", what)
                    .arg("limit", MONEY_LIMIT.to_string()),
                Msg::new("diag-too-large"),
            ));
            None
        }
        Some(v) if v.scale() > MONEY_PLACES => {
            r.push(DecodeError::error(
                "job::bad-value",
                span,
                Msg::new("diag-too-many-places")
                    .arg("what", what)
                    .arg("places", MONEY_PLACES.to_string()),
                Msg::new("diag-too-many-decimals"),
            ));
            None
        }
        Some(v) => Some(v.normalize()),
        None => {
            r.push(
                DecodeError::error(
                    "job::bad-value",
                    span,
                    Msg::new("diag-plain-decimal")
                        .arg("what", what)
                        .arg("found", text.trim()),
                    Msg::new("diag-expected-money"),
                )
                .with_help(Msg::new("diag-money-help")),
            );
            None
        }
    }
}

/// The text of a number as written: the string's text, or a bare number's
/// own source text (so `1.1` is exactly 1.1, not the nearest binary float).
fn decimal_text(r: &mut Reader, entry: &Entry<'_>) -> Option<String> {
    match entry.value() {
        Value::String(s) => Some(s.to_string()),
        Value::Integer(i) => Some(i.to_string()),
        Value::Float(_) => {
            let span = r.value_span(entry);
            r.source
                .get(span.offset()..span.offset() + span.len())
                .map(|s| s.replace('_', ""))
        }
        _ => {
            r.push(DecodeError::error(
                "job::bad-value",
                r.value_span(entry),
                Msg::new("diag-expected-a-number"),
                Msg::new("diag-expected-money"),
            ));
            None
        }
    }
}

/// A plain decimal: optional sign, digits, optional point and digits, or
/// exponent form. No thousands separators, no currency signs.
fn parse_decimal(text: &str) -> Option<Decimal> {
    let ok = !text.is_empty()
        && text
            .chars()
            .all(|c| c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E'))
        && text.chars().any(|c| c.is_ascii_digit());
    if !ok {
        return None;
    }
    if text.contains(['e', 'E']) {
        Decimal::from_scientific(text).ok()
    } else {
        text.parse::<Decimal>().ok()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::str::FromStr;

    fn line(kind: ChargeKind, amount: LineAmount) -> ChargeLine {
        ChargeLine {
            kind,
            description: String::new(),
            amount,
        }
    }

    fn d(s: &str) -> Decimal {
        Decimal::from_str(s).unwrap()
    }

    #[test]
    fn charges_total_to_the_cent_as_worked_by_hand() {
        let charges = Charges {
            lines: vec![
                line(
                    ChargeKind::Labour,
                    LineAmount::Hours {
                        hours: d("1.5"),
                        rate: d("48.00"),
                    },
                ),
                line(
                    ChargeKind::Labour,
                    LineAmount::Hours {
                        hours: d("0.75"),
                        rate: d("52.50"),
                    },
                ),
                line(ChargeKind::Labour, LineAmount::Fixed { amount: d("25") }),
                line(
                    ChargeKind::Part,
                    LineAmount::Quantity {
                        quantity: d("2"),
                        price: d("6.40"),
                    },
                ),
                line(
                    ChargeKind::Part,
                    LineAmount::Quantity {
                        quantity: d("3"),
                        price: d("0.1"),
                    },
                ),
                line(
                    ChargeKind::Part,
                    LineAmount::Quantity {
                        quantity: d("1"),
                        price: d("18.955"),
                    },
                ),
            ],
            currency: "GBP".into(),
            tax_rate_pct: d("20"),
            tax_name: "VAT".into(),
            span: SourceSpan::new(0.into(), 0),
        };
        // By hand, each line to the penny, halves rounded up:
        //   1.5 h × 48.00 = 72.00
        //   0.75 h × 52.50 = 39.375 → 39.38
        //   fixed 25.00
        //   labour: 72.00 + 39.38 + 25.00 = 136.38
        //   2 × 6.40 = 12.80
        //   3 × 0.10 = 0.30 (exactly: a binary float would make 0.30000000000000004)
        //   1 × 18.955 → 18.96
        //   parts: 12.80 + 0.30 + 18.96 = 32.06
        //   subtotal 136.38 + 32.06 = 168.44
        //   VAT 20 %: 168.44 × 0.20 = 33.688 → 33.69
        //   total 168.44 + 33.69 = 202.13
        let t = charges.totals().unwrap();
        assert_eq!(
            t.lines,
            [
                d("72.00"),
                d("39.38"),
                d("25"),
                d("12.80"),
                d("0.30"),
                d("18.96")
            ]
        );
        assert_eq!(t.labour, d("136.38"));
        assert_eq!(t.parts, d("32.06"));
        assert_eq!(t.subtotal, d("168.44"));
        assert_eq!(t.tax, d("33.69"));
        assert_eq!(t.total, d("202.13"));
        assert_eq!(t.total.to_string(), "202.13");
    }

    #[test]
    fn halves_round_away_from_zero() {
        assert_eq!(to_cents(d("0.125")), d("0.13"));
        assert_eq!(to_cents(d("0.135")), d("0.14"));
        assert_eq!(to_cents(d("2.3349")), d("2.33"));
    }

    #[test]
    fn plain_decimals_parse_exactly_and_nothing_else_does() {
        assert_eq!(parse_decimal("48.00"), Decimal::from_str("48").ok());
        assert_eq!(parse_decimal("0.1"), Decimal::from_str("0.1").ok());
        assert_eq!(parse_decimal("1.5e2"), Decimal::from_str("150").ok());
        for bad in ["", "£48", "1,250.00", "12 00", "abc", ".", "-"] {
            assert_eq!(parse_decimal(bad), None, "{bad}");
        }
    }
}
