//! The blocks of a sheet, one file each: each draws itself in the area a
//! layout gives it, claims that area for the overlap check, and returns
//! the height it took when it sizes itself.

pub(crate) mod class_record;
pub(crate) mod fields;
pub(crate) mod footer;
pub(crate) mod labelled;
pub(crate) mod measures;
pub(crate) mod notice;
pub(crate) mod plan_box;
pub(crate) mod plan_table;
pub(crate) mod procedure;
pub(crate) mod readings;
pub(crate) mod record;
pub(crate) mod results;
pub(crate) mod risks;
pub(crate) mod rule;
pub(crate) mod signatures;
pub(crate) mod standard_notes;
pub(crate) mod standard_plans;
pub(crate) mod switching;
pub(crate) mod table_box;
pub(crate) mod title;
pub(crate) mod true_risks;
