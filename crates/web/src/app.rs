//! The app: starts from what the device saved (or a shared link), keeps
//! the device's copy in step, applies the theme to the page, listens for a
//! link pasted into the address bar and for a new version, and shows the
//! check screen.

use gloo::events::EventListener;
use yew::prelude::*;

use crate::browser;
use crate::pages::check_page::CheckPage;
use crate::persist::{self, Persisted};
use crate::session::{is_link, SessionAction};
use crate::state::{Action, State};

/// Props of [`App`].
#[derive(Properties, PartialEq, Default)]
pub struct AppProps {}

/// The app.
#[component]
pub fn App(_props: &AppProps) -> Html {
    let state = use_reducer(|| State::start(persist::stored(), Some(&browser::fragment())));
    let theme = state.theme;
    use_effect_with(theme, move |theme| {
        if let Some(root) = gloo::utils::document().document_element() {
            // An attribute that cannot be set leaves the device's theme.
            let _ = root.set_attribute("data-theme", theme.key());
        }
    });
    // After every change: the device's copy follows the screen; and when
    // the page is hidden or closed, at once, even before the next render.
    let persisted = use_mut_ref(Persisted::default);
    {
        let (state, persisted) = (state.clone(), persisted.clone());
        use_effect(move || {
            let ok = persisted.borrow_mut().sync(&state);
            if ok == state.session.not_saved {
                state.dispatch(Action::Session(SessionAction::Saved(ok)));
            }
        });
    }
    {
        // The handle reads the state as the last action left it, rendered
        // or not (Yew renders a large page in slices).
        let state = state.clone();
        use_effect_with((), move |_| {
            let flush = move |_: &web_sys::Event| {
                persisted.borrow_mut().sync(&state);
            };
            let document = gloo::utils::document();
            let hidden = EventListener::new(&document, "visibilitychange", flush.clone());
            let closing = EventListener::new(&gloo::utils::window(), "pagehide", flush);
            move || drop((hidden, closing))
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
                    on_link.dispatch(Action::Session(SessionAction::OpenLink(fragment)));
                }
            });
            let update = EventListener::new(&window, browser::UPDATE_READY_EVENT, move |_| {
                d.dispatch(Action::Session(SessionAction::UpdateReady));
            });
            move || drop((hash, update))
        });
    }
    html! { <CheckPage state={state} /> }
}
