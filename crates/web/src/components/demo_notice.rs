//! Says plainly when the screen shows the invented demo case, so its
//! numbers are never taken for a patient's.

use yew::prelude::*;

/// Props of [`DemoNotice`].
#[derive(Properties, PartialEq)]
pub struct DemoNoticeProps {}

/// The demo notice.
#[component]
pub fn DemoNotice(_props: &DemoNoticeProps) -> Html {
    html! {
        <p class="demo-notice" role="note">
            <strong>{ "Invented demo case. " }</strong>
            { "These numbers belong to no patient: enter this patient's position, size and readings." }
        </p>
    }
}
