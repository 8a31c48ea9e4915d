//! The page of the trade-off map: one landscape page (A4 or Letter
//! turned, since a projector is wider than tall and the cost view sits
//! beside the sample-size view) with the title block, one panel per
//! quantity, the key and the footer.

use crate::design::{Scheme, TradeoffGrid};
use crate::model::ModelKind;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::map::field::{Field, Gap, MapQuantity};
use crate::print::map::panel::{MapPanel, draw};
use crate::print::map::plot::Panel;
use crate::print::map::style::{agreed_ring, contour_swatch, gap_swatch};
use crate::print::page::printable;
use crate::print::text::Shrink;
use crate::print::wording::map as text;
use crate::report::words;
use crate::source::tool_version;

/// Page margin, mm.
const MARGIN: f64 = 10.0;

/// Heights of the footer and of one line of the key, mm.
const FOOT_H: f64 = 17.0;
const KEY_PITCH: f64 = 5.0;

/// Lays out the map of `grid` on `c`, a landscape page `size` (mm), with
/// the `title`, the `command` that regenerates it (if given) and the
/// inputs' `hash`, the `agreed` risk points `(RQL, AQL)` ringed on every
/// panel when given; returns the panels.
pub fn map_layout(
    c: &mut Canvas,
    grid: &TradeoffGrid,
    (title, command, hash): (&str, Option<&str>, &str),
    size: (f64, f64),
    agreed: Option<(f64, f64)>,
) -> Vec<MapPanel> {
    let request = &grid.request;
    let per_unit = request.model().kind() == ModelKind::Poisson;
    let page = printable(size, MARGIN);
    let (left, width) = (page.x, page.w);
    let main = match request.scheme() {
        Scheme::Double => MapQuantity::AsnAtAql,
        _ => MapQuantity::SampleSize,
    };
    let mut quantities = vec![main];
    if request.cost().is_some() {
        quantities.push(MapQuantity::CostPerLot);
    }
    let fields: Vec<Field> = quantities.iter().map(|&q| Field::new(grid, q)).collect();
    let process = request.cost().map_or_else(String::new, |k| {
        text::quality(k.process_average(), per_unit)
    });

    let top = page.top();
    let title_h = title_block(c, grid, title, Rect::top_edge(left, top, width), per_unit);
    let (foot, _) = page.split_bottom(FOOT_H, 0.0);
    let foot_top = foot.top();
    footer(c, hash, command, foot);
    let gaps = fields[0].gaps();
    let key_at = Rect::new(left, foot_top + 2.0, width, 0.0);
    let key_h = key(c, grid, (&gaps, &process, agreed.is_some()), key_at);

    let panels_top = top - title_h - 4.0;
    let panels_bottom = foot_top + 2.0 + key_h + 3.0;
    let gap = 10.0;
    let count = quantities.len() as f64;
    let panel_w = (width - gap * (count - 1.0)) / count;
    quantities
        .iter()
        .zip(&fields)
        .enumerate()
        .map(|(k, (&quantity, field))| {
            let x = left + k as f64 * (panel_w + gap);
            let name = match quantity {
                MapQuantity::CostPerLot => "cost panel",
                _ => "sample size panel",
            };
            draw(
                c,
                name,
                Rect::new(x, panels_bottom, panel_w, panels_top - panels_bottom),
                &Panel {
                    quantity,
                    title: text::panel_title(quantity, &process),
                    field,
                    rql: request.rql(),
                    aql: request.aql(),
                    per_unit,
                    agreed,
                },
            )
        })
        .collect()
}

/// The title block hanging from the top edge `at`: the kicker across the
/// page, the title and how to read the map on the left, the request's
/// fields on the right. Returns its height.
fn title_block(c: &mut Canvas, grid: &TradeoffGrid, title: &str, at: Rect, per_unit: bool) -> f64 {
    let (left, top, width) = (at.x, at.top(), at.w);
    let r = &grid.request;
    let mut fields = vec![
        (text::SCHEME, text::scheme(r.scheme(), r.criterion())),
        (text::MODEL, text::model(r.model().kind())),
        (text::RISKS, text::risks(r.alpha(), r.beta())),
        (text::LOT_SIZE, text::lot_size(r.model().lot_size())),
        (text::AQL_ROWS, text::range(r.aql(), per_unit)),
        (text::RQL_COLUMNS, text::range(r.rql(), per_unit)),
    ];
    if let Some(k) = r.cost() {
        fields.push((text::COST_PER_UNIT, text::number(k.per_unit())));
        fields.push((
            text::PROCESS_QUALITY,
            text::quality(k.process_average(), per_unit),
        ));
    }
    let rows = fields.len().div_ceil(2);
    let row_h = 8.0;
    let block_h = 6.0 + rows as f64 * row_h + 1.0;
    c.claim(
        "title block",
        Rect::new(left, top - block_h, width, block_h),
    );
    c.text(left, top - 3.5, text::KICKER, Face::Bold, 7.5, grey(0.35));
    if c.width(text::KICKER, Face::Bold, 7.5) > width {
        c.fault("the kicker is wider than the page".into());
    }
    let fields_w = 150.0;
    let text_w = width - fields_w - 6.0;
    let title_used = c.paragraph(
        "title",
        Rect::from_top(left, top - 5.5, text_w, 9.0),
        title,
        Face::Bold,
        Shrink::new(17.0, 10.0),
    );
    c.paragraph(
        "how to read",
        Rect::from_top(
            left,
            top - 7.0 - title_used,
            text_w,
            block_h - 9.0 - title_used,
        ),
        text::how_to_read(r.scheme()),
        Face::Regular,
        Shrink::new(8.0, 6.5),
    );
    let fx = left + width - fields_w;
    let col_w = fields_w / 2.0;
    for (k, (label, value)) in fields.iter().enumerate() {
        let (col, row) = (k % 2, k / 2);
        let x = fx + col as f64 * col_w;
        let y = top - 6.0 - row as f64 * row_h;
        c.text(x, y - 2.4, label, Face::Bold, 6.5, grey(0.35));
        let fit = c.fit(
            value,
            Face::Regular,
            col_w - 3.0,
            4.0,
            Shrink::new(9.0, 6.5),
        );
        if !fit.fits {
            c.overflow(format!("{label}: '{value}'"));
        }
        c.text(x, y - 6.2, value, Face::Regular, fit.size, grey(0.0));
    }
    c.line(
        &[(left, top - block_h), (left + width, top - block_h)],
        0.9,
        grey(0.0),
        None,
    );
    block_h
}

