//! `new`: the arguments.

use clap::Args;

#[derive(Debug, Args)]
pub struct NewArgs {
    /// Template kind: binomial, hypergeometric, poisson, double, multiple, sequential, variables,
    /// rectifying or standard
    #[arg(value_name = "KIND")]
    pub kind: String,
}
