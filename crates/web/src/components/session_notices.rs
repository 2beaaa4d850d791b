//! What happened to the whole check, said at the top of the screen: a new
//! check, a shared link opened or refused, a check set aside (with the way
//! back), a saved state that could not be read (with its raw copy for
//! download), storage that is not saving, and a new version waiting.

use yew::prelude::*;

use crate::browser;
use crate::session::{Event, SessionAction};
use crate::state::{Action, Handle};

/// Props of [`SessionNotices`].
#[derive(Properties, PartialEq)]
pub struct SessionNoticesProps {
    /// The state.
    pub state: Handle,
}

/// The file name offered for an unreadable saved state.
const UNREADABLE_FILE: &str = "plumbline-unreadable-save.txt";

/// The notices; nothing when there is nothing to say.
#[component]
pub fn SessionNotices(props: &SessionNoticesProps) -> Html {
    let session = &props.state.session;
    let act = |action: SessionAction| {
        let d = props.state.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Session(action.clone())))
    };
    // A refused link has a notice of its own; what replaced the check is
    // said beside the way back to the set-aside one.
    let refusal = match &session.event {
        Some(Event::LinkRefused(words)) => Some(format!(
            "The link could not be opened ({words}). Nothing from it was used; the check on screen is unchanged."
        )),
        _ => None,
    };
    let event_words = session.event.as_ref().and_then(|e| match e {
        Event::NewCheck => Some("New check started: every value is still to be entered."),
        Event::Demo => Some("The invented demo case is loaded."),
        Event::LinkOpened => Some(
            "Opened the check from the shared link. Compare it with the patient before relying on it.",
        ),
        Event::BroughtBack => Some("The set-aside check is back."),
        Event::LinkRefused(_) => None,
    });
    let undo_label = match session.event {
        Some(Event::NewCheck) => "Undo new check",
        Some(Event::Demo) => "Undo: bring back my check",
        _ => "Bring back the previous check",
    };
    let download = session.unreadable.as_ref().map(|u| {
        let raw = u.raw.clone();
        Callback::from(move |_: MouseEvent| {
            browser::download(UNREADABLE_FILE, &raw);
        })
    });
    let nothing = !session.update_ready
        && session.unreadable.is_none()
        && !session.not_saved
        && session.event.is_none()
        && session.kept.is_none();
    if nothing {
        return html! {};
    }
    html! {
        <div class="notices">
            if session.update_ready {
                <div class="notice notice-update" role="status">
                    <p><strong>{ "A new version of Plumbline is ready. " }</strong>
                        { "Your check is saved on this device and stays open through the update." }</p>
                    <div class="notice-actions">
                        <button type="button" onclick={Callback::from(|_: MouseEvent| browser::apply_update())}>
                            { "Use the new version" }
                        </button>
                        <button type="button" onclick={act(SessionAction::UpdateLater)}>{ "Later" }</button>
                    </div>
                </div>
            }
            if let Some(words) = refusal {
                <div class="notice notice-problem" role="alert">
                    <p>{ words }</p>
                    <button type="button" onclick={act(SessionAction::CloseEvent)}>{ "Close" }</button>
                </div>
            }
            if let Some(u) = &session.unreadable {
                <div class="notice notice-problem" role="alert">
                    <p><strong>{ "The check saved on this device could not be read" }</strong>
                        { format!(" ({}). ", u.reason) }
                        { "The demo case is shown instead. The unreadable copy stays on this device until you discard it." }</p>
                    <div class="notice-actions">
                        <button type="button" onclick={download}>{ "Download the unreadable copy" }</button>
                        <button type="button" onclick={act(SessionAction::DiscardUnreadable)}>{ "Discard it" }</button>
                    </div>
                </div>
            }
            if session.not_saved {
                <div class="notice notice-problem" role="alert">
                    <p><strong>{ "This device is not saving the check " }</strong>
                        { "(its storage is full or switched off): it lasts only while this page stays open." }</p>
                </div>
            }
            if session.kept.is_some() {
                <div class="notice" role="status">
                    <p>
                        if let Some(words) = event_words {
                            { words }{ " " }
                        }
                        { "The previous check is set aside on this device." }
                    </p>
                    <div class="notice-actions">
                        <button type="button" onclick={act(SessionAction::BringBack)}>{ undo_label }</button>
                        <button type="button" onclick={act(SessionAction::DiscardKept)}>{ "Discard the previous check" }</button>
                    </div>
                </div>
            } else if let Some(words) = event_words {
                <div class="notice" role="status">
                    <p>{ words }</p>
                    <button type="button" onclick={act(SessionAction::CloseEvent)}>{ "Close" }</button>
                </div>
            }
        </div>
    }
}
