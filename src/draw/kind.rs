//! How the units of a draw are laid out (one sample, stages, or items one
//! at a time), and the checks of the sizes against the lot.

use crate::input::InputError;

/// How the units of a draw are laid out: in stages, or one at a time.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum DrawKind {
    /// Stages of these sizes (`--n` once per stage), each drawn from the
    /// units the stages before it left; one stage is a single draw.
    Stages(Vec<u64>),
    /// This many units one at a time, in the order to inspect them
    /// (`--items`, for an item-by-item plan): stages of one unit each.
    Items(u64),
}

impl DrawKind {
    /// The units drawn in all.
    pub fn total(&self) -> u64 {
        match self {
            DrawKind::Stages(sizes) => sizes.iter().fold(0, |a, &b| a.saturating_add(b)),
            DrawKind::Items(k) => *k,
        }
    }

    /// The number of stages (of items, for an item-by-item draw).
    pub fn stage_count(&self) -> u64 {
        match self {
            DrawKind::Stages(sizes) => u64::try_from(sizes.len()).unwrap_or(u64::MAX),
            DrawKind::Items(k) => *k,
        }
    }

    /// The stages' sizes: for an item-by-item draw, one unit each.
    pub fn sizes(&self) -> Vec<u64> {
        match self {
            DrawKind::Stages(sizes) => sizes.clone(),
            DrawKind::Items(k) => vec![1; usize::try_from(*k).unwrap_or(0)],
        }
    }
}

/// The sizes of `kind` checked against the lot: at least one unit in
/// every stage, and no more in all than the lot holds.
pub(super) fn check_sizes(kind: &DrawKind, lot_size: u64) -> Result<(), InputError> {
    let sizes = match kind {
        DrawKind::Items(0) => {
            return Err(InputError::out_of_range(
                "items to draw (--items)",
                0,
                "at least 1 unit; a plan that inspects no unit needs no draw",
            ));
        }
        DrawKind::Items(k) if *k > lot_size => {
            return Err(InputError::Inconsistent(format!(
                "--items {k} is more units than the lot (--lot-size {lot_size}) holds: give at most {lot_size}, the whole lot in the order to inspect it"
            )));
        }
        DrawKind::Items(_) => return Ok(()),
        DrawKind::Stages(sizes) => sizes,
    };
    match sizes.as_slice() {
        [] => Err(InputError::Inconsistent(
            "no sample size (--n) given: give the plan's sample size, once per stage".into(),
        )),
        [0] => Err(InputError::out_of_range(
            "sample size (--n)",
            0,
            "at least 1 unit; a plan that inspects no unit needs no draw",
        )),
        [sample] if *sample > lot_size => Err(InputError::Inconsistent(format!(
            "the sample (--n {sample}) is larger than the lot (--lot-size {lot_size}): inspect every unit of the lot; there is nothing to draw"
        ))),
        [_] => Ok(()),
        _ => {
            if let Some(stage) = sizes.iter().position(|&k| k == 0) {
                return Err(InputError::out_of_range(
                    &format!("stage {}'s sample size (--n)", stage + 1),
                    0,
                    "at least 1 unit; leave out a stage that inspects no unit",
                ));
            }
            let total = kind.total();
            if total > lot_size {
                let flags: Vec<String> = sizes.iter().map(|k| format!("--n {k}")).collect();
                return Err(InputError::Inconsistent(format!(
                    "the {} stages draw {total} units in all ({}), more than the lot (--lot-size {lot_size}): each stage needs units of its own; check the plan's stage sizes, or inspect every unit of the lot",
                    sizes.len(),
                    flags.join(" ")
                )));
            }
            Ok(())
        }
    }
}