/// The key above the footer, standing on the bottom edge `at`: a sample
/// of the contour line, the ring of the agreed points when `ringed`, the
/// double scheme's note, each reason for cells without a plan in `gaps`
/// that occurs, and the cost's definition at the `process` quality,
/// flowing over as many lines as they need. Returns its height.
fn key(
    c: &mut Canvas,
    grid: &TradeoffGrid,
    (gaps, process, ringed): (&[Gap], &str, bool),
    at: Rect,
) -> f64 {
    let (left, bottom, width) = (at.x, at.y, at.w);
    enum Sample {
        Contour,
        Ring,
        Gap(Gap),
        None,
    }
    let mut entries: Vec<(Sample, String)> = vec![(Sample::Contour, text::CONTOUR_KEY.into())];
    if ringed {
        entries.push((Sample::Ring, text::AGREED_KEY.into()));
    }
    if grid.request.scheme() == Scheme::Double {
        entries.push((Sample::None, text::ASN_KEY.into()));
    }
    entries.extend(
        gaps.iter()
            .map(|&g| (Sample::Gap(g), text::gap(g).to_string())),
    );
    if let Some(k) = grid.request.cost() {
        entries.push((Sample::None, text::cost_key(k.per_unit(), process)));
    }
    let size = 8.0;
    let sample_w = 8.0;
    // Lay the entries out in lines, then draw them top down.
    let mut lines: Vec<Vec<(f64, usize)>> = vec![Vec::new()];
    let mut x = 0.0;
    for (k, (sample, label)) in entries.iter().enumerate() {
        let w = match sample {
            Sample::None => 0.0,
            _ => sample_w + 1.5,
        } + c.width(label, Face::Regular, size);
        if x > 0.0 && x + w > width {
            lines.push(Vec::new());
            x = 0.0;
        }
        if w > width {
            c.overflow(format!("key: '{label}'"));
        }
        if let Some(line) = lines.last_mut() {
            line.push((x, k));
        }
        x += w + 6.0;
    }
    let h = KEY_PITCH * lines.len() as f64;
    c.claim("key", Rect::new(left, bottom, width, h));
    for (row, line) in lines.iter().enumerate() {
        let base = bottom + h - KEY_PITCH * (row as f64 + 1.0) + 1.2;
        for &(at, k) in line {
            let (sample, label) = &entries[k];
            let sx = left + at;
            let tx = match sample {
                Sample::Contour => {
                    contour_swatch(c, sx, base + 1.0, sample_w);
                    sx + sample_w + 1.5
                }
                Sample::Ring => {
                    agreed_ring(c, sx + sample_w / 2.0, base + 1.0);
                    sx + sample_w + 1.5
                }
                Sample::Gap(g) => {
                    gap_swatch(c, *g, (sx, base - 0.6, sx + sample_w, base + 2.8));
                    sx + sample_w + 1.5
                }
                Sample::None => sx,
            };
            c.text(tx, base, label, Face::Regular, size, grey(0.05));
        }
    }
    h
}

/// The footer in `area`, at the bottom margin: that the map is no plan,
/// the cautions, and the provenance.
fn footer(c: &mut Canvas, hash: &str, command: Option<&str>, area: Rect) {
    let (left, width, top) = (area.x, area.w, area.top());
    c.claim("footer", area);
    c.line(&[(left, top), (left + width, top)], 0.6, grey(0.0), None);
    let cautions = format!("{} {}", text::NOT_A_PLAN, words::CAUTION);
    let used = c.paragraph(
        "cautions",
        Rect::from_top(left, top - 1.5, width, 9.0),
        &cautions,
        Face::Regular,
        Shrink::new(7.5, 6.0),
    );
    let provenance = text::provenance(&tool_version(), hash, command);
    c.paragraph(
        "provenance",
        Rect::from_top(left, top - 2.5 - used, width, FOOT_H - 3.0 - used),
        &provenance,
        Face::Regular,
        Shrink::new(6.5, 5.0),
    );
}
