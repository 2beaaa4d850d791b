//! The result of a check, as plain data for screens, tables and JSON.
//!
//! Pressures are numbers of mmHg in fields named `*_mmhg`, lengths numbers
//! of cm in fields named `*_cm`; words are ready to show. A front end shows
//! these; it never computes a pressure of its own.

use serde::Serialize;

use crate::error::Warning;
use crate::evaluate::Frame;
use crate::geometry::Figure;
use crate::landmark::Landmark;
use crate::organ::{Metric, Organ};
use crate::reading::{Component, Method, Quantity};
pub use crate::target::IahGrade;
use crate::target::Status;

/// The caution every screen, table and summary carries.
pub const CAUTION: &str = "Decision support for trained clinicians only. Every value depends on \
    correct heights, levels and zeroing, and targets are patient-specific: local protocols and \
    licensed clinical judgement come first.";

/// The value of a result's `format` field.
pub const RESULT_FORMAT: &str = "plumbline-result";

/// Everything one check found.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Report {
    /// Always `"plumbline-result"`.
    pub format: &'static str,
    /// The result format version (the case format's version).
    pub version: u32,
    /// The position in words, when one was given.
    pub position: Option<String>,
    /// Every landmark with a known height.
    pub heights: Vec<HeightRow>,
    /// The arterial sources as read.
    pub arterial: Vec<SourceRow>,
    /// The verdict first: each organ of concern judged, in one headline.
    pub summary: Summary,
    /// The organs that could be checked.
    pub organs: Vec<OrganReport>,
    /// The organs that could not, and what each needs.
    pub not_checked: Vec<NotChecked>,
    /// Agreement between arterial sources once at one level.
    pub cross_checks: Vec<CrossCheck>,
    /// The site readings to defend across backrest angles.
    pub sweeps: Vec<Sweep>,
    /// The patient's height as used: stated, or assumed when none was given.
    pub patient_height: Option<PatientHeight>,
    /// The venous pressure at the operative site.
    pub venous_site: Option<VenousSite>,
    /// Where an external ventricular drain drains, now and at other
    /// backrest angles.
    pub drain: Option<DrainReport>,
    /// The body in its position, for drawing.
    pub figure: Option<Figure>,
    /// Things worth a second look.
    pub warnings: Vec<Warning>,
    /// The caution.
    pub caution: &'static str,
}

/// Where a height came from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Provenance {
    /// The heart reference itself: 0 by definition.
    Datum,
    /// Measured on the patient.
    Measured,
    /// Estimated from the position and body proportions.
    Estimated,
}

impl Provenance {
    /// The provenance in words.
    pub fn label(self) -> &'static str {
        match self {
            Provenance::Datum => "reference",
            Provenance::Measured => "measured",
            Provenance::Estimated => "estimated",
        }
    }
}

/// One landmark's height.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct HeightRow {
    /// Which landmark.
    pub landmark: Landmark,
    /// It in words.
    pub label: &'static str,
    /// Height above the heart reference, cm.
    pub above_heart_cm: f64,
    /// Half-width of its plausible range, cm.
    pub uncertainty_cm: f64,
    /// Where it came from.
    pub provenance: Provenance,
    /// What moves it most, for estimated heights.
    pub largest_contributor: Option<String>,
}

/// One arterial source as read.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SourceRow {
    /// Its name.
    pub id: String,
    /// How it is measured.
    pub method: Method,
    /// Its level in words.
    pub level: String,
    /// Its level's height above the heart, cm.
    pub level_height_cm: Option<f64>,
    /// Systolic, mmHg.
    pub systolic_mmhg: Option<f64>,
    /// Diastolic, mmHg.
    pub diastolic_mmhg: Option<f64>,
    /// Mean, mmHg.
    pub mean_mmhg: Option<f64>,
    /// How the mean was obtained.
    pub mean_basis: Option<String>,
    /// Mean brought to the heart reference, mmHg.
    pub mean_at_heart_mmhg: Option<f64>,
    /// Accuracy half-width used, mmHg.
    pub accuracy_mmhg: f64,
    /// Where that accuracy comes from.
    pub accuracy_source: String,
    /// What the model assumes about this source that a reader should know,
    /// with its size (the saline in a transducer's tubing).
    pub note: Option<String>,
    /// Whether this source drives the organ results.
    pub primary: bool,
}

/// One organ's results.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OrganReport {
    /// Which organ.
    pub organ: Organ,
    /// It in words.
    pub label: &'static str,
    /// The landmark it is checked at; `None` at an explicit height (a
    /// compartment pressure taken at a measured height).
    pub level: Option<Landmark>,
    /// Where it is checked, in words.
    pub level_label: String,
    /// That level's height above the heart, cm.
    pub level_height_cm: f64,
    /// How the organ stands against its targets, decided here once.
    pub verdict: OrganVerdict,
    /// The metrics computed.
    pub metrics: Vec<MetricReport>,
    /// The metrics that could not be computed, and why.
    pub missing: Vec<MissingMetric>,
}

