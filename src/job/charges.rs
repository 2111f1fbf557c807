//! The job's charges, as written: labour lines (hours at a rate, or a fixed
//! amount) and parts lines (a quantity at a unit price), with the money
//! kept as exact decimals ([`rust_decimal::Decimal`]) read from the text of
//! the file, never through a binary float. Decoding only reads them; the
//! hand-over document's context works out the totals.

use kdl::{KdlEntry, KdlNode, KdlValue};
use miette::SourceSpan;
use rust_decimal::Decimal;
use serde::Serialize;

use super::decode_error::DecodeError;
use super::model::Spanned;
use super::reader::Reader;

/// The largest amount, rate, price, quantity or hours a charges line may
/// hold (a billion): far above any bench job, and low enough that every
/// product and sum stays exact in a `Decimal`.
pub const MONEY_LIMIT: i64 = 1_000_000_000;

/// At most this many decimal places in a written amount.
pub const MONEY_PLACES: u32 = 6;

/// The `charges` block of a job.
#[derive(Debug, Clone, Serialize)]
pub struct Charges {
    pub lines: Vec<ChargeLine>,
    /// The currency, when the job names its own (else the shop profile's).
    pub currency: Option<Spanned<String>>,
    /// Tax rate in percent, when the job sets its own (else the shop
    /// profile's, else none).
    pub tax_rate_pct: Option<Spanned<Decimal>>,
    #[serde(skip)]
    pub span: SourceSpan,
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

pub(crate) fn decode_charges(node: &KdlNode, r: &mut Reader) -> Charges {
    r.check_entries(node, &["currency", "tax-rate"], 0);
    let currency = Reader::prop(node, "currency").and_then(|e| currency(r, e));
    let tax_rate_pct = Reader::prop(node, "tax-rate").and_then(|e| tax_rate(r, e));
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
        let description = r.req_arg_string(child, "a description", example);
        let amount = line_amount(child, kind, example, r);
        if let (Some(description), Some(amount)) = (description, amount) {
            lines.push(ChargeLine {
                kind,
                description: description.value,
                amount,
            });
        }
    }
    Charges {
        lines,
        currency,
        tax_rate_pct,
        span: node.span(),
    }
}

fn line_amount(
    node: &KdlNode,
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
                    format!("a line with `amount` takes no `{count_key}` or `{price_key}`"),
                    "remove this, or the amount",
                )
                .with_help(format!(
                    "write either amount=\"…\" or {count_key}=… {price_key}=\"…\""
                )),
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
            let want = match kind {
                ChargeKind::Labour => "`hours` and `rate`, or an `amount`",
                ChargeKind::Part => "a `price` (and a `quantity`), or an `amount`",
            };
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(node),
                    format!("`{}` needs {want}", node.name().value()),
                    "amount missing",
                )
                .with_help(format!("for example: {example}")),
            );
            None
        }
    }
}

fn nonzero(r: &mut Reader, entry: &KdlEntry, v: Option<Decimal>, what: &str) -> Option<Decimal> {
    let v = v?;
    if v.is_zero() {
        r.push(DecodeError::error(
            "job::impossible-value",
            r.value_span(entry),
            format!("{what} cannot be zero"),
            "expected more than zero",
        ));
        return None;
    }
    Some(v)
}

/// A currency code or sign: short text such as "GBP", "EUR", "$".
pub(crate) fn currency(r: &mut Reader, entry: &KdlEntry) -> Option<Spanned<String>> {
    let text = r.string(entry, "`currency`")?;
    let trimmed = text.value.trim();
    if trimmed.is_empty() || trimmed.chars().count() > 8 || trimmed.chars().any(char::is_control) {
        r.push(
            DecodeError::error(
                "job::bad-value",
                text.span,
                "`currency` must be a short code or sign (1 to 8 characters)",
                "expected a currency",
            )
            .with_help("for example currency=\"GBP\", \"EUR\", \"USD\" or \"€\""),
        );
        return None;
    }
    Some(Spanned::new(trimmed.to_string(), text.span))
}

/// A tax rate in percent, 0 to 100: `"20%"`, `20` or `"8.875%"`.
pub(crate) fn tax_rate(r: &mut Reader, entry: &KdlEntry) -> Option<Spanned<Decimal>> {
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
                    format!(
                        "`tax-rate` must be a percentage from 0% to 100%, found `{}`",
                        text.trim()
                    ),
                    "expected a percentage",
                )
                .with_help("for example tax-rate=\"20%\" or tax-rate=\"8.875%\""),
            );
            None
        }
    }
}

/// An amount of money, a rate, hours or a quantity: zero or more, exact,
/// from a plain number (read from its text in the file) or text such as
/// `"48.00"`.
pub(crate) fn money(r: &mut Reader, entry: &KdlEntry, what: &str) -> Option<Decimal> {
    let span = r.value_span(entry);
    let text = decimal_text(r, entry)?;
    let value = parse_decimal(text.trim());
    match value {
        Some(v) if v.is_sign_negative() && !v.is_zero() => {
            r.push(
                DecodeError::error(
                    "job::impossible-value",
                    span,
                    format!("{what} cannot be negative"),
                    "expected zero or more",
                )
                .with_help("charges lines add up; write the amount without a sign"),
            );
            None
        }
        Some(v) if v >= Decimal::from(MONEY_LIMIT) => {
            r.push(DecodeError::error(
                "job::impossible-value",
                span,
                format!("{what} is too large (the limit is {MONEY_LIMIT})"),
                "too large",
            ));
            None
        }
        Some(v) if v.scale() > MONEY_PLACES => {
            r.push(DecodeError::error(
                "job::bad-value",
                span,
                format!("{what} has more than {MONEY_PLACES} decimal places"),
                "too many decimals",
            ));
            None
        }
        Some(v) => Some(v.normalize()),
        None => {
            r.push(
                DecodeError::error(
                    "job::bad-value",
                    span,
                    format!("{what} must be a plain decimal number, found `{}`", text.trim()),
                    "expected a number such as 48.00",
                )
                .with_help("write money and hours with a decimal point and no currency sign or thousands separator, for example \"1250.00\""),
            );
            None
        }
    }
}

/// The text of a number as written: the string's text, or a bare number's
/// own source text (so `1.1` is exactly 1.1, not the nearest binary float).
fn decimal_text(r: &mut Reader, entry: &KdlEntry) -> Option<String> {
    match entry.value() {
        KdlValue::String(s) => Some(s.clone()),
        KdlValue::Integer(i) => Some(i.to_string()),
        KdlValue::Float(_) => {
            let span = r.value_span(entry);
            r.source
                .get(span.offset()..span.offset() + span.len())
                .map(|s| s.replace('_', ""))
        }
        _ => {
            r.push(DecodeError::error(
                "job::bad-value",
                r.value_span(entry),
                "expected a number",
                "expected a number such as 48.00",
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
