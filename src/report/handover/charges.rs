//! The charges table of the hand-over document: every line, the labour and
//! parts subtotals, the tax and the total, formatted from the exact sums of
//! [`Charges::totals`]. Built only into the hand-over's own context, so no
//! other document (a dealer's listing) can show what the customer paid.

use crate::catalogue::{Arg, Catalogue};
use rust_decimal::Decimal;
use serde::Serialize;

use crate::job::{CENT_PLACES, ChargeKind, Charges, LineAmount};

/// The charges as the page shows them; every amount has two decimals.
#[derive(Debug, Clone, Serialize)]
pub struct ChargesContext {
    /// "GBP", "USD", "€" …
    pub currency: String,
    pub labour: Vec<ChargeRow>,
    pub parts: Vec<ChargeRow>,
    pub labour_total: String,
    pub parts_total: String,
    pub subtotal: String,
    /// None when no tax is charged.
    pub tax: Option<TaxRow>,
    pub total: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct ChargeRow {
    pub description: String,
    /// "1.5 h", "2", or none for a fixed amount.
    pub quantity: Option<String>,
    /// "48.00 per hour", "6.40 each", or none for a fixed amount.
    pub rate: Option<String>,
    pub amount: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct TaxRow {
    /// "VAT".
    pub name: String,
    /// "20 %".
    pub rate: String,
    pub amount: String,
}

/// Money with two decimals: "1250.00".
fn money(v: Decimal) -> String {
    let mut v = v;
    v.rescale(CENT_PLACES);
    v.to_string()
}

/// A count or rate as written, without trailing zeros: "1.5", "2".
fn plain(v: Decimal) -> String {
    v.normalize().to_string()
}

/// The charges context, or none when the sums do not fit (never for a job
/// the decoder accepted).
pub fn charges_context(charges: &Charges, cat: &Catalogue) -> Option<ChargesContext> {
    let totals = charges.totals()?;
    let (mut labour, mut parts) = (Vec::new(), Vec::new());
    for (line, amount) in charges.lines.iter().zip(&totals.lines) {
        let (quantity, rate) = match &line.amount {
            LineAmount::Hours { hours, rate } => (
                Some(format!("{} h", plain(*hours))),
                Some(cat.format("doc-per-hour", &[("price", Arg::from(money(*rate)))])),
            ),
            LineAmount::Quantity { quantity, price } => (
                Some(plain(*quantity)),
                Some(cat.format("doc-each", &[("price", Arg::from(money(*price)))])),
            ),
            LineAmount::Fixed { .. } => (None, None),
        };
        let row = ChargeRow {
            description: super::context::reflow(&line.description),
            quantity,
            rate,
            amount: money(*amount),
        };
        match line.kind {
            ChargeKind::Labour => labour.push(row),
            ChargeKind::Part => parts.push(row),
        }
    }
    Some(ChargesContext {
        currency: charges.currency.clone(),
        labour,
        parts,
        labour_total: money(totals.labour),
        parts_total: money(totals.parts),
        subtotal: money(totals.subtotal),
        tax: (!charges.tax_rate_pct.is_zero()).then(|| TaxRow {
            name: charges.tax_name.clone(),
            rate: format!("{} %", plain(charges.tax_rate_pct)),
            amount: money(totals.tax),
        }),
        total: money(totals.total),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn amounts_show_two_decimals_and_counts_as_written() {
        assert_eq!(money(Decimal::new(25, 0)), "25.00");
        assert_eq!(money(Decimal::new(3938, 2)), "39.38");
        assert_eq!(plain(Decimal::new(150, 2)), "1.5");
        assert_eq!(plain(Decimal::new(8875, 3)), "8.875");
    }
}
