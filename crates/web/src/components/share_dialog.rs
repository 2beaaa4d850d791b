//! Share: a header button that opens a dialog with the link to this check
//! (copyable text) and its QR code. The link carries the case itself in its
//! fragment, which never reaches a web server; nothing is sent anywhere by
//! the app: the clinician chooses who gets the link.

use plumbline_core::share;
use web_sys::HtmlDialogElement;
use yew::prelude::*;

use crate::browser;
use crate::components::qr_code::QrCode;
use crate::state::Handle;

/// Props of [`ShareDialog`].
#[derive(Properties, PartialEq)]
pub struct ShareDialogProps {
    /// The state.
    pub state: Handle,
}

/// The share button and its dialog.
#[component]
pub fn ShareDialog(props: &ShareDialogProps) -> Html {
    let open = use_state(|| false);
    let copied = use_state(|| None::<bool>);
    let dialog = use_node_ref();
    {
        let dialog = dialog.clone();
        use_effect_with(*open, move |open| {
            if let Some(d) = dialog.cast::<HtmlDialogElement>() {
                if *open && !d.open() {
                    // A dialog that cannot be shown modally still shows.
                    if d.show_modal().is_err() {
                        d.set_open(true);
                    }
                } else if !*open && d.open() {
                    d.close();
                }
            }
        });
    }
    let onopen = {
        let (open, copied) = (open.clone(), copied.clone());
        Callback::from(move |_: MouseEvent| {
            copied.set(None);
            open.set(true);
        })
    };
    let onclose = {
        let open = open.clone();
        Callback::from(move |_: MouseEvent| open.set(false))
    };
    // Escape closes the dialog natively; the state follows.
    let onclosed = {
        let open = open.clone();
        Callback::from(move |_: Event| open.set(false))
    };
    let s = &props.state;
    let link = (*open)
        .then(|| {
            let case = &s.checked.as_ref()?.case;
            Some(share::link(&browser::page_address()?, case))
        })
        .flatten();
    let oncopy = {
        let (copied, link) = (copied.clone(), link.clone());
        Callback::from(move |_: MouseEvent| {
            copied.set(Some(link.as_deref().is_some_and(browser::copy)));
        })
    };
    html! {
        <>
            <button type="button" class="tool" onclick={onopen} aria-haspopup="dialog"
                aria-label="Share this check by link or QR code">
                <svg viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                    <circle cx="6" cy="12" r="2.6" class="theme-half" />
                    <circle cx="18" cy="5.5" r="2.6" class="theme-half" />
                    <circle cx="18" cy="18.5" r="2.6" class="theme-half" />
                    <path d="M8.3 10.8 L15.7 6.7 M8.3 13.2 L15.7 17.3" class="theme-ring" />
                </svg>
                <span>{ "Share" }</span>
            </button>
            <dialog ref={dialog} class="share" aria-labelledby="h-share" onclose={onclosed}>
                if *open {
                    <h2 id="h-share">{ "Share this check" }</h2>
                    if let Some(link) = &link {
                        <p class="hint">
                            { "The link holds the case itself: position, size, readings, levels and targets; \
                               no record over time and nothing that names the patient. Plumbline sends it \
                               nowhere: you choose who gets it." }
                        </p>
                        if s.is_stale() {
                            <p class="msg msg-warning">
                                { "The link carries the last good check: the boxes marked in red are not in it." }
                            </p>
                        }
                        <div class="share-body">
                            <figure class="qr-figure">
                                <QrCode text={link.clone()} />
                                <figcaption>{ "Scan with the other device's camera." }</figcaption>
                            </figure>
                            <div class="share-link">
                                <label for="share-link">{ "Link to this check" }</label>
                                <textarea id="share-link" readonly=true rows="5" spellcheck="false"
                                    value={link.clone()} />
                                <div class="share-actions">
                                    <button type="button" onclick={oncopy} autofocus=true>{ "Copy link" }</button>
                                    <span role="status" class="hint">
                                        { match *copied {
                                            Some(true) => "Copied.",
                                            Some(false) => "This browser offers no clipboard here: select the text and copy it.",
                                            None => "",
                                        } }
                                    </span>
                                </div>
                            </div>
                        </div>
                    } else {
                        <p>{ "Nothing to share yet: the check has not run. Enter the values first." }</p>
                    }
                    <button type="button" class="close" onclick={onclose}>{ "Close" }</button>
                }
            </dialog>
        </>
    }
}
