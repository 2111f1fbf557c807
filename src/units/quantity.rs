//! Typed physical quantities, so that a volts-for-amps slip fails to compile.
//!
//! Each quantity is a thin wrapper over an `f64` in the base SI unit. Only the
//! products and quotients that the trade's formulas use are defined.

use serde::{Deserialize, Serialize};
use std::fmt;
use std::ops::{Add, Div, Mul, Neg, Sub};

use super::format::format_engineering;
use super::kind::QuantityKind;

macro_rules! quantity {
    ($(#[$doc:meta])* $name:ident, $kind:expr) => {
        $(#[$doc])*
        #[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default, Serialize, Deserialize)]
        #[serde(transparent)]
        pub struct $name(pub f64);

        impl $name {
            /// The kind of quantity this type holds.
            pub const KIND: QuantityKind = $kind;

            /// The value in the base SI unit.
            pub fn get(self) -> f64 {
                self.0
            }

            /// The larger of two values.
            pub fn max(self, other: Self) -> Self {
                $name(self.0.max(other.0))
            }

            /// The absolute value.
            pub fn abs(self) -> Self {
                $name(self.0.abs())
            }

            /// The value scaled by a plain factor.
            pub fn scale(self, factor: f64) -> Self {
                $name(self.0 * factor)
            }
        }

        impl Add for $name {
            type Output = $name;
            fn add(self, rhs: $name) -> $name {
                $name(self.0 + rhs.0)
            }
        }

        impl Sub for $name {
            type Output = $name;
            fn sub(self, rhs: $name) -> $name {
                $name(self.0 - rhs.0)
            }
        }

        impl Neg for $name {
            type Output = $name;
            fn neg(self) -> $name {
                $name(-self.0)
            }
        }

        impl Mul<f64> for $name {
            type Output = $name;
            fn mul(self, rhs: f64) -> $name {
                $name(self.0 * rhs)
            }
        }

        impl Div<f64> for $name {
            type Output = $name;
            fn div(self, rhs: f64) -> $name {
                $name(self.0 / rhs)
            }
        }

        /// The ratio of two like quantities is a plain number.
        impl Div for $name {
            type Output = f64;
            fn div(self, rhs: $name) -> f64 {
                self.0 / rhs.0
            }
        }

        impl fmt::Display for $name {
            fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
                f.write_str(&format_engineering(self.0, $kind))
            }
        }
    };
}

quantity!(
    /// Electric potential difference, volts.
    Volts,
    QuantityKind::Voltage
);
quantity!(
    /// Electric current, amperes.
    Amps,
    QuantityKind::Current
);
quantity!(
    /// Resistance, ohms.
    Ohms,
    QuantityKind::Resistance
);
quantity!(
    /// Power, watts.
    Watts,
    QuantityKind::Power
);
quantity!(
    /// Capacitance, farads.
    Farads,
    QuantityKind::Capacitance
);
quantity!(
    /// Frequency, hertz.
    Hertz,
    QuantityKind::Frequency
);

/// Ohm's law: I = V / R.
impl Div<Ohms> for Volts {
    type Output = Amps;
    fn div(self, rhs: Ohms) -> Amps {
        Amps(self.0 / rhs.0)
    }
}

/// Ohm's law: R = V / I.
impl Div<Amps> for Volts {
    type Output = Ohms;
    fn div(self, rhs: Amps) -> Ohms {
        Ohms(self.0 / rhs.0)
    }
}

/// Ohm's law: V = I · R.
impl Mul<Ohms> for Amps {
    type Output = Volts;
    fn mul(self, rhs: Ohms) -> Volts {
        Volts(self.0 * rhs.0)
    }
}

/// Joule's law: P = V · I.
impl Mul<Amps> for Volts {
    type Output = Watts;
    fn mul(self, rhs: Amps) -> Watts {
        Watts(self.0 * rhs.0)
    }
}

/// Joule's law: P = I · V.
impl Mul<Volts> for Amps {
    type Output = Watts;
    fn mul(self, rhs: Volts) -> Watts {
        Watts(self.0 * rhs.0)
    }
}

/// I = P / V.
impl Div<Volts> for Watts {
    type Output = Amps;
    fn div(self, rhs: Volts) -> Amps {
        Amps(self.0 / rhs.0)
    }
}

impl Volts {
    /// Joule's law in the form P = V² / R.
    pub fn power_in(self, r: Ohms) -> Watts {
        Watts(self.0 * self.0 / r.0)
    }
}

/// A first-order RC time constant's corner frequency, fc = 1 / (2π·R·C).
pub fn rc_corner(r: Ohms, c: Farads) -> Hertz {
    Hertz(1.0 / (2.0 * std::f64::consts::PI * r.0 * c.0))
}
