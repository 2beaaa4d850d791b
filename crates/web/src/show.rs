//! How the core's numbers and names are written on screen: the core's own
//! display rounding, short names where space is tight, and ids for boxes.

use plumbline_core::target::Status;

pub use plumbline_core::text::{signed_cm, signed_whole_cm, whole_mmhg as rounded};

/// A core label without its parenthesis or qualifier: "tragus (ear level)"
/// becomes "tragus", "iliac crest, mid-axillary line" becomes "iliac crest".
pub fn short(label: &str) -> &str {
    label
        .split([',', '('])
        .next()
        .map(str::trim_end)
        .unwrap_or(label)
}

/// The CSS class that gives a status its shape and colour.
pub fn status_class(status: Status) -> &'static str {
    match status {
        Status::Met => "status-meets",
        Status::Below => "status-below",
        Status::Above => "status-above",
        Status::NotObserved | Status::NotEvaluated => "status-none",
    }
}

/// An id for an element from a document path: `arterial[0].systolic`
/// becomes `f-arterial-0-systolic`.
pub fn dom_id(path: &str) -> String {
    let mut id = String::from("f-");
    let mut last_dash = true;
    for c in path.chars() {
        if c.is_ascii_alphanumeric() || c == '_' {
            id.push(c);
            last_dash = false;
        } else if !last_dash {
            id.push('-');
            last_dash = true;
        }
    }
    id.trim_end_matches('-').to_owned()
}

/// A document path in words for a problem list: `arterial[0].systolic`
/// becomes "arterial source 1 · systolic", `assume.icp.value` "assumed · ICP · value".
pub fn path_words(path: &str) -> String {
    use plumbline_core::reading::Quantity;
    path.split('.')
        .filter(|p| !p.is_empty())
        .map(|part| {
            let (name, index) = match part.split_once('[') {
                Some((name, rest)) => (name, rest.trim_end_matches(']').parse::<usize>().ok()),
                None => (part, None),
            };
            let name = match name {
                "arterial" => "arterial source",
                "targets" => "target",
                "assume" => "assumed",
                other => Quantity::ALL
                    .into_iter()
                    .find(|q| q.key() == other)
                    .map_or(other, |q| q.label()),
            };
            let name = name.trim_end_matches("_deg").replace('_', " ");
            match index {
                Some(i) => format!("{name} {}", i + 1),
                None => name,
            }
        })
        .collect::<Vec<_>>()
        .join(" · ")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_read_as_words() {
        assert_eq!(
            path_words("arterial[0].systolic"),
            "arterial source 1 · systolic"
        );
        assert_eq!(path_words("readings.icp.value"), "readings · ICP · value");
        assert_eq!(path_words("position.backrest_deg"), "position · backrest");
        assert_eq!(path_words("targets[2].at_least"), "target 3 · at least");
        assert_eq!(path_words(""), "");
    }

    #[test]
    fn short_names_drop_the_qualifier() {
        assert_eq!(short("tragus (ear level)"), "tragus");
        assert_eq!(short("iliac crest, mid-axillary line"), "iliac crest");
        assert_eq!(short("left calf"), "left calf");
    }

    #[test]
    fn ids_are_safe_for_the_dom() {
        assert_eq!(dom_id("arterial[0].systolic"), "f-arterial-0-systolic");
        assert_eq!(
            dom_id("readings.icp.level.height"),
            "f-readings-icp-level-height"
        );
    }
}
