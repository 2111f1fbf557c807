//! Preferred numbers for resistors and capacitors, IEC 60063: the E6, E12
//! and E24 series, and the nearest preferred value to a figure, so a
//! suggestion ("fit 220 Ω") names a part that can be bought.

use std::fmt;

/// An IEC 60063 series of preferred values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Series {
    /// Six values per decade, for ±20 % parts.
    E6,
    /// Twelve values per decade, for ±10 % parts.
    E12,
    /// Twenty-four values per decade, for ±5 % parts.
    E24,
}

/// The significant figures of each series, times ten (IEC 60063).
const E6: [u32; 6] = [10, 15, 22, 33, 47, 68];
const E12: [u32; 12] = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82];
const E24: [u32; 24] = [
    10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91,
];

impl Series {
    /// The values of one decade, 1.0 up to (not including) 10.
    pub fn decade(self) -> Vec<f64> {
        self.figures()
            .iter()
            .map(|&f| f64::from(f) / 10.0)
            .collect()
    }

    /// The tolerance the series was made for, in percent.
    pub fn tolerance_pct(self) -> f64 {
        match self {
            Series::E6 => 20.0,
            Series::E12 => 10.0,
            Series::E24 => 5.0,
        }
    }

    fn figures(self) -> &'static [u32] {
        match self {
            Series::E6 => &E6,
            Series::E12 => &E12,
            Series::E24 => &E24,
        }
    }
}

impl fmt::Display for Series {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Series::E6 => "E6",
            Series::E12 => "E12",
            Series::E24 => "E24",
        })
    }
}

/// `figure` × 10^`exp`, as the nearest f64 to the true value (so 47 × 10⁻³
/// is exactly the double nearest 0.047, as a parsed "47m" would be).
fn scaled(figure: u32, exp: i32) -> f64 {
    let f = f64::from(figure);
    if exp >= 0 {
        f * 10f64.powi(exp)
    } else {
        f / 10f64.powi(-exp)
    }
}

/// The preferred value of `series` nearest to `value`, judged on a
/// logarithmic scale as the series are spaced; `None` for a value that is
/// not a positive finite number. Halfway cases go to the lower value.
pub fn nearest_preferred(value: f64, series: Series) -> Option<f64> {
    if !(value.is_finite() && value > 0.0) {
        return None;
    }
    // Figures are two digits (10 … 91), so the decade of `value` in those
    // units is log10(value) − 1; look one decade either side for safety.
    let exp = value.log10().floor() as i32 - 1;
    let mut best: Option<(f64, f64)> = None;
    for e in [exp - 1, exp, exp + 1] {
        for &f in series.figures() {
            let candidate = scaled(f, e);
            let distance = (candidate / value).ln().abs();
            if best.is_none_or(|(d, c)| {
                distance < d - 1e-12 || (distance < d + 1e-12 && candidate < c)
            }) {
                best = Some((distance, candidate));
            }
        }
    }
    best.map(|(_, c)| c)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_series_hold_the_iec_60063_values() {
        // IEC 60063: E6 = 1.0 1.5 2.2 3.3 4.7 6.8.
        assert_eq!(Series::E6.decade(), [1.0, 1.5, 2.2, 3.3, 4.7, 6.8]);
        // IEC 60063: E12 = 1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2.
        assert_eq!(
            Series::E12.decade(),
            [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]
        );
        // IEC 60063: E24 = 1.0 1.1 1.2 1.3 1.5 1.6 1.8 2.0 2.2 2.4 2.7 3.0 3.3 3.6 3.9 4.3 4.7 5.1 5.6 6.2 6.8 7.5 8.2 9.1.
        assert_eq!(
            Series::E24.decade(),
            [
                1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3,
                4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1
            ]
        );
        // IEC 60063: each series nests in the next one up.
        for v in Series::E6.decade() {
            assert!(Series::E12.decade().contains(&v));
        }
        for v in Series::E12.decade() {
            assert!(Series::E24.decade().contains(&v));
        }
        // IEC 60063: E6, E12, E24 go with ±20 %, ±10 %, ±5 %.
        assert_eq!(
            [Series::E6, Series::E12, Series::E24].map(Series::tolerance_pct),
            [20.0, 10.0, 5.0]
        );
    }

    #[test]
    fn preferred_values_come_back_unchanged_in_any_decade() {
        // IEC 60063 values across decades: 4.7 Ω, 470 Ω, 4.7 kΩ, 2.2 MΩ, 22 nF, 0.047 µF.
        for (v, s) in [
            (4.7, Series::E6),
            (470.0, Series::E12),
            (4700.0, Series::E24),
            (2.2e6, Series::E6),
            (22e-9, Series::E6),
            (0.047e-6, Series::E12),
        ] {
            assert_eq!(nearest_preferred(v, s), Some(v), "{v} in {s}");
        }
        // Decade edges: 1 Ω, 10 Ω, 100 kΩ (IEC 60063: every decade starts at 1.0).
        for v in [1.0, 10.0, 100e3, 1e-12] {
            assert_eq!(nearest_preferred(v, Series::E12), Some(v));
        }
    }

    #[test]
    fn the_nearest_value_on_a_logarithmic_scale() {
        // IEC 60063 E12 around 4.5 kΩ: 3.9 k and 4.7 k; ln(4.7/4.5) = 0.043 < ln(4.5/3.9) = 0.143 → 4.7 kΩ.
        assert_eq!(nearest_preferred(4500.0, Series::E12), Some(4700.0));
        // E12 around 130 Ω: 120 and 150; ln(130/120) = 0.080 < ln(150/130) = 0.143 → 120 Ω. E24 has 130 Ω itself.
        assert_eq!(nearest_preferred(130.0, Series::E12), Some(120.0));
        assert_eq!(nearest_preferred(130.0, Series::E24), Some(130.0));
        // E12 around 9.6: 8.2 and the next decade's 10; ln(10/9.6) = 0.041 < ln(9.6/8.2) = 0.158 → 10.
        assert_eq!(nearest_preferred(9.6, Series::E12), Some(10.0));
        // E6 around 50 µF: 47 µ and 68 µ → 47 µF.
        assert_eq!(nearest_preferred(50e-6, Series::E6), Some(47e-6));
        // E6 around 265 Ω: 220 and 330; the geometric midpoint is √(220 × 330) = 269.4 Ω, so 265 Ω → 220 Ω, 275 Ω → 330 Ω.
        assert_eq!(nearest_preferred(265.0, Series::E6), Some(220.0));
        assert_eq!(nearest_preferred(275.0, Series::E6), Some(330.0));
        // E24 just under a decade: 0.97 → 1.0 (ln(1/0.97) = 0.030 < ln(0.97/0.91) = 0.064).
        assert_eq!(nearest_preferred(0.97, Series::E24), Some(1.0));
    }

    #[test]
    fn no_preferred_value_for_zero_negative_or_non_finite() {
        for v in [0.0, -470.0, f64::NAN, f64::INFINITY] {
            assert_eq!(nearest_preferred(v, Series::E12), None);
        }
    }
}
