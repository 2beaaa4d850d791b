//! Reference checks: every value in REFERENCES.md §1-§4 and §6 that the
//! core computes or carries, with its source and tag beside the check.
//!
//! Tags as in REFERENCES.md: V read in the source, V2 read in a secondary
//! source, M from memory (wide tolerance only), CP common practice, D
//! derived from the constants. Most checks go through a case document and
//! `check::check_json`, so the whole pipeline is under test. The seated and
//! side-lying measurements of §5 are in `geometry_reference`; the worked
//! examples of §7 in `worked`.

use plumbline_core::fluid::{self, Densities};
use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::reading::Method;
use plumbline_core::target::{self, Bound, Status};
use plumbline_core::units::{
    self, cm, kg_per_m3, mmhg, to_kg_per_m3, to_mmhg, to_pa, PressureUnit,
};
use serde_json::{json, Value};

use crate::util::{
    case, check, check_within, line, metric, reading, refuse, run, target, value, PA_PER_MMHG,
};

// ---------------------------------------------------------------------------
// §1 Constants
// ---------------------------------------------------------------------------

#[test]
fn conventional_units_have_their_defined_values() {
    let rows = [
        // NIST SP 811 App. B.8 (V2): 1 mmHg = 133.322387415 Pa.
        (
            "1 mmHg in Pa, NIST SP 811 App. B.8 (V2)",
            to_pa(mmhg(1.0)),
            133.322_387_415,
        ),
        // NIST SP 811 App. B.8 (V2): 1 cmH2O = 98.0665 Pa.
        (
            "1 cmH2O in Pa, NIST SP 811 App. B.8 (V2)",
            to_pa(PressureUnit::CmH2O.pressure(1.0)),
            98.0665,
        ),
        // SI: 1 kPa = 1000 Pa.
        (
            "1 kPa in Pa, SI",
            to_pa(PressureUnit::KPa.pressure(1.0)),
            1000.0,
        ),
        // 3rd CGPM 1901; ISO 80000-3 (V2): g = 9.80665 m/s², so a 1 m column
        // of 1000 kg/m³ weighs 1000 × 9.80665 × 1 = 9806.65 Pa.
        (
            "standard gravity via a 1 m water column, CGPM 1901 (V2)",
            to_pa(units::column(kg_per_m3(1000.0), cm(100.0))),
            9806.65,
        ),
    ];
    for (what, actual, expected) in rows {
        check(what, actual, expected, 1e-9);
    }
    check(
        "the published constant, NIST SP 811 App. B.8 (V2)",
        units::PA_PER_MMHG,
        133.322_387_415,
        0.0,
    );
}

#[test]
fn derived_unit_factors() {
    // D: 98.0665 / 133.322387415 = 0.7355591; 1000 / 133.322387415 = 7.5006158.
    check(
        "1 cmH2O in mmHg (D)",
        to_mmhg(PressureUnit::CmH2O.pressure(1.0)),
        0.735_559,
        1e-6,
    );
    check(
        "1 kPa in mmHg (D)",
        to_mmhg(PressureUnit::KPa.pressure(1.0)),
        7.500_62,
        1e-5,
    );
}

/// An ICP read at the tragus, whose height is measured: the brain's
/// surrounding pressure is the reading itself, in mmHg.
fn icp_as_mmhg(entry: &str) -> f64 {
    let report = run(json!({
        "heights": { "tragus": "15 cm" },
        "readings": { "icp": reading(entry, "drain_scale", json!("tragus")) },
    }));
    value(&report, Organ::Brain, Metric::Surrounding)
}

#[test]
fn pressures_entered_in_any_unit_reach_the_report_in_mmhg() {
    let rows = [
        // D: 10 × 98.0665 / 133.322387415 = 7.35559 (REFERENCES §7 example 1).
        ("10 cmH2O (D)", "10 cmH2O", 7.355_59, 1e-5),
        // Anaesthesia textbook, monitoring chapter (V2): "30 cmH2O is about
        // 22 mmHg"; exactly 30 × 0.7355591 = 22.0668.
        ("30 cmH2O is about 22 mmHg (V2)", "30 cmH2O", 22.0, 0.1),
        ("30 cmH2O exactly (D)", "30 cmH2O", 22.066_77, 1e-5),
        // D: 1000 / 133.322387415 = 7.50062 (REFERENCES §7 example 1).
        ("1 kPa (D)", "1 kPa", 7.500_62, 1e-5),
        // D: 2000 / 133.322387415 = 15.00123.
        ("2 kPa (D)", "2 kPa", 15.001_23, 1e-5),
        ("mmHg as entered", "15 mmHg", 15.0, 1e-12),
        ("decimal comma", "12,5 mmHg", 12.5, 1e-12),
        // torr (101325/760 Pa) and the conventional mmHg differ by about 1 part
        // in 7 million (D); the core reads torr as mmHg.
        ("torr", "11.5 torr", 11.5, 1e-5),
    ];
    for (what, entry, expected, tolerance) in rows {
        check(what, icp_as_mmhg(entry), expected, tolerance);
    }
}

// ---------------------------------------------------------------------------
// §1 Fluid columns and blood density
// ---------------------------------------------------------------------------

