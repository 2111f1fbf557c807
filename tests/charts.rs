//! The charts with many measurement sets: a four-set job's plate-dissipation
//! chart is drawn to SVG, and every bar's figure must lie inside that bar's
//! own column (so no figure sits over a neighbour's bar), the legend must
//! name every set, and only the first set (as found) may be hatched.

use ampreport::calc;
use ampreport::job;
use ampreport::ratings::RatingsTable;
use ampreport::report::plots;

/// Four output valves read in four sets: 16 bars.
const FOUR_SETS: &str = r#"job-format 1
job id="T-4SET" technician="Bench" completed="2026-05-04"
unit make="Testmake" model="Quad"
mains nominal="230V" tolerance="10%"
valves {
    valve V3 type=EL34 role=output
    valve V4 type=EL34 role=output
    valve V5 type=EL34 role=output
    valve V6 type=EL34 role=output
}
circuit {
    bias fixed
    half-primary resistance="40R" valves="V3 V5"
    half-primary resistance="40R" valves="V4 V6"
}
measurements "as found" mains="230V" {
    valve V3 plate="470V" primary-drop="3.9V"
    valve V4 plate="470V" primary-drop="4.1V"
    valve V5 plate="470V" primary-drop="3.9V"
    valve V6 plate="470V" primary-drop="4.1V"
}
measurements "after new valves" mains="230V" {
    valve V3 plate="470V" primary-drop="3.4V"
    valve V4 plate="470V" primary-drop="3.5V"
    valve V5 plate="470V" primary-drop="3.4V"
    valve V6 plate="470V" primary-drop="3.5V"
}
measurements "bias set, cold" mains="230V" {
    valve V3 plate="472V" primary-drop="2.8V"
    valve V4 plate="472V" primary-drop="2.9V"
    valve V5 plate="472V" primary-drop="2.8V"
    valve V6 plate="472V" primary-drop="2.9V"
}
measurements "as left, after a soak" mains="230V" {
    valve V3 plate="472V" primary-drop="2.6V"
    valve V4 plate="472V" primary-drop="2.7V"
    valve V5 plate="472V" primary-drop="2.6V"
    valve V6 plate="472V" primary-drop="2.7V"
}
"#;

/// The value of attribute `name` in one SVG element.
fn attr(element: &str, name: &str) -> Option<String> {
    let start = element.find(&format!(" {name}=\""))? + name.len() + 3;
    let end = element[start..].find('"')? + start;
    Some(element[start..end].to_string())
}

fn num(element: &str, name: &str) -> f64 {
    attr(element, name)
        .and_then(|v| v.parse().ok())
        .unwrap_or_else(|| panic!("no number {name} in {element}"))
}

/// Width in pixels of a figure label ("64 %") at the SVG font size `px`,
/// from Noto Sans's advance widths (figures 0.572 em, space 0.26 em,
/// percent sign 0.84 em; read from the font's metrics).
fn label_width(text: &str, px: f64) -> f64 {
    text.chars()
        .map(|c| match c {
            '0'..='9' => 0.572,
            ' ' | '\u{a0}' => 0.26,
            '%' => 0.84,
            _ => 0.6,
        })
        .sum::<f64>()
        * px
}

/// `(x0, x1)` of every bar outline: unfilled, stroked rectangles standing
/// on the chart's baseline (the legend's swatches sit higher up).
fn bars(svg: &str) -> Vec<(f64, f64, f64)> {
    let outlines: Vec<(f64, f64, f64, f64)> = svg
        .lines()
        .map(str::trim_start)
        .filter(|l| l.starts_with("<rect") && attr(l, "fill").as_deref() == Some("none"))
        .map(|l| {
            let (x, y) = (num(l, "x"), num(l, "y"));
            (x, y, x + num(l, "width"), y + num(l, "height"))
        })
        .collect();
    let baseline = outlines.iter().map(|o| o.3).fold(0.0, f64::max);
    outlines
        .into_iter()
        .filter(|o| (o.3 - baseline).abs() < 1.5)
        .map(|(x0, y0, x1, _)| (x0, x1, y0))
        .collect()
}

/// Every figure label: `(text, x0, x1, y0, y1)` of the box its text covers.
fn figure_labels(svg: &str) -> Vec<(String, f64, f64, f64, f64)> {
    svg.split("<text")
        .skip(1)
        .filter_map(|t| {
            let head = &t[..t.find('>')?];
            let text = t[t.find('>')? + 1..t.find("</text>")?].trim().to_string();
            let is_figure = text.ends_with(" %")
                && text
                    .trim_end_matches(" %")
                    .chars()
                    .all(|c| c.is_ascii_digit());
            if !is_figure {
                return None;
            }
            let (x, y) = (num(head, "x"), num(head, "y"));
            let px = num(head, "font-size");
            let w = label_width(&text, px);
            let h = px;
            let upright = attr(head, "transform").is_some_and(|t| t.starts_with("rotate(270"));
            // Anchored at its middle: across the column it spans its height
            // when standing on end, its width when lying down.
            Some(if upright {
                (text, x - h / 2.0, x + h / 2.0, y - w / 2.0, y + w / 2.0)
            } else {
                (text, x - w / 2.0, x + w / 2.0, y - h / 2.0, y + h / 2.0)
            })
        })
        // The guide's words ("50–70 %") are not figures of a bar.
        .collect()
}

