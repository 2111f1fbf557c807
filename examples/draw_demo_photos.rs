//! Draws the two demo photos of `jobs/combo-6v6-fixed.kdl`: sketches of an
//! invented combo's chassis, seen from above, before and after the work (a
//! leaking filter capacitor and a scorched dropper, then their
//! replacements). They are drawn here, pixel by pixel, so the demo holds no
//! picture from anywhere else. Run it again after changing it:
//!
//! ```sh
//! cargo run --example draw_demo_photos
//! ```

use image::{ImageFormat, Rgb, RgbImage};

const W: u32 = 960;
const H: u32 = 640;

fn main() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("jobs/photos");
    std::fs::create_dir_all(&dir).expect("create jobs/photos");
    let before = chassis(false);
    let mut jpeg = std::fs::File::create(dir.join("parlour-twelve-before.jpg")).expect("create");
    image::codecs::jpeg::JpegEncoder::new_with_quality(&mut jpeg, 82)
        .encode_image(&before)
        .expect("encode the JPEG");
    chassis(true)
        .save_with_format(dir.join("parlour-twelve-after.png"), ImageFormat::Png)
        .expect("write the PNG");
    println!("wrote {}", dir.display());
}

/// A small deterministic noise, for the grain of the bench and the metal.
fn noise(x: u32, y: u32) -> i32 {
    let mut h = x.wrapping_mul(374_761_393) ^ y.wrapping_mul(668_265_263);
    h = (h ^ (h >> 13)).wrapping_mul(1_274_126_177);
    ((h >> 24) % 13) as i32 - 6
}

fn shade(c: [u8; 3], d: i32) -> Rgb<u8> {
    Rgb(c.map(|v| (i32::from(v) + d).clamp(0, 255) as u8))
}

fn rect(img: &mut RgbImage, x0: i32, y0: i32, x1: i32, y1: i32, c: [u8; 3], grain: bool) {
    for y in y0.max(0)..y1.min(H as i32) {
        for x in x0.max(0)..x1.min(W as i32) {
            let d = if grain {
                noise(x as u32 / 6, y as u32 / 6) / 2
            } else {
                0
            };
            img.put_pixel(x as u32, y as u32, shade(c, d));
        }
    }
}

fn disc(img: &mut RgbImage, cx: i32, cy: i32, r: i32, c: [u8; 3]) {
    for y in (cy - r).max(0)..(cy + r + 1).min(H as i32) {
        for x in (cx - r).max(0)..(cx + r + 1).min(W as i32) {
            let (dx, dy) = (x - cx, y - cy);
            if dx * dx + dy * dy <= r * r {
                img.put_pixel(x as u32, y as u32, Rgb(c));
            }
        }
    }
}

fn ring(img: &mut RgbImage, cx: i32, cy: i32, r: i32, width: i32, c: [u8; 3]) {
    for y in (cy - r).max(0)..(cy + r + 1).min(H as i32) {
        for x in (cx - r).max(0)..(cx + r + 1).min(W as i32) {
            let d2 = (x - cx).pow(2) + (y - cy).pow(2);
            if d2 <= r * r && d2 >= (r - width).pow(2) {
                img.put_pixel(x as u32, y as u32, Rgb(c));
            }
        }
    }
}

/// A darkened patch fading out from the centre: a scorch or a leak stain.
fn stain(img: &mut RgbImage, cx: i32, cy: i32, r: i32, strength: f64) {
    for y in (cy - r).max(0)..(cy + r + 1).min(H as i32) {
        for x in (cx - r).max(0)..(cx + r + 1).min(W as i32) {
            let d = f64::from((x - cx).pow(2) + (y - cy).pow(2)).sqrt() / f64::from(r);
            if d < 1.0 {
                let k = 1.0 - strength * (1.0 - d).powf(0.7);
                let p = img.get_pixel_mut(x as u32, y as u32);
                p.0 = [
                    (f64::from(p.0[0]) * k) as u8,
                    (f64::from(p.0[1]) * k * 0.92) as u8,
                    (f64::from(p.0[2]) * k * 0.8) as u8,
                ];
            }
        }
    }
}

/// A valve seen from above: glass, getter and a highlight.
fn valve(img: &mut RgbImage, cx: i32, cy: i32, r: i32) {
    disc(img, cx, cy, r + 3, [40, 40, 44]);
    disc(img, cx, cy, r, [150, 160, 165]);
    disc(img, cx, cy, r * 2 / 3, [70, 72, 78]);
    disc(img, cx, cy, r / 3, [185, 190, 200]);
    disc(img, cx - r / 3, cy - r / 3, r / 6, [235, 238, 242]);
}

