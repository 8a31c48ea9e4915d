//! The `lotsman` binary: parse the command line, hand it to its command,
//! and map the outcome to an exit code: 0 ok, 1 a verify (or demo)
//! mismatch, 2 invalid input, no plan, or output that cannot be written.
//!
//! Each command lives in `commands/`, its arguments and their conversion
//! into validated library requests in `cli/`; what is written where, in
//! `out`.

mod cli;
mod commands;
mod out;
mod progress;
mod serve;

use std::process::ExitCode;

use clap::Parser;
use cli::{Cli, Command};
use lotsman::{Error, Outcome, escape_controls};

fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => return arguments_refused(&e),
    };
    match run(cli.command) {
        Ok(Outcome::Ok) => ExitCode::SUCCESS,
        Ok(Outcome::Mismatch) => ExitCode::from(1),
        Ok(Outcome::Invalid) => ExitCode::from(2),
        Err(e) => refuse(&e),
    }
}

fn run(command: Command) -> Result<Outcome, Error> {
    match command {
        Command::Design(args) => commands::design::run(*args),
        Command::Evaluate(args) => commands::evaluate::run(args),
        Command::Compare(args) => commands::compare::run(args),
        Command::Verify(args) => commands::verify::run(args),
        Command::Judge(args) => commands::judge::run(args),
        Command::Sheet(args) => commands::sheet::run(args),
        Command::Tradeoff(args) => commands::tradeoff::run(args),
        Command::New(args) => commands::new::run(&args),
        Command::Demo(args) => commands::demo::run(&args),
        Command::Rectify(args) => commands::rectify::run(args),
        Command::Standard(args) => commands::standard::run(*args),
        Command::Draw(args) => commands::draw::run(args),
        Command::Status(args) => commands::status::run(args),
        Command::History(args) => commands::history::run(args),
        Command::Serve(args) => serve::run(args),
    }
}

/// The one-line refusal on stderr, exit code 2. Control characters that
/// came from a file or an argument are shown escaped, never sent raw to
/// the terminal.
fn refuse(e: &dyn std::fmt::Display) -> ExitCode {
    out::say(format_args!("error: {}", escape_controls(&e.to_string())));
    ExitCode::from(2)
}

/// What clap reports: help and version on stdout (exit 0, or 2 when they
/// cannot be written), an argument error as one line like every refusal.
fn arguments_refused(e: &clap::Error) -> ExitCode {
    use clap::error::ErrorKind;
    use std::io::IsTerminal;
    match e.kind() {
        ErrorKind::DisplayHelp | ErrorKind::DisplayVersion => {
            if std::io::stdout().is_terminal() {
                // clap's own printing keeps its styles on a terminal.
                let _ = e.print();
                return ExitCode::SUCCESS;
            }
            match out::print_out(e.render().to_string().as_bytes()) {
                Ok(()) => ExitCode::SUCCESS,
                Err(e) => refuse(&e),
            }
        }
        ErrorKind::DisplayHelpOnMissingArgumentOrSubcommand => refuse(&cli::no_command()),
        _ => refuse(&cli::one_line(&e.render().to_string())),
    }
}
