//! The frequencies a network is solved at: a log sweep from 20 Hz to
//! 20 kHz with a fixed number of points per decade, the same points a
//! circuit simulator's `.ac dec` analysis takes.

/// Points per decade of the sweep.
pub const POINTS_PER_DECADE: u32 = 40;
/// The sweep's first frequency, hertz.
pub const F_START: f64 = 20.0;
/// The sweep's last frequency, hertz.
pub const F_STOP: f64 = 20_000.0;

/// The frequencies at which figures are quoted in the document's table.
pub const SPOT_FREQUENCIES: [f64; 3] = [100.0, 1_000.0, 5_000.0];

/// `fstart · 10^(k/n)` for k = 0, 1, … up to `fstop` (included when it
/// falls on a point, within rounding).
pub fn log_sweep(fstart: f64, fstop: f64, per_decade: u32) -> Vec<f64> {
    let n = f64::from(per_decade.max(1));
    let steps = ((fstop / fstart).log10() * n + 1e-9).floor() as i64;
    (0..=steps.max(0))
        .map(|k| fstart * 10f64.powf(k as f64 / n))
        .collect()
}

/// The document's sweep: 20 Hz to 20 kHz at [`POINTS_PER_DECADE`].
pub fn audio_sweep() -> Vec<f64> {
    log_sweep(F_START, F_STOP, POINTS_PER_DECADE)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn three_decades_at_forty_points_is_121_points_ending_at_20k() {
        let f = audio_sweep();
        assert_eq!(f.len(), 121);
        assert_eq!(f[0], 20.0);
        assert!((f[40] - 200.0).abs() < 1e-9);
        assert!((f[120] - 20_000.0).abs() < 1e-8);
        assert!(f.windows(2).all(|w| w[1] > w[0]));
    }
}
