//! Says plainly when the screen shows the invented demo case, so its
//! numbers are never taken for a patient's; once the demo is changed, lists
//! every value still invented and offers to clear them all in one step.

use yew::prelude::*;

/// Props of [`DemoNotice`].
#[derive(Properties, PartialEq)]
pub struct DemoNoticeProps {
    /// The values still as the demo had them, in words.
    pub invented: Vec<String>,
    /// Whether the demo is untouched.
    pub untouched: bool,
    /// Clears the invented values, keeping the clinician's own.
    pub onclear: Callback<MouseEvent>,
}

/// The demo notice.
#[component]
pub fn DemoNotice(props: &DemoNoticeProps) -> Html {
    if props.untouched {
        return html! {
            <p class="demo-notice" role="note">
                <strong>{ "Invented demo case. " }</strong>
                { "These numbers belong to no patient: press New check, or enter this patient's position, size and readings." }
            </p>
        };
    }
    html! {
        <div class="demo-notice" role="note">
            <p>
                <strong>{ "Still from the invented demo case: " }</strong>
                { props.invented.join("; ") }{ "." }
            </p>
            <p>{ "These are judged with your entries until cleared." }</p>
            <button type="button" onclick={props.onclear.clone()}>{ "Clear the demo's values, keep mine" }</button>
        </div>
    }
}
