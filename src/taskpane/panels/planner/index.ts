/**
 * The Planner panel ("Plan a test"): piston speeds per die that cover the target rates with
 * pressures the transducers read well, written to a new "Rheo plan" sheet. Its section is
 * `#planner-section` in taskpane.html; the form: form.ts and plan.ts; the wiring: controls.ts.
 */
import type { PanePanel } from "../../panelContract";
import { SHEET_BASE_NAMES } from "../../excelWriter";
import { plannerMode, wirePlanner } from "./controls";

export const plannerPanel: PanePanel = {
  id: "planner",
  title: "Plan a test",
  sheets: [SHEET_BASE_NAMES.plan],
  runButton: "planRun",
  fields: {
    planBarrel: { control: "planBarrel", label: "Barrel bore [mm]" },
    planUsableLength: { control: "planUsableLength", label: "Usable barrel length [mm]" },
    planDies: { control: "planDies", label: "Dies" },
    planTransducers: { control: "planTransducers", label: "Transducers" },
    planRateMin: { control: "planRateMin", label: "Lowest apparent shear rate [1/s]" },
    planRateMax: { control: "planRateMax", label: "Highest apparent shear rate [1/s]" },
    planPoints: { control: "planPoints", label: "Steps per die" },
    planPrior: { control: "planPrior", label: "Prior viscosity" },
    planK: { control: "planK", label: "K [Pa·sⁿ]" },
    planN: { control: "planN", label: "n [–]" },
    planModel: { control: "planModel", label: "Model" },
    planParameters: { control: "planParameters", label: "Parameters (SI, name=value)" },
    planMfr: { control: "planMfr", label: "MFR [g/10 min]" },
    planMfrLoad: { control: "planMfrLoad", label: "MFR load [kg]" },
    planDwell: { control: "planDwell", label: "Dwell per step [s]" },
    planDensity: { control: "planDensity", label: "Melt density [g/cm³]" },
    planCompressibility: { control: "planCompressibility", label: "Compressibility [1/GPa]" },
    planTimePerLoad: { control: "planTimePerLoad", label: "Time per load [min]" },
    planRun: { control: "planRun", label: "Plan into a new sheet" },
  },
  wire: wirePlanner,
  applyMode: plannerMode,
};
