//! The notes of a standard-indexed plan's sheet: how each plan was read
//! (arrows followed, a mark of the table that sends to another scheme's
//! plan), which cells rest on memory of the printed standard rather than
//! a copy of it, the classes that inspect every unit, and the user's
//! tables. An inspector must see that a plan rests on a recalled value.

use super::labelled::Labelled;
use crate::print::canvas::Canvas;
use crate::print::draw::grey;
use crate::print::geometry::Rect;
use crate::print::palette::REJECT;
use crate::print::standard_facts::StandardFacts;
use crate::print::wording::standard as words;

/// Room above the notes for the heading, and the padding, mm.
const TOP: f64 = 5.5;
const PAD: f64 = 2.0;

/// The block's height `w` mm wide at `size`; nothing without notes.
pub fn notes_height(c: &Canvas, f: &StandardFacts, w: f64, size: f64) -> f64 {
    let notes = words::notes(f);
    if notes.is_empty() {
        return 0.0;
    }
    let text: f64 = notes
        .iter()
        .map(|(label, text)| Labelled { label, text, size }.height(c, w - 2.0 * PAD) + 0.6)
        .sum();
    TOP + text + PAD
}

/// The notes in a thin frame in `area`, at `size` points; the marks of
/// cells from memory in red.
pub fn notes_block(c: &mut Canvas, f: &StandardFacts, area: Rect, size: f64) {
    let notes = words::notes(f);
    if notes.is_empty() {
        return;
    }
    let (x, top, w) = (area.x + PAD, area.top(), area.w - 2.0 * PAD);
    c.claim("notes", area);
    c.rect_stroke(area, 0.5, grey(0.0));
    c.heading(x, top - 4.0, words::NOTES_HEADING);
    let mut y = top - TOP;
    for (label, text) in &notes {
        let colour = if label == words::MEMORY_MARK {
            REJECT
        } else {
            grey(0.1)
        };
        let note = Labelled { label, text, size };
        y -= note.draw(c, "notes", (x, y), w, colour) + 0.6;
    }
    if y < area.y - 1e-6 {
        c.fault("notes: the notes are taller than their block".to_string());
    }
}