/// MAP brought to the tragus, `tragus` above a transducer at the heart that
/// reads a mean of 90 mmHg, with extra case fields.
fn inflow_at_tragus(tragus: &str, extra: Value) -> f64 {
    let mut body = json!({
        "heights": { "tragus": tragus },
        "arterial": [line("line", json!("heart"), "90 mmHg")],
    });
    if let (Some(b), Value::Object(extra)) = (body.as_object_mut(), extra) {
        b.extend(extra);
    }
    value(&run(body), Organ::Brain, Metric::Inflow)
}

/// The blood density a report used, backed out of the fall in MAP over a
/// column of `cm` centimetres: ΔP / (g × h).
fn density_used(drop_mmhg: f64, cm: f64) -> f64 {
    drop_mmhg * PA_PER_MMHG / (crate::util::G * cm / 100.0)
}

#[test]
fn blood_column_per_centimetre_at_published_densities() {
    // D: rho × 9.80665 × 0.01 / 133.322387415 per cm of blood.
    let rows = [
        ("1050 kg/m³: 0.7723 mmHg/cm (D)", 1050.0, 0.7723),
        ("1055 kg/m³: 0.776 mmHg/cm (D)", 1055.0, 0.776),
        ("1060 kg/m³: 0.780 mmHg/cm (D)", 1060.0, 0.780),
    ];
    for (what, rho, per_cm) in rows {
        let direct = to_mmhg(units::column(kg_per_m3(rho), cm(1.0)));
        check(what, direct, per_cm, 5e-4);
        // The same through a case: a density override and a tragus 20 cm up.
        let report = inflow_at_tragus(
            "20 cm",
            json!({ "densities": { "blood": format!("{rho} kg/m3") } }),
        );
        check(
            &format!("{what}, via a case"),
            (90.0 - report) / 20.0,
            per_cm,
            5e-4,
        );
    }
    // A density in g/mL is the same density: 1.055 g/mL = 1055 kg/m³.
    let report = inflow_at_tragus("20 cm", json!({ "densities": { "blood": "1.055 g/mL" } }));
    check("1.055 g/mL (D)", (90.0 - report) / 20.0, 0.776, 5e-4);
}

#[test]
fn default_blood_column_matches_the_bedside_rule_of_thumb() {
    // Tragus 10 cm above the heart: 90 − 1050.6 × 9.80665 × 0.10 / 133.322387415
    // = 90 − 7.72778 = 82.27222 (D).
    let at_tragus = inflow_at_tragus("10 cm", json!({}));
    check("default blood, 10 cm (D)", at_tragus, 82.272_22, 1e-4);
    // ASA Monitor 2013 beach-chair review (V): "approximately 0.77 mmHg per cm".
    check(
        "0.77 mmHg per cm, ASA Monitor 2013 (V)",
        (90.0 - at_tragus) / 10.0,
        0.77,
        0.01,
    );
    // Common practice (CP): "about 2 mmHg per inch". 10 in = 25.4 cm:
    // 1050.6 × 9.80665 × 0.254 / 133.322387415 = 19.6286 mmHg, 1.963 per inch.
    let per_inch = (90.0 - inflow_at_tragus("10 in", json!({}))) / 10.0;
    check(
        "about 2 mmHg per inch, common practice (CP)",
        per_inch,
        2.0,
        0.05,
    );
    check("1.963 mmHg per inch (D)", per_inch, 1.962_86, 1e-4);
}

#[test]
fn default_blood_density_is_the_published_whole_blood_value() {
    let d = Densities::default();
    // Trudnowski and Rico, Clin Chem 1974;20:615 (V): specific gravity 1.0506
    // at 37 °C, 95% CI 1.0475-1.0537.
    check(
        "default density, Trudnowski and Rico 1974 (V)",
        to_kg_per_m3(d.blood.nominal),
        1050.6,
        1e-9,
    );
    check(
        "the published constant (V)",
        fluid::BLOOD_KG_PER_M3,
        1050.6,
        0.0,
    );
    // Hinghofer-Szalkay and Greenleaf, J Appl Physiol 1987;63:1003 (V2):
    // whole-blood density 1043-1057 kg/m³: the range the uncertainty spans.
    check(
        "range low, Hinghofer-Szalkay 1987 (V2)",
        to_kg_per_m3(d.blood.low),
        1043.0,
        1e-9,
    );
    check(
        "range high, Hinghofer-Szalkay 1987 (V2)",
        to_kg_per_m3(d.blood.high),
        1057.0,
        1e-9,
    );
    // Through a case: the density backed out of the column, 30 cm.
    let drop = 90.0 - inflow_at_tragus("30 cm", json!({}));
    let rho = density_used(drop, 30.0);
    check("density used in a case (V)", rho, 1050.6, 0.01);
    check_within(
        "inside the 95% CI, Trudnowski and Rico 1974 (V)",
        rho,
        1047.5,
        1053.7,
    );
    check(
        "plasma specific gravity 1.0205 (V)",
        fluid::PLASMA_KG_PER_M3,
        1020.5,
        0.0,
    );
}

#[test]
fn density_range_reaches_the_report_as_a_contribution() {
    let report = run(json!({
        "heights": { "tragus": "30 cm" },
        "arterial": [line("line", json!("heart"), "90 mmHg")],
    }));
    let inflow = metric(&report, Organ::Brain, Metric::Inflow);
    let density = inflow
        .contributions
        .iter()
        .find(|c| c.input.contains("blood density"))
        .expect("a blood density contribution");
    // Hinghofer-Szalkay and Greenleaf 1987 (V2), 1043-1057 kg/m³, over 30 cm:
    // denser blood lowers MAP at the ear by (1057 − 1050.6) × 9.80665 × 0.30
    // / 133.322387415 = 0.14123; lighter raises it by 7.6 × ... = 0.16771.
    assert!(density.input.contains("1043-1057"), "{}", density.input);
    check(
        "pull down, 1057 kg/m³ (D)",
        density.down_mmhg,
        -0.141_23,
        1e-4,
    );
    check("push up, 1043 kg/m³ (D)", density.up_mmhg, 0.167_71, 1e-4);
}

