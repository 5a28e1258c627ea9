/**
 * `npm run demo`: migrate, seed (first run, or with --reseed), build when needed, then start the
 * local fakes and the app on http://localhost:3000. Ctrl-C stops everything.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { createClient } from "@libsql/client";
import { openDb } from "../../db/client";
import { seed } from "@/lib/seed/seed";
import { DEMO_PASSWORDS, DEMO_USERS } from "@/lib/seed/data";
import { migrateDatabase } from "./migrate";
import { DEMO_PORTS, root, startStack, stackEnv } from "./stack";

async function main() {
  const dataDir = path.resolve(root, process.env.DATA_DIR ?? "data");
  mkdirSync(dataDir, { recursive: true });
  const env = stackEnv(DEMO_PORTS, dataDir, {}, "localhost");
  const dbUrl = env.DATABASE_URL!;

  await migrateDatabase(dbUrl);
  const probe = createClient({ url: dbUrl });
  const users = Number((await probe.execute("SELECT count(*) AS n FROM users")).rows[0]?.n ?? 0);
  probe.close();
  if (users === 0 || process.argv.includes("--reseed")) {
    const { db, client } = openDb(dbUrl);
    await seed(db, { dataDir, fileBaseUrl: env.UPLOADTHING_FILE_BASE_URL });
    client.close();
  } else {
    console.log("Database already seeded (npm run demo -- --reseed starts over).");
  }

  if (!existsSync(path.join(root, ".next", "BUILD_ID")) || process.argv.includes("--rebuild")) {
    console.log("Building the app (about a minute the first time)…");
    const r = spawnSync("npm", ["run", "build"], { cwd: root, stdio: "inherit", env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1" } });
    if (r.status !== 0) process.exit(r.status ?? 1);
  }

  const stack = await startStack({ ports: DEMO_PORTS, dataDir, distDir: ".next", host: "localhost" });
  console.log(`\nLayerwright is running at http://localhost:${DEMO_PORTS.app}`);
  console.log("Demo accounts (e-mail / password):");
  for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(13)} ${u.email.padEnd(30)} ${DEMO_PASSWORDS[u.role]}`);
  console.log("E-mail goes to the outbox: sign in as admin and open /admin/outbox. Ctrl-C stops.");

  const shutdown = () => {
    void stack.stop().then(() => process.exit(0));
  };
  process.on("SIGINT", shutdown);
  process.on("SIGTERM", shutdown);
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : String(e));
  process.exit(1);
});
