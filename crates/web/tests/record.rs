//! The record over time as the browser runs it (`wasm-bindgen-test`, in
//! headless Chromium): the reducer opens a file and gives the core's
//! exposure, a keystroke leaves the record alone until the pause, and an
//! eight-hour record at 1 Hz is imported, analysed and laid out in wasm.

#![cfg(target_arch = "wasm32")]
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::indexing_slicing)]

use std::rc::Rc;

use plumbline_core::record;
use plumbline_web::form::{Edit, Slot, TargetPart};
use plumbline_web::record::RecordAction;
use plumbline_web::state::{Action, State, Theme};
use wasm_bindgen_test::{wasm_bindgen_test, wasm_bindgen_test_configure};
use yew::Reducible;

wasm_bindgen_test_configure!(run_in_browser);

const RECORD: &str = include_str!("../../../examples/beach-chair-record.csv");

fn open(state: Rc<State>, name: &str, text: String) -> Rc<State> {
    state.reduce(Action::Record(RecordAction::Open {
        name: name.into(),
        text,
    }))
}

#[wasm_bindgen_test]
fn opening_a_file_gives_the_cores_exposure() {
    let state = Rc::new(State::demo(Theme::Device));
    let case = state.checked.as_ref().unwrap().case.clone();
    let state = open(state, "beach-chair-record.csv", RECORD.into());
    let analysis = state.record.analysis.clone().unwrap();
    let cli = record::Recorded::import(&case, RECORD, &Default::default()).unwrap();
    assert_eq!(analysis.exposure, cli.exposure());
    assert_eq!(analysis.trends.len(), 3);
    assert!(state.checked.as_ref().unwrap().case.timeline.is_none());
}

#[wasm_bindgen_test]
fn a_keystroke_leaves_the_record_alone_until_the_pause() {
    let state = open(
        Rc::new(State::demo(Theme::Device)),
        "beach-chair-record.csv",
        RECORD.into(),
    );
    let before = state.record.analysis.clone().unwrap();
    let slot = Slot::Target(0, TargetPart::Bound);
    let state = state.reduce(Action::Edit(Edit::Text(slot, "70".into())));
    let state = state.reduce(Action::Recheck);
    assert!(state.record.pending);
    assert!(Rc::ptr_eq(state.record.analysis.as_ref().unwrap(), &before));
    let state = state.reduce(Action::Record(RecordAction::Analyse));
    let after = state.record.analysis.clone().unwrap();
    assert!(!state.record.pending);
    assert_eq!(after.exposure.targets[0].threshold_mmhg, 70.0);
}

#[wasm_bindgen_test]
fn an_eight_hour_record_is_analysed_in_the_browser() {
    let mut text = String::from("elapsed_s,radial line.mean [mmHg],left arm cuff.mean [mmHg]\n");
    for t in 0..28_800u32 {
        let x = f64::from(t);
        let map = 72.0 + 9.0 * (x / 900.0).sin() + 2.0 * (x / 13.0).sin();
        let cuff = if t % 180 == 0 {
            format!("{:.0}", map + 20.0)
        } else {
            String::new()
        };
        text.push_str(&format!("{t},{map:.1},{cuff}\n"));
    }
    let state = open(Rc::new(State::demo(Theme::Device)), "eight-hours.csv", text);
    assert_eq!(state.record.samples(), 28_800 + 160);
    let analysis = state.record.analysis.clone().unwrap();
    let map = analysis
        .trends
        .iter()
        .find(|t| t.title == "Whole body · MAP at the heart")
        .unwrap();
    let points: usize = map.curve.iter().map(|d| d.matches('L').count() + 1).sum();
    assert!(points < 1300, "{points} points drawn");
}
