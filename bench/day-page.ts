// Bundled into a Chromium page of the app by the bench (iife `lodebookBenchDay`): a member's
// day of work written on the device by the app's own code (its write path, its shrinking).
import { LodebookDb } from "../src/client/device-db";
import { newId, saveFind, saveWeighIn } from "../src/client/logbook";
import { addPhoto } from "../src/client/photos";
import { estimateSpecimen } from "../src/lib/estimate";
import { anotherShot, cameraJpeg } from "./photo-page";

/**
 * 30 finds (two photos each, from 12 MP camera JPEGs of painted specimens) and 40 weigh-ins on
 * the specimens among them. `seeds` distinct paintings, each shot again a little shifted, so
 * every photo's bytes differ.
 */
export async function writeDayOfWork(memberId: string, counts = { finds: 30, photosPerFind: 2, weighIns: 40 }, seeds = 6) {
  const db = new LodebookDb(`lodebook-member-${memberId}`);
  const paintings: Blob[] = [];
  for (let s = 0; s < seeds; s++) paintings.push(await cameraJpeg(100 + s));
  const day = Date.now() - 8 * 3600_000;
  const findIds: string[] = [];
  let photoBytes = 0;
  let shot = 0;
  for (let f = 0; f < counts.finds; f++) {
    const id = newId();
    const specimen = f % 3 !== 2;
    await saveFind(db, {
      id,
      outingId: null,
      claimId: null,
      kind: specimen ? "specimen" : "nugget",
      weightGrams: 20 + f,
      purity: null,
      depthCm: 15,
      method: "detecting",
      notes: `Bench find ${f + 1}`,
      lat: 41.8 + f / 1e4,
      lon: -117.61,
      accuracyM: 5,
      locationSource: "device",
      foundAt: day + f * 600_000,
    });
    findIds.push(id);
    for (let p = 0; p < counts.photosPerFind; p++) {
      const file = await anotherShot(paintings[shot % seeds], Math.floor(shot / seeds));
      shot++;
      photoBytes += (await addPhoto(db, id, file)).photo.bytes;
    }
  }
  const specimens = findIds.filter((_, f) => f % 3 !== 2);
  for (let w = 0; w < counts.weighIns; w++) {
    const input = {
      method: "hanging" as const,
      airGrams: [40 + w / 10, 40.01 + w / 10],
      waterGrams: [24.6 + w / 20],
      finenessPermille: 825,
      finenessRangePermille: [700, 950] as [number, number],
    };
    await saveWeighIn(db, {
      id: newId(),
      findId: specimens[w % specimens.length],
      input,
      deviceEstimate: estimateSpecimen(input),
      weighedAt: day + 9 * 3600_000 + w * 60_000,
      scaleId: null,
      scaleCheck: null,
    });
  }
  db.close();
  return { findIds, photoBytes };
}
