//! The notice of a plan printed as recorded at the user's request: a red
//! box above the plan that states the discrepancy the audit found.

use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey, rgb};
use crate::print::facts::Common;
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::page::GAP;
use crate::print::palette::REJECT;
use crate::print::text::Shrink;
use crate::print::wording::sheet;

/// The most differing fields the notice lists (the rest are counted).
pub const NOTICE_FIELDS: usize = 2;

/// The most lines of a notice across the page.
pub const NOTICE_LINES: usize = 4;

/// The notice's type size.
const NOTICE_SIZE: f64 = 7.0;

/// The notice of a plan printed as recorded at the user's request: a red
/// box as wide as `at`, hanging from its top edge, its heading in bold
/// red and the statement running on after it. Returns the height it takes with the gap below it
/// (nothing without a notice); a notice of more than `max_lines` lines is
/// an overflow.
pub fn notice_block(c: &mut Canvas, f: &Common, at: Rect, max_lines: usize) -> f64 {
    let (left, top, width) = (at.x, at.top(), at.w);
    let Some(notice) = &f.notice else {
        return 0.0;
    };
    let pad = 1.8;
    let text_w = width - 2.0 * pad;
    let head_w = c.width(sheet::NOTICE, Face::Bold, NOTICE_SIZE) + 1.2;
    // The first line: the heading, then the words that fit beside it.
    let words: Vec<&str> = notice.split_whitespace().collect();
    let mut first = String::new();
    let mut taken = 0;
    for word in &words {
        let candidate = if first.is_empty() {
            word.to_string()
        } else {
            format!("{first} {word}")
        };
        if c.width(&candidate, Face::Regular, NOTICE_SIZE) > text_w - head_w {
            break;
        }
        first = candidate;
        taken += 1;
    }
    let rest = words[taken..].join(" ");
    let lead = NOTICE_SIZE * MM_PER_PT * 1.25;
    // More lines than the box holds are the paragraph's overflow below.
    let lines = 1 + c.wrap(&rest, Face::Regular, NOTICE_SIZE, text_w).len();
    let h = 2.0 * pad + lead * lines.min(max_lines) as f64;
    let block = Rect::from_top(left, top, width, h);
    c.claim("notice", block);
    c.rect_fill(block, rgb(0.99, 0.92, 0.90));
    c.rect_stroke(block, 1.4, REJECT);
    let baseline = top - pad - NOTICE_SIZE * MM_PER_PT;
    c.text(
        left + pad,
        baseline,
        sheet::NOTICE,
        Face::Bold,
        NOTICE_SIZE,
        REJECT,
    );
    c.text(
        left + pad + head_w,
        baseline,
        &first,
        Face::Regular,
        NOTICE_SIZE,
        grey(0.0),
    );
    c.paragraph(
        "notice",
        Rect::from_top(
            left + pad,
            top - pad - lead,
            text_w,
            lead * max_lines.saturating_sub(1) as f64,
        ),
        &rest,
        Face::Regular,
        Shrink::fixed(NOTICE_SIZE),
    );
    h + GAP
}
