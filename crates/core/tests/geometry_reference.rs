//! Issue 3, geometry references: the body proportions, landmark heights in
//! the positions whose answer is known by hand, the mirror symmetries, the
//! seated and side-lying measurements of REFERENCES.md §5, measured heights
//! winning over estimates, and out-of-range input naming its field.
//!
//! Heights are read from the report of a whole case (`check::check_json`)
//! unless a check is about the proportion constants themselves.

use plumbline_core::geometry::proportions::{self, standing};
use plumbline_core::geometry::Segment;
use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::report::{Provenance, Report};
use serde_json::{json, Value};

use crate::util::{
    above_heart, check, check_within, column, height, line, metric, refuse, run, BLOOD,
};

/// The heights report of a body of `body_cm` in `position`.
fn placed(body_cm: f64, position: Value) -> Report {
    run(json!({ "patient": { "height": format!("{body_cm} cm") }, "position": position }))
}

// ---------------------------------------------------------------------------
// Drillis and Contini (1966) proportions, from memory
// ---------------------------------------------------------------------------

#[test]
fn standing_proportions_are_drillis_and_contini() {
    // Drillis and Contini 1966, as reproduced in biomechanics textbooks (from
    // memory, DOMAIN.md §4): heights above the floor as fractions of H.
    let rows = [
        ("eye 0.936 H (from memory)", standing::EYE, 0.936),
        ("shoulder 0.818 H (from memory)", standing::SHOULDER, 0.818),
        ("chest/nipple 0.720 H (from memory)", standing::CHEST, 0.720),
        ("elbow 0.630 H (from memory)", standing::ELBOW, 0.630),
        ("wrist 0.485 H (from memory)", standing::WRIST, 0.485),
        ("hip 0.530 H (from memory)", standing::HIP, 0.530),
        ("knee 0.285 H (from memory)", standing::KNEE, 0.285),
    ];
    // From memory: a wide tolerance, ±0.01 H (under 2 cm).
    for (what, actual, expected) in rows {
        check(what, actual, expected, 0.01);
    }
}

#[test]
fn segment_lengths_agree_with_the_quoted_segment_ratios() {
    // The same diagram also quotes segment lengths (from memory): upper arm
    // 0.186 H, forearm 0.146 H, thigh 0.245 H, leg 0.246 H, chest width
    // 0.174 H. The core derives segments from joint heights, so these are an
    // independent cross-check of the remembered numbers (wide: ±0.01 H).
    let rows = [
        (
            "upper arm 0.186 H (from memory)",
            Segment::UpperArm.fraction(),
            0.186,
        ),
        (
            "forearm 0.146 H (from memory)",
            Segment::Forearm.fraction(),
            0.146,
        ),
        (
            "thigh 0.245 H (from memory)",
            Segment::Thigh.fraction(),
            0.245,
        ),
        (
            "leg 0.246 H (from memory)",
            Segment::LowerLeg.fraction(),
            0.246,
        ),
        (
            "chest width 0.174 H (from memory)",
            standing::CHEST_WIDTH,
            0.174,
        ),
    ];
    for (what, actual, expected) in rows {
        check(what, actual, expected, 0.01);
    }
}

#[test]
fn upright_upper_body_reproduces_the_standing_proportions() {
    // Backrest at 90° on a flat seat: the trunk and head stand as when
    // standing, so each landmark sits at (its standing fraction − 0.720) × H
    // above the heart; depth offsets are horizontal and add nothing. The legs
    // lie on the seat at hip height, (0.530 − 0.720) × H. For H = 180 cm:
    let report = placed(
        180.0,
        json!({ "posture": "head_up", "backrest_deg": 90, "left_arm": "side", "right_arm": "side" }),
    );
    let rows = [
        // (landmark, fraction of H above the floor standing)
        (Landmark::Tragus, 0.926),  // eye 0.936 − 0.010 (Frankfurt plane)
        (Landmark::EyeLeft, 0.936), // 38.88 cm
        (Landmark::CordCervical, 0.846), // shoulder + 0.028
        (Landmark::CordThoracic, 0.720), // at chest level
        (Landmark::CordLumbar, 0.620), // hip + 0.090
        (Landmark::KidneyRight, 0.610), // hip + 0.080
        (Landmark::IliacCrest, 0.590), // hip + 0.060
        (Landmark::UpperArmLeft, 0.724), // midway shoulder 0.818 to elbow 0.630
        (Landmark::WristRight, 0.485), // −42.3 cm
        (Landmark::ThighLeft, 0.530),
        (Landmark::AnkleRight, 0.530),
    ];
    for (landmark, fraction) in rows {
        check(
            &format!("{landmark} upright"),
            above_heart(&report, landmark),
            (fraction - 0.720) * 180.0,
            1e-9,
        );
    }
}

