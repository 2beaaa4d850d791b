//! Errors and warnings, each naming the field it is about.
//!
//! One error type with a kind enum: the kind says what is wrong, the field
//! path (`arterial[1].mean`, `position.backrest_deg`) says where. A check
//! collects every problem it finds instead of stopping at the first, so a
//! form can mark all the bad fields at once.

use std::fmt;

use serde::Serialize;

/// One problem with the input, and the field it is in.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Error {
    field: String,
    kind: ErrorKind,
}

/// What is wrong with a field.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
#[non_exhaustive]
pub enum ErrorKind {
    /// The text is not JSON at all.
    Syntax {
        /// 1-based line of the problem.
        line: usize,
        /// 1-based column of the problem.
        column: usize,
        /// The parser's description.
        message: String,
    },
    /// The JSON does not have the shape of a case (a misspelt field, a
    /// number where text belongs, an unknown name).
    Shape {
        /// The reader's description.
        message: String,
    },
    /// The document names a format version this build does not read.
    UnsupportedVersion {
        /// The version found.
        found: u32,
        /// The newest version this build reads.
        supported: u32,
    },
    /// A number with a missing or wrong unit, or not a number at all.
    Quantity {
        /// Why the text is not a quantity.
        message: String,
    },
    /// A value outside the range a living human (or this model) allows.
    OutOfRange {
        /// The value as entered.
        value: String,
        /// The lowest accepted value, with its unit.
        min: String,
        /// The highest accepted value, with its unit.
        max: String,
        /// A likely explanation, e.g. a unit mix-up, when one fits.
        hint: Option<String>,
    },
    /// Values that contradict each other (diastolic above systolic).
    Inconsistent {
        /// What contradicts what.
        message: String,
    },
    /// Something the check needs is not there.
    Missing {
        /// What to add.
        message: String,
    },
    /// The same name used twice where names must be unique.
    Duplicate {
        /// The repeated name.
        name: String,
    },
    /// A reference to something that is not in the case.
    UnknownReference {
        /// The name that was not found.
        name: String,
    },
    /// A record channel that names no reading of the case.
    UnknownChannel {
        /// The channel as written.
        name: String,
        /// The channels the case offers, in words.
        offered: String,
    },
    /// A text too short or too long (a source's id, a target's source).
    Length {
        /// What the text is, in words.
        what: String,
        /// The fewest characters it may have.
        min: usize,
        /// The most.
        max: usize,
    },
    /// A clock time that cannot be read.
    ClockTime {
        /// The text as written.
        text: String,
    },
    /// A setting that does not apply to the chosen position or method.
    NotApplicable {
        /// Why it does not apply.
        message: String,
    },
    /// More of something than one input may hold (sources, samples,
    /// bytes): a cap on cost, far above bedside use (`limits`).
    OverLimit {
        /// How many were found.
        found: usize,
        /// Of what, plural: `arterial sources`.
        what: String,
        /// The most accepted.
        max: usize,
    },
}

impl Error {
    /// Where the problem is, as a path into the case document
    /// (`readings.icp.value`); empty for the document as a whole.
    pub fn field(&self) -> &str {
        &self.field
    }

    /// What is wrong.
    pub fn kind(&self) -> &ErrorKind {
        &self.kind
    }

    /// What is wrong, as one sentence without the field.
    pub fn message(&self) -> String {
        self.kind.to_string()
    }

    /// A new error about `field`.
    pub fn new(field: impl Into<String>, kind: ErrorKind) -> Self {
        Error {
            field: field.into(),
            kind,
        }
    }

    /// An error that something is missing.
    pub fn missing(field: impl Into<String>, message: impl Into<String>) -> Self {
        Error::new(
            field,
            ErrorKind::Missing {
                message: message.into(),
            },
        )
    }

    /// An error that values contradict each other.
    pub fn inconsistent(field: impl Into<String>, message: impl Into<String>) -> Self {
        Error::new(
            field,
            ErrorKind::Inconsistent {
                message: message.into(),
            },
        )
    }

    /// An error that a setting does not apply.
    pub fn not_applicable(field: impl Into<String>, message: impl Into<String>) -> Self {
        Error::new(
            field,
            ErrorKind::NotApplicable {
                message: message.into(),
            },
        )
    }
}

