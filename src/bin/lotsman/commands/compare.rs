//! `compare`: two to six plans, from plan sources or typed as stages, at
//! one pair of risk points: a table of their true risks, and a page of
//! their OC, AOQ and ASN charts.

use std::path::Path;

use lotsman::{
    CompareReport, Comparison, Error, InputError, Outcome, SourceText, check_compared_count,
    compare, compared_source, format_quality, render_comparison, write_atomic,
};

use crate::cli::compare::CompareArgs;
use crate::out::{page_format, print_report, say, shown, warn_accepted};

/// What was done with a recorded plan used at the user's request although
/// the audit does not confirm it, for [`warn_accepted`].
const COMPARED_AS_RECORDED: &str =
    "compared as recorded (--accept-recorded), with the discrepancy stated in its note";

/// A comparison made, with its report and the title of its page.
pub struct Compared {
    pub comparison: Comparison,
    pub report: CompareReport,
    pub title: String,
}

/// The comparison `args` ask for, the plan sources read from `sources`
/// (their paths as the user named them, for the messages): the one path
/// of `lotsman compare` and of the web face's comparison screen.
pub fn compared(args: &CompareArgs, sources: &[&Path]) -> Result<Compared, Error> {
    check_compared_count(sources.len() + args.stage.len())?;
    let typed = args.typed_plans()?;
    let mut plans = Vec::with_capacity(sources.len() + typed.len());
    let mut source_points = None;
    for path in sources {
        let read = SourceText::read(path)?;
        let source = compared_source(&read, args.accept_recorded)?;
        warn_accepted(
            path,
            source.accepted_recorded.as_deref(),
            COMPARED_AS_RECORDED,
        );
        if source_points.is_none() {
            source_points = source.risks.map(|r| (r, shown(path)));
        }
        plans.push(source.compared);
    }
    plans.extend(typed);
    let first_model = plans.first().map(|p| p.model);
    let flagged = match &first_model {
        Some(model) => args.risks(model)?,
        None => None,
    };
    let (risks, points_from) = match (flagged, source_points) {
        (Some(risks), _) => (risks, "--aql and --rql".to_string()),
        (None, Some(from_source)) => from_source,
        (None, None) => {
            return Err(InputError::Inconsistent(
                "no plan source gives risk points to hold the plans against: give them, as --aql 1% --rql 6% (with --alpha and --beta, 0.05 and 0.10 by default)".to_string(),
            )
            .into());
        }
    };
    let comparison = compare(plans, &risks)?;
    let report = CompareReport::new(&comparison, &points_from);
    report.check()?;
    let title = format!(
        "Comparison of {} plans at AQL {} and RQL {}",
        comparison.rows.len(),
        format_quality(report.aql, comparison.per_unit),
        format_quality(report.rql, comparison.per_unit)
    );
    Ok(Compared {
        comparison,
        report,
        title,
    })
}

pub fn run(args: CompareArgs) -> Result<Outcome, Error> {
    let page = match &args.output.output {
        None => None,
        Some(path) => Some((path, page_format(path, "the charts are")?)),
    };
    let sources: Vec<&Path> = args.sources.iter().map(|p| p.as_path()).collect();
    let made = compared(&args, &sources)?;
    if let Some((path, format)) = page {
        let bytes = render_comparison(&made.comparison, &made.report, &made.title, format)?;
        write_atomic(path, &bytes, args.output.overwrite())?;
        say(format_args!("wrote {}", shown(path)));
    }
    print_report(&made.report, args.report.format.into())?;
    Ok(Outcome::Ok)
}
