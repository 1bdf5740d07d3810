/**
 * The task pane's shell. It paints at once (the page has no blocking script), shows that it is
 * waiting for Excel, wires every panel of the registry (panels/index.ts), and sets each up for the
 * host: Excel when office.js answers in time, preview mode on the bundled demo data otherwise
 * (and Excel after all if it answers late). Each panel's action bar follows the field in use, so
 * the panel's run button is never more than a few Tab presses away. Imports src/core and src/io
 * only through the panels' modules; never src/functions (it is its own bundle).
 */
import { detectHost, type HostMode } from "./officeHost";
import type { PanePanel } from "./panelContract";
import { byId, fillStaticHelp } from "./paneDom";
import { setBusy, setMode, state } from "./paneState";
import { PANELS } from "./panels";
import { ADDIN_VERSION } from "./version";

/**
 * Where the action bar goes for a focused element: after its group of controls (an explicit
 * `.bar-group`, else its `.field`); for the summary of an open fold that holds groups of its own,
 * right after the summary.
 */
function anchorOf(el: Element): Element | null {
  const fold = el.parentElement;
  if (el.matches("summary") && fold instanceof HTMLDetailsElement && fold.open && fold.querySelector(".bar-group")) return el;
  return el.closest(".bar-group, .field");
}

/** A pointer press this recent (ms) means the focus came from the mouse or a touch. */
const POINTER_FOCUS_MS = 800;

/**
 * Keeps each panel's action bar right after the group of fields in use when the keyboard moves
 * the focus, so that Tab from any field reaches the run button within three presses (the bar is
 * sticky, so it stays in view too). A focus that comes from a pointer leaves the bar where it is:
 * moving it then would shift the page under the pointer between press and release.
 */
export function followFocus(panel: PanePanel): void {
  const section = document.getElementById(`${panel.id}-section`);
  const bar = section?.querySelector<HTMLElement>(".action-bar");
  if (!section || !bar) return;
  let pointerAt = -Infinity;
  section.addEventListener("pointerdown", () => (pointerAt = Date.now()), { capture: true });
  section.addEventListener("focusin", (event) => {
    const target = event.target as Element;
    if (bar.contains(target) || Date.now() - pointerAt < POINTER_FOCUS_MS) return;
    const anchor = anchorOf(target);
    if (!anchor || !section.contains(anchor) || anchor.nextElementSibling === bar) return;
    anchor.after(bar);
  });
}

function applyMode(mode: HostMode): void {
  setMode(mode);
  const banner = byId("mode-banner");
  banner.classList.remove("waiting");
  if (mode.kind === "preview") {
    banner.hidden = false;
    banner.textContent = `Preview mode (${mode.reason}): the pane runs on bundled, invented demo data and shows its tables and charts here. Writing sheets and sharing need Excel.`;
  } else {
    banner.hidden = true;
    banner.textContent = "";
  }
  for (const panel of PANELS) panel.applyMode(mode);
  setBusy(false);
}

function wire(): void {
  state.panels = PANELS;
  fillStaticHelp();
  byId("version").textContent = `Rheoledger ${ADDIN_VERSION}`;
  for (const panel of PANELS) {
    panel.wire();
    followFocus(panel);
  }
  setBusy(true); // until the host is known
  byId("safety-link").addEventListener("click", () => {
    const d = byId<HTMLDetailsElement>("safety");
    d.open = true;
    d.querySelector("summary")?.focus();
  });
  document.querySelector(".skip")?.addEventListener("click", (e) => {
    e.preventDefault();
    byId("run").focus();
  });
  document.addEventListener("click", (e) => {
    const button = (e.target as Element).closest<HTMLButtonElement>("button.all-columns");
    if (!button) return;
    const wrap = button.closest(".table-wrap");
    const all = !wrap?.classList.contains("show-all");
    wrap?.classList.toggle("show-all", all);
    button.setAttribute("aria-pressed", String(all));
    button.textContent = all ? "Key columns only" : `All ${wrap?.querySelectorAll("thead th").length ?? ""} columns`;
  });
}

async function start(): Promise<void> {
  wire();
  const mode = await detectHost(undefined, () => applyMode({ kind: "excel" }));
  applyMode(mode);
}

/** Starts once the page is parsed; never waits for DOMContentLoaded, which a hanging office.js (a `defer` script) holds back. */
function whenParsed(run: () => void): void {
  if (document.readyState !== "loading") run();
  else {
    const onChange = () => {
      if (document.readyState === "loading") return;
      document.removeEventListener("readystatechange", onChange);
      run();
    };
    document.addEventListener("readystatechange", onChange);
  }
}

if (typeof document !== "undefined") whenParsed(() => void start());
