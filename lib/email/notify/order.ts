import "server-only";
import { createElement } from "react";
import { getDb, type Db } from "@/db/client";
import { listCurrentCells } from "@/db/queries/catalogue";
import { getOrderWithRequest } from "@/db/queries/payments";
import ScheduledEmail from "@/emails/scheduled";
import ShipDateChangedEmail from "@/emails/ship-date-changed";
import ShippedEmail from "@/emails/shipped";
import { formatMass } from "@/lib/units";
import { queueEmail } from "../outbox";
import { formatDate } from "@/lib/dates";
import { contactsOrThrow, dateText, documentAttachment, recipients, requestUrl } from "./shared";

/** The order's notices: scheduled, its ship date moved, shipped. */
export async function notifyScheduled(orderId: string, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const start = row.order.plannedStart;
  await queueEmail({
    to: recipients(c.creatorEmail),
    subject: `${c.reference} is scheduled`,
    react: createElement(ScheduledEmail, {
      reference: c.reference,
      projectName: c.projectName,
      cellName: row.order.cellKey ? ((await listCurrentCells(db, { activeOnly: false })).find((x) => x.key === row.order.cellKey)?.params.name ?? null) : null,
      printStart: dateText(start),
      shipDate: dateText(row.order.plannedShip),
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "scheduled" }],
    // A re-planned order gets a fresh notice with the new dates.
    idempotencyKey: `scheduled/${orderId}/${start?.getTime() ?? "none"}/${row.order.plannedShip?.getTime() ?? "none"}`,
  }, db);
}

/** The client's planned ship date moved by a working day or more: both dates and the reason staff gave. */
export async function notifyShipDateChanged(orderId: string, change: { id: string; fromDate: Date; toDate: Date; reason: string }, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  await queueEmail({
    to: recipients(c.creatorEmail),
    subject: `${c.reference}: planned ship date now ${formatDate(change.toDate)}`,
    react: createElement(ShipDateChangedEmail, {
      reference: c.reference,
      projectName: c.projectName,
      fromDate: formatDate(change.fromDate),
      toDate: formatDate(change.toDate),
      reason: change.reason,
      isLater: change.toDate.getTime() > change.fromDate.getTime(),
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "ship-date-changed" }],
    idempotencyKey: `ship-date-changed/${change.id}`,
  }, db);
}

export async function notifyShipped(orderId: string, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const kg = row.order.actualMaterialKg;
  const doc = await documentAttachment(db, { kind: "packing_list", sourceId: orderId });
  await queueEmail({
    attachments: doc.attachments,
    to: recipients(c.creatorEmail, c.billingEmail),
    subject: `${c.reference} has shipped`,
    react: createElement(ShippedEmail, {
      reference: c.reference,
      projectName: c.projectName,
      carrier: row.order.carrier,
      trackingNumber: row.order.trackingNumber,
      massText: kg ? formatMass(kg, c.unitsPref) : null,
      attached: doc.labels,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "shipped" }],
    idempotencyKey: `shipped/${orderId}`,
  }, db);
}
