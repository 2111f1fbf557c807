//! Quantities: typed values, reading SI prefixes and RKM codes, and printing
//! with engineering prefixes. Knows nothing about valves.

mod format;
mod kind;
mod parse;
mod preferred;
mod quantity;

pub use format::{
    fixed, fixed_digits, fixed_signed, fixed_with, format_engineering, format_engineering_sig,
    format_fixed, format_sig, round_sig, write_fixed,
};
pub use kind::QuantityKind;
pub use parse::{UnitError, UnitProblem, parse_quantity};
pub use preferred::{Series, nearest_preferred};
pub use quantity::{Amps, Farads, Henries, Hertz, Ohms, Volts, Watts, rc_corner};
