//! Entries made on screen: the readings of the last good check as one
//! sample at a new time ("same as last, new time"), and the position on
//! screen as a change at a time.
//!
//! A sample keeps the record's shape: once a record has channels, a sample
//! adds to those channels only, in each channel's own unit (converted by
//! the core), so a cuff recorded as systolic and diastolic keeps its
//! estimated mean and a reading the record never had does not appear with
//! one sample. A record started on screen takes every reading on screen.
//! Entries go in time order; a second sample at the same time is refused.

use plumbline_core::case::{Case, ChannelSpec, PositionChangeSpec, TimelineSpec};
use plumbline_core::geometry::PositionSpec;
use plumbline_core::record::{case_readings, elapsed_words};
use plumbline_core::units::PressureEntry;

/// The readings of `case` one sample adds to `spec`: channel name and value.
pub fn readings(case: &Case, spec: &TimelineSpec) -> Vec<(String, PressureEntry)> {
    let all = case_readings(case);
    if spec.channels.is_empty() {
        return all;
    }
    all.into_iter()
        .filter_map(|(name, v)| {
            let channel = spec.channels.iter().find(|c| c.channel == name)?;
            Some((name, v.convert_to(channel.unit)))
        })
        .collect()
}

/// Adds one sample of each reading at `t_s`.
///
/// # Errors
/// Nothing to add, or a channel that already has a sample at that time;
/// the record is then unchanged.
pub fn add_sample(
    spec: &mut TimelineSpec,
    t_s: f64,
    readings: &[(String, PressureEntry)],
) -> Result<(), String> {
    if readings.is_empty() {
        return Err(if spec.channels.is_empty() {
            "nothing to add: the check on screen has no readings".to_owned()
        } else {
            "nothing to add: the check on screen has no value for any of the record's channels"
                .to_owned()
        });
    }
    for (name, _) in readings {
        let taken = spec
            .channels
            .iter()
            .any(|c| c.channel == *name && c.t_s.contains(&t_s));
        if taken {
            return Err(format!(
                "the record already has a {name} sample at {}; choose another time",
                elapsed_words(t_s)
            ));
        }
    }
    for (name, value) in readings {
        let k = match spec.channels.iter().position(|c| c.channel == *name) {
            Some(k) => k,
            None => {
                spec.channels.push(ChannelSpec {
                    channel: name.clone(),
                    unit: value.unit,
                    t_s: Vec::new(),
                    values: Vec::new(),
                });
                spec.channels.len() - 1
            }
        };
        if let Some(c) = spec.channels.get_mut(k) {
            let at = c.t_s.partition_point(|t| *t < t_s);
            c.t_s.insert(at, t_s);
            c.values.insert(at.min(c.values.len()), value.amount);
        }
    }
    Ok(())
}

/// Adds a position change at `at_s`.
///
/// # Errors
/// A change at the start (the start's position is set apart) or at the
/// time of another change; the record is then unchanged.
pub fn add_change(
    spec: &mut TimelineSpec,
    at_s: f64,
    position: PositionSpec,
) -> Result<(), String> {
    if at_s <= 0.0 {
        return Err(
            "a change comes after the start; to change the position the record \
             starts in, use \"Start in the position on screen\""
                .to_owned(),
        );
    }
    if spec.positions.iter().any(|p| p.at_s == at_s) {
        return Err(format!(
            "the record already has a position change at {}",
            elapsed_words(at_s)
        ));
    }
    let at = spec.positions.partition_point(|p| p.at_s < at_s);
    spec.positions
        .insert(at, PositionChangeSpec { at_s, position });
    Ok(())
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used, clippy::indexing_slicing)]
    use super::*;
    use plumbline_core::demo::CASE_JSON;
    use plumbline_core::geometry::Posture;
    use plumbline_core::units::PressureUnit;

    fn demo() -> Case {
        Case::from_json(CASE_JSON).unwrap()
    }

    fn names(list: &[(String, PressureEntry)]) -> Vec<&str> {
        list.iter().map(|(n, _)| n.as_str()).collect()
    }

    #[test]
    fn a_record_started_on_screen_takes_every_reading() {
        let list = readings(&demo(), &TimelineSpec::default());
        assert_eq!(
            names(&list),
            vec![
                "radial line.systolic",
                "radial line.diastolic",
                "radial line.mean",
                "left arm cuff.systolic",
                "left arm cuff.diastolic",
                "left arm cuff.mean"
            ]
        );
    }

    #[test]
    fn a_sample_keeps_the_records_channels_and_units() {
        let spec = TimelineSpec {
            channels: vec![
                ChannelSpec {
                    channel: "radial line.mean".into(),
                    unit: PressureUnit::KPa,
                    t_s: vec![0.0],
                    values: vec![9.9],
                },
                ChannelSpec {
                    channel: "left arm cuff.systolic".into(),
                    unit: PressureUnit::MmHg,
                    t_s: vec![0.0],
                    values: vec![110.0],
                },
            ],
            ..TimelineSpec::default()
        };
        let list = readings(&demo(), &spec);
        assert_eq!(
            names(&list),
            vec!["radial line.mean", "left arm cuff.systolic"]
        );
        let mean = list[0].1;
        assert_eq!(mean.unit, PressureUnit::KPa);
        assert!((mean.convert_to(PressureUnit::MmHg).amount - 74.0).abs() < 1e-9);
    }

    #[test]
    fn samples_go_in_time_order_and_never_twice_at_one_time() {
        let mut spec = TimelineSpec::default();
        let list = readings(&demo(), &spec);
        add_sample(&mut spec, 600.0, &list).unwrap();
        add_sample(&mut spec, 0.0, &list).unwrap();
        assert_eq!(spec.channels.len(), 6);
        assert_eq!(spec.channels[2].t_s, vec![0.0, 600.0]);
        assert_eq!(spec.channels[2].values, vec![74.0, 74.0]);
        let before = spec.clone();
        let e = add_sample(&mut spec, 600.0, &list).unwrap_err();
        assert!(e.contains("0:10:00"), "{e}");
        assert_eq!(spec, before, "a refused sample changes nothing");
        assert!(add_sample(&mut spec, 900.0, &[])
            .unwrap_err()
            .contains("nothing to add"));
    }

    #[test]
    fn position_changes_come_after_the_start_in_order() {
        let mut spec = TimelineSpec::default();
        let supine = PositionSpec::new(Posture::Supine);
        let prone = PositionSpec::new(Posture::Prone);
        add_change(&mut spec, 1200.0, prone.clone()).unwrap();
        add_change(&mut spec, 600.0, supine.clone()).unwrap();
        let at: Vec<f64> = spec.positions.iter().map(|p| p.at_s).collect();
        assert_eq!(at, vec![600.0, 1200.0]);
        assert_eq!(spec.positions[0].position, supine);
        assert!(add_change(&mut spec, 600.0, prone.clone()).is_err());
        assert!(add_change(&mut spec, 0.0, prone)
            .unwrap_err()
            .contains("after the start"));
        assert_eq!(spec.positions.len(), 2);
    }
}
