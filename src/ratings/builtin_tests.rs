//! Checks the built-in ratings file against the ratings list in the
//! project's field notes (`/work/shared/domain.md`, "Ratings"), which were
//! recalled from published manufacturer data. Each check names its source
//! on the same line.

use super::*;
use crate::units::{Amps, Volts, Watts};

/// The built-in table, parsed once for all checks.
fn table() -> &'static RatingsTable {
    static TABLE: std::sync::OnceLock<RatingsTable> = std::sync::OnceLock::new();
    TABLE.get_or_init(RatingsTable::builtin)
}

#[track_caller]
fn close(got: f64, want: f64, what: &str) {
    assert!(
        (got - want).abs() <= 1e-9 * want.abs().max(1.0),
        "{what}: got {got}, want {want}"
    );
}

/// Pa(max) W, Pg2(max) W, Va(max) V, heater V and A of an output valve.
#[track_caller]
fn output(name: &str, pa: f64, pg2: f64, va: f64, heater_v: f64, heater_a: f64) {
    let t = table();
    let r = t.lookup(name).unwrap();
    assert!(r.class.is_output(), "{name} is an output valve");
    assert_eq!(r.plate_dissipation, Some(Watts(pa)), "{name} Pa(max)");
    assert_eq!(r.screen_dissipation, Some(Watts(pg2)), "{name} Pg2(max)");
    assert_eq!(r.plate_voltage, Some(Volts(va)), "{name} Va(max)");
    close(
        r.heater_voltage.0,
        heater_v,
        &format!("{name} heater voltage"),
    );
    close(
        r.heater_current.0,
        heater_a,
        &format!("{name} heater current"),
    );
}

/// Pa(max) W per section, Va(max) V, μ, ra kΩ, gm mA/V of a preamp triode.
#[track_caller]
fn triode(name: &str, pa: f64, va: f64, mu: f64, ra_k: f64, gm: f64) {
    let t = table();
    let r = t.lookup(name).unwrap();
    assert_eq!(r.class, ValveClass::PreampTriode, "{name} class");
    assert_eq!(r.plate_dissipation, Some(Watts(pa)), "{name} Pa(max)");
    assert_eq!(r.plate_voltage, Some(Volts(va)), "{name} Va(max)");
    assert_eq!(r.mu, Some(mu), "{name} mu");
    close(
        r.plate_resistance.unwrap().0,
        ra_k * 1e3,
        &format!("{name} ra"),
    );
    close(
        r.transconductance_ma_per_v.unwrap(),
        gm,
        &format!("{name} gm"),
    );
}

/// Maximum DC output current in mA and heater of a rectifier.
#[track_caller]
fn rectifier(name: &str, ma: f64, heater_v: f64, heater_a: f64) {
    let t = table();
    let r = t.lookup(name).unwrap();
    assert!(r.class.is_rectifier(), "{name} is a rectifier");
    close(
        r.output_current.unwrap().0,
        ma * 1e-3,
        &format!("{name} output current"),
    );
    close(
        r.heater_voltage.0,
        heater_v,
        &format!("{name} heater voltage"),
    );
    close(
        r.heater_current.0,
        heater_a,
        &format!("{name} heater current"),
    );
}

