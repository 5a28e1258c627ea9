"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { submitTaxExemption } from "@/app/(portal)/portal/(member)/firm/tax-actions";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { EXEMPTION_STATE_LABEL, EXEMPTION_STATE_TONE } from "@/lib/labels";
import { PdfUpload } from "@/components/portal/pdf-upload";

export interface ExemptionView {
  id: string;
  certificateNumber: string;
  issuedBy: string;
  /** Formatted on the server. */
  expiresOn: string;
  state: "pending" | "approved" | "rejected" | "expired";
  reviewNote: string | null;
  fileUrl: string | null;
}

const STATE_TEXT: Record<ExemptionView["state"], string> = {
  pending: "Our accounts team checks it; until then orders carry tax.",
  approved: "Orders you accept and their invoices carry no tax, and say why.",
  rejected: "Not accepted; see the note, and send a corrected certificate.",
  expired: "Expired: orders accepted from now on carry tax. Send the renewed certificate.",
};

/** The firm's tax-exemption certificates and the form to send one. */
export function TaxExemptionCard({ certificates }: { certificates: ExemptionView[] }) {
  const router = useRouter();
  const [number, setNumber] = useState("");
  const [issuedBy, setIssuedBy] = useState("");
  const [expiresOn, setExpiresOn] = useState("");
  const [uploadId, setUploadId] = useState<string | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, start] = useTransition();
  return (
    <div className="space-y-4">
      {certificates.length ? (
        <ul className="divide-y divide-paper-200 text-sm">
          {certificates.map((c) => (
            <li key={c.id} className="space-y-1 py-2" data-testid="tax-certificate">
              <div className="flex flex-wrap items-baseline gap-2">
                <span className="font-medium text-ink-800">Certificate {c.certificateNumber}</span>
                <Badge tone={EXEMPTION_STATE_TONE[c.state]}>{EXEMPTION_STATE_LABEL[c.state]}</Badge>
                <span className="text-xs text-ink-500">
                  {c.issuedBy} · valid until {c.expiresOn}
                </span>
                {c.fileUrl ? (
                  <a href={c.fileUrl} className="text-xs text-kiln-700 underline">
                    PDF
                  </a>
                ) : null}
              </div>
              <p className="text-ink-600">{STATE_TEXT[c.state]}</p>
              {c.reviewNote ? <p className="text-ink-600">Note from accounts: {c.reviewNote}</p> : null}
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-600">No certificate on file: orders carry tax at the quote&apos;s rate.</p>
      )}
      <form
        className="space-y-3 rounded bg-paper-50 p-3 ring-1 ring-paper-200"
        aria-label="Send a tax-exemption certificate"
        onSubmit={(e) => {
          e.preventDefault();
          setMsg(null);
          if (!uploadId) return setErrors({ uploadId: ["Attach the certificate as a PDF."] });
          start(async () => {
            const r = await submitTaxExemption({ certificateNumber: number, issuedBy, expiresOn, uploadId });
            if (!r.ok) {
              setErrors(r.fieldErrors ?? {});
              return setMsg({ tone: "error", text: r.message });
            }
            setErrors({});
            setNumber("");
            setIssuedBy("");
            setExpiresOn("");
            setMsg({ tone: "ok", text: "Sent: our accounts team checks it, usually within two working days." });
            router.refresh();
          });
        }}
      >
        <div className="grid gap-3 sm:grid-cols-3">
          <Field label="Certificate number" htmlFor="tx-number" error={errors.certificateNumber?.[0]}>
            <Input id="tx-number" value={number} onChange={(e) => setNumber(e.target.value)} autoComplete="off" />
          </Field>
          <Field label="Issuing authority" htmlFor="tx-issuer" error={errors.issuedBy?.[0]}>
            <Input id="tx-issuer" value={issuedBy} placeholder="e.g. state revenue department" onChange={(e) => setIssuedBy(e.target.value)} />
          </Field>
          <Field label="Valid until" htmlFor="tx-expiry" error={errors.expiresOn?.[0]}>
            <Input id="tx-expiry" type="date" value={expiresOn} onChange={(e) => setExpiresOn(e.target.value)} />
          </Field>
        </div>
        <PdfUpload id="tx-file" label="The certificate (PDF)" hint="A scan or the issued PDF." onUploaded={setUploadId} />
        {errors.uploadId ? <p className="text-xs text-signal-danger" role="alert">{errors.uploadId[0]}</p> : null}
        {msg ? <FormMessage tone={msg.tone}>{msg.text}</FormMessage> : null}
        <Button type="submit" variant="secondary" disabled={pending}>
          {pending ? "Sending…" : "Send the certificate"}
        </Button>
      </form>
    </div>
  );
}
