//! The screens, one file each.

pub mod audit;
pub mod compare;
pub mod design;
mod design_form;
pub mod design_map;
pub mod history;
pub mod home;
pub mod inspect;
pub mod login;
mod lot_judge;
mod lot_plan;
mod negotiate;
pub mod plans;
pub mod save;
mod verified;
