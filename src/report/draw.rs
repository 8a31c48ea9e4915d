//! The report of `lotsman draw`: the unit positions to inspect, with the
//! seed and the method that reproduce them.
//!
//! JSON keys: `lot`, `lot_size`, `sample`, `seed` (decimal), `seed_from`
//! (`given`, `lot`, or `plan_and_lot`), `plan_sha256` (or null),
//! `generator`, `method`, `cartons` (each with `carton`, `first`, `last`,
//! `size`, `sample` and its `positions_in_carton`; empty when the draw is
//! not stratified), `positions` (the lot positions, increasing), `stages`
//! (each with `stage`, its `sample` and its `positions`, increasing: one
//! stage for a single draw, one per item for an item-by-item draw) and
//! `items` (for an item-by-item draw the positions in the order to
//! inspect them; null otherwise).

use std::io::{self, Write};

use serde::ser::SerializeStruct;
use serde::{Serialize, Serializer};

use super::format::{Report, csv_writer};
use crate::draw::{DRAW_GENERATOR, Draw, DrawKind, SeedSource};

/// The method of a single draw, as the output states it.
const METHOD: &str = "Floyd's sample without replacement, Lemire's unbiased bounded integers";

/// The method of a draw in stages.
const STAGED_METHOD: &str = "Floyd's sample without replacement, Lemire's unbiased bounded integers; each stage drawn from the units the stages before it left";

/// The method of an item-by-item draw.
const ITEMS_METHOD: &str = "one unit at a time, each drawn from the units not drawn yet (Floyd's sample of one), Lemire's unbiased bounded integers";

/// The units drawn for inspection from one lot.
#[derive(Clone, Debug, PartialEq)]
pub struct DrawReport {
    /// The draw.
    pub draw: Draw,
}

impl DrawReport {
    /// The method, in words, for the kind of draw.
    fn method(&self) -> &'static str {
        match self.draw.request.kind() {
            DrawKind::Items(_) => ITEMS_METHOD,
            DrawKind::Stages(sizes) if sizes.len() > 1 => STAGED_METHOD,
            DrawKind::Stages(_) => METHOD,
        }
    }

    /// The draw's items in the order to inspect them, when it is an
    /// item-by-item draw.
    fn items(&self) -> Option<Vec<u64>> {
        matches!(self.draw.request.kind(), DrawKind::Items(_)).then(|| self.draw.stages.concat())
    }

    /// Where the seed came from, in words.
    fn seed_words(&self) -> String {
        match self.draw.request.seed_source() {
            SeedSource::Given => "given with --seed".to_string(),
            SeedSource::Lot => "from the lot ID alone (no plan source given)".to_string(),
            SeedSource::PlanAndLot { plan_sha256 } => {
                format!("from the lot ID and the plan source's SHA-256 {plan_sha256}")
            }
        }
    }

    /// Each carton's positions within the carton (the positions are
    /// sorted and each carton's run is contiguous).
    fn in_carton(&self) -> Vec<Vec<u64>> {
        let mut rest = self.draw.positions.as_slice();
        self.draw
            .shares
            .iter()
            .map(|s| {
                let take = usize::try_from(s.sample).unwrap_or(0).min(rest.len());
                let (here, after) = rest.split_at(take);
                rest = after;
                here.iter().map(|p| p - s.first + 1).collect()
            })
            .collect()
    }
}

/// One stage in the JSON.
#[derive(Serialize)]
struct StageJson<'a> {
    stage: usize,
    sample: usize,
    positions: &'a [u64],
}

/// One carton in the JSON.
#[derive(Serialize)]
struct CartonJson<'a> {
    carton: u64,
    first: u64,
    last: u64,
    size: u64,
    sample: u64,
    positions_in_carton: &'a [u64],
}

impl Serialize for DrawReport {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let r = &self.draw.request;
        let (seed_from, plan) = match r.seed_source() {
            SeedSource::Given => ("given", None),
            SeedSource::Lot => ("lot", None),
            SeedSource::PlanAndLot { plan_sha256 } => ("plan_and_lot", Some(plan_sha256)),
        };
        let in_carton = self.in_carton();
        let cartons: Vec<CartonJson> = self
            .draw
            .shares
            .iter()
            .zip(&in_carton)
            .map(|(c, p)| CartonJson {
                carton: c.carton,
                first: c.first,
                last: c.last(),
                size: c.size,
                sample: c.sample,
                positions_in_carton: p,
            })
            .collect();
        let stages: Vec<StageJson> = (1..)
            .zip(&self.draw.stages)
            .map(|(stage, p)| StageJson {
                stage,
                sample: p.len(),
                positions: p,
            })
            .collect();
        let mut st = s.serialize_struct("DrawReport", 12)?;
        st.serialize_field("lot", r.lot())?;
        st.serialize_field("lot_size", &r.lot_size())?;
        st.serialize_field("sample", &r.sample())?;
        st.serialize_field("seed", &r.seed())?;
        st.serialize_field("seed_from", seed_from)?;
        st.serialize_field("plan_sha256", &plan)?;
        st.serialize_field("generator", DRAW_GENERATOR)?;
        st.serialize_field("method", self.method())?;
        st.serialize_field("cartons", &cartons)?;
        st.serialize_field("positions", &self.draw.positions)?;
        st.serialize_field("stages", &stages)?;
        st.serialize_field("items", &self.items())?;
        st.end()
    }
}

