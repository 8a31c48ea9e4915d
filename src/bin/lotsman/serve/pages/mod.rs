//! The screens, one file each.

pub mod design;
pub mod home;
pub mod login;
pub mod save;
