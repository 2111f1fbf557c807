//! What to fit for a target bias: the cathode resistor that would bring a
//! cathode-biased output valve to the target share of its plate rating, and
//! the grid voltage that would bring a fixed-bias valve to the middle of its
//! target window.
//!
//! Both come from the three-halves power law for the cathode current of a
//! pentode or tetrode (Child–Langmuir, as the classic valve handbooks use
//! it; from memory): Ik = K·(Vg2k/μg1g2 + Vgk)^(3/2), with K calibrated so
//! the law reproduces the measured point exactly. For a power triode the
//! plate takes the screen's place and μ the place of μg1g2. The plate and
//! screen voltages to ground are taken as measured: the supply's sag as the
//! current changes is ignored. The results are estimates from one point;
//! the bias must be measured again after any change.

use super::findings::{CathodeResistorOption, CathodeResistorSuggestion, ValveFindings};
use crate::catalogue::{Arg, Catalogue};
use crate::job::{Circuit, Job, MeasurementSet, Settings};
use crate::ratings::{Rating, RatingsTable, ValveClass};
use crate::units::fixed;
use crate::units::{Amps, Ohms, Series, Volts, Watts, nearest_preferred};

/// The three-halves power law for one valve, calibrated at a measured point.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ThreeHalvesLaw {
    /// K, in amperes per volt^(3/2).
    pub k: f64,
    /// μg1g2 (or a triode's μ).
    pub mu: f64,
}

impl ThreeHalvesLaw {
    /// The effective control voltage Vg2k/μ + Vgk.
    pub fn effective(mu: f64, vg2k: Volts, vgk: Volts) -> f64 {
        vg2k.0 / mu + vgk.0
    }

    /// The law through the measured point (`ik` at `vg2k`, `vgk`); `None`
    /// when the point gives no positive effective voltage or current (the
    /// law cannot describe it).
    pub fn calibrate(ik: Amps, vg2k: Volts, vgk: Volts, mu: f64) -> Option<ThreeHalvesLaw> {
        let e = Self::effective(mu, vg2k, vgk);
        (e > 0.0 && ik.0 > 0.0 && mu > 0.0 && e.is_finite()).then(|| ThreeHalvesLaw {
            k: ik.0 / e.powf(1.5),
            mu,
        })
    }

    /// The cathode current the law gives: zero at and beyond cut-off.
    pub fn cathode_current(&self, vg2k: Volts, vgk: Volts) -> Amps {
        let e = Self::effective(self.mu, vg2k, vgk);
        Amps(if e > 0.0 { self.k * e.powf(1.5) } else { 0.0 })
    }

    /// The effective voltage that gives `ik`: (Ik / K)^(2/3).
    fn effective_for(&self, ik: Amps) -> f64 {
        (ik.0 / self.k).powf(2.0 / 3.0)
    }

    /// Cathode-bias operating point with a resistor `rk` shared by `n`
    /// matched valves and the screen at `vg2` to ground: solves
    /// Vk = n·Rk·Ik(Vg2 − Vk, −Vk) by bisection (the left side rises and
    /// the right side falls with Vk, so there is one answer between 0 V and
    /// cut-off, Vg2/(μ + 1)).
    pub fn cathode_bias_point(&self, vg2: Volts, rk: Ohms, n: usize) -> CathodePoint {
        let n = n.max(1) as f64;
        let ik = |vk: f64| self.cathode_current(Volts(vg2.0 - vk), Volts(-vk));
        let (mut lo, mut hi) = (0.0, cut_off(vg2, self.mu));
        for _ in 0..200 {
            let mid = 0.5 * (lo + hi);
            if mid - n * rk.0 * ik(mid).0 < 0.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        let vk = 0.5 * (lo + hi);
        CathodePoint {
            vk: Volts(vk),
            ik: ik(vk),
        }
    }
}

/// The cathode voltage at which a cathode-biased valve with its screen at
/// `vg2` cuts off: Vg2k/μ − Vk = 0 ⇒ Vk = Vg2/(μ + 1).
fn cut_off(vg2: Volts, mu: f64) -> f64 {
    (vg2.0 / (mu + 1.0)).max(0.0)
}

/// A cathode-bias operating point: Vk and each valve's cathode current.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CathodePoint {
    pub vk: Volts,
    pub ik: Amps,
}

