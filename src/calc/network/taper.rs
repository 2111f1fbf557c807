//! Potentiometer laws: where the wiper sits on the track for a setting
//! from 0 (at the `ccw` end) to 10 (at the `cw` end).

use crate::job::network::{SETTING_MAX, Taper};

/// The share of the track left on each side of a wiper at an end, so a pot
/// turned fully one way keeps a small end resistance (real carbon tracks
/// keep some; this is the tool's own figure, not a measured one) and the
/// network stays solvable.
pub const END_RESIDUAL: f64 = 0.001;

/// The audio taper's resistance from the `ccw` end to the wiper at half
/// rotation, as a share of the track: two straight segments meeting here
/// approximate a log track (common practice puts the point at 10–15 %).
pub const AUDIO_MIDPOINT: f64 = 0.10;

/// The share of the track between the `ccw` end and the wiper at
/// `setting` (0–10).
pub fn fraction(taper: Taper, setting: f64) -> f64 {
    let x = (setting / SETTING_MAX).clamp(0.0, 1.0);
    match taper {
        Taper::Linear => x,
        Taper::Audio => {
            if x <= 0.5 {
                2.0 * AUDIO_MIDPOINT * x
            } else {
                AUDIO_MIDPOINT + (1.0 - AUDIO_MIDPOINT) * 2.0 * (x - 0.5)
            }
        }
    }
}

/// The resistances (ccw end to wiper, wiper to cw end) of a pot of
/// `total` ohms at `setting`, each at least [`END_RESIDUAL`] of the track.
pub fn split(total: f64, taper: Taper, setting: f64) -> (f64, f64) {
    let f = fraction(taper, setting);
    (
        total * f.max(END_RESIDUAL),
        total * (1.0 - f).max(END_RESIDUAL),
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn linear_taper_splits_in_proportion() {
        // A linear track splits in proportion to the rotation (definition).
        assert_eq!(fraction(Taper::Linear, 0.0), 0.0);
        assert_eq!(fraction(Taper::Linear, 2.5), 0.25);
        assert_eq!(fraction(Taper::Linear, 10.0), 1.0);
        let (a, b) = split(250e3, Taper::Linear, 4.0);
        assert!((a - 100e3).abs() < 1e-9 && (b - 150e3).abs() < 1e-9);
    }

    #[test]
    fn audio_taper_is_two_segments_through_ten_percent_at_half() {
        // Two-segment log approximation (common practice): 10 % at half rotation.
        assert!((fraction(Taper::Audio, 5.0) - 0.10).abs() < 1e-12);
        assert!((fraction(Taper::Audio, 2.5) - 0.05).abs() < 1e-12);
        // Upper segment: 0.1 + 0.9 × 2 × (0.75 − 0.5) = 0.55.
        assert!((fraction(Taper::Audio, 7.5) - 0.55).abs() < 1e-12);
        assert_eq!(fraction(Taper::Audio, 10.0), 1.0);
        assert_eq!(fraction(Taper::Audio, 0.0), 0.0);
        // Monotonic over the whole rotation.
        let mut last = -1.0;
        for i in 0..=100 {
            let f = fraction(Taper::Audio, i as f64 / 10.0);
            assert!(f > last);
            last = f;
        }
    }

    #[test]
    fn a_wiper_at_an_end_keeps_the_end_residual() {
        let (a, b) = split(1e6, Taper::Linear, 0.0);
        assert_eq!(a, 1e6 * END_RESIDUAL);
        assert_eq!(b, 1e6);
        let (a, b) = split(1e6, Taper::Audio, 10.0);
        assert_eq!((a, b), (1e6, 1e6 * END_RESIDUAL));
    }
}
