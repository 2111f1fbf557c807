//! The mains-safety notice in plain words, for the listing's Markdown. The
//! words are read from the program's own `templates/mains-safety.typ` (the
//! file every PDF includes), so the two can never say different things:
//! its heading, each `point[title][body]`, and the closing deferral to
//! local codes.

use crate::report::handover::NOTICE_TEXT;

/// The notice, piece by piece.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Notice {
    pub heading: String,
    /// Each point's title and body.
    pub points: Vec<(String, String)>,
    /// The deferral's bold opening sentence and the rest.
    pub codes_lead: String,
    pub codes_rest: String,
}

/// The text between the `[` at `open` and its matching `]`, and the index
/// just past it.
fn bracketed(s: &str, open: usize) -> Option<(&str, usize)> {
    let bytes = s.as_bytes();
    if bytes.get(open) != Some(&b'[') {
        return None;
    }
    let mut depth = 0usize;
    for (i, b) in bytes.iter().enumerate().skip(open) {
        match b {
            b'[' => depth += 1,
            b']' => {
                depth -= 1;
                if depth == 0 {
                    return Some((&s[open + 1..i], i + 1));
                }
            }
            _ => {}
        }
    }
    None
}

/// Reads the notice's words out of its Typst source.
pub fn notice_from(source: &str) -> Option<Notice> {
    let mut heading = None;
    let mut points = Vec::new();
    let mut codes_lead = None;
    let mut codes_rest = None;
    let lines: Vec<&str> = source.lines().map(str::trim).collect();
    for (i, line) in lines.iter().enumerate() {
        if line.starts_with("//") {
            continue;
        }
        if let Some(at) = line.find("point[") {
            let (title, next) = bracketed(line, at + "point".len())?;
            let (body, _) = bracketed(line, next)?;
            points.push((title.to_string(), body.to_string()));
        } else if let Some(at) = line.find("tracking: 0.1em)[") {
            heading = Some(
                bracketed(line, at + "tracking: 0.1em)".len())?
                    .0
                    .to_string(),
            );
        } else if let Some(at) = line.find("text(weight: \"bold\")[") {
            codes_lead = Some(
                bracketed(line, at + "text(weight: \"bold\")".len())?
                    .0
                    .to_string(),
            );
            let rest = lines.get(i + 1)?;
            codes_rest = Some(bracketed(rest, rest.find('[')?)?.0.trim().to_string());
        }
    }
    Some(Notice {
        heading: heading?,
        points,
        codes_lead: codes_lead?,
        codes_rest: codes_rest?,
    })
}

/// The program's notice.
pub fn notice() -> Notice {
    // The built-in file is part of the program and read by a test below.
    notice_from(NOTICE_TEXT).expect("templates/mains-safety.typ keeps its shape")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::handover::NOTICE_PHRASES;

    #[test]
    fn every_checked_phrase_and_point_comes_out_of_the_notice_file() {
        let n = notice();
        let all = format!(
            "{} {} {} {}",
            n.heading,
            n.points
                .iter()
                .map(|(t, b)| format!("{t} {b}"))
                .collect::<Vec<_>>()
                .join(" "),
            n.codes_lead,
            n.codes_rest
        );
        for phrase in NOTICE_PHRASES {
            assert!(all.contains(phrase), "{phrase} missing from {all}");
        }
        let titles: Vec<&str> = n.points.iter().map(|(t, _)| t.as_str()).collect();
        assert_eq!(
            titles,
            [
                "Deadly voltages",
                "Stored charge",
                "Who may open it",
                "Earth",
                "Fuses",
                "This document"
            ]
        );
        // Nothing of the Typst code comes through.
        assert!(!all.contains('#') && !all.contains("text("), "{all}");
    }
}
