// A push server reduced to its core, run as a child process that the crash test kills with
// SIGKILL: it applies batches through the real applyPush and prints "ACK n" after each commit.
import { getDb } from "../../src/server/db";
import { applyPush } from "../../src/server/sync/push";
import { PROTOCOL_VERSION } from "../../src/lib/sync/protocol";

const [memberId, clientId, startArg] = process.argv.slice(2);
const db = getDb();
const member = db.$client.prepare("select id, email, name, role from members where id = ?").get(memberId) as { id: string; email: string; name: string; role: "member" };
let next = Number(startArg);
for (;;) {
  const mutations = Array.from({ length: 20 }, (_, i) => {
    const id = next + i;
    const findId = `0190a5f0-0000-7000-8000-${String(id).padStart(12, "0")}`;
    return { id, name: "find.put", args: { id: findId, outingId: null, claimId: null, kind: "nugget", weightGrams: id / 100, depthCm: null, method: "detecting", notes: "", lat: null, lon: null, accuracyM: null, locationSource: null, foundAt: 1780000000000 + id } };
  });
  const res = applyPush(member, { protocolVersion: PROTOCOL_VERSION, clientId, mutations });
  process.stdout.write(`ACK ${res.lastMutationId}\n`);
  next = res.lastMutationId + 1;
}
