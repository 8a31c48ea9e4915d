//! The printed wording: the sheet's headings and labels, the variables
//! sheet's rule and blanks, and the trade-off map's key and footer. The
//! inspector's steps and the cautions come from [`crate::report::words`],
//! which the terminal prints too.

pub(crate) mod compare;
pub(crate) mod map;
pub(crate) mod sheet;
pub(crate) mod standard;
pub(crate) mod variables;
