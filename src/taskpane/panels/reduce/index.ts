/**
 * The reduction panel: raw capillary readings (a range or table) to the corrected flow curve,
 * validity checks and model fits, written to new "Rheo results" and "Rheo method" sheets. Its
 * section is `#reduce-section` in taskpane.html; the wiring: controls.ts; what the data allow:
 * applicability.ts; the results view: resultsView.ts.
 */
import type { PanePanel } from "../../panelContract";
import { SHEET_BASE_NAMES } from "../../excelWriter";
import { settingLabel, type FieldId } from "../../settings";
import { reductionMode, wireReduction } from "./controls";

export const reducePanel: PanePanel & { fields: Readonly<Record<FieldId, { control: string; label: string }>> } = {
  id: "reduce",
  title: "Reduce raw data to a flow curve",
  sheets: [SHEET_BASE_NAMES.results, SHEET_BASE_NAMES.method],
  runButton: "run",
  fields: {
    source: { control: "source", label: "Raw data range or table name" },
    columns: { control: "field-columns", label: "Columns" },
    dies: { control: "field-dies", label: "Die list" },
    endCorrection: { control: "end-bagley", label: "End correction" },
    rabinowitschMethod: { control: "rabinowitschMethod", label: "Rabinowitsch slope method" },
    rabinowitschDegree: { control: "rabinowitschDegree", label: "Polynomial degree" },
    rabinowitschWindow: { control: "rabinowitschWindow", label: "Points per local fit" },
    models: { control: "field-models", label: "Models to fit" },
    transducerRangeBar: { control: "transducerRangeBar", label: "Transducer full scale [bar]" },
    transducerAccuracyPercent: { control: "transducerAccuracyPercent", label: "Transducer accuracy [% of full scale]" },
    checks: { control: "check-representativeRate", label: "Optional checks" },
    slip: { control: "check-slip", label: "Wall slip (Mooney)" },
    heatingDensity: { control: "heatingDensity", label: "Density [g/cm³]" },
    heatingHeatCapacity: { control: "heatingHeatCapacity", label: "Specific heat [kJ/(kg·K)]" },
    heatingConductivity: { control: "heatingConductivity", label: "Conductivity [W/(m·K)]" },
    heatingTemperatureCoefficient: { control: "heatingTemperatureCoefficient", label: "b [1/K]" },
    temperatureShift: { control: "temperatureShift", label: "Temperature shift" },
    referenceTemperatureC: { control: "referenceTemperatureC", label: "Reference temperature [°C]" },
    chartModel: { control: "chartModel", label: "Model on the viscosity chart" },
    material: { control: "material-melt", label: settingLabel("material") },
    masterModel: { control: "masterModel", label: settingLabel("masterModel") },
    crossWlfD2C: { control: "crossWlfD2C", label: settingLabel("crossWlfD2C") },
    rotational: { control: "rotational", label: settingLabel("rotational") },
    glassTransitionTemperatureC: { control: "glassTransitionTemperatureC", label: settingLabel("glassTransitionTemperatureC") },
    verticalShiftPerK: { control: "verticalShiftPerK", label: settingLabel("verticalShiftPerK") },
    slitEdgeCorrection: { control: "slitEdgeCorrection", label: settingLabel("slitEdgeCorrection") },
    stabilityThresholdPercent: { control: "stabilityThresholdPercent", label: settingLabel("stabilityThresholdPercent") },
    run: { control: "run", label: "Reduce into new sheets" },
  },
  wire: wireReduction,
  applyMode: reductionMode,
};
