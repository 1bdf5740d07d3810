/**
 * Checks against printed values and named results of the literature: unit definitions, the WLF
 * constants and their conversion to another reference temperature, Sampson's orifice flow as an
 * exact entrance loss for the Bagley and orifice methods, the melt-flow-rate test's wall stress,
 * Cogswell's relations, the adiabatic heating of water, the gas constant. Each check names its
 * source; "from memory" marks a value recalled without the text at hand.
 */
import { toSI } from "../src/core/units";
import { GAS_CONSTANT, WLF_UNIVERSAL_C1, WLF_UNIVERSAL_C2, arrheniusShiftFactor, wlfShiftFactor } from "../src/core/temperature/shiftFactors";
import { bagleyCorrection } from "../src/core/bagley";
import { orificeEntrancePressure } from "../src/core/orifice";
import { correctedWallShearStress, apparentShearRate } from "../src/core/capillary";
import { meltFlowPoint } from "../src/core/meltFlowRate";
import { cogswell, cogswellEntrancePressure } from "../src/core/cogswell";
import { adiabaticTemperatureRise, temperatureCoefficientFromShift } from "../src/core/viscousHeating";
import { mooneyLine } from "../src/core/slip";
import { expectClose } from "./helpers/expectClose";

describe("unit definitions", () => {
  test("exact definitions of the customary units", () => {
    // @check units | 1 lbf/in² = 0.45359237 kg · 9.80665 m/s² / (0.0254 m)² = 6894.757293168 Pa | NIST SP 811 (2008), App. B (from memory); international yard and pound (1959) and standard gravity (3rd CGPM 1901) definitions | rel 1e-13 | 1
    expectClose(toSI(1, "psi", "pressure"), (0.45359237 * 9.80665) / 0.0254 ** 2, { rel: 1e-13 });
    // @check units | 1 atm = 101 325 Pa exactly | 10th CGPM (1954), Resolution 4 (from memory) | exact | 1
    expect(toSI(1, "atm", "pressure")).toBe(101325);
    // @check units | 1 kgf = 9.80665 N exactly | 3rd CGPM (1901), standard acceleration of gravity | exact | 1
    expect(toSI(1, "kgf", "force")).toBe(9.80665);
    // @check units | 1 lb = 0.45359237 kg exactly; 1 lb/h | International yard and pound agreement (1959); NIST SP 811 (2008) (from memory) | rel 1e-15 | 2
    expect(toSI(1, "lb", "mass")).toBe(0.45359237);
    expectClose(toSI(3600, "lb/h", "massRate"), 0.45359237, { rel: 1e-15 });
    // @check units | 1 P = 0.1 Pa·s, 1 cP = 1 mPa·s (CGS units) | NIST SP 811 (2008), App. B (from memory) | rel 1e-15 | 2
    expectClose(toSI(1, "P", "viscosity"), 0.1, { rel: 1e-15 });
    expectClose(toSI(1, "cP", "viscosity"), 1e-3, { rel: 1e-15 });
    // @check units | 32 °F = 273.15 K, 212 °F = 373.15 K, −40 °F = −40 °C | NIST SP 811 (2008), App. B.9 (from memory) | rel 1e-14 | 3
    expectClose(toSI(32, "F", "temperature"), 273.15, { rel: 1e-14 });
    expectClose(toSI(212, "F", "temperature"), 373.15, { rel: 1e-14 });
    expectClose(toSI(-40, "F", "temperature"), toSI(-40, "C", "temperature"), { rel: 1e-14 });
  });
  test("the molar gas constant is N_A·k exactly (2019 SI)", () => {
    // @check temperature/shiftFactors | R = N_A·k = 6.02214076e23 · 1.380649e-23 J/(mol·K), to the 10 digits it is quoted with | CODATA 2018 (exact defining constants of the 2019 SI) | rel 1e-10 | 1
    expectClose(GAS_CONSTANT, 6.02214076e23 * 1.380649e-23, { rel: 1e-10 });
  });
});

