//! The switching rules of a standard-indexed plan in plain words, with
//! the sections of MIL-STD-105E they come from and, for the move to
//! reduced inspection, each class's limit number from Table VIII.

use super::labelled::Labelled;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::palette::PLAN;
use crate::print::standard_facts::StandardFacts;
use crate::print::text::Shrink;
use crate::print::wording::standard as words;

/// Room above the rules for the heading, and the padding inside the
/// frame, mm.
const TOP: f64 = 6.0;
const PAD: f64 = 2.0;

/// The gap between two rules, mm.
const RULE_GAP: f64 = 0.7;

/// The preamble's height and the rules' heights in a column `w` mm wide
/// at `size`.
fn heights(c: &Canvas, f: &StandardFacts, w: f64, size: f64) -> (f64, Vec<f64>) {
    let preamble = c
        .fit(
            words::SWITCHING_PREAMBLE,
            Face::Regular,
            w,
            f64::INFINITY,
            Shrink::fixed(size),
        )
        .height;
    let rules = words::switching_rules(f)
        .iter()
        .map(|(label, text)| Labelled { label, text, size }.height(c, w))
        .collect();
    (preamble, rules)
}

/// The block's height `w` mm wide at `size`.
pub fn switching_height(c: &Canvas, f: &StandardFacts, w: f64, size: f64) -> f64 {
    let (preamble, rules) = heights(c, f, w - 2.0 * PAD, size);
    TOP + preamble + RULE_GAP + rules.iter().map(|h| h + RULE_GAP).sum::<f64>() + PAD
}

/// The switching rules in a thin frame in `area`, from its top, at
/// `size` points.
pub fn switching_block(c: &mut Canvas, f: &StandardFacts, area: Rect, size: f64) {
    let (x, top, w) = (area.x + PAD, area.top(), area.w - 2.0 * PAD);
    c.claim("switching rules", area);
    c.rect_stroke(area, 0.5, grey(0.0));
    c.heading(x, top - 4.0, words::SWITCHING_HEADING);
    let mut y = top - TOP;
    y -= c.paragraph(
        "switching rules",
        Rect::new(x, area.y, w, y - area.y),
        words::SWITCHING_PREAMBLE,
        Face::Regular,
        Shrink::fixed(size),
    ) + RULE_GAP;
    for (label, text) in words::switching_rules(f) {
        let rule = Labelled {
            label: &label,
            text: &text,
            size,
        };
        y -= rule.draw(c, "switching rules", (x, y), w, PLAN) + RULE_GAP;
    }
    if y < area.y - 1e-6 {
        c.fault("switching rules: the rules are taller than their block".to_string());
    }
}
