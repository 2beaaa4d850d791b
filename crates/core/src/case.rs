//! The case document: a versioned JSON description of one check.
//!
//! The document holds what the clinician entered, in the units they entered
//! it, and nothing that identifies a patient. It is read in two steps: first
//! the format name and version, so a newer document gets a clear "version"
//! message rather than a list of unknown fields; then the whole shape, with
//! every problem reported at its path. `docs/case-format.md` describes it.

use std::collections::BTreeMap;

use serde::{Deserialize, Deserializer, Serialize, Serializer};

use crate::error::{Error, ErrorKind, Errors};
use crate::geometry::{PositionSpec, Segment};
use crate::landmark::Landmark;
use crate::limits;
use crate::organ::Organ;
use crate::reading::{Level, MeanRule, Method, Quantity};
use crate::target::TargetSpec;
use crate::units::{DensityEntry, LengthEntry, PressureEntry, PressureUnit};

/// The value of the document's `format` field.
pub const FORMAT: &str = "plumbline-case";
/// The newest document version this build reads and writes.
pub const VERSION: u32 = 1;
/// The largest document accepted, in bytes (`limits::MAX_DOCUMENT_BYTES`).
pub const MAX_BYTES: usize = crate::limits::MAX_DOCUMENT_BYTES;

/// One check, as written by the clinician.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Case {
    /// Always `"plumbline-case"`.
    pub format: String,
    /// The document version, currently 1.
    pub version: u32,
    /// The patient's size, used by the geometry.
    #[serde(default, skip_serializing_if = "PatientSpec::is_empty")]
    pub patient: PatientSpec,
    /// The position, from which landmark heights are estimated.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub position: Option<PositionSpec>,
    /// Segment lengths measured on the patient.
    #[serde(default, skip_serializing_if = "BTreeMap::is_empty")]
    pub segments: BTreeMap<Segment, LengthEntry>,
    /// Landmark heights measured above the heart reference; they win over
    /// the position's estimates.
    #[serde(default, skip_serializing_if = "BTreeMap::is_empty")]
    pub heights: BTreeMap<Landmark, HeightSpec>,
    /// Fluid densities to use instead of the published defaults.
    #[serde(default, skip_serializing_if = "DensitySpec::is_empty")]
    pub densities: DensitySpec,
    /// How a mean is estimated from systolic and diastolic.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mean_rule: Option<MeanRule>,
    /// Arterial pressure sources (lines and cuffs).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub arterial: Vec<ArterialSpec>,
    /// The `id` of the arterial source that drives the organ results; the
    /// first invasive source, else the first, when left out.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub primary_arterial: Option<String>,
    /// The other pressures, one of each at most.
    #[serde(default, skip_serializing_if = "BTreeMap::is_empty")]
    pub readings: BTreeMap<Quantity, ReadingSpec>,
    /// Values assumed where nothing was measured (an assumed ICP). Used only
    /// when the reading is absent, and flagged in every result that uses them.
    #[serde(default, skip_serializing_if = "BTreeMap::is_empty")]
    pub assume: BTreeMap<Quantity, AssumedSpec>,
    /// The organs of concern: the summary judges these. Every organ with a
    /// result when left out.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub concern: Vec<Organ>,
    /// The landmark an organ is checked at, for organs with a choice.
    #[serde(default, skip_serializing_if = "BTreeMap::is_empty")]
    pub organ_levels: BTreeMap<Organ, Landmark>,
    /// The targets; the defaults when left out.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub targets: Option<Vec<TargetSpec>>,
    /// The operative site, for the venous pressure there (air entrainment
    /// when it is below atmospheric); the vertex in a seated position when
    /// left out.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub operative_site: Option<Landmark>,
    /// An external ventricular drain and where its chamber is set.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub ventricular_drain: Option<DrainSpec>,
    /// The patient's baseline arterial pressure, for relative targets.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub baseline: Option<BaselineSpec>,
    /// Readings and position changes over time, for exposure analysis.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub timeline: Option<TimelineSpec>,
}

/// A record over time: samples per channel and position changes. Times are
/// seconds from the start of the record; no date is kept.
#[derive(Clone, Debug, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TimelineSpec {
    /// Clock time of the record's start, `"HH:MM:SS"`, for showing clock
    /// times; optional.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub clock_start: Option<String>,
    /// How gaps and short episodes are treated.
    #[serde(default, skip_serializing_if = "RulesSpec::is_empty")]
    pub rules: RulesSpec,
    /// Position changes after the start; the case's `position` holds from 0.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub positions: Vec<PositionChangeSpec>,
    /// Samples, one entry per channel.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub channels: Vec<ChannelSpec>,
}

