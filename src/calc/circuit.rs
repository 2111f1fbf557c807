//! Textbook circuit figures for modifications: RC corners, the resistance
//! looking into a cathode, the cathode-bypass corner, stage gain, the
//! phase-shift oscillator and the Child–Langmuir estimate of how idle
//! current moves. Sources: standard valve-amplifier texts and the
//! application notes of the receiving-tube manuals (from memory).

use crate::units::{Farads, Hertz, Ohms, rc_corner};

/// Two resistances in parallel.
pub fn parallel(a: Ohms, b: Ohms) -> Ohms {
    Ohms(a.0 * b.0 / (a.0 + b.0))
}

/// Resistance looking into a cathode: (ra + RL) / (μ + 1).
pub fn cathode_resistance(mu: f64, ra: Ohms, load: Ohms) -> Ohms {
    Ohms((ra.0 + load.0) / (mu + 1.0))
}

/// Corner of a cathode bypass capacitor: fc = 1 / (2π · (Rk ∥ rk) · Ck),
/// rk the resistance looking into the cathode.
pub fn cathode_bypass_corner(mu: f64, ra: Ohms, load: Ohms, rk: Ohms, ck: Farads) -> Hertz {
    rc_corner(parallel(rk, cathode_resistance(mu, ra, load)), ck)
}

/// Gain of a common-cathode stage with its cathode resistor bypassed:
/// A = μ · RL / (RL + ra).
pub fn gain_bypassed(mu: f64, ra: Ohms, load: Ohms) -> f64 {
    mu * load.0 / (load.0 + ra.0)
}

/// Gain with the cathode resistor unbypassed:
/// A = μ · RL / (RL + ra + (μ + 1) · Rk).
pub fn gain_unbypassed(mu: f64, ra: Ohms, load: Ohms, rk: Ohms) -> f64 {
    mu * load.0 / (load.0 + ra.0 + (mu + 1.0) * rk.0)
}

/// Three equal RC sections of a phase-shift oscillator, unloaded:
/// f = 1 / (2π · R · C · √6). The stage must give a loop gain of at least
/// [`PHASE_SHIFT_MIN_GAIN`] to oscillate.
pub fn phase_shift_frequency(r: Ohms, c: Farads) -> Hertz {
    Hertz(rc_corner(r, c).0 / 6f64.sqrt())
}

/// The gain three equal RC sections need from the stage to sustain oscillation.
pub const PHASE_SHIFT_MIN_GAIN: f64 = 29.0;

/// Child–Langmuir law: current ∝ (effective voltage)^(3/2). The factor by
/// which the current changes when the effective voltage goes from `from` to
/// `to`. An estimate only: verify by measurement.
pub fn child_langmuir_factor(from: f64, to: f64) -> f64 {
    (to / from).powf(1.5)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * b.abs()
    }

    #[test]
    fn rc_corner_first_order() {
        // fc = 1/(2πRC) (textbook): 1 MΩ with 120 pF → 1/(2π·1e6·120e-12) = 1326.3 Hz.
        assert!(close(
            rc_corner(Ohms(1e6), Farads(120e-12)).0,
            1326.29,
            1e-4
        ));
        // 1/(2π · 1 kΩ · 1 µF) = 159.155 Hz (textbook).
        assert!(close(rc_corner(Ohms(1e3), Farads(1e-6)).0, 159.155, 1e-5));
    }

    #[test]
    fn cathode_figures_for_a_high_mu_triode() {
        // 12AX7 typical μ 100, ra 62.5 kΩ (from memory of manufacturer data), RL 100 kΩ:
        // (ra + RL)/(μ + 1) = 162.5 kΩ / 101 = 1608.9 Ω (textbook formula).
        let rk_in = cathode_resistance(100.0, Ohms(62_500.0), Ohms(100_000.0));
        assert!(close(rk_in.0, 1608.91, 1e-5));
        // Rk 1.5 kΩ ∥ 1608.9 Ω = 776.2 Ω; with 22 µF: 1/(2π·776.2·22e-6) = 9.32 Hz (textbook).
        let fc = cathode_bypass_corner(
            100.0,
            Ohms(62_500.0),
            Ohms(100_000.0),
            Ohms(1_500.0),
            Farads(22e-6),
        );
        assert!(close(fc.0, 9.3197, 1e-3), "{}", fc.0);
    }

    #[test]
    fn stage_gain() {
        // A = μ·RL/(RL + ra) (textbook): 100 × 100k / 162.5k = 61.54.
        assert!(close(
            gain_bypassed(100.0, Ohms(62_500.0), Ohms(100_000.0)),
            61.538,
            1e-4
        ));
        // Unbypassed: 100 × 100k / (162.5k + 101 × 1.5k) = 1e7 / 314 000 = 31.85 (textbook).
        assert!(close(
            gain_unbypassed(100.0, Ohms(62_500.0), Ohms(100_000.0), Ohms(1_500.0)),
            31.847,
            1e-4
        ));
    }

    #[test]
    fn phase_shift_oscillator() {
        // f = 1/(2πRC√6) (textbook): R 220 kΩ, C 10 nF → 72.34 Hz / 2.449 = 29.53 Hz.
        assert!(close(
            phase_shift_frequency(Ohms(220e3), Farads(10e-9)).0,
            29.535,
            1e-3
        ));
        assert_eq!(PHASE_SHIFT_MIN_GAIN, 29.0); // textbook: loop gain ≥ 29 for three equal sections
    }

    #[test]
    fn child_langmuir_three_halves_power() {
        // I ∝ V^(3/2) (Child–Langmuir law, textbook): doubling V multiplies I by 2^1.5 = 2.828.
        assert!(close(child_langmuir_factor(100.0, 200.0), 2.828_427, 1e-6));
        assert!(close(child_langmuir_factor(100.0, 100.0), 1.0, 1e-12));
    }

    #[test]
    fn parallel_resistors() {
        // Two equal resistors in parallel halve (textbook): 10k ∥ 10k = 5k.
        assert!(close(parallel(Ohms(10e3), Ohms(10e3)).0, 5e3, 1e-12));
    }
}
