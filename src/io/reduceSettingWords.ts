/**
 * The words of the reduce settings of src/io/reduceOptions.ts: the plain label the pane shows, one
 * line of help (command-line help, pane help, docs), and help per choice. Kept apart from the
 * settings table so the worksheet-function bundle, which reads settings but shows no help, does
 * not carry them; test/reduceOptions.test.ts keeps the two key sets equal.
 */
import { DEFAULT_ORIFICE_OPTIONS } from "../core/orifice";
import { DEFAULT_RABINOWITSCH_OPTIONS } from "../core/rabinowitsch";
import { DEFAULT_REPEAT_OPTIONS } from "../core/speedSteps";
import { DEFAULT_UNCERTAINTY_OPTIONS } from "../core/uncertainty";
import { DEFAULT_UNCERTAINTY_BUDGET_OPTIONS } from "../core/uncertaintyBudget";
import { MODEL_IDS } from "../core/models";
import { DEFAULT_FLOW_CURVE_MODELS, defaultModels } from "../core/flowCurveFits";
import { MASTER_MODELS } from "../core/temperature/masterFit";
import { REDUCE_SETTINGS } from "./reduceOptions";
import { DEFAULT_REDUCE_OPTIONS } from "../core/reduceTypes";
import { DEFAULT_STEP_OPTIONS } from "../core/steps/options";

/** Label, help and per-choice help of one setting. */
export interface ReduceSettingWords {
  /** plain label as the pane shows it */
  label: string;
  /** one line: what it does */
  help: string;
  /** help per choice, for choices */
  choiceHelp?: Readonly<Record<string, string>>;
}

