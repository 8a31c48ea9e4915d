//! The title block of a sheet: the title, item and characteristic on the
//! left; plan ID, revision, date, lot size and scheme on the right.

use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::facts::{Common, given};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::text::Shrink;
use crate::print::wording::sheet;

/// The sizes the characteristic is printed at, from the largest: it wraps
/// onto as many lines as the block's room holds at each, and shrinks only
/// when they do not fit. Below 7 points it would no longer read on a
/// photocopy at the bench, so at 7 points the block grows instead, up to
/// [`CHARACTERISTIC_LINES`] lines; a longer text is refused.
const CHARACTERISTIC_SIZES: [f64; 3] = [8.0, 7.5, 7.0];
const CHARACTERISTIC_LINES: usize = 5;

/// What the title block prints: the document's fields, the lot size and
/// the scheme, as the source of a sheet gives them.
pub struct Heading<'a> {
    /// The title.
    pub title: &'a str,
    /// The item inspected.
    pub item: &'a Option<String>,
    /// The characteristic inspected.
    pub characteristic: &'a Option<String>,
    /// The plan ID.
    pub id: &'a Option<String>,
    /// The revision.
    pub revision: &'a Option<String>,
    /// The revision's date.
    pub date: &'a Option<String>,
    /// The lot size field.
    pub lot: String,
    /// The scheme field.
    pub scheme: &'a str,
}

impl<'a> Heading<'a> {
    /// The heading of a plan source's sheet.
    pub fn of(f: &'a Common) -> Self {
        let source = f.source;
        Heading {
            title: &source.title,
            item: &source.item,
            characteristic: &source.characteristic,
            id: &source.id,
            revision: &source.revision,
            date: &source.date,
            lot: f
                .lot_size
                .map_or(sheet::NO_LOT_SIZE.to_string(), |n| format!("{n} units")),
            scheme: &f.scheme,
        }
    }
}

/// The title block of a plan source's sheet (see [`heading_block`]).
pub fn title_block(c: &mut Canvas, f: &Common, area: Rect) -> f64 {
    heading_block(c, &Heading::of(f), area)
}

/// The title block: title, item and characteristic on the left; plan ID,
/// revision, date, lot size and scheme on the right. The block hangs
/// from the top of `area`, as wide and at least as tall, taller when a
/// long characteristic needs the room; returns its height.
pub fn heading_block(c: &mut Canvas, h: &Heading, area: Rect) -> f64 {
    let (left, top, width, min_h) = (area.x, area.top(), area.w, area.h);
    let right = left + width;
    let black = || grey(0.0);
    let meta_w = 52.0;
    let title_w = width - meta_w - 6.0;
    let field_w = title_w - 23.0;
    // Measured first, for the characteristic's size and the block's
    // height: the title and item above it, and the room they leave.
    let title_h = c
        .fit(h.title, Face::Bold, title_w, 13.0, Shrink::new(14.0, 8.0))
        .height;
    let item = given(h.item);
    let item_h = c
        .fit(&item, Face::Regular, field_w, 9.0, Shrink::new(8.0, 5.5))
        .height
        .max(3.5);
    let above = 8.5 + title_h + item_h + 1.5;
    let room = min_h - above - 2.0;
    let characteristic = given(h.characteristic);
    let height_at = |c: &Canvas, size: f64| {
        let lines = c.wrap(&characteristic, Face::Regular, size, field_w).len();
        size * MM_PER_PT * 1.25 * lines.min(CHARACTERISTIC_LINES) as f64
    };
    let size = CHARACTERISTIC_SIZES
        .into_iter()
        .find(|&s| height_at(c, s) <= room + 1e-6)
        .unwrap_or(CHARACTERISTIC_SIZES[CHARACTERISTIC_SIZES.len() - 1]);
    let characteristic_h = height_at(c, size);
    let block_h = min_h.max(above + characteristic_h.max(3.5) + 2.0);
    let block = Rect::from_top(left, top, width, block_h);
    c.claim("title block", block);
    c.rect_stroke(block, 0.8, black());
    c.text(
        left + 3.0,
        top - 4.5,
        sheet::KICKER,
        Face::Bold,
        6.5,
        grey(0.35),
    );
    let title_used = c.paragraph(
        "title",
        Rect::from_top(left + 3.0, top - 6.5, title_w, 13.0),
        h.title,
        Face::Bold,
        Shrink::new(14.0, 8.0),
    );
    let fields = [
        (sheet::ITEM, item, 9.0, 8.0, 5.5),
        // Room for the lines at the size chosen; more lines than that are
        // the paragraph's overflow, and a refusal.
        (
            sheet::CHARACTERISTIC,
            characteristic,
            characteristic_h + 1e-6,
            size,
            size,
        ),
    ];
    let mut fy = top - 8.5 - title_used;
    for (label, value, room, size, min_size) in fields {
        c.text(left + 3.0, fy - 2.5, label, Face::Bold, 6.5, grey(0.35));
        let used = c.paragraph(
            label,
            Rect::from_top(left + 26.0, fy, field_w, room),
            &value,
            Face::Regular,
            Shrink::new(size, min_size),
        );
        fy -= used.max(3.5) + 1.5;
    }
    let meta_x = right - meta_w;
    c.line(
        &[(meta_x - 3.0, top), (meta_x - 3.0, top - block_h)],
        0.5,
        black(),
        None,
    );
    let meta = [
        (sheet::PLAN_ID, given(h.id)),
        (sheet::REVISION, given(h.revision)),
        (sheet::DATE, given(h.date)),
        (sheet::LOT_SIZE, h.lot.clone()),
        (sheet::SCHEME, h.scheme.to_string()),
    ];
    // Five rows spread over the block's height.
    let pitch = (block_h - 5.0) / 5.0;
    for (i, (label, value)) in meta.iter().enumerate() {
        let y = top - 6.0 - pitch * i as f64;
        c.text(meta_x, y, label, Face::Bold, 6.5, grey(0.35));
        c.paragraph(
            label,
            Rect::from_top(meta_x + 17.0, y + 2.6, meta_w - 17.0, 4.0),
            value,
            Face::Regular,
            Shrink::new(8.0, 5.5),
        );
    }
    block_h
}