impl Report for DrawReport {
    /// The lot, the seed and where it came from, the method, then one
    /// line per unit: its position, and its carton and place in the
    /// carton in a stratified draw; stage by stage under a heading each
    /// for a draw in stages; numbered in order for an item-by-item draw.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = &self.draw.request;
        let width = r.lot_size().to_string().len().max("position".len());
        let mut text = match r.kind() {
            DrawKind::Items(k) => format!(
                "Units to inspect from lot {} one at a time: {k} of {}, in the order to inspect them (positions 1 to {})\n",
                r.lot(),
                r.lot_size(),
                r.lot_size()
            ),
            DrawKind::Stages(sizes) if sizes.len() > 1 => {
                let parts: Vec<String> = sizes.iter().map(u64::to_string).collect();
                format!(
                    "Units to inspect from lot {} in {} stages: {} of {} (positions 1 to {}, each stage sorted)\n",
                    r.lot(),
                    sizes.len(),
                    parts.join(" + "),
                    r.lot_size(),
                    r.lot_size()
                )
            }
            DrawKind::Stages(_) => format!(
                "Units to inspect from lot {}: {} of {} (positions 1 to {}, sorted)\n",
                r.lot(),
                r.sample(),
                r.lot_size(),
                r.lot_size()
            ),
        };
        text.push_str(&format!("  seed {}, {}\n", r.seed(), self.seed_words()));
        text.push_str(&format!(
            "  generator {DRAW_GENERATOR}; {}\n",
            self.method()
        ));
        if let Some(items) = self.items() {
            text.push_str(
                "  inspect them in this order and stop where the plan's decision lines say; the units after that are not inspected\n\n",
            );
            let iw = items.len().to_string().len().max("item".len());
            text.push_str(&format!("{:>iw$}  {:>width$}\n", "item", "position"));
            for (i, p) in (1..).zip(&items) {
                text.push_str(&format!("{i:>iw$}  {p:>width$}\n"));
            }
        } else if let Some(c) = r.cartons() {
            text.push_str(&format!(
                "  {c} cartons, units numbered carton by carton; the sample shared in proportion to carton size (largest remainder)\n\n"
            ));
            let cw = c.to_string().len().max("carton".len());
            text.push_str(&format!(
                "{:>width$}  {:>cw$}  in carton\n",
                "position", "carton"
            ));
            for u in self.draw.units() {
                text.push_str(&format!(
                    "{:>width$}  {:>cw$}  {:>9}\n",
                    u.position,
                    u.carton.unwrap_or(0),
                    u.in_carton.unwrap_or(0)
                ));
            }
        } else if self.draw.stages.len() > 1 {
            for (s, positions) in (1..).zip(&self.draw.stages) {
                text.push_str(&format!("\n{}\n", stage_heading(s, positions.len())));
                text.push_str(&format!("{:>width$}\n", "position"));
                for p in positions {
                    text.push_str(&format!("{p:>width$}\n"));
                }
            }
        } else {
            text.push('\n');
            text.push_str(&format!("{:>width$}\n", "position"));
            for p in &self.draw.positions {
                text.push_str(&format!("{p:>width$}\n"));
            }
        }
        out.write_all(text.as_bytes())
    }

    /// One row per unit: `position`, and `carton` and `in_carton` in a
    /// stratified draw; `stage` and `position` in a draw in stages (stage
    /// by stage, each sorted); `item` and `position` in an item-by-item
    /// draw, in the order to inspect them.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        if let Some(items) = self.items() {
            w.write_record(["item", "position"])?;
            for (i, p) in (1u64..).zip(&items) {
                w.write_record([i.to_string(), p.to_string()])?;
            }
        } else if self.draw.request.cartons().is_some() {
            w.write_record(["position", "carton", "in_carton"])?;
            for u in self.draw.units() {
                w.write_record([
                    u.position.to_string(),
                    u.carton.unwrap_or(0).to_string(),
                    u.in_carton.unwrap_or(0).to_string(),
                ])?;
            }
        } else if self.draw.stages.len() > 1 {
            w.write_record(["stage", "position"])?;
            for (s, positions) in (1u64..).zip(&self.draw.stages) {
                for p in positions {
                    w.write_record([s.to_string(), p.to_string()])?;
                }
            }
        } else {
            w.write_record(["position"])?;
            for p in &self.draw.positions {
                w.write_record([p.to_string()])?;
            }
        }
        w.flush()
    }
}

/// The heading of stage `stage` of a draw in stages, of `units` units:
/// when the inspector needs it.
fn stage_heading(stage: u64, units: usize) -> String {
    let plural = if units == 1 { "unit" } else { "units" };
    match stage {
        1 => format!("stage 1: {units} {plural}"),
        2 => format!("stage 2: {units} more {plural}, only when stage 1 does not decide the lot"),
        3 => format!(
            "stage 3: {units} more {plural}, only when stages 1 and 2 do not decide the lot"
        ),
        _ => format!(
            "stage {stage}: {units} more {plural}, only when stages 1 to {} do not decide the lot",
            stage - 1
        ),
    }
}