/// One organ's verdict against its targets. An organ with no evaluated
/// target is never "met": it is not evaluated, and the reason says why.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OrganVerdict {
    /// Met, below, above, or not evaluated.
    pub status: Status,
    /// The verdict in one sentence, with the deciding value and target.
    pub words: String,
    /// The deciding metric's value with its range, when there is one:
    /// `MAP at organ level 47 mmHg (41–53)`.
    pub value: Option<String>,
    /// The reading to defend now: the first site that can bring the first
    /// missed target back (or, when all are met, hold the first one).
    pub defend: Option<Defend>,
    /// Targets that could not be evaluated, each with what it needs.
    pub not_evaluated: Vec<String>,
}

/// The answer first: every organ of concern with its verdict, and one
/// headline that never calls an organ fine when it could not be judged.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Summary {
    /// Below or above if any organ of concern misses a target; not
    /// evaluated if any could not be judged; met only when every one is.
    pub status: Status,
    /// The verdict in one or two short sentences.
    pub headline: String,
    /// How many targets are missed, over every organ.
    pub missed_targets: usize,
    /// The organs of concern (the case's, or every organ with a result),
    /// in the order results are shown.
    pub organs: Vec<OrganLine>,
}

/// One organ of concern in the summary.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OrganLine {
    /// Which organ.
    pub organ: Organ,
    /// It in words.
    pub label: &'static str,
    /// Its verdict.
    pub status: Status,
    /// The verdict in one sentence.
    pub words: String,
    /// The deciding value with its range, when there is one.
    pub value: Option<String>,
    /// The reading to defend now, in words.
    pub defend: Option<String>,
}

/// A metric that could not be computed.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MissingMetric {
    /// Which metric.
    pub metric: Metric,
    /// Its name.
    pub label: &'static str,
    /// What it needs.
    pub needs: Vec<String>,
    /// The targets on it, in words, that could therefore not be evaluated.
    pub targets: Vec<String>,
}

/// One computed metric with its range, derivation and targets.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MetricReport {
    /// Which metric.
    pub metric: Metric,
    /// Its name.
    pub label: &'static str,
    /// The value, mmHg.
    pub value_mmhg: f64,
    /// The low end of its plausible range, mmHg.
    pub lower_mmhg: f64,
    /// The high end, mmHg.
    pub upper_mmhg: f64,
    /// The value and range as shown: `47 mmHg (41–53)`.
    pub display: String,
    /// Where its pressures are referred to: the organ's height, or the
    /// zeros of its published definition.
    pub frame: Frame,
    /// That zero in words, with its source: what its targets assume.
    pub zero: &'static str,
    /// The same metric in the other frame, when the two differ by half a
    /// mmHg or more (the head above the heart, a drain not at the cord).
    pub beside: Option<Beside>,
    /// The input that moves it most.
    pub largest_contributor: Option<String>,
    /// Each input's effect, largest first.
    pub contributions: Vec<Contribution>,
    /// The arterial source it was computed from.
    pub inflow_source: Option<String>,
    /// The waterfall's choice.
    pub outflow: Option<OutflowReport>,
    /// Assumed values used: the result is only as good as the assumption.
    pub assumed: Vec<Quantity>,
    /// How it was computed.
    pub steps: Vec<StepReport>,
    /// The targets on it.
    pub targets: Vec<TargetReport>,
    /// The IAH grade, for IAP.
    pub grade: Option<IahGrade>,
}

/// A metric in the frame it is not judged in, shown beside the judged
/// value.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Beside {
    /// The other frame.
    pub frame: Frame,
    /// What the value is, in words.
    pub what: &'static str,
    /// The value, mmHg.
    pub value_mmhg: f64,
    /// One line: what it shows here, and how far it is from the judged value.
    pub words: String,
}

/// One input's effect on a metric when moved across its range.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Contribution {
    /// The input in words.
    pub input: String,
    /// How far it can pull the metric down, mmHg (zero or negative).
    pub down_mmhg: f64,
    /// How far it can push it up, mmHg (zero or positive).
    pub up_mmhg: f64,
}

/// The waterfall's choice.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OutflowReport {
    /// The effective back pressure, mmHg.
    pub value_mmhg: f64,
    /// The pressure that set it.
    pub winner: Quantity,
    /// Every candidate at the organ's height.
    pub candidates: Vec<OutflowCandidate>,
}

/// A waterfall candidate.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OutflowCandidate {
    /// Which pressure.
    pub quantity: Quantity,
    /// Its value at the organ's height, mmHg.
    pub value_mmhg: f64,
}

/// One step of a derivation.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StepReport {
    /// The step in words.
    pub what: String,
    /// Its value, mmHg.
    pub value_mmhg: f64,
}

