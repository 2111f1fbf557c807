//! The response chart of a mod's network: magnitude in dB at the load
//! against frequency on a log axis, 20 Hz to 20 kHz, one curve per state
//! and pot setting. Before is dashed grey, after solid black, and each
//! setting has its own marker shape along its curves, so the chart reads on
//! a black-and-white printout. It only draws what `calc::network` worked
//! out.

use plotters::coord::Shift;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::plots::SvgOut;
use super::plots::{
    DARK, GRID, INK, MID, PAPER, PlotError, anchored, draw_marker, err, font, label_text, marker,
    text_width,
};
use crate::calc::network::{F_START, F_STOP, NetworkFindings};
use crate::catalogue::{Arg, Catalogue};

/// Width and height of the SVG in pixels (CSS px; typst scales it).
pub const RESPONSE_SIZE: (u32, u32) = (760, 360);

/// The chart shows at most this many dB below its top, so a deep notch
/// does not flatten every other curve; lower points sit on the floor.
pub const RANGE_DB: f64 = 50.0;

/// Frequencies with a grid line and a label.
const TICKS: [(f64, &str); 10] = [
    (20.0, "20"),
    (50.0, "50"),
    (100.0, "100"),
    (200.0, "200"),
    (500.0, "500"),
    (1_000.0, "1k"),
    (2_000.0, "2k"),
    (5_000.0, "5k"),
    (10_000.0, "10k"),
    (20_000.0, "20k"),
];

/// One curve of the chart.
#[derive(Debug, Clone, PartialEq)]
pub struct ResponseCurve {
    pub after: bool,
    /// The network setting, from 1.
    pub setting: usize,
    /// (frequency Hz, magnitude dB).
    pub points: Vec<(f64, f64)>,
}

/// Data for the response chart.
#[derive(Debug, Clone, PartialEq)]
pub struct ResponseChart {
    pub curves: Vec<ResponseCurve>,
    /// Per setting (from 1), the pot positions in words; empty when the
    /// network has no pots.
    pub settings: Vec<String>,
    pub has_after: bool,
    /// The chart's fixed words, in the document's language.
    pub words: Catalogue,
}

/// The chart for a network, if it was worked out.
pub fn response_chart(net: &NetworkFindings, cat: &Catalogue) -> Option<ResponseChart> {
    if net.curves.is_empty() {
        return None;
    }
    let curves: Vec<ResponseCurve> = net
        .curves
        .iter()
        .map(|c| ResponseCurve {
            after: c.state == "after",
            setting: c.setting,
            points: net
                .frequencies_hz
                .iter()
                .copied()
                .zip(c.magnitude_db.iter().copied())
                .collect(),
        })
        .collect();
    let count = curves.iter().map(|c| c.setting).max().unwrap_or(1);
    let settings = (1..=count)
        .map(|k| {
            net.curves
                .iter()
                .rev()
                .find(|c| c.setting == k)
                .map(|c| setting_words(&c.pots))
                .unwrap_or_default()
        })
        .collect::<Vec<_>>();
    let settings = if settings.iter().all(String::is_empty) {
        Vec::new()
    } else {
        settings
    };
    Some(ResponseChart {
        has_after: curves.iter().any(|c| c.after),
        curves,
        settings,
        words: cat.clone(),
    })
}