#[test]
fn haematocrit_option_stays_within_the_published_whole_blood_range() {
    let density_at = |hct: f64| {
        let drop = 90.0
            - inflow_at_tragus(
                "20 cm",
                json!({ "patient": { "haematocrit_percent": hct } }),
            );
        density_used(drop, 20.0)
    };
    // Hinghofer-Szalkay and Greenleaf 1987 (V2): 1043-1057 kg/m³, for the
    // haematocrits of healthy adults (36-50%, common practice).
    for hct in [36.0, 38.0, 40.0, 42.0, 44.0, 46.0, 48.0, 50.0] {
        check_within(
            &format!("Hct {hct}%, Hinghofer-Szalkay 1987 range (V2)"),
            density_at(hct),
            1043.0,
            1057.0,
        );
    }
    // Trudnowski and Rico 1974 (V): at a normal haematocrit the whole-blood
    // value lies in the 95% CI 1047.5-1053.7. Hct 42: 1020.5 + 0.42 × 72.5
    // = 1050.95 kg/m³ (plasma from the same source; cells from memory).
    let at_42 = density_at(42.0);
    check_within("Hct 42%, Trudnowski and Rico CI (V)", at_42, 1047.5, 1053.7);
    check("Hct 42%, 1050.95 (D)", at_42, 1050.95, 0.01);
    // Hinghofer-Szalkay et al. 1979 (V): density is linear in haematocrit, so
    // the midpoint of Hct 40 and 50 has the mean of their densities.
    let (a, b, mid) = (density_at(40.0), density_at(50.0), density_at(45.0));
    check(
        "linear in Hct, Hinghofer-Szalkay 1979 (V)",
        (a + b) / 2.0,
        mid,
        1e-6,
    );
    assert!(b > a, "density rises with haematocrit");
}

// ---------------------------------------------------------------------------
// §2 Mean arterial pressure from systolic and diastolic
// ---------------------------------------------------------------------------

fn source_mean(rule: Option<&str>, mean: Option<&str>) -> (f64, String) {
    let mut source = json!({
        "id": "line", "method": "transducer", "level": "heart",
        "systolic": "120 mmHg", "diastolic": "80 mmHg",
    });
    if let Some(m) = mean {
        source["mean"] = json!(m);
    }
    let mut body = json!({ "arterial": [source] });
    if let Some(rule) = rule {
        body["mean_rule"] = json!(rule);
    }
    let report = run(body);
    let row = &report.arterial[0];
    (
        row.mean_mmhg.expect("a mean"),
        row.mean_basis.clone().expect("a basis"),
    )
}

#[test]
fn mean_pressure_rules_on_120_over_80() {
    // Common practice (CP): 80 + 40/3 = 93.333 (REFERENCES §2 example).
    let (mean, basis) = source_mean(None, None);
    check("one-third rule, common practice (CP)", mean, 93.333, 1e-3);
    assert!(basis.contains("/3"), "{basis}");
    // Meaney et al., Heart 2000;84:64 (V): 80 + 0.412 × 40 = 96.48.
    let (mean, basis) = source_mean(Some("form_factor_0412"), None);
    check("form factor 0.412, Meaney 2000 (V)", mean, 96.48, 1e-9);
    assert!(basis.contains("0.412"), "{basis}");
    // A device's own mean is used as read, and the report says so (DOMAIN §3).
    let (mean, basis) = source_mean(Some("form_factor_0412"), Some("91 mmHg"));
    check("measured mean wins", mean, 91.0, 1e-12);
    assert_eq!(basis, "measured");
}

#[test]
fn estimated_mean_carries_the_other_rule_as_its_spread() {
    // The gap between the two rules at a pulse pressure of 40 mmHg:
    // (0.412 − 1/3) × 40 = 3.1467 mmHg (D). Grillo et al., J Hypertens 2020
    // (V) found the rules' biases against tonometry to differ by several mmHg
    // (−5.0 and −0.6), which is why an estimated mean is not exact.
    let report = run(json!({
        "arterial": [{ "id": "line", "method": "transducer", "level": "heart",
                       "systolic": "120 mmHg", "diastolic": "80 mmHg" }],
    }));
    let inflow = metric(&report, Organ::WholeBody, Metric::Inflow);
    let rule = inflow
        .contributions
        .iter()
        .find(|c| c.input.contains("mean estimated"))
        .expect("the estimation rule as a contribution");
    check("rule gap up (D)", rule.up_mmhg, 3.146_67, 1e-4);
    check("rule gap down (D)", rule.down_mmhg, -3.146_67, 1e-4);
}

// ---------------------------------------------------------------------------
// §3 Reference levels
// ---------------------------------------------------------------------------

