/** Display names of models in sentences the core writes with ids (src/io/displayNames.ts). */
import { MODEL_NAMES, modelName, modelNamesIn } from "../src/io/displayNames";

describe("modelNamesIn(text)", () => {
  test("every model id in a verdict sentence becomes its display name, the longer id first", () => {
    expect(modelNamesIn("carreau-yasuda is the adequate, well-determined model of lowest AIC; carreau and cross were passed over")).toBe(
      `${modelName("carreau-yasuda")} is the adequate, well-determined model of lowest AIC; ${modelName("carreau")} and ${modelName("cross")} were passed over`,
    );
  });
  test("ids inside other words or hyphenated words are left alone", () => {
    expect(modelNamesIn("crossover and well-determined; cross-wlf")).toBe(`crossover and well-determined; ${modelName("cross-wlf")}`);
  });
  test("each id of the registry is replaced", () => {
    for (const id of Object.keys(MODEL_NAMES)) expect(modelNamesIn(`(${id})`)).toBe(`(${modelName(id)})`);
  });
});
