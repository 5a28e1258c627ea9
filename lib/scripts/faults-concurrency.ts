/**
 * Concurrent writes across serving processes: sign-ins (right and wrong passwords), e-mailed
 * sign-in links, deposits paid through the payment fake (its webhooks reach whichever process
 * the kernel hands them to) and messages posted by a client, all at once, against a stack
 * started with several `next start` processes on one SQLite file. Nothing may answer with a
 * server error, no process may log a locked database, and every write must be in the database
 * afterwards (shared by tests/e2e/faults.e2e.ts and `npm run faults`).
 */
import { createClient } from "@libsql/client";
import { DEMO_PASSWORDS, DEMO_USERS } from "@/lib/seed/data";
import { checkDatabase, type CheckReport } from "./faults-core";
import { pendingDeposits } from "./faults-kill";
import type { HardStack } from "./hard-stack";
import { listActions, Session } from "./http-client";
import { busyLines } from "./stack";

export interface ConcurrencyFigures {
  processes: number;
  ms: number;
  /** Right passwords (every demo client account, four at once each) and wrong ones (unknown accounts). */
  signIns: { right: number; rightOk: number; wrong: number; wrongRefused: number };
  links: { asked: number; mailed: number };
  payments: { paid: number; recorded: number };
  messages: { posted: number; stored: number };
  /** Answers with a status of 500 or more, by kind of write. */
  serverErrors: Record<string, number>;
  /** Log lines of any process that reported a locked database. */
  busy: string[];
  check: CheckReport;
}

/** The demo's client accounts (staff sign in with a one-time code, which a parallel copy may not reuse). */
const CLIENTS = DEMO_USERS.filter((u) => u.role === "client" || u.role === "client_admin").map((u) => ({ email: u.email, password: DEMO_PASSWORDS[u.role] }));
/**
 * Right passwords in flight at once per account: each attempt is counted before its check, and an
 * account takes five at a time (lib/auth/throttle.ts EMAIL_RULE), so more than that for one account
 * would be refused by design, not by the database.
 */
const PER_ACCOUNT = 4;