#[test]
fn phlebostatic_axis_is_the_datum() {
    // Winsor and Burch 1945 (V): the heart reference, 4th intercostal space at
    // mid-chest depth. A transducer levelled there reads MAP at the heart.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [line("line", json!("heart"), "80 mmHg")],
    }));
    let heart = crate::util::height(&report, Landmark::Heart);
    check("heart height", heart.above_heart_cm, 0.0, 0.0);
    assert_eq!(heart.provenance.label(), "reference");
    check(
        "MAP at heart from a transducer at the heart",
        value(&report, Organ::WholeBody, Metric::Inflow),
        80.0,
        1e-12,
    );
    // Mid-chest depth: the arms resting at the side of a supine patient are at
    // the same depth, so a cuff there needs no correction.
    check(
        "supine arm at the side",
        crate::util::above_heart(&report, Landmark::UpperArmLeft),
        0.0,
        1e-9,
    );
}

#[test]
fn side_lying_warns_that_the_phlebostatic_axis_is_undefined() {
    // Kee et al., Am J Crit Care 1993;2:72 (V): the axis as defined does not
    // hold in side-lying.
    for posture in ["lateral_left", "lateral_right"] {
        let report = run(json!({
            "patient": { "height": "170 cm" },
            "position": { "posture": posture },
        }));
        assert!(
            report
                .warnings
                .iter()
                .any(|w| w.field == "position" && w.message.contains("Kee")),
            "{posture}: {:?}",
            report.warnings
        );
    }
    let supine =
        run(json!({ "patient": { "height": "170 cm" }, "position": { "posture": "supine" } }));
    assert!(!supine.warnings.iter().any(|w| w.message.contains("Kee")));
}

#[test]
fn transducer_at_the_tragus_gives_brain_inflow_as_read() {
    // Joint statement of UK neuro-anaesthesia and neurosurgical societies,
    // Br J Anaesth 2015 (V): for CPP, level the arterial transducer at the
    // tragus, and report the level used. At any backrest the MAP at the
    // tragus is then the reading itself.
    for backrest in [30, 45, 60, 75, 90] {
        let report = run(json!({
            "patient": { "height": "172 cm" },
            "position": { "posture": "beach_chair", "backrest_deg": backrest },
            "arterial": [line("line", json!("tragus"), "70 mmHg")],
            "readings": { "icp": reading("10 mmHg", "probe", json!("tragus")) },
        }));
        check(
            &format!("MAP at tragus, backrest {backrest}° (V)"),
            value(&report, Organ::Brain, Metric::Inflow),
            70.0,
            1e-9,
        );
        check(
            "CPP = 70 − 10",
            value(&report, Organ::Brain, Metric::Perfusion),
            60.0,
            1e-9,
        );
        let brain = report
            .organs
            .iter()
            .find(|o| o.organ == Organ::Brain)
            .expect("brain");
        assert!(
            brain.level_label.contains("tragus"),
            "{}",
            brain.level_label
        );
        assert!(
            report.arterial[0].level.contains("tragus"),
            "{}",
            report.arterial[0].level
        );
    }
}

#[test]
fn assumed_pressures_default_to_their_conventional_zero() {
    // ICP zero at the tragus (CP); IAP zero at the mid-axillary line at the
    // iliac crest, Kirkpatrick et al. (WSACS) 2013 (V). Head-up 40°, where the
    // tragus and iliac crest are far from the heart: an assumed value at its
    // own zero comes through unchanged.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "head_up", "backrest_deg": 40 },
        "arterial": [line("line", json!("heart"), "80 mmHg")],
        "assume": { "icp": { "value": "10 mmHg" }, "iap": { "value": "8 mmHg" } },
    }));
    check(
        "ICP at the tragus (CP)",
        value(&report, Organ::Brain, Metric::Surrounding),
        10.0,
        1e-9,
    );
    check(
        "IAP at the iliac crest (V)",
        value(&report, Organ::Abdomen, Metric::Surrounding),
        8.0,
        1e-9,
    );
    let abdomen = report
        .organs
        .iter()
        .find(|o| o.organ == Organ::Abdomen)
        .expect("abdomen");
    assert_eq!(abdomen.level, Some(Landmark::IliacCrest), "WSACS 2013 (V)");
}

#[test]
fn intra_abdominal_pressure_is_expected_in_mmhg_supine() {
    // Kirkpatrick et al. (WSACS), Intensive Care Med 2013;39:1190 (V): IAP is
    // expressed in mmHg and measured supine. A transducer value typed in
    // cmH2O, or a reading taken head-up, draws a warning on readings.iap.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "head_up" },
        "readings": { "iap": reading("20 cmH2O", "transducer", json!("iliac_crest")) },
    }));
    let on_iap: Vec<_> = report
        .warnings
        .iter()
        .filter(|w| w.field.starts_with("readings.iap"))
        .collect();
    assert!(
        on_iap.iter().any(|w| w.message.contains("mmHg")),
        "{on_iap:?}"
    );
    assert!(
        on_iap.iter().any(|w| w.message.contains("supine")),
        "{on_iap:?}"
    );
    let flat = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "readings": { "iap": reading("12 mmHg", "transducer", json!("iliac_crest")) },
    }));
    assert!(
        !flat
            .warnings
            .iter()
            .any(|w| w.field.starts_with("readings.iap")),
        "{:?}",
        flat.warnings
    );
}

#[test]
fn lumbar_drain_needs_its_level_stated() {
    // Lumbar CSF drain zero is per local protocol (CP): the core takes no
    // default for a measured reading, and says which field is missing.
    let errors = refuse(json!({
        "readings": { "csf": { "value": "10 mmHg", "method": "transducer" } },
    }));
    assert!(
        errors
            .iter()
            .any(|e| e.field().starts_with("readings.csf") && e.to_string().contains("level")),
        "{errors}"
    );
}