/// Exposure rules; each left out takes its default.
#[derive(Clone, Debug, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RulesSpec {
    /// How long an intermittent reading (a cuff) is held, seconds.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub hold_max_s: Option<f64>,
    /// The longest gap continuous samples are interpolated across, seconds.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub gap_max_s: Option<f64>,
    /// Episodes outside a target shorter than this are ignored, seconds.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub min_episode_s: Option<f64>,
}

impl RulesSpec {
    fn is_empty(&self) -> bool {
        self.hold_max_s.is_none() && self.gap_max_s.is_none() && self.min_episode_s.is_none()
    }
}

/// A position change in a record.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PositionChangeSpec {
    /// When, seconds from the start.
    pub at_s: f64,
    /// The new position.
    pub position: PositionSpec,
}

/// The samples of one channel: `"radial line.mean"` (an arterial source's
/// id and component) or a reading's name (`"icp"`).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ChannelSpec {
    /// Which reading.
    pub channel: String,
    /// The unit of `values`.
    pub unit: PressureUnit,
    /// Sample times, seconds from the start, increasing.
    pub t_s: Vec<f64>,
    /// Sample values, one per time.
    pub values: Vec<f64>,
}

/// The patient's size.
#[derive(Clone, Debug, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PatientSpec {
    /// Standing body height.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub height: Option<LengthEntry>,
    /// Haematocrit in percent, to adjust blood density.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub haematocrit_percent: Option<f64>,
}

impl PatientSpec {
    fn is_empty(&self) -> bool {
        self.height.is_none() && self.haematocrit_percent.is_none()
    }
}

/// A measured landmark height: `"24 cm"`, or with its uncertainty
/// `{"height": "24 cm", "uncertainty": "2 cm"}`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct HeightSpec {
    /// Height above the heart reference point, positive up.
    pub height: LengthEntry,
    /// How far the measurement may be off; 1 cm when left out.
    pub uncertainty: Option<LengthEntry>,
}

#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct HeightDetail {
    height: LengthEntry,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    uncertainty: Option<LengthEntry>,
}

impl Serialize for HeightSpec {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        match self.uncertainty {
            None => self.height.serialize(serializer),
            Some(u) => HeightDetail {
                height: self.height,
                uncertainty: Some(u),
            }
            .serialize(serializer),
        }
    }
}

impl<'de> Deserialize<'de> for HeightSpec {
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        use serde::de::Error as _;
        match serde_json::Value::deserialize(deserializer)? {
            serde_json::Value::String(text) => text
                .parse()
                .map(|height| HeightSpec {
                    height,
                    uncertainty: None,
                })
                .map_err(D::Error::custom),
            value @ serde_json::Value::Object(_) => serde_json::from_value::<HeightDetail>(value)
                .map(|d| HeightSpec {
                    height: d.height,
                    uncertainty: d.uncertainty,
                })
                .map_err(D::Error::custom),
            _ => Err(D::Error::custom(
                "a height is \"24 cm\" or {\"height\": \"24 cm\", \"uncertainty\": \"2 cm\"}",
            )),
        }
    }
}

/// Density overrides.
#[derive(Clone, Debug, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DensitySpec {
    /// Whole blood (overrides the haematocrit estimate too).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub blood: Option<DensityEntry>,
    /// CSF.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub csf: Option<DensityEntry>,
    /// Saline.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub saline: Option<DensityEntry>,
}

impl DensitySpec {
    fn is_empty(&self) -> bool {
        self.blood.is_none() && self.csf.is_none() && self.saline.is_none()
    }
}

/// An arterial pressure source: a line or a cuff.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ArterialSpec {
    /// A short name of our choosing ("radial line", "left arm cuff"); never a
    /// patient's name. At most 40 characters.
    pub id: String,
    /// How it is measured.
    pub method: Method,
    /// The level the reading refers to: the cuff's landmark, or where the
    /// transducer is now.
    pub level: Level,
    /// Systolic pressure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub systolic: Option<PressureEntry>,
    /// Diastolic pressure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub diastolic: Option<PressureEntry>,
    /// Mean pressure as shown by the device.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mean: Option<PressureEntry>,
    /// Accuracy (half-width) instead of the method's default.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub accuracy: Option<PressureEntry>,
}

/// A pressure reading other than arterial.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ReadingSpec {
    /// The value as read.
    pub value: PressureEntry,
    /// How it is measured.
    pub method: Method,
    /// The level it refers to (for IOP and compartment pressure: where it
    /// was taken).
    pub level: Level,
    /// Accuracy (half-width) instead of the method's default.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub accuracy: Option<PressureEntry>,
}

/// An assumed value and the level it is assumed at.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AssumedSpec {
    /// The value assumed.
    pub value: PressureEntry,
    /// The level it is assumed at; the quantity's usual reference when left
    /// out (the tragus for ICP, the heart for CVP).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub level: Option<Level>,
}