/// The plate dissipation at a cathode-bias point: (Va − Vk)·s·Ik, where
/// `plate_share` s = Ia/Ik at the measured point (1 when the screen
/// current is unknown and counted with the plate).
pub fn plate_dissipation_at(va: Volts, point: CathodePoint, plate_share: f64) -> Watts {
    Watts((va.0 - point.vk.0) * plate_share * point.ik.0)
}

/// The cathode resistor (shared by `n` valves) that puts each valve's plate
/// dissipation at `target`, with the plate at `va` and the screen at `vg2`
/// to ground. The dissipation falls steadily as Vk rises towards cut-off,
/// so Vk is found by bisection and Rk = Vk / (n·Ik). `None` when even no
/// resistor at all would not reach the target.
pub fn cathode_resistor_for(
    law: &ThreeHalvesLaw,
    va: Volts,
    vg2: Volts,
    n: usize,
    plate_share: f64,
    target: Watts,
) -> Option<Ohms> {
    let at = |vk: f64| {
        let ik = law.cathode_current(Volts(vg2.0 - vk), Volts(-vk));
        (
            ik,
            plate_dissipation_at(va, CathodePoint { vk: Volts(vk), ik }, plate_share),
        )
    };
    if at(0.0).1.0 < target.0 || target.0 <= 0.0 {
        return None;
    }
    let (mut lo, mut hi) = (0.0, cut_off(vg2, law.mu).min(va.0));
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if at(mid).1.0 > target.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    let vk = 0.5 * (lo + hi);
    let (ik, _) = at(vk);
    (ik.0 > 0.0).then(|| Ohms(vk / (n.max(1) as f64 * ik.0)))
}

/// The grid voltage to ground that brings a fixed-bias valve's cathode
/// current to `ik`, with the screen at `vg2` and the cathode at `vk`:
/// Vgk = (Ik/K)^(2/3) − Vg2k/μ, Vg = Vgk + Vk.
pub fn grid_for_current(law: &ThreeHalvesLaw, ik: Amps, vg2: Volts, vk: Volts) -> Volts {
    let vgk = law.effective_for(ik) - (vg2.0 - vk.0) / law.mu;
    Volts(vgk + vk.0)
}

/// Power ratings resistors are commonly sold in, watts (common practice).
const POWER_RATINGS: [f64; 13] = [
    0.25, 0.5, 1.0, 2.0, 3.0, 5.0, 7.0, 10.0, 15.0, 20.0, 25.0, 50.0, 100.0,
];

/// A resistor's power rating for a dissipation `p`: at least twice it
/// (common practice), rounded up to a usual rating. Returns (2·P, rating).
pub fn resistor_rating_for(p: Watts) -> (Watts, Watts) {
    let need = 2.0 * p.0;
    let rating = POWER_RATINGS
        .iter()
        .copied()
        .find(|&r| r >= need - 1e-12)
        .unwrap_or_else(|| (need / 50.0).ceil() * 50.0);
    (Watts(need), Watts(rating))
}

/// The inputs the law needs from one valve's findings and rating.
struct Calibration {
    law: ThreeHalvesLaw,
    /// The screen voltage to ground (the plate for a power triode).
    vg2: Volts,
    va: Volts,
    vk: Volts,
    ik: Amps,
    plate_share: f64,
}

/// Why the law cannot be calibrated for a valve, in words.
/// Why the three-halves law cannot be fitted to a valve's readings.
#[derive(Debug, Clone, PartialEq)]
pub(crate) enum Unfit {
    /// The ratings row lacks μ (a triode) or μg1g2.
    NoMu {
        triode: bool,
        name: String,
    },
    NoPlate,
    NoScreen,
    NoCurrent,
    NoGrid,
    CutOff {
        mu: f64,
    },
}

