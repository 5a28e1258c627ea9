import { Button, Text } from "@react-email/components";
import { AttachedDocuments } from "./_components/attached";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface BalanceDueEmailProps {
  reference: string;
  projectName: string;
  balance: string;
  poNumber: string;
  /** Labels of the PDFs sent with the notice. */
  attached?: string[] | null;
  url: string;
}

export default function BalanceDueEmail(p: BalanceDueEmailProps) {
  return (
    <EmailShell preview={`${p.reference}: balance of ${p.balance} due`} heading="Balance due">
      <Text style={paragraph}>
        {p.reference} “{p.projectName}” (PO {p.poNumber}) has shipped. The remaining balance of {p.balance} is now due; you
        can pay it by card from the order page.
      </Text>
      <AttachedDocuments labels={p.attached} />
      <Button href={p.url} style={buttonStyle}>
        Pay the balance
      </Button>
    </EmailShell>
  );
}

BalanceDueEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  balance: "$9,552.50",
  poNumber: "KA-PO-7781",
  url: "http://localhost:3000/portal/requests/demo",
} satisfies BalanceDueEmailProps;
