//! Clinically safe by default: the verdicts an organ gets when an input is
//! missing, the brain judged without ICP, the zero each default target
//! assumes, the per-reading spread of a cuff, and the hazards the same
//! physics names (venous pressure at the operative site, a drain's level,
//! the vertex, no body height). Each check names its source and tag.

use plumbline_core::check::check_json;
use plumbline_core::evaluate::Frame;
use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::target::{self, Status};
use serde_json::json;

use crate::util::{above_heart, case, check, column, line, metric, reading, run, target, BLOOD};

/// The beach chair of the report that opened this work: backrest 70°, a
/// 180 cm patient, a cuff on the upper arm at the side reading 100/60, no
/// ICP. The brain was shown at 47 mmHg under "Every evaluated target is
/// met".
fn beach_chair() -> serde_json::Value {
    json!({
        "patient": { "height": "180 cm" },
        "position": { "posture": "beach_chair", "backrest_deg": 70, "left_arm": "side" },
        "arterial": [{ "id": "L arm cuff", "method": "cuff", "level": "upper_arm_left",
                       "systolic": "100 mmHg", "diastolic": "60 mmHg" }],
    })
}

#[test]
fn the_beach_chair_without_icp_judges_the_brain_below_and_never_says_met() {
    let r = run(beach_chair());
    let brain = r.organs.iter().find(|o| o.organ == Organ::Brain).unwrap();
    assert_eq!(
        brain.verdict.status,
        Status::Below,
        "{}",
        brain.verdict.words
    );
    // Mean 60 + 40/3 = 73.3 at the arm, carried to the tragus about 34 cm
    // higher: about 47 mmHg, under the 70 mmHg floor (Drummond 1997, M).
    let map = metric(&r, Organ::Brain, Metric::Inflow);
    let rise = above_heart(&r, Landmark::Tragus) - above_heart(&r, Landmark::UpperArmLeft);
    check(
        "MAP at the tragus (D)",
        map.value_mmhg,
        60.0 + 40.0 / 3.0 - column(BLOOD, rise),
        1e-6,
    );
    let floor = target(map, "at least 70");
    assert_eq!(floor.status, Status::Below);
    let defend = &floor.defend[0];
    assert!(
        defend.words.starts_with("L arm cuff: mean at least"),
        "{}",
        defend.words
    );
    // Defending the cuff's mean at the needed value brings the tragus to 70.
    check(
        "needed cuff mean (D)",
        defend.needed_mmhg,
        70.0 + column(BLOOD, rise),
        1e-6,
    );
    assert_eq!(r.summary.status, Status::Below);
    assert!(
        r.summary.headline.contains("BELOW target: Brain"),
        "{}",
        r.summary.headline
    );
    assert!(!r.summary.headline.to_lowercase().contains("every"));
    let line = r
        .summary
        .organs
        .iter()
        .find(|l| l.organ == Organ::Brain)
        .unwrap();
    assert!(line
        .defend
        .as_deref()
        .is_some_and(|d| d.contains("L arm cuff")));
}

#[test]
fn an_organ_whose_targets_need_a_missing_reading_is_not_evaluated_and_says_why() {
    // The cord: MAP at cord level is computed, but SCPP and the CSF limit
    // need a CSF pressure.
    let r = run(beach_chair());
    let cord = r.organs.iter().find(|o| o.organ == Organ::Cord).unwrap();
    assert_eq!(cord.verdict.status, Status::NotEvaluated);
    assert!(
        cord.verdict.words.contains("needs CSF pressure"),
        "{}",
        cord.verdict.words
    );
    assert!(r
        .summary
        .headline
        .contains("Not evaluated: Spinal cord (needs CSF pressure)"));
}

#[test]
fn organs_of_concern_narrow_the_summary_and_a_missing_one_is_named() {
    let mut body = beach_chair();
    body["concern"] = json!(["brain", "kidney"]);
    let r = run(body);
    let organs: Vec<Organ> = r.summary.organs.iter().map(|l| l.organ).collect();
    assert_eq!(organs, vec![Organ::Brain, Organ::Kidney]);
    let kidney = &r.summary.organs[1];
    assert_eq!(kidney.status, Status::NotEvaluated);
    assert!(kidney.words.contains("CVP"), "{}", kidney.words);
}