// ---------------------------------------------------------------------------
// Supine and upright
// ---------------------------------------------------------------------------

#[test]
fn supine_trunk_landmarks_sit_at_heart_level_within_their_depth_offsets() {
    // Supine, everything lies in the table plane through the mid-axillary
    // line, except the front-to-back offsets of the proportions module
    // (assumed, ±2 cm): eye +8, cervical cord −2, thoracic cord −6, lumbar
    // cord −5, kidneys −4.
    for body in [150.0, 176.0, 210.0] {
        let report = placed(body, json!({ "posture": "supine" }));
        let rows = [
            (Landmark::Heart, 0.0),
            (Landmark::Tragus, 0.0),
            (Landmark::IliacCrest, 0.0),
            (Landmark::EyeLeft, 8.0),
            (Landmark::EyeRight, 8.0),
            (Landmark::CordCervical, -2.0),
            (Landmark::CordThoracic, -6.0),
            (Landmark::CordLumbar, -5.0),
            (Landmark::KidneyLeft, -4.0),
            (Landmark::KidneyRight, -4.0),
            (Landmark::UpperArmLeft, 0.0),
            (Landmark::WristRight, 0.0),
            (Landmark::ThighLeft, 0.0),
            (Landmark::CalfRight, 0.0),
            (Landmark::AnkleLeft, 0.0),
        ];
        for (landmark, expected) in rows {
            check(
                &format!("supine {landmark}, {body} cm"),
                above_heart(&report, landmark),
                expected,
                1e-9,
            );
        }
        // The offsets themselves, as the proportions module states them.
        check("eye offset", proportions::forward_cm::EYE, 8.0, 0.0);
        check("kidney offset", proportions::forward_cm::KIDNEY, -4.0, 0.0);
    }
}

#[test]
fn upright_tragus_height_is_the_trunk_distance_from_heart_to_ear() {
    // At 90°, no neck flexion: (0.926 − 0.720) × H = 0.206 H.
    for (body, expected) in [(150.0, 30.9), (170.0, 35.02), (200.0, 41.2)] {
        let report = placed(body, json!({ "posture": "head_up", "backrest_deg": 90 }));
        check(
            &format!("tragus at 90°, {body} cm"),
            above_heart(&report, Landmark::Tragus),
            expected,
            1e-9,
        );
    }
    // The sitting posture flexes the neck 25°: tragus = 0.098 H sin 80° +
    // 0.108 H sin(80° + 25°) = 16.4640 × 0.98481 + 18.1440 × 0.96593 = 33.740
    // for 168 cm (the trunk at 80°; the head's angle is the sum).
    let report = placed(168.0, json!({ "posture": "sitting" }));
    check(
        "sitting tragus",
        above_heart(&report, Landmark::Tragus),
        33.740,
        1e-3,
    );
}

#[test]
fn heart_to_ear_distance_upright_is_adult_sized() {
    // Heart-to-ear distance upright about 25-35 cm (M, from memory). The model
    // gives 0.206 H: 33.0 cm at 160, 35.0 at 170, 37.1 at 180. From memory, so
    // only a wide tolerance (±5 cm); at 176 cm and above the model is above
    // the remembered range (see README).
    for body in [160.0, 170.0, 180.0] {
        let report = placed(body, json!({ "posture": "head_up", "backrest_deg": 90 }));
        check_within(
            &format!("heart to ear upright, {body} cm (M, from memory)"),
            above_heart(&report, Landmark::Tragus),
            20.0,
            40.0,
        );
    }
}

