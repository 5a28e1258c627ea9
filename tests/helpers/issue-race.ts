/**
 * One "server process" of the numbering race (tests/integration/documents.test.ts): issues
 * `count` documents into the database at `url`, rolling back every fifth after its number was
 * taken, and prints the numbers it committed as JSON. Several run at once against one file.
 * All start together at `startAtMs` (epoch ms), so their transactions interleave.
 * Usage: tsx tests/helpers/issue-race.ts <url> <requestId> <orgId> <count> <tag> <startAtMs>
 */
import { createClient } from "@libsql/client";
import { drizzle } from "drizzle-orm/libsql";
import { insertIssuedDocument } from "../../db/queries/issued-documents";
import * as schema from "../../db/schema";

const [url, requestId, orgId, countText, tag, startAtText] = process.argv.slice(2);
const client = createClient({ url: url!, timeout: 30_000 });
const db = drizzle(client, { schema });
const committed: string[] = [];
await new Promise((r) => setTimeout(r, Math.max(0, Number(startAtText) - Date.now())));
let rolledBack = 0;
for (let i = 0; i < Number(countText); i++) {
  try {
    const n = await db.transaction(async (tx) => {
      const doc = await insertIssuedDocument(tx, { kind: "packing_list", sourceId: `race-${tag}-${i}`, requestId: requestId!, orgId: orgId!, data: {}, issuedAt: new Date(Date.UTC(2031, 4, 1)) });
      if (i % 5 === 0) throw new Error("rolled back on purpose");
      return doc.number;
    });
    committed.push(n);
  } catch (e) {
    if (!String((e as Error).message).includes("on purpose")) throw e;
    rolledBack += 1;
  }
  // A breath between documents, as between requests, so the other processes get the lock too.
  await new Promise((r) => setTimeout(r, 1 + Math.floor(Math.random() * 4)));
}
client.close();
process.stdout.write(JSON.stringify({ committed, rolledBack }));
