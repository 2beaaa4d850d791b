//! The record's tests: exposure, series and checking on small invented records.

#![allow(clippy::unwrap_used, clippy::indexing_slicing)]

use super::*;
use crate::case::Case;
use crate::case::{ChannelSpec, RulesSpec};
use crate::organ::{Metric, Organ};
use crate::target::Status;
use crate::units::{to_mmhg, PressureUnit};
use proptest::prelude::*;

/// A case with one source at heart level, so the organ-level value is
/// the reading itself, and one floor of 65 mmHg on MAP at the heart.
fn scene(method: &str) -> Scene {
    let text = format!(
        r#"{{"format": "plumbline-case", "version": 1,
            "arterial": [{{"id": "a", "method": "{method}", "level": "heart", "mean": "70 mmHg"}}],
            "readings": {{"icp": {{"value": "10 mmHg", "method": "probe", "level": "heart"}}}},
            "heights": {{"tragus": "0 cm"}},
            "targets": [{{"organ": "whole_body", "metric": "inflow", "at_least": "65 mmHg"}},
                        {{"organ": "brain", "metric": "surrounding", "at_most": "22 mmHg"}}]}}"#
    );
    Scene::from_case(&Case::from_json(&text).unwrap()).unwrap()
}

fn timeline(scene: &Scene, channel: &str, t: &[f64], v: &[f64], rules: RulesSpec) -> Timeline {
    let spec = TimelineSpec {
        rules,
        channels: vec![ChannelSpec {
            channel: channel.to_owned(),
            unit: PressureUnit::MmHg,
            t_s: t.to_vec(),
            values: v.to_vec(),
        }],
        ..TimelineSpec::default()
    };
    Timeline::from_spec(&spec, scene).unwrap()
}

fn first(e: &Exposure) -> &TargetExposure {
    &e.targets[0]
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() < 1e-9
}

// Definitions: time and area below a threshold as reported in studies of
// intraoperative hypotension (Salmasi et al., Anesthesiology 2017);
// average depth (time-weighted) = area / observed time. Expected values by hand.

#[test]
fn a_held_step_series() {
    let s = scene("cuff");
    // 70 for 5 min, 60 for 5 min, 70 for 5 min: 5 min below 65,
    // area 5 mmHg × 5 min = 25 mmHg·min over 15 min observed.
    let tl = timeline(
        &s,
        "a.mean",
        &[0.0, 300.0, 600.0, 900.0],
        &[70.0, 60.0, 70.0, 70.0],
        RulesSpec::default(),
    );
    let e = analyze(&s, &tl, None);
    let x = first(&e);
    assert!(close(x.observed_min, 15.0), "{}", x.observed_min);
    assert!(close(x.outside_min, 5.0));
    assert!(close(x.area_mmhg_min, 25.0));
    assert!(close(x.twa_mmhg, 25.0 / 15.0));
    assert!(close(x.outside_percent, 100.0 / 3.0));
    assert!(close(x.longest_episode_min, 5.0));
    assert_eq!(x.episodes, 1);
    assert_eq!(x.worst_mmhg, Some(60.0));
    assert_eq!(x.worst_at_s, Some(300.0));
}

#[test]
fn the_headline_names_each_organ_that_missed_a_target_over_time() {
    let s = scene("cuff");
    let held = |v: &[f64]| {
        let tl = timeline(
            &s,
            "a.mean",
            &[0.0, 300.0, 600.0, 900.0],
            v,
            RulesSpec::default(),
        );
        analyze(&s, &tl, None)
    };
    // 5 of 15 min below 65 at the heart; the ICP ceiling has no samples.
    let dipped = held(&[70.0, 60.0, 70.0, 70.0]);
    assert_eq!(
        headline(&dipped.targets),
        "Over the record, a target missed: Whole body for 5.0 min of 15.0 min."
    );
    let good = held(&[70.0, 70.0, 70.0, 70.0]);
    assert_eq!(
        headline(&good.targets),
        "Over the record: no followed target missed."
    );
    let unobserved: Vec<TargetExposure> = good
        .targets
        .iter()
        .map(|t| TargetExposure {
            status: Status::NotObserved,
            ..t.clone()
        })
        .collect();
    assert_eq!(
        headline(&unobserved),
        "Over the record: no followed target observed."
    );
}

