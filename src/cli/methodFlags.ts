/**
 * JSON output of the optional reduction methods (slip, orifice, representative rate,
 * extensional viscosity, heating, pressure dependence, transducer uncertainty, melt flow rate).
 * Their flags are reduce settings (src/io/reduceOptions.ts).
 */
import { ReductionGroup, ReductionResult } from "../core/reduce";

/** Additive keys of one flow-curve row in the JSON document (present only when computed). */
export function flowCurveExtrasJson(g: ReductionGroup, i: number): Record<string, number | null> {
  const out: Record<string, number | null> = {};
  const rep = g.representativeRate?.[i];
  if (rep) {
    out.shearRateRepresentative = rep.shearRateRepresentative;
    out.viscosityRepresentative = rep.viscosityRepresentative;
    out.representativeDeviation = rep.deviation;
    out.representativeExpectedDeviation = rep.expectedDeviation;
    out.representativeDeviationCorrected = rep.deviationCorrected;
  }
  const u = g.uncertainty?.[i];
  if (u) {
    out.wallShearStressUncertainty = u.wallShearStress;
    out.shearRateWallUncertainty = u.shearRateWall;
    out.viscosityUncertainty = u.viscosity;
  }
  return out;
}

/** Additive group keys of the JSON document. */
export function groupExtrasJson(g: ReductionGroup): Record<string, unknown> {
  const out: Record<string, unknown> = { geometry: g.geometry };
  if (g.geometry === "slit") {
    out.dieDiameter = null;
    out.slitWidth = g.slitWidth;
    out.slitHeight = g.slitHeight;
  }
  if (g.slitShapeFactor !== undefined) out.slitShapeFactor = g.slitShapeFactor;
  if (g.entrancePressures) out.entrancePressures = g.entrancePressures;
  if (g.extensional) {
    out.extensional = g.extensional.map((e) => ({
      shearRateApparent: e.shearRateApparent,
      shearRateWall: e.shearRateWall,
      entrancePressure: e.entrancePressure,
      tensileStress: e.tensileStress,
      extensionRate: e.extensionRate,
      extensionalViscosity: e.extensionalViscosity,
      troutonRatio: e.troutonRatio,
      shearRateBasis: e.shearRateBasis,
      shearRate: e.shearRate,
      viscosity: e.viscosity,
    }));
  }
  if (g.uncertaintyBudget) out.uncertaintyBudget = g.uncertaintyBudget;
  if (g.heating) out.heating = g.heating;
  if (g.pressureDependence) out.pressureDependence = g.pressureDependence;
  return out;
}

/** Additive top-level keys of the JSON document. */
export function topExtrasJson(result: ReductionResult): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  if (result.slip) {
    out.slip = result.slip.map((s) => ({
      temperature: s.temperature,
      wallShearStress: s.wallShearStress,
      slipVelocity: s.slipVelocity,
      slipApplied: s.slipApplied,
      shearRateApparentCorrected: s.shearRateApparentCorrected,
      slipVelocityStandardError: s.slipVelocityStandardError,
      r2: s.r2,
      nPrime: s.nPrime,
      shearRateWall: s.shearRateWall,
      viscosity: s.viscosity,
    }));
  }
  if (result.meltFlowRate) {
    const { warnings: _w, ...point } = result.meltFlowRate;
    out.meltFlowRate = point;
  }
  return out;
}

