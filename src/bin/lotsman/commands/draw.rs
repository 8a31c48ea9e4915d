//! `draw`: the unit positions to inspect, drawn from a seed that the
//! ledger can record and an auditor can use again.

use lotsman::{
    DrawReport, Error, InputError, MAX_SOURCE_BYTES, Outcome, SourceError, draw, read_limited,
    text_sha256,
};

use crate::cli::draw::DrawArgs;
use crate::out::{print_report, shown};

pub fn run(args: DrawArgs) -> Result<Outcome, Error> {
    if args.seed.is_some() && args.plan.is_some() {
        return Err(InputError::Inconsistent(
            "--seed gives the seed itself, so --plan would not change the draw: give one of them"
                .to_string(),
        )
        .into());
    }
    let plan_sha256 = match &args.plan {
        None => None,
        Some(path) => {
            let bytes =
                read_limited(path, MAX_SOURCE_BYTES, "a plan source").map_err(|source| {
                    SourceError::Io {
                        path: path.clone(),
                        source,
                    }
                })?;
            let text = String::from_utf8(bytes).map_err(|_| {
                InputError::Inconsistent(format!(
                    "{} is not text (UTF-8): give the plan source, the YAML file the plan was designed into",
                    shown(path)
                ))
            })?;
            Some(text_sha256(&text))
        }
    };
    let request = args.request(plan_sha256)?;
    print_report(
        &DrawReport {
            draw: draw(&request),
        },
        args.report.format.into(),
    )?;
    Ok(Outcome::Ok)
}
