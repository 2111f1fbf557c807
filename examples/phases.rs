use ampreport::report::handover::{self, HandoverInput};
use ampreport::typeset::TemplateSource;
use std::time::Instant;
fn main() {
    let path = std::env::args().nth(1).unwrap();
    let text = std::fs::read_to_string(&path).unwrap();
    let t = Instant::now();
    let ratings = ampreport::ratings::RatingsTable::builtin();
    let t_r = t.elapsed();
    let t = Instant::now();
    let decoded = ampreport::job::decode_with_ratings(&path, &text, &ratings).unwrap();
    let t_d = t.elapsed();
    let t = Instant::now();
    let findings = ampreport::calc::derive(&decoded.job, &ratings);
    let t_c = t.elapsed();
    let t = Instant::now();
    let d = ampreport::report::plots::dissipation_chart(
        &findings,
        ampreport::catalogue::Catalogue::english(),
    )
    .unwrap();
    let parts = ampreport::report::plots::split_dissipation(&d);
    for p in &parts {
        ampreport::report::plots::dissipation_svg(&p.chart).unwrap();
    }
    let t_p1 = t.elapsed();
    let t = Instant::now();
    let s = ampreport::report::plots::supply_chart(
        &findings,
        ampreport::catalogue::Catalogue::english(),
    )
    .unwrap();
    for p in &ampreport::report::plots::split_supply(&s) {
        ampreport::report::plots::supply_svg(&p.chart).unwrap();
    }
    let t_p2 = t.elapsed();
    let input = HandoverInput::new(&decoded.job, &findings, &text, "0.15.1");
    let t = Instant::now();
    let doc = handover::build(
        &input,
        &TemplateSource::embedded(handover::EMBEDDED_TEMPLATES),
    )
    .unwrap();
    let t_b = t.elapsed();
    let t = Instant::now();
    let _ = ampreport::report::terminal::render(
        &decoded.job,
        &findings,
        &ampreport::report::terminal::TerminalStyle {
            colour: false,
            catalogue: ampreport::catalogue::Catalogue::english().clone(),
        },
    );
    let t_term = t.elapsed();
    println!(
        "ratings {t_r:?} decode {t_d:?} derive {t_c:?} diss charts {t_p1:?} supply charts {t_p2:?} build(all) {t_b:?} terminal {t_term:?} files {}",
        doc.sandbox.len()
    );
}
