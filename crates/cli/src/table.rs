//! The readable table: the core's report laid out for a terminal.
//!
//! Whole mmHg and tenths of a cm only: the ranges show why more digits
//! would be false precision.

use std::fmt::Write;

use plumbline_core::record::{elapsed_words, headline, Exposure};
use plumbline_core::report::{Report, Sweep};
use plumbline_core::target::Status;
use plumbline_core::text::{signed_cm, whole_mmhg as rounded};

/// A status as a bracketed mark for a terminal: the core's badge.
fn mark(status: Status) -> String {
    format!("[{}]", status.badge())
}

/// The report as text.
pub fn render(report: &Report) -> String {
    let mut out = String::new();
    // Writing to a String cannot fail; the results are ignored for that reason.
    let _ = write_report(&mut out, report);
    out
}

fn write_report(out: &mut String, r: &Report) -> std::fmt::Result {
    writeln!(out, "PLUMBLINE perfusion check")?;
    if let Some(position) = &r.position {
        writeln!(out, "Position: {position}")?;
    }
    writeln!(out)?;
    writeln!(out, "{} {}", mark(r.summary.status), r.summary.headline)?;
    for line in &r.summary.organs {
        writeln!(
            out,
            "  {} {}: {}",
            mark(line.status),
            line.label,
            line.words
        )?;
        if let Some(defend) = &line.defend {
            writeln!(out, "      defend {defend}")?;
        }
    }
    writeln!(out)?;

    writeln!(out, "Heights above the heart reference (cm)")?;
    for h in &r.heights {
        let why = h
            .largest_contributor
            .as_deref()
            .map_or(String::new(), |c| format!(", mostly {c}"));
        writeln!(
            out,
            "  {:<34} {:>6} ± {:<4.1} {}{why}",
            h.label,
            signed_cm(h.above_heart_cm),
            h.uncertainty_cm,
            h.provenance.label()
        )?;
    }
    writeln!(out)?;

    if !r.arterial.is_empty() {
        writeln!(out, "Arterial sources")?;
        for a in &r.arterial {
            let primary = if a.primary {
                " (drives the results)"
            } else {
                ""
            };
            let sd = match (a.systolic_mmhg, a.diastolic_mmhg) {
                (Some(s), Some(d)) => format!("{}/{} ", rounded(s), rounded(d)),
                _ => String::new(),
            };
            let mean = a
                .mean_mmhg
                .map_or(String::new(), |m| format!("mean {}", rounded(m)));
            let at_heart = a.mean_at_heart_mmhg.map_or(String::new(), |m| {
                format!(", mean at heart level {}", rounded(m))
            });
            writeln!(
                out,
                "  {}{primary}: {}, {}: {sd}{mean} mmHg{at_heart}",
                a.id,
                a.method.label(),
                a.level
            )?;
            if let Some(basis) = &a.mean_basis {
                writeln!(
                    out,
                    "      mean {basis}; accuracy ±{} mmHg",
                    rounded(a.accuracy_mmhg)
                )?;
            }
        }
        for c in &r.cross_checks {
            let mark = if c.agree { "[AGREE]" } else { "[CHECK]" };
            writeln!(out, "  {mark} {}", c.words)?;
        }
        writeln!(out)?;
    }

    for organ in &r.organs {
        writeln!(
            out,
            "{}: checked at the {} ({} cm) {}",
            organ.label,
            organ.level_label,
            signed_cm(organ.level_height_cm),
            mark(organ.verdict.status)
        )?;
        for m in &organ.metrics {
            let largest = m
                .largest_contributor
                .as_deref()
                .map_or(String::new(), |c| format!("; most from {c}"));
            let excluded = if m.assumed.is_empty() {
                String::new()
            } else {
                "; the assumed value's own error is not in the range".to_owned()
            };
            writeln!(
                out,
                "  {:<44} {:>4} mmHg  (range {} to {}{largest}{excluded})",
                m.label,
                rounded(m.value_mmhg),
                rounded(m.lower_mmhg),
                rounded(m.upper_mmhg)
            )?;
            if let Some(b) = &m.beside {
                writeln!(out, "      {}", b.words)?;
            }
            if let Some(g) = &m.grade {
                writeln!(out, "      {}", g.words)?;
            }
            for q in &m.assumed {
                writeln!(out, "      uses an ASSUMED {}", q.label())?;
            }
            for t in &m.targets {
                writeln!(out, "      {} {}: {}", mark(t.status), t.target, t.words)?;
                for need in &t.defend {
                    writeln!(out, "           to meet it now: {}", need.words)?;
                }
            }
        }
        for miss in &organ.missing {
            writeln!(out, "  {}: needs {}", miss.label, miss.needs.join("; "))?;
            for t in &miss.targets {
                writeln!(out, "      {} {t}", mark(Status::NotEvaluated))?;
            }
        }
        writeln!(out)?;
    }

    if !r.not_checked.is_empty() {
        writeln!(out, "Not checked")?;
        for n in &r.not_checked {
            writeln!(out, "  {}: needs {}", n.label, n.needs.join("; "))?;
        }
        writeln!(out)?;
    }

    if !r.sweeps.is_empty() {
        write_sweeps(out, &r.sweeps)?;
    }

    if let Some(site) = &r.venous_site {
        writeln!(out, "Operative site")?;
        let mark = if site.alarm { "! " } else { "" };
        writeln!(out, "  {mark}{}", site.words)?;
        writeln!(out)?;
    }
    if let Some(drain) = &r.drain {
        writeln!(out, "Ventricular drain")?;
        writeln!(out, "  {}", drain.words)?;
        writeln!(out)?;
    }

    if !r.warnings.is_empty() {
        writeln!(out, "Warnings")?;
        for w in &r.warnings {
            writeln!(out, "  ! {w}")?;
        }
        writeln!(out)?;
    }
    writeln!(out, "{}", r.caution)
}