/// "VR1 3, VR2 7", or by the knobs' names: "treble 3, bass 7".
pub fn setting_words(pots: &[crate::calc::network::PotSetting]) -> String {
    pots.iter()
        .map(|p| {
            format!(
                "{} {}",
                p.label.as_deref().unwrap_or(&p.reference),
                crate::units::format_sig(p.setting, 3)
            )
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// Draws the response chart as an SVG document.
pub fn response_svg(chart: &ResponseChart) -> Result<String, PlotError> {
    let mut svg = String::new();
    draw(chart, &mut svg).map_err(err("network response"))?;
    Ok(svg)
}

/// One entry of the legend: a setting's marker, or a line sample (dashed
/// or solid), and its text.
struct LegendEntry {
    marker: Option<usize>,
    dashed: bool,
    text: String,
    /// Room it takes in its row, pixels.
    width: f64,
}

fn legend(chart: &ResponseChart) -> Vec<LegendEntry> {
    let mut out = Vec::new();
    let mut push = |marker, dashed, text: String| {
        let width = 34.0 + text_width(&text, 13) + 18.0;
        out.push(LegendEntry {
            marker,
            dashed,
            text,
            width,
        });
    };
    if chart.has_after {
        push(None, true, chart.words.text("chart-before-mod"));
        push(None, false, chart.words.text("chart-after-mod"));
    }
    let many = chart.settings.len() > 1;
    for (k, words) in chart.settings.iter().enumerate() {
        let text = if many {
            chart.words.format(
                "chart-setting",
                &[("number", Arg::from(k + 1)), ("pots", Arg::from(words))],
            )
        } else {
            chart
                .words
                .format("chart-pots-at", &[("pots", Arg::from(words))])
        };
        push(many.then_some(k), false, label_text(&text, 60));
    }
    out
}

fn draw(chart: &ResponseChart, svg: &mut String) -> Result<(), String> {
    let root = SvgOut::with_string(svg, RESPONSE_SIZE).into_drawing_area();
    root.fill(&PAPER).map_err(|e| e.to_string())?;

    // Legend rows first: they decide the top margin.
    let width = f64::from(RESPONSE_SIZE.0) - 90.0;
    let mut rows: Vec<Vec<LegendEntry>> = vec![Vec::new()];
    let mut x = 0.0;
    for entry in legend(chart) {
        if x + entry.width > width && !rows.last().is_some_and(Vec::is_empty) {
            rows.push(Vec::new());
            x = 0.0;
        }
        x += entry.width;
        if let Some(row) = rows.last_mut() {
            row.push(entry);
        }
    }
    let rows: Vec<_> = rows.into_iter().filter(|r| !r.is_empty()).collect();
    let legend_height = 20 * rows.len() as u32;

    let all: Vec<f64> = chart
        .curves
        .iter()
        .flat_map(|c| c.points.iter().map(|p| p.1))
        .collect();
    let hi = all.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let lo = all.iter().copied().fold(f64::INFINITY, f64::min);
    let (lo, hi) = if lo.is_finite() && hi.is_finite() {
        (lo, hi)
    } else {
        (-20.0, 0.0)
    };
    let top = ((hi + 1.5) / 5.0).ceil() * 5.0;
    let bottom = (((lo - 1.5) / 5.0).floor() * 5.0)
        .max(top - RANGE_DB)
        .min(top - 10.0);
    let step = if top - bottom > 30.0 { 10.0 } else { 5.0 };

    let mut ctx = ChartBuilder::on(&root)
        .margin_top(16 + legend_height)
        .margin_right(18)
        .margin_left(8)
        .margin_bottom(6)
        .x_label_area_size(40)
        .y_label_area_size(62)
        .build_cartesian_2d((F_START..F_STOP).log_scale(), bottom..top)
        .map_err(|e| e.to_string())?;
    ctx.configure_mesh()
        .disable_x_mesh()
        .x_labels(0)
        .x_label_formatter(&|_| String::new())
        .y_labels(((top - bottom) / step) as usize + 1)
        .y_label_formatter(&|v| format!("{v:.0}").replace('-', "−"))
        .y_desc(chart.words.text("chart-db-at-load"))
        .axis_desc_style(font(14))
        .label_style(font(13))
        .max_light_lines(0)
        .bold_line_style(GRID.stroke_width(1))
        .axis_style(INK.stroke_width(1))
        .draw()
        .map_err(|e| e.to_string())?;

    // Frequency grid and labels.
    for (f, text) in TICKS {
        let (x, y0) = ctx.backend_coord(&(f, bottom));
        let (_, y1) = ctx.backend_coord(&(f, top));
        if f > F_START && f < F_STOP {
            root.draw(&PathElement::new(
                vec![(x, y0), (x, y1)],
                GRID.stroke_width(1),
            ))
            .map_err(|e| e.to_string())?;
        }
        root.draw(&Text::new(
            text,
            (x, y0 + 6),
            anchored(13, HPos::Center, VPos::Top),
        ))
        .map_err(|e| e.to_string())?;
    }
    let (xl, yb) = ctx.backend_coord(&(F_START, bottom));
    let (xr, _) = ctx.backend_coord(&(F_STOP, bottom));
    root.draw(&Text::new(
        "Hz",
        ((xl + xr) / 2, yb + 24),
        anchored(13, HPos::Center, VPos::Top),
    ))
    .map_err(|e| e.to_string())?;

    // Before curves under the after curves.
    let mut order: Vec<&ResponseCurve> = chart.curves.iter().collect();
    order.sort_by_key(|c| c.after);
    let many = chart.settings.len() > 1;
    for c in &order {
        let pixels: Vec<(i32, i32)> = c
            .points
            .iter()
            .map(|&(f, v)| ctx.backend_coord(&(f, v.clamp(bottom, top))))
            .collect();
        if c.after || !chart.has_after {
            root.draw(&PathElement::new(pixels.clone(), INK.stroke_width(2)))
                .map_err(|e| e.to_string())?;
        } else {
            dashed_path(&root, &pixels, MID.stroke_width(2))?;
        }
        if many {
            // Markers along the curve, staggered by setting so they do not
            // sit on each other.
            let k = c.setting - 1;
            let stride = 12;
            let mut i = 3 + (k * 4) % stride;
            while i < pixels.len() {
                draw_marker(&root, pixels[i], marker(k))?;
                i += stride;
            }
        }
    }

    // Legend.
    let mut y = 14;
    for row in &rows {
        let mut x = xl;
        for entry in row {
            let (x0, x1) = (x, x + 26);
            match (entry.marker, entry.dashed) {
                (Some(k), _) => {
                    root.draw(&PathElement::new(
                        vec![(x0, y), (x1, y)],
                        DARK.stroke_width(1),
                    ))
                    .map_err(|e| e.to_string())?;
                    draw_marker(&root, (x0 + 13, y), marker(k))?;
                }
                (None, true) => dashed_path(&root, &[(x0, y), (x1, y)], MID.stroke_width(2))?,
                (None, false) => {
                    root.draw(&PathElement::new(
                        vec![(x0, y), (x1, y)],
                        INK.stroke_width(2),
                    ))
                    .map_err(|e| e.to_string())?;
                }
            }
            root.draw(&Text::new(
                entry.text.as_str(),
                (x1 + 8, y),
                anchored(13, HPos::Left, VPos::Center),
            ))
            .map_err(|e| e.to_string())?;
            x += entry.width as i32;
        }
        y += 20;
    }
    root.present().map_err(|e| e.to_string())?;
    Ok(())
}

/// A polyline drawn in dashes of 9 px with 6 px gaps, following its length.
fn dashed_path(
    area: &DrawingArea<SvgOut<'_>, Shift>,
    points: &[(i32, i32)],
    style: ShapeStyle,
) -> Result<(), String> {
    const ON: f64 = 9.0;
    const OFF: f64 = 6.0;
    let mut dash: Vec<(i32, i32)> = Vec::new();
    // Distance into the current on/off period.
    let mut phase = 0.0;
    let flush = |dash: &mut Vec<(i32, i32)>| -> Result<(), String> {
        if dash.len() > 1 {
            area.draw(&PathElement::new(std::mem::take(dash), style))
                .map_err(|e| e.to_string())?;
        }
        dash.clear();
        Ok(())
    };
    for pair in points.windows(2) {
        let (a, b) = (pair[0], pair[1]);
        let (ax, ay) = (f64::from(a.0), f64::from(a.1));
        let (dx, dy) = (f64::from(b.0) - ax, f64::from(b.1) - ay);
        let len = (dx * dx + dy * dy).sqrt();
        let mut t = 0.0;
        while t < len {
            let on = phase < ON;
            let left = if on { ON - phase } else { ON + OFF - phase };
            let step = left.min(len - t);
            let p0 = ((ax + dx * t / len) as i32, (ay + dy * t / len) as i32);
            let t1 = t + step;
            let p1 = ((ax + dx * t1 / len) as i32, (ay + dy * t1 / len) as i32);
            if on {
                if dash.is_empty() {
                    dash.push(p0);
                }
                dash.push(p1);
            } else {
                flush(&mut dash)?;
            }
            phase += step;
            if phase >= ON + OFF {
                phase = 0.0;
            }
            if phase >= ON && on {
                flush(&mut dash)?;
            }
            t = t1;
        }
    }
    flush(&mut dash)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn chart(after: bool, settings: usize) -> ResponseChart {
        let freqs = crate::calc::network::audio_sweep();
        let mut curves = Vec::new();
        for state in [false, true].into_iter().filter(|s| !*s || after) {
            for k in 1..=settings {
                curves.push(ResponseCurve {
                    after: state,
                    setting: k,
                    points: freqs
                        .iter()
                        .map(|&f| (f, -10.0 - k as f64 - (f / 1000.0).ln().abs()))
                        .collect(),
                });
            }
        }
        ResponseChart {
            words: crate::catalogue::Catalogue::english().clone(),
            curves,
            settings: (1..=settings).map(|k| format!("VR1 {k}")).collect(),
            has_after: after,
        }
    }

    #[test]
    fn before_is_dashed_after_solid_and_settings_have_markers() {
        let svg = response_svg(&chart(true, 2)).unwrap();
        assert!(svg.contains("before the mod") && svg.contains("after"));
        assert!(svg.contains("setting 1: VR1 1") && svg.contains("setting 2: VR1 2"));
        for t in ["20", "100", "1k", "20k", "Hz", "dB at the load"] {
            assert!(svg.contains(&format!("\n{t}\n")), "tick {t} missing");
        }
        // Dashed before curves are drawn as many short paths.
        let paths = svg.matches("<polyline").count() + svg.matches("<path").count();
        assert!(paths > 100, "{paths}");
        // Markers: a hollow circle per stride along setting 1's curves.
        assert!(svg.matches("<circle").count() >= 2 * 10);
    }

    #[test]
    fn one_state_one_setting_has_no_marker_legend() {
        let svg = response_svg(&chart(false, 1)).unwrap();
        assert!(!svg.contains("before the mod"));
        assert!(svg.contains("pots at VR1 1"));
        assert_eq!(svg.matches("<circle").count(), 0);
    }

    #[test]
    fn a_deep_notch_is_held_at_the_floor() {
        let mut c = chart(false, 1);
        c.curves[0].points[60].1 = -300.0;
        let svg = response_svg(&c).unwrap();
        // The axis stops RANGE_DB below its top (the curves' top is −5 dB).
        assert!(svg.contains("\n−50\n") && !svg.contains("\n−60\n"));
    }
}
