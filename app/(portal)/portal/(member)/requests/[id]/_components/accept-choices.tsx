"use client";

import { formatCents } from "@/lib/money";

/** The accept form's choices: where the order ships (freight priced to each address) and how it is paid. */

/** One of the firm's shipping addresses with what the order would cost shipped there. */
export interface ShipToChoice {
  id: string;
  label: string;
  lines: string[];
  isDefault: boolean;
  zoneName: string | null;
  transitDays: number | null;
  freightCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
}

export interface AcceptanceView {
  shipTos: ShipToChoice[];
  exemption: { certificateNumber: string; expiresOn: string } | null;
  canManageAddresses: boolean;
  /** The firm's net terms, when accounts approved them: what it owes on account now and its limit. */
  account?: { termsLabel: string; limitCents: number; openCents: number } | null;
}

export type PayBy = "card" | "bank_transfer" | "account";

export function PayByPicker({ value, onChange, account, totalCents, currency, error }: { value: PayBy; onChange: (v: PayBy) => void; account: AcceptanceView["account"]; totalCents: number | null; currency: string; error?: string }) {
  const available = account ? Math.max(0, account.limitCents - account.openCents) : 0;
  const isOver = account && totalCents !== null ? account.openCents + totalCents > account.limitCents : false;
  const options: { key: PayBy; title: string; text: string; disabled?: boolean }[] = [
    ...(account
      ? [{ key: "account" as const, title: `On account, ${account.termsLabel}`, text: isOver ? `Over your credit limit: ${formatCents(available, currency)} of ${formatCents(account.limitCents, currency)} is left.` : `No deposit: one invoice when the order ships, due on your terms. ${formatCents(available, currency)} of your ${formatCents(account.limitCents, currency)} limit is left.`, disabled: isOver }]
      : []),
    { key: "card", title: "Deposit by card", text: "Paid now on the payment page; the balance when the order ships." },
    { key: "bank_transfer", title: "Deposit by bank transfer", text: "We give you account details and a reference; work starts when the money arrives." },
  ];
  return (
    <fieldset className="space-y-2" aria-describedby={error ? "payby-error" : undefined}>
      <legend className="text-sm font-medium text-ink-700">How your firm pays</legend>
      {isOver ? (
        <p className="rounded bg-amber-50 px-3 py-2 text-sm text-amber-900" role="status">
          This order would take your firm past its credit limit ({formatCents(account!.openCents, currency)} owed on account, limit {formatCents(account!.limitCents, currency)}). Pay the deposit by card or bank transfer, or ask our accounts team to raise the limit.
        </p>
      ) : null}
      <div className="grid gap-2 sm:grid-cols-3">
        {options.map((o) => (
          <label key={o.key} className={`flex gap-3 rounded bg-white p-3 text-sm ring-1 ${o.disabled ? "cursor-not-allowed opacity-70" : "cursor-pointer"} ${value === o.key ? "ring-2 ring-kiln-500" : "ring-paper-300"}`} data-testid="pay-by-choice">
            <input type="radio" name="payBy" value={o.key} checked={value === o.key} disabled={o.disabled} onChange={() => onChange(o.key)} className="mt-1 accent-kiln-600" />
            <span className="min-w-0 space-y-1">
              <span className="block font-medium text-ink-800">{o.title}</span>
              <span className="block text-xs text-ink-600">{o.text}</span>
            </span>
          </label>
        ))}
      </div>
      {error ? (
        <p id="payby-error" className="text-xs text-signal-danger" role="alert">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

export function ShipToPicker({ choices, value, onChange, currency, error }: { choices: ShipToChoice[]; value: string; onChange: (id: string) => void; currency: string; error?: string }) {
  return (
    <fieldset className="space-y-2" aria-describedby={error ? "shipto-error" : undefined}>
      <legend className="text-sm font-medium text-ink-700">Ship to</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {choices.map((c) => (
          <label key={c.id} className={`flex cursor-pointer gap-3 rounded bg-white p-3 text-sm ring-1 ${value === c.id ? "ring-2 ring-kiln-500" : "ring-paper-300"}`} data-testid="ship-to-choice">
            <input type="radio" name="shipTo" value={c.id} checked={value === c.id} onChange={() => onChange(c.id)} className="mt-1 accent-kiln-600" />
            <span className="min-w-0 space-y-1">
              <span className="block font-medium text-ink-800">{c.label}</span>
              <span className="block text-xs text-ink-500">{c.lines.join(", ")}</span>
              <span className="block text-xs text-ink-600">
                {c.zoneName ?? "Freight zone not found"}
                {c.transitDays ? `, about ${c.transitDays} working days in transit` : ""}
              </span>
              <span className="figures block">
                Freight {formatCents(c.freightCents, currency)} · total <strong>{formatCents(c.totalCents, currency)}</strong>
              </span>
            </span>
          </label>
        ))}
      </div>
      {error ? (
        <p id="shipto-error" className="text-xs text-signal-danger" role="alert">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