/// Angles shown in the sweep table (the report has every 5°).
const SHOWN: [f64; 7] = [0.0, 15.0, 30.0, 45.0, 60.0, 75.0, 90.0];

fn write_sweeps(out: &mut String, sweeps: &[Sweep]) -> std::fmt::Result {
    writeln!(out, "Site reading needed by backrest angle (mmHg)")?;
    let names: Vec<String> = sweeps
        .iter()
        .map(|s| {
            let component = s.component.map_or("", |c| c.label());
            format!("{} ({}, {component})", s.target, s.site)
        })
        .collect();
    let width = names.iter().map(|n| n.chars().count()).max().unwrap_or(0) + 2;
    write!(out, "  {:<width$}", "target (site, component)")?;
    for deg in SHOWN {
        write!(out, "{:>6}", format!("{deg:.0}°"))?;
    }
    writeln!(out)?;
    for (s, name) in sweeps.iter().zip(&names) {
        write!(out, "  {name:<width$}")?;
        for deg in SHOWN {
            let point = s
                .points
                .iter()
                .find(|p| (p.backrest_deg - deg).abs() < 1e-9);
            let cell = point.map_or("-".to_owned(), |p| {
                let v = if s.at_least {
                    p.needed_mmhg.ceil()
                } else {
                    p.needed_mmhg.floor()
                };
                format!("{v:.0}")
            });
            write!(out, "{cell:>6}")?;
        }
        writeln!(out)?;
    }
    if let Some(first) = sweeps.first() {
        writeln!(out, "  ({})", first.note)?;
    }
    writeln!(out)
}

/// An exposure summary as text.
pub fn render_exposure(e: &Exposure) -> String {
    let mut out = String::new();
    let _ = write_exposure(&mut out, e);
    out
}

fn write_exposure(out: &mut String, e: &Exposure) -> std::fmt::Result {
    writeln!(out, "PLUMBLINE exposure over a record")?;
    let clock = e
        .clock_start
        .as_deref()
        .map_or(String::new(), |c| format!(", started at {c}"));
    writeln!(
        out,
        "Window: {} to {} elapsed{clock}",
        elapsed_words(e.from_s),
        elapsed_words(e.to_s)
    )?;
    writeln!(out, "Rules: {}", e.rules)?;
    writeln!(out, "Definitions: {}", e.definitions)?;
    writeln!(out)?;
    writeln!(out, "{}", headline(&e.targets))?;
    for t in &e.targets {
        writeln!(out, "  {} {}", mark(t.status), t.target)?;
        writeln!(out, "        {}", t.words)?;
    }
    for n in &e.not_analysed {
        writeln!(out, "  {} {}: {}", mark(n.status), n.target, n.why)?;
    }
    writeln!(out)?;
    writeln!(out, "{}", plumbline_core::report::CAUTION)
}
