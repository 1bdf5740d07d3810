/**
 * The recording panel ("Steps of a pressure recording"): a pressure–time recording (a range or
 * table; the invented demo recording in preview mode) → the steps of each die run with their
 * steady windows, shown as traces with the windows shaded and the steps left out marked, and a
 * step table; a window can be moved and the detection re-run (the move is recorded in the method
 * lines). Writes new "Rheo steps" and "Rheo trace curve" sheets. Its section is `#trace-section`
 * in taskpane.html; the wiring: controls.ts; the computation: run.ts; the view: resultsView.ts,
 * chart.ts, view.ts; the sheets: sheets.ts; the settings: settings.ts.
 */
import type { PanePanel, PanelField } from "../../panelContract";
import { SHEET_BASE_NAMES } from "../../excelWriter";
import { traceMode, wireTrace } from "./controls";
import { TRACE_SETTING_FIELDS } from "./settings";

export const tracePanel: PanePanel = {
  id: "trace",
  title: "Steps of a pressure recording",
  sheets: [SHEET_BASE_NAMES.steps, SHEET_BASE_NAMES.traceCurve],
  runButton: "traceRun",
  fields: {
    traceSource: { control: "traceSource", label: "Recording range or table name" },
    ...Object.fromEntries(TRACE_SETTING_FIELDS.map((f): [string, PanelField] => [f.control, { control: f.control, label: f.label, help: f.help }])),
    traceStep: { control: "traceStep", label: "Step" },
    traceStart: { control: "traceStart", label: "Window start [s]" },
    traceEnd: { control: "traceEnd", label: "Window end [s]" },
    traceRun: { control: "traceRun", label: "Find the steps into new sheets" },
  },
  wire: wireTrace,
  applyMode: traceMode,
};
