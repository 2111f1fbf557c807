//! The hand-over document's frequency-response chart: each response read
//! on the bench, in dB against its reference frequency, on a logarithmic
//! frequency axis, with the 0 dB and −3 dB levels and the −3 dB points calc
//! interpolated. Greyscale, one marker shape per curve, like the other
//! charts (see `plots.rs`, whose drawing helpers it shares).

use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::plots::SvgOut;
use super::plots::{ChartPart, SETS_PER_CHART, even_groups, span_words};
use super::plots::{
    DARK, GRID, INK, LABEL_HEIGHT, Line, MID, Obstacles, PAPER, PixelBox, PlotError, SIZE,
    anchored, dashed, draw_label, draw_marker, draw_mesh, label_spots, label_text, marker,
    text_width, to_svg,
};
use crate::calc::Findings;
use crate::catalogue::{Arg, Catalogue};
use crate::units::{QuantityKind as Q, format_engineering};

/// One response curve.
#[derive(Debug, Clone, PartialEq)]
pub struct ResponseCurve {
    /// "as left" or "as left, bright".
    pub label: String,
    /// (frequency Hz, dB against the reference), in order of frequency.
    pub points: Vec<(f64, f64)>,
    /// The −3 dB frequencies calc found for this curve.
    pub minus_3db: Vec<f64>,
}

/// Data for the frequency-response chart.
#[derive(Debug, Clone, PartialEq)]
pub struct ResponseChart {
    pub curves: Vec<ResponseCurve>,
    /// The chart's fixed words, in the document's language.
    pub words: Catalogue,
}

/// The chart's data, or `None` when no set has a response reading.
pub fn response_chart(findings: &Findings, cat: &Catalogue) -> Option<ResponseChart> {
    let curves: Vec<ResponseCurve> = findings
        .sets
        .iter()
        .flat_map(|set| {
            set.bench.responses.iter().map(move |r| ResponseCurve {
                label: match &r.channel {
                    Some(c) => format!("{}, {c}", set.label),
                    None => set.label.clone(),
                },
                points: r
                    .points
                    .iter()
                    .map(|p| (p.frequency_hz, p.response_db))
                    .collect(),
                minus_3db: r
                    .minus_3db_low_hz
                    .into_iter()
                    .chain(r.minus_3db_high_hz)
                    .collect(),
            })
        })
        .filter(|c| !c.points.is_empty())
        .collect();
    (!curves.is_empty()).then(|| ResponseChart {
        curves,
        words: cat.clone(),
    })
}

/// The response chart cut into parts of at most [`SETS_PER_CHART`]
/// curves for a long job; one part holding the whole chart otherwise.
pub fn split_response(chart: &ResponseChart) -> Vec<ChartPart<ResponseChart>> {
    let groups = even_groups(chart.curves.len(), SETS_PER_CHART);
    let whole = groups.len() <= 1;
    groups
        .into_iter()
        .map(|g| {
            let curves = &chart.curves[g];
            let part = (!whole).then(|| {
                let (first, last) = (&curves[0].label, &curves[curves.len() - 1].label);
                let span = span_words(first, last, true, &chart.words);
                chart
                    .words
                    .format("chart-part-curves", &[("span", Arg::from(span))])
            });
            ChartPart {
                chart: ResponseChart {
                    curves: curves.to_vec(),
                    words: chart.words.clone(),
                },
                part,
            }
        })
        .collect()
}

/// Draws the frequency-response chart as an SVG document.
pub fn response_svg(chart: &ResponseChart) -> Result<String, PlotError> {
    to_svg(chart, "frequency response", draw_response)
}

/// The 1-2-5 frequencies from `lo` to `hi`, for the axis labels.
fn frequency_ticks(lo: f64, hi: f64) -> Vec<f64> {
    let mut out = Vec::new();
    let mut decade = 10f64.powf(lo.log10().floor());
    while decade <= hi {
        for m in [1.0, 2.0, 5.0] {
            let f = decade * m;
            if f >= lo && f <= hi {
                out.push(f);
            }
        }
        decade *= 10.0;
    }
    out
}

/// "20", "500", "1k", "20k": axis labels in hertz.
fn tick_label(f: f64) -> String {
    if f >= 1000.0 {
        format!("{}k", f / 1000.0)
    } else {
        format!("{f}")
    }
}