// ---------------------------------------------------------------------------
// §4 Definitions and thresholds
// ---------------------------------------------------------------------------

/// An abdomen checked flat (supine, so every trunk landmark is at heart
/// level) with a line at the heart and an IAP at the iliac crest.
fn abdomen(map: &str, iap: &str) -> plumbline_core::report::Report {
    run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [line("line", json!("heart"), map)],
        "readings": { "iap": reading(iap, "transducer", json!("iliac_crest")) },
    }))
}

#[test]
fn intra_abdominal_hypertension_grades_and_their_edges() {
    // Kirkpatrick et al. (WSACS) 2013 (V): IAH is a sustained IAP ≥ 12 mmHg;
    // grade I 12-15, II 16-20, III 21-25, IV > 25; normal 5-7 in adult ICU.
    let rows: [(&str, u8, &str); 13] = [
        ("5 mmHg", 0, "normal 5-7 (V)"),
        ("7 mmHg", 0, "normal 5-7 (V)"),
        ("11.9 mmHg", 0, "below 12 (V)"),
        ("12 mmHg", 1, "lower edge of I (V)"),
        ("15 mmHg", 1, "upper edge of I (V)"),
        // Between the published whole-number bands; the core's documented
        // convention gives the lower grade.
        ("15.5 mmHg", 1, "between I and II (core convention)"),
        ("16 mmHg", 2, "lower edge of II (V)"),
        ("20 mmHg", 2, "upper edge of II (V)"),
        ("21 mmHg", 3, "lower edge of III (V)"),
        ("25 mmHg", 3, "upper edge of III (V)"),
        ("25.1 mmHg", 4, "above 25 (V)"),
        ("26 mmHg", 4, "IV (V)"),
        ("40 mmHg", 4, "IV (V)"),
    ];
    for (iap, grade, what) in rows {
        let report = abdomen("90 mmHg", iap);
        let m = metric(&report, Organ::Abdomen, Metric::Surrounding);
        let got = m.grade.as_ref().expect("an IAH grade").grade;
        assert_eq!(got, grade, "IAP {iap}: {what}, WSACS 2013");
    }
}

#[test]
fn abdominal_compartment_syndrome_is_named_above_20() {
    // WSACS 2013 (V): abdominal compartment syndrome is a sustained IAP > 20
    // mmHg with new organ dysfunction.
    let words = |iap: &str| {
        let report = abdomen("90 mmHg", iap);
        metric(&report, Organ::Abdomen, Metric::Surrounding)
            .grade
            .as_ref()
            .expect("grade")
            .words
            .clone()
    };
    assert!(!words("20 mmHg").contains("compartment syndrome"));
    assert!(words("20.5 mmHg").contains("compartment syndrome"));
    assert!(words("30 mmHg").contains("organ dysfunction"));
}

#[test]
fn abdominal_perfusion_and_filtration_gradient() {
    // WSACS 2013 (V): APP = MAP − IAP, below 60 flagged; filtration gradient
    // = MAP − 2 × IAP. Supine, every level at the heart: no column.
    let rows = [
        // (MAP, IAP, APP, FG, status of APP ≥ 60)
        ("90 mmHg", "10 mmHg", 80.0, 70.0, Status::Met),
        ("72 mmHg", "12 mmHg", 60.0, 48.0, Status::Met),
        ("71 mmHg", "12 mmHg", 59.0, 47.0, Status::Below),
        ("65 mmHg", "25 mmHg", 40.0, 15.0, Status::Below),
    ];
    for (map, iap, app, fg, status) in rows {
        let report = abdomen(map, iap);
        let perfusion = metric(&report, Organ::Abdomen, Metric::Perfusion);
        check(
            &format!("APP {map} − {iap} (V)"),
            perfusion.value_mmhg,
            app,
            1e-9,
        );
        check(
            &format!("FG {map} − 2 × {iap} (V)"),
            value(&report, Organ::Abdomen, Metric::FiltrationGradient),
            fg,
            1e-9,
        );
        assert_eq!(
            target(perfusion, "at least 60").status,
            status,
            "{map} {iap}"
        );
    }
}

#[test]
fn cerebral_perfusion_with_the_waterfall() {
    // Anaesthesia and neurocritical care texts (V2): CPP = MAP − ICP; if the
    // venous pressure exceeds ICP, CPP = MAP − venous pressure.
    let cpp = |icp: &str, cvp: &str| {
        let report = run(json!({
            "heights": { "tragus": "0 cm" },
            "arterial": [line("line", json!("tragus"), "85 mmHg")],
            "readings": {
                "icp": reading(icp, "probe", json!("tragus")),
                "cvp": reading(cvp, "transducer", json!("tragus")),
            },
        }));
        metric(&report, Organ::Brain, Metric::Perfusion).clone()
    };
    let rows = [
        // (ICP, venous, CPP, winner)
        ("15 mmHg", "5 mmHg", 70.0, "icp"),
        ("10 mmHg", "18 mmHg", 67.0, "cvp"),
        ("20 mmHg", "19.9 mmHg", 65.0, "icp"),
    ];
    for (icp, cvp, expected, winner) in rows {
        let m = cpp(icp, cvp);
        check(
            &format!("CPP 85 − max({icp}, {cvp}) (V2)"),
            m.value_mmhg,
            expected,
            1e-9,
        );
        let outflow = m.outflow.expect("an outflow");
        assert_eq!(outflow.winner.key(), winner, "{icp} vs {cvp}");
        assert_eq!(outflow.candidates.len(), 2);
    }
}

