//! The one screen that answers the question. The answer is pinned (a bar at
//! the top of a phone, a column beside the inputs on a tablet); under it
//! the quick path for the usual jobs (posture, body height, one blood
//! pressure with its site, another pressure, the organs of concern) beside
//! the patient's picture, everything else folded one tap away, then each
//! organ in detail and the record over time.
//!
//! The page is the only component that holds the state: it makes the notes
//! and the callbacks, and every part below receives values.

use gloo::render::request_animation_frame;
use gloo::timers::callback::Timeout;
use plumbline_core::error::ErrorKind;
use plumbline_core::record::TargetExposure;
use yew::prelude::*;

use crate::components::baseline_panel::BaselinePanel;
use crate::components::box_group;
use crate::components::case_json::CaseJson;
use crate::components::caution::Caution;
use crate::components::concern_picker::ConcernPicker;
use crate::components::demo_notice::DemoNotice;
use crate::components::figure_view::FigureView;
use crate::components::fold::Fold;
use crate::components::hazards_panel::HazardsPanel;
use crate::components::heights_table::HeightsTable;
use crate::components::not_checked::NotCheckedList;
use crate::components::organ_card::OrganCard;
use crate::components::patient_panel::PatientPanel;
use crate::components::position_panel::PositionPanel;
use crate::components::problems::Problems;
use crate::components::quick_position::QuickPosition;
use crate::components::quick_pressures::QuickPressures;
use crate::components::readings_panel::ReadingsPanel;
use crate::components::readings_summary::ReadingsSummary;
use crate::components::record_panel::RecordPanel;
use crate::components::session_notices::SessionNotices;
use crate::components::share_dialog::ShareDialog;
use crate::components::sources_panel::SourcesPanel;
use crate::components::sweep_chart::SweepChart;
use crate::components::targets_panel::TargetsPanel;
use crate::components::theme_toggle::ThemeToggle;
use crate::components::verdicts::Verdicts;
use crate::components::warnings_panel::WarningsPanel;
use crate::form::Edit;
use crate::session::SessionAction;
use crate::show::path_words;
use crate::state::{Action, Handle};

/// Props of [`CheckPage`].
#[derive(Properties, PartialEq)]
pub struct CheckPageProps {
    /// The state.
    pub state: Handle,
}

/// A folded section of the inputs, one tap away, its boxes a group.
fn fold(title: String, problem: bool, body: Html) -> Html {
    html! { <Fold title={title} open_when={problem} class="fold">{ box_group(body) }</Fold> }
}