impl fmt::Display for ErrorKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ErrorKind::Syntax {
                line,
                column,
                message,
            } => write!(
                f,
                "not valid JSON at line {line}, column {column}: {message}"
            ),
            ErrorKind::Shape { message } => f.write_str(message),
            ErrorKind::UnsupportedVersion { found, supported } => write!(
                f,
                "format version {found} is not supported; this build reads version {supported}"
            ),
            ErrorKind::Quantity { message } => f.write_str(message),
            ErrorKind::OutOfRange {
                value,
                min,
                max,
                hint,
            } => {
                write!(f, "{value} is outside the accepted range {min} to {max}")?;
                if let Some(hint) = hint {
                    write!(f, " ({hint})")?;
                }
                Ok(())
            }
            ErrorKind::Inconsistent { message }
            | ErrorKind::Missing { message }
            | ErrorKind::NotApplicable { message } => f.write_str(message),
            ErrorKind::Duplicate { name } => write!(f, "the name '{name}' is used more than once"),
            ErrorKind::UnknownReference { name } => {
                write!(f, "'{name}' does not name anything in this case")
            }
            ErrorKind::UnknownChannel { name, offered } => {
                write!(f, "'{name}' is not a channel of this case; {offered}")
            }
            ErrorKind::Length { what, min, max } if *min <= 1 => {
                write!(f, "{what} of at most {max} characters is needed")
            }
            ErrorKind::Length { what, min, max } => {
                write!(f, "{what} of {min}-{max} characters is needed")
            }
            ErrorKind::ClockTime { text } => {
                write!(f, "'{text}' is not a clock time like 08:15:00")
            }
            ErrorKind::OverLimit { found, what, max } => {
                write!(f, "{found} {what}; at most {max} are accepted")
            }
        }
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.field.is_empty() {
            write!(f, "{}", self.kind)
        } else {
            write!(f, "{}: {}", self.field, self.kind)
        }
    }
}

impl std::error::Error for Error {}

/// Every problem found in one input, in the order of the document.
#[derive(Clone, Debug, Default, PartialEq, Serialize)]
#[serde(transparent)]
pub struct Errors(Vec<Error>);

impl Errors {
    /// Adds a problem.
    pub fn push(&mut self, error: Error) {
        self.0.push(error);
    }

    /// Adds every problem of `other`, in order.
    pub fn extend(&mut self, other: Errors) {
        self.0.extend(other.0);
    }

    /// How many problems were found.
    pub fn len(&self) -> usize {
        self.0.len()
    }

    /// The first problem, if any.
    pub fn first(&self) -> Option<&Error> {
        self.0.first()
    }

    /// Whether no problem was found.
    pub fn is_empty(&self) -> bool {
        self.0.is_empty()
    }

    /// The problems, in order.
    pub fn iter(&self) -> impl Iterator<Item = &Error> {
        self.0.iter()
    }

    /// The problems about one field, for showing beside it.
    pub fn for_field<'a>(&'a self, field: &'a str) -> impl Iterator<Item = &'a Error> + 'a {
        self.0.iter().filter(move |e| e.field == field)
    }

    /// `Ok(value)` when no problem was found, else the problems.
    pub fn into_result<T>(self, value: T) -> Result<T, Errors> {
        if self.is_empty() {
            Ok(value)
        } else {
            Err(self)
        }
    }
}

impl From<Error> for Errors {
    fn from(error: Error) -> Self {
        Errors(vec![error])
    }
}

impl FromIterator<Error> for Errors {
    fn from_iter<I: IntoIterator<Item = Error>>(iter: I) -> Self {
        Errors(iter.into_iter().collect())
    }
}

impl IntoIterator for Errors {
    type Item = Error;
    type IntoIter = std::vec::IntoIter<Error>;

    fn into_iter(self) -> Self::IntoIter {
        self.0.into_iter()
    }
}

impl fmt::Display for Errors {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, error) in self.0.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            write!(f, "{error}")?;
        }
        Ok(())
    }
}

impl std::error::Error for Errors {}

/// Something worth a second look that does not stop the check.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Warning {
    /// The field it is about; empty for the case as a whole.
    pub field: String,
    /// What to look at, in words.
    pub message: String,
}

impl Warning {
    /// A new warning about `field`.
    pub fn new(field: impl Into<String>, message: impl Into<String>) -> Self {
        Warning {
            field: field.into(),
            message: message.into(),
        }
    }
}

impl fmt::Display for Warning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.field.is_empty() {
            f.write_str(&self.message)
        } else {
            write!(f, "{}: {}", self.field, self.message)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn display_names_the_field_first() {
        let error = Error::new(
            "arterial[0].mean",
            ErrorKind::Inconsistent {
                message: "mean 130 mmHg is above systolic 120 mmHg".into(),
            },
        );
        assert_eq!(
            error.to_string(),
            "arterial[0].mean: mean 130 mmHg is above systolic 120 mmHg"
        );
    }

    #[test]
    fn errors_list_one_per_line() {
        let mut errors = Errors::default();
        errors.push(Error::missing("patient.height", "needed by the position"));
        errors.push(Error::new(
            "readings.icp.value",
            ErrorKind::OutOfRange {
                value: "300 mmHg".into(),
                min: "-20 mmHg".into(),
                max: "100 mmHg".into(),
                hint: None,
            },
        ));
        let text = errors.to_string();
        assert_eq!(text.lines().count(), 2);
        assert!(text.contains("readings.icp.value: 300 mmHg is outside"));
        assert_eq!(errors.for_field("patient.height").count(), 1);
    }
}