/// An external ventricular drain: the drip chamber's height above the
/// tragus as set on its scale, and whether it is open.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DrainSpec {
    /// The chamber's height above the tragus as marked on the drain's
    /// scale, in the current position (`"15 cmH2O"`).
    pub set_at: PressureEntry,
    /// Whether the drain is open to drainage; clamped when false.
    #[serde(default = "open_by_default", skip_serializing_if = "is_open")]
    pub open: bool,
}

fn open_by_default() -> bool {
    true
}

fn is_open(open: &bool) -> bool {
    *open
}

/// The patient's baseline arterial pressure, and where it was taken.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct BaselineSpec {
    /// How it was measured.
    pub method: Method,
    /// The level it refers to.
    pub level: Level,
    /// The position the patient was in.
    pub position: PositionSpec,
    /// Systolic pressure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub systolic: Option<PressureEntry>,
    /// Diastolic pressure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub diastolic: Option<PressureEntry>,
    /// Mean pressure.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mean: Option<PressureEntry>,
}

impl Case {
    /// An empty case of the current version.
    pub fn new() -> Self {
        Case {
            format: FORMAT.to_owned(),
            version: VERSION,
            patient: PatientSpec::default(),
            position: None,
            segments: BTreeMap::new(),
            heights: BTreeMap::new(),
            densities: DensitySpec::default(),
            mean_rule: None,
            arterial: Vec::new(),
            primary_arterial: None,
            readings: BTreeMap::new(),
            assume: BTreeMap::new(),
            concern: Vec::new(),
            operative_site: None,
            ventricular_drain: None,
            organ_levels: BTreeMap::new(),
            targets: None,
            baseline: None,
            timeline: None,
        }
    }

    /// Reads a case from JSON text.
    ///
    /// # Errors
    /// Text that is not JSON (with line and column), a document of another
    /// format or a newer version, a shape problem named by its path
    /// (`arterial[0].systolic: '80' has no unit ...`), or a cap on cost met
    /// (`limits`: bytes and nesting first, then counts and texts).
    ///
    /// # Example
    /// ```
    /// use plumbline_core::case::Case;
    /// let ok = Case::from_json(r#"{"format": "plumbline-case", "version": 1}"#);
    /// assert!(ok.is_ok());
    /// let bad = Case::from_json(r#"{"format": "plumbline-case", "version": 1, "arterial": 3}"#);
    /// assert!(bad.unwrap_err().to_string().starts_with("arterial"));
    /// ```
    pub fn from_json(text: &str) -> Result<Case, Errors> {
        limits::check_bytes("", text.len())?;
        limits::check_nesting(text)?;
        let value: serde_json::Value = serde_json::from_str(text).map_err(|e| {
            Error::new(
                "",
                ErrorKind::Syntax {
                    line: e.line(),
                    column: e.column(),
                    message: e.to_string(),
                },
            )
        })?;
        Case::from_value(value)
    }

    /// Reads a case from a JSON value (as the JavaScript face receives it).
    ///
    /// # Errors
    /// As [`Case::from_json`], without the syntax, byte and nesting steps.
    pub fn from_value(value: serde_json::Value) -> Result<Case, Errors> {
        check_header(&value)?;
        let case: Case = serde_path_to_error::deserialize(value).map_err(|e| {
            let path = e.path().to_string();
            let field = if path == "." { String::new() } else { path };
            Errors::from(Error::new(
                field,
                ErrorKind::Shape {
                    message: e.into_inner().to_string(),
                },
            ))
        })?;
        limits::check_case(&case)?;
        Ok(case)
    }

    /// A copy without its record over time, made without copying the record.
    pub fn without_timeline(&self) -> Case {
        Case {
            format: self.format.clone(),
            version: self.version,
            patient: self.patient.clone(),
            position: self.position.clone(),
            segments: self.segments.clone(),
            heights: self.heights.clone(),
            densities: self.densities.clone(),
            mean_rule: self.mean_rule,
            arterial: self.arterial.clone(),
            primary_arterial: self.primary_arterial.clone(),
            readings: self.readings.clone(),
            assume: self.assume.clone(),
            concern: self.concern.clone(),
            operative_site: self.operative_site,
            ventricular_drain: self.ventricular_drain.clone(),
            organ_levels: self.organ_levels.clone(),
            targets: self.targets.clone(),
            baseline: self.baseline.clone(),
            timeline: None,
        }
    }

    /// The case as pretty JSON.
    pub fn to_json(&self) -> String {
        serde_json::to_string_pretty(self).unwrap_or_default()
    }
}

impl Default for Case {
    fn default() -> Self {
        Case::new()
    }
}

