//! A metric as a linear formula of its readings for a fixed position:
//! `lead − factor × max(back pressures)`, each term a reading times a scale
//! plus the fluid column between the reading's level and where it is
//! referred to. The formulas write it as they compute the value, so a long
//! record, a shifted reading or a site's needed value is found without
//! placing the body or writing the derivation again.

use crate::fluid::Fluid;
use crate::reading::{Component, Quantity};
use crate::units::Pressure;

/// An input reading a metric depends on.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Input {
    /// A component of an arterial source, by index.
    Arterial(usize, Component),
    /// A non-arterial reading.
    Reading(Quantity),
}

/// One input as it enters a metric: `scale × reading + offset`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Term {
    /// Which reading.
    pub input: Input,
    /// Its multiplier (2/3 in the population formula, else 1).
    pub scale: f64,
    /// The height correction added to it.
    pub offset: Pressure,
    /// The fluid the reading was carried through to where it is referred
    /// to; `None` when it is taken as read at its own zero, so moving its
    /// transducer does not change the metric.
    pub carried: Option<Fluid>,
}

impl Term {
    /// The term's value for a reading of `reading`.
    pub fn at(self, reading: Pressure) -> Pressure {
        reading * self.scale + self.offset
    }
}

/// A metric as a formula of its inputs, for one position.
#[derive(Clone, Debug, PartialEq)]
pub struct Linear {
    /// The term the others are taken from (the inflow, or the reading itself).
    pub lead: Term,
    /// The candidates for the back pressure; the highest is subtracted.
    pub subtract: Vec<Term>,
    /// How many times the back pressure is subtracted (2 for the filtration
    /// gradient).
    pub factor: f64,
}

impl Linear {
    /// A metric that is one term alone.
    pub fn single(lead: Term) -> Self {
        Linear {
            lead,
            subtract: Vec::new(),
            factor: 1.0,
        }
    }

    /// The metric for the given readings; `None` if a reading it needs is
    /// missing.
    pub fn eval(&self, reading: impl Fn(Input) -> Option<Pressure>) -> Option<Pressure> {
        self.eval_terms(|term| reading(term.input))
    }

    /// The metric with each term's reading chosen by the term itself, for
    /// a change that moves a reading differently depending on how it
    /// enters (a transducer moved up changes only a carried term).
    pub fn eval_terms(&self, reading: impl Fn(&Term) -> Option<Pressure>) -> Option<Pressure> {
        let lead = self.lead.at(reading(&self.lead)?);
        let mut back: Option<Pressure> = None;
        for term in &self.subtract {
            let v = term.at(reading(term)?);
            back = Some(match back {
                Some(b) if b >= v => b,
                _ => v,
            });
        }
        Some(match back {
            Some(b) => lead - b * self.factor,
            None => lead,
        })
    }

    /// Every term, the lead first.
    pub fn terms(&self) -> impl Iterator<Item = &Term> + '_ {
        std::iter::once(&self.lead).chain(self.subtract.iter())
    }

    /// Every input the metric reads.
    pub fn inputs(&self) -> impl Iterator<Item = Input> + '_ {
        self.terms().map(|t| t.input)
    }
}