impl Unfit {
    /// The message of a reason that has no arguments (its words are
    /// `cat.text(key)`, the same as [`Unfit::words`]), which a long job's
    /// sets say once.
    pub(crate) fn plain_key(&self) -> Option<&'static str> {
        match self {
            Unfit::NoPlate => Some("note-unfit-no-plate"),
            Unfit::NoScreen => Some("note-unfit-no-screen"),
            Unfit::NoCurrent => Some("note-unfit-no-current"),
            Unfit::NoGrid => Some("note-unfit-no-grid"),
            Unfit::NoMu { .. } | Unfit::CutOff { .. } => None,
        }
    }

    /// The reason in `cat`'s words.
    pub(crate) fn words(&self, cat: &Catalogue) -> String {
        match self {
            Unfit::NoMu { triode, name } => cat.format(
                "note-unfit-no-mu",
                &[
                    ("factor", Arg::from(if *triode { "μ" } else { "μg1g2" })),
                    ("type", Arg::from(name)),
                ],
            ),
            Unfit::NoPlate => cat.text("note-unfit-no-plate"),
            Unfit::NoScreen => cat.text("note-unfit-no-screen"),
            Unfit::NoCurrent => cat.text("note-unfit-no-current"),
            Unfit::NoGrid => cat.text("note-unfit-no-grid"),
            Unfit::CutOff { mu } => {
                cat.format("note-unfit-cut-off", &[("mu", Arg::from(mu.to_string()))])
            }
        }
    }
}

fn calibrate(
    v: &ValveFindings,
    rating: &Rating,
    grid: Option<Volts>,
) -> Result<Calibration, Unfit> {
    let triode = rating.class == ValveClass::PowerTriode;
    let mu = if triode { rating.mu } else { rating.mu_g1g2 }.ok_or_else(|| Unfit::NoMu {
        triode,
        name: rating.name.clone(),
    })?;
    let va = v.plate_volts.map(Volts).ok_or(Unfit::NoPlate)?;
    let vg2 = if triode {
        va
    } else {
        v.screen_volts.map(Volts).ok_or(Unfit::NoScreen)?
    };
    let vk = Volts(v.cathode_volts.unwrap_or(0.0));
    let ia = v.plate_current_ma.map(|i| Amps(i / 1e3));
    let ik = v
        .cathode_current_ma
        .map(|i| Amps(i / 1e3))
        .or(ia)
        .ok_or(Unfit::NoCurrent)?;
    let plate_share = match ia {
        Some(ia) if ik.0 > 0.0 => (ia / ik).clamp(0.0, 1.0),
        _ => 1.0,
    };
    let vgk = match v.bias.as_str() {
        "cathode" => Volts(-vk.0),
        _ => match grid {
            Some(g) => Volts(g.0 - vk.0),
            None => return Err(Unfit::NoGrid),
        },
    };
    let law =
        ThreeHalvesLaw::calibrate(ik, Volts(vg2.0 - vk.0), vgk, mu).ok_or(Unfit::CutOff { mu })?;
    Ok(Calibration {
        law,
        vg2,
        va,
        vk,
        ik,
        plate_share,
    })
}

/// The grid voltage that brings a fixed-bias valve to the middle of its
/// target window, or why there is none.
pub(crate) fn grid_for_window_middle(
    v: &ValveFindings,
    rating: &Rating,
    grid: Option<Volts>,
    middle_ia: Amps,
) -> Result<Volts, Unfit> {
    let c = calibrate(v, rating, grid)?;
    let ik = Amps(middle_ia.0 / c.plate_share.max(1e-9));
    Ok(grid_for_current(&c.law, ik, c.vg2, c.vk))
}

