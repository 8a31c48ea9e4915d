//! The numbers along a chart's axes: nice tick steps, nice axis ends, and
//! tick labels with as many decimals as the step needs.

/// A "nice" tick step for a range: 1, 2 or 5 times a power of ten giving
/// four to eight intervals.
pub fn nice_step(range: f64) -> f64 {
    let raw = range / 5.0;
    let magnitude = 10f64.powf(raw.log10().floor());
    let m = raw / magnitude;
    let nice = if m < 1.5 {
        1.0
    } else if m < 3.0 {
        2.0
    } else if m < 7.0 {
        5.0
    } else {
        10.0
    };
    nice * magnitude
}

/// The nice step after `step`: 1 -> 2 -> 5 -> 10 times a power of ten.
pub fn next_step(step: f64) -> f64 {
    let magnitude = 10f64.powf(step.log10().floor());
    let m = (step / magnitude).round();
    let next = if m < 2.0 {
        2.0
    } else if m < 5.0 {
        5.0
    } else {
        10.0
    };
    next * magnitude
}

/// Rounds an axis end up to a whole number of nice steps.
pub fn nice_ceiling(v: f64) -> f64 {
    let step = nice_step(v);
    (v / step).ceil() * step
}

/// A tick label with as many decimals as the step needs; `scale` turns a
/// fraction into percent (100) or leaves it (1), `suffix` follows.
pub fn tick_label(v: f64, step: f64, scale: f64, suffix: &str) -> String {
    if v == 0.0 {
        return "0".to_string();
    }
    let decimals = (-(step * scale).log10().floor()).max(0.0) as usize;
    format!("{:.*}{suffix}", decimals, v * scale)
}

/// Quality tick labels: percent, or plain numbers per unit.
pub fn quality_tick(per_unit: bool) -> impl Fn(f64, f64) -> String {
    let (scale, suffix) = if per_unit { (1.0, "") } else { (100.0, "%") };
    move |v: f64, step: f64| tick_label(v, step, scale, suffix)
}

/// Tick labels of plain numbers: counts and probabilities.
pub fn plain_tick(v: f64, step: f64) -> String {
    tick_label(v, step, 1.0, "")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn steps_are_one_two_five_times_a_power_of_ten() {
        assert_eq!(nice_step(1.0), 0.2);
        assert_eq!(nice_step(0.08), 0.02);
        assert_eq!(nice_step(300.0), 50.0);
        assert_eq!(next_step(0.2), 0.5);
        assert_eq!(next_step(5.0), 10.0);
        assert_eq!(nice_ceiling(0.137), 0.14);
    }

    #[test]
    fn tick_labels_carry_the_decimals_of_their_step() {
        assert_eq!(tick_label(0.0, 0.01, 100.0, "%"), "0");
        assert_eq!(tick_label(0.025, 0.005, 100.0, "%"), "2.5%");
        assert_eq!(quality_tick(true)(0.2, 0.1), "0.2");
        assert_eq!(plain_tick(40.0, 20.0), "40");
    }
}
