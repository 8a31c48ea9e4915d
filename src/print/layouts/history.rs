//! The page of a ledger's history (`lotsman history --output`): a title
//! and key, the control chart of each lot above, the running process
//! average below, and the usual caution; A4 landscape, as a PDF or an SVG
//! drawn by the same code.

use super::landscape::{HistoryFormat, PAGE, landscape_page};
use crate::input::InputError;
use crate::ledger::History;
use crate::print::canvas::Canvas;
use crate::print::chart::history::{REDUCED_BAND, TIGHTENED_BAND, control_chart, running_chart};
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::palette::{ACCEPT, PLAN, REJECT};
use crate::source::Error;

/// The most lots one page charts legibly (a point per 0.4 mm).
pub const MAX_HISTORY_LOTS: usize = 600;

fn lay(c: &mut Canvas, history: &History, title: &str) {
    let (pw, ph) = PAGE;
    let margin = 12.0;
    c.text(
        margin,
        ph - margin - 4.0,
        title,
        Face::Bold,
        12.0,
        grey(0.0),
    );
    // The key, left to right: bands, points, lines.
    let mut x = margin;
    let y = ph - margin - 11.0;
    for (label, colour) in [("tightened", TIGHTENED_BAND), ("reduced", REDUCED_BAND)] {
        c.rect_fill(Rect::new(x, y - 0.5, 4.0, 3.0), colour);
        c.text(x + 5.0, y, label, Face::Regular, 7.0, grey(0.1));
        x += 7.0 + c.width(label, Face::Regular, 7.0);
    }
    c.marker(x + 1.0, y + 1.0, 0.8, PLAN);
    c.text(x + 3.0, y, "lot accepted", Face::Regular, 7.0, grey(0.1));
    x += 5.0 + c.width("lot accepted", Face::Regular, 7.0);
    c.marker(x + 1.0, y + 1.0, 1.6, REJECT);
    c.marker(x + 1.0, y + 1.0, 1.0, grey(1.0));
    c.marker(x + 1.0, y + 1.0, 0.6, REJECT);
    c.text(x + 3.5, y, "lot rejected", Face::Regular, 7.0, grey(0.1));
    x += 6.0 + c.width("lot rejected", Face::Regular, 7.0);
    c.line(
        &[(x, y + 1.0), (x + 6.0, y + 1.0)],
        0.6,
        grey(0.35),
        Some(2.0),
    );
    let limits = "three-sigma limits for each lot's n; solid grey: centre line";
    c.text(x + 7.0, y, limits, Face::Regular, 7.0, grey(0.1));
    x += 9.0 + c.width(limits, Face::Regular, 7.0);
    c.line(&[(x, y + 1.0), (x + 6.0, y + 1.0)], 0.8, ACCEPT, Some(4.0));
    c.text(x + 7.0, y, "AQL", Face::Regular, 7.0, grey(0.1));
    let body = Rect::new(
        margin,
        margin + 6.0,
        pw - 2.0 * margin,
        ph - 2.0 * margin - 24.0,
    );
    let (below, above) = body.split_bottom(body.h * 0.36, 6.0);
    control_chart(c, history, above);
    running_chart(c, history, below);
    c.text(
        margin,
        margin - 4.0,
        "Sampling does not guarantee the quality of any lot. A point outside its limits asks for a cause beyond chance, not a verdict on the supplier.",
        Face::Regular,
        6.5,
        grey(0.3),
    );
}

/// The history page of `history`, titled `title`, in `format`.
///
/// # Errors
/// [`InputError`](crate::InputError) for a ledger of no lot or of more than
/// [`MAX_HISTORY_LOTS`], or a page that does not lay out; an output error
/// when the PDF cannot be written.
pub fn render_history(
    history: &History,
    title: &str,
    format: HistoryFormat,
) -> Result<Vec<u8>, Error> {
    if history.lots.is_empty() {
        return Err(InputError::Inconsistent(
            "the ledger has no lot yet, so there is nothing to chart: record lots with judge --record first".into(),
        )
        .into());
    }
    if history.lots.len() > MAX_HISTORY_LOTS {
        return Err(InputError::out_of_range(
            "lots on one history chart",
            history.lots.len(),
            &format!("at most {MAX_HISTORY_LOTS}: chart a shorter ledger, or print the table with --format csv"),
        )
        .into());
    }
    landscape_page(
        format,
        title,
        ("the history chart", "lotsman lot history"),
        history,
        |c| lay(c, history, title),
    )
}