fn draw_response(chart: &ResponseChart, svg: &mut String) -> Result<(), String> {
    let root = SvgOut::with_string(svg, SIZE).into_drawing_area();
    root.fill(&PAPER).map_err(|e| e.to_string())?;
    let all = || chart.curves.iter().flat_map(|c| c.points.iter());
    let f_min = all().map(|p| p.0).fold(f64::INFINITY, f64::min);
    let f_max = all().map(|p| p.0).fold(f64::NEG_INFINITY, f64::max);
    let db_min = all().map(|p| p.1).fold(-3.0f64, f64::min);
    let db_max = all().map(|p| p.1).fold(0.0f64, f64::max);
    let (f_min, f_max) = match (f_min.is_finite(), f_max > f_min) {
        (true, true) => (f_min, f_max),
        // A single frequency: a decade either side of it.
        (true, false) => (f_min / 10.0, f_min * 10.0),
        _ => (20.0, 20_000.0),
    };
    // A little room either side on the log axis; whole dB steps of three.
    let (lo, hi) = (f_min / 1.5, f_max * 1.5);
    let bottom = ((db_min - 1.0) / 3.0).floor() * 3.0;
    let top = ((db_max + 1.0) / 3.0).ceil() * 3.0;

    let mut ctx = ChartBuilder::on(&root)
        .margin_top(44)
        .margin_right(70)
        .margin_left(8)
        .margin_bottom(6)
        .x_label_area_size(40)
        .y_label_area_size(62)
        .build_cartesian_2d((lo..hi).log_scale(), bottom..top)
        .map_err(|e| e.to_string())?;
    draw_mesh(
        &mut ctx,
        ((top - bottom) as usize + 1).min(13),
        &|v| {
            if v.abs() < 1e-9 {
                "0".to_string()
            } else {
                format!("{v:+.0}").replace('-', "\u{2212}")
            }
        },
        &chart.words.text("chart-db-against-reference"),
    )?;

    let (left, plot_bottom) = ctx.backend_coord(&(lo, bottom));
    let (right, plot_top) = ctx.backend_coord(&(hi, top));

    // Frequency grid and labels at 1-2-5 steps.
    for f in frequency_ticks(lo, hi) {
        let (x, _) = ctx.backend_coord(&(f, bottom));
        root.draw(&PathElement::new(
            vec![(x, plot_top), (x, plot_bottom)],
            GRID.stroke_width(1),
        ))
        .map_err(|e| e.to_string())?;
        root.draw(&Text::new(
            tick_label(f),
            (x, plot_bottom + 6),
            anchored(13, HPos::Center, VPos::Top),
        ))
        .map_err(|e| e.to_string())?;
    }
    root.draw(&Text::new(
        chart.words.text("chart-frequency-axis"),
        ((left + right) / 2, plot_bottom + 24),
        anchored(14, HPos::Center, VPos::Top),
    ))
    .map_err(|e| e.to_string())?;

    // The reference level and the −3 dB level, named in the right margin.
    let (_, y0) = ctx.backend_coord(&(lo, 0.0));
    let (_, y3) = ctx.backend_coord(&(lo, -3.0));
    root.draw(&PathElement::new(
        vec![(left, y0), (right, y0)],
        DARK.stroke_width(1),
    ))
    .map_err(|e| e.to_string())?;
    dashed(&root, left, right, y3, INK.stroke_width(1))?;
    root.draw(&Text::new(
        "0 dB",
        (right + 8, y0),
        anchored(12, HPos::Left, VPos::Center),
    ))
    .map_err(|e| e.to_string())?;
    root.draw(&Text::new(
        "\u{2212}3 dB",
        (right + 8, y3),
        anchored(12, HPos::Left, VPos::Center),
    ))
    .map_err(|e| e.to_string())?;

    let mut obstacles = Obstacles::new(PixelBox::new(
        (f64::from(left), f64::from(plot_top)),
        (f64::from(right), f64::from(plot_bottom)),
    ));
    let (l, r) = (f64::from(left), f64::from(right));
    obstacles.add_line(Line::new((l, f64::from(y0)), (r, f64::from(y0)), 20.0));
    obstacles.add_line(Line::new((l, f64::from(y3)), (r, f64::from(y3)), 25.0));

    // Curves: lines first, then markers over them.
    let paths: Vec<Vec<(i32, i32)>> = chart
        .curves
        .iter()
        .map(|c| {
            c.points
                .iter()
                .map(|&(f, d)| ctx.backend_coord(&(f, d)))
                .collect()
        })
        .collect();
    for path in &paths {
        if path.len() > 1 {
            root.draw(&PathElement::new(path.clone(), MID.stroke_width(2)))
                .map_err(|e| e.to_string())?;
            for pair in path.windows(2) {
                obstacles.add_line(Line::new(
                    (f64::from(pair[0].0), f64::from(pair[0].1)),
                    (f64::from(pair[1].0), f64::from(pair[1].1)),
                    20.0,
                ));
            }
        }
    }
    for (k, path) in paths.iter().enumerate() {
        for p in path {
            draw_marker(&root, *p, marker(k))?;
            obstacles.add_solid(PixelBox::around(*p, 9.0));
        }
    }

    // The −3 dB points: a short upright tick on the −3 dB line and the
    // frequency beside it, where it covers nothing else.
    let mut ticks = Vec::new();
    for c in &chart.curves {
        for &f in &c.minus_3db {
            let (x, y) = ctx.backend_coord(&(f, -3.0));
            root.draw(&PathElement::new(
                vec![(x, y - 9), (x, y + 9)],
                INK.stroke_width(2),
            ))
            .map_err(|e| e.to_string())?;
            obstacles.add_solid(PixelBox::around((x, y), 4.0));
            ticks.push(((x, y), f));
        }
    }
    let bands = obstacles.bands().to_vec();
    let figure = anchored(12, HPos::Center, VPos::Center);
    for ((x, y), f) in ticks {
        let text = format_engineering(f, Q::Frequency);
        let w = text_width(&text, 12) + 4.0;
        let left_first = f64::from(x) > (l + r) / 2.0;
        let candidates = label_spots((x, y + 16), w, LABEL_HEIGHT, left_first);
        let place = obstacles.place(&candidates);
        draw_label(&root, &place, &bands, &text, &figure)?;
    }

    // Legend along the top: each curve's marker and label.
    // Curves that do not fit on the legend line are named in the tables.
    let mut x = left;
    let room = SIZE.0 as i32 - 130;
    for (k, c) in chart.curves.iter().enumerate() {
        let text = label_text(&c.label, 28);
        if x + 30 + text_width(&text, 13).round() as i32 > room {
            root.draw(&Text::new(
                "…",
                (x, 20),
                anchored(13, HPos::Left, VPos::Center),
            ))
            .map_err(|e| e.to_string())?;
            x += 20;
            break;
        }
        root.draw(&PathElement::new(
            vec![(x, 20), (x + 22, 20)],
            MID.stroke_width(2),
        ))
        .map_err(|e| e.to_string())?;
        draw_marker(&root, (x + 11, 20), marker(k))?;
        root.draw(&Text::new(
            text.clone(),
            (x + 30, 20),
            anchored(13, HPos::Left, VPos::Center),
        ))
        .map_err(|e| e.to_string())?;
        x += 30 + text_width(&text, 13).round() as i32 + 26;
    }
    let legend_end = x;
    let tick_x = legend_end.max(left);
    root.draw(&PathElement::new(
        vec![(tick_x, 11), (tick_x, 29)],
        INK.stroke_width(2),
    ))
    .map_err(|e| e.to_string())?;
    root.draw(&Text::new(
        chart.words.text("chart-minus-3db-point"),
        (tick_x + 8, 20),
        anchored(13, HPos::Left, VPos::Center),
    ))
    .map_err(|e| e.to_string())?;
    root.present().map_err(|e| e.to_string())?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_run_one_two_five_inside_the_range() {
        assert_eq!(
            frequency_ticks(26.7, 24_000.0),
            [
                50.0, 100.0, 200.0, 500.0, 1000.0, 2000.0, 5000.0, 10_000.0, 20_000.0
            ]
        );
        assert_eq!(tick_label(20_000.0), "20k");
        assert_eq!(tick_label(50.0), "50");
    }

    #[test]
    fn a_curve_draws_with_its_minus_3db_points() {
        let chart = ResponseChart {
            words: crate::catalogue::Catalogue::english().clone(),
            curves: vec![ResponseCurve {
                label: "as left, bright".into(),
                points: vec![(40.0, -3.7), (100.0, -0.7), (1000.0, 0.0), (16_000.0, -4.1)],
                minus_3db: vec![49.9, 12_957.0],
            }],
        };
        let svg = response_svg(&chart).unwrap();
        assert!(svg.starts_with("<svg"));
        assert!(svg.contains("49.9 Hz"), "the low −3 dB point is labelled");
        assert!(svg.contains("13 kHz"), "the high −3 dB point is labelled");
        assert!(svg.contains("as left, bright"));
    }

    #[test]
    fn extreme_and_many_curves_still_draw() {
        // The widest figures a job can hold (1 Hz to 1 MHz, volts from 1 µV to 100 kV, so about
        // ±200 dB) and more curves than the legend line holds.
        let curves = (0..12)
            .map(|k| ResponseCurve {
                label: format!("set {k} with a rather long channel name"),
                points: vec![(1.0, -200.0), (1000.0, 0.0), (1e6, 200.0)],
                minus_3db: vec![1.03],
            })
            .collect();
        let svg = response_svg(&ResponseChart {
            curves,
            words: crate::catalogue::Catalogue::english().clone(),
        })
        .unwrap();
        assert!(svg.contains("…"), "the legend says it stops");
        let one = ResponseChart {
            words: crate::catalogue::Catalogue::english().clone(),
            curves: vec![ResponseCurve {
                label: "one".into(),
                points: vec![(1e6, 0.0)],
                minus_3db: vec![],
            }],
        };
        assert!(response_svg(&one).unwrap().contains("one"));
    }
}
