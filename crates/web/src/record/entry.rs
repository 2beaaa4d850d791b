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
use plumbline_core::reading::Component;
use plumbline_core::record::{arterial_channel, case_readings, elapsed_words};
use plumbline_core::units::{PressureEntry, PressureUnit};
use plumbline_core::usual::BloodPressure;

use crate::fields::number_text;

/// The three components of a blood pressure, in the order it is written.
const PARTS: [Component; 3] = [Component::Systolic, Component::Diastolic, Component::Mean];

/// A blood pressure as samples of a source's channels: channel name and
/// value, each in the channel's own unit when the record has it.
pub fn bp_readings(
    spec: &TimelineSpec,
    id: &str,
    bp: &BloodPressure,
) -> Vec<(String, PressureEntry)> {
    let values = [Some(bp.systolic), Some(bp.diastolic), bp.mean];
    PARTS
        .iter()
        .zip(values)
        .filter_map(|(c, v)| {
            let name = arterial_channel(id, *c);
            let v = v?;
            let unit = spec
                .channels
                .iter()
                .find(|ch| ch.channel == name)
                .map_or(v.unit, |ch| ch.unit);
            Some((name, in_unit(v, unit)))
        })
        .collect()
}

/// `v` in `unit`, untouched when it is already in it (a conversion through
/// pascals would write 63 as 62.99999999999999).
fn in_unit(v: PressureEntry, unit: PressureUnit) -> PressureEntry {
    if v.unit == unit {
        v
    } else {
        v.convert_to(unit)
    }
}

/// Whether a blood pressure fits the source's readings already in the
/// record at other times than `t_s`: all with the device's mean, or all
/// without (the core then estimates every mean alike). A record mixing the
/// two would follow the mean only where it was typed.
///
/// # Errors
/// What to type instead, in words.
pub fn fits(spec: &TimelineSpec, id: &str, t_s: f64, bp: &BloodPressure) -> Result<(), String> {
    let times = |c: Component| {
        let name = arterial_channel(id, c);
        spec.channels
            .iter()
            .find(|ch| ch.channel == name)
            .map_or(0, |ch| ch.t_s.iter().filter(|t| **t != t_s).count())
    };
    let (others, means) = (times(Component::Systolic), times(Component::Mean));
    match (others > 0, means > 0, bp.mean.is_some()) {
        (true, true, false) => Err(format!(
            "the record keeps {id}'s own mean with each reading: type it as systolic/diastolic \
             (mean), e.g. 100/60 (74)"
        )),
        (true, false, true) => Err(format!(
            "the record has {id}'s readings without the device's mean, and estimates each mean \
             from systolic and diastolic: type systolic/diastolic only, e.g. 100/60"
        )),
        _ => Ok(()),
    }
}

/// One time of a source's readings in the record, as the list under the
/// chart shows it.
#[derive(Clone, Debug, PartialEq)]
pub struct ReadingRow {
    /// Seconds from the start.
    pub t_s: f64,
    /// The reading as one text: `104/58 (74)`, or the parts there are.
    pub text: String,
}

/// The latest `last` times at which `id`'s channels have samples, each with
/// its values written as one text (numbers as recorded, never recomputed),
/// and how many times there are in all. Only the rows shown are written,
/// so an eight-hour monitor record costs a merge, not 28,800 texts.
pub fn reading_rows(spec: &TimelineSpec, id: &str, last: usize) -> (usize, Vec<ReadingRow>) {
    let channels: Vec<Option<&ChannelSpec>> = PARTS
        .iter()
        .map(|c| {
            let name = arterial_channel(id, *c);
            spec.channels.iter().find(|ch| ch.channel == name)
        })
        .collect();
    let mut times: Vec<f64> = channels
        .iter()
        .flatten()
        .flat_map(|c| c.t_s.iter().copied())
        .collect();
    times.sort_by(f64::total_cmp);
    times.dedup();
    let total = times.len();
    let at = |c: Option<&ChannelSpec>, t: f64| {
        let c = c?;
        let k = c.t_s.partition_point(|x| *x < t);
        (c.t_s.get(k) == Some(&t)).then_some(())?;
        let v = number_text(*c.values.get(k)?);
        Some(match c.unit {
            PressureUnit::MmHg => v,
            u => format!("{v} {}", u.symbol()),
        })
    };
    let rows = times
        .iter()
        .skip(total.saturating_sub(last))
        .map(|&t| {
            let get = |i: usize| at(channels.get(i).copied().flatten(), t);
            let text = match (get(0), get(1), get(2)) {
                (Some(s), Some(d), Some(m)) => format!("{s}/{d} ({m})"),
                (Some(s), Some(d), None) => format!("{s}/{d}"),
                (s, d, m) => [("sys", s), ("dia", d), ("mean", m)]
                    .into_iter()
                    .filter_map(|(k, v)| Some(format!("{k} {}", v?)))
                    .collect::<Vec<_>>()
                    .join(", "),
            };
            ReadingRow { t_s: t, text }
        })
        .collect();
    (total, rows)
}

