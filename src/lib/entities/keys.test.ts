import { describe, expect, it } from "vitest";
import { answerSchema } from "./answer";
import { barrenRockSchema } from "./barren-rock";
import { claimViewSchema } from "./claim";
import { findSchema } from "./find";
import { CLAIM_KEYS, RECORD_KEYS } from "./keys";
import { outingSchema } from "./outing";
import { photoSchema } from "./photo";
import { scaleSchema } from "./scale";
import { weighInSchema } from "./weigh-in";

describe("the sync key lists", () => {
  it("name exactly each entity schema's fields", () => {
    const schemas = {
      outing: outingSchema,
      find: findSchema,
      photo: photoSchema,
      weighIn: weighInSchema,
      scale: scaleSchema,
      barrenRock: barrenRockSchema,
      answer: answerSchema,
    };
    for (const [entity, schema] of Object.entries(schemas)) {
      expect([...RECORD_KEYS[entity as keyof typeof schemas]].sort(), entity).toEqual(Object.keys(schema.shape).sort());
    }
    expect([...CLAIM_KEYS].sort()).toEqual(Object.keys(claimViewSchema.shape).sort());
  });
});
