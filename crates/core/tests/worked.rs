//! Worked examples: the nine of REFERENCES.md §7 and a few of our own, each
//! derived by hand from the formulas and constants, with the arithmetic
//! beside the check, and run as whole cases through `check::check_json`.

use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::reading::{Component, Quantity};
use plumbline_core::target::Status;
use plumbline_core::units::{PressureEntry, PressureUnit};
use serde_json::json;

use crate::util::{above_heart, check, line, metric, reading, run, target, value};

#[test]
fn example_1_unit_conversions() {
    // 10 cmH2O = 10 × 98.0665 / 133.322387415 = 7.356 mmHg (D).
    let ten = PressureEntry::new(10.0, PressureUnit::CmH2O).convert_to(PressureUnit::MmHg);
    check("10 cmH2O in mmHg", ten.amount, 7.356, 5e-4);
    // 20 mmHg = 20 × 133.322387415 / 98.0665 = 27.19 cmH2O (D).
    let twenty = PressureEntry::mmhg(20.0).convert_to(PressureUnit::CmH2O);
    check("20 mmHg in cmH2O", twenty.amount, 27.19, 5e-3);
    // 1 kPa = 1000 / 133.322387415 = 7.5006 mmHg (D).
    let kpa = PressureEntry::new(1.0, PressureUnit::KPa).convert_to(PressureUnit::MmHg);
    check("1 kPa in mmHg", kpa.amount, 7.5006, 5e-5);
    // The same through a case: an ICP of 10 cmH2O on a drain scale.
    let report = run(json!({
        "heights": { "tragus": "12 cm" },
        "readings": { "icp": reading("10 cmH2O", "drain_scale", json!("tragus")) },
    }));
    check(
        "ICP 10 cmH2O in the report",
        value(&report, Organ::Brain, Metric::Surrounding),
        7.356,
        5e-4,
    );
}

#[test]
fn example_2_blood_column_to_the_ear() {
    // Blood 1050 kg/m³, 20 cm: 1050 × 9.80665 × 0.20 / 133.322387415 = 15.447
    // mmHg. Arm MAP 75 with the arm at heart level, tragus 20 cm higher:
    // 75 − 15.447 = 59.553, "59.6" (D).
    let report = run(json!({
        "densities": { "blood": "1050 kg/m3" },
        "heights": { "tragus": "20 cm", "upper_arm_left": "0 cm" },
        "arterial": [{ "id": "arm cuff", "method": "cuff", "level": "upper_arm_left", "mean": "75 mmHg" }],
    }));
    let inflow = value(&report, Organ::Brain, Metric::Inflow);
    check("MAP at the ear", inflow, 59.6, 0.05);
    check("column of 20 cm", 75.0 - inflow, 15.45, 5e-3);
}

#[test]
fn example_3_mean_from_120_over_80() {
    // One-third rule: 80 + 40/3 = 93.33; form factor: 80 + 0.412 × 40 = 96.48.
    // (The offset variant, 98.33, is not a rule of the core.)
    for (rule, expected) in [("one_third", 93.33), ("form_factor_0412", 96.48)] {
        let report = run(json!({
            "mean_rule": rule,
            "arterial": [{ "id": "line", "method": "transducer", "level": "heart",
                           "systolic": "120 mmHg", "diastolic": "80 mmHg" }],
        }));
        check(
            rule,
            value(&report, Organ::WholeBody, Metric::Inflow),
            expected,
            5e-3,
        );
    }
}

#[test]
fn example_4_cpp_with_and_without_venous_outflow() {
    // MAP at the tragus 80, ICP 15: CPP 65. With the venous pressure at the
    // head 20, it wins the waterfall: CPP 80 − 20 = 60.
    let brain = |readings: serde_json::Value| {
        run(json!({
            "heights": { "tragus": "25 cm" },
            "arterial": [line("line at the ear", json!("tragus"), "80 mmHg")],
            "readings": readings,
        }))
    };
    let icp_only = brain(json!({ "icp": reading("15 mmHg", "probe", json!("tragus")) }));
    let cpp = metric(&icp_only, Organ::Brain, Metric::Perfusion);
    check("CPP = 80 − 15", cpp.value_mmhg, 65.0, 1e-9);
    assert_eq!(cpp.outflow.as_ref().map(|o| o.winner), Some(Quantity::Icp));
    let with_venous = brain(json!({
        "icp": reading("15 mmHg", "probe", json!("tragus")),
        "cvp": reading("20 mmHg", "transducer", json!("tragus")),
    }));
    let cpp = metric(&with_venous, Organ::Brain, Metric::Perfusion);
    check("CPP = 80 − max(15, 20)", cpp.value_mmhg, 60.0, 1e-9);
    assert_eq!(cpp.outflow.as_ref().map(|o| o.winner), Some(Quantity::Cvp));
}