#[test]
fn head_rises_steadily_with_the_backrest_when_the_neck_is_not_flexed() {
    // tragus = 0.098 H sin b + 0.108 H sin(b + n): for neck flexion n ≤ 0 both
    // terms rise on 0-90°. The cervical cord (2 cm behind) rises too.
    for neck in [-30, -10, 0] {
        let mut last = (f64::NEG_INFINITY, f64::NEG_INFINITY);
        for backrest in (0..=90).step_by(10) {
            let report = placed(
                172.0,
                json!({ "posture": "head_up", "backrest_deg": backrest, "neck_flexion_deg": neck }),
            );
            let now = (
                above_heart(&report, Landmark::Tragus),
                above_heart(&report, Landmark::CordCervical),
            );
            assert!(
                now.0 > last.0,
                "tragus at {backrest}°, neck {neck}°: {} after {}",
                now.0,
                last.0
            );
            assert!(now.1 > last.1, "cervical cord at {backrest}°, neck {neck}°");
            last = now;
        }
    }
}

#[test]
fn a_flexed_head_is_highest_before_full_upright() {
    // With the neck flexed 25° the head tips forward past vertical as the
    // backrest nears 90°: d/db [0.098 sin b + 0.108 sin(b + 25°)] = 0 at
    // tan b = (0.098 + 0.108 cos 25°) / (0.108 sin 25°) = 4.2916, b = 76.9°.
    let tragus = |backrest: f64| {
        let report = placed(
            170.0,
            json!({ "posture": "sitting", "backrest_deg": backrest }),
        );
        above_heart(&report, Landmark::Tragus)
    };
    let peak = tragus(77.0);
    assert!(peak > tragus(74.0) && peak > tragus(80.0) && peak > tragus(90.0));
    assert!(tragus(74.0) > tragus(60.0));
}

// ---------------------------------------------------------------------------
// Mirror symmetries
// ---------------------------------------------------------------------------

#[test]
fn head_up_and_head_down_tilts_mirror_each_other() {
    // Tilting the table by t turns every point: h(t) = a cos t + c sin t, with
    // a its height flat and c its distance toward the head. So h(+t) + h(−t) =
    // 2 cos t · h(0) and the two tilts are mirror images about the flat
    // position scaled by cos t.
    for tilt in [10.0_f64, 25.0, 45.0] {
        let flat = placed(170.0, json!({ "posture": "supine" }));
        let up = placed(
            170.0,
            json!({ "posture": "reverse_trendelenburg", "tilt_deg": tilt }),
        );
        let down = placed(
            170.0,
            json!({ "posture": "trendelenburg", "tilt_deg": -tilt }),
        );
        let cos = tilt.to_radians().cos();
        for landmark in Landmark::ALL {
            check(
                &format!("{landmark} at ±{tilt}°"),
                above_heart(&up, landmark) + above_heart(&down, landmark),
                2.0 * cos * above_heart(&flat, landmark),
                1e-9,
            );
        }
        // Head-up raises the head and lowers the feet.
        assert!(above_heart(&up, Landmark::Tragus) > 0.0);
        assert!(above_heart(&down, Landmark::Tragus) < 0.0);
        assert!(above_heart(&up, Landmark::AnkleLeft) < 0.0);
    }
}

