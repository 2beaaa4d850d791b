//! The one screen that answers the question: the patient now on one side,
//! the pressures at the organs' own height on the other.

use yew::prelude::*;

use crate::components::case_json::CaseJson;
use crate::components::caution::Caution;
use crate::components::demo_notice::DemoNotice;
use crate::components::figure_view::FigureView;
use crate::components::hazards_panel::HazardsPanel;
use crate::components::heights_table::HeightsTable;
use crate::components::not_checked::NotCheckedList;
use crate::components::organ_card::OrganCard;
use crate::components::patient_panel::PatientPanel;
use crate::components::position_panel::PositionPanel;
use crate::components::problems::Problems;
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
use crate::session::SessionAction;
use crate::state::{Action, Handle};

/// Props of [`CheckPage`].
#[derive(Properties, PartialEq)]
pub struct CheckPageProps {
    /// The state.
    pub state: Handle,
}

/// The check screen.
#[component]
pub fn CheckPage(props: &CheckPageProps) -> Html {
    let s = &props.state;
    let stale = s.is_stale();
    let onprint = Callback::from(|_: MouseEvent| {
        if let Some(w) = web_sys::window() {
            // A refused print dialog leaves the screen as it is.
            let _ = w.print();
        }
    });
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
    let checked = s.checked.clone();
    html! {
        <>
            <a class="skip" href="#h-verdicts">{ "Skip to results" }</a>
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
                    <ShareDialog state={s.clone()} />
                    <button type="button" class="tool" onclick={ondemo} aria-label="Reload the demo case">{ "Demo case" }</button>
                    <button type="button" class="tool" onclick={onprint} aria-label="Print a one-page handover">{ "Print" }</button>
                    <ThemeToggle state={s.clone()} />
                </div>
            </header>
            <SessionNotices state={s.clone()} />
            <p class="sr-only" aria-live="polite">{ s.announcement() }</p>
            <main class="layout">
                <div class="col col-inputs">
                    <section class="pane pane-position" aria-labelledby="h-patient">
                        <h2 id="h-patient">{ "The patient now" }</h2>
                        <PatientPanel state={s.clone()} />
                        <PositionPanel state={s.clone()} />
                        if let Some(c) = &checked {
                            <FigureView checked={c.clone()} stale={stale} />
                        }
                    </section>
                    <section class="pane pane-readings" aria-labelledby="h-pressures">
                        <h2 id="h-pressures">{ "Pressures as read" }</h2>
                        <SourcesPanel state={s.clone()} />
                        <ReadingsPanel state={s.clone()} />
                    </section>
                    <div class="pane pane-targets">
                        <TargetsPanel state={s.clone()} />
                    </div>
                </div>
                <div class="col col-results">
                    <Problems errors={s.errors.clone()} has_results={checked.is_some()} />
                    if s.shows_demo() {
                        <DemoNotice />
                    }
                    if let Some(c) = &checked {
                        <div class={classes!("pane", "pane-verdicts", stale.then_some("stale"))}>
                            <Verdicts summary={c.report.summary.clone()} stale={stale} />
                        </div>
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
                    }
                </div>
                <RecordPanel state={s.clone()} />
            </main>
            <Caution />
        </>
    }
}
