import type { AddressSnapshot } from "@/db/schema";
import { addressLines } from "@/lib/validation/address";

/** An order's ship-to as it was picked at acceptance (its copy, not the live address book). */
export function ShipToBlock({ shipTo, title = "Ships to" }: { shipTo: AddressSnapshot | null; title?: string }) {
  if (!shipTo) return <p className="text-sm text-ink-500">No ship-to recorded: this order was accepted before orders kept one.</p>;
  return (
    <div className="text-sm" data-testid="ship-to">
      <p className="text-xs text-ink-500">{title}</p>
      <p className="font-medium text-ink-800">{shipTo.label}</p>
      <address className="not-italic text-ink-600">
        {addressLines(shipTo).map((l) => (
          <span key={l} className="block">
            {l}
          </span>
        ))}
      </address>
      {shipTo.zoneName ? <p className="text-xs text-ink-500">Freight: {shipTo.zoneName}</p> : null}
      {shipTo.deliveryNotes ? <p className="text-xs text-ink-500">Delivery: {shipTo.deliveryNotes}</p> : null}
      {shipTo.phone ? <p className="text-xs text-ink-500">Phone {shipTo.phone}</p> : null}
    </div>
  );
}