fn check_header(value: &serde_json::Value) -> Result<(), Error> {
    let shape = |field: &str, message: &str| {
        Error::new(
            field,
            ErrorKind::Shape {
                message: message.to_owned(),
            },
        )
    };
    let object = value
        .as_object()
        .ok_or_else(|| shape("", "a case is a JSON object { ... }"))?;
    match object.get("format").and_then(|f| f.as_str()) {
        Some(FORMAT) => {}
        Some(other) => {
            return Err(shape(
                "format",
                &format!("'{other}' is not a Plumbline case; expected \"{FORMAT}\""),
            ))
        }
        None => {
            return Err(shape(
                "format",
                &format!("missing; a case starts with \"format\": \"{FORMAT}\""),
            ))
        }
    }
    match object.get("version").and_then(|v| v.as_u64()) {
        Some(v) if v >= 1 && v <= u64::from(VERSION) => Ok(()),
        Some(v) => Err(Error::new(
            "version",
            ErrorKind::UnsupportedVersion {
                found: u32::try_from(v).unwrap_or(u32::MAX),
                supported: VERSION,
            },
        )),
        None => Err(shape(
            "version",
            &format!("missing or not a whole number; this build writes version {VERSION}"),
        )),
    }
}

#[cfg(test)]
mod tests {
    #![allow(clippy::unwrap_used)]
    use super::*;

    fn field_of(text: &str) -> String {
        let errors = Case::from_json(text).unwrap_err();
        let field = errors.iter().next().unwrap().field().to_owned();
        field
    }

    #[test]
    fn syntax_errors_carry_line_and_column() {
        let errors = Case::from_json("{\n  \"format\": ").unwrap_err();
        let first = errors.iter().next().unwrap();
        assert!(matches!(first.kind(), ErrorKind::Syntax { line: 2, .. }));
    }

    #[test]
    fn header_is_checked_first() {
        assert_eq!(field_of(r#"{"version": 1}"#), "format");
        assert_eq!(field_of(r#"{"format": "other", "version": 1}"#), "format");
        assert_eq!(field_of(r#"{"format": "plumbline-case"}"#), "version");
        let errors = Case::from_json(r#"{"format": "plumbline-case", "version": 9}"#).unwrap_err();
        assert!(matches!(
            errors.iter().next().unwrap().kind(),
            ErrorKind::UnsupportedVersion { found: 9, .. }
        ));
        assert_eq!(field_of("[]"), "");
    }

    #[test]
    fn shape_errors_name_the_path() {
        let text = r#"{"format": "plumbline-case", "version": 1,
            "arterial": [{"id": "a", "method": "cuff", "level": "heart", "systolic": "120"}]}"#;
        assert_eq!(field_of(text), "arterial[0].systolic");
        let text = r#"{"format": "plumbline-case", "version": 1,
            "readings": {"icp": {"value": "12 mmHg", "method": "probe", "levle": "tragus"}}}"#;
        assert_eq!(field_of(text), "readings.icp.levle");
        let text = r#"{"format": "plumbline-case", "version": 1, "heights": {"elbow": "3 cm"}}"#;
        assert_eq!(field_of(text), "heights.elbow");
    }

    #[test]
    fn heights_take_a_plain_or_detailed_form() {
        let text = r#"{"format": "plumbline-case", "version": 1,
            "heights": {"tragus": "28 cm", "upper_arm_left": {"height": "-20 cm", "uncertainty": "3 cm"}}}"#;
        let case = Case::from_json(text).unwrap();
        assert_eq!(case.heights.len(), 2);
        let back = Case::from_json(&case.to_json()).unwrap();
        assert_eq!(back, case);
    }

    #[test]
    fn oversized_documents_are_refused() {
        let text = " ".repeat(MAX_BYTES + 1);
        assert_eq!(
            Case::from_json(&text).unwrap_err().to_string(),
            "16777217 bytes; at most 16777216 are accepted"
        );
    }

    #[test]
    fn deep_nesting_is_refused_before_parsing() {
        // Deeper than serde_json's own limit (128), which would say
        // "recursion limit exceeded" as a syntax error.
        let text = format!(
            r#"{{"format": "plumbline-case", "version": 1, "patient": {}{}}}"#,
            "[".repeat(200),
            "]".repeat(200)
        );
        assert_eq!(
            Case::from_json(&text).unwrap_err().to_string(),
            "201 levels of nesting; at most 32 are accepted"
        );
    }

    #[test]
    fn caps_are_checked_once_the_shape_is_read() {
        let source = r#"{"id": "a", "method": "cuff", "level": "heart", "mean": "70 mmHg"}"#;
        let text = format!(
            r#"{{"format": "plumbline-case", "version": 1, "arterial": [{}]}}"#,
            vec![source; 130].join(", ")
        );
        assert_eq!(
            Case::from_json(&text).unwrap_err().to_string(),
            "arterial: 130 arterial sources; at most 64 are accepted"
        );
    }
}
