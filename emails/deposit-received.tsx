import { Button, Text } from "@react-email/components";
import { AttachedDocuments } from "./_components/attached";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface DepositReceivedEmailProps {
  reference: string;
  projectName: string;
  kind: "deposit" | "balance";
  amount: string;
  poNumber: string;
  /** The bureau's receipt number, and our receipt page for it. */
  receiptNumber: string | null;
  receiptUrl: string | null;
  /** Labels of the PDFs sent with the notice. */
  attached?: string[] | null;
  url: string;
}

export default function DepositReceivedEmail(p: DepositReceivedEmailProps) {
  const what = p.kind === "deposit" ? "deposit" : "balance payment";
  return (
    <EmailShell preview={`${p.reference}: ${what} of ${p.amount} received`} heading={`Your ${what} is in`}>
      <Text style={paragraph}>
        We received {p.amount} for {p.reference} “{p.projectName}” (PO {p.poNumber}).
        {p.kind === "deposit" ? " Our planners will now put the job on a printing cell's calendar and send you the dates." : " Thank you: the order is paid in full."}
      </Text>
      {p.receiptNumber && p.receiptUrl ? <Text style={paragraph}>Receipt {p.receiptNumber}: {p.receiptUrl}</Text> : null}
      <AttachedDocuments labels={p.attached} />
      <Button href={p.url} style={buttonStyle}>
        Open the order
      </Button>
    </EmailShell>
  );
}

DepositReceivedEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  kind: "deposit",
  amount: "$9,552.50",
  poNumber: "KA-PO-7781",
  receiptNumber: "RC-2026-00042",
  receiptUrl: "http://localhost:3000/portal/payments/demo",
  url: "http://localhost:3000/portal/requests/demo",
} satisfies DepositReceivedEmailProps;
