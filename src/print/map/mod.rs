//! The trade-off map: one landscape page that shows a solved
//! [`TradeoffGrid`](crate::design::TradeoffGrid) as a heat map, for a buyer and a supplier who negotiate
//! their risk points in front of a projector or on paper.
//!
//! The page is landscape (A4 or Letter turned), because a projector is
//! wider than tall and the cost view sits beside the sample-size view. It
//! holds:
//!
//! * a title block: the title, the scheme, model, lot size, both risks, the
//!   two axes' ranges and counts, the cost inputs when given, and how to
//!   read the map;
//! * one panel per quantity: the sample size `n` (single plans) or the ASN
//!   at the AQL (double plans), and, when the grid carries a cost, the
//!   expected inspection cost per lot beside it. The RQL runs to the right,
//!   the AQL upwards; each cell is coloured on a log scale along a ramp
//!   whose lightness falls steadily ([`ramp`]); contour lines at 1-2-5
//!   levels are traced by marching squares on the logarithm of the value
//!   ([`contour`]) and labelled on the line where a label has room; a
//!   colour bar carries the same levels;
//! * a key for the lines and for each reason a cell has no plan (grey
//!   where the AQL is not below the RQL, hatched where the points are too
//!   close for the designer's limits or no plan meets them);
//! * a footer: the map is a negotiation aid, not a plan; the cautions; and
//!   the provenance (tool version, the inputs' hash and the command that
//!   regenerates the map, when the caller gives it).
//!
//! Layout (the page in `print/layouts/map.rs`, each panel in [`panel`]
//! with its [`cells`], [`labels`] and colour [`bar`]) and wording
//! (`print/wording/map.rs`) are kept apart from the numbers ([`field`],
//! [`contour`], [`ramp`]). The same grid, title, command and paper give
//! the same bytes: the document ID comes from a SHA-256 of those inputs
//! ([`render`]).

pub(crate) mod bar;
pub(crate) mod cells;
pub(crate) mod contour;
pub(crate) mod field;
pub(crate) mod labels;
pub(crate) mod panel;
pub(crate) mod plot;
pub(crate) mod ramp;
pub(crate) mod render;
pub(crate) mod style;

pub use field::MapQuantity;
pub use panel::{ContourLabel, MapContour, MapPanel};
pub use render::{TradeoffMap, render_tradeoff_map, render_tradeoff_map_svg};