/// Cathode-resistor suggestions for one set: for each cathode resistor
/// under output valves, when the set asks for it or a valve on it is above
/// the cathode-bias caution guide. Where one cannot be worked out, a note
/// says why.
#[allow(clippy::too_many_arguments)]
pub(crate) fn cathode_suggestions(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    settings: &Settings,
    valves: &[ValveFindings],
    ratings: &RatingsTable,
    notes: &mut Vec<String>,
    cat: &Catalogue,
) -> Vec<CathodeResistorSuggestion> {
    let mut out = Vec::new();
    for resistor in &circuit.cathode_resistors {
        let on: Vec<&ValveFindings> = valves
            .iter()
            .filter(|v| {
                v.is_output
                    && v.bias == "cathode"
                    && resistor.valves.iter().any(|p| p.value == v.position)
            })
            .collect();
        let above = on.iter().any(|v| {
            v.checks
                .iter()
                .any(|c| c.check == "plate_dissipation" && c.verdict.status != super::Status::Ok)
        });
        if on.is_empty() || !(set.suggest_cathode_resistor || above) {
            continue;
        }
        // The hottest valve decides, so no valve on the resistor ends up
        // above the target.
        let hottest = on.iter().fold(None, |best: Option<&&ValveFindings>, v| {
            match (
                v.plate_dissipation_pct,
                best.and_then(|b| b.plate_dissipation_pct),
            ) {
                (Some(p), Some(b)) if p <= b => best,
                (Some(_), _) => Some(v),
                (None, _) => best,
            }
        });
        let Some(hottest) = hottest else {
            notes.push(cat.format(
                "note-no-suggestion-figure",
                &[("reference", Arg::from(&resistor.reference))],
            ));
            continue;
        };
        let Some(rating) = job
            .valve(&hottest.position)
            .and_then(|spec| ratings.lookup(&spec.type_name.value).ok())
        else {
            continue;
        };
        let Some(pa_max) = rating.plate_dissipation else {
            continue;
        };
        let c = match calibrate(hottest, rating, None) {
            Ok(c) => c,
            Err(why) => {
                notes.push(cat.format(
                    "note-no-suggestion-unfit",
                    &[
                        ("reference", Arg::from(&resistor.reference)),
                        ("valve", Arg::from(&hottest.position)),
                        ("why", Arg::from(why.words(cat))),
                    ],
                ));
                continue;
            }
        };
        let n = resistor.valves.len().max(1);
        let target = Watts(pa_max.0 * settings.cathode_bias_target);
        let exact = cathode_resistor_for(&c.law, c.va, c.vg2, n, c.plate_share, target);
        let option = |series: Series| {
            let value = nearest_preferred(exact?.0, series)?;
            let point = c.law.cathode_bias_point(c.vg2, Ohms(value), n);
            let pa = plate_dissipation_at(c.va, point, c.plate_share);
            let power = point.vk.power_in(Ohms(value));
            let (least, rating_w) = resistor_rating_for(power);
            Some(CathodeResistorOption {
                series: series.to_string(),
                resistance_ohms: value,
                cathode_volts: point.vk.0,
                cathode_current_ma: point.ik.0 * 1e3,
                plate_dissipation_w: pa.0,
                plate_dissipation_pct: pa / pa_max * 100.0,
                resistor_power_w: power.0,
                resistor_rating_at_least_w: least.0,
                resistor_rating_w: rating_w.0,
            })
        };
        if exact.is_none() {
            notes.push(cat.format(
                "note-no-suggestion-reach",
                &[
                    ("reference", Arg::from(&resistor.reference)),
                    ("valve", Arg::from(&hottest.position)),
                    (
                        "pct",
                        Arg::from(fixed(settings.cathode_bias_target * 100.0, 0)),
                    ),
                ],
            ));
        }
        let present = Watts(hottest.plate_dissipation_w.unwrap_or(0.0));
        out.push(CathodeResistorSuggestion {
            reference: resistor.reference.clone(),
            valves: resistor.valves.iter().map(|v| v.value.clone()).collect(),
            calibrated_on: hottest.position.clone(),
            valve_type: hottest.valve_type.clone(),
            why: if set.suggest_cathode_resistor {
                "asked"
            } else {
                "above_guide"
            },
            mu_g1g2: c.law.mu,
            law_constant_ma_per_v1_5: c.law.k * 1e3,
            present_ohms: resistor.value.value.0,
            present_cathode_volts: c.vk.0,
            present_cathode_current_ma: c.ik.0 * 1e3,
            present_plate_dissipation_w: present.0,
            present_plate_dissipation_pct: present / pa_max * 100.0,
            target_pct: settings.cathode_bias_target * 100.0,
            target_plate_dissipation_w: target.0,
            exact_ohms: exact.map(|o| o.0),
            plate_current_includes_screen: hottest.plate_current_includes_screen,
            options: [Series::E12, Series::E24]
                .into_iter()
                .filter_map(option)
                .collect(),
        });
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close_rel(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * b.abs()
    }

    #[test]
    fn a_reason_without_arguments_is_its_messages_text() {
        for cat in [Catalogue::english(), &Catalogue::built_in("de").unwrap()] {
            for why in [
                Unfit::NoPlate,
                Unfit::NoScreen,
                Unfit::NoCurrent,
                Unfit::NoGrid,
            ] {
                let key = why.plain_key().expect("no arguments");
                assert_eq!(why.words(cat), cat.text(key));
                assert!(!why.words(cat).starts_with('['), "{key}");
            }
            let with_arguments = [
                Unfit::NoMu {
                    triode: true,
                    name: "X".into(),
                },
                Unfit::CutOff { mu: 19.0 },
            ];
            assert!(with_arguments.iter().all(|why| why.plain_key().is_none()));
        }
    }

    /// A hand case: an EL84 (μg1g2 19, from memory of manufacturer data) on
    /// its own cathode resistor, screen 295 V, plate 300 V, read at
    /// Vk = 10 V with Ik = 50 mA (a 200 Ω resistor).
    fn el84_hand_case() -> ThreeHalvesLaw {
        ThreeHalvesLaw::calibrate(Amps(0.050), Volts(285.0), Volts(-10.0), 19.0).unwrap()
    }

    #[test]
    fn the_fit_reproduces_the_measured_point_exactly() {
        // Three-halves power law (Child–Langmuir, classic valve handbooks, from memory):
        // Veff = 285/19 − 10 = 15 − 10 = 5 V; K = 50 mA / 5^1.5 = 50 mA / 11.1803 = 4.47214 mA/V^1.5.
        let law = el84_hand_case();
        assert!(close_rel(law.k, 0.004_472_136, 1e-6));
        let back = law.cathode_current(Volts(285.0), Volts(-10.0));
        assert!(close_rel(back.0, 0.050, 1e-12), "{}", back.0);
        // Solving the cathode-bias loop with the measured 200 Ω gives the measured point back.
        let p = law.cathode_bias_point(Volts(295.0), Ohms(200.0), 1);
        assert!(close_rel(p.vk.0, 10.0, 1e-9), "{}", p.vk.0);
        assert!(close_rel(p.ik.0, 0.050, 1e-9), "{}", p.ik.0);
        // The same for a pair on one resistor: 100 Ω shared by two gives Vk = 2 × 100 Ω × 50 mA = 10 V.
        let p = law.cathode_bias_point(Volts(295.0), Ohms(100.0), 2);
        assert!(close_rel(p.vk.0, 10.0, 1e-9));
    }

    #[test]
    fn the_fit_moves_the_right_way() {
        let law = el84_hand_case();
        let at = |rk: f64| law.cathode_bias_point(Volts(295.0), Ohms(rk), 1);
        // A larger cathode resistor raises Vk and lowers the current (self-bias is negative feedback).
        assert!(at(270.0).ik.0 < at(200.0).ik.0 && at(200.0).ik.0 < at(150.0).ik.0);
        assert!(at(270.0).vk.0 > at(200.0).vk.0);
        // A more negative grid lowers the current; a higher screen voltage raises it.
        let ik = |vg2k: f64, vgk: f64| law.cathode_current(Volts(vg2k), Volts(vgk)).0;
        assert!(ik(285.0, -11.0) < ik(285.0, -10.0));
        assert!(ik(300.0, -10.0) > ik(285.0, -10.0));
        // Beyond cut-off (Veff ≤ 0) there is no current: 285/19 = 15 V of grid bias cuts it off.
        assert_eq!(ik(285.0, -15.0), 0.0);
        // A colder target needs a larger resistor.
        let rk = |w: f64| {
            cathode_resistor_for(&law, Volts(300.0), Volts(295.0), 1, 1.0, Watts(w))
                .unwrap()
                .0
        };
        assert!(rk(9.0) > rk(10.2) && rk(10.2) > rk(12.0));
    }

    #[test]
    fn a_hand_worked_cathode_resistor_within_one_percent() {
        // Target 85 % of the EL84's 12 W Pa(max) (from memory; 85 % common practice) = 10.2 W,
        // with Ia = Ik (no screen figure), plate 300 V, screen 295 V, K = 0.01/√5 A/V^1.5 from the fit above.
        // Pa(Vk) = (300 − Vk)·K·((295 − Vk)/19 − Vk)^1.5, worked by hand at two trial cathode voltages:
        //   Vk = 10.95 V: Veff = 284.05/19 − 10.95 = 14.95 − 10.95 = 4.00 V; Ik = K·4^1.5 = 8K = 35.777 mA;
        //                 Pa = 289.05 V × 35.777 mA = 10.341 W.
        //   Vk = 11.00 V: Veff = 284/19 − 11 = 3.9474 V; Ik = K·7.8427 = 35.073 mA; Pa = 289 V × 35.073 mA = 10.136 W.
        // Linear between them for 10.2 W: Vk = 10.95 + 0.05 × (10.341 − 10.2)/(10.341 − 10.136) = 10.984 V;
        //   Veff = 284.016/19 − 10.984 = 3.964 V; Ik = K·3.964^1.5 = 4.472 mA × 7.893 = 35.30 mA;
        //   Rk = Vk / Ik = 10.984 V / 35.30 mA = 311.2 Ω.
        let law = el84_hand_case();
        let rk =
            cathode_resistor_for(&law, Volts(300.0), Volts(295.0), 1, 1.0, Watts(10.2)).unwrap();
        assert!(close_rel(rk.0, 311.2, 0.01), "{}", rk.0);
        // A pair sharing one resistor draws twice the current through it: half the resistance (155.6 Ω).
        let shared =
            cathode_resistor_for(&law, Volts(300.0), Volts(295.0), 2, 1.0, Watts(10.2)).unwrap();
        assert!(close_rel(shared.0, 311.2 / 2.0, 0.01), "{}", shared.0);
        // IEC 60063: 311 Ω lies between E12 270 and 330 (ln(330/311.2) = 0.059 < ln(311.2/270) = 0.142 → 330 Ω)
        // and between E24 300 and 330 (ln(311.2/300) = 0.037 < 0.059 → 300 Ω).
        assert_eq!(nearest_preferred(rk.0, Series::E12), Some(330.0));
        assert_eq!(nearest_preferred(rk.0, Series::E24), Some(300.0));
        // Out of reach: even with no cathode resistor (Vk = 0) Veff = 295/19 = 15.53 V,
        // Ik = K·15.53^1.5 = 273.6 mA and Pa = 300 V × 273.6 mA = 82 W, so 90 W cannot be reached.
        assert!(
            cathode_resistor_for(&law, Volts(300.0), Volts(295.0), 1, 1.0, Watts(90.0)).is_none()
        );
    }

    #[test]
    fn the_grid_for_a_target_current() {
        // A fixed-bias 6L6GC (μg1g2 8, from memory): screen 400 V, cathode at 0 V, grid −45 V, Ik 40 mA.
        // Veff = 400/8 − 45 = 5 V; K = 40 mA / 5^1.5 = 3.5777 mA/V^1.5 (three-halves power law, from memory).
        let law = ThreeHalvesLaw::calibrate(Amps(0.040), Volts(400.0), Volts(-45.0), 8.0).unwrap();
        // Back at 40 mA the grid is −45 V again.
        assert!(close_rel(
            grid_for_current(&law, Amps(0.040), Volts(400.0), Volts(0.0)).0,
            -45.0,
            1e-9
        ));
        // For Ik = K·4^1.5 = 8K = 28.62 mA: Veff = 4 V, so Vg = 4 − 400/8 = −46 V.
        let g = grid_for_current(&law, Amps(8.0 * law.k), Volts(400.0), Volts(0.0));
        assert!(close_rel(g.0, -46.0, 1e-9), "{}", g.0);
        // Less current needs a more negative grid.
        assert!(grid_for_current(&law, Amps(0.030), Volts(400.0), Volts(0.0)).0 < -45.0);
    }

    #[test]
    fn resistor_power_rating_at_least_twice() {
        // Common practice: rate a resistor for at least twice its dissipation, then a usual rating up.
        assert_eq!(resistor_rating_for(Watts(0.9)), (Watts(1.8), Watts(2.0)));
        assert_eq!(resistor_rating_for(Watts(1.0)), (Watts(2.0), Watts(2.0)));
        assert_eq!(resistor_rating_for(Watts(1.6)), (Watts(3.2), Watts(5.0)));
        assert_eq!(resistor_rating_for(Watts(0.1)), (Watts(0.2), Watts(0.25)));
    }

    #[test]
    fn snapping_against_the_iec_60063_table_for_every_decade_value() {
        // IEC 60063 rounded values (the standard's table): E12 and E24.
        let e12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]; // IEC 60063 E12
        let e24 = [
            1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7,
            5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
        ]; // IEC 60063 E24
        for (series, table) in [(Series::E12, &e12[..]), (Series::E24, &e24[..])] {
            for decade in [1.0, 10.0, 100.0, 1000.0] {
                for (i, &v) in table.iter().enumerate() {
                    let value = v * decade;
                    let next = table.get(i + 1).copied().unwrap_or(10.0) * decade;
                    // Each table value snaps to itself, even when read slightly off.
                    for x in [value, value * 1.001, value * 0.999] {
                        let got = nearest_preferred(x, series).unwrap();
                        assert!(close_rel(got, value, 1e-12), "{x} in {series}: {got}");
                    }
                    // Just either side of the geometric midpoint to the next value, it snaps to the nearer one.
                    let mid = (value * next).sqrt();
                    let below = nearest_preferred(mid * 0.999, series).unwrap();
                    let above = nearest_preferred(mid * 1.001, series).unwrap();
                    assert!(
                        close_rel(below, value, 1e-12),
                        "{mid} − in {series}: {below}"
                    );
                    assert!(
                        close_rel(above, next, 1e-12),
                        "{mid} + in {series}: {above}"
                    );
                }
            }
        }
    }

    /// Derives one set of a cathode-biased pair of `valve` on a shared
    /// resistor of `rk`, read at cathode `vk`.
    fn derive_pair(valve: &str, rk: &str, vk: &str, extra: &str) -> crate::calc::Findings {
        let text = format!(
            "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\"\nmains nominal=\"120V\"\n\
             valves {{\n valve V3 type=\"{valve}\" role=output\n valve V4 type=\"{valve}\" role=output\n}}\n\
             circuit {{\n bias cathode\n cathode-resistor R24 value=\"{rk}\" rating=\"5W\" valves=\"V3 V4\"\n}}\n\
             measurements \"x\" mains=\"120V\" {{\n valve V3 plate=\"338V\" screen=\"334V\" cathode=\"{vk}\"\n\
             valve V4 plate=\"338V\" screen=\"334V\" cathode=\"{vk}\"\n{extra}\n}}\n"
        );
        let ratings = RatingsTable::builtin();
        let job = crate::job::decode_with_ratings("t.kdl", &text, &ratings)
            .unwrap_or_else(|d| panic!("{:?}", d.problems))
            .job;
        crate::calc::derive(&job, &ratings)
    }

    #[test]
    fn a_suggestion_appears_above_the_guide_or_when_asked() {
        // EL84 pair at 11.6 V on 130 Ω: (338 − 11.6) V × 44.6 mA = 14.56 W, 121 % of 12 W (from memory):
        // above the 90 % cathode-bias guide (common practice), so a suggestion appears by itself.
        let f = derive_pair("EL84", "130", "11.6V", "");
        let s = &f.sets[0].cathode_resistor_suggestions[0];
        assert_eq!(s.why, "above_guide");
        assert_eq!(s.reference, "R24");
        assert_eq!(s.valves, ["V3", "V4"]);
        assert_eq!(s.calibrated_on, "V3");
        assert_eq!(s.target_pct, 85.0); // common practice
        let exact = s.exact_ohms.unwrap();
        // A colder target than today needs more than today's 130 Ω.
        assert!(exact > 130.0, "{exact}");
        // Each option is consistent with the law it came from: Vk = n·Rk·Ik and P = Vk²/Rk (Ohm's and Joule's laws).
        assert_eq!(s.options.len(), 2);
        for o in &s.options {
            assert!(close_rel(
                o.cathode_volts,
                2.0 * o.resistance_ohms * o.cathode_current_ma / 1e3,
                1e-6
            ));
            assert!(close_rel(
                o.resistor_power_w,
                o.cathode_volts.powi(2) / o.resistance_ohms,
                1e-9
            ));
            assert!(o.resistor_rating_w >= 2.0 * o.resistor_power_w);
        }
        assert_eq!(s.options[0].series, "E12");
        assert_eq!(s.options[1].series, "E24");
        // Running cool (a 270 Ω resistor at 16 V: 16/(2 × 270) = 29.6 mA, Pa = 322 V × 29.6 mA = 9.5 W, 79 %): none,
        // unless the set asks for one.
        let f = derive_pair("EL84", "270", "16V", "");
        assert!(f.sets[0].cathode_resistor_suggestions.is_empty());
        let f = derive_pair("EL84", "270", "16V", "suggest-cathode-resistor");
        let s = &f.sets[0].cathode_resistor_suggestions[0];
        assert_eq!(s.why, "asked");
        // Raising the current to 85 % needs less than today's 270 Ω.
        assert!(s.exact_ohms.unwrap() < 270.0);
    }

    #[test]
    fn without_mu_g1g2_the_report_says_why_there_is_no_suggestion() {
        // The 6973 row has no μg1g2 in the built-in table, so no law can be fitted.
        let f = derive_pair("6973", "130", "11.6V", "");
        assert!(f.sets[0].cathode_resistor_suggestions.is_empty());
        assert!(
            f.warnings.iter().any(|w| w.message
                == "R24: no cathode-resistor suggestion, since for V3 the ratings table gives no μg1g2 for 6973"),
            "{:?}",
            f.warnings
        );
    }

    #[test]
    fn a_power_triode_uses_its_plate_and_mu() {
        // A 300B (μ 3.85, Pa(max) 40 W; from memory of manufacturer data) on its own 1 kΩ cathode resistor,
        // plate 400 V to ground, cathode 80 V: Ik = 80 V / 1 kΩ = 80 mA (Ohm's law);
        // Pa = (400 − 80) V × 80 mA = 25.6 W, 64 % of 40 W: below the guide, so only when asked.
        let text = "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\"\nmains nominal=\"120V\"\n\
             valves {\n valve V3 type=\"300B\" role=output\n}\n\
             circuit {\n bias cathode\n cathode-resistor R9 value=\"1k\" rating=\"20W\" valves=\"V3\"\n}\n\
             measurements \"x\" mains=\"120V\" {\n valve V3 plate=\"400V\" cathode=\"80V\"\n suggest-cathode-resistor\n}\n";
        let ratings = RatingsTable::builtin();
        let job = crate::job::decode_with_ratings("t.kdl", text, &ratings)
            .unwrap_or_else(|d| panic!("{:?}", d.problems))
            .job;
        let f = crate::calc::derive(&job, &ratings);
        let s = &f.sets[0].cathode_resistor_suggestions[0];
        // The triode law: Veff = Vak/μ + Vgk = 320/3.85 − 80 = 3.117 V (three-halves power law, from memory).
        assert_eq!(s.mu_g1g2, 3.85);
        assert!(close_rel(s.present_cathode_current_ma, 80.0, 1e-9));
        // Hotter than today (85 % of 40 W = 34 W > 25.6 W) needs less than today's 1 kΩ.
        assert!(s.exact_ohms.unwrap() < 1000.0, "{:?}", s.exact_ohms);
    }
}