/// The check screen.
#[component]
pub fn CheckPage(props: &CheckPageProps) -> Html {
    let s = &props.state;
    // The answer first: each organ in detail, the folds and the record are
    // built just after the first frame is painted (a timer set from the
    // frame's callback runs after it), so on a slow tablet the verdict and
    // the quick path show as soon as the app has started.
    let whole = use_state_eq(|| false);
    {
        let whole = whole.clone();
        use_effect_with((), move |_| {
            let frame = request_animation_frame(move |_| {
                Timeout::new(0, move || whole.set(true)).forget();
            });
            move || drop(frame)
        });
    }
    let whole = *whole;
    let stale = s.is_stale();
    let notes = s.notes();
    // One callback for the page's life: a new one at every render would
    // count as a change and re-render every panel it is handed to.
    let onedit = use_callback(s.dispatcher(), |e: Edit, d| d.dispatch(Action::Edit(e)));
    // What was just typed is checked and on the page before it prints. The
    // app's `beforeprint` check does not cover this button: called from
    // this handler, `print()` lays the page out before any microtask (the
    // render) can run, so the print waits for a zero timer.
    let onprint = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| {
            d.dispatch(Action::Recheck);
            Timeout::new(0, || {
                if let Some(w) = web_sys::window() {
                    // A refused print dialog leaves the screen as it is.
                    let _ = w.print();
                }
            })
            .forget();
        })
    };
    // Asks first: a gloved tap must not wipe what was entered.
    let ondemo = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| {
            let sure = web_sys::window().is_some_and(|w| {
                w.confirm_with_message("Replace everything on screen with the invented demo case?")
                    .unwrap_or(false)
            });
            if sure {
                d.dispatch(Action::LoadDemo);
            }
        })
    };
    // No question asked: the check on screen is set aside, with an undo.
    let onnew = {
        let d = s.dispatcher();
        Callback::from(move |_: MouseEvent| d.dispatch(Action::Session(SessionAction::NewCheck)))
    };
    let form = &s.form;
    let checked = s.checked.clone();
    let invented = form.invented();
    // A fold opens by itself for a real problem inside, never for what is
    // merely still to enter (a new check opens with every fold closed).
    let has = |prefix: &str| {
        s.errors.iter().any(|e| {
            e.field().starts_with(prefix) && !matches!(e.kind(), ErrorKind::Missing { .. })
        })
    };
    // What is still to enter, said in the answer's place until it can be given.
    let needed: Vec<String> = s
        .errors
        .iter()
        .filter(|e| matches!(e.kind(), ErrorKind::Missing { .. }))
        .map(|e| match path_words(e.field()) {
            w if w.is_empty() => e.kind().to_string(),
            w => format!("{w}: {}", e.kind()),
        })
        .collect();
    // The record's part of the answer: the organs of concern's targets.
    let record: Option<Vec<TargetExposure>> = s.record.analysis.as_ref().map(|a| {
        a.exposure
            .targets
            .iter()
            .filter(|t| form.concern.is_empty() || form.concern.contains(&t.organ))
            .cloned()
            .collect()
    });
    let sources: Vec<AttrValue> = form
        .sources
        .iter()
        .map(|src| AttrValue::from(src.id.trim().to_owned()))
        .collect();
    let rows = checked
        .as_ref()
        .filter(|_| !stale)
        .map(|c| c.report.arterial.clone())
        .unwrap_or_default();
    let readings: Vec<_> = form.readings.iter().map(|(q, r)| (*q, r.clone())).collect();
    let onclear = onedit.reform(|_: MouseEvent| Edit::ClearDemo);
    html! {
        <>
            <a class="skip" href="#h-verdicts">{ "Skip to the answer" }</a>
            <header class="top">
                <div class="brand">
                    <svg class="logo" viewBox="0 0 24 24" aria-hidden="true" focusable="false">
                        <line x1="12" y1="1" x2="12" y2="15" />
                        <path d="M7 15 H17 L12 23 Z" />
                    </svg>
                    <h1>{ "Plumbline" }</h1>
                    <p class="tagline">{ "perfusion pressure at the organ's own height" }</p>
                </div>
                <div class="tools">
                    <button type="button" class="tool" onclick={onnew}>{ "New check" }</button>
                    <ShareDialog checked={checked.clone()} record={s.record.clone()} stale={stale} />
                    <a class="tool" href="#h-record">{ "Record" }</a>
                    <button type="button" class="tool" onclick={ondemo} aria-label="Reload the demo case">{ "Demo case" }</button>
                    <button type="button" class="tool" onclick={onprint} aria-label="Print a one-page handover">{ "Print" }</button>
                    <ThemeToggle state={s.clone()} />
                </div>
            </header>
            <SessionNotices state={s.clone()} />
            <p class="sr-only" aria-live="polite">{ s.announcement() }</p>
            <div class="screen">
                <div class="col-answer">
                    <div class={classes!("pane", "answer-pin", stale.then_some("stale-pin"), s.pending.then_some("updating"))}
                        aria-busy={if s.pending { "true" } else { "false" }}>
                        if let Some(c) = &checked {
                            <Verdicts summary={c.report.summary.clone()} stale={stale}
                                invented={!invented.is_empty() || s.shows_demo()} record={record}
                                needed={needed.clone()} />
                        } else {
                            <section class="verdicts pending" aria-labelledby="h-verdicts">
                                <h2 id="h-verdicts">{ "At the organs' own height" }</h2>
                                <p class="headline">{ "No answer yet. To check, enter:" }</p>
                                <ul class="needed-list">
                                    { for needed.iter().map(|n| html! { <li>{ n.clone() }</li> }) }
                                </ul>
                            </section>
                        }
                    </div>
                    if let (Some(c), true) = (&checked, whole) {
                        <div class="results">
                            <section class={classes!("pane", "pane-results", stale.then_some("stale"))}
                                aria-labelledby="h-organs">
                                <h2 id="h-organs">{ "Organ by organ" }</h2>
                                if let Some(p) = &c.report.position {
                                    <p class="position-words">{ format!("Position: {p}") }</p>
                                }
                                <ReadingsSummary checked={c.clone()} />
                                { for c.report.organs.iter().map(|o| html! { <OrganCard organ={o.clone()} /> }) }
                                <HazardsPanel venous_site={c.report.venous_site.clone()}
                                    drain={c.report.drain.clone()} />
                                <NotCheckedList organs={c.report.not_checked.clone()} />
                                <WarningsPanel cross_checks={c.report.cross_checks.clone()}
                                    warnings={c.report.warnings.clone()} />
                                <HeightsTable rows={c.report.heights.clone()} />
                            </section>
                            <div class={classes!("pane", "pane-sweep", stale.then_some("stale"))}>
                                <SweepChart sweeps={c.report.sweeps.clone()} now_deg={c.backrest_deg()} />
                            </div>
                            <div class="pane pane-json">
                                <CaseJson json={c.case_json.clone()} stale={stale} />
                            </div>
                        </div>
                    }
                </div>
                <main class="col-inputs">
                    if s.shows_demo() || !invented.is_empty() {
                        <DemoNotice invented={invented.clone()} untouched={s.shows_demo()} onclear={onclear} />
                    }
                    <Problems errors={s.errors.clone()} has_results={checked.is_some()} />
                    <section class="pane quick" aria-labelledby="h-patient">
                        <h2 id="h-patient">{ "The patient now" }</h2>
                        <div class="quick-top">
                            { box_group(html! {
                                <QuickPosition position={form.position.clone()} height={form.height.clone()}
                                    notes={notes.clone()} onedit={onedit.clone()} />
                            }) }
                            <div class="quick-figure">
                                if let Some(c) = &checked {
                                    <FigureView checked={c.clone()} stale={stale} />
                                } else {
                                    <p class="hint">{ "The patient's picture shows once the position and body height are in." }</p>
                                }
                            </div>
                        </div>
                        { box_group(html! {
                            <QuickPressures source={form.sources.first().cloned()} readings={readings}
                                notes={notes.clone()} onedit={onedit.clone()} />
                        }) }
                        <ConcernPicker concern={form.concern.clone()} onedit={onedit.clone()} />
                    </section>
                    if whole {
                        <section class="pane folds" aria-label="More detail">
                            { fold("Position in detail: other angles, arms".to_owned(), has("position."),
                                html! { <PositionPanel position={form.position.clone()} notes={notes.clone()} onedit={onedit.clone()} /> }) }
                            { fold(format!("Arterial sources ({})", form.sources.len()), has("arterial"),
                                html! { <SourcesPanel sources={form.sources.clone()} rows={rows}
                                    notes={notes.clone()} onedit={onedit.clone()} /> }) }
                            { fold(format!("Other pressures and assumed values ({})", form.readings.len() + form.assumed.len()),
                                has("readings") || has("assume"),
                                html! { <ReadingsPanel readings={form.readings.clone()} assumed={form.assumed.clone()}
                                    notes={notes.clone()} onedit={onedit.clone()} /> }) }
                            { fold(if form.baseline.is_some() { "Baseline blood pressure".to_owned() } else { "Baseline blood pressure (none)".to_owned() },
                                has("baseline"),
                                html! { <BaselinePanel baseline={form.baseline.clone()} notes={notes.clone()} onedit={onedit.clone()} /> }) }
                            { fold(format!("Targets ({}{})", form.targets.len(), if form.custom_targets { ", this case's own" } else { ", defaults" }),
                                has("targets"),
                                html! { <TargetsPanel targets={form.targets.clone()} custom={form.custom_targets}
                                    notes={notes.clone()} onedit={onedit.clone()} /> }) }
                            { fold("Haematocrit".to_owned(), has("patient.haematocrit"),
                                html! { <PatientPanel haematocrit={form.haematocrit.clone()} notes={notes.clone()} onedit={onedit.clone()} /> }) }
                        </section>
                    }
                </main>
                if whole {
                    <RecordPanel record={s.record.clone()} checked={checked.clone()} stale={stale}
                        sources={sources} dispatch={s.dispatcher()} />
                }
            </div>
            <Caution />
        </>
    }
}
