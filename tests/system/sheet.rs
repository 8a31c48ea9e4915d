//! The sheet's words as poppler boxes them: a long characteristic wraps
//! and never prints below 7 points; a short one keeps 8 points. (Moved
//! from the cargo suite's sheet tests, which read the text with lopdf.)

use std::path::Path;

use lotsman::{Paper, PlanSource, render_sheet};

use crate::poppler::{pdf_text, word_heights};

const SEAL: &str = "plans/tpw-seal-visual.yaml";
const DOUBLE: &str = "plans/tpw-impeller-porosity.yaml";
const SEQUENTIAL: &str = "plans/tpw-sleeve-hardness.yaml";
const MULTIPLE: &str = "tests/data/sheet-multiple-seven.yaml";
const COVER_THICKNESS: &str = "plans/tpw-cover-thickness.yaml";

fn source_at(path: &str) -> (String, PlanSource) {
    let text = std::fs::read_to_string(path).unwrap();
    let source = PlanSource::from_yaml(&text, Path::new(path)).unwrap();
    (text, source)
}

fn demo_source() -> (String, PlanSource) {
    source_at(SEAL)
}

/// All the text with every run of white space folded to one space, so that
/// a wrapped paragraph reads as written.
fn folded(text: &str) -> String {
    text.split_whitespace().collect::<Vec<_>>().join(" ")
}

/// Every block on the page and apart from every other.
fn assert_laid_out(sheet: &lotsman::Sheet, paper: Paper) {
    let (w, h) = match paper {
        Paper::A4 => (210.0, 297.0),
        Paper::Letter => (215.9, 279.4),
    };
    for (i, a) in sheet.regions.iter().enumerate() {
        assert!(
            a.x >= 0.0 && a.y >= 0.0 && a.x + a.w <= w && a.y + a.h <= h,
            "{} leaves the page",
            a.name
        );
        for b in &sheet.regions[i + 1..] {
            assert!(!a.overlaps(b), "{} overlaps {}", a.name, b.name);
        }
    }
}

/// A characteristic of some 320 characters, with a word found nowhere
/// else on a sheet.
const LONG_CHARACTERISTIC: &str = "Bore diameter 12.000 +0.018/-0.000 mm, measured with the \
    air gauge TPW-AG-12 at three heights and in two orientations ninety degrees apart; a \
    unit is nonconforming when any of the six readings lies outside the tolerance, or when \
    the bore shows a scratch deeper than 0.01 mm under the profilometer (Quillfeather method)";

#[test]
#[ignore = "system suite: needs poppler-utils; run by .ci/run"]
fn a_long_characteristic_wraps_onto_more_lines_and_never_prints_below_7_points() {
    for path in [SEAL, DOUBLE, SEQUENTIAL, MULTIPLE, COVER_THICKNESS] {
        let (text, mut source) = source_at(path);
        source.characteristic = Some(LONG_CHARACTERISTIC.to_string());
        for paper in [Paper::A4, Paper::Letter] {
            let sheet = render_sheet(&text, &source, "s.yaml", paper)
                .unwrap_or_else(|e| panic!("{path} {paper:?}: {e}"));
            assert_laid_out(&sheet, paper);
            let page = folded(&pdf_text(&sheet.pdf));
            assert!(
                page.contains(LONG_CHARACTERISTIC),
                "{path} {paper:?}: {page}"
            );
            let heights = word_heights(&sheet.pdf, "(Quillfeather");
            assert_eq!(heights.len(), 1, "{path} {paper:?}");
            assert!(
                heights[0] >= 8.1,
                "{path} {paper:?}: {heights:?} (7 pt is 8.15)"
            );
        }
    }
    // One that does not fit at 7 points in five lines is refused, with
    // the field named.
    let (text, mut source) = source_at(SEAL);
    source.characteristic = Some(LONG_CHARACTERISTIC.repeat(2));
    let err = render_sheet(&text, &source, "s.yaml", Paper::A4)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("cannot be laid out") && err.contains("Characteristic: 'Bore diameter"),
        "{err}"
    );
}

#[test]
#[ignore = "system suite: needs poppler-utils; run by .ci/run"]
fn a_short_characteristic_keeps_8_points() {
    let (text, source) = demo_source();
    let sheet = render_sheet(&text, &source, "s.yaml", Paper::A4).unwrap();
    let heights = word_heights(&sheet.pdf, "magnification");
    assert_eq!(heights.len(), 1);
    assert!((heights[0] - 9.31).abs() < 0.05, "{heights:?}");
}
