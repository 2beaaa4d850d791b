//! Taking the record away, made on the device (no network): the
//! organ-level series as CSV, the whole case with its record as JSON, and
//! the samples as a record file.

use plumbline_core::record::csv;
use yew::prelude::*;

use crate::browser;
use crate::state::Handle;

/// Props of [`RecordExports`].
#[derive(Properties, PartialEq)]
pub struct RecordExportsProps {
    /// The state.
    pub state: Handle,
}

/// The download buttons.
#[component]
pub fn RecordExports(props: &RecordExportsProps) -> Html {
    let outcome = use_state(|| None::<String>);
    let download = |name: &'static str,
                    make: fn(&crate::state::State) -> Result<String, String>| {
        let s = props.state.clone();
        let outcome = outcome.clone();
        Callback::from(move |_: MouseEvent| {
            let said = match make(&s) {
                Ok(text) if browser::download(name, &text) => {
                    format!("{name} saved on this device.")
                }
                Ok(_) => format!("This browser refused to save {name}."),
                Err(why) => format!("{name} not made: {why}"),
            };
            outcome.set(Some(said));
        })
    };
    let onseries = download("plumbline-organ-series.csv", |s| {
        let case = s
            .checked
            .as_ref()
            .map(|c| &c.case)
            .ok_or("there is no complete check")?;
        s.record.series_csv(case).map_err(|e| e.to_string())
    });
    let oncase = download("plumbline-case-with-record.json", |s| {
        let case = s
            .checked
            .as_ref()
            .map(|c| &c.case)
            .ok_or("there is no complete check")?;
        Ok(s.record.join(case).to_json())
    });
    let onsamples = download("plumbline-record.csv", |s| {
        Ok(csv::export(&s.record.timeline()))
    });
    html! {
        <section class="record-exports" aria-labelledby="h-record-exports">
            <h3 id="h-record-exports">{ "Take it away" }</h3>
            <div class="entry-actions">
                <button type="button" onclick={onseries}>{ "Download organ-level series (CSV)" }</button>
                <button type="button" onclick={oncase}>{ "Download case with record (JSON)" }</button>
                <button type="button" onclick={onsamples}>{ "Download samples (record CSV)" }</button>
            </div>
            <p class="hint" role="status">
                { (*outcome).clone().unwrap_or_else(|| "Made on this device; nothing is sent anywhere. The case's position is the one the record starts in.".to_owned()) }
            </p>
        </section>
    }
}
