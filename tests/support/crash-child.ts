// A push server reduced to its core, run as a child process that the crash test kills with
// SIGKILL. Several device streams push at once through applyPushGrouped, the path production
// uses (their pushes share a transaction and a flush: group commit); each stream prints
// "ACK <stream> <last id>" after the commit that holds its batch.
import { getDb } from "../../src/server/db";
import { applyPushGrouped } from "../../src/server/sync/push";
import { PROTOCOL_VERSION } from "../../src/lib/sync/protocol";

const [memberId, clients, starts] = process.argv.slice(2);
const db = getDb();
const member = db.$client.prepare("select id, email, name, role from members where id = ?").get(memberId) as {
  id: string;
  email: string;
  name: string;
  role: "member";
};

/** The find a stream's mutation id writes, so the test can count them per stream. */
const crashFindId = (stream: number, id: number) => `0190a5f0-0000-7000-800${stream}-${String(id).padStart(12, "0")}`;

async function stream(index: number, clientId: string, start: number) {
  let next = start;
  for (;;) {
    const mutations = Array.from({ length: 20 }, (_, i) => {
      const id = next + i;
      return {
        id,
        name: "find.put",
        args: {
          id: crashFindId(index, id),
          outingId: null,
          claimId: null,
          kind: "nugget",
          weightGrams: id / 100,
          purity: null,
          depthCm: null,
          method: "detecting",
          notes: "",
          lat: null,
          lon: null,
          accuracyM: null,
          locationSource: null,
          foundAt: 1780000000000 + id,
        },
      };
    });
    const res = await applyPushGrouped(member, { protocolVersion: PROTOCOL_VERSION, clientId, mutations });
    process.stdout.write(`ACK ${index} ${res.lastMutationId}\n`);
    next = res.lastMutationId + 1;
  }
}

const startIds = starts.split(",").map(Number);
clients.split(",").forEach((clientId, i) => void stream(i, clientId, startIds[i]));