#[test]
fn a_ramp_crossing_the_threshold() {
    let s = scene("transducer");
    // 75 → 55 over 60 s crosses 65 at 30 s: 30 s below, a triangle of
    // 30 s × 10 mmHg / 2 = 150 mmHg·s = 2.5 mmHg·min.
    let tl = timeline(
        &s,
        "a.mean",
        &[0.0, 60.0],
        &[75.0, 55.0],
        RulesSpec::default(),
    );
    let x = analyze(&s, &tl, None).targets[0].clone();
    assert!(close(x.outside_min, 0.5));
    assert!(close(x.area_mmhg_min, 2.5));
    assert!(close(x.observed_min, 1.0));
    assert_eq!(x.worst_mmhg, Some(55.0));
}

#[test]
fn a_gap_longer_than_the_limit_is_unobserved() {
    let s = scene("transducer");
    // Samples at 0, 10 and 200 s: the 190 s gap exceeds 60 s, so only
    // the first 10 s are observed, all 5 mmHg below.
    let tl = timeline(
        &s,
        "a.mean",
        &[0.0, 10.0, 200.0],
        &[60.0, 60.0, 60.0],
        RulesSpec::default(),
    );
    let x = analyze(&s, &tl, None).targets[0].clone();
    assert!(close(x.observed_min, 10.0 / 60.0));
    assert!(close(x.outside_min, 10.0 / 60.0));
    assert!(close(x.area_mmhg_min, 5.0 * 10.0 / 60.0));
    // A held cuff reading past its hold limit is unobserved too.
    let c = scene("cuff");
    let rules = RulesSpec {
        hold_max_s: Some(120.0),
        ..RulesSpec::default()
    };
    let tl = timeline(&c, "a.mean", &[0.0, 600.0], &[60.0, 60.0], rules);
    assert!(close(analyze(&c, &tl, None).targets[0].observed_min, 2.0));
}

#[test]
fn short_episodes_can_be_ignored() {
    let s = scene("cuff");
    let t = [0.0, 30.0, 60.0, 300.0, 600.0, 660.0];
    let v = [70.0, 60.0, 70.0, 60.0, 70.0, 70.0];
    let rules = RulesSpec {
        min_episode_s: Some(60.0),
        ..RulesSpec::default()
    };
    let x = analyze(&s, &timeline(&s, "a.mean", &t, &v, rules), None).targets[0].clone();
    assert_eq!((x.episodes, x.ignored_episodes), (1, 1));
    assert!(close(x.outside_min, 5.0));
}

#[test]
fn a_ceiling_counts_time_above() {
    let s = scene("transducer");
    let spec = TimelineSpec {
        channels: vec![
            ChannelSpec {
                channel: "a.mean".into(),
                unit: PressureUnit::MmHg,
                t_s: vec![0.0, 60.0],
                values: vec![70.0, 70.0],
            },
            ChannelSpec {
                channel: "icp".into(),
                unit: PressureUnit::MmHg,
                t_s: vec![0.0, 60.0],
                values: vec![20.0, 26.0],
            },
        ],
        ..TimelineSpec::default()
    };
    let tl = Timeline::from_spec(&spec, &s).unwrap();
    let e = analyze(&s, &tl, None);
    let icp = e.targets.iter().find(|t| !t.at_least).unwrap();
    // 20 → 26 crosses 22 at 20 s: 40 s above, area 40 × 4 / 2 = 80 mmHg·s.
    assert!(close(icp.outside_min, 40.0 / 60.0));
    assert!(close(icp.area_mmhg_min, 80.0 / 60.0));
    assert_eq!(icp.worst_mmhg, Some(26.0));
}

#[test]
fn a_target_never_outside_has_no_negative_zero() {
    let s = scene("transducer");
    let tl = timeline(
        &s,
        "a.mean",
        &[0.0, 60.0],
        &[80.0, 80.0],
        RulesSpec::default(),
    );
    let x = analyze(&s, &tl, None).targets[0].clone();
    for v in [
        x.outside_min,
        x.outside_percent,
        x.area_mmhg_min,
        x.twa_mmhg,
    ] {
        assert!(v == 0.0 && v.is_sign_positive(), "{v}");
    }
    assert!(!x.words.contains("-0"), "{}", x.words);
}

