/**
 * The registry of the task pane's panels, in page order. The shell (taskpane.ts) wires each,
 * sets each up for the host (preview mode or Excel), moves each panel's action bar next to the
 * field in use, and hands the list to the shared state, which finds every field, its control and
 * its run button here; the run-to-sheet flow writes each panel's `sheets`. Adding a panel: a new
 * folder `panels/<name>/` whose index.ts exports a {@link PanePanel}, one line here, and its
 * `<section id="<name>-section">` in taskpane.html (see DEVELOPERS.md).
 */
import type { PanePanel } from "../panelContract";
import { lotPanel } from "./lot";
import { plannerPanel } from "./planner";
import { reducePanel } from "./reduce";
import { sharePanel } from "./share";
import { tracePanel } from "./trace";

export const PANELS: readonly PanePanel[] = Object.freeze([reducePanel, tracePanel, sharePanel, plannerPanel, lotPanel]);