#[test]
fn with_a_measured_icp_cpp_decides_the_brain() {
    // Joint statement (Br J Anaesth 2015, V): CPP judged with MAP at the
    // tragus. ICP 10 mmHg measured: the MAP-level floor only advises.
    let mut body = beach_chair();
    body["readings"] = json!({ "icp": reading("10 mmHg", "probe", json!("tragus")) });
    body["arterial"][0]["systolic"] = json!("150 mmHg");
    body["arterial"][0]["diastolic"] = json!("90 mmHg");
    let r = run(body);
    let brain = r.organs.iter().find(|o| o.organ == Organ::Brain).unwrap();
    let cpp = metric(&r, Organ::Brain, Metric::Perfusion);
    assert!(
        brain.verdict.words.starts_with("CPP"),
        "{}",
        brain.verdict.words
    );
    assert_eq!(brain.verdict.status, target(cpp, "at least 60").status);
}

#[test]
fn every_default_target_names_its_source_and_the_zero_it_assumes() {
    let r = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [line("line", json!("heart"), "80 mmHg")],
        "readings": {
            "icp": reading("10 mmHg", "probe", json!("tragus")),
            "csf": reading("8 mmHg", "transducer", json!("heart")),
            "cvp": reading("6 mmHg", "transducer", json!("heart")),
            "iap": reading("9 mmHg", "transducer", json!("iliac_crest")),
        },
    }));
    let mut seen = 0;
    for o in &r.organs {
        for m in &o.metrics {
            assert!(!m.zero.is_empty(), "{} {}", o.label, m.label);
            for t in &m.targets {
                assert_eq!(t.zero, m.zero);
                assert!(!t.citation.is_empty());
                seen += 1;
            }
        }
    }
    assert!(seen >= 8, "{seen}");
    let zero = |organ, metric| crate::util::metric(&r, organ, metric).zero;
    assert!(zero(Organ::Brain, Metric::Perfusion).contains("Br J Anaesth 2015"));
    assert!(zero(Organ::Abdomen, Metric::Perfusion).contains("Malbrain"));
    assert!(zero(Organ::Kidney, Metric::Perfusion).contains("BMC Nephrol 2017"));
    assert!(zero(Organ::Cord, Metric::Surrounding).contains("drain's own zero"));
}

#[test]
fn the_brain_has_own_level_targets_with_their_sources() {
    let brain: Vec<_> = target::defaults()
        .into_iter()
        .filter(|t| t.organ == Organ::Brain && t.metric == Metric::Inflow)
        .collect();
    assert_eq!(brain.len(), 2);
    // Drummond, Anesthesiology 1997 (M, from memory): lower limit of
    // autoregulation around 70 mmHg in many adults.
    assert!(brain[0].citation.contains("Drummond") && brain[0].citation.contains("from memory"));
    assert_eq!(brain[0].describe(), "MAP at brain level at least 70 mmHg");
    // APSF Newsletter 2009 (V): correct to head level, limit the fall from
    // baseline; the 20% figure is common practice (CP).
    assert!(brain[1].citation.contains("APSF") && brain[1].citation.contains("common practice"));
    assert_eq!(
        brain[1].describe(),
        "MAP at brain level at least 80% of baseline"
    );
}

#[test]
fn cpp_with_the_line_zeroed_at_the_heart_is_shown_beside_the_tragus_value() {
    // Head 30° up: the tragus about 18-20 cm above the heart. A monitor's
    // MAP − ICP with the line zeroed at the heart reads the column higher
    // than the value at the tragus (DOMAIN trap "two zero conventions").
    let r = run(json!({
        "patient": { "height": "175 cm" },
        "position": { "posture": "head_up", "backrest_deg": 30 },
        "arterial": [line("line", json!("heart"), "85 mmHg")],
        "readings": { "icp": reading("12 mmHg", "probe", json!("tragus")) },
    }));
    let cpp = metric(&r, Organ::Brain, Metric::Perfusion);
    let beside = cpp.beside.as_ref().expect("the monitor's value");
    assert_eq!(beside.frame, Frame::Convention);
    let tragus = above_heart(&r, Landmark::Tragus);
    check("monitor CPP (D)", beside.value_mmhg, 85.0 - 12.0, 1e-9);
    check(
        "CPP at the tragus (D)",
        cpp.value_mmhg,
        85.0 - column(BLOOD, tragus) - 12.0,
        1e-6,
    );
    assert!(beside
        .words
        .starts_with("a monitor's MAP − ICP with the line zeroed at the heart: 73 mmHg here"));
    assert!(beside.words.contains("above the value at the tragus"));
}

