//! A QR code drawn as one SVG path, dark on white in every theme (cameras
//! read dark modules on a light ground).

use yew::prelude::*;

use crate::qr;

/// Props of [`QrCode`].
#[derive(Properties, PartialEq)]
pub struct QrCodeProps {
    /// What the code carries (a share link).
    pub text: AttrValue,
}

/// The QR code, or a sentence saying the text is too long for one.
#[component]
pub fn QrCode(props: &QrCodeProps) -> Html {
    let picture = use_memo(props.text.clone(), |text| qr::picture(text));
    match picture.as_ref() {
        Some(p) => html! {
            <svg class="qr" viewBox={format!("0 0 {0} {0}", p.side)} role="img"
                aria-label="QR code of the link" shape-rendering="crispEdges">
                <rect width={p.side.to_string()} height={p.side.to_string()} fill="#fff" />
                <path d={p.path.clone()} fill="#000" />
            </svg>
        },
        None => html! {
            <p class="hint">{ "This check is too long for a QR code: send the link instead." }</p>
        },
    }
}
