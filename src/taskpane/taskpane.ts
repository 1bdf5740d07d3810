/**
 * The task pane: Data → Settings → Run → Share, then the Planner and the Lot check. Inside Excel
 * each run writes new sheets through the Excel writer; outside Office (a plain browser) the pane
 * runs in preview mode on the bundled demo data and shows the same plans as tables and small
 * charts. Imports src/core and src/io only through the pane's modules; never src/functions (it
 * loads as its own bundle).
 *
 * This entry only wires the panels: reductionControls.ts, plannerControls.ts, lotControls.ts and
 * shareControls.ts, over the shared state in paneState.ts.
 */
import { wireLot, previewLot } from "./lotControls";
import { detectHost } from "./officeHost";
import { byId, fillStaticHelp } from "./paneDom";
import { fail, setBusy, state } from "./paneState";
import { previewPlanner, wirePlanner } from "./plannerControls";
import { loadSource, previewReduction, wireReduction } from "./reductionControls";
import { previewShare, refreshWorkbookLists, wireShare } from "./shareControls";
import { ADDIN_VERSION } from "./version";

function wire(): void {
  fillStaticHelp();
  byId("version").textContent = `Rheoledger ${ADDIN_VERSION}`;
  wireReduction();
  wirePlanner();
  wireLot();
  wireShare();
  byId("safety-link").addEventListener("click", () => {
    const d = byId<HTMLDetailsElement>("safety");
    d.open = true;
    d.querySelector("summary")?.focus();
  });
}

function enterPreview(reason: string): void {
  const banner = byId("mode-banner");
  banner.hidden = false;
  banner.textContent = `Preview mode (${reason}): the pane runs on bundled, invented demo data and shows its tables and charts here. Writing sheets and sharing need Excel.`;
  previewReduction();
  previewShare();
  previewPlanner();
  previewLot();
  setBusy(false);
  void loadSource().catch((e) => fail(e, "source"));
}

async function start(): Promise<void> {
  wire();
  state.mode = await detectHost();
  document.body.dataset.mode = state.mode.kind;
  if (state.mode.kind === "preview") enterPreview(state.mode.reason);
  else {
    setBusy(false);
    await refreshWorkbookLists().catch((e) => fail(e, "source"));
  }
}

if (typeof document !== "undefined") {
  if (document.readyState === "loading") document.addEventListener("DOMContentLoaded", () => void start());
  else void start();
}
