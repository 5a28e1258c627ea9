import { expect, it } from "vitest";
import { centsToDecimal, csvCell, ledgerCsv } from "./csv";

it("quotes fields per RFC 4180 and defuses formula cells", () => {
  expect(csvCell('He said "hold"')).toBe('"He said ""hold"""');
  expect(csvCell("a,b")).toBe('"a,b"');
  expect(csvCell("=SUM(A1)")).toBe("'=SUM(A1)");
  expect(csvCell("-cmd|calc")).toBe("'-cmd|calc");
  expect(csvCell("-12.50")).toBe("-12.50"); // a plain negative amount is not a formula
  expect(csvCell(null)).toBe("");
});

it("writes cents as plain decimals", () => {
  expect(centsToDecimal(123_456)).toBe("1234.56");
  expect(centsToDecimal(-5)).toBe("-0.05");
  expect(centsToDecimal(null)).toBe("");
});

it("lists payments and refunds in time order, refunds negative, CRLF line ends", () => {
  const csv = ledgerCsv(
    [{ id: "p1", reference: "LW-1", firmName: "Firm, Inc", kind: "deposit", status: "partially_refunded", amountCents: 50_000, feeCents: 1_480, refundedCents: 10_000, currency: "usd", receiptNumber: "RC-2027-00001", processorReference: "ch_1", createdAt: new Date("2027-01-01T00:00:00Z"), paidAt: new Date("2027-01-02T00:00:00Z") }],
    [{ id: "r1", paymentId: "p1", reference: "LW-1", firmName: "Firm, Inc", amountCents: 10_000, status: "succeeded", reason: "Short shipment", stripeRefundId: "re_1", receiptNumber: "RC-2027-00001", currency: "usd", createdAt: new Date("2027-01-03T00:00:00Z") }],
  );
  const lines = csv.split("\r\n");
  expect(lines[0]).toBe("Date (UTC),Entry,Kind,Order,Firm,Status,Amount,Fee,Refunded,Currency,Receipt number,Processor reference,Reason");
  expect(lines[1]).toBe('2027-01-02T00:00:00.000Z,Payment,Deposit,LW-1,"Firm, Inc",Part refunded,500.00,14.80,100.00,USD,RC-2027-00001,ch_1,');
  expect(lines[2]).toBe('2027-01-03T00:00:00.000Z,Refund,,LW-1,"Firm, Inc",Returned,-100.00,,,USD,RC-2027-00001,re_1,Short shipment');
  expect(lines[3]).toBe("");
});
