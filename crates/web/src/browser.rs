//! The thin layer over the page's browser: local storage, the address's
//! fragment, a download made on the device, the clipboard, and the signals
//! exchanged with `boot.js` about a new version.
//!
//! Every call tolerates a browser that refuses (storage switched off, no
//! clipboard): it reports `false` or `None`, never panics. Nothing here
//! sends anything off the device.

use wasm_bindgen::JsValue;

/// The event `boot.js` sends on `window` when a new version is waiting.
pub const UPDATE_READY_EVENT: &str = "plumbline-update-ready";
/// The attribute `boot.js` sets on the root element for the same, in case
/// the screen was not yet listening.
pub const UPDATE_READY_ATTRIBUTE: &str = "data-update-ready";
/// The event the screen sends on `window` to switch to the new version.
pub const APPLY_UPDATE_EVENT: &str = "plumbline-apply-update";

fn local_storage() -> Option<web_sys::Storage> {
    web_sys::window()?.local_storage().ok()?
}

/// The text saved under `key`, if storage is on and holds one.
pub fn read(key: &str) -> Option<String> {
    local_storage()?.get_item(key).ok()?
}

/// Every key local storage holds (none when storage is off).
pub fn keys() -> Vec<String> {
    let Some(storage) = local_storage() else {
        return Vec::new();
    };
    let n = storage.length().unwrap_or(0);
    (0..n)
        .filter_map(|i| storage.key(i).ok().flatten())
        .collect()
}

/// Saves `value` under `key`; `false` when storage is off or full.
pub fn write(key: &str, value: &str) -> bool {
    local_storage().is_some_and(|s| s.set_item(key, value).is_ok())
}

/// Removes what is saved under `key`; `false` when storage is off.
pub fn remove(key: &str) -> bool {
    local_storage().is_some_and(|s| s.remove_item(key).is_ok())
}

/// The address's fragment, with its `#`; empty when there is none.
pub fn fragment() -> String {
    web_sys::window()
        .and_then(|w| w.location().hash().ok())
        .unwrap_or_default()
}

/// Whether `fragment` names an element of the page (an in-page link, such
/// as "skip to results"), rather than a shared check.
pub fn is_anchor(fragment: &str) -> bool {
    let id = fragment.trim_start_matches('#');
    !id.is_empty()
        && web_sys::window()
            .and_then(|w| w.document())
            .and_then(|d| d.get_element_by_id(id))
            .is_some()
}

/// The page's address without its fragment, for building a share link.
pub fn page_address() -> Option<String> {
    web_sys::window()?.location().href().ok()
}

/// Takes the fragment off the address bar, without reloading or adding a
/// step to the history.
pub fn clear_fragment() {
    let Some(window) = web_sys::window() else {
        return;
    };
    let location = window.location();
    let (Ok(path), Ok(search)) = (location.pathname(), location.search()) else {
        return;
    };
    if let Ok(history) = window.history() {
        // A refusal leaves the fragment in the bar; the check is open either way.
        let _ =
            history.replace_state_with_url(&JsValue::NULL, "", Some(&format!("{path}{search}")));
    }
}

/// Offers `text` as a file download made on the device (no network).
pub fn download(name: &str, text: &str) -> bool {
    let made = (|| {
        let document = web_sys::window()?.document()?;
        let parts = js_sys::Array::of1(&JsValue::from_str(text));
        let options = web_sys::BlobPropertyBag::new();
        options.set_type("text/plain");
        let blob = web_sys::Blob::new_with_str_sequence_and_options(&parts, &options).ok()?;
        let url = web_sys::Url::create_object_url_with_blob(&blob).ok()?;
        let link = document.create_element("a").ok()?;
        let _ = link.set_attribute("href", &url);
        let _ = link.set_attribute("download", name);
        let body = document.body()?;
        let _ = body.append_child(&link);
        if let Some(a) = wasm_bindgen::JsCast::dyn_ref::<web_sys::HtmlElement>(&link) {
            a.click();
        }
        link.remove();
        let _ = web_sys::Url::revoke_object_url(&url);
        Some(())
    })();
    made.is_some()
}

/// Puts `text` on the clipboard; `false` when the browser offers none.
pub fn copy(text: &str) -> bool {
    web_sys::window()
        .map(|w| w.navigator().clipboard())
        .map(|c| c.write_text(text))
        .is_some()
}

/// Whether `boot.js` already said a new version is waiting.
pub fn update_was_ready() -> bool {
    gloo::utils::document()
        .document_element()
        .is_some_and(|root| root.has_attribute(UPDATE_READY_ATTRIBUTE))
}

/// Asks `boot.js` to switch to the waiting version (the page then reloads;
/// the check is saved on the device, so it comes back as it was).
pub fn apply_update() {
    if let (Some(window), Ok(event)) = (web_sys::window(), web_sys::Event::new(APPLY_UPDATE_EVENT))
    {
        let _ = window.dispatch_event(&event);
    }
}
