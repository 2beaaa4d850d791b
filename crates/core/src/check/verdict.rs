//! The verdict of each organ and the summary over the organs of concern,
//! decided here once so that every front end shows the same thing.
//!
//! Silence is not safety: an organ whose targets could not be evaluated is
//! "not evaluated", with what it needs, never "met"; and the summary is met
//! only when every organ of concern is.

use crate::organ::{Metric, Organ};
use crate::reading::Quantity;
use crate::report::{
    MetricReport, MissingMetric, NotChecked, OrganLine, OrganReport, OrganVerdict, Summary,
    TargetReport,
};
use crate::scene::Scene;
use crate::target::Status;

/// The first part of a need, without its hint in parentheses: "CSF
/// pressure" of "CSF pressure (readings.csf, or an assumed value ...)".
fn short(need: &str) -> &str {
    need.split(" (").next().unwrap_or(need).trim()
}

/// Whether a metric's targets only advise: with a measured ICP, CPP and ICP
/// judge the brain and its own-level MAP targets are shown beside them.
fn advisory(organ: Organ, metric: Metric, metrics: &[MetricReport], scene: &Scene) -> bool {
    let measured_icp = scene
        .readings
        .get(&Quantity::Icp)
        .is_some_and(|r| !r.is_assumed());
    organ == Organ::Brain
        && metric == Metric::Inflow
        && measured_icp
        && metrics.iter().any(|m| {
            matches!(m.metric, Metric::Perfusion | Metric::Surrounding)
                && m.targets.iter().any(|t| t.status.is_judged())
        })
}

/// An organ's verdict from its computed metrics and those it could not
/// compute.
pub(super) fn organ_verdict(
    organ: Organ,
    metrics: &[MetricReport],
    missing: &[MissingMetric],
    scene: &Scene,
) -> OrganVerdict {
    let deciding: Vec<(&MetricReport, &TargetReport)> = metrics
        .iter()
        .filter(|m| !advisory(organ, m.metric, metrics, scene))
        .flat_map(|m| m.targets.iter().map(move |t| (m, t)))
        .collect();
    let judged: Vec<&(&MetricReport, &TargetReport)> = deciding
        .iter()
        .filter(|(_, t)| t.status.is_judged())
        .collect();
    let missed: Vec<&&(&MetricReport, &TargetReport)> = judged
        .iter()
        .filter(|(_, t)| t.status.is_missed())
        .collect();
    let mut not_evaluated: Vec<String> = metrics
        .iter()
        .flat_map(|m| m.targets.iter())
        .filter(|t| t.status == Status::NotEvaluated)
        .map(|t| format!("{}: {}", t.target, t.words))
        .collect();
    not_evaluated.extend(missing.iter().flat_map(|m| {
        m.targets.iter().map(move |t| {
            format!(
                "{t}: not evaluated: needs {}",
                m.needs
                    .iter()
                    .map(|n| short(n))
                    .collect::<Vec<_>>()
                    .join("; ")
            )
        })
    }));
    let deciding_one = missed.first().map(|x| **x).or(judged.first().copied());
    if let Some((m, t)) = deciding_one {
        let status = if missed.iter().any(|(_, t)| t.status == Status::Below) {
            Status::Below
        } else if missed.is_empty() {
            Status::Met
        } else {
            Status::Above
        };
        let value = format!("{} {}", m.label, m.display);
        let mut assumed: String = m
            .assumed
            .iter()
            .map(|q| format!("; uses an ASSUMED {}", q.label()))
            .collect();
        for (a, t) in metrics
            .iter()
            .filter(|a| advisory(organ, a.metric, metrics, scene))
            .flat_map(|a| a.targets.iter().map(move |t| (a, t)))
            .filter(|(_, t)| t.status.is_missed())
        {
            assumed.push_str(&format!(
                "; {} {} misses {} (advisory while ICP is measured)",
                a.label, a.display, t.target
            ));
        }
        return OrganVerdict {
            status,
            words: format!("{value}: {} ({}){assumed}", t.words, t.target),
            value: Some(value),
            defend: t.defend.first().cloned(),
            not_evaluated,
        };
    }
    let has_targets = scene.targets.iter().any(|t| t.organ == organ);
    let needs: Vec<&str> = {
        let mut needs: Vec<&str> = missing
            .iter()
            .filter(|m| !m.targets.is_empty())
            .flat_map(|m| m.needs.iter().map(|n| short(n)))
            .chain(
                metrics
                    .iter()
                    .flat_map(|m| m.targets.iter())
                    .filter_map(|t| t.words.strip_prefix("not evaluated: needs "))
                    .map(short),
            )
            .collect();
        needs.dedup();
        needs
    };
    let words = if !has_targets {
        "no target is set for it".to_owned()
    } else if needs.is_empty() {
        "no target could be evaluated".to_owned()
    } else {
        format!("no target could be evaluated: needs {}", needs.join("; "))
    };
    OrganVerdict {
        status: Status::NotEvaluated,
        words,
        value: metrics
            .first()
            .map(|m| format!("{} {}", m.label, m.display)),
        defend: None,
        not_evaluated,
    }
}

