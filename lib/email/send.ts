import "server-only";
import { createHash } from "node:crypto";
import { render } from "@react-email/render";
import type { ReactElement } from "react";
import { Resend } from "resend";
import { getDb } from "../../db/client";
import { createOutboxMessage } from "../../db/queries/outbox";
import { env } from "../env";

export interface SendEmailInput {
  to: string | string[];
  subject: string;
  /** A react-email template element, e.g. `createElement(WelcomeEmail, props)`. */
  react: ReactElement;
  /** Plain-text part; rendered from the template when omitted. */
  text?: string;
  /** Resend tags: ASCII letters, digits, `_` and `-` only. */
  tags?: { name: string; value: string }[];
  from?: string;
  replyTo?: string | string[];
  /** Resend de-duplicates sends with the same key for 24 h. */
  idempotencyKey?: string;
  /** Files sent with the message (issued documents' PDFs). */
  attachments?: { filename: string; content: Buffer; contentType?: string }[];
}

/** A send the e-mail API refused or could not take; `name` is Resend's error name. */
export class EmailSendError extends Error {
  constructor(
    message: string,
    readonly errorName: string,
    readonly statusCode: number | null,
  ) {
    super(message);
    this.name = "EmailSendError";
  }
}

let client: Resend | undefined;

/**
 * The one Resend client. `RESEND_BASE_URL` points it at the local fake (mocks/resend); unset,
 * the SDK talks to the hosted API.
 */
export function getResend(): Resend {
  if (!client) {
    const e = env();
    client = new Resend(e.RESEND_API_KEY, e.RESEND_BASE_URL ? { baseUrl: e.RESEND_BASE_URL.replace(/\/$/, "") } : undefined);
  }
  return client;
}

/** For tests that change the environment between cases. */
export function resetResendClient(): void {
  client = undefined;
}

/**
 * Render a react-email template to HTML (and plain text) and send it through Resend. The SDK
 * answers `{ data, error }` and does not throw on API errors; this throws `EmailSendError` so a
 * failed send is never mistaken for a sent one. What the API accepted is written to the app's
 * outbox (the back office's list of sent mail). Returns the provider's message id.
 */
export async function sendEmail(input: SendEmailInput, resend: Resend = getResend()): Promise<{ id: string }> {
  const html = await render(input.react);
  const text = input.text ?? (await render(input.react, { plainText: true }));
  const from = input.from ?? env().EMAIL_FROM;
  let result: Awaited<ReturnType<Resend["emails"]["send"]>>;
  try {
    result = await resend.emails.send(
      {
        from,
        to: input.to,
        subject: input.subject,
        html,
        text,
        tags: input.tags,
        replyTo: input.replyTo,
        attachments: input.attachments?.map((a) => ({ filename: a.filename, content: a.content, contentType: a.contentType })),
      },
      input.idempotencyKey ? { idempotencyKey: input.idempotencyKey } : undefined,
    );
  } catch (e) {
    throw new EmailSendError(`E-mail "${input.subject}" could not be sent: ${(e as Error).message}`, "network_error", null);
  }
  const { data, error } = result;
  if (error || !data) {
    const statusCode = error && "statusCode" in error ? (error.statusCode) : null;
    throw new EmailSendError(
      `E-mail "${input.subject}" was refused by the e-mail API: ${error?.message ?? "no message id returned"}`,
      error?.name ?? "unknown",
      statusCode,
    );
  }
  try {
    await createOutboxMessage(getDb(), {
      providerId: data.id,
      fromAddress: from,
      toAddresses: Array.isArray(input.to) ? input.to : [input.to],
      subject: input.subject,
      html,
      text,
      tags: input.tags ?? [],
      attachments: attachmentRecords(input.attachments),
    });
  } catch (e) {
    // The message is on its way; only the back office's copy is missing. Say so in the log.
    console.error(`E-mail "${input.subject}" (${data.id}) was sent but not written to the outbox`, e);
  }
  return { id: data.id };
}

/** An e-mail already rendered (a durable job's stored content). */
export interface RenderedEmail {
  to: string[];
  subject: string;
  html: string;
  text: string;
  tags?: { name: string; value: string }[] | null;
  from?: string | null;
  replyTo?: string[] | null;
  idempotencyKey: string;
  attachments?: { filename: string; content: Buffer; contentType?: string | null }[] | null;
}

/** What the outbox keeps of an attachment: name, type, size and SHA-256, not the bytes. */
export function attachmentRecords(attachments: { filename: string; content: Buffer; contentType?: string | null }[] | null | undefined) {
  return (attachments ?? []).map((a) => ({ filename: a.filename, contentType: a.contentType ?? null, sizeBytes: a.content.length, sha256: createHash("sha256").update(a.content).digest("hex") }));
}

export async function renderEmail(input: SendEmailInput): Promise<{ html: string; text: string }> {
  const html = await render(input.react);
  const text = input.text ?? (await render(input.react, { plainText: true }));
  return { html, text };
}

/** Send pre-rendered content (durable jobs' attempts); throws EmailSendError like `sendEmail`. */
export async function sendRenderedEmail(input: RenderedEmail, resend: Resend = getResend()): Promise<{ id: string }> {
  let result: Awaited<ReturnType<Resend["emails"]["send"]>>;
  try {
    result = await resend.emails.send(
      {
        from: input.from ?? env().EMAIL_FROM,
        to: input.to,
        subject: input.subject,
        html: input.html,
        text: input.text,
        tags: input.tags ?? undefined,
        replyTo: input.replyTo ?? undefined,
        attachments: input.attachments?.length ? input.attachments.map((a) => ({ filename: a.filename, content: a.content, contentType: a.contentType ?? undefined })) : undefined,
      },
      { idempotencyKey: input.idempotencyKey },
    );
  } catch (e) {
    throw new EmailSendError(`E-mail "${input.subject}" could not be sent: ${(e as Error).message}`, "network_error", null);
  }
  const { data, error } = result;
  if (error || !data) {
    const statusCode = error && "statusCode" in error ? (error.statusCode) : null;
    throw new EmailSendError(`E-mail "${input.subject}" was refused by the e-mail API: ${error?.message ?? "no message id returned"}`, error?.name ?? "unknown", statusCode);
  }
  return { id: data.id };
}
