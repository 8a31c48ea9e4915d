//! The page layouts, one file each: where the blocks and charts of a
//! single, staged (double, multiple, item-by-item) or variables plan's
//! sheet go, a standard-indexed plan's one page or two, and the
//! trade-off map's page.

pub(crate) mod compare;
pub(crate) mod history;
pub(crate) mod landscape;
pub(crate) mod map;
pub(crate) mod shared;
pub(crate) mod single;
pub(crate) mod staged;
pub(crate) mod standard;
pub(crate) mod standard_pages;
pub(crate) mod variables;
