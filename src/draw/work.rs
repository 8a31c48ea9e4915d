//! The work of a draw, for the budget.

use super::kind::DrawKind;
use crate::budget::Work;

/// The work of a draw of `kind` from `lot_size` units in `cartons`.
///
/// Time: 150 ns per unit drawn (one ChaCha20 word, a set insertion, the
/// sort and the printed row) and 100 ns per carton, on the calibration
/// machine: a sample of 10^7 takes about 1.5 s. From stage 2 on, each
/// stage walks over the units drawn before it to find the units left, and
/// merges its own into them: 1 ns per unit walked over, twice per unit
/// drawn before and in the stage. An item-by-item draw of `K` items walks
/// about `K^2` units in all, so 30,000 items take about 0.9 s and 60,000
/// about 3.6 s (measured 0.82 s and 3.1 s in a release build, on the
/// calibration machine under load), and 100,000 pass the budget of 10 s.
///
/// Memory: per unit drawn, 8 bytes of position in its stage, 8 in the
/// sorted list of all, 24 of hash set (or one bit per position of the
/// lot or carton, when smaller) and 48 of printed text; 80 bytes per
/// carton. A draw of several stages keeps two more sorted lists (16 bytes
/// per unit) and 40 bytes per stage. A sample of 10^7 needs about 880 MB,
/// within the budget of 1 GiB.
pub fn draw_work(lot_size: u64, kind: &DrawKind, cartons: Option<u64>) -> Work {
    #[allow(clippy::cast_precision_loss)]
    let (n, k, c, stages) = (
        lot_size as f64,
        kind.total() as f64,
        cartons.unwrap_or(1) as f64,
        kind.stage_count() as f64,
    );
    // The units walked over from stage 2 on: each stage's own and those
    // drawn before it.
    let walked = match kind {
        // Stage s (from 2 to K) walks s units.
        DrawKind::Items(_) => stages * (stages + 1.0) / 2.0 - 1.0,
        DrawKind::Stages(sizes) => {
            let mut before = 0.0;
            let mut walked = 0.0;
            for (s, &size) in sizes.iter().enumerate() {
                #[allow(clippy::cast_precision_loss)]
                let size = size as f64;
                if s > 0 {
                    walked += before + size;
                }
                before += size;
            }
            walked
        }
    };
    let largest = match kind {
        DrawKind::Items(_) => 1.0,
        #[allow(clippy::cast_precision_loss)]
        DrawKind::Stages(sizes) => sizes.iter().copied().max().unwrap_or(0) as f64,
    };
    let set = (24.0 * largest).min(n / 8.0);
    let several = if stages > 1.0 {
        16.0 * k + 40.0 * stages
    } else {
        0.0
    };
    Work {
        seconds: 150e-9 * k + 100e-9 * c + 2.0 * WALK_SECONDS * walked,
        bytes: (8.0 + 8.0 + 48.0) * k + set + 80.0 * c + several,
    }
}

/// Seconds per unit walked over when a stage finds the units left or
/// merges its own into those drawn before (fitted on item-by-item draws of
/// 10,000 to 60,000 items, above).
const WALK_SECONDS: f64 = 1e-9;
