//! What the pages of attributes plans (single and staged) share: the
//! heights of the staged pages' title block and footer, which a single
//! plan's page takes under a notice, and the band at the bottom: the
//! measures table beside the lot record and the approval, then the
//! footer.

use crate::plan::Evaluation;
use crate::print::blocks::footer::footer;
use crate::print::blocks::measures::measures_table;
use crate::print::blocks::record::record_column;
use crate::print::canvas::Canvas;
use crate::print::facts::Facts;
use crate::print::geometry::Rect;
use crate::print::page::MIN_CHART_H;
use crate::report::words;

/// The staged sheets' title block and footer: a little lower than the
/// single sheet's, for the room the stage or item table needs.
pub const STAGED_TITLE_H: f64 = 34.0;
pub const STAGED_FOOT_H: f64 = 17.0;

/// Width of the measures table; the lot record takes the rest.
const TABLE_W: f64 = 112.0;

/// The bottom of an attributes page, from `top` down in the printable
/// area `page`: the measures table of `evaluation`, `table_h` tall,
/// beside the lot record and the approval; the footer `foot_h` tall at
/// the bottom margin; and a fault when the charts above, `chart_h` tall,
/// or the band do not fit.
pub fn lower_band(
    c: &mut Canvas,
    f: &Facts,
    evaluation: &Evaluation,
    page: Rect,
    (top, table_h): (f64, f64),
    (chart_h, foot_h): (f64, f64),
) {
    let (left, width, margin) = (page.x, page.w, page.y);
    let foot_top = margin + foot_h;
    let band = Rect::from_top(left, top, width, table_h);
    let (table, record) = band.split_left(TABLE_W, 4.0);
    measures_table(c, f, evaluation, table);
    record_column(c, f, record);
    let (foot, _) = page.split_bottom(foot_h, 0.0);
    footer(c, &f.common, foot, words::CAUTION, "");
    if chart_h < MIN_CHART_H - 1e-9 || top - table_h < foot_top + 2.0 {
        c.fault("the page is too short for its blocks".to_string());
    }
}
