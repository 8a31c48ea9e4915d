//! The command line, as clap derive structs: one file per command's
//! arguments, the groups several commands share in [`groups`], the choices
//! in [`values`]. Each file also turns its arguments into validated library
//! requests (`TryFrom`), so that the commands start from checked values.

pub mod compare;
pub mod demo;
pub mod design;
pub mod draw;
pub mod evaluate;
pub mod groups;
pub mod history;
pub mod judge;
pub mod new;
pub mod qualities;
pub mod rectify;
pub mod serve;
pub mod sheet;
pub mod standard;
pub mod status;
pub mod tradeoff;
pub mod values;
pub mod verify;

use clap::{CommandFactory, Parser, Subcommand};

/// Acceptance-sampling plans from two risk points.
#[derive(Debug, Parser)]
#[command(name = "lotsman", version, about, long_about = None, max_term_width = 100)]
pub struct Cli {
    #[command(subcommand)]
    pub command: Command,
}

#[derive(Debug, Subcommand)]
pub enum Command {
    /// Design the smallest plan that meets both risk points.
    Design(Box<design::DesignArgs>),
    /// Evaluate a plan: OC, AOQ, ATI and ASN at chosen qualities, AOQL.
    Evaluate(evaluate::EvaluateArgs),
    /// Compare two to six plans at one pair of risk points: true risks, AOQL, ASN, and their
    /// curves.
    Compare(compare::CompareArgs),
    /// Re-solve plan sources and compare with the plans they record.
    Verify(verify::VerifyArgs),
    /// Decide a lot from the counts found: accept, reject, or go on.
    Judge(judge::JudgeArgs),
    /// Print the plan sheet (PDF) of each plan source.
    Sheet(sheet::SheetArgs),
    /// Solve a grid of risk points: the plan, and its inspection cost, for
    /// each AQL and RQL.
    Tradeoff(tradeoff::TradeoffArgs),
    /// Print a commented plan-source template.
    New(new::NewArgs),
    /// Run the whole job on the demo plans of the invented scenario.
    Demo(demo::DemoArgs),
    /// Design the plan with the least average total inspection at the process
    /// average (rectifying inspection, Dodge and Romig's method).
    Rectify(rectify::RectifyArgs),
    /// Look a plan up in the AQL tables of MIL-STD-105E: code letter, the plan at each severity,
    /// and the risks it really gives.
    Standard(Box<standard::StandardArgs>),
    /// List the units of a lot to inspect, drawn at random from a seed that reproduces
    /// them.
    Draw(draw::DrawArgs),
    /// Where a supplier stands after its ledger's lots: the next lot's severity and plan,
    /// the switching rules' counters, the process average.
    Status(status::StatusArgs),
    /// Each lot of a ledger on a control chart (p- or u-chart of first samples) with the
    /// running process average: a table, and a PDF or SVG chart.
    History(history::HistoryArgs),
    /// The local web face in a browser on this machine: design and negotiate, plans and
    /// sheets, inspect and record lots, supplier history, compare, audit.
    Serve(serve::ServeArgs),
}

impl Cli {
    /// The names of the commands, in the order of `--help`.
    pub fn command_names() -> Vec<String> {
        Cli::command()
            .get_subcommands()
            .map(|c| c.get_name().to_string())
            .collect()
    }
}

/// The refusal of a command line without a command.
pub fn no_command() -> String {
    format!(
        "give a command: {}; what each does: lotsman --help",
        Cli::command_names().join(", ")
    )
}

/// clap's message on one line: the error and its tips, without the usage
/// block, and the command whose `--help` lists the options.
pub fn one_line(rendered: &str) -> String {
    let mut text = String::new();
    let command = std::env::args()
        .nth(1)
        .filter(|a| Cli::command_names().contains(a));
    let help = match command {
        Some(c) => format!("lotsman {c} --help"),
        None => "lotsman --help".to_string(),
    };
    for line in rendered.lines().map(str::trim).filter(|l| !l.is_empty()) {
        if line.starts_with("Usage: ") || line.starts_with("For more information") {
            continue;
        }
        let line = line.strip_prefix("error: ").unwrap_or(line);
        if !text.is_empty() {
            text.push_str(if text.ends_with(':') { " " } else { "; " });
        }
        text.push_str(line);
    }
    format!("{text}; the options: {help}")
}

#[cfg(test)]
mod tests {
    use super::*;

    /// clap's own checks of the definitions: every argument a group, a
    /// conflict or a `mut_arg` names exists, no two share a name.
    #[test]
    fn the_command_line_is_well_formed() {
        Cli::command().debug_assert();
    }
}
