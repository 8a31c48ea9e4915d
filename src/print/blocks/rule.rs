//! The decision rule of a variables plan: the statistic's formula with the
//! plan's numbers filled in, the accept and reject conditions, and how to
//! work the formula out in a spreadsheet.

use crate::plan::VariablesPlan;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::palette::{ACCEPT, PLAN, REJECT};
use crate::print::text::Shrink;
use crate::print::wording::variables::{self, RuleLine};

/// The formula size, from which a formula too wide for its block steps
/// down.
const FORMULA_SIZES: [f64; 4] = [8.5, 8.0, 7.5, 7.0];

/// The decision rule of `plan` in a thin frame hanging from the top edge
/// `at`: the formulas with the plan's numbers, the accept and reject
/// conditions, the notes. Returns the block's height.
pub fn rule_block(c: &mut Canvas, plan: &VariablesPlan, at: Rect) -> f64 {
    let (x, top, w) = (at.x, at.top(), at.w);
    let lines = variables::rule(plan);
    let inner = w - 4.0;
    let pair_gap = 4.0;
    let face = |l: &RuleLine| match l {
        RuleLine::Accept(_) | RuleLine::Reject(_) => Face::Bold,
        _ => Face::Regular,
    };
    // One size for all the formulas of the block: the largest at which
    // each fits (a pair one under the other, if need be).
    let widest = |size: f64| {
        lines
            .iter()
            .map(|l| match l {
                RuleLine::Formula(t) | RuleLine::Accept(t) | RuleLine::Reject(t) => {
                    c.formula_width(t, face(l), size)
                }
                RuleLine::Pair(a, b) => c
                    .formula_width(a, Face::Regular, size)
                    .max(c.formula_width(b, Face::Regular, size)),
                RuleLine::Note(_) => 0.0,
            })
            .fold(0.0, f64::max)
    };
    let size = FORMULA_SIZES
        .iter()
        .copied()
        .find(|&s| widest(s) <= inner)
        .unwrap_or(FORMULA_SIZES[FORMULA_SIZES.len() - 1]);
    if widest(size) > inner {
        c.overflow("decision rule: a formula is wider than its block".to_string());
    }
    let side_by_side = |c: &Canvas, a: &str, b: &str| {
        c.formula_width(a, Face::Regular, size) + pair_gap + c.formula_width(b, Face::Regular, size)
            <= inner
    };
    let lead = size * MM_PER_PT * 1.4;
    let note_size = 6.0;
    let heights: Vec<f64> = lines
        .iter()
        .map(|l| match l {
            RuleLine::Note(t) => {
                c.fit(
                    t,
                    Face::Regular,
                    inner,
                    f64::INFINITY,
                    Shrink::fixed(note_size),
                )
                .height
                    + 1.2
            }
            RuleLine::Pair(a, b) if !side_by_side(c, a, b) => 2.0 * lead,
            _ => lead,
        })
        .collect();
    let h = 7.5 + heights.iter().sum::<f64>() + 1.0;
    let block = Rect::from_top(x, top, w, h);
    c.claim("decision rule", block);
    c.rect_stroke(block, 0.8, PLAN);
    c.heading(x + 2.0, top - 4.0, variables::RULE_HEADING);
    c.text_right(
        x + w - 2.0,
        top - 4.0,
        variables::JUDGE_TOO,
        Face::Regular,
        6.0,
        grey(0.35),
    );
    let mut y = top - 6.5;
    for (line, lh) in lines.iter().zip(&heights) {
        let base = y - lead + 1.2;
        match line {
            RuleLine::Formula(t) => c.formula(x + 2.0, base, t, Face::Regular, size, grey(0.0)),
            RuleLine::Pair(a, b) => {
                c.formula(x + 2.0, base, a, Face::Regular, size, grey(0.0));
                let (bx, by) = if side_by_side(c, a, b) {
                    (
                        x + 2.0 + c.formula_width(a, Face::Regular, size) + pair_gap,
                        base,
                    )
                } else {
                    (x + 2.0, base - lead)
                };
                c.formula(bx, by, b, Face::Regular, size, grey(0.0));
            }
            RuleLine::Accept(t) => c.formula(x + 2.0, base, t, Face::Bold, size, ACCEPT),
            RuleLine::Reject(t) => c.formula(x + 2.0, base, t, Face::Bold, size, REJECT),
            RuleLine::Note(t) => {
                c.paragraph(
                    "decision rule note",
                    Rect::from_top(x + 2.0, y - 0.6, inner, lh + 0.5),
                    t,
                    Face::Regular,
                    Shrink::fixed(note_size),
                );
            }
        }
        y -= lh;
    }
    h
}