describe("WLF constants (Williams, Landel & Ferry 1955; Ferry 1980)", () => {
  test("the universal constants at T_ref = T_g", () => {
    // @check temperature/shiftFactors | universal WLF constants C1 = 17.44, C2 = 51.6 K at T_g | Williams, Landel & Ferry, J. Am. Chem. Soc. 77 (1955) 3701 | exact | 2
    expect(WLF_UNIVERSAL_C1).toBe(17.44);
    expect(WLF_UNIVERSAL_C2).toBe(51.6);
  });
  test("moved to T_s = T_g + 50 K they become C1 = 8.86, C2 = 101.6 K (the printed pair)", () => {
    // C1'·C2' = C1·C2 and C2' = C2 + (T_s − T_g); a_T(T; T_s) = a_T(T; T_g)/a_T(T_s; T_g).
    const Tg = 373.15;
    const Ts = Tg + 50;
    for (const T of [Tg + 20, Tg + 50, Tg + 80, Tg + 150]) {
      const shifted = wlfShiftFactor(T, Tg, 17.44, 51.6) / wlfShiftFactor(Ts, Tg, 17.44, 51.6);
      // @check temperature/shiftFactors | a_T referred to T_g + 50 K with the printed constants 8.86 and 101.6 K equals the T_g form, at 4 temperatures | Ferry, Viscoelastic Properties of Polymers, 3rd ed. (1980), ch. 11 (from memory); Williams, Landel & Ferry 1955 | rel 2e-3 in log a_T | 4
      expectClose(Math.log10(wlfShiftFactor(T, Ts, 8.86, 101.6)), Math.log10(shifted), { rel: 2e-3, abs: 1e-9 }, `T = ${T} K`);
    }
  });
  test("Arrhenius b = −d ln a_T/dT = Ea/(R·T²) and WLF b = ln10·C1·C2/(C2 + T − T_ref)²", () => {
    const T = 473.15;
    const h = 1e-3;
    const numericB = (aT: (t: number) => number) => -(Math.log(aT(T + h)) - Math.log(aT(T - h))) / (2 * h);
    // @check viscousHeating | b from the shift law equals −d ln a_T/dT of the law itself (Arrhenius, WLF) | Dealy & Wang, Melt Rheology and Its Applications in the Plastics Industry, 2nd ed. (2013) (from memory); Williams, Landel & Ferry 1955 | rel 1e-6 | 2
    expectClose(temperatureCoefficientFromShift({ law: "arrhenius", referenceTemperature: 463.15, activationEnergy: 45e3 }, T), numericB((t) => arrheniusShiftFactor(t, 463.15, 45e3)), { rel: 1e-6 });
    expectClose(temperatureCoefficientFromShift({ law: "wlf", referenceTemperature: 400, C1: 8.86, C2: 101.6 }, T), numericB((t) => wlfShiftFactor(t, 400, 8.86, 101.6)), { rel: 1e-6 });
  });
});

/**
 * Sampson (1891): creeping Newtonian flow through a circular hole of radius a in a thin wall needs
 * ΔP = 3μQ/a³. Added to Hagen–Poiseuille, ΔP = 8μQL/(πa⁴) + 3μQ/a³, which is Bagley's relation
 * ΔP = 2τ_w(L/R + e) with τ_w = 4μQ/(πa³) and e = 3π/8 ≈ 1.178 radii: entrance plus exit, each
 * 3π/16 ≈ 0.589 since creeping flow is reversible (the sum is Weissberg's approximation for short
 * tubes, Phys. Fluids 5 (1962) 1033; from memory).
 */
describe("Sampson's orifice flow as an exact entrance loss", () => {
  const mu = 250;
  const D = 1e-3;
  const a = D / 2;
  const rates = [5, 20, 80, 320];
  const sampson = (rate: number) => {
    const Q = (rate * Math.PI * a ** 3) / 4;
    return (3 * mu * Q) / a ** 3;
  };
  const tube = (rate: number, L: number) => sampson(rate) + (8 * mu * ((rate * Math.PI * a ** 3) / 4) * L) / (Math.PI * a ** 4);

  test("Bagley's line through three dies gives e = 3π/8 and τ_w = μγ̇_a", () => {
    const points = [10, 20, 40].flatMap((ld) => rates.map((rate) => ({ die: `L/D ${ld}`, lengthOverRadius: 2 * ld, shearRateApparent: rate, pressure: tube(rate, ld * D) })));
    const r = bagleyCorrection(points);
    expect(r.rows).toHaveLength(rates.length);
    for (const row of r.rows) {
      // @check bagley | e = 3π/8 ≈ 1.178 from Sampson's orifice loss plus Hagen–Poiseuille, at 4 rates | Sampson, Phil. Trans. R. Soc. A 182 (1891) 449; Weissberg, Phys. Fluids 5 (1962) 1033 (from memory) | rel 1e-9 | 4
      expectClose(row.endCorrection, (3 * Math.PI) / 8, { rel: 1e-9 });
      expectClose(row.wallShearStress, mu * row.shearRateApparent, { rel: 1e-9 });
      expectClose(row.entrancePressure, sampson(row.shearRateApparent), { rel: 1e-9 });
    }
  });

  test("the orifice method with Sampson's pressure gives τ_w = μγ̇_a", () => {
    const L = 20e-3;
    for (const rate of [7, 50, 200]) {
      const entrance = orificeEntrancePressure(rates, rates.map(sampson), rate) as number;
      // @check orifice | orifice-die pressure interpolated log–log to 3 rates equals Sampson's 3μQ/a³ (linear in Q, so exact) | Sampson, Phil. Trans. R. Soc. A 182 (1891) 449 | rel 1e-12 | 3
      expectClose(entrance, sampson(rate), { rel: 1e-12 });
      const tau = correctedWallShearStress(tube(rate, L), entrance, D, L);
      expectClose(tau, mu * rate, { rel: 1e-12 });
    }
  });
});

