//! The record CSV reader's tests: layouts, times, units and every problem
//! named by line and column.

#![allow(clippy::unwrap_used, clippy::indexing_slicing)]
use super::*;
use crate::case::Case;

fn scene() -> Scene {
    Scene::from_case(&Case::from_json(crate::demo::CASE_JSON).unwrap()).unwrap()
}

fn fields_of(text: &str) -> Vec<String> {
    import(text, &scene())
        .unwrap_err()
        .iter()
        .map(|e| e.field().to_owned())
        .collect()
}

#[test]
fn wide_file_with_units_and_gaps() {
    let text = "# from a monitor\nelapsed_s,radial line.mean [mmHg],icp [cmH2O]\n0,74,14\n1,73,\n2,,13.5\n";
    let spec = import(text, &scene()).unwrap();
    assert_eq!(spec.channels.len(), 2);
    assert_eq!(spec.channels[0].t_s, vec![0.0, 1.0]);
    assert_eq!(spec.channels[1].unit, PressureUnit::CmH2O);
    assert_eq!(spec.channels[1].values, vec![14.0, 13.5]);
}

#[test]
fn long_file_with_clock_times_crossing_midnight() {
    let text = "time,channel,value\n23:59:30,radial line.mean,74 mmHg\n00:00:30,radial line.mean,70 mmHg\n";
    let spec = import(text, &scene()).unwrap();
    assert_eq!(spec.channels[0].t_s, vec![0.0, 60.0]);
    assert_eq!(spec.clock_start.as_deref(), Some("23:59:30"));
}

#[test]
fn semicolons_take_decimal_commas() {
    let text = "elapsed_s;radial line.mean [mmHg]\n0;74,5\n";
    let spec = import(text, &scene()).unwrap();
    assert_eq!(spec.channels[0].values, vec![74.5]);
}

#[test]
fn every_problem_has_its_line_and_column() {
    let text = "elapsed_s,radial line.mean [mmHg],femoral.mean [mmHg],cvp\n\
                0,74,1\n\
                x,70\n\
                1,700\n\
                1,70\n";
    let fields = fields_of(text);
    assert!(
        fields.contains(&"line 1, column 3".to_owned()),
        "{fields:?}"
    );
    assert!(
        fields.contains(&"line 1, column 4".to_owned()),
        "{fields:?}"
    );
    assert!(fields.contains(&"line 3".to_owned()), "{fields:?}");
    assert!(fields.contains(&"line 4".to_owned()), "{fields:?}");
}

#[test]
fn values_out_of_range_and_backward_times() {
    let text = "elapsed_s,radial line.mean [mmHg]\n0,74\n5,700\n3,70\n";
    let fields = fields_of(text);
    assert_eq!(fields, vec!["line 3, column 2", "line 4, column 1"]);
}

#[test]
fn samples_a_nanosecond_apart_are_one_time() {
    let text = "elapsed_s,radial line.mean [mmHg],icp [mmHg]\n1,70,\n1.0000000001,71,9\n";
    let errors = import(text, &scene()).unwrap_err().to_string();
    assert_eq!(
        errors,
        "line 3, column 1: a second radial line.mean sample at the same time"
    );
    let text =
        "time,channel,value\n00:00:01,icp,9 mmHg\n00:00:03,icp,8 mmHg\n00:00:01,icp,7 mmHg\n";
    let errors = import(text, &scene()).unwrap_err().to_string();
    assert_eq!(
        errors,
        "line 4, column 1: a second icp sample at the same time"
    );
}