#[test]
fn brain_trauma_foundation_thresholds_with_their_edges() {
    // Carney et al. (BTF 4th ed.), Neurosurgery 2017;80:6 (V2): CPP 60-70
    // mmHg; treat ICP above 22 mmHg.
    let brain = |map: &str, icp: &str| {
        run(json!({
            "heights": { "tragus": "0 cm" },
            "arterial": [line("line", json!("tragus"), map)],
            "readings": { "icp": reading(icp, "probe", json!("tragus")) },
        }))
    };
    let rows = [
        // (MAP, ICP, CPP status, ICP status)
        ("82 mmHg", "22 mmHg", Status::Met, Status::Met),
        ("82 mmHg", "22.1 mmHg", Status::Below, Status::Above),
        ("80 mmHg", "20 mmHg", Status::Met, Status::Met),
        ("79 mmHg", "20 mmHg", Status::Below, Status::Met),
    ];
    for (map, icp, cpp_status, icp_status) in rows {
        let report = brain(map, icp);
        let cpp = metric(&report, Organ::Brain, Metric::Perfusion);
        let t = target(cpp, "at least 60");
        assert_eq!(t.status, cpp_status, "CPP {map} − {icp}");
        check(
            "CPP threshold, BTF 2016 (V2)",
            t.threshold_mmhg.expect("threshold"),
            60.0,
            0.0,
        );
        assert!(
            t.citation.contains("Brain Trauma Foundation"),
            "{}",
            t.citation
        );
        let icp_metric = metric(&report, Organ::Brain, Metric::Surrounding);
        let t = target(icp_metric, "at most 22");
        assert_eq!(t.status, icp_status, "ICP {icp}");
        check(
            "ICP threshold, BTF 2016 (V2)",
            t.threshold_mmhg.expect("threshold"),
            22.0,
            0.0,
        );
    }
}

#[test]
fn renal_perfusion_map_minus_cvp() {
    // BMC Nephrol 2017;18:146 (V): renal mean perfusion pressure MAP − CVP;
    // below 60 associated with worsening AKI. Supine: kidneys 4 cm behind
    // mid-chest, but MAP and CVP both move through blood, so the column
    // cancels: 70 − 12 = 58.
    let report = run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "supine" },
        "arterial": [line("line", json!("heart"), "70 mmHg")],
        "readings": { "cvp": reading("12 mmHg", "transducer", json!("heart")) },
    }));
    let kidney = metric(&report, Organ::Kidney, Metric::Perfusion);
    check("renal MAP − CVP (V)", kidney.value_mmhg, 58.0, 1e-9);
    let t = target(kidney, "at least 60");
    assert_eq!(t.status, Status::Below);
    assert!(t.citation.contains("BMC Nephrol"), "{}", t.citation);
    check(
        "whole body MAP − CVP",
        value(&report, Organ::WholeBody, Metric::Perfusion),
        58.0,
        1e-9,
    );
}

#[test]
fn coronary_perfusion_in_cpr_and_its_threshold() {
    // Paradis et al., JAMA 1990;263:1106 (V): coronary perfusion pressure =
    // aortic − right-atrial relaxation pressure; return of circulation only
    // when at least 15 mmHg.
    let rows = [
        ("30 mmHg", "12 mmHg", 18.0, Status::Met),
        ("27 mmHg", "12 mmHg", 15.0, Status::Met),
        ("26 mmHg", "12 mmHg", 14.0, Status::Below),
    ];
    for (aortic, atrial, expected, status) in rows {
        let report = run(json!({
            "readings": {
                "cpr_aortic_relaxation": reading(aortic, "transducer", json!("heart")),
                "cpr_right_atrial_relaxation": reading(atrial, "transducer", json!("heart")),
            },
        }));
        let m = metric(&report, Organ::HeartCpr, Metric::Perfusion);
        check(
            &format!("CPR CPP {aortic} − {atrial} (V)"),
            m.value_mmhg,
            expected,
            1e-9,
        );
        let t = target(m, "at least 15");
        assert_eq!(t.status, status, "{aortic} − {atrial}");
        assert!(t.citation.contains("Paradis"), "{}", t.citation);
    }
}

#[test]
fn coronary_perfusion_without_arrest() {
    // Clinical reference texts (V2): aortic diastolic − LVEDP. 60 − 14 = 46.
    let report = run(json!({
        "arterial": [{ "id": "line", "method": "transducer", "level": "heart",
                       "systolic": "110 mmHg", "diastolic": "60 mmHg", "mean": "77 mmHg" }],
        "readings": { "lvedp": reading("14 mmHg", "transducer", json!("heart")) },
    }));
    check(
        "DBP − LVEDP (V2)",
        value(&report, Organ::Heart, Metric::Perfusion),
        46.0,
        1e-9,
    );
}

