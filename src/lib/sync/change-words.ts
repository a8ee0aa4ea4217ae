/** What each kind of record is called on the member's camp sync screen. */
export const ENTITY_WORDS: Record<string, string> = {
  outing: "Outing",
  find: "Find",
  photo: "Photo",
  weighIn: "Weigh-in",
  scale: "Scale",
  barrenRock: "Barren-rock piece",
  answer: "Answer to a query",
  settings: "Settings",
};

/** A waiting change in words ("Find saved", "Photo deleted"), never its internal name. */
export function changeWords(name: string): string {
  const [entity, op] = name.split(".");
  const what = ENTITY_WORDS[entity] ?? "Change";
  return `${what} ${op === "delete" ? "deleted" : "saved"}`;
}