export const REDUCE_SETTING_WORDS: Readonly<Record<string, ReduceSettingWords>> = Object.freeze({
  barrelDiameter: {
    label: "Barrel bore",
    help: 'barrel bore when the data have no barrel_diameter column, e.g. "15 mm" (piston speed → flow rate)',
  },
  density: {
    label: "Melt density",
    help: 'melt density when the data have no density column, e.g. "0.76 g/cm3" (mass rate → flow rate; MFR)',
  },
  temperatureTolerance: {
    label: "Temperature tolerance",
    help: `temperature readings closer than this form one set-point, reported at their mean with their spread, e.g. "2 K" (default ${DEFAULT_REDUCE_OPTIONS.temperatureTolerance} K)`,
  },
  unsteady: {
    label: "Steps that never settle",
    help: `pressure recordings: exclude (default) or keep, flagged, the steps whose pressure never becomes steady`,
    choiceHelp: {
      exclude: "Leaves a step out of the flow curve when its pressure still drifts, or it is cut short (a warning names it).",
      keep: "Keeps such a step in the flow curve with its warning: its plateau may be off by the drift.",
    },
  },
  speedTolerance: {
    label: "Speed change that starts a step",
    help: `pressure recordings: a piston-speed change beyond this starts a new step (default ${DEFAULT_STEP_OPTIONS.speedTolerance * 100} %)`,
  },
  minWindowTime: {
    label: "Shortest steady window",
    help: `pressure recordings: the plateau is read over at least this long (default ${DEFAULT_STEP_OPTIONS.minWindowTime} s)`,
  },
  driftLimit: {
    label: "Drift limit (noise sd)",
    help: `pressure recordings: steady when the drift over the window is at most this many noise standard deviations (default ${DEFAULT_STEP_OPTIONS.driftLimit})`,
  },
  timeConstant: {
    label: "Time constant of the pressure",
    help: "pressure recordings: time constant τ of the pressure's approach after a speed change (default: read off each step)",
  },
  compressibility: {
    label: "Melt compressibility",
    help: 'pressure recordings: melt compressibility β, e.g. "1 1/GPa"; with the melt volume gives τ = β·V·ΔP/Q as in the planner',
  },
  meltVolume: {
    label: "Melt volume in the barrel",
    help: 'pressure recordings: melt volume in the barrel, e.g. "25 cm3" (with the compressibility)',
  },
  oscillationLimit: {
    label: "Oscillation reported above",
    help: `pressure recordings: a pressure oscillation larger than this, peak to peak, is reported as flow instability (default ${DEFAULT_STEP_OPTIONS.oscillationLimit * 100} %)`,
  },
  thermalCheckLimit: {
    label: "Repeated first speed: largest change",
    help: `pressure recordings: the first speed repeated at the end of a die run may change its pressure by this much (default ${DEFAULT_STEP_OPTIONS.thermalCheckLimit * 100} %)`,
  },
  endCorrection: {
    label: "End correction",
    help: "bagley (default), orifice (needs an orifice die), or none",
    choiceHelp: {
      bagley: "Fits pressure against L/R over dies of one bore at each rate and removes the entrance loss (needs two or more die lengths).",
      orifice: "Subtracts the pressure of an orifice die (L/D below 1) at the same rate from the longest die: one long die is enough.",
      none: "Uses the longest die as measured: quick, but the wall stress still includes the entrance loss and reads high.",
    },
  },
  orifice: {
    label: "Orifice end correction",
    help: "same as --end-correction orifice: subtract an orifice die's pressure (L/D < 1) at the same rate",
  },
  orificeMaxLengthOverDiameter: {
    label: "Orifice limit L/D",
    help: `dies with L/D (L/H) below this are orifice dies (default ${DEFAULT_ORIFICE_OPTIONS.maxLengthOverDiameter})`,
  },
  rabinowitschMethod: {
    label: "Rabinowitsch slope method",
    help: "Rabinowitsch slope method: transition (default), local, global, difference",
    choiceHelp: {
      transition: "The S-shaped curve of a melt (Carreau–Yasuda in log stress vs log rate), or of a paste, differentiated exactly; kept under noise, the most accurate on melt data (default).",
      local: "A low-order polynomial over a few neighbouring points at each rate; follows local bends.",
      global: "One polynomial of degree 1–3 through all points; simple, but biased at the ends of the range.",
      difference: "Slopes between neighbouring points; no smoothing, so noise shows through. For comparison.",
    },
  },
  rabinowitschDegree: {
    label: "Polynomial degree",
    help: "polynomial degree for the local (1–2) or global (1–3) method",
  },
  rabinowitschWindow: {
    label: "Points per local fit",
    help: `points per local fit (odd, at least 3; default ${DEFAULT_RABINOWITSCH_OPTIONS.window})`,
  },
  stabilityThreshold: {
    label: "Repeat stability limit",
    help: `a speed run again (the stability check) whose pressure differs from the first reading by more than this has drifted: the first reading alone is used (default ${DEFAULT_REPEAT_OPTIONS.stabilityThreshold * 100} %)`,
  },
  slitEdgeCorrection: {
    label: "Slit edge correction",
    help: "slit dies: divide the true wall rate by the channel's Newtonian shape factor (finite width; 6.7 % at W/H = 10)",
  },
  transducer: {
    label: "Pressure transducer",
    help: 'pressure transducer "full scale, accuracy", e.g. "1000 bar, 0.25 %": low-reading flags and ± columns (k = 2)',
  },
  transducerFullScale: {
    label: "Transducer full scale",
    help: `full scale of the pressure transducer; readings above it or below ${DEFAULT_UNCERTAINTY_OPTIONS.minFractionOfFullScale * 100} % of it are flagged, and the flow curve gets ± columns`,
  },
  transducerAccuracy: {
    label: "Transducer accuracy",
    help: "accuracy in % of full scale from the transducer's certificate; gives the ± columns (k = 2, about 95 %)",
  },
  transducerZeroOffset: {
    label: "Transducer zero offset (±)",
    help: "± zero offset of the transducer, shared by every reading (default: the accuracy × full scale); cancels in the Bagley slope",
  },
  transducerGainError: {
    label: "Transducer gain error (±)",
    help: "± gain (span) error of the transducer in % of the reading, shared by every reading (default: the accuracy)",
  },
  dieBoreTolerance: {
    label: "Die bore tolerance (±)",
    help: `± tolerance of each die's bore (slit: gap and width) for the uncertainty budget (default ${DEFAULT_UNCERTAINTY_BUDGET_OPTIONS.dieBoreTolerance * 1e3} mm)`,
  },
  dieLengthTolerance: {
    label: "Die length tolerance (±)",
    help: `± tolerance of each die's length for the uncertainty budget (default ${DEFAULT_UNCERTAINTY_BUDGET_OPTIONS.dieLengthTolerance * 1e3} mm)`,
  },
  meltTemperatureTolerance: {
    label: "Melt temperature tolerance (±)",
    help: `± deviation of the melt from its set temperature, propagated through the shift law (default ${DEFAULT_UNCERTAINTY_BUDGET_OPTIONS.meltTemperatureTolerance} K)`,
  },
  pistonSpeedTolerance: {
    label: "Piston speed tolerance (±)",
    help: `± error of the flow rate (piston speed and barrel bore) in % (default ${DEFAULT_UNCERTAINTY_BUDGET_OPTIONS.pistonSpeedTolerance * 100} %)`,
  },
  representativeRate: {
    label: "Representative-rate cross-check",
    help: "representative-rate (Schümmer) viscosity beside the Rabinowitsch result",
  },
  slip: {
    label: "Wall slip (Mooney)",
    help: "Mooney wall-slip analysis across two or more die diameters per temperature",
  },
  extensional: {
    label: "Extensional viscosity (Cogswell)",
    help: "Cogswell extensional viscosity and Trouton ratio from the entrance pressure",
  },
  cogswellShearRate: {
    label: "Cogswell shear rate",
    help: "shear rate of the Cogswell formulas: apparent (default, as Cogswell 1972) or wall (Rabinowitsch-corrected); the Trouton ratio is the same",
    choiceHelp: {
      apparent: "Apparent wall rate 4Q/(πR³) with the apparent viscosity, as in Cogswell's derivation (default).",
      wall: "True (Rabinowitsch-corrected) wall rate with the true viscosity: extension rate higher and extensional viscosity lower by (3n′+1)/(4n′).",
    },
  },
  pressureDependence: {
    label: "Pressure dependence",
    help: "curvature of the Bagley lines and the pressure coefficient of viscosity (three or more dies)",
  },
  heating: {
    label: "Viscous heating",
    help: 'viscous heating: "density=0.76 g/cm3, cp=2.1 kJ/(kg.K), k=0.18 W/(m.K), b=0.03 1/K" (b optional: fitted across temperatures)',
  },
  heatingDensity: {
    label: "Melt density (heating)",
    help: "melt density at test temperature",
  },
  heatingHeatCapacity: {
    label: "Specific heat",
    help: "specific heat of the melt",
  },
  heatingConductivity: {
    label: "Thermal conductivity",
    help: "thermal conductivity of the melt",
  },
  heatingTemperatureCoefficient: {
    label: "Temperature coefficient b",
    help: "b = −d ln aT/dT, the shift-law coefficient (Ea/(R·T²)); leave empty to fit it across the temperatures of the data",
  },
  meltFlowRate: {
    label: "Melt-flow-rate result",
    help: 'melt-flow-rate result "value unit, load", e.g. "12 g/10min, 2.16 kg" (MFR, needs the density) or "16 cm3/10min, 2.16 kg" (MVR)',
  },
  model: {
    label: "Model",
    help: `fit one viscosity model to each group's true flow curve: ${MODEL_IDS.join(", ")} (cross-wlf is fitted across the temperatures, as --master cross-wlf)`,
  },
  compare: {
    label: "Models to compare",
    help: `rank models by AIC per group, e.g. power-law,cross,carreau-yasuda (default: ${defaultModels("melt").join(", ")}; a paste adds ${DEFAULT_FLOW_CURVE_MODELS.filter((m) => !defaultModels("melt").includes(m)).join(", ")})`,
  },
  shift: {
    label: "Temperature shift",
    help: "fit a temperature shift over the groups' flow curves: arrhenius or wlf (needs --tref on the command line)",
    choiceHelp: {
      none: "No shift: each temperature is reported on its own.",
      arrhenius: "Arrhenius shift aT = exp[(Ea/R)(1/T − 1/Tref)]: fits the activation energy Ea; suits melts well above Tg.",
      wlf: "WLF shift log aT = −C1(T − Tref)/(C2 + T − Tref): fits C1 and C2; suits melts within about 100 K of Tg.",
    },
  },
  referenceTemperature: {
    label: "Reference temperature",
    help: 'reference temperature of the shift, e.g. "210 C" or "483.15 K" (pane: empty = the middle temperature of the data)',
  },
  glassTransitionTemperature: {
    label: "Glass transition temperature",
    help: 'WLF: when the data cannot fit C2, hold it at the universal 51.6 K converted to the reference temperature with this Tg, e.g. "100 C"',
  },
  verticalShift: {
    label: "Vertical shift (melt expansion)",
    help: 'apply the vertical shift ρ(T)T/(ρref·Tref) to the viscosities, with the melt\'s volumetric expansion coefficient, e.g. "7e-4 1/K" (0: T/Tref only)',
  },
  material: {
    label: "Material class",
    help: "melt (default) or paste: yield-stress models and a free infinite-shear viscosity only for a paste or suspension (or when named)",
    choiceHelp: {
      melt: "Polymer melt: power law to Carreau–Yasuda with η∞ held at 0; no yield stress unless a yield-stress model is named.",
      paste: "Paste, suspension or gel: adds Bingham, Herschel–Bulkley and Casson to the default models and fits η∞.",
    },
  },
  master: {
    label: "Fit across temperatures",
    help: `fit one model to every temperature at once with the --shift law: ${MASTER_MODELS.join(", ")} (cross-wlf needs no --shift)`,
    choiceHelp: {
      "power-law": "Power law × the temperature law: K and n at Tref with Ea (or c1, c2).",
      cross: "Cross × the temperature law: η0, λ and m at Tref with Ea (or c1, c2).",
      carreau: "Carreau × the temperature law: η0, λ and n at Tref with Ea (or c1, c2).",
      "carreau-yasuda": "Carreau–Yasuda × the temperature law: η0, λ, n and a at Tref with Ea (or c1, c2).",
      "cross-wlf": "Cross-WLF (Hieber & Shen 1980) with its moulding-simulation constants n, τ*, D1, D2, D3 (held 0), A1, Ã2 (51.6 K).",
    },
  },
  crossWlfD2: {
    label: "Cross-WLF D2 (T*)",
    help: 'hold Cross-WLF\'s D2 = T* (commonly the glass transition), e.g. "-20 C"; without it D2 is fitted',
  },
  rotational: {
    label: "Rotational data",
    help: "rotational-rheometer curve to join (CSV: angular_frequency [rad/s] + complex_viscosity [Pa.s], or shear_rate [1/s] + viscosity [Pa.s]; optional temperature [C])",
  },
  si: {
    label: "Bare numbers are SI",
    help: "read numbers given without a unit in SI units (m, Pa, kg/m3, J/(kg.K), W/(m.K), 1/K); without it a unit is required",
  },
});

/** The command-line flag table of `reduce` (flag → takes a value, description), from the settings table. */
export function reduceSettingFlags(): Record<string, { value: boolean; description: string }> {
  const out: Record<string, { value: boolean; description: string }> = {};
  for (const s of REDUCE_SETTINGS) if (s.flag !== null) out[s.flag] = { value: s.kind.type !== "switch", description: REDUCE_SETTING_WORDS[s.key]?.help ?? "" };
  return out;
}