#[test]
fn spinal_cord_perfusion_and_csf_limit() {
    // Saadoun et al., JNNP 2017 (V): SCPP = MAP − CSF pressure. Coselli et al.,
    // J Vasc Surg 2002 (V): CSF kept at or below 10 mmHg. Cord measured at
    // heart level, so no column: 88 − 10 = 78; 88 − 10.5 = 77.5.
    let cord = |csf: &str| {
        run(json!({
            "heights": { "cord_thoracic": "0 cm" },
            "arterial": [line("line", json!("heart"), "88 mmHg")],
            "readings": { "csf": reading(csf, "transducer", json!("heart")) },
        }))
    };
    let report = cord("10 mmHg");
    check(
        "SCPP, Saadoun 2017 (V)",
        value(&report, Organ::Cord, Metric::Perfusion),
        78.0,
        1e-9,
    );
    let csf = metric(&report, Organ::Cord, Metric::Surrounding);
    let t = target(csf, "at most 10");
    assert_eq!(t.status, Status::Met, "10 is within the Coselli limit");
    assert!(t.citation.contains("Coselli"), "{}", t.citation);
    let report = cord("10.5 mmHg");
    check(
        "SCPP (V)",
        value(&report, Organ::Cord, Metric::Perfusion),
        77.5,
        1e-9,
    );
    let t = target(
        metric(&report, Organ::Cord, Metric::Surrounding),
        "at most 10",
    );
    assert_eq!(t.status, Status::Above);
    // ACC/AHA aortic guideline 2022 (M, from memory): SCPP at least 80. From
    // memory, so only a wide check on the default.
    let t = target(
        metric(&report, Organ::Cord, Metric::Perfusion),
        "SCPP at least",
    );
    check_within(
        "SCPP floor about 80, ACC/AHA 2022 (M, from memory)",
        t.threshold_mmhg.expect("threshold"),
        70.0,
        90.0,
    );
}

#[test]
fn limb_compartment_delta_p() {
    // McQueen and Court-Brown, J Bone Joint Surg Br 1996;78:99 (V): ΔP = DBP −
    // compartment pressure; fasciotomy below 30. Supine: the calf at heart level.
    let rows = [
        ("60 mmHg", "30 mmHg", 30.0, Status::Met),
        ("59 mmHg", "30 mmHg", 29.0, Status::Below),
        ("70 mmHg", "20 mmHg", 50.0, Status::Met),
    ];
    for (dbp, compartment, expected, status) in rows {
        let report = run(json!({
            "patient": { "height": "170 cm" },
            "position": { "posture": "supine" },
            "arterial": [{ "id": "line", "method": "transducer", "level": "heart",
                           "systolic": "130 mmHg", "diastolic": dbp }],
            "readings": { "compartment": reading(compartment, "needle", json!("calf_left")) },
        }));
        let m = metric(&report, Organ::Limb, Metric::Perfusion);
        check(
            &format!("ΔP {dbp} − {compartment} (V)"),
            m.value_mmhg,
            expected,
            1e-9,
        );
        let t = target(m, "at least 30");
        assert_eq!(t.status, status);
        assert!(t.citation.contains("McQueen"), "{}", t.citation);
    }
}

// ---------------------------------------------------------------------------
// Default targets: thresholds and sources
// ---------------------------------------------------------------------------

/// A seated case with every reading, so every organ and every default
/// target is evaluated.
fn every_organ() -> plumbline_core::report::Report {
    run(json!({
        "patient": { "height": "170 cm" },
        "position": { "posture": "beach_chair", "backrest_deg": 60 },
        "arterial": [
            { "id": "line", "method": "transducer", "level": "heart",
              "systolic": "120 mmHg", "diastolic": "70 mmHg", "mean": "88 mmHg" },
            { "id": "cuff", "method": "cuff", "level": "upper_arm_left",
              "systolic": "124 mmHg", "diastolic": "76 mmHg" },
        ],
        "readings": {
            "icp": reading("10 mmHg", "probe", json!("tragus")),
            "csf": reading("8 mmHg", "transducer", json!("heart")),
            "iap": reading("10 mmHg", "transducer", json!("iliac_crest")),
            "cvp": reading("6 mmHg", "transducer", json!("heart")),
            "iop": reading("16 mmHg", "tonometer", json!("eye_left")),
            "compartment": reading("12 mmHg", "needle", json!("calf_left")),
            "lvedp": reading("10 mmHg", "transducer", json!("heart")),
            "cpr_aortic_relaxation": reading("30 mmHg", "transducer", json!("heart")),
            "cpr_right_atrial_relaxation": reading("10 mmHg", "transducer", json!("heart")),
        },
        "baseline": {
            "method": "cuff", "level": "upper_arm_left", "position": { "posture": "supine" },
            "systolic": "130 mmHg", "diastolic": "80 mmHg",
        },
    }))
}

