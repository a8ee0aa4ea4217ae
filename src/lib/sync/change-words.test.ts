import { describe, expect, it } from "vitest";
import { changeWords, ENTITY_WORDS } from "./change-words";
import { MUTATION_ARGS } from "./mutations";

describe("waiting changes in words (issue 19)", () => {
  it("has words for every kind of change a device can send", () => {
    for (const name of Object.keys(MUTATION_ARGS)) expect(ENTITY_WORDS[name.split(".")[0]], name).toBeDefined();
  });
  it("says what happened, not the change's internal name", () => {
    expect(changeWords("find.put")).toBe("Find saved");
    expect(changeWords("weighIn.delete")).toBe("Weigh-in deleted");
    expect(changeWords("settings.put")).toBe("Settings saved");
  });
});
