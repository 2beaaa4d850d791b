//! A bare Yew 0.23 page: a heading, one text box and its echo. It is built
//! with the bedside screen's own pipeline (`scripts/bench-web.sh`) so the
//! web benchmark can state Plumbline's download, start and keystroke costs
//! as ratios to the framework's floor. Nothing here ships.

use yew::prelude::*;

/// The page: its first text is the "result" the benchmark waits for, and a
/// keystroke in the box re-renders the echo, as a keystroke re-renders the
/// bedside screen.
#[component]
fn Bare() -> Html {
    // Two characters, as the screen's mean box holds "75": the benchmark
    // deletes and retypes the last one.
    let text = use_state(|| "75".to_owned());
    let oninput = {
        let text = text.clone();
        Callback::from(move |e: InputEvent| {
            let input: web_sys::HtmlInputElement = e.target_unchecked_into();
            text.set(input.value());
        })
    };
    html! {
        <main>
            <h1>{ "Bare Yew page" }</h1>
            <label>{ "Text " }<input value={(*text).clone()} {oninput} /></label>
            <p>{ format!("Typed: {}", *text) }</p>
        </main>
    }
}

/// Mounts the page on the body; the page's `boot.js` calls it.
#[wasm_bindgen::prelude::wasm_bindgen]
pub fn start() {
    yew::Renderer::<Bare>::new().render();
}
