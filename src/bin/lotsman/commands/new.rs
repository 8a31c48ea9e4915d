//! `new`: print a plan-source template.

use lotsman::{Error, InputError, Outcome, template, template_kinds};

use crate::cli::new::NewArgs;
use crate::out::print_out;

pub fn run(args: &NewArgs) -> Result<Outcome, Error> {
    let Some(text) = template(&args.kind) else {
        return Err(InputError::unparsable(
            "template kind",
            &args.kind,
            &format!("one of: {}", template_kinds().join(", ")),
        )
        .into());
    };
    print_out(text.as_bytes())?;
    Ok(Outcome::Ok)
}