#[test]
fn left_and_right_side_lying_mirror_each_other() {
    let left = placed(176.0, json!({ "posture": "lateral_left" }));
    let right = placed(176.0, json!({ "posture": "lateral_right" }));
    let pairs = [
        (Landmark::EyeLeft, Landmark::EyeRight),
        (Landmark::KidneyLeft, Landmark::KidneyRight),
        (Landmark::UpperArmLeft, Landmark::UpperArmRight),
        (Landmark::WristLeft, Landmark::WristRight),
        (Landmark::ThighLeft, Landmark::ThighRight),
        (Landmark::CalfLeft, Landmark::CalfRight),
        (Landmark::AnkleLeft, Landmark::AnkleRight),
    ];
    for (l, r) in pairs {
        check(
            &format!("{l} ↔ {r}"),
            above_heart(&left, l),
            above_heart(&right, r),
            1e-9,
        );
        check(
            &format!("{r} ↔ {l}"),
            above_heart(&left, r),
            above_heart(&right, l),
            1e-9,
        );
        assert!(
            above_heart(&left, l) < 0.0,
            "{l} is down when lying on the left"
        );
    }
    for midline in [
        Landmark::Tragus,
        Landmark::CordCervical,
        Landmark::CordLumbar,
        Landmark::IliacCrest,
    ] {
        check(
            &format!("{midline}"),
            above_heart(&left, midline),
            above_heart(&right, midline),
            1e-9,
        );
        // Head on its pillow and the spine: at heart level.
        check(
            &format!("{midline} at heart level"),
            above_heart(&left, midline),
            0.0,
            1e-9,
        );
    }
}

#[test]
fn dependent_arm_is_half_a_chest_width_below_the_heart() {
    // DOMAIN §4: in side-lying the dependent arm is about half the chest
    // width below the heart: 0.174 / 2 × 176 = 15.312 cm. A cuff there reads
    // 1050.6 × 9.80665 × 0.15312 / 133.322387415 = 11.833 mmHg above the
    // pressure at the heart, and the upper arm as much below.
    let report = run(json!({
        "patient": { "height": "176 cm" },
        "position": { "posture": "lateral_left" },
        "arterial": [
            { "id": "dependent cuff", "method": "cuff", "level": "upper_arm_left", "mean": "92 mmHg" },
            { "id": "upper cuff", "method": "cuff", "level": "upper_arm_right", "mean": "68 mmHg" },
        ],
    }));
    check(
        "dependent arm",
        above_heart(&report, Landmark::UpperArmLeft),
        -15.312,
        1e-9,
    );
    check(
        "upper arm",
        above_heart(&report, Landmark::UpperArmRight),
        15.312,
        1e-9,
    );
    let at_heart = |i: usize| report.arterial[i].mean_at_heart_mmhg.expect("at heart");
    check("dependent cuff at heart", at_heart(0), 92.0 - 11.833, 1e-3);
    check("upper cuff at heart", at_heart(1), 68.0 + 11.833, 1e-3);
}

// ---------------------------------------------------------------------------
// Seated measurements, REFERENCES.md §5
// ---------------------------------------------------------------------------

/// A beach-chair case at `backrest`° for a 170 cm adult, the cuff arm as
/// given and a cuff reading 90 mmHg mean on it.
fn beach_chair(backrest: f64, arm: &str) -> Report {
    run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "beach_chair", "backrest_deg": backrest, "left_arm": arm },
        "arterial": [{ "id": "arm cuff", "method": "cuff", "level": "upper_arm_left", "mean": "90 mmHg" }],
    }))
}

#[test]
fn beach_chair_cuff_to_ear_distance_asa_monitor_2013() {
    // ASA Monitor 2013 (V): in most adults in the beach chair position the
    // upper-arm cuff is about 10-30 cm below the external auditory meatus, so
    // the pressure at the brain is 8-24 mmHg lower than the cuff reads.
    //
    // Configuration: a 170 cm adult (a middling adult height), backrest 45°
    // and 30° (within the 30-90° used in practice, shoulder-surgery chapters,
    // V2; 45° is the angle of the ankle-arm study of REFERENCES §5), the cuff
    // arm alongside the trunk, at the side or with the forearm on the lap
    // (the upper arm, where the cuff is, lies alongside the trunk in both).
    //
    // By hand: tragus − mid upper arm = (0.098 + 0.108 − 0.004) H sin b =
    // 0.202 × 170 × sin b: 24.28 cm at 45°, 17.17 cm at 30°.
    for (backrest, distance) in [(45.0, 24.282), (30.0, 17.170)] {
        for arm in ["side", "lap"] {
            let report = beach_chair(backrest, arm);
            let gap = above_heart(&report, Landmark::Tragus)
                - above_heart(&report, Landmark::UpperArmLeft);
            check(
                &format!("cuff to ear at {backrest}°, arm {arm} (D)"),
                gap,
                distance,
                1e-3,
            );
            check_within(
                &format!("cuff to ear at {backrest}°, ASA Monitor 2013 (V)"),
                gap,
                10.0,
                30.0,
            );
            let lower = 90.0 - metric(&report, Organ::Brain, Metric::Inflow).value_mmhg;
            check_within(
                &format!("brain below cuff at {backrest}°, ASA Monitor 2013 (V)"),
                lower,
                8.0,
                24.0,
            );
            check("column (D)", lower, column(BLOOD, distance), 1e-3);
        }
    }
    // At the core's default beach chair (70°) the same arithmetic gives
    // 0.202 × 170 × sin 70° = 32.27 cm, a little above the range ASA quotes
    // for most adults (a departure recorded in README).
    let report = beach_chair(70.0, "lap");
    let gap = above_heart(&report, Landmark::Tragus) - above_heart(&report, Landmark::UpperArmLeft);
    check("cuff to ear at 70° (D)", gap, 32.269, 1e-3);
}

