//! What happened to the whole check, said at the top of the screen: a new
//! check, a shared link opened, a check set aside (with the way back),
//! each text the app could not use (named exactly, with its raw copy for
//! download), another window's save, storage that is not saving, and a new
//! version waiting.

use std::rc::Rc;

use yew::prelude::*;

use crate::browser;
use crate::persist;
use crate::session::{Event, Instead, Part, Rescued, SessionAction, Why, MAX_RESCUED};
use crate::state::{Action, Dispatch, Handle};

/// Props of [`SessionNotices`].
#[derive(Properties, PartialEq)]
pub struct SessionNoticesProps {
    /// The state.
    pub state: Handle,
}

/// What a rescued text was, in words.
fn label(part: Part) -> &'static str {
    match part {
        Part::State => "The check saved on this device",
        Part::Record => "The record over time saved with the check",
        Part::Kept => "The set-aside check",
        Part::KeptRecord => "The set-aside check's record over time",
        Part::Link => "The link",
        Part::Other => "A text saved by another version of Plumbline",
    }
}

/// What happened to a rescued text, in words: the first sentence.
fn headline(r: &Rescued) -> String {
    let what = label(r.part);
    match (&r.why, r.part) {
        (Why::Unreadable(reason), Part::Link) => format!("{what} could not be opened ({reason})."),
        (Why::Unreadable(reason), _) => format!("{what} could not be read ({reason})."),
        (Why::Stalled, _) => format!(
            "{what} did not finish opening last time (the page froze or was closed while checking it), so it was set aside unopened."
        ),
        (Why::HeldBack, _) => format!(
            "{what} in a window that held its saving back, so as not to overwrite another window's, was kept here instead."
        ),
        (Why::Replaced, _) => format!(
            "{what} of another window was replaced here when that window's check was opened in this one."
        ),
    }
}

/// What the screen shows instead, in words.
fn instead(r: &Rescued) -> &'static str {
    match (r.instead, r.part) {
        (Instead::Demo, _) => "The demo case is shown instead.",
        (Instead::BlankWithRecord, _) => {
            "Its record over time is shown with a blank check: enter the patient's values again."
        }
        (Instead::CheckWithoutRecord, _) => "The check opened without it.",
        (Instead::KeptWithoutRecord, _) => "The set-aside check keeps its boxes without it.",
        (Instead::Unchanged, Part::Link) => {
            "Nothing from it was used; the check on screen is unchanged."
        }
        (Instead::Unchanged, _) => "The check on screen is unchanged.",
        (Instead::Earlier, _) => "Kept from an earlier visit.",
    }
}

/// One rescued text: what failed, what is shown instead, and its copy.
fn rescued_notice(r: &Rc<Rescued>, d: &Dispatch) -> Html {
    let download = {
        let r = r.clone();
        Callback::from(move |_: MouseEvent| {
            let name = format!("plumbline-{}-{}.txt", r.why.name(), r.part.name());
            browser::download(&name, &r.raw);
        })
    };
    let discard = {
        let (d, key) = (d.clone(), r.key.clone());
        Callback::from(move |_: MouseEvent| {
            d.dispatch(Action::Session(SessionAction::DiscardRescued(key.clone())));
        })
    };
    html! {
        <div class="notice notice-problem" role="alert" key={r.key.clone()}>
            <p><strong>{ headline(r) }</strong>{ " " }{ instead(r) }
                { format!(" A copy stays on this device, exactly as it was, until you discard it (the {MAX_RESCUED} newest such copies are kept).") }</p>
            <div class="notice-actions">
                <button type="button" onclick={download}>{ "Download the copy" }</button>
                <button type="button" onclick={discard}>{ "Discard it" }</button>
            </div>
        </div>
    }
}

/// The notices; nothing when there is nothing to say.
#[component]
pub fn SessionNotices(props: &SessionNoticesProps) -> Html {
    let session = &props.state.session;
    let act = |action: SessionAction| {
        let d = props.state.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Session(action.clone())))
    };
    let event_words = session.event.as_ref().map(|e| match e {
        Event::NewCheck => "New check started: every value is still to be entered.",
        Event::Demo => "The invented demo case is loaded.",
        Event::LinkOpened => {
            "Opened the check from the shared link. Compare it with the patient before relying on it."
        }
        Event::BroughtBack => "The set-aside check is back.",
        Event::OtherWindowOpened => "Opened the check the other window saved.",
    });
    let undo_label = match session.event {
        Some(Event::NewCheck) => "Undo new check",
        Some(Event::Demo) => "Undo: bring back my check",
        _ => "Bring back the previous check",
    };
    let open_other = {
        let d = props.state.dispatcher();
        Callback::from(move |_: MouseEvent| {
            d.dispatch(Action::Session(SessionAction::OpenOtherWindow(
                persist::stored(),
            )));
        })
    };
    // This visit's are said one by one; earlier visits' wait, folded.
    let (earlier, fresh): (Vec<_>, Vec<_>) =
        (session.rescued.iter().rev()).partition(|r| r.instead == Instead::Earlier);
    let d = props.state.dispatcher();
    let nothing = !session.update_ready
        && session.rescued.is_empty()
        && !session.other_window
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
            if session.other_window {
                <div class="notice notice-problem" role="alert">
                    <p><strong>{ "Another window of Plumbline on this device has saved a different check. " }</strong>
                        { "This window has stopped saving so that neither overwrites the other; what you enter here is kept aside on this device meanwhile." }</p>
                    <div class="notice-actions">
                        <button type="button" onclick={open_other}>{ "Open the other window's check" }</button>
                        <button type="button" onclick={act(SessionAction::KeepThisWindow)}>{ "Keep this window's check" }</button>
                    </div>
                </div>
            }
            { for fresh.iter().map(|r| rescued_notice(r, &d)) }
            if !earlier.is_empty() {
                <details class="notice notice-problem rescued-earlier">
                    <summary>{ match earlier.len() {
                        1 => "1 text that could not be used on an earlier visit is kept on this device for download".to_owned(),
                        n => format!("{n} texts that could not be used on earlier visits are kept on this device for download"),
                    } }</summary>
                    { for earlier.iter().map(|r| rescued_notice(r, &d)) }
                </details>
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