#[test]
fn example_5_abdominal_perfusion() {
    // MAP 75, IAP 18, supine (iliac crest at heart level): APP 75 − 18 = 57,
    // below 60; filtration gradient 75 − 2 × 18 = 39; IAP 18 is grade II.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [line("line", json!("heart"), "75 mmHg")],
        "readings": { "iap": reading("18 mmHg", "transducer", json!("iliac_crest")) },
    }));
    let app = metric(&report, Organ::Abdomen, Metric::Perfusion);
    check("APP", app.value_mmhg, 57.0, 1e-9);
    let t = target(app, "at least 60");
    assert_eq!(t.status, Status::Below);
    check("APP margin", t.margin_mmhg.expect("margin"), -3.0, 1e-9);
    check(
        "FG",
        value(&report, Organ::Abdomen, Metric::FiltrationGradient),
        39.0,
        1e-9,
    );
    let iap = metric(&report, Organ::Abdomen, Metric::Surrounding);
    assert_eq!(iap.grade.as_ref().map(|g| g.grade), Some(2));
}

#[test]
fn example_6_coronary_perfusion_in_cpr() {
    // Aortic relaxation 30, right atrium 12: 30 − 12 = 18, at least 15.
    // To reach 15 exactly the aortic relaxation pressure would be 27.
    let report = run(json!({
        "readings": {
            "cpr_aortic_relaxation": reading("30 mmHg", "transducer", json!("heart")),
            "cpr_right_atrial_relaxation": reading("12 mmHg", "transducer", json!("heart")),
        },
    }));
    let m = metric(&report, Organ::HeartCpr, Metric::Perfusion);
    check("CPR coronary perfusion", m.value_mmhg, 18.0, 1e-9);
    let t = target(m, "at least 15");
    assert_eq!(t.status, Status::Met);
    let needed = t.defend.first().expect("a required reading");
    check("aortic relaxation needed", needed.needed_mmhg, 27.0, 1e-9);
}

#[test]
fn example_7_ocular_perfusion_population_formulas() {
    // 120/80 on the upper arm of a seated patient, IOP 15. Mean OPP =
    // 2/3 × MAP − IOP = 2/3 × 93.333 − 15 = 62.222 − 15 = 47.22; the wrong
    // form 2/3 × (MAP − IOP) would give 52.22. Diastolic OPP = 80 − 15 = 65.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "beach_chair" },
        "arterial": [{ "id": "arm cuff", "method": "cuff", "level": "upper_arm_left",
                       "systolic": "120 mmHg", "diastolic": "80 mmHg" }],
        "readings": { "iop": reading("15 mmHg", "tonometer", json!("eye_left")) },
    }));
    let mean_opp = value(&report, Organ::Eye, Metric::PopulationMean);
    check("mean OPP, 2/3 MAP − IOP", mean_opp, 47.22, 5e-3);
    assert!((mean_opp - 52.22).abs() > 4.0, "not 2/3 (MAP − IOP)");
    check(
        "diastolic OPP",
        value(&report, Organ::Eye, Metric::PopulationDiastolic),
        65.0,
        1e-9,
    );
    // Leske 2002 risk markers: 47.2 ≥ 42 and 65 ≥ 55.
    let m = metric(&report, Organ::Eye, Metric::PopulationMean);
    check(
        "margin to 42",
        target(m, "at least 42").margin_mmhg.expect("margin"),
        5.22,
        5e-3,
    );
}

#[test]
fn example_8_limb_delta_p() {
    // DBP 55 at the compartment, compartment 30: ΔP 25, below 30.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [{ "id": "line", "method": "transducer", "level": "heart",
                       "systolic": "100 mmHg", "diastolic": "55 mmHg", "mean": "70 mmHg" }],
        "readings": { "compartment": reading("30 mmHg", "needle", json!("calf_right")) },
    }));
    let m = metric(&report, Organ::Limb, Metric::Perfusion);
    check("ΔP", m.value_mmhg, 25.0, 1e-9);
    let t = target(m, "at least 30");
    assert_eq!(t.status, Status::Below);
    let needed = t.defend.first().expect("required");
    assert_eq!(needed.component, Some(Component::Diastolic));
    check("diastolic needed 55 + 5", needed.needed_mmhg, 60.0, 1e-9);
}

#[test]
fn example_9_relative_to_baseline() {
    // Baseline MAP 100 (supine, arm at heart level), now 78: (100 − 78)/100 =
    // 22% below baseline, so below the 80% floor (80) by 2; but 13 above an
    // absolute 65.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [line("line", json!("heart"), "78 mmHg")],
        "baseline": { "method": "cuff", "level": "upper_arm_left",
                      "position": { "posture": "supine" },
                      "systolic": "130 mmHg", "diastolic": "85 mmHg", "mean": "100 mmHg" },
    }));
    let m = metric(&report, Organ::WholeBody, Metric::Inflow);
    let relative = target(m, "80% of baseline");
    check(
        "80% of 100",
        relative.threshold_mmhg.expect("threshold"),
        80.0,
        1e-9,
    );
    assert_eq!(relative.status, Status::Below);
    check("margin", relative.margin_mmhg.expect("margin"), -2.0, 1e-9);
    let baseline_at_heart = relative.threshold_steps.first().expect("steps").value_mmhg;
    check(
        "22% below baseline",
        1.0 - m.value_mmhg / baseline_at_heart,
        0.22,
        1e-9,
    );
    let absolute = target(m, "at least 65");
    assert_eq!(absolute.status, Status::Met);
    check(
        "13 above 65",
        absolute.margin_mmhg.expect("margin"),
        13.0,
        1e-9,
    );
}