#[test]
fn one_cuff_reading_spreads_by_the_standards_bias_and_scatter() {
    // ISO 81060-2 (V): mean difference within 5 mmHg and SD within 8 mmHg;
    // one reading's root-mean-square error √(5² + 8²) = 9.43 mmHg (D).
    let r = run(json!({
        "heights": { "upper_arm_left": "0 cm" },
        "arterial": [{ "id": "cuff", "method": "cuff", "level": "upper_arm_left", "mean": "80 mmHg" }],
    }));
    check(
        "cuff accuracy (D)",
        r.arterial[0].accuracy_mmhg,
        89f64.sqrt(),
        1e-9,
    );
    let map = metric(&r, Organ::WholeBody, Metric::Inflow);
    // Only the device moves MAP at the heart when the arm is measured at the
    // heart's height (the measured height ±1 cm adds a little).
    assert!(map.upper_mmhg - map.value_mmhg >= 89f64.sqrt() - 1e-9);
    assert!(map.upper_mmhg - map.value_mmhg < 89f64.sqrt() + 1.0);
}

#[test]
fn a_diastolic_alone_is_enough_for_a_compartment_at_a_measured_height() {
    // McQueen and Court-Brown 1996 (V): ΔP = diastolic − compartment
    // pressure, below 30 suggests compartment syndrome. Diastolic 55 at the
    // heart, compartment 30 at a point 10 cm below it: 55 + column − 30.
    let r = run(json!({
        "arterial": [{ "id": "line", "method": "transducer", "level": "heart", "diastolic": "55 mmHg" }],
        "readings": { "compartment": reading("30 mmHg", "needle", json!({ "height": "-10 cm" })) },
    }));
    let dp = metric(&r, Organ::Limb, Metric::Perfusion);
    check(
        "ΔP (D)",
        dp.value_mmhg,
        55.0 + column(BLOOD, 10.0) - 30.0,
        1e-6,
    );
    assert_eq!(target(dp, "at least 30").status, Status::Met);
    let limb = r.organs.iter().find(|o| o.organ == Organ::Limb).unwrap();
    assert_eq!(limb.level, None);
    assert!(
        limb.level_label.contains("-10.0 cm"),
        "{}",
        limb.level_label
    );
}

#[test]
fn the_vertex_is_above_the_tragus_and_can_be_where_the_brain_is_checked() {
    let mut body = beach_chair();
    body["organ_levels"] = json!({ "brain": "vertex" });
    let at_vertex = run(body);
    let at_tragus = run(beach_chair());
    let v = above_heart(&at_vertex, Landmark::Vertex);
    let t = above_heart(&at_vertex, Landmark::Tragus);
    assert!(v > t + 5.0, "vertex {v} tragus {t}");
    let map_v = metric(&at_vertex, Organ::Brain, Metric::Inflow).value_mmhg;
    let map_t = metric(&at_tragus, Organ::Brain, Metric::Inflow).value_mmhg;
    check(
        "vertex below tragus by the column (D)",
        map_t - map_v,
        column(BLOOD, v - t),
        1e-6,
    );
}

#[test]
fn venous_pressure_at_a_raised_operative_site_is_named() {
    // CVP 5 mmHg at the heart, the left shoulder about 30 cm above it in the
    // beach chair: 5 − 0.77 × 30 is well below atmospheric (Mirski et al.
    // 2007, M: about 5 cmH2O of gradient can entrain air).
    let mut body = beach_chair();
    body["operative_site"] = json!("shoulder_left");
    body["readings"] = json!({ "cvp": reading("5 mmHg", "transducer", json!("heart")) });
    let r = run(body);
    let site = r.venous_site.as_ref().expect("the site");
    assert_eq!(site.site, Landmark::ShoulderLeft);
    let h = above_heart(&r, Landmark::ShoulderLeft);
    assert!(h > 15.0, "{h}");
    check(
        "venous at the site (D)",
        site.venous_mmhg.unwrap(),
        5.0 - column(BLOOD, h),
        1e-6,
    );
    assert_eq!(site.below_atmospheric, Some(true));
    check(
        "CVP for zero (D)",
        site.cvp_for_zero_mmhg,
        column(BLOOD, h),
        1e-6,
    );
    assert!(site.alarm);
    // Without a CVP the vertex of a seated patient is watched and the CVP
    // that would keep it at atmospheric is said.
    let r = run(beach_chair());
    let site = r.venous_site.as_ref().unwrap();
    assert_eq!((site.site, site.chosen), (Landmark::Vertex, false));
    assert!(site.venous_mmhg.is_none());
    assert!(site.words.contains("unless CVP exceeds"), "{}", site.words);
}