#[test]
fn beach_chair_ankle_cuff_reads_higher_than_the_arm() {
    // Korean J Anesthesiol 2012;63:515 (V): in the beach chair, ankle
    // pressure is higher than brachial; REFERENCES §5 gives ankle MAP about
    // +13 mmHg at 45°. By hand at 45°, 170 cm, hips 20° and knees 40°: ankle
    // = −0.190 H sin 45° + (0.245 − 0.246) H sin 20° = −22.898 cm; mid upper
    // arm +0.481 cm; 23.379 cm of blood = 18.07 mmHg. The model's difference
    // is larger than the published mean, so the check is that an ankle cuff
    // 13 mmHg above the arm agrees with it once both are at heart level,
    // within the combined accuracy the report states.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "beach_chair", "backrest_deg": 45 },
        "arterial": [
            { "id": "arm cuff", "method": "cuff", "level": "upper_arm_left", "mean": "80 mmHg" },
            { "id": "ankle cuff", "method": "cuff", "level": "ankle_right", "mean": "93 mmHg" },
        ],
        "assume": { "icp": { "value": "10 mmHg" } },
    }));
    check(
        "ankle height (D)",
        above_heart(&report, Landmark::AnkleRight),
        -22.898,
        1e-3,
    );
    let cross = report.cross_checks.first().expect("a cross-check");
    assert!(cross.agree, "{}", cross.words);
    // Direction (V): for the same brain target the ankle must read higher.
    let cpp = metric(&report, Organ::Brain, Metric::Perfusion);
    let needed = |site: &str| {
        cpp.targets[0]
            .defend
            .iter()
            .find(|r| r.site == site)
            .map(|r| r.needed_mmhg)
            .expect("a required reading")
    };
    check(
        "ankle minus arm needed (D)",
        needed("ankle cuff") - needed("arm cuff"),
        18.067,
        1e-2,
    );
}

// ---------------------------------------------------------------------------
// Measured heights win
// ---------------------------------------------------------------------------

#[test]
fn a_measured_height_wins_and_says_so() {
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "beach_chair" },
        "heights": {
            "tragus": { "height": "28 cm", "uncertainty": "3 cm" },
            "upper_arm_left": "-2 cm",
        },
        "arterial": [line("line", json!("heart"), "80 mmHg")],
    }));
    let tragus = height(&report, Landmark::Tragus);
    check("measured tragus", tragus.above_heart_cm, 28.0, 1e-9);
    check("its uncertainty", tragus.uncertainty_cm, 3.0, 1e-9);
    assert_eq!(tragus.provenance, Provenance::Measured);
    assert_eq!(tragus.provenance.label(), "measured");
    assert_eq!(tragus.largest_contributor, None);
    let arm = height(&report, Landmark::UpperArmLeft);
    check("measured arm", arm.above_heart_cm, -2.0, 1e-9);
    check("default uncertainty 1 cm", arm.uncertainty_cm, 1.0, 1e-9);
    assert_eq!(arm.provenance, Provenance::Measured);
    assert_eq!(
        height(&report, Landmark::EyeLeft).provenance,
        Provenance::Estimated
    );
    // The brain uses the measured 28 cm: 80 − 1050.6 × 9.80665 × 0.28 /
    // 133.322387415 = 80 − 21.638 = 58.362; the ±3 cm moves it ±2.318.
    let inflow = metric(&report, Organ::Brain, Metric::Inflow);
    check(
        "MAP at the measured tragus",
        inflow.value_mmhg,
        58.362,
        1e-3,
    );
    let measured = inflow
        .contributions
        .iter()
        .find(|c| c.input.contains("measured height"))
        .expect("the measurement's own uncertainty");
    check("±3 cm of blood", measured.up_mmhg, 2.318, 1e-3);
    check("±3 cm of blood", measured.down_mmhg, -2.318, 1e-3);
}