#[test]
fn output_valves_match_the_field_notes() {
    output("EL84", 12.0, 2.0, 300.0, 6.3, 0.76); // EL84 12 W / 2 W / 300 V / 6.3 V 0.76 A: from memory of manufacturer data (domain.md ratings list)
    output("6V6GT", 12.0, 2.0, 315.0, 6.3, 0.45); // 6V6GT 12 W / 2 W / 315 V / 6.3 V 0.45 A: from memory of manufacturer data (domain.md ratings list)
    output("6AQ5", 12.0, 2.0, 275.0, 6.3, 0.45); // 6AQ5 12 W / 2 W / 275 V / 6.3 V 0.45 A: from memory of manufacturer data (domain.md ratings list)
    output("6L6GC", 30.0, 5.0, 500.0, 6.3, 0.9); // 6L6GC 30 W / 5 W / 500 V / 6.3 V 0.9 A: from memory of manufacturer data (domain.md ratings list)
    output("5881", 23.0, 3.0, 400.0, 6.3, 0.9); // 5881 23 W / 3 W / 400 V / 6.3 V 0.9 A: from memory of manufacturer data (domain.md ratings list)
    output("7027A", 35.0, 5.0, 600.0, 6.3, 0.9); // 7027A 35 W / 5 W / 600 V / 6.3 V 0.9 A: from memory of manufacturer data (domain.md ratings list)
    output("EL34", 25.0, 8.0, 800.0, 6.3, 1.5); // EL34 25 W / 8 W / 800 V / 6.3 V 1.5 A: from memory of manufacturer data (domain.md ratings list)
    output("KT66", 25.0, 3.5, 500.0, 6.3, 1.27); // KT66 25 W / 3.5 W / 500 V / 6.3 V 1.27 A: from memory of manufacturer data (domain.md ratings list)
    output("KT88", 35.0, 6.0, 800.0, 6.3, 1.6); // KT88 35 W / 6 W / 800 V / 6.3 V 1.6 A: from memory of manufacturer data (domain.md ratings list)
    output("6550", 35.0, 6.0, 600.0, 6.3, 1.6); // 6550 35 W / 6 W / 600 V / 6.3 V 1.6 A: from memory of manufacturer data (domain.md ratings list)
    output("6973", 12.0, 2.0, 440.0, 6.3, 0.45); // 6973 12 W / 2 W / 440 V / 6.3 V 0.45 A: from memory of manufacturer data (domain.md ratings list)
    output("7591A", 19.0, 3.3, 550.0, 6.3, 0.8); // 7591A 19 W / 3.3 W / 550 V / 6.3 V 0.8 A: from memory of manufacturer data (domain.md ratings list)
    output("6K6GT", 8.5, 2.8, 315.0, 6.3, 0.4); // 6K6GT 8.5 W / 2.8 W / 315 V / 6.3 V 0.4 A: from memory of manufacturer data (domain.md ratings list)
    output("6F6", 11.0, 3.75, 375.0, 6.3, 0.7); // 6F6 11 W / 3.75 W / 375 V / 6.3 V 0.7 A: from memory of manufacturer data (domain.md ratings list)
}

#[test]
fn the_6v6gt_design_max_is_kept_beside_its_rating() {
    let t = table();
    let r = t.lookup("6V6GT").unwrap();
    assert_eq!(r.design_max_plate_dissipation, Some(Watts(14.0))); // 6V6GT 14 W design-max: from memory of manufacturer data (domain.md ratings list)
    assert_eq!(r.plate_dissipation, Some(Watts(12.0))); // 6V6GT Pa(max) 12 W: from memory of manufacturer data (domain.md ratings list)
}

#[test]
fn preamp_triodes_match_the_field_notes() {
    triode("12AX7", 1.0, 330.0, 100.0, 62.5, 1.6); // 12AX7 1.0 W / 330 V / μ 100 / ra 62.5 kΩ / gm 1.6 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("12AT7", 2.5, 300.0, 60.0, 10.9, 5.5); // 12AT7 2.5 W / 300 V / μ 60 / ra 10.9 kΩ / gm 5.5 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("12AU7", 2.75, 330.0, 17.0, 7.7, 2.2); // 12AU7 2.75 W / 330 V / μ 17 / ra 7.7 kΩ / gm 2.2 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("12AY7", 1.5, 300.0, 40.0, 25.0, 1.75); // 12AY7 1.5 W / 300 V / μ 40 / ra 25 kΩ / gm 1.75 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("5751", 1.0, 330.0, 70.0, 58.0, 1.2); // 5751 1.0 W / 330 V / μ 70 / ra 58 kΩ / gm 1.2 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("6SN7GT", 5.0, 450.0, 20.0, 7.7, 2.6); // 6SN7GT 5 W / 450 V / μ 20 / ra 7.7 kΩ / gm 2.6 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("6SL7GT", 1.0, 300.0, 70.0, 44.0, 1.6); // 6SL7GT 1 W / 300 V / μ 70 / ra 44 kΩ / gm 1.6 mA/V: from memory of manufacturer data (domain.md ratings list)
    triode("6C4", 3.5, 300.0, 17.0, 7.7, 2.2); // 6C4 3.5 W / 300 V / μ 17 / ra 7.7 kΩ / gm 2.2 mA/V: from memory of manufacturer data (domain.md ratings list)
}

#[test]
fn rectifiers_match_the_field_notes() {
    rectifier("5Y3GT", 125.0, 5.0, 2.0); // 5Y3GT 125 mA / 5 V 2 A: from memory of manufacturer data (domain.md ratings list)
    rectifier("5AR4", 250.0, 5.0, 1.9); // 5AR4 (GZ34) 250 mA / 5 V 1.9 A: from memory of manufacturer data (domain.md ratings list)
    rectifier("5U4GB", 275.0, 5.0, 3.0); // 5U4GB 275 mA / 5 V 3 A: from memory of manufacturer data (domain.md ratings list)
    rectifier("5V4G", 175.0, 5.0, 2.0); // 5V4G 175 mA / 5 V 2 A: from memory of manufacturer data (domain.md ratings list)
    rectifier("EZ81", 150.0, 6.3, 1.0); // EZ81 (6CA4) 150 mA / 6.3 V 1 A: from memory of manufacturer data (domain.md ratings list)
    rectifier("6X4", 70.0, 6.3, 0.6); // 6X4 70 mA / 6.3 V 0.6 A: from memory of manufacturer data (domain.md ratings list)
}