/// Replaces `id`'s readings at `t_s` with `bp` (a part it lacks is taken
/// out), or removes them all for `None`; a channel left empty goes.
pub fn set_reading(spec: &mut TimelineSpec, id: &str, t_s: f64, bp: Option<&BloodPressure>) {
    let values = bp.map_or([None; 3], |b| [Some(b.systolic), Some(b.diastolic), b.mean]);
    for (c, v) in PARTS.iter().zip(values) {
        let name = arterial_channel(id, *c);
        let k = spec.channels.iter().position(|ch| ch.channel == name);
        let k = match (k, v) {
            (Some(k), _) => k,
            (None, Some(v)) => {
                spec.channels.push(ChannelSpec {
                    channel: name,
                    unit: v.unit,
                    t_s: Vec::new(),
                    values: Vec::new(),
                });
                spec.channels.len() - 1
            }
            (None, None) => continue,
        };
        if let Some(ch) = spec.channels.get_mut(k) {
            let at = ch.t_s.partition_point(|t| *t < t_s);
            let here = ch.t_s.get(at) == Some(&t_s);
            match (v, here) {
                (Some(v), true) => {
                    if let Some(x) = ch.values.get_mut(at) {
                        *x = in_unit(v, ch.unit).amount;
                    }
                }
                (Some(v), false) => {
                    ch.t_s.insert(at, t_s);
                    ch.values
                        .insert(at.min(ch.values.len()), in_unit(v, ch.unit).amount);
                }
                (None, true) => {
                    ch.t_s.remove(at);
                    if at < ch.values.len() {
                        ch.values.remove(at);
                    }
                }
                (None, false) => {}
            }
        }
    }
    spec.channels.retain(|ch| !ch.t_s.is_empty());
}

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
    fn a_sources_readings_list_edit_and_go_by_time() {
        use plumbline_core::usual::read_blood_pressure;
        let bp = |t: &str| read_blood_pressure(t, PressureUnit::MmHg).unwrap();
        let mut spec = TimelineSpec::default();
        let first = bp_readings(&spec, "L arm cuff", &bp("100/60"));
        add_sample(&mut spec, 0.0, &first).unwrap();
        // A record of readings without the mean takes no mean later, and
        // the other way round, except in place of its only reading.
        let with_mean = bp("95/55 (68)");
        let refused = fits(&spec, "L arm cuff", 600.0, &with_mean).unwrap_err();
        assert!(refused.contains("estimates"), "{refused}");
        assert!(fits(&spec, "L arm cuff", 0.0, &with_mean).is_ok());
        assert!(fits(&spec, "L arm cuff", 600.0, &bp("95/55")).is_ok());
        assert!(fits(&spec, "other", 600.0, &with_mean).is_ok());
        let second = bp_readings(&spec, "L arm cuff", &bp("90/50 (63)"));
        add_sample(&mut spec, 300.0, &second).unwrap();
        let (total, rows) = reading_rows(&spec, "L arm cuff", 24);
        assert_eq!(total, 2);
        assert_eq!(reading_rows(&spec, "L arm cuff", 1).1.len(), 1);
        assert_eq!(
            rows,
            vec![
                ReadingRow {
                    t_s: 0.0,
                    text: "100/60".into()
                },
                ReadingRow {
                    t_s: 300.0,
                    text: "90/50 (63)".into()
                },
            ]
        );
        set_reading(&mut spec, "L arm cuff", 0.0, Some(&bp("110/70 (83)")));
        assert_eq!(
            reading_rows(&spec, "L arm cuff", 24).1[0].text,
            "110/70 (83)"
        );
        set_reading(&mut spec, "L arm cuff", 300.0, Some(&bp("95/55")));
        assert_eq!(reading_rows(&spec, "L arm cuff", 24).1[1].text, "95/55");
        set_reading(&mut spec, "L arm cuff", 0.0, None);
        let (total, _) = reading_rows(&spec, "L arm cuff", 24);
        assert_eq!(total, 1);
        assert_eq!(spec.channels.len(), 2, "the mean channel, now empty, goes");
        assert_eq!(reading_rows(&spec, "other", 24), (0, Vec::new()));
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
