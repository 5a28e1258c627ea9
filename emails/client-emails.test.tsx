import { render } from "@react-email/render";
import { createElement, type FC } from "react";
import { describe, expect, it } from "vitest";
import BalanceDueEmail from "./balance-due";
import DepositReceivedEmail from "./deposit-received";
import MemberInviteEmail from "./member-invite";
import QuoteReadyEmail from "./quote-ready";
import RequestReceivedEmail from "./request-received";
import ScheduledEmail from "./scheduled";
import ShipDateChangedEmail from "./ship-date-changed";
import ShippedEmail from "./shipped";
import StaffMessageEmail from "./staff-message";

type Template = FC<never> & { PreviewProps: object };
const text = async (t: Template, props: object = t.PreviewProps) => (await render(createElement(t as unknown as FC<object>, props), { plainText: true })).replace(/\s+/g, " ");

describe("client e-mail templates render their preview props", () => {
  it.each([
    ["request-received", RequestReceivedEmail, ["LW-2026-0042", "Automatic estimate (not an offer): $18,420.00"]],
    ["quote-ready", QuoteReadyEmail, ["Quote version 2", "$9,552.50", "Valid until 15 January 2027"]],
    ["deposit-received", DepositReceivedEmail, ["$9,552.50", "PO KA-PO-7781", "Receipt RC-2026-00042"]],
    ["scheduled", ScheduledEmail, ["Long Bed", "12 January 2027", "2 February 2027"]],
    ["ship-date-changed", ShipDateChangedEmail, ["from 2 February 2027 to 5 February 2027", "moved later", "second print after a layer fault"]],
    ["shipped", ShippedEmail, ["HF-88213-04", "340 kg", "lifting procedures"]],
    ["balance-due", BalanceDueEmail, ["balance of $9,552.50"]],
    ["member-invite", MemberInviteEmail, ["Caldrith Aerostructures", "one-time link"]],
    ["staff-message", StaffMessageEmail, ["Wren Halloway at Ostrevane Additive Works wrote", "140 mm to spare", "Open the conversation"]],
  ] as const)("%s", async (_name, t, expected) => {
    const out = await text(t);
    for (const e of expected) expect(out).toContain(e);
  });

  it("staff-message for a controlled request says only that there is a message", async () => {
    const t = StaffMessageEmail as unknown as Template;
    const out = await text(t, { ...StaffMessageEmail.PreviewProps, isControlled: true, body: null });
    expect(out).toContain("posted a new message on your request LW-2026-0042");
    expect(out).not.toContain("140 mm");
    expect(out).not.toContain(StaffMessageEmail.PreviewProps.projectName);
  });

  it("the sales copy of request-received reads as a notice to the bureau", async () => {
    const t = RequestReceivedEmail as unknown as Template;
    const out = await text(t, { ...RequestReceivedEmail.PreviewProps, forSales: true, isControlled: true });
    expect(out.toLowerCase()).toContain("new request lw-2026-0042 from caldrith aerostructures");
    expect(out).toContain("flagged controlled");
  });
});