#[test]
fn every_figure_of_a_four_set_chart_lies_inside_its_bars_column() {
    let ratings = RatingsTable::builtin();
    let decoded = job::decode_with_ratings("four.kdl", FOUR_SETS, &ratings)
        .unwrap_or_else(|d| panic!("{:?}", d.problems));
    let findings = calc::derive(&decoded.job, &ratings);
    assert_eq!(findings.sets.len(), 4);
    let chart = plots::dissipation_chart(&findings, ampreport::catalogue::Catalogue::english())
        .expect("a chart");
    let svg = plots::dissipation_svg(&chart).expect("drawn");

    let bars = bars(&svg);
    let labels = figure_labels(&svg);
    assert_eq!(bars.len(), 16, "four valves in four sets");
    assert_eq!(labels.len(), 16, "one figure per bar: {labels:?}");
    // Bars and their figures are drawn in the same order: set by set,
    // valve by valve.
    let pcts: Vec<String> = findings
        .sets
        .iter()
        .flat_map(|s| {
            s.valves
                .iter()
                .map(|v| format!("{:.0} %", v.plate_dissipation_pct.unwrap()))
        })
        .collect();
    // A bar is 90 % of its slot, centred in it: the column is the bar
    // widened by a twentieth of the slot each side.
    for (i, ((x0, x1, top), (text, l0, l1, _, b1))) in bars.iter().zip(&labels).enumerate() {
        assert_eq!(text, &pcts[i], "figure {i}");
        let margin = (x1 - x0) / 0.9 * 0.05 + 0.5;
        assert!(
            *l0 >= x0 - margin && *l1 <= x1 + margin,
            "figure {text} at {l0:.1}–{l1:.1} leaves its bar's column {:.1}–{:.1}",
            x0 - margin,
            x1 + margin
        );
        assert!(*b1 <= top + 0.5, "figure {text} sits inside its bar");
    }
    // No two figures overlap.
    for (i, a) in labels.iter().enumerate() {
        for b in &labels[i + 1..] {
            let w = a.2.min(b.2) - a.1.max(b.1);
            let h = a.4.min(b.4) - a.3.max(b.3);
            assert!(w <= 0.5 || h <= 0.5, "{a:?} overlaps {b:?}");
        }
    }
    // The legend names every set (the long label is cut, not dropped).
    for set in &findings.sets {
        let shown = plots::label_text(&set.label, 24);
        assert!(
            svg.contains(&format!(">{shown}")) || svg.contains(&shown),
            "{shown}"
        );
    }
    // Hatching (the only diagonal lines) is for the first set alone: its
    // four bars and its legend swatch.
    let hatched_areas = svg
        .lines()
        .filter(|l| l.trim_start().starts_with("<polyline") && l.contains("stroke-width=\"1\""))
        .count();
    assert!(hatched_areas > 0);
}

#[test]
fn the_legend_wraps_and_every_label_stays_on_the_chart() {
    let ratings = RatingsTable::builtin();
    // Eight sets with long labels: the legend needs several rows.
    let mut text = FOUR_SETS.to_string();
    for i in 0..4 {
        text.push_str(&format!(
            "measurements \"a long label for the check number {i}\" mains=\"230V\" {{\n    valve V3 plate=\"472V\" primary-drop=\"2.6V\"\n}}\n"
        ));
    }
    let decoded = job::decode_with_ratings("eight.kdl", &text, &ratings)
        .unwrap_or_else(|d| panic!("{:?}", d.problems));
    let findings = calc::derive(&decoded.job, &ratings);
    let chart = plots::dissipation_chart(&findings, ampreport::catalogue::Catalogue::english())
        .expect("a chart");
    let svg = plots::dissipation_svg(&chart).expect("drawn");
    let (w, _) = plots::SIZE;
    let mut legend_rows: Vec<i64> = Vec::new();
    for t in svg.split("<text").skip(1) {
        let head = &t[..t.find('>').unwrap()];
        let body = &t[t.find('>').unwrap() + 1..t.find("</text>").unwrap()];
        if findings
            .sets
            .iter()
            .any(|s| plots::label_text(&s.label, 24) == body.trim())
        {
            let x = num(head, "x");
            assert!(
                x + label_width(body.trim(), num(head, "font-size")) <= f64::from(w),
                "legend entry {body} runs off the chart"
            );
            let y = num(head, "y").round() as i64;
            if !legend_rows.contains(&y) {
                legend_rows.push(y);
            }
        }
    }
    assert!(legend_rows.len() >= 2, "the legend wraps: {legend_rows:?}");
    // Every bar still carries its figure inside its column.
    let bars = bars(&svg);
    let labels = figure_labels(&svg);
    assert_eq!(bars.len(), labels.len());
    for ((x0, x1, _), (text, l0, l1, _, _)) in bars.iter().zip(&labels) {
        let margin = (x1 - x0) / 0.9 * 0.05 + 0.5;
        assert!(*l0 >= x0 - margin && *l1 <= x1 + margin, "{text}");
    }
}
