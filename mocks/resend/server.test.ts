import { createElement } from "react";
import { Resend } from "resend";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { EmailSendError, sendEmail } from "../../lib/email/send";
import { startResendFake, type FakeEmail, type ResendFake } from "./server";

function Hello({ name }: { name: string }) {
  return createElement("html", null, createElement("body", null, createElement("p", null, `Your quote is ready, ${name}.`)));
}

describe("Resend fake with the real SDK", () => {
  let fake: ResendFake;
  const stored: FakeEmail[] = [];
  let failStore = false;
  let resend: Resend;

  beforeAll(async () => {
    fake = await startResendFake({
      port: 0,
      store: (m) => {
        if (failStore) throw new Error("disk full");
        stored.push(m);
      },
      log: () => {},
    });
    resend = new Resend("re_test_suite", { baseUrl: fake.url });
  });
  afterAll(async () => fake.close());
  beforeEach(() => {
    stored.length = 0;
    failStore = false;
  });

  it("stores a message sent with sendEmail (rendered HTML and text) and returns its id", async () => {
    const { id } = await sendEmail(
      { to: "buyer@bramblewake.example", subject: "Quote Q-12 is ready", react: createElement(Hello, { name: "Ada" }), tags: [{ name: "template", value: "quote-ready" }], from: "Ostrevane Additive Works <orders@ostrevane.example>" },
      resend,
    );
    expect(id).toMatch(/^[0-9a-f-]{36}$/);
    expect(stored).toHaveLength(1);
    const m = stored[0]!;
    expect(m).toMatchObject({ id, to: ["buyer@bramblewake.example"], subject: "Quote Q-12 is ready", from: "Ostrevane Additive Works <orders@ostrevane.example>", tags: [{ name: "template", value: "quote-ready" }] });
    expect(m.html).toContain("<p>Your quote is ready, Ada.</p>");
    expect(m.text).toContain("Your quote is ready, Ada.");
    const got = await resend.emails.get(id);
    expect(got.data?.subject).toBe("Quote Q-12 is ready");
  });

  it("returns validation errors as { error } in Resend's shape, and sendEmail throws them clearly", async () => {
    const bad = await resend.emails.send({ from: "not an address", to: "x@y.example", subject: "s", text: "t" });
    expect(bad.data).toBeNull();
    expect(bad.error).toMatchObject({ statusCode: 422, name: "validation_error" });
    expect(bad.error!.message).toContain("`from`");
    const noTo = await resend.emails.send({ from: "a@b.example", to: [], subject: "s", text: "t" });
    expect(noTo.error).toMatchObject({ statusCode: 422 });
    const err = await sendEmail({ to: "bad@", subject: "Hello", react: createElement(Hello, { name: "x" }), from: "a@b.example" }, resend).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(EmailSendError);
    expect(err).toMatchObject({ errorName: "validation_error", statusCode: 422 });
    expect((err as Error).message).toContain("Invalid `to` field");
    expect(stored).toHaveLength(0);
  });

  it("refuses a request without a bearer key (401 missing_api_key)", async () => {
    const res = await fetch(`${fake.url}/emails`, { method: "POST", headers: { "content-type": "application/json" }, body: "{}" });
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ name: "missing_api_key", statusCode: 401 });
  });

  it("sends a batch, refusing the whole batch when one message is invalid", async () => {
    const ok = await resend.batch.send([
      { from: "a@b.example", to: "one@c.example", subject: "1", text: "one" },
      { from: "a@b.example", to: ["two@c.example"], subject: "2", html: "<p>two</p>" },
    ]);
    expect(ok.error).toBeNull();
    expect(ok.data?.data).toHaveLength(2);
    expect(stored.map((m) => m.subject)).toEqual(["1", "2"]);
    const bad = await resend.batch.send([
      { from: "a@b.example", to: "three@c.example", subject: "3", text: "t" },
      { from: "a@b.example", to: "four@c.example", subject: "", text: "t" },
    ]);
    expect(bad.error).toMatchObject({ statusCode: 422, name: "missing_required_field" });
    expect(stored).toHaveLength(2);
  });

  it("answers 500 application_error when storing fails, and sendEmail throws", async () => {
    failStore = true;
    const err = await sendEmail({ to: "x@y.example", subject: "S", react: createElement(Hello, { name: "x" }), from: "a@b.example" }, resend).catch((e: unknown) => e);
    expect(err).toMatchObject({ errorName: "application_error", statusCode: 500 });
  });
});