#[test]
fn export_reads_back() {
    let text = "elapsed_s,radial line.mean [mmHg],left arm cuff.mean [mmHg]\n0,74,\n1,73,79\n";
    let spec = import(text, &scene()).unwrap();
    let again = import(&export(&spec), &scene()).unwrap();
    assert_eq!(spec, again);
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig::with_cases(3000))]

    /// The quick number reader gives the standard reader's f64, bit
    /// for bit, or refuses what it refuses.
    #[test]
    fn numbers_read_as_the_standard_reader_reads_them(
        text in "-?[0-9]{0,18}(\\.[0-9]{0,18})?|[-+0-9.eE ,x]{0,12}|(-?[0-9]{1,8}\\.[0-9]{1,8})",
    ) {
        let quick = parse_f64(&text).map(f64::to_bits);
        let standard = text.parse::<f64>().ok().map(f64::to_bits);
        proptest::prop_assert_eq!(quick, standard, "{:?}", text);
    }

    /// Any text is read or refused with messages, never a panic.
    #[test]
    fn any_text_imports_or_errs(text in "(?s).{0,600}") {
        if let Err(errors) = import(&text, &scene()) {
            proptest::prop_assert!(errors.iter().all(|e| !e.to_string().is_empty()));
        }
    }

    /// A valid file with bytes changed anywhere never panics either.
    #[test]
    fn mutated_files_never_panic(
        edits in proptest::collection::vec((0usize..400, proptest::prelude::any::<char>()), 1..12)
    ) {
        let mut chars: Vec<char> = "time,channel,value\n08:00:00,radial line.mean,74 mmHg\n\
             08:00:01,radial line.mean,73,5 mmHg\n23:59:59,icp,14 cmH2O\n\
             2026-03-04T08:00:00Z,left arm cuff.systolic,120 mmHg\n"
            .chars()
            .collect();
        for (at, c) in edits {
            let len = chars.len();
            if let Some(x) = chars.get_mut(at % len) {
                *x = c;
            }
        }
        let text: String = chars.into_iter().collect();
        let _ = import(&text, &scene());
        let wide = text.replace("time,channel,value", "elapsed_s,radial line.mean [mmHg]");
        let _ = import(&wide, &scene());
    }
}

#[test]
fn caps_are_met_before_a_line_is_split() {
    let long = format!("0,{}\n", "7".repeat(MAX_CSV_LINE_BYTES));
    let text = format!("elapsed_s,radial line.mean [mmHg]\n{long}");
    assert_eq!(
        import(&text, &scene()).unwrap_err().to_string(),
        "line 2: 65538 bytes in one line; at most 65536 are accepted"
    );
    let header = format!("elapsed_s{}\n0\n", ",x".repeat(MAX_CSV_COLUMNS));
    assert_eq!(
        import(&header, &scene()).unwrap_err().to_string(),
        "line 1: 258 columns; at most 257 are accepted"
    );
    let big = " ".repeat(limits::MAX_DOCUMENT_BYTES + 1);
    assert_eq!(
        import(&big, &scene()).unwrap_err().to_string(),
        "16777217 bytes; at most 16777216 are accepted"
    );
}

#[test]
fn empty_and_headless_files() {
    assert!(import("", &scene()).is_err());
    assert!(import("# only a comment\n", &scene()).is_err());
    assert!(import("elapsed_s,radial line.mean [mmHg]\n", &scene()).is_err());
    assert!(import("when,radial line.mean [mmHg]\n0,1\n", &scene()).is_err());
}

#[test]
fn a_long_wide_file_reads_whole_past_the_columns_given_room() {
    // Past RESERVE_AFTER_ROWS the columns get room at the rate they filled;
    // the cuff fills more sparsely later on, and the lines grow longer, so
    // the estimate is wrong both ways and nothing may be lost for it.
    let rows = 3 * RESERVE_AFTER_ROWS;
    let mut text = String::from("elapsed_s,radial line.mean [mmHg],icp [cmH2O]\n");
    let (mut line_times, mut icp_times) = (Vec::new(), Vec::new());
    for i in 0..rows {
        let t = i as f64 * 0.5;
        let icp = if i < RESERVE_AFTER_ROWS || i % 9 == 0 {
            icp_times.push(t);
            "12.25"
        } else {
            ""
        };
        let mean = if i < RESERVE_AFTER_ROWS {
            "74"
        } else {
            "74.0625"
        };
        line_times.push(t);
        text.push_str(&format!("{t},{mean},{icp}\n"));
    }
    let spec = import(&text, &scene()).unwrap();
    assert_eq!(spec.channels[0].t_s, line_times);
    assert_eq!(spec.channels[1].t_s, icp_times);
    assert_eq!(spec.channels[0].values.last(), Some(&74.0625));
    for c in &spec.channels {
        assert_eq!(c.t_s.len(), c.values.len());
        assert_eq!(c.t_s.capacity(), c.t_s.len(), "room not used is given back");
    }
}
