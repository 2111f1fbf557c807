//! The photos as a document shows them: each prepared picture's place in
//! the typesetting folder, its caption and the size it is printed at (the
//! print box, keeping the picture's proportions). Shared by the hand-over
//! and the listing.

use serde::Serialize;

use crate::photo::{PRINT_BOX_MM, PreparedPhoto};

/// One photo for a template.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct PhotoRow {
    /// Its path in the typesetting folder.
    pub path: String,
    pub caption: Option<String>,
    /// The printed size in millimetres, as text for `float(…) * 1mm`.
    pub width_mm: String,
    pub height_mm: String,
}

/// The printed size of a `width` × `height` picture fitted into the print
/// box, in millimetres.
pub fn printed_size(width: u32, height: u32) -> (f64, f64) {
    let (box_w, box_h) = PRINT_BOX_MM;
    if width == 0 || height == 0 {
        return (box_w, box_h);
    }
    let scale = (box_w / f64::from(width)).min(box_h / f64::from(height));
    (f64::from(width) * scale, f64::from(height) * scale)
}

/// The rows for `photos`, in job order.
pub fn photo_rows<'a>(photos: impl IntoIterator<Item = &'a PreparedPhoto>) -> Vec<PhotoRow> {
    photos
        .into_iter()
        .map(|p| {
            let (w, h) = printed_size(p.width, p.height);
            PhotoRow {
                path: p.sandbox_path.clone(),
                caption: p.caption.clone(),
                width_mm: format!("{w:.2}"),
                height_mm: format!("{h:.2}"),
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_photo_fills_the_box_in_one_direction_and_keeps_its_shape() {
        // 630 × 472 px fits 80 × 60 mm by its width: 80 × 472/630 = 59.94 mm.
        let (w, h) = printed_size(630, 472);
        assert!((w - 80.0).abs() < 1e-9 && (h - 59.936_507_9).abs() < 1e-6);
        // A portrait picture fills the height: 60 × 300/400 = 45 mm wide.
        let (w, h) = printed_size(300, 400);
        assert!((w - 45.0).abs() < 1e-9 && (h - 60.0).abs() < 1e-9);
    }
}