export async function concurrentWrites(stack: HardStack, opts: { wrongSignIns?: number; links?: string[]; payments?: number; messages?: number } = {}): Promise<ConcurrencyFigures> {
  const since = Date.now();
  const serverErrors: Record<string, number> = {};
  const count5xx = (kind: string, status: number) => {
    if (status >= 500) serverErrors[kind] = (serverErrors[kind] ?? 0) + 1;
  };
  const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
  try {
    // Every request comes from one loopback address: start each round with no sign-in counters,
    // so an earlier round's wrong guesses do not lock this round's right ones out.
    await db.execute("DELETE FROM sign_in_attempts");
    // A signed-in client and one of the firm's requests to post messages on.
    const poster = new Session(stack.baseUrl);
    if (!(await poster.signIn(CLIENTS[0]!.email, CLIENTS[0]!.password)).ok) throw new Error("the poster could not sign in");
    const request = String((await db.execute({ sql: "SELECT r.id FROM requests r JOIN users u ON u.id = r.created_by_id WHERE u.email = ? ORDER BY r.reference LIMIT 1", args: [CLIENTS[0]!.email] })).rows[0]!.id);
    const postMessage = listActions(stack.distDir).find((a) => a.name === "postMessage" && /portal\/(\([^/)]+\)\/)?requests\/\[id\]\//.test(a.file));
    if (!postMessage) throw new Error("postMessage action not found in the build");
    const messagePath = `/portal/requests/${request}`;

    // Deposits waiting to be paid: a pending payment and its checkout session for each.
    const sessions = await pendingDeposits(stack, db, opts.payments ?? 6, "concurrency run");

    const wrong = opts.wrongSignIns ?? 10;
    const right = CLIENTS.length * PER_ACCOUNT;
    const links = opts.links ?? ["engineer@caldrith.example", "lead@caldrith.example", "lab@tarnavel.example"];
    const messages = opts.messages ?? 20;
    const tag = `concurrency ${since}`;

    const started = Date.now();
    const work: Promise<unknown>[] = [];
    let rightOk = 0;
    let wrongRefused = 0;
    for (let i = 0; i < right; i++) {
      const who = CLIENTS[i % CLIENTS.length]!;
      work.push(
        new Session(stack.baseUrl).signIn(who.email, who.password).then((r) => {
          if (r.ok) rightOk += 1;
          else if (/error=Configuration/.test(r.location)) count5xx("sign-in", 500);
        }),
      );
    }
    for (let i = 0; i < wrong; i++) {
      work.push(
        new Session(stack.baseUrl).signIn(`nobody${i}@nowhere.example`, "wrong guess").then((r) => {
          if (!r.ok && !/error=Configuration/.test(r.location)) wrongRefused += 1;
          else if (/error=Configuration/.test(r.location)) count5xx("sign-in", 500);
        }),
      );
    }
    for (const address of links) {
      work.push(
        (async () => {
          const s = new Session(stack.baseUrl);
          const { csrfToken } = (await (await s.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
          const res = await s.fetch("/api/auth/signin/email", {
            method: "POST",
            headers: { "content-type": "application/x-www-form-urlencoded" },
            body: new URLSearchParams({ csrfToken, email: address, callbackUrl: `${stack.baseUrl}/after-sign-in` }),
          });
          await res.arrayBuffer();
          count5xx("sign-in link", res.status);
          if (/error=/.test(res.headers.get("location") ?? "")) count5xx("sign-in link", 500);
        })(),
      );
    }
    for (const id of sessions) {
      work.push(
        fetch(`http://127.0.0.1:${stack.ports.stripe}/_fake/pay/${id}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ card: "4242424242424242" }) }).then((r) => {
          count5xx("payment", r.status);
          return r.arrayBuffer();
        }),
      );
    }
    for (let i = 0; i < messages; i++) {
      work.push(poster.callAction({ ...postMessage, pagePath: messagePath }, [{ requestId: request, body: `${tag} #${i}`, uploadIds: [] }]).then((r) => count5xx("message", r.status)));
    }
    await Promise.all(work);

    // Webhooks arrive after the fake's answer: wait until every event is acknowledged.
    const deadline = Date.now() + 60_000;
    for (;;) {
      const events = ((await (await fetch(`http://127.0.0.1:${stack.ports.stripe}/_fake/events`)).json()) as { data: { type: string; delivery: { deliveredAt: number | null; lastStatus?: number } }[] }).data;
      const pending = events.filter((e) => e.type === "checkout.session.completed" && e.delivery.deliveredAt === null);
      if (pending.length === 0) break;
      if (Date.now() > deadline) throw new Error(`${pending.length} webhook events still unacknowledged`);
      await new Promise((r) => setTimeout(r, 250));
    }
    const ms = Date.now() - started;

    const scalar = async (sql: string, args: (string | number)[]) => Number((await db.execute({ sql, args })).rows[0]!.n);
    const mailed = await scalar(
      `SELECT count(DISTINCT to_addresses) AS n FROM email_outbox WHERE created_at >= ? AND subject LIKE '%Sign-in link%' AND (${links.map(() => "to_addresses LIKE ?").join(" OR ")})`,
      [started - 1000, ...links.map((l) => `%${l}%`)],
    );
    const recorded = sessions.length ? await scalar(`SELECT count(*) AS n FROM payments WHERE status = 'paid' AND checkout_session_id IN (${sessions.map(() => "?").join(",")})`, sessions) : 0;
    const stored = await scalar("SELECT count(*) AS n FROM messages WHERE body LIKE ?", [`${tag} #%`]);
    const busy = [stack.app(), stack.fakes].flatMap((p) => busyLines(p));
    return {
      processes: stack.processes,
      ms,
      signIns: { right, rightOk, wrong, wrongRefused },
      links: { asked: links.length, mailed },
      payments: { paid: sessions.length, recorded },
      messages: { posted: messages, stored },
      serverErrors,
      busy,
      check: await checkDatabase(stack.dbUrl, stack.dataDir, since),
    };
  } finally {
    db.close();
  }
}
