"use client";

import { Field, Input, Select } from "@/components/ui/input";
import { COUNTRIES } from "@/lib/validation/address";

export interface AddressDraft {
  label: string;
  attention: string;
  line1: string;
  line2: string;
  city: string;
  region: string;
  postalCode: string;
  country: string;
  phone: string;
  deliveryNotes: string;
}

export const emptyAddress = (label = ""): AddressDraft => ({ label, attention: "", line1: "", line2: "", city: "", region: "", postalCode: "", country: "US", phone: "", deliveryNotes: "" });

/**
 * The fields of one address; `errors` are keyed by field ("postalCode"), `prefix` keeps ids
 * unique when two forms share a page. Shared by sign-up and the firm's address book.
 */
export function AddressFields({ value, onChange, errors, prefix, withNotes = false, withLabel = true, namePrefix }: { value: AddressDraft; onChange: (v: AddressDraft) => void; errors: Record<string, string[] | undefined>; prefix: string; withNotes?: boolean; withLabel?: boolean; namePrefix?: string }) {
  const set = (k: keyof AddressDraft) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => onChange({ ...value, [k]: e.target.value });
  const rule = COUNTRIES[value.country];
  const id = (k: string) => `${prefix}-${k}`;
  // In a posted form (sign-up) each field carries a name; in the address book the state is sent.
  const nm = (k: keyof AddressDraft) => (namePrefix ? { name: `${namePrefix}${k}` } : {});
  const err = (k: string) => errors[k]?.[0];
  return (
    <div className="grid gap-3 sm:grid-cols-6">
      {withLabel ? (
        <div className="sm:col-span-3">
          <Field label="Name of this address" htmlFor={id("label")} error={err("label")} hint="e.g. Main yard, Tooling hall">
            <Input id={id("label")} {...nm("label")} value={value.label} onChange={set("label")} aria-invalid={Boolean(err("label"))} />
          </Field>
        </div>
      ) : null}
      <div className={withLabel ? "sm:col-span-3" : "sm:col-span-6"}>
        <Field label="Attention of (optional)" htmlFor={id("attention")} error={err("attention")}>
          <Input id={id("attention")} {...nm("attention")} value={value.attention} onChange={set("attention")} />
        </Field>
      </div>
      <div className="sm:col-span-6">
        <Field label="Street address" htmlFor={id("line1")} error={err("line1")}>
          <Input id={id("line1")} {...nm("line1")} value={value.line1} onChange={set("line1")} autoComplete="address-line1" aria-invalid={Boolean(err("line1"))} />
        </Field>
      </div>
      <div className="sm:col-span-6">
        <Field label="Building, unit, dock (optional)" htmlFor={id("line2")} error={err("line2")}>
          <Input id={id("line2")} {...nm("line2")} value={value.line2} onChange={set("line2")} autoComplete="address-line2" />
        </Field>
      </div>
      <div className="sm:col-span-2">
        <Field label="Country" htmlFor={id("country")} error={err("country")}>
          <Select id={id("country")} {...nm("country")} value={value.country} onChange={(e) => onChange({ ...value, country: e.target.value, region: "" })} autoComplete="country">
            {Object.entries(COUNTRIES).map(([code, c]) => (
              <option key={code} value={code}>
                {c.name}
              </option>
            ))}
          </Select>
        </Field>
      </div>
      <div className="sm:col-span-2">
        <Field label="Town or city" htmlFor={id("city")} error={err("city")}>
          <Input id={id("city")} {...nm("city")} value={value.city} onChange={set("city")} autoComplete="address-level2" aria-invalid={Boolean(err("city"))} />
        </Field>
      </div>
      {rule?.regions ? (
        <div className="sm:col-span-1">
          <Field label={rule.regionLabel ?? "Region"} htmlFor={id("region")} error={err("region")}>
            <Select id={id("region")} {...nm("region")} value={value.region} onChange={set("region")} aria-invalid={Boolean(err("region"))} autoComplete="address-level1">
              <option value="">—</option>
              {rule.regions.map((r) => (
                <option key={r} value={r}>
                  {r}
                </option>
              ))}
            </Select>
          </Field>
        </div>
      ) : null}
      <div className={rule?.regions ? "sm:col-span-1" : "sm:col-span-2"}>
        <Field label="Postal code" htmlFor={id("postalCode")} error={err("postalCode")}>
          <Input id={id("postalCode")} {...nm("postalCode")} value={value.postalCode} onChange={set("postalCode")} autoComplete="postal-code" aria-invalid={Boolean(err("postalCode"))} />
        </Field>
      </div>
      {withNotes ? (
        <>
          <div className="sm:col-span-2">
            <Field label="Phone for the carrier (optional)" htmlFor={id("phone")} error={err("phone")}>
              <Input id={id("phone")} {...nm("phone")} value={value.phone} onChange={set("phone")} autoComplete="tel" />
            </Field>
          </div>
          <div className="sm:col-span-4">
            <Field label="Delivery notes (optional)" htmlFor={id("deliveryNotes")} error={err("deliveryNotes")} hint="Dock hours, forklift or crane on site">
              <Input id={id("deliveryNotes")} {...nm("deliveryNotes")} value={value.deliveryNotes} onChange={set("deliveryNotes")} />
            </Field>
          </div>
        </>
      ) : null}
    </div>
  );
}

/** Field errors of an action whose address sits under `address.` → keyed by the field alone. */
export function addressErrors(fe: Record<string, string[]> | undefined, under = "address."): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const [k, v] of Object.entries(fe ?? {})) if (k.startsWith(under)) out[k.slice(under.length)] = v;
  return out;
}