// ---------------------------------------------------------------------------
// Out of range
// ---------------------------------------------------------------------------

#[test]
fn out_of_range_angles_and_sizes_name_their_field() {
    let base =
        || json!({ "patient": { "height": "170 cm" }, "position": { "posture": "beach_chair" } });
    let rows: [(&str, Value, &str); 13] = [
        ("/position/backrest_deg", json!(95), "position.backrest_deg"),
        ("/position/backrest_deg", json!(-1), "position.backrest_deg"),
        ("/position/tilt_deg", json!(46), "position.tilt_deg"),
        (
            "/position/neck_flexion_deg",
            json!(61),
            "position.neck_flexion_deg",
        ),
        (
            "/position/hip_flexion_deg",
            json!(121),
            "position.hip_flexion_deg",
        ),
        (
            "/position/knee_flexion_deg",
            json!(-5),
            "position.knee_flexion_deg",
        ),
        (
            "/position/left_arm",
            json!({ "angles": { "shoulder_flexion_deg": 190, "elbow_flexion_deg": 0 } }),
            "position.left_arm.angles.shoulder_flexion_deg",
        ),
        (
            "/position/right_arm",
            json!({ "angles": { "shoulder_flexion_deg": 0, "elbow_flexion_deg": 151 } }),
            "position.right_arm.angles.elbow_flexion_deg",
        ),
        ("/patient/height", json!("250 cm"), "patient.height"),
        ("/patient/height", json!("119 cm"), "patient.height"),
        (
            "/segments",
            json!({ "upper_arm": "2 cm" }),
            "segments.upper_arm",
        ),
        ("/heights", json!({ "tragus": "130 cm" }), "heights.tragus"),
        (
            "/heights",
            json!({ "tragus": { "height": "20 cm", "uncertainty": "40 cm" } }),
            "heights.tragus.uncertainty",
        ),
    ];
    for (pointer, bad, field) in rows {
        let mut body = base();
        set(&mut body, pointer, bad);
        let errors = refuse(body);
        assert!(
            errors
                .iter()
                .any(|e| e.field() == field && !e.to_string().is_empty()),
            "{pointer}: expected an error on {field}, got\n{errors}"
        );
    }
    // A backrest on a position that has none, and the baseline's own position.
    let errors = refuse(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "prone", "backrest_deg": 20 },
        "baseline": { "method": "cuff", "level": "upper_arm_left",
                      "position": { "posture": "supine", "tilt_deg": 50 }, "mean": "90 mmHg" },
    }));
    assert!(
        errors.iter().any(|e| e.field() == "position.backrest_deg"),
        "{errors}"
    );
    assert!(
        errors
            .iter()
            .any(|e| e.field() == "baseline.position.tilt_deg"),
        "{errors}"
    );
}

/// Sets the value at a JSON pointer, creating the last object member.
fn set(doc: &mut Value, pointer: &str, value: Value) {
    let (parent, key) = pointer.rsplit_once('/').expect("a pointer");
    let slot = if parent.is_empty() {
        Some(&mut *doc)
    } else {
        doc.pointer_mut(parent)
    };
    match slot {
        Some(Value::Object(map)) => {
            map.insert(key.to_owned(), value);
        }
        _ => panic!("no object at {parent}"),
    }
}
