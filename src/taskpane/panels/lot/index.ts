/**
 * The Lot check panel ("Check a lot"): a lot's flow curve against a reference curve or model
 * within a tolerance, written to a new "Rheo lot check" sheet. Its section is `#lot-section` in
 * taskpane.html; the comparison: check.ts; the wiring: controls.ts.
 */
import type { PanePanel } from "../../panelContract";
import { SHEET_BASE_NAMES } from "../../excelWriter";
import { lotMode, wireLot } from "./controls";

export const lotPanel: PanePanel = {
  id: "lot",
  title: "Check a lot",
  sheets: [SHEET_BASE_NAMES.lot],
  runButton: "lotRun",
  fields: {
    lotSource: { control: "lotSource", label: "Lot's flow curve" },
    lotRange: { control: "lotRange", label: "Lot range or table name" },
    refKind: { control: "refKind", label: "Reference" },
    refRange: { control: "refRange", label: "Reference range or table name" },
    refModel: { control: "refModel", label: "Reference model" },
    refParameters: { control: "refParameters", label: "Parameters (SI, name=value)" },
    lotTolerance: { control: "lotTolerance", label: "Tolerance [± %]" },
    lotRun: { control: "lotRun", label: "Check into a new sheet" },
  },
  wire: wireLot,
  applyMode: lotMode,
};
