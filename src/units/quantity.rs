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
    /// Inductance, henries.
    Henries,
    QuantityKind::Inductance
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

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol
    }

    #[test]
    fn ohms_and_joules_laws_between_the_types() {
        // Ohm's law I = V/R (textbook): 11.6 V / 130 Ω = 89.231 mA.
        assert!(close((Volts(11.6) / Ohms(130.0)).0, 0.0892308, 1e-7));
        // Ohm's law R = V/I (textbook): 3.5 V / 46.05 mA = 76.0 Ω.
        assert!(close((Volts(3.5) / Amps(0.046052632)).0, 76.0, 1e-6));
        // Ohm's law V = I·R (textbook): 26.88 mA × 76 Ω = 2.043 V.
        assert!(close((Amps(0.026882) * Ohms(76.0)).0, 2.043032, 1e-9));
        // Joule's law P = V·I, either order (textbook): 326.4 V × 44.615 mA = 14.562 W.
        assert!(close((Volts(326.4) * Amps(0.044615)).0, 14.562336, 1e-9));
        assert!(close((Amps(0.044615) * Volts(326.4)).0, 14.562336, 1e-9));
        // I = P/V (textbook): 6 W / 314 V = 19.108 mA.
        assert!(close((Watts(6.0) / Volts(314.0)).0, 0.0191083, 1e-7));
        // Joule's law P = V²/R (textbook): (356 − 334)² / 1 kΩ = 0.484 W.
        assert!(close(
            (Volts(356.0) - Volts(334.0)).power_in(Ohms(1000.0)).0,
            0.484,
            1e-12
        ));
        // Like quantities divide to a plain ratio: 14.562 W / 12 W = 1.2135.
        assert!(close(Watts(14.562) / Watts(12.0), 1.2135, 1e-12));
    }

    #[test]
    fn first_order_rc_corner() {
        // fc = 1/(2π·R·C) (textbook): 1 MΩ with 22 nF → 1 / (2π × 0.022 s) = 7.2343 Hz.
        assert!(close(rc_corner(Ohms(1e6), Farads(22e-9)).0, 7.23432, 1e-5));
        // A cathode bypass of 25 µF on 1.5 kΩ (textbook formula): 1 / (2π × 0.0375 s) = 4.2441 Hz.
        assert!(close(
            rc_corner(Ohms(1500.0), Farads(25e-6)).0,
            4.24413,
            1e-5
        ));
        // 100 kΩ with 0.022 µF, a common coupling pair: 1 / (2π × 2.2 ms) = 72.343 Hz (textbook formula).
        assert!(close(
            rc_corner(Ohms(100e3), Farads(0.022e-6)).0,
            72.3432,
            1e-4
        ));
    }

    #[test]
    fn quantities_print_with_engineering_prefixes() {
        assert_eq!(Amps(0.0342).to_string(), "34.2 mA");
        assert_eq!(Ohms(4700.0).to_string(), "4.7 kΩ");
        assert_eq!(Volts(352.0).max(Volts(360.0)), Volts(360.0));
        assert_eq!(Volts(-5.0).abs(), Volts(5.0));
        assert_eq!(Watts(2.0).scale(1.1025), Watts(2.205));
    }
}