describe("melt-flow-rate test (ISO 1133 geometry)", () => {
  test("the 2.16 kg load gives an apparent wall stress of about 1.94e4 Pa", () => {
    // ΔP = m·g_n/(πR_b²) with the standard die 2.095 × 8.000 mm and barrel 9.550 mm.
    const p = meltFlowPoint({ volumeRate: 10e-6 / 600 }, 2.16);
    // @check meltFlowRate | τ_w,app of the 2.16 kg load ≈ 1.94e4 Pa, whatever the flow | Dealy & Wissbrun, Melt Rheology and Its Role in Plastics Processing (1990), melt flow rate section (from memory); ISO 1133-1 geometry | rel 3e-3 | 1
    expectClose(p.wallShearStressApparent, 1.94e4, { rel: 3e-3 });
    // γ̇_a = 32Q/(πD³) of the standard die
    // @check capillary | γ̇_a = 32Q/(πD³): 10 cm³/10 min through the 2.095 mm die | ISO 1133-1 (die bore; from memory); Hagen–Poiseuille wall rate | rel 1e-12 | 1
    expectClose(apparentShearRate(10e-6 / 600, 2.095e-3), (32 * (10e-6 / 600)) / (Math.PI * 2.095e-3 ** 3), { rel: 1e-12 });
  });
});

describe("Cogswell's converging-flow relations (Cogswell 1972)", () => {
  test("σ_E = (3/8)(n+1)ΔP_ent, ε̇ = 4ηγ̇²/(3(n+1)ΔP_ent), and the entrance pressure inverts them", () => {
    for (const n of [0.3, 0.6, 1]) {
      const dp = 2.5e6;
      const c = cogswell(dp, 400, 800, n);
      // @check cogswell | σ_E = (3/8)(n+1)ΔP_ent and ε̇ = 4ηγ̇²/(3(n+1)ΔP_ent) at n = 0.3, 0.6, 1 | Cogswell, Polym. Eng. Sci. 12 (1972) 64; Macosko, Rheology (1994), ch. 6 (from memory) | rel 1e-14 | 6
      expectClose(c.tensileStress, (3 / 8) * (n + 1) * dp, { rel: 1e-14 });
      expectClose(c.extensionRate, (4 * 800 * 400 ** 2) / (3 * (n + 1) * dp), { rel: 1e-14 });
      expectClose(cogswellEntrancePressure(400, 800, c.extensionalViscosity, n), dp, { rel: 1e-12 });
    }
  });
  test("a Newtonian liquid with Trouton's η_E = 3η gives ΔP_ent = (2√6/3)·ηγ̇, e = √6/3 ≈ 0.816", () => {
    // @check cogswell | Cogswell's entrance pressure of a Trouton (η_E = 3η) Newtonian liquid: ΔP_ent = (2√6/3)ηγ̇ | Trouton, Proc. R. Soc. A 77 (1906) 426; Cogswell 1972 | rel 1e-14 | 1
    expectClose(cogswellEntrancePressure(100, 50, 150, 1), ((2 * Math.sqrt(6)) / 3) * 50 * 100, { rel: 1e-14 });
  });
});

describe("adiabatic heating", () => {
  test("water at 20 °C throttled by 10 MPa warms by ΔP/(ρc_p) ≈ 2.394 K", () => {
    // ρ = 998.21 kg/m³, c_p = 4184.1 J/(kg·K) at 20 °C and 0.1 MPa (IAPWS-95, from memory).
    // @check viscousHeating | ΔT_ad = ΔP/(ρc_p) for water at 20 °C, 10 MPa: 2.394 K | IAPWS-95 properties of water (ρ = 998.21 kg/m³, c_p = 4.1841 kJ/(kg·K); from memory) | rel 1e-3 | 1
    expectClose(adiabaticTemperatureRise(10e6, 998.21, 4184.1), 2.394, { rel: 1e-3 });
  });
});

describe("Mooney line arithmetic", () => {
  test("three diameters on a straight line in 1/R: slope 4v_s, intercept the slip-free rate", () => {
    // γ̇_a = γ̇_c + 4v_s/R (Mooney 1931) with γ̇_c = 250 1/s and v_s = 2 mm/s.
    const D = [0.5e-3, 1e-3, 2e-3];
    const r = mooneyLine(D, D.map((d) => 250 + (8 * 2e-3) / d));
    // @check slip | v_s and the slip-free rate from γ̇_a = γ̇_c + 4v_s/R at three diameters | Mooney, J. Rheol. 2 (1931) 210 | rel 1e-12 | 2
    expectClose(r.slipVelocity, 2e-3, { rel: 1e-12 });
    expectClose(r.shearRateApparentCorrected, 250, { rel: 1e-12 });
  });
});