#[test]
fn a_drains_opening_pressure_moves_with_the_backrest() {
    // Common practice (CP): an open drain drains when ICP at the tragus
    // exceeds the chamber's height above it; the chamber hangs on its pole.
    let mut body = beach_chair();
    body["ventricular_drain"] = json!({ "set_at": "15 cmH2O" });
    let r = run(body);
    let d = r.drain.as_ref().unwrap();
    check("set at 15 cmH2O (D)", d.opens_above_cmh2o, 15.0, 1e-9);
    // NIST SP 811 (V2): 15 cmH2O = 15 × 98.0665 / 133.322387415 mmHg.
    check(
        "in mmHg (D)",
        d.opens_above_mmhg,
        15.0 * 98.0665 / 133.322_387_415,
        1e-9,
    );
    let at = |deg: f64| {
        d.by_backrest
            .iter()
            .find(|p| (p.backrest_deg - deg).abs() < 1e-9)
            .map(|p| p.opens_above_cmh2o)
            .unwrap()
    };
    check("at the current angle", at(70.0), 15.0, 1e-9);
    assert!(
        at(0.0) > at(70.0) + 20.0,
        "lowering the head raises the threshold"
    );
}

#[test]
fn no_body_height_gives_a_flagged_result_with_a_wider_range() {
    let mut without = beach_chair();
    without["patient"] = json!({});
    let r = run(without);
    let h = r.patient_height.as_ref().unwrap();
    assert!(h.assumed);
    check("assumed height", h.height_cm, 170.0, 1e-9);
    assert!(r
        .warnings
        .iter()
        .any(|w| w.field == "patient.height" && w.message.contains("ASSUMED")));
    let with = run(beach_chair());
    let spread = |r: &plumbline_core::report::Report| {
        let m = metric(r, Organ::Brain, Metric::Inflow);
        m.upper_mmhg - m.lower_mmhg
    };
    assert!(
        spread(&r) > spread(&with),
        "{} vs {}",
        spread(&r),
        spread(&with)
    );
    let m = metric(&r, Organ::Brain, Metric::Inflow);
    assert!(m
        .contributions
        .iter()
        .any(|c| c.input == "body height ±15 cm (ASSUMED: none was given)"));
    assert_eq!(
        r.organs
            .iter()
            .find(|o| o.organ == Organ::Brain)
            .unwrap()
            .verdict
            .status,
        Status::Below
    );
}

#[test]
fn the_blood_density_range_says_it_is_the_published_one() {
    let r = run(beach_chair());
    let m = metric(&r, Organ::Brain, Metric::Inflow);
    // Hinghofer-Szalkay and Greenleaf, J Appl Physiol 1987 (V2): 1043-1057.
    assert!(m.contributions.iter().any(|c| c.input
        == "blood density 1043-1057 kg/m³ (the published whole-blood range, \
            Hinghofer-Szalkay and Greenleaf 1987)"));
}

#[test]
fn a_transducer_source_states_its_tubing_assumption() {
    let r = run(json!({ "arterial": [line("line", json!("heart"), "80 mmHg")] }));
    let note = r.arterial[0].note.as_deref().unwrap();
    // (1050.6 − 1005) kg/m³ × g × 1 cm = 0.0335 mmHg per cm (D).
    assert!(
        note.contains(&format!("{:.3} mmHg", column(1050.6 - 1005.0, 1.0))),
        "{note}"
    );
    let cuff = check_json(&case(beach_chair())).unwrap();
    assert!(cuff.arterial[0].note.is_none());
}