#[test]
fn unknown_channels_and_bad_samples_are_named() {
    let s = scene("cuff");
    let spec = TimelineSpec {
        channels: vec![ChannelSpec {
            channel: "b.mean".into(),
            unit: PressureUnit::MmHg,
            t_s: vec![0.0],
            values: vec![70.0],
        }],
        ..TimelineSpec::default()
    };
    let errors = Timeline::from_spec(&spec, &s).unwrap_err();
    assert_eq!(
        errors.first().unwrap().field(),
        "timeline.channels[0].channel"
    );
    let spec = TimelineSpec {
        channels: vec![ChannelSpec {
            channel: "a.mean".into(),
            unit: PressureUnit::MmHg,
            t_s: vec![0.0, 0.0],
            values: vec![70.0, 900.0],
        }],
        ..TimelineSpec::default()
    };
    let fields: Vec<String> = Timeline::from_spec(&spec, &s)
        .unwrap_err()
        .iter()
        .map(|e| e.field().to_owned())
        .collect();
    assert!(fields.contains(&"timeline.channels[0].t_s[1]".to_owned()));
    assert!(fields.contains(&"timeline.channels[0].values[1]".to_owned()));
}

#[test]
fn systolic_and_diastolic_give_an_estimated_mean() {
    let s = scene("cuff");
    let spec = TimelineSpec {
        channels: ["a.systolic", "a.diastolic"]
            .iter()
            .zip([[120.0, 90.0], [60.0, 45.0]])
            .map(|(name, v)| ChannelSpec {
                channel: (*name).into(),
                unit: PressureUnit::MmHg,
                t_s: vec![0.0, 300.0],
                values: v.to_vec(),
            })
            .collect(),
        ..TimelineSpec::default()
    };
    let tl = Timeline::from_spec(&spec, &s).unwrap();
    let mean = tl.channels.iter().find(|c| c.estimated).unwrap();
    // One-third rule: 60 + 60/3 = 80; 45 + 45/3 = 60.
    assert!(close(to_mmhg(mean.values[0]), 80.0));
    assert!(close(to_mmhg(mean.values[1]), 60.0));
    assert!(tl
        .to_spec()
        .channels
        .iter()
        .all(|c| !c.channel.ends_with("mean")));
}

#[test]
fn series_csv_has_a_row_per_event_and_blank_gaps() {
    let s = scene("transducer");
    let tl = timeline(
        &s,
        "a.mean",
        &[0.0, 10.0, 200.0],
        &[60.0, 62.0, 64.0],
        RulesSpec::default(),
    );
    let csv = series_csv(&s, &tl);
    let lines: Vec<&str> = csv.lines().collect();
    assert_eq!(lines[0], "elapsed_s,whole_body.inflow [mmHg]");
    assert_eq!(lines[1], "0,60.00");
    assert_eq!(lines[2], "10,");
    assert_eq!(lines[3], "200,");
}

#[test]
fn series_keeps_steps_and_gaps() {
    // A held cuff: 70 then 60 from 300 s, held at most 600 s, then a
    // sample at 1500 s after an unobserved stretch.
    let s = scene("cuff");
    let tl = timeline(
        &s,
        "a.mean",
        &[0.0, 300.0, 1500.0, 1560.0],
        &[70.0, 60.0, 65.0, 66.0],
        RulesSpec::default(),
    );
    let series = series(&s, &tl);
    assert_eq!(series.len(), 1);
    let map = &series[0];
    assert_eq!((map.organ, map.metric), (Organ::WholeBody, Metric::Inflow));
    assert_eq!(map.runs.len(), 2, "{:?}", map.runs);
    // 600 s is an event too: the first reading's hold ends there.
    assert_eq!(map.runs[0].t_s, vec![0.0, 300.0, 300.0, 600.0, 900.0]);
    assert_eq!(map.runs[0].mmhg, vec![70.0, 70.0, 60.0, 60.0, 60.0]);
    // The record ends at the last sample: its value holds no time, but it
    // is the value at the end, for drawing.
    assert_eq!(map.runs[1].t_s, vec![1500.0, 1560.0]);
    assert_eq!(map.runs[1].mmhg, vec![65.0, 65.0]);
    assert_eq!(map.end_mmhg, Some(66.0));
}

