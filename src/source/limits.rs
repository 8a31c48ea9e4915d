//! The size limit of the files a plan source is made of (the source, and
//! the user tables it names), on its own so that every reader of them
//! takes it without importing another's code.

/// The largest plan source (or table file) read: 1 MiB, refused by size
/// before parsing.
pub const MAX_SOURCE_BYTES: u64 = 1 << 20;
