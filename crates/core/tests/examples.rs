//! The example case files under `examples/` (invented scenarios, nothing
//! from any patient): each reads with `Case::from_json`, checks with
//! `check_case`, and its key numbers match a hand derivation.

use std::path::PathBuf;

use plumbline_core::case::Case;
use plumbline_core::check::check_case;
use plumbline_core::landmark::Landmark;
use plumbline_core::organ::{Metric, Organ};
use plumbline_core::reading::Quantity;
use plumbline_core::report::{Provenance, Report};
use plumbline_core::target::Status;

use crate::util::{above_heart, check, height, metric, target, try_metric, value};

/// The examples the tests rely on. Every `.json` file in the directory is
/// also checked, whether listed here or not.
pub const NAMES: [&str; 9] = [
    "beach-chair",
    "sitting-craniotomy",
    "prone-spine",
    "icu-abdomen",
    "aortic-repair",
    "cpr",
    "lateral-thoracotomy",
    "measured-heights",
    "limb-compartment",
];

fn dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../examples")
}

/// The text of an example.
pub fn text(name: &str) -> String {
    let path = dir().join(format!("{name}.json"));
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

/// An example's report, through `Case::from_json` and `check_case`.
fn report(name: &str) -> Report {
    let case = Case::from_json(&text(name)).unwrap_or_else(|e| panic!("{name}: {e}"));
    check_case(&case).unwrap_or_else(|e| panic!("{name}: {e}"))
}

#[test]
fn every_example_reads_and_checks() {
    let mut found = Vec::new();
    for entry in std::fs::read_dir(dir()).expect("examples directory") {
        let path = entry.expect("entry").path();
        if path.extension().is_some_and(|e| e == "json") {
            let name = path
                .file_stem()
                .expect("stem")
                .to_string_lossy()
                .into_owned();
            let report = report(&name);
            assert!(
                !report.organs.is_empty(),
                "{name}: no organ could be checked"
            );
            // A case survives its own round trip through the document format.
            let case = Case::from_json(&text(&name)).expect("reads");
            assert_eq!(
                Case::from_json(&case.to_json()).expect("re-reads"),
                case,
                "{name}"
            );
            found.push(name);
        }
    }
    for name in NAMES {
        assert!(
            found.iter().any(|f| f == name),
            "examples/{name}.json is missing"
        );
    }
}

#[test]
fn beach_chair() {
    // 172 cm at 65°, haematocrit 38%: blood 1020.5 + 0.38 × 72.5 = 1048.05
    // kg/m³. Tragus 0.206 × 172 × sin 65° = 32.112 cm. MAP at the tragus
    // 74 − 1048.05 × 9.80665 × 0.32112 / 133.322387415 = 74 − 24.755 = 49.245;
    // CPP with the assumed ICP 10: 39.245, below 60.
    let r = report("beach-chair");
    check("tragus", above_heart(&r, Landmark::Tragus), 32.112, 1e-3);
    let cpp = metric(&r, Organ::Brain, Metric::Perfusion);
    check("CPP", cpp.value_mmhg, 39.245, 1e-3);
    assert_eq!(target(cpp, "at least 60").status, Status::Below);
    assert_eq!(cpp.assumed, vec![Quantity::Icp]);
    // Baseline 136/80 supine on the arm (at heart level): mean 98.667; 80% of
    // it is 78.933, which the line's 74 misses by 4.933.
    let relative = target(
        metric(&r, Organ::WholeBody, Metric::Inflow),
        "80% of baseline",
    );
    check(
        "relative floor",
        relative.threshold_mmhg.expect("threshold"),
        78.933,
        1e-3,
    );
    check(
        "margin",
        relative.margin_mmhg.expect("margin"),
        -4.933,
        1e-3,
    );
}

#[test]
fn sitting_craniotomy() {
    // Drain 16 cmH2O at the tragus = 11.769 mmHg; line levelled at the tragus
    // reads 78: CPP 66.231. Veins collapse at the ear, ICP sets the outflow.
    // Cross-check: tragus 33.740 cm, so the line is 78 + 26.073 = 104.073 at
    // the heart; the cuff on the right upper arm (+0.662 cm) is 104 + 0.511 =
    // 104.511: they agree.
    let r = report("sitting-craniotomy");
    let cpp = metric(&r, Organ::Brain, Metric::Perfusion);
    check("CPP", cpp.value_mmhg, 66.231, 1e-3);
    assert_eq!(cpp.outflow.as_ref().map(|o| o.winner), Some(Quantity::Icp));
    check(
        "ICP in mmHg",
        value(&r, Organ::Brain, Metric::Surrounding),
        11.769,
        1e-3,
    );
    check(
        "line at heart",
        r.arterial[0].mean_at_heart_mmhg.expect("at heart"),
        104.073,
        1e-3,
    );
    check(
        "cuff at heart",
        r.arterial[1].mean_at_heart_mmhg.expect("at heart"),
        104.511,
        1e-3,
    );
    assert!(r.cross_checks.iter().all(|c| c.agree));
    // The posterior fossa, the operative site, sits above the heart: CVP 4
    // carried up the blood column is below atmospheric there (air
    // entrainment; Mirski 2007, M). The drain is clamped.
    let fossa = above_heart(&r, Landmark::PosteriorFossa);
    let site = r.venous_site.as_ref().expect("the operative site");
    check(
        "venous at the fossa",
        site.venous_mmhg.unwrap_or(f64::NAN),
        4.0 - crate::util::column(crate::util::BLOOD, fossa),
        1e-6,
    );
    assert_eq!(site.below_atmospheric, Some(true));
    assert!(r.drain.as_ref().is_some_and(|d| !d.open));
}

#[test]
fn prone_spine() {
    // Prone, 5° head-down, 181 cm: the left eye is 8 cm in front of the ear
    // (so below it, face down) and 0.216 H toward the head: height =
    // 0.216 × 181 × sin(−5°) − 8 × cos 5° = −3.408 − 7.970 = −11.377 cm.
    // MAP at the eye 66 + 8.792 = 74.792; minus IOP 24: 50.792.
    let r = report("prone-spine");
    check(
        "eye height",
        above_heart(&r, Landmark::EyeLeft),
        -11.377,
        1e-3,
    );
    let opp = metric(&r, Organ::Eye, Metric::Perfusion);
    check("OPP at eye level", opp.value_mmhg, 50.792, 1e-3);
    assert_eq!(target(opp, "at least 40").status, Status::Met);
    // The seated population formula does not apply face down.
    assert!(try_metric(&r, Organ::Eye, Metric::PopulationMean).is_none());
}

#[test]
fn icu_abdomen() {
    // Head-up 30°, 174 cm, haematocrit 30%: blood 1042.25 kg/m³. Iliac crest
    // (0.060 − 0.190) × 174 × sin 30° = −11.31 cm. APP and the filtration
    // gradient are judged as defined, MAP at the heart − IAP at its zero:
    // 75 − 18 = 57 (below 60) and 75 − 36 = 39, IAH grade II, as in the
    // worked example of REFERENCES.md §7.5 (D, from WSACS 2013 and Malbrain
    // 2006). At the crest itself MAP is 75 + 8.671 = 83.671, so the APP
    // there, shown beside, is 65.671. The kidney is judged as MAP − CVP at
    // the heart (BMC Nephrol 2017): 75 − 12 = 63; at the kidney CVP carried
    // there (21.99) beats IAP carried there (19.27), and MAP and CVP share the
    // blood column: 63 again, so nothing is shown beside it.
    let r = report("icu-abdomen");
    check("crest", above_heart(&r, Landmark::IliacCrest), -11.31, 1e-9);
    let app = metric(&r, Organ::Abdomen, Metric::Perfusion);
    check("APP", app.value_mmhg, 57.0, 1e-9);
    assert_eq!(target(app, "at least 60").status, Status::Below);
    check(
        "APP at the crest",
        app.beside.as_ref().map_or(f64::NAN, |b| b.value_mmhg),
        65.671,
        1e-3,
    );
    check(
        "FG",
        value(&r, Organ::Abdomen, Metric::FiltrationGradient),
        39.0,
        1e-9,
    );
    let iap = metric(&r, Organ::Abdomen, Metric::Surrounding);
    assert_eq!(iap.grade.as_ref().map(|g| g.grade), Some(2));
    let kidney = metric(&r, Organ::Kidney, Metric::Perfusion);
    check("renal", kidney.value_mmhg, 63.0, 1e-9);
    assert!(kidney.beside.is_none());
    assert_eq!(
        kidney.outflow.as_ref().map(|o| o.winner),
        Some(Quantity::Cvp)
    );
    assert!(
        r.warnings.iter().any(|w| w.field == "readings.iap"),
        "{:?}",
        r.warnings
    );
}

#[test]
fn aortic_repair() {
    // Lumbar drain 14 cmH2O at the heart = 10.298 mmHg, judged at the
    // drain's own zero as the aortic-repair studies read it (Coselli 2002):
    // above the 10 mmHg limit. At L1 (5 cm lower, supine) 10.298 + 3.702 =
    // 14.000, shown beside. SCPP = 88 + 3.864 − 14.000 = 77.864, below 80.
    // The cmH2O on a transducer draws a unit warning.
    let r = report("aortic-repair");
    let scpp = metric(&r, Organ::Cord, Metric::Perfusion);
    check("SCPP", scpp.value_mmhg, 77.864, 1e-3);
    assert_eq!(target(scpp, "at least").status, Status::Below);
    let csf = metric(&r, Organ::Cord, Metric::Surrounding);
    check("CSF at the drain's zero", csf.value_mmhg, 10.298, 1e-3);
    check(
        "CSF at the cord",
        csf.beside.as_ref().map_or(f64::NAN, |b| b.value_mmhg),
        14.0,
        1e-3,
    );
    assert_eq!(target(csf, "at most 10").status, Status::Above);
    assert!(r.warnings.iter().any(|w| w.field == "readings.csf.value"));
}

#[test]
fn cpr() {
    // 30 − 12 = 18, at least 15; 27 would meet it exactly.
    let r = report("cpr");
    let m = metric(&r, Organ::HeartCpr, Metric::Perfusion);
    check("coronary perfusion in CPR", m.value_mmhg, 18.0, 1e-9);
    let t = target(m, "at least 15");
    assert_eq!(t.status, Status::Met);
    check("aortic needed", t.defend[0].needed_mmhg, 27.0, 1e-9);
}

#[test]
fn lateral_thoracotomy() {
    // Left side down, 176 cm: the dependent arm is 0.087 × 176 = 15.312 cm
    // below the heart, so its cuff's 92 is 92 − 11.833 = 80.167 at the heart,
    // agreeing with the line's 80. The right kidney is higher and is checked.
    let r = report("lateral-thoracotomy");
    check(
        "dependent arm",
        above_heart(&r, Landmark::UpperArmLeft),
        -15.312,
        1e-9,
    );
    check(
        "cuff at heart",
        r.arterial[1].mean_at_heart_mmhg.expect("at heart"),
        80.167,
        1e-3,
    );
    let cross = &r.cross_checks[0];
    assert!(cross.agree, "{}", cross.words);
    let kidney = r
        .organs
        .iter()
        .find(|o| o.organ == Organ::Kidney)
        .expect("kidney");
    assert_eq!(kidney.level, Some(Landmark::KidneyRight));
    assert!(r.warnings.iter().any(|w| w.message.contains("Kee")));
}

#[test]
fn measured_heights() {
    // No position: only measured heights. Cuff 124/70, mean 70 + 54/3 = 88,
    // at −6 cm; tragus +24: a 30 cm column, 88 − 23.183 = 64.817; CPP with
    // ICP 12: 52.817. APP as defined: MAP at the heart 88 − 4.637 (the cuff
    // is 6 cm below it) = 83.363, less IAP 9 at its zero: 74.363; at the
    // crest (−18 cm) MAP is 88 + 9.273 = 97.273 and the APP there 88.273.
    let r = report("measured-heights");
    check(
        "CPP",
        value(&r, Organ::Brain, Metric::Perfusion),
        52.817,
        1e-3,
    );
    let app = metric(&r, Organ::Abdomen, Metric::Perfusion);
    check("APP", app.value_mmhg, 74.363, 1e-3);
    check(
        "APP at the crest",
        app.beside.as_ref().map_or(f64::NAN, |b| b.value_mmhg),
        88.273,
        1e-3,
    );
    let tragus = height(&r, Landmark::Tragus);
    assert_eq!(tragus.provenance, Provenance::Measured);
    check("tragus uncertainty", tragus.uncertainty_cm, 2.0, 0.0);
    assert_eq!(r.heights.len(), 4, "heart plus the three measured");
    for organ in [Organ::Cord, Organ::Kidney] {
        assert!(r.not_checked.iter().any(|n| n.organ == organ), "{organ}");
    }
    assert!(r.figure.is_none());
}

#[test]
fn limb_compartment() {
    // Lithotomy, 175 cm: hips and knees at 90°, so the calf lies level with
    // the knee, a thigh's length (0.245 × 175 = 42.875 cm) above the heart.
    // Diastolic there 64 − 33.133 = 30.867; ΔP = 30.867 − 18 = 12.867, below
    // 30. The line's diastolic would need 64 + 17.133 = 81.133.
    let r = report("limb-compartment");
    check("calf", above_heart(&r, Landmark::CalfRight), 42.875, 1e-9);
    let m = metric(&r, Organ::Limb, Metric::Perfusion);
    check("ΔP", m.value_mmhg, 12.867, 1e-3);
    let t = target(m, "at least 30");
    assert_eq!(t.status, Status::Below);
    check("diastolic needed", t.defend[0].needed_mmhg, 81.133, 1e-3);
}
