//! The device's copy in headless Chromium's real local storage: a rescued
//! text is kept before the key it came from is written over, a discarded
//! one goes, and another window's save is never written over unasked
//! (this window's check is held back under keys of its own meanwhile).

#![cfg(target_arch = "wasm32")]
#![allow(clippy::unwrap_used, clippy::indexing_slicing)]

use std::rc::Rc;

use plumbline_web::form::{Edit, Slot, SourcePart};
use plumbline_web::persist::{self, Elsewhere, Persisted};
use plumbline_web::session::SessionAction;
use plumbline_web::state::{Action, State};
use plumbline_web::storage::{KEPT_KEY, STATE_KEY};
use wasm_bindgen_test::{wasm_bindgen_test, wasm_bindgen_test_configure};
use yew::Reducible;

wasm_bindgen_test_configure!(run_in_browser);

fn storage() -> web_sys::Storage {
    web_sys::window().unwrap().local_storage().unwrap().unwrap()
}

fn get(key: &str) -> Option<String> {
    storage().get_item(key).unwrap()
}

fn keys_ending(tail: &str) -> Vec<String> {
    all_keys()
        .into_iter()
        .filter(|k| k.ends_with(tail))
        .collect()
}

fn all_keys() -> Vec<String> {
    let s = storage();
    (0..s.length().unwrap())
        .filter_map(|i| s.key(i).unwrap())
        .collect()
}

fn act(state: State, action: Action) -> State {
    Rc::try_unwrap(Rc::new(state).reduce(action)).unwrap()
}

fn mean(state: State, text: &str) -> State {
    let slot = Slot::Source(0, SourcePart::Mean);
    let typed = act(state, Action::Edit(Edit::Text(slot, text.into())));
    act(typed, Action::Recheck)
}

/// Starts as the app does, from what local storage holds now.
fn start() -> (State, Persisted) {
    let stored = persist::stored();
    let mut persisted = Persisted::default();
    persisted.know(&stored);
    (State::start(stored, None, &mut |_| {}), persisted)
}

#[wasm_bindgen_test]
fn an_unreadable_state_is_kept_before_its_key_is_written_over() {
    storage().clear().unwrap();
    storage().set_item(STATE_KEY, "not a check").unwrap();
    let (state, mut persisted) = start();
    let synced = persisted.sync(&state);
    assert!(synced.ok && !synced.conflict);
    let copies = keys_ending(".state.unreadable");
    assert_eq!(copies.len(), 1, "{:?}", all_keys());
    assert_eq!(get(&copies[0]).as_deref(), Some("not a check"));
    assert!(get(STATE_KEY)
        .unwrap()
        .starts_with("{\"format\":\"plumbline-state\""));
    // Discarded, it goes from the device.
    let key = state.session.rescued[0].key.clone();
    let state = act(
        state,
        Action::Session(SessionAction::DiscardRescued(key.clone())),
    );
    persisted.sync(&state);
    assert_eq!(get(&key), None);
}

#[wasm_bindgen_test]
fn another_windows_save_is_not_written_over_unasked() {
    storage().clear().unwrap();
    let (state, mut persisted) = start();
    let state = mean(state, "81");
    persisted.sync(&state);
    let ours = get(STATE_KEY).unwrap();
    // Our own text coming back is no news; another window's is.
    assert_eq!(
        persisted.changed_elsewhere(Some(STATE_KEY), Some(&ours)),
        None
    );
    let theirs = ours.replace("\"81\"", "\"70\"");
    storage().set_item(STATE_KEY, &theirs).unwrap();
    assert_eq!(
        persisted.changed_elsewhere(Some(STATE_KEY), Some(&theirs)),
        Some(Elsewhere::OpenCheck)
    );
    assert_eq!(
        persisted.changed_elsewhere(Some(KEPT_KEY), Some("x")),
        Some(Elsewhere::KeptCheck)
    );
    // Typing here does not overwrite theirs: the user is asked first.
    let state = mean(state, "82");
    let synced = persisted.sync(&state);
    assert!(synced.conflict);
    assert_eq!(get(STATE_KEY).as_deref(), Some(theirs.as_str()));
    // Meanwhile this window's check is held back under keys of its own.
    let state = act(state, Action::Session(SessionAction::OtherWindowSaved));
    persisted.sync(&state);
    let held = keys_ending(".state.held-back");
    assert_eq!(held.len(), 1, "{:?}", all_keys());
    assert!(get(&held[0]).unwrap().contains("\"82\""));
    assert_eq!(get(STATE_KEY).as_deref(), Some(theirs.as_str()));
    // Kept as chosen: saved over theirs, and the held-back copy goes.
    let state = act(state, Action::Session(SessionAction::KeepThisWindow));
    let synced = persisted.sync(&state);
    assert!(synced.ok && !synced.conflict);
    assert!(get(STATE_KEY).unwrap().contains("\"82\""));
    assert!(keys_ending(".held-back").is_empty(), "{:?}", all_keys());
}
