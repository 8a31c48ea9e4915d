//! `rectify`: design a minimum-inspection plan, write it as a plan source
//! when asked, and print its report.

use lotsman::{
    Error, Outcome, PlanSource, RectifyingReport, RectifyingRequest, design_rectifying,
    write_atomic,
};

use crate::cli::rectify::RectifyArgs;
use crate::out::{print_report, say};

pub fn run(args: RectifyArgs) -> Result<Outcome, Error> {
    let request = RectifyingRequest::try_from(&args)?;
    let design = design_rectifying(&request)?;
    let title = args
        .title
        .clone()
        .unwrap_or_else(|| "Minimum-inspection plan".to_string());
    let report = RectifyingReport::new(&title, &design);
    report.check()?;
    if let Some(target) = &args.output.output {
        let mut source = PlanSource::new_rectifying(&title, &request);
        source.record_rectifying(&design)?;
        write_atomic(target, source.to_yaml().as_bytes(), args.output.overwrite())?;
        say(format_args!("wrote plan source {}", target.display()));
    }
    print_report(&report, args.report.format.into())?;
    Ok(Outcome::Ok)
}