/// The verdict of an organ with nothing computed.
pub(super) fn not_checked_line(n: &NotChecked) -> OrganLine {
    let needs: Vec<&str> = n.needs.iter().map(|s| short(s)).collect();
    OrganLine {
        organ: n.organ,
        label: n.label,
        status: Status::NotEvaluated,
        words: format!("not evaluated: needs {}", needs.join("; ")),
        value: None,
        defend: None,
    }
}

/// The summary over the organs of concern: those the case names, else every
/// organ with a result.
pub(super) fn summary(
    organs: &[OrganReport],
    not_checked: &[NotChecked],
    scene: &Scene,
) -> Summary {
    let in_scope = |organ: Organ| scene.concern.is_empty() || scene.concern.contains(&organ);
    let mut lines: Vec<OrganLine> = Vec::new();
    for organ in Organ::ALL.into_iter().filter(|o| in_scope(*o)) {
        if let Some(o) = organs.iter().find(|o| o.organ == organ) {
            lines.push(OrganLine {
                organ,
                label: o.label,
                status: o.verdict.status,
                words: o.verdict.words.clone(),
                value: o.verdict.value.clone(),
                defend: o.verdict.defend.as_ref().map(|d| d.words.clone()),
            });
        } else if !scene.concern.is_empty() {
            if let Some(n) = not_checked.iter().find(|n| n.organ == organ) {
                lines.push(not_checked_line(n));
            }
        }
    }
    let missed_targets = organs
        .iter()
        .flat_map(|o| o.metrics.iter())
        .flat_map(|m| m.targets.iter())
        .filter(|t| t.status.is_missed())
        .count();
    let names = |status: Status| -> Vec<&str> {
        lines
            .iter()
            .filter(|l| l.status == status)
            .map(|l| l.label)
            .collect()
    };
    let (below, above, met) = (
        names(Status::Below),
        names(Status::Above),
        names(Status::Met),
    );
    let unjudged: Vec<String> = lines
        .iter()
        .filter(|l| !l.status.is_judged())
        .map(|l| match l.words.split_once("needs ") {
            Some((_, needs)) => format!("{} (needs {needs})", l.label),
            None => format!("{} ({})", l.label, l.words),
        })
        .collect();
    let status = if !below.is_empty() {
        Status::Below
    } else if !above.is_empty() {
        Status::Above
    } else if !unjudged.is_empty() || lines.is_empty() {
        Status::NotEvaluated
    } else {
        Status::Met
    };
    let mut parts = Vec::new();
    if !below.is_empty() {
        parts.push(format!("BELOW target: {}.", below.join(", ")));
    }
    if !above.is_empty() {
        parts.push(format!("ABOVE limit: {}.", above.join(", ")));
    }
    if !met.is_empty() {
        parts.push(format!("Met: {}.", met.join(", ")));
    }
    if !unjudged.is_empty() {
        parts.push(format!("Not evaluated: {}.", unjudged.join("; ")));
    }
    let headline = if lines.is_empty() {
        let needs: Vec<&str> = not_checked
            .iter()
            .flat_map(|n| n.needs.iter().map(|s| short(s)))
            .take(1)
            .collect();
        format!(
            "No organ could be judged: needs {}.",
            needs.first().copied().unwrap_or("more readings")
        )
    } else {
        parts.join(" ")
    };
    Summary {
        status,
        headline,
        missed_targets,
        organs: lines,
    }
}