#[test]
fn rectifier_heating_follows_the_cathode_type() {
    let t = table();
    let heating = |name: &str| t.lookup(name).unwrap().rectifier_heating;
    assert_eq!(heating("5AR4"), Some(RectifierHeating::Indirect)); // 5AR4/GZ34 indirectly heated (slow warm-up): from memory of manufacturer data (project brief)
    assert_eq!(heating("EZ81"), Some(RectifierHeating::Indirect)); // EZ81 indirectly heated: from memory of manufacturer data (project brief)
    assert_eq!(heating("5Y3GT"), Some(RectifierHeating::Direct)); // 5Y3GT directly heated filament: from memory of manufacturer data (project brief)
    assert_eq!(heating("5U4GB"), Some(RectifierHeating::Direct)); // 5U4GB directly heated filament: from memory of manufacturer data (project brief)
}

#[test]
fn equivalents_from_the_field_notes_find_their_rows() {
    let t = table();
    assert_eq!(t.lookup("6BQ5").unwrap().name, "EL84"); // EL84 (6BQ5): domain.md ratings list
    assert_eq!(t.lookup("6CA7").unwrap().name, "EL34"); // EL34 (6CA7): domain.md ratings list
    assert_eq!(t.lookup("ECC83").unwrap().name, "12AX7"); // 12AX7 (ECC83, 7025): domain.md ratings list
    assert_eq!(t.lookup("7025").unwrap().name, "12AX7"); // 12AX7 (ECC83, 7025): domain.md ratings list
    assert_eq!(t.lookup("ECC81").unwrap().name, "12AT7"); // 12AT7 (ECC81): domain.md ratings list
    assert_eq!(t.lookup("ECC82").unwrap().name, "12AU7"); // 12AU7 (ECC82): domain.md ratings list
    assert_eq!(t.lookup("GZ34").unwrap().name, "5AR4"); // 5AR4 (GZ34): domain.md ratings list
    assert_eq!(t.lookup("6CA4").unwrap().name, "EZ81"); // EZ81 (6CA4): domain.md ratings list
}

#[test]
fn dual_heaters_are_recorded_both_ways() {
    let t = table();
    let r = t.lookup("12AX7").unwrap();
    assert_eq!(
        (r.heater_voltage, r.heater_current),
        (Volts(12.6), Amps(0.15))
    ); // 12AX7 heater 12.6 V 0.15 A in series: from memory of manufacturer data (project brief)
    assert_eq!(
        r.heater_parallel,
        Some(Heater {
            voltage: Volts(6.3),
            current: Amps(0.3)
        })
    ); // 12AX7 heater 6.3 V 0.3 A in parallel: from memory of manufacturer data (project brief)
    assert_eq!(r.sections, 2); // 12AX7 is a dual triode: from memory of manufacturer data
}

#[test]
fn grid_to_screen_mu_for_the_bias_estimates() {
    let t = table();
    let mu = |name: &str| t.lookup(name).unwrap().mu_g1g2;
    assert_eq!(mu("EL84"), Some(19.0)); // EL84 μg1g2 19: from memory of manufacturer data (triode-connected figures); verify
    assert_eq!(mu("EL34"), Some(11.0)); // EL34 μg1g2 11: from memory of manufacturer data (triode-connected figures); verify
    assert_eq!(mu("6L6GC"), Some(8.0)); // 6L6 family μg1g2 8: from memory of manufacturer data (triode-connected figures); verify
    assert_eq!(mu("6V6GT"), Some(9.8)); // 6V6GT μg1g2 9.8: from memory of manufacturer data (triode-connected figures); verify
    // Every figure given belongs to a valve with a screen, and is plausible
    // for one (triode-connected output valves run from about 4 to 25).
    for r in t.iter() {
        if let Some(m) = r.mu_g1g2 {
            assert!(r.class.has_screen(), "{} has μg1g2 but no screen", r.name);
            assert!((4.0..=25.0).contains(&m), "{} μg1g2 {m}", r.name);
        }
    }
}
