//! The sheet's type: DejaVu Sans and DejaVu Sans Bold (libre; licence in
//! `src/print/fonts/`), embedded so that alpha, beta, <= and subscripts
//! print as themselves. Their metrics measure every text a layout places,
//! whatever the backend draws it with.

use printpdf::ParsedFont;

use super::draw::Face;
use super::geometry::MM_PER_PT;
use crate::input::InputError;

const REGULAR_TTF: &[u8] = include_bytes!("fonts/DejaVuSans.ttf");
const BOLD_TTF: &[u8] = include_bytes!("fonts/DejaVuSans-Bold.ttf");

/// The two font programs as a PDF embeds them, regular then bold.
pub(crate) const PROGRAMS: [&[u8]; 2] = [REGULAR_TTF, BOLD_TTF];

/// The family name of the embedded faces, as an SVG names it.
pub const FAMILY: &str = "DejaVu Sans";

/// The two embedded faces, parsed.
pub struct Fonts {
    regular: ParsedFont,
    bold: ParsedFont,
}

impl Fonts {
    /// The two embedded faces, regular and bold.
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] when they do not parse (a build defect).
    pub fn embedded() -> Result<Self, InputError> {
        let parse = |bytes| ParsedFont::from_bytes(bytes, 0, &mut Vec::new());
        match (parse(REGULAR_TTF), parse(BOLD_TTF)) {
            (Some(regular), Some(bold)) => Ok(Fonts { regular, bold }),
            _ => Err(InputError::Inconsistent(
                "the embedded fonts do not parse (a defect of this build)".into(),
            )),
        }
    }

    /// The parsed face, for a backend that embeds it.
    pub fn face(&self, face: Face) -> &ParsedFont {
        match face {
            Face::Regular => &self.regular,
            Face::Bold => &self.bold,
        }
    }

    /// Whether `face` has a glyph for `ch`.
    pub fn has_glyph(&self, face: Face, ch: char) -> bool {
        self.face(face).lookup_glyph_index(ch as u32).is_some()
    }

    /// Width of `text` in mm at `size` points: the sum of the glyphs'
    /// advances (half an em for a character without a glyph).
    pub fn width(&self, text: &str, face: Face, size: f64) -> f64 {
        let font = self.face(face);
        let units: f64 = text
            .chars()
            .map(|ch| {
                font.lookup_glyph_index(ch as u32)
                    .and_then(|g| font.get_glyph_width(g))
                    .unwrap_or(font.units_per_em / 2) as f64
            })
            .sum();
        units / font.units_per_em as f64 * size * MM_PER_PT
    }
}
