//! How numbers are written for people, in one place for every front end:
//! pressures in whole mmHg (the ranges show why more digits would be false
//! precision), heights in signed centimetres, ranges with an en dash. No
//! output ever reads "-0".

/// A pressure in whole mmHg: `47`, `-3`, never `-0`.
///
/// # Example
/// ```
/// use plumbline_core::text::whole_mmhg;
/// assert_eq!(whole_mmhg(46.6), "47");
/// assert_eq!(whole_mmhg(-0.4), "0");
/// ```
pub fn whole_mmhg(value_mmhg: f64) -> String {
    whole(value_mmhg)
}

/// A value rounded half away from zero to a whole number, without a
/// negative zero.
pub fn whole(value: f64) -> String {
    format!("{:.0}", value.round() + 0.0)
}

/// A plausible range of pressures: `41–53`.
pub fn mmhg_range(lower_mmhg: f64, upper_mmhg: f64) -> String {
    format!("{}–{}", whole(lower_mmhg), whole(upper_mmhg))
}

/// A value with its range: `47 mmHg (41–53)`.
pub fn mmhg_with_range(value_mmhg: f64, lower_mmhg: f64, upper_mmhg: f64) -> String {
    format!(
        "{} mmHg ({})",
        whole(value_mmhg),
        mmhg_range(lower_mmhg, upper_mmhg)
    )
}

/// A height in cm with its sign and one decimal: `+32.1`, `+0.0`.
pub fn signed_cm(value_cm: f64) -> String {
    format!("{:+.1}", (value_cm * 10.0).round() / 10.0 + 0.0)
}

/// A height in whole cm with its sign, for labels in a picture: `+32`.
pub fn signed_whole_cm(value_cm: f64) -> String {
    format!("{:+.0}", value_cm.round() + 0.0)
}

/// A gap in whole mmHg that is never called "0": a value just outside a
/// bound is still outside it.
pub fn shortfall_mmhg(value_mmhg: f64) -> String {
    if value_mmhg.abs() < 0.5 {
        "less than 1".to_owned()
    } else {
        whole(value_mmhg.abs())
    }
}

/// Minutes with one decimal: `12.5 min`.
pub fn minutes(value_min: f64) -> String {
    format!("{:.1} min", value_min + 0.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_read_the_same_everywhere() {
        assert_eq!(whole_mmhg(39.244), "39");
        assert_eq!(whole_mmhg(94.5), "95");
        assert_eq!(whole_mmhg(-0.4), "0");
        assert_eq!(whole_mmhg(-2.5), "-3");
        assert_eq!(signed_cm(32.11), "+32.1");
        assert_eq!(signed_cm(-0.01), "+0.0");
        assert_eq!(signed_whole_cm(-0.2), "+0");
        assert_eq!(mmhg_with_range(46.6, 40.9, 53.2), "47 mmHg (41–53)");
        assert_eq!(minutes(-0.0), "0.0 min");
    }

    #[test]
    fn a_shortfall_under_half_a_mmhg_is_not_called_zero() {
        assert_eq!(shortfall_mmhg(-0.3), "less than 1");
        assert_eq!(shortfall_mmhg(-0.6), "1");
        assert_eq!(shortfall_mmhg(-12.4), "12");
    }
}
