//! The report of `lotsman draw`: the unit positions to inspect, with the
//! seed and the method that reproduce them.
//!
//! JSON keys: `lot`, `lot_size`, `sample`, `seed` (decimal), `seed_from`
//! (`given`, `lot`, or `plan_and_lot`), `plan_sha256` (or null),
//! `generator`, `method`, `cartons` (each with `carton`, `first`, `last`,
//! `size`, `sample` and its `positions_in_carton`; empty when the draw is
//! not stratified) and `positions` (the lot positions, increasing).

use std::io::{self, Write};

use serde::ser::SerializeStruct;
use serde::{Serialize, Serializer};

use super::format::{Report, csv_writer};
use crate::draw::{DRAW_GENERATOR, Draw, SeedSource};

/// The method, as the output states it.
const METHOD: &str = "Floyd's sample without replacement, Lemire's unbiased bounded integers";

/// The units drawn for inspection from one lot.
#[derive(Clone, Debug, PartialEq)]
pub struct DrawReport {
    /// The draw.
    pub draw: Draw,
}

impl DrawReport {
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
        let mut st = s.serialize_struct("DrawReport", 10)?;
        st.serialize_field("lot", r.lot())?;
        st.serialize_field("lot_size", &r.lot_size())?;
        st.serialize_field("sample", &r.sample())?;
        st.serialize_field("seed", &r.seed())?;
        st.serialize_field("seed_from", seed_from)?;
        st.serialize_field("plan_sha256", &plan)?;
        st.serialize_field("generator", DRAW_GENERATOR)?;
        st.serialize_field("method", METHOD)?;
        st.serialize_field("cartons", &cartons)?;
        st.serialize_field("positions", &self.draw.positions)?;
        st.end()
    }
}

impl Report for DrawReport {
    /// The lot, the seed and where it came from, the method, then one
    /// line per unit: its position, and its carton and place in the
    /// carton in a stratified draw.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = &self.draw.request;
        let mut text = format!(
            "Units to inspect from lot {}: {} of {} (positions 1 to {}, sorted)\n",
            r.lot(),
            r.sample(),
            r.lot_size(),
            r.lot_size()
        );
        text.push_str(&format!("  seed {}, {}\n", r.seed(), self.seed_words()));
        text.push_str(&format!("  generator {DRAW_GENERATOR}; {METHOD}\n"));
        if let Some(c) = r.cartons() {
            text.push_str(&format!(
                "  {c} cartons, units numbered carton by carton; the sample shared in proportion to carton size (largest remainder)\n\n"
            ));
            let width = r.lot_size().to_string().len().max("position".len());
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
        } else {
            text.push('\n');
            let width = r.lot_size().to_string().len().max("position".len());
            text.push_str(&format!("{:>width$}\n", "position"));
            for p in &self.draw.positions {
                text.push_str(&format!("{p:>width$}\n"));
            }
        }
        out.write_all(text.as_bytes())
    }

    /// One row per unit: `position`, and `carton` and `in_carton` in a
    /// stratified draw.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        if self.draw.request.cartons().is_some() {
            w.write_record(["position", "carton", "in_carton"])?;
            for u in self.draw.units() {
                w.write_record([
                    u.position.to_string(),
                    u.carton.unwrap_or(0).to_string(),
                    u.in_carton.unwrap_or(0).to_string(),
                ])?;
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
