/**
 * The Share panel: a copy of a sheet with the add-in's formulas replaced by their values, for
 * colleagues without the add-in. Its section is `#share-section` in taskpane.html; the copy:
 * values.ts; the wiring: controls.ts. Excel only (its button is off in preview mode).
 */
import type { PanePanel } from "../../panelContract";
import { shareMode, wireShare } from "./controls";

export const sharePanel: PanePanel = {
  id: "share",
  title: "Share",
  // the copy is named after the sheet copied ("<sheet> values"), not after a base name
  sheets: [],
  runButton: "share",
  fields: {
    share: { control: "share-sheet", label: "Sheet to copy as values" },
    shareRun: { control: "share", label: "Copy as values" },
  },
  wire: wireShare,
  applyMode: shareMode,
};
