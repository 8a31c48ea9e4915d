//! The colour ramp of the map: a path through the OKLab colour space whose
//! lightness falls steadily from a pale sand to a deep blue, so that equal
//! steps of the quantity look like equal steps of colour, the order reads
//! without a legend (light is few units, dark is many), and it survives a
//! black-and-white printer and the common colour-vision deficiencies, which
//! keep lightness.
//!
//! OKLab and its conversion to sRGB: B. Ottosson, "A perceptual color space
//! for image processing" (2020), the matrices as published there.

use crate::print::draw::{Colour, rgb};

/// The number of colours the ramp is cut into: steps of under 1% of the
/// ramp, finer than the eye separates on a projector, coarse enough that
/// neighbouring cells of equal colour merge into one rectangle.
pub const STEPS: usize = 128;

/// Lightness at the two ends of the ramp (OKLab L).
const LIGHT: f64 = 0.96;
const DARK: f64 = 0.36;

/// Hue at the two ends, degrees: sand through green-teal to blue.
const HUE_LIGHT: f64 = 95.0;
const HUE_DARK: f64 = 262.0;

/// The colour of step `k` of [`STEPS`].
pub fn colour(k: usize) -> Colour {
    let (r, g, b) = srgb(k as f64 / (STEPS - 1) as f64);
    rgb(r as f32, g as f32, b as f32)
}

/// The step of a position `t` in `[0, 1]` along the ramp.
pub fn step(t: f64) -> usize {
    (t.clamp(0.0, 1.0) * (STEPS - 1) as f64).round() as usize
}

/// OKLab lightness, chroma and hue (radians) at `t` in `[0, 1]`.
fn lch(t: f64) -> (f64, f64, f64) {
    let l = LIGHT + (DARK - LIGHT) * t;
    // Pale at the light end, fuller towards the middle, where the eye
    // reads hue best, and a little at the dark end so that it stays blue;
    // held under the sRGB gamut, which is narrowest for the mid-dark
    // blue-greens (checked by the tests below).
    let c = 0.05 + 0.07 * (std::f64::consts::PI * t).sin() * (1.0 - t) + 0.04 * t.powi(3);
    let h = (HUE_LIGHT + (HUE_DARK - HUE_LIGHT) * t).to_radians();
    (l, c, h)
}

/// The sRGB colour (channels in `[0, 1]`) at `t`.
fn srgb(t: f64) -> (f64, f64, f64) {
    let (l, c, h) = lch(t);
    let (a, b) = (c * h.cos(), c * h.sin());
    let l_ = l + 0.396_337_777_4 * a + 0.215_803_757_3 * b;
    let m_ = l - 0.105_561_345_8 * a - 0.063_854_172_8 * b;
    let s_ = l - 0.089_484_177_5 * a - 1.291_485_548_0 * b;
    let (lc, mc, sc) = (l_.powi(3), m_.powi(3), s_.powi(3));
    let r = 4.076_741_662_1 * lc - 3.307_711_591_3 * mc + 0.230_969_929_2 * sc;
    let g = -1.268_438_004_6 * lc + 2.609_757_401_1 * mc - 0.341_319_396_5 * sc;
    let bl = -0.004_196_086_3 * lc - 0.703_418_614_7 * mc + 1.707_612_701_0 * sc;
    (encode(r), encode(g), encode(bl))
}

/// Linear light to the sRGB transfer curve.
fn encode(x: f64) -> f64 {
    let x = x.clamp(0.0, 1.0);
    if x <= 0.003_130_8 {
        12.92 * x
    } else {
        1.055 * x.powf(1.0 / 2.4) - 0.055
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Relative luminance of an sRGB colour (WCAG), for the checks.
    fn luminance((r, g, b): (f64, f64, f64)) -> f64 {
        let lin = |v: f64| {
            if v <= 0.04045 {
                v / 12.92
            } else {
                ((v + 0.055) / 1.055).powf(2.4)
            }
        };
        0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b)
    }

    #[test]
    fn every_step_is_darker_than_the_one_before() {
        let lum: Vec<f64> = (0..STEPS)
            .map(|k| luminance(srgb(k as f64 / (STEPS - 1) as f64)))
            .collect();
        for w in lum.windows(2) {
            assert!(w[1] < w[0], "{w:?}");
        }
        // Light end near white, dark end dark enough for a projector.
        assert!(lum[0] > 0.8 && lum[STEPS - 1] < 0.1, "{lum:?}");
    }

    #[test]
    fn the_ramp_stays_inside_the_srgb_gamut() {
        // A channel clipped to 0 or 1 would bend the lightness path; the
        // clamp in `encode` shows as a channel exactly at 0 or 1.
        for k in 0..STEPS {
            let t = k as f64 / (STEPS - 1) as f64;
            let (r, g, b) = srgb(t);
            for v in [r, g, b] {
                assert!(v > 0.0 && v < 1.0, "step {k}: {r} {g} {b}");
            }
        }
    }

    #[test]
    fn positions_map_to_the_nearest_step() {
        assert_eq!(step(0.0), 0);
        assert_eq!(step(1.0), STEPS - 1);
        assert_eq!(step(-0.5), 0);
        assert_eq!(step(0.5), 64);
    }
}
