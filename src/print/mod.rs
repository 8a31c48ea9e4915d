//! The print layer: the plan sheet (one A4 or Letter page an inspector
//! follows and an auditor files), the trade-off map, and the charts of a
//! plan as SVG.
//!
//! Everything is laid out once and drawn through a small backend trait
//! ([`draw`]): the PDF backend ([`pdf`]) writes the sheets and the map,
//! the SVG backend ([`svg`]) the charts a web page inlines
//! ([`chart_svg`]) and a sheet seen in a browser ([`render_sheet_svg`]). Layout works
//! on areas ([`geometry`]): a layout ([`layouts`]) places the blocks
//! ([`blocks`]) and charts ([`chart`]) of a page, each of which draws in
//! the area it is given and claims it, so that a page whose blocks
//! overlap, leave the page or overflow is refused rather than printed
//! ([`canvas`]). Text is measured with the embedded fonts ([`fonts`]),
//! the same for every backend. The wording is apart ([`wording`]), the
//! numbers come from the library.

pub(crate) mod agreement;
pub(crate) mod blocks;
pub(crate) mod canvas;
pub(crate) mod chart;
pub(crate) mod check;
pub(crate) mod draw;
pub(crate) mod facts;
pub(crate) mod font_programs;
pub(crate) mod fonts;
pub(crate) mod geometry;
pub(crate) mod layouts;
pub(crate) mod map;
pub(crate) mod metadata;
pub(crate) mod names;
pub(crate) mod page;
pub(crate) mod palette;
pub(crate) mod pdf;
mod rendered;
pub(crate) mod sheet;
mod source_oc;
pub(crate) mod standard_facts;
pub(crate) mod standard_sheet;
mod standard_source;
pub(crate) mod svg;
pub(crate) mod text;
pub(crate) mod wording;

pub use chart::{ChartKind, chart_svg};
pub use check::{MAX_SHEET_BYTES, SheetVerdict, check_sheet, check_sheet_text};
pub use layouts::compare::render_comparison;
pub use layouts::history::{MAX_HISTORY_LOTS, render_history};
pub use layouts::landscape::HistoryFormat;
pub use map::{
    ContourLabel, MapContour, MapPanel, MapQuantity, TradeoffMap, render_tradeoff_map,
    render_tradeoff_map_svg,
};
pub use metadata::{HASH_PREFIX, SOURCE_NAME_KEY, sheet_source_hash, source_hash};
pub use page::Paper;
pub use rendered::Sheet;
pub use sheet::{
    SheetNotes, SheetOptions, render_sheet, render_sheet_noting, render_sheet_svg, sheet_of_text,
    write_sheet, write_sheet_text,
};
pub use source_oc::{RiskAt, SourceOc, source_oc_svg};
pub use standard_facts::{
    ReducedLimit, SCHEME_POINTS, SchemeCurve, SheetDocument, StandardClassFacts, StandardFacts,
};
pub use standard_sheet::{render_standard_sheet, render_standard_sheet_svg};
