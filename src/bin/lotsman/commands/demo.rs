//! `demo`: run the whole job on the demo plans and print what each step
//! gave.

use lotsman::{DemoReport, Error, Format, Outcome, Overwrite, run_demo};

use crate::cli::demo::DemoArgs;
use crate::out::print_report;

pub fn run(args: &DemoArgs) -> Result<Outcome, Error> {
    let report = DemoReport {
        rows: run_demo(&args.output_dir, Overwrite::from_force(args.force))?,
    };
    print_report(&report, Format::Table)?;
    Ok(if report.verified() {
        Outcome::Ok
    } else {
        Outcome::Mismatch
    })
}
