//! The file system, the one way the crate touches it: the atomic writer
//! (one file, or a set of files as one), the overwrite rules, the
//! size-limited reader, the folders made for outputs, and the leftovers a
//! killed run leaves.

mod append;
mod atomic;
mod error;
mod folder;
pub(crate) mod leftovers;
mod overwrite;
mod read;

pub use append::{append_synced, open_locked_append};
pub use atomic::{Overwrite, write_atomic, write_set};
pub use error::FileError;
pub use folder::normalise_folder;
pub use overwrite::{refuse_overwriting_input, same_file};
pub use read::read_limited;
