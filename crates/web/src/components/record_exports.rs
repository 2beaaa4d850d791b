//! Taking the record away, made on the device (no network): the
//! organ-level series as CSV, the whole case with its record as JSON, and
//! the samples as a record file.

use plumbline_core::record::csv;
use yew::prelude::*;

use crate::browser;
use crate::record::Record;
use crate::state::Checked;

/// Props of [`RecordExports`].
#[derive(Properties, PartialEq)]
pub struct RecordExportsProps {
    /// The record.
    pub record: Record,
    /// The last complete check.
    pub checked: Option<std::rc::Rc<Checked>>,
}

/// The download buttons.
#[component]
pub fn RecordExports(props: &RecordExportsProps) -> Html {
    let outcome = use_state(|| None::<String>);
    let download =
        |name: &'static str, make: fn(&Record, Option<&Checked>) -> Result<String, String>| {
            let (record, checked) = (props.record.clone(), props.checked.clone());
            let outcome = outcome.clone();
            Callback::from(move |_: MouseEvent| {
                let said = match make(&record, checked.as_deref()) {
                    Ok(text) if browser::download(name, &text) => {
                        format!("{name} saved on this device.")
                    }
                    Ok(_) => format!("This browser refused to save {name}."),
                    Err(why) => format!("{name} not made: {why}"),
                };
                outcome.set(Some(said));
            })
        };
    let onseries = download("plumbline-organ-series.csv", |r, c| {
        let checked = c.ok_or("there is no complete check")?;
        r.series_csv(checked.basis()).map_err(|e| e.to_string())
    });
    let oncase = download("plumbline-case-with-record.json", |r, c| {
        let case = c.map(|c| &c.case).ok_or("there is no complete check")?;
        Ok(r.join(case).to_json())
    });
    let onsamples = download("plumbline-record.csv", |r, _| {
        Ok(csv::export(&r.timeline()))
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
