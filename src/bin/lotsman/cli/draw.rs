//! `draw`: the arguments, and the draw request they make.

use std::path::PathBuf;

use clap::Args;
use lotsman::{DrawRequest, InputError, MAX_LOT_SIZE, SeedSource, draw_seed, parse_count};

use super::groups::FormatFlag;
use super::values::ReportFormatArg;

/// `draw`: which units of a lot to inspect, drawn at random from a seed.
#[derive(Debug, Args)]
#[group(id = "units", required = true, multiple = false)]
pub struct DrawArgs {
    /// The lot's ID, as on its label; it seeds the draw unless --seed is given
    #[arg(long, value_name = "ID")]
    pub lot: String,
    /// Units in the lot, numbered 1 to N
    #[arg(long, value_name = "N", allow_hyphen_values = true)]
    pub lot_size: String,
    /// Units to draw (the plan's sample size); once per stage for a double or multiple plan
    /// (--n 32 --n 32), each stage from the units the stages before it left
    #[arg(
        long = "n",
        value_name = "K",
        allow_hyphen_values = true,
        group = "units"
    )]
    pub sample: Vec<String>,
    /// For an item-by-item plan: K units one at a time, in the order to inspect them
    #[arg(
        long,
        value_name = "K",
        allow_hyphen_values = true,
        group = "units",
        conflicts_with = "cartons"
    )]
    pub items: Option<String>,
    /// The plan source: its SHA-256 joins the lot ID in the seed
    #[arg(long, value_name = "PLAN.yaml")]
    pub plan: Option<PathBuf>,
    /// The seed, a whole number from 0 to 18446744073709551615 (to draw again a
    /// recorded draw)
    #[arg(
        long,
        value_name = "S",
        allow_hyphen_values = true,
        conflicts_with = "seed_from_lot"
    )]
    pub seed: Option<String>,
    /// Seed from the lot ID (and the plan source's SHA-256 with --plan): the default,
    /// stated
    #[arg(long)]
    pub seed_from_lot: bool,
    /// The lot is packed in C cartons of nearly equal size: draw from each in
    /// proportion to its size
    #[arg(long, value_name = "C", allow_hyphen_values = true)]
    pub cartons: Option<String>,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}

impl DrawArgs {
    /// The validated request; `plan_sha256` is the SHA-256 of the plan
    /// source's text when --plan was given.
    pub fn request(&self, plan_sha256: Option<String>) -> Result<DrawRequest, InputError> {
        let lot_size = parse_count("lot size (--lot-size)", &self.lot_size, MAX_LOT_SIZE)?;
        let sizes = self
            .sample
            .iter()
            .map(|k| parse_count("sample size (--n)", k, MAX_LOT_SIZE))
            .collect::<Result<Vec<u64>, InputError>>()?;
        let items = self
            .items
            .as_deref()
            .map(|k| parse_count("items to draw (--items)", k, MAX_LOT_SIZE))
            .transpose()?;
        let cartons = self
            .cartons
            .as_deref()
            .map(|c| parse_count("cartons (--cartons)", c, MAX_LOT_SIZE))
            .transpose()?;
        let (seed, source) = match (&self.seed, plan_sha256) {
            (Some(s), _) => (
                parse_count("seed (--seed)", s, u64::MAX)?,
                SeedSource::Given,
            ),
            (None, None) => (draw_seed(None, &self.lot), SeedSource::Lot),
            (None, Some(h)) => (
                draw_seed(Some(&h), &self.lot),
                SeedSource::PlanAndLot { plan_sha256: h },
            ),
        };
        match items {
            Some(k) => DrawRequest::items(&self.lot, lot_size, k, seed, source),
            None => DrawRequest::staged(&self.lot, lot_size, &sizes, cartons, seed, source),
        }
    }
}