#[test]
fn default_targets_carry_published_thresholds_and_sources() {
    let report = every_organ();
    // (organ, metric, words in the target, threshold, words in the source, tag)
    let rows = [
        (
            Organ::Brain,
            Metric::Perfusion,
            "CPP at least",
            60.0,
            "Brain Trauma Foundation",
            "V2",
        ),
        (
            Organ::Brain,
            Metric::Surrounding,
            "ICP at most",
            22.0,
            "Brain Trauma Foundation",
            "V2",
        ),
        (
            Organ::Cord,
            Metric::Surrounding,
            "at most",
            10.0,
            "Coselli",
            "V",
        ),
        (
            Organ::Abdomen,
            Metric::Perfusion,
            "APP at least",
            60.0,
            "Malbrain",
            "V",
        ),
        (
            Organ::Kidney,
            Metric::Perfusion,
            "at least",
            60.0,
            "BMC Nephrol",
            "V",
        ),
        (
            Organ::HeartCpr,
            Metric::Perfusion,
            "at least",
            15.0,
            "Paradis",
            "V",
        ),
        (
            Organ::Eye,
            Metric::PopulationMean,
            "at least",
            42.0,
            "Leske",
            "V",
        ),
        (
            Organ::Eye,
            Metric::PopulationDiastolic,
            "at least",
            55.0,
            "Leske",
            "V",
        ),
        (
            Organ::Limb,
            Metric::Perfusion,
            "at least",
            30.0,
            "McQueen",
            "V",
        ),
        (
            Organ::WholeBody,
            Metric::Inflow,
            "at least 65",
            65.0,
            "Surviving Sepsis",
            "V2",
        ),
        // Salmasi et al., Anesthesiology 2017 (V): more than 20% below baseline
        // is harmful, so the floor is 80% of the baseline mean at the heart.
        // Baseline 130/80 supine on the arm (at heart level supine): mean
        // 80 + 50/3 = 96.667; 0.8 × 96.667 = 77.333 (D).
        (
            Organ::WholeBody,
            Metric::Inflow,
            "80% of baseline",
            77.333,
            "Salmasi",
            "V",
        ),
    ];
    for (organ, which, words, threshold, source, tag) in rows {
        let t = target(metric(&report, organ, which), words);
        check(
            &format!("{organ} {which} threshold, {source} ({tag})"),
            t.threshold_mmhg.expect("an evaluated threshold"),
            threshold,
            1e-3,
        );
        assert!(
            t.citation.contains(source),
            "{organ} {which}: {}",
            t.citation
        );
    }
    // ACC/AHA 2022 (M, from memory): SCPP floor about 80.
    let t = target(
        metric(&report, Organ::Cord, Metric::Perfusion),
        "SCPP at least",
    );
    check_within(
        "SCPP floor (M, from memory)",
        t.threshold_mmhg.expect("threshold"),
        70.0,
        90.0,
    );
    assert!(t.citation.contains("ACC/AHA"), "{}", t.citation);
}

#[test]
fn default_map_floor_lies_in_the_consensus_harm_band() {
    // Sessler et al. (POQI), Br J Anaesth 2019;122:563 (V): harm below MAP
    // 60-70 mmHg; Surviving Sepsis Campaign 2021 (V2): initial target 65.
    let floors: Vec<f64> = target::defaults()
        .iter()
        .filter(|t| t.organ == Organ::WholeBody && t.metric == Metric::Inflow)
        .filter_map(|t| match t.bound {
            Bound::AtLeast(p) => Some(to_mmhg(p)),
            _ => None,
        })
        .collect();
    assert_eq!(floors.len(), 1, "{floors:?}");
    for floor in floors {
        check_within("absolute MAP floor, POQI 2019 (V)", floor, 60.0, 70.0);
        check("absolute MAP floor, SSC 2021 (V2)", floor, 65.0, 0.0);
    }
}

// ---------------------------------------------------------------------------
// §6 Device accuracy
// ---------------------------------------------------------------------------

#[test]
fn device_accuracy_defaults() {
    let report = run(json!({
        "arterial": [
            { "id": "cuff", "method": "cuff", "level": "upper_arm_left", "mean": "90 mmHg" },
            line("line", json!("heart"), "74 mmHg"),
            line("high line", json!("heart"), "200 mmHg"),
        ],
        "heights": { "upper_arm_left": "0 cm" },
    }));
    let row = |id: &str| report.arterial.iter().find(|a| a.id == id).expect("source");
    // ISO 81060-2 (V): validated cuffs have a mean error within 5 mmHg and
    // an SD within 8 mmHg; one reading's root-mean-square error at those
    // limits is √(5² + 8²) = 9.434 mmHg (D).
    check(
        "cuff accuracy, ISO 81060-2 (V) per reading (D)",
        row("cuff").accuracy_mmhg,
        (5.0f64 * 5.0 + 8.0 * 8.0).sqrt(),
        1e-12,
    );
    assert!(row("cuff").accuracy_source.contains("ISO 81060-2"));
    assert_eq!(row("cuff").method, Method::Cuff);
    // IEC 60601-2-34 (M, from memory): ±4 mmHg or ±4%, whichever is larger:
    // 4 at 74 mmHg (4% is 2.96), 8 at 200 mmHg. From memory: wide tolerance.
    check(
        "transducer at 74, IEC 60601-2-34 (M, from memory)",
        row("line").accuracy_mmhg,
        4.0,
        1.0,
    );
    check(
        "transducer at 200 (M, from memory)",
        row("high line").accuracy_mmhg,
        8.0,
        2.0,
    );
    assert!(row("line").accuracy_source.contains("from memory"));
}

#[test]
fn entered_accuracy_replaces_the_default() {
    let text = case(json!({
        "arterial": [{ "id": "cuff", "method": "cuff", "level": "upper_arm_left",
                       "mean": "90 mmHg", "accuracy": "8 mmHg" }],
        "heights": { "upper_arm_left": "0 cm" },
    }));
    let report = plumbline_core::check::check_json(&text).expect("accepted");
    check(
        "entered accuracy",
        report.arterial[0].accuracy_mmhg,
        8.0,
        0.0,
    );
    assert_eq!(report.arterial[0].accuracy_source, "entered in the case");
}