/// A resistor lying left to right, with its colour bands.
fn resistor(
    img: &mut RgbImage,
    x: i32,
    y: i32,
    len: i32,
    thick: i32,
    body: [u8; 3],
    bands: &[[u8; 3]],
) {
    rect(
        img,
        x - 18,
        y - 1,
        x + len + 18,
        y + 2,
        [200, 200, 205],
        false,
    );
    rect(img, x, y - thick / 2, x + len, y + thick / 2, body, false);
    for (i, b) in bands.iter().enumerate() {
        let bx = x + 6 + i as i32 * (len - 12) / bands.len().max(1) as i32;
        rect(img, bx, y - thick / 2, bx + 4, y + thick / 2, *b, false);
    }
}

/// An axial capacitor lying left to right.
fn capacitor(
    img: &mut RgbImage,
    x: i32,
    y: i32,
    len: i32,
    thick: i32,
    body: [u8; 3],
    band: [u8; 3],
) {
    rect(
        img,
        x - 20,
        y - 1,
        x + len + 20,
        y + 2,
        [200, 200, 205],
        false,
    );
    rect(img, x, y - thick / 2, x + len, y + thick / 2, body, false);
    rect(
        img,
        x + len - 10,
        y - thick / 2,
        x + len - 4,
        y + thick / 2,
        band,
        false,
    );
    rect(
        img,
        x,
        y - thick / 2,
        x + len,
        y - thick / 2 + 3,
        [250, 250, 250],
        false,
    );
}

fn chassis(after: bool) -> RgbImage {
    let mut img = RgbImage::new(W, H);
    // The bench.
    rect(&mut img, 0, 0, W as i32, H as i32, [164, 128, 88], true);
    for y in (0..H as i32).step_by(23) {
        rect(&mut img, 0, y, W as i32, y + 2, [150, 114, 76], false);
    }
    // The chassis, with its folded edge.
    rect(&mut img, 70, 90, 890, 560, [96, 98, 102], false);
    rect(&mut img, 80, 100, 880, 550, [188, 190, 194], true);
    // Power and output transformers, with their bolts.
    for (x0, y0, x1, y1) in [(110, 130, 300, 300), (690, 130, 850, 270)] {
        rect(&mut img, x0, y0, x1, y1, [30, 30, 32], false);
        rect(
            &mut img,
            x0 + 12,
            y0 + 12,
            x1 - 12,
            y1 - 12,
            [52, 52, 56],
            false,
        );
        for (bx, by) in [
            (x0 + 10, y0 + 10),
            (x1 - 10, y0 + 10),
            (x0 + 10, y1 - 10),
            (x1 - 10, y1 - 10),
        ] {
            disc(&mut img, bx, by, 6, [170, 170, 175]);
        }
    }
    // The can capacitor beside the power transformer.
    disc(&mut img, 370, 190, 46, [120, 122, 128]);
    disc(&mut img, 370, 190, 42, [205, 208, 214]);
    ring(&mut img, 370, 190, 30, 3, [150, 152, 158]);
    // Rectifier, output pair, phase inverter and preamp valves.
    valve(&mut img, 470, 190, 36);
    valve(&mut img, 565, 170, 31);
    valve(&mut img, 565, 270, 31);
    valve(&mut img, 760, 340, 22);
    valve(&mut img, 830, 340, 22);
    // The tag board along the front.
    rect(&mut img, 120, 380, 660, 520, [126, 84, 46], true);
    for x in (140..650).step_by(40) {
        disc(&mut img, x, 395, 5, [210, 200, 150]);
        disc(&mut img, x, 505, 5, [210, 200, 150]);
    }
    // Small parts on the board.
    resistor(
        &mut img,
        150,
        430,
        50,
        12,
        [214, 196, 150],
        &[[150, 80, 40], [20, 20, 20], [200, 40, 30]],
    );
    resistor(
        &mut img,
        250,
        430,
        50,
        12,
        [214, 196, 150],
        &[[240, 200, 20], [120, 40, 160], [200, 40, 30]],
    );
    capacitor(&mut img, 160, 475, 90, 22, [190, 160, 40], [60, 60, 60]);
    capacitor(&mut img, 480, 475, 90, 22, [60, 90, 170], [220, 220, 220]);
    if after {
        // The new dropper, a 3 W metal-oxide part, and the new filter
        // capacitor, a size up.
        resistor(
            &mut img,
            370,
            430,
            80,
            20,
            [236, 236, 232],
            &[[240, 200, 20], [120, 40, 160], [200, 40, 30]],
        );
        capacitor(&mut img, 330, 475, 110, 30, [40, 70, 150], [230, 230, 230]);
    } else {
        // The scorched dropper and the leaking capacitor beside it.
        resistor(
            &mut img,
            380,
            430,
            50,
            12,
            [214, 196, 150],
            &[[240, 200, 20], [120, 40, 160], [200, 40, 30]],
        );
        stain(&mut img, 405, 430, 38, 0.85);
        capacitor(&mut img, 330, 475, 100, 26, [200, 176, 60], [60, 60, 60]);
        stain(&mut img, 350, 488, 26, 0.55);
        rect(&mut img, 425, 470, 431, 482, [120, 100, 40], false);
    }
    img
}
