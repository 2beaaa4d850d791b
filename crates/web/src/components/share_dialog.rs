//! Share: a header button that opens a dialog with the link to this check
//! (copyable text) and its QR code. The link carries the case itself in its
//! fragment, which never reaches a web server, with its record over time
//! when the whole fits a link (else it says so and offers the record as a
//! file); nothing is sent anywhere by the app: the clinician chooses who
//! gets the link.

use plumbline_core::share;
use web_sys::HtmlDialogElement;
use yew::prelude::*;

use crate::browser;
use crate::components::qr_code::QrCode;
use crate::record::Record;
use crate::state::Checked;

/// Props of [`ShareDialog`].
#[derive(Properties, PartialEq)]
pub struct ShareDialogProps {
    /// The last complete check.
    pub checked: Option<std::rc::Rc<Checked>>,
    /// The record over time.
    pub record: Record,
    /// Whether the boxes differ from the last complete check.
    pub stale: bool,
}

/// What the link carries.
#[derive(Clone, Debug, PartialEq)]
enum Carries {
    /// The case alone: there is no record.
    Case,
    /// The case and its record.
    Record,
    /// The case alone: the record would make the link this many
    /// characters long.
    TooLong(usize),
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
    let made = (*open)
        .then(|| {
            let case = &props.checked.as_ref()?.case;
            let base = browser::page_address()?;
            Some(if props.record.is_empty() {
                (share::link(&base, case), Carries::Case)
            } else {
                match share::link_with_record(&base, &props.record.join(case)) {
                    Ok(link) => (link, Carries::Record),
                    Err(n) => (share::link(&base, case), Carries::TooLong(n)),
                }
            })
        })
        .flatten();
    let link = made.as_ref().map(|(l, _)| l.clone());
    let carries = made.map(|(_, c)| c);
    let onfile = {
        let (record, checked) = (props.record.clone(), props.checked.clone());
        Callback::from(move |_: MouseEvent| {
            if let Some(c) = &checked {
                browser::download(
                    "plumbline-case-with-record.json",
                    &record.join(&c.case).to_json(),
                );
            }
        })
    };
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
                            { "The link holds the case itself: position, size, readings, levels and targets" }
                            { match carries {
                                Some(Carries::Record) => ", and the record over time",
                                _ => "",
                            } }
                            { "; nothing that names the patient. Plumbline sends it nowhere: you choose who gets it." }
                        </p>
                        if let Some(Carries::TooLong(n)) = carries {
                            <div class="msg msg-warning share-record">
                                <p>{ format!("The record over time is NOT in this link: with it the link would be {n} characters, \
                                    over the {} a link can carry. The receiver sees the check now, not the time outside targets. \
                                    Send the record as a file:", share::MAX_FRAGMENT_CHARS) }</p>
                                <button type="button" onclick={onfile}>{ "Download case with record (JSON)" }</button>
                            </div>
                        }
                        if props.stale {
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