/// A metric against one target.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TargetReport {
    /// The target in words.
    pub target: String,
    /// Where it comes from.
    pub citation: String,
    /// The zero level the target assumes, with its source.
    pub zero: &'static str,
    /// The threshold it resolves to, mmHg (relative targets resolve through
    /// the baseline).
    pub threshold_mmhg: Option<f64>,
    /// How the threshold was found, for relative targets.
    pub threshold_steps: Vec<StepReport>,
    /// Met, below, above; not evaluated when an input is missing (`words`
    /// says which).
    pub status: Status,
    /// How far inside the bound, mmHg: positive meets, negative fails.
    pub margin_mmhg: Option<f64>,
    /// Whether the plausible range reaches across the threshold.
    pub range_crosses: bool,
    /// The verdict in words.
    pub words: String,
    /// The reading each site must show to meet this target now.
    pub defend: Vec<Defend>,
}

/// The reading a site must show for a target to be met in the current
/// position: the value to defend.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Defend {
    /// The site (an arterial source's id, or a reading's name).
    pub site: String,
    /// Which component of its reading.
    pub component: Option<Component>,
    /// Its reading now, mmHg.
    pub current_mmhg: f64,
    /// The reading that meets the target exactly, mmHg.
    pub needed_mmhg: f64,
    /// `true` when the reading must be at least the needed value.
    pub at_least: bool,
    /// The needed value in words, rounded the safe way, in the site's unit.
    pub words: String,
}

/// Two arterial sources compared at the heart reference.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct CrossCheck {
    /// The first source.
    pub first: String,
    /// The second source.
    pub second: String,
    /// The first's mean at heart level, mmHg.
    pub first_at_heart_mmhg: f64,
    /// The second's mean at heart level, mmHg.
    pub second_at_heart_mmhg: f64,
    /// First minus second, mmHg.
    pub difference_mmhg: f64,
    /// Their combined accuracy, mmHg.
    pub tolerance_mmhg: f64,
    /// Whether they agree within it.
    pub agree: bool,
    /// The verdict in words.
    pub words: String,
}

/// The reading one site needs across backrest angles.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Sweep {
    /// Which organ.
    pub organ: Organ,
    /// Which metric.
    pub metric: Metric,
    /// The target in words.
    pub target: String,
    /// The site whose reading is given.
    pub site: String,
    /// Which component of its reading.
    pub component: Option<Component>,
    /// `true` when the reading must be at least the needed value.
    pub at_least: bool,
    /// One point per angle.
    pub points: Vec<SweepPoint>,
    /// What is held fixed while the angle moves.
    pub note: String,
}

/// One point of a sweep.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct SweepPoint {
    /// Backrest angle, degrees.
    pub backrest_deg: f64,
    /// The site reading needed at that angle, mmHg.
    pub needed_mmhg: f64,
}

/// An organ that could not be checked.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct NotChecked {
    /// Which organ.
    pub organ: Organ,
    /// It in words.
    pub label: &'static str,
    /// What it needs.
    pub needs: Vec<String>,
}

/// The body height the geometry used.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PatientHeight {
    /// Standing height, cm.
    pub height_cm: f64,
    /// Its half-width in the ranges, cm.
    pub uncertainty_cm: f64,
    /// Whether it was assumed because none was given.
    pub assumed: bool,
}

/// The venous pressure at an operative site above or below the heart.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VenousSite {
    /// The site.
    pub site: Landmark,
    /// It in words.
    pub label: &'static str,
    /// Whether the case named it (else the vertex of a seated patient).
    pub chosen: bool,
    /// Its height above the heart reference, cm.
    pub above_heart_cm: f64,
    /// The venous pressure there, from CVP at the heart, mmHg; `None`
    /// without a CVP.
    pub venous_mmhg: Option<f64>,
    /// The CVP that would bring it to atmospheric, mmHg.
    pub cvp_for_zero_mmhg: f64,
    /// Whether it is below atmospheric; `None` without a CVP.
    pub below_atmospheric: Option<bool>,
    /// Whether to show it as a warning: below atmospheric, or well above
    /// the heart with no CVP to tell.
    pub alarm: bool,
    /// The finding in words.
    pub words: String,
}

/// An external ventricular drain's opening pressure.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DrainReport {
    /// Whether it is open.
    pub open: bool,
    /// The ICP at the tragus above which it drains now, cmH2O.
    pub opens_above_cmh2o: f64,
    /// The same, mmHg.
    pub opens_above_mmhg: f64,
    /// Where it would drain at other backrest angles without re-levelling
    /// (the chamber stays on its pole, the head moves with the bed).
    pub by_backrest: Vec<DrainPoint>,
    /// The finding in words.
    pub words: String,
}

/// A drain's opening pressure at one backrest angle.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct DrainPoint {
    /// Backrest angle, degrees.
    pub backrest_deg: f64,
    /// ICP at the tragus above which it drains, cmH2O.
    pub opens_above_cmh2o: f64,
}