#[test]
fn series_gives_the_values_of_series_csv() {
    let s = scene("transducer");
    let t = [0.0, 10.0, 20.0, 200.0, 230.0];
    let v = [60.0, 62.0, 61.0, 64.0, 70.0];
    let tl = timeline(&s, "a.mean", &t, &v, RulesSpec::default());
    let csv = series_csv(&s, &tl);
    let rows: Vec<(f64, Option<f64>)> = csv
        .lines()
        .skip(1)
        .map(|l| {
            let (t, v) = l.split_once(',').unwrap();
            (t.parse().unwrap(), v.parse().ok())
        })
        .collect();
    let runs = &series(&s, &tl)[0].runs;
    // Every observed row's value is a point of a run at that time.
    for (t, v) in rows.iter().filter_map(|(t, v)| Some((*t, (*v)?))) {
        let found = runs.iter().any(|r| {
            r.t_s
                .iter()
                .zip(&r.mmhg)
                .any(|(rt, rv)| *rt == t && (rv - v).abs() < 0.005)
        });
        assert!(found, "{t} {v} in {runs:?}");
    }
    // The 180 s gap splits the line in two.
    assert_eq!(runs.len(), 2);
    assert_eq!(runs[1].t_s, vec![200.0, 230.0]);
}

fn arbitrary_series() -> impl Strategy<Value = (Vec<f64>, Vec<f64>)> {
    prop::collection::vec((1.0..120.0f64, 40.0..110.0f64), 1..40).prop_map(|steps| {
        let mut t = 0.0;
        let mut times = Vec::new();
        let mut values = Vec::new();
        for (dt, v) in steps {
            times.push(t);
            values.push(v);
            t += dt;
        }
        (times, values)
    })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    #[test]
    fn time_outside_never_exceeds_observed_time(
        (t, v) in arbitrary_series(), held in any::<bool>()
    ) {
        let s = scene(if held { "cuff" } else { "transducer" });
        let x = analyze(&s, &timeline(&s, "a.mean", &t, &v, RulesSpec::default()), None);
        let x = &x.targets[0];
        prop_assert!(x.outside_min <= x.observed_min + 1e-9);
        prop_assert!(x.outside_percent <= 100.0 + 1e-9);
        prop_assert!(x.area_mmhg_min >= 0.0);
    }

    #[test]
    fn raising_every_arterial_reading_never_adds_exposure(
        (t, v) in arbitrary_series(), lift in 0.0..30.0f64, held in any::<bool>()
    ) {
        let s = scene(if held { "cuff" } else { "transducer" });
        let raised: Vec<f64> = v.iter().map(|x| (x + lift).min(250.0)).collect();
        let low = analyze(&s, &timeline(&s, "a.mean", &t, &v, RulesSpec::default()), None);
        let high = analyze(&s, &timeline(&s, "a.mean", &t, &raised, RulesSpec::default()), None);
        prop_assert!(high.targets[0].outside_min <= low.targets[0].outside_min + 1e-9);
        prop_assert!(high.targets[0].area_mmhg_min <= low.targets[0].area_mmhg_min + 1e-9);
    }

    #[test]
    fn splitting_a_record_and_summing_the_parts_gives_the_whole(
        (t, v) in arbitrary_series(), cut in 0.0..1.0f64, held in any::<bool>()
    ) {
        let s = scene(if held { "cuff" } else { "transducer" });
        let tl = timeline(&s, "a.mean", &t, &v, RulesSpec::default());
        let (a, b) = tl.span().unwrap();
        let m = a + (b - a) * cut;
        let whole = analyze(&s, &tl, None);
        let left = analyze(&s, &tl, Some((a, m)));
        let right = analyze(&s, &tl, Some((m, b)));
        let sum = |f: fn(&TargetExposure) -> f64| f(&left.targets[0]) + f(&right.targets[0]);
        prop_assert!((sum(|x| x.observed_min) - whole.targets[0].observed_min).abs() < 1e-6);
        prop_assert!((sum(|x| x.outside_min) - whole.targets[0].outside_min).abs() < 1e-6);
        prop_assert!((sum(|x| x.area_mmhg_min) - whole.targets[0].area_mmhg_min).abs() < 1e-6);
    }
}
