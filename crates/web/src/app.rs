//! The app: starts from what the device saved (or a shared link), keeps
//! the device's copy in step (and in step with other windows of the app),
//! applies the theme to the page, listens for a link pasted into the
//! address bar, for a new version and for a print from the browser's
//! menu, and shows the check screen.
//!
//! These are the state's effects: the reducer only computes the next
//! state, and everything that touches the browser runs here (or in the
//! component that offers it: downloads, the clipboard).

use gloo::events::EventListener;
use gloo::timers::callback::Timeout;
use wasm_bindgen::JsCast;
use yew::prelude::*;

use crate::browser;
use crate::pages::check_page::CheckPage;
use crate::persist::{self, Elsewhere, Persisted};
use crate::session::{is_link, Opening, SessionAction};
use crate::state::{Action, State, CHECK_PAUSE_MS};

/// Props of [`App`].
#[derive(Properties, PartialEq, Default)]
pub struct AppProps {}

/// The app.
#[component]
pub fn App(_props: &AppProps) -> Html {
    let persisted = use_mut_ref(Persisted::default);
    // The note of what is opening stays on the device until the first
    // render is done: found at the next start, it means the page froze or
    // was closed while opening it, and that document is set aside.
    let opening = use_mut_ref(|| false);
    let state = {
        let (persisted, opening) = (persisted.clone(), opening.clone());
        use_reducer(move || {
            let stored = persist::stored();
            persisted.borrow_mut().know(&stored);
            State::start(stored, Some(&browser::fragment()), &mut |what| {
                persist::note_opening(what);
                *opening.borrow_mut() = what.is_some();
            })
        })
    };
    // What was typed is checked once typing pauses: each keystroke drops
    // the waiting timer and starts another.
    {
        let d = state.dispatcher();
        use_effect_with((state.pending, state.keystrokes), move |(pending, _)| {
            let timer =
                pending.then(|| Timeout::new(CHECK_PAUSE_MS, move || d.dispatch(Action::Recheck)));
            move || drop(timer)
        });
    }
    let theme = state.theme;
    use_effect_with(theme, move |theme| {
        if let Some(root) = gloo::utils::document().document_element() {
            // An attribute that cannot be set leaves the device's theme.
            let _ = root.set_attribute("data-theme", theme.key());
        }
    });
    // After every change (typing: once it pauses): the device's copy
    // follows the screen; and when the page is hidden or closed, at once,
    // even before the next render.
    {
        let (state, persisted, opening) = (state.clone(), persisted.clone(), opening.clone());
        use_effect(move || {
            if std::mem::take(&mut *opening.borrow_mut()) {
                persist::note_opening(None);
            }
            // While typing, the copy waits for the pause (each keystroke
            // would otherwise write the whole form); a page hidden or
            // closed meanwhile is written at once below.
            if state.pending {
                return;
            }
            let synced = persisted.borrow_mut().sync(&state);
            if synced.ok == state.session.not_saved {
                state.dispatch(Action::Session(SessionAction::Saved(synced.ok)));
            }
            if synced.conflict && !state.session.other_window {
                state.dispatch(Action::Session(SessionAction::OtherWindowSaved));
            }
        });
    }
    {
        // The handle reads the state as the last action left it, rendered
        // or not (Yew renders a large page in slices).
        let state = state.clone();
        use_effect_with((), move |_| {
            let flush = {
                let (state, persisted) = (state.clone(), persisted.clone());
                move |_: &web_sys::Event| {
                    persisted.borrow_mut().sync(&state);
                }
            };
            let document = gloo::utils::document();
            let hidden = EventListener::new(&document, "visibilitychange", flush.clone());
            let closing = EventListener::new(&gloo::utils::window(), "pagehide", flush);
            // Another window of the app saved: said at once when it is the
            // open check, and before this window would write over it.
            let other = EventListener::new(&gloo::utils::window(), "storage", move |event| {
                let Some(event) = event.dyn_ref::<web_sys::StorageEvent>() else {
                    return;
                };
                let changed = persisted
                    .borrow_mut()
                    .changed_elsewhere(event.key().as_deref(), event.new_value().as_deref());
                if changed == Some(Elsewhere::OpenCheck) && !state.session.other_window {
                    state.dispatch(Action::Session(SessionAction::OtherWindowSaved));
                }
            });
            move || drop((hidden, closing, other))
        });
    }
    {
        let d = state.dispatcher();
        use_effect_with((), move |_| {
            // The link is open (or refused): it leaves the address bar, so
            // a reload shows the check as it is now.
            if is_link(&browser::fragment()) {
                browser::clear_fragment();
            }
            if browser::update_was_ready() {
                d.dispatch(Action::Session(SessionAction::UpdateReady));
            }
            let window = gloo::utils::window();
            let on_link = d.clone();
            let hash = EventListener::new(&window, "hashchange", move |_| {
                let fragment = browser::fragment();
                if is_link(&fragment) && !browser::is_anchor(&fragment) {
                    browser::clear_fragment();
                    persist::note_opening(Some(&Opening::Link(fragment.clone())));
                    *opening.borrow_mut() = true;
                    on_link.dispatch(Action::Session(SessionAction::OpenLink(fragment)));
                }
            });
            let on_update = d.clone();
            let update = EventListener::new(&window, browser::UPDATE_READY_EVENT, move |_| {
                on_update.dispatch(Action::Session(SessionAction::UpdateReady));
            });
            // Printed from the browser's own menu while typing: what was
            // typed is checked first. The render runs as a microtask, before
            // the browser lays the page out for print.
            let print = EventListener::new(&window, "beforeprint", move |_| {
                d.dispatch(Action::Recheck);
            });
            move || drop((hash, update, print))
        });
    }
    html! { <CheckPage state={state} /> }
}