// ---------------------------------------------------------------------------
// Our own
// ---------------------------------------------------------------------------

#[test]
fn own_transducer_moved_up_after_zeroing() {
    // DOMAIN §2: a transducer moved 10 cm up reads lower by about 7.5 mmHg;
    // with blood 1050.6 kg/m³ it is 1050.6 × 9.80665 × 0.10 / 133.322387415 =
    // 7.728. A line reading 72.272 at +10 cm and one reading 80 at the heart
    // agree at heart level.
    let report = run(json!({
        "arterial": [
            line("moved line", json!({ "height": "10 cm" }), "72.272 mmHg"),
            line("levelled line", json!("heart"), "80 mmHg"),
        ],
    }));
    let at_heart = report.arterial[0].mean_at_heart_mmhg.expect("at heart");
    check("moved line at heart", at_heart, 80.0, 1e-3);
    check(
        "about 7.5 mmHg per 10 cm (DOMAIN, common practice)",
        at_heart - 72.272,
        7.5,
        0.3,
    );
    let cross = report.cross_checks.first().expect("a cross-check");
    assert!(cross.agree, "{}", cross.words);
    check("difference", cross.difference_mmhg, 0.0, 1e-3);
}

#[test]
fn own_ventricular_drain_in_the_sitting_position() {
    // Drain read as 16 cmH2O at the tragus: 16 × 0.7355591 = 11.769 mmHg. The
    // arterial transducer is levelled at the tragus, so CPP = 78 − 11.769 =
    // 66.231. The venous pressure at the ear is far below zero (CVP 4 at the
    // heart, some 33 cm lower), so the veins collapse and ICP sets the outflow.
    let report = run(json!({
        "patient": { "height": "168 cm" },
        "position": { "posture": "sitting" },
        "arterial": [line("line at the ear", json!("tragus"), "78 mmHg")],
        "readings": {
            "icp": reading("16 cmH2O", "drain_scale", json!("tragus")),
            "cvp": reading("4 mmHg", "transducer", json!("heart")),
        },
    }));
    let cpp = metric(&report, Organ::Brain, Metric::Perfusion);
    check("CPP", cpp.value_mmhg, 66.231, 1e-3);
    let outflow = cpp.outflow.as_ref().expect("outflow");
    assert_eq!(outflow.winner, Quantity::Icp);
    let venous = outflow
        .candidates
        .iter()
        .find(|c| c.quantity == Quantity::Cvp)
        .expect("venous candidate");
    assert!(venous.value_mmhg < 0.0, "{}", venous.value_mmhg);
    assert!(cpp.steps.iter().any(|s| s.what.contains("collapse")));
    assert!(above_heart(&report, Landmark::Tragus) > 25.0);
}

#[test]
fn own_lumbar_drain_levelled_at_the_heart() {
    // Supine, drain transducer at the heart reading 10 mmHg, cord checked at
    // L1, 5 cm behind mid-chest (so 5 cm below the heart). MAP at the cord:
    // 88 + 1050.6 × 9.80665 × 0.05 / 133.322387415 = 88 + 3.8639 = 91.8639.
    // CSF at the cord: 10 + 1006.5 × ... = 10 + 3.7017 = 13.7017. CVP 9 at the
    // cord: 12.8639, lower, so CSF wins. SCPP = 91.8639 − 13.7017 = 78.1622.
    let report = run(json!({
        "patient": { "height": "178 cm" },
        "position": { "posture": "supine" },
        "organ_levels": { "cord": "cord_lumbar" },
        "arterial": [line("line", json!("heart"), "88 mmHg")],
        "readings": {
            "csf": reading("10 mmHg", "transducer", json!("heart")),
            "cvp": reading("9 mmHg", "transducer", json!("heart")),
        },
    }));
    check(
        "cord height",
        above_heart(&report, Landmark::CordLumbar),
        -5.0,
        1e-9,
    );
    let scpp = metric(&report, Organ::Cord, Metric::Perfusion);
    check("SCPP", scpp.value_mmhg, 78.1622, 1e-3);
    assert_eq!(scpp.outflow.as_ref().map(|o| o.winner), Some(Quantity::Csf));
    // The 10 mmHg drain limit is read at the drain's own zero (Coselli et
    // al. 2002, V): 10 as read; at the cord 13.7017, shown beside.
    let csf = metric(&report, Organ::Cord, Metric::Surrounding);
    check("CSF at the drain's zero", csf.value_mmhg, 10.0, 1e-9);
    check(
        "CSF at the cord",
        csf.beside.as_ref().map_or(f64::NAN, |b| b.value_mmhg),
        13.7017,
        1e-3,
    );
    check(
        "MAP at the cord",
        value(&report, Organ::Cord, Metric::Inflow),
        91.8639,
        1e-3,
    );
}
