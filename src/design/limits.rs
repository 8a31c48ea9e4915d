//! How far the designers search: the limits of the designers themselves,
//! beside the size limits every plan keeps (such as
//! [`MAX_SAMPLE_SIZE`](crate::MAX_SAMPLE_SIZE)).

/// The most stages the multiple designer builds.
pub const MAX_DESIGN_STAGES: u32 = 7;

/// The largest single-plan acceptance number for which the double designer
/// searches: the range its stopping rule serves (the search's time is held
/// by the work budget, [`double_work`](crate::double_work)).
pub const MAX_DOUBLE_SINGLE_C: u64 = 25;

/// The largest acceptance number the scan reaches for an AOQL: each step
/// is an exact threshold search on the AOQL, whose every evaluation scans
/// the AOQ curve, so the scan costs about the square of the acceptance
/// numbers; at `2000` it takes about 10 s on two cores. (An LTPD scan runs
/// to [`MAX_ACCEPTANCE_NUMBER`](crate::MAX_ACCEPTANCE_NUMBER).)
pub const MAX_AOQL_ACCEPTANCE_NUMBER: u64 = 2_000;

/// The most cells a trade-off grid may have (`250,000`, e.g. 500 x 500).
pub const MAX_GRID_CELLS: usize = 250_000;
