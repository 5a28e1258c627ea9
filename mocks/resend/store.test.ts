import { existsSync, mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { openMailStore } from "./store";

const dir = mkdtempSync(path.join(os.tmpdir(), "mail-fake-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("e-mail fake mailbox", () => {
  it("keeps messages in its own file, newest first per recipient, across reopening", async () => {
    const base = { from: "orders@ostrevane.example", cc: [], bcc: [], replyTo: [], html: "<p>x</p>", text: "x", tags: [], headers: {} };
    const box = await openMailStore(dir);
    await box.store({ ...base, id: "a", to: ["Buyer@Bramblewake.example"], subject: "first", createdAt: new Date(1000) });
    await box.store({ ...base, id: "b", to: ["other@caldrith.example"], bcc: ["buyer@bramblewake.example"], subject: "second", createdAt: new Date(2000) });
    box.close();
    expect(existsSync(path.join(dir, "mail-fake.db"))).toBe(true);
    expect(existsSync(path.join(dir, "layerwright.db"))).toBe(false);
    const again = await openMailStore(dir);
    const mails = await again.listTo("buyer@bramblewake.example");
    expect(mails.map((m) => m.subject)).toEqual(["second", "first"]);
    expect(mails[0]!.createdAt.getTime()).toBe(2000);
    again.close();
  });
});
