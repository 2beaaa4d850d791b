//! Tests that run in headless Chromium (`wasm-bindgen-test`): the reducer
//! as the browser runs it, and the whole app mounted on a page.

#![cfg(target_arch = "wasm32")]
#![allow(clippy::unwrap_used, clippy::expect_used)]

use std::rc::Rc;

use plumbline_web::form::{Edit, Slot, SourcePart};
use plumbline_web::state::{Action, State, Theme};
use wasm_bindgen::JsCast;
use wasm_bindgen_test::{wasm_bindgen_test, wasm_bindgen_test_configure};
use yew::Reducible;

wasm_bindgen_test_configure!(run_in_browser);

/// Lets the app's scheduler render: waits one short timer.
async fn settle() {
    let promise = js_sys::Promise::new(&mut |resolve, _| {
        web_sys::window()
            .unwrap()
            .set_timeout_with_callback_and_timeout_and_arguments_0(&resolve, 20)
            .unwrap();
    });
    js_sys::futures::JsFuture::from(promise).await.unwrap();
}

#[wasm_bindgen_test]
fn the_reducer_keeps_the_last_report_when_an_entry_is_bad() {
    let state = Rc::new(State::demo(Theme::Device));
    let good = state.checked.clone().unwrap();
    let slot = Slot::Source(0, SourcePart::Diastolic);
    // Typing waits for the pause; the app then sends Recheck.
    let state = state.reduce(Action::Edit(Edit::Text(slot, "fifty".into())));
    assert!(state.pending && !state.is_stale());
    let state = state.reduce(Action::Recheck);
    assert!(state.is_stale());
    assert_eq!(state.checked.as_ref().unwrap(), &good);
    assert_eq!(state.errors.for_field("arterial[0].diastolic").count(), 1);
    let state = state.reduce(Action::Edit(Edit::Text(slot, "58".into())));
    let state = state.reduce(Action::Recheck);
    assert!(!state.is_stale());
}

#[wasm_bindgen_test]
async fn the_app_mounts_with_the_demo_results() {
    let document = web_sys::window().unwrap().document().unwrap();
    let root = document.create_element("div").unwrap();
    document.body().unwrap().append_child(&root).unwrap();
    yew::Renderer::<plumbline_web::app::App>::with_root(root.clone()).render();
    // The answer is painted first; each organ in detail follows a frame later.
    for _ in 0..100 {
        settle().await;
        if root.query_selector(".results").unwrap().is_some() {
            break;
        }
    }
    assert!(root.query_selector("#h-verdicts").unwrap().is_some());

    let headings: Vec<String> = {
        let list = root.query_selector_all("h2, h3").unwrap();
        (0..list.length())
            .filter_map(|i| list.item(i))
            .filter_map(|n| n.text_content())
            .collect()
    };
    for wanted in [
        "At the organs' own height",
        "Brain",
        "Spinal cord",
        "Whole body",
    ] {
        assert!(
            headings.iter().any(|h| h == wanted),
            "{wanted} in {headings:?}"
        );
    }
    let caution = root.query_selector(".caution").unwrap().unwrap();
    assert!(caution
        .text_content()
        .unwrap()
        .contains(plumbline_core::report::CAUTION));

    // The quick path's blood pressure box (the separate boxes are folded
    // away, and built only when opened).
    let pressure: web_sys::HtmlInputElement = root
        .query_selector("#f-arterial-0-blood_pressure")
        .unwrap()
        .unwrap()
        .dyn_into()
        .unwrap();
    assert!(pressure.value().contains("(74)"), "{}", pressure.value());
    let live = root.query_selector("[aria-live]").unwrap().unwrap();
    let headline = plumbline_core::check::check_json(plumbline_core::demo::CASE_JSON)
        .unwrap()
        .summary
        .headline;
    assert_eq!(live.text_content().unwrap(), headline);
}
