import { Button, Text } from "@react-email/components";
import { AttachedDocuments } from "./_components/attached";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface RefundIssuedEmailProps {
  reference: string;
  projectName: string;
  amount: string;
  reason: string;
  attached?: string[] | null;
  url: string;
}

export default function RefundIssuedEmail(p: RefundIssuedEmailProps) {
  return (
    <EmailShell preview={`${p.reference}: ${p.amount} refunded`} heading="We have refunded a payment">
      <Text style={paragraph}>
        We refunded {p.amount} on {p.reference} “{p.projectName}”: {p.reason}. The money goes back to the card that paid; it usually appears
        within 5 to 10 working days.
      </Text>
      <AttachedDocuments labels={p.attached} />
      <Button href={p.url} style={buttonStyle}>
        Open the order
      </Button>
    </EmailShell>
  );
}

RefundIssuedEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  amount: "$1,200.00",
  reason: "freight charged twice",
  attached: ["Credit note CN-2026-00001"],
  url: "http://localhost:3000/portal/requests/demo",
} satisfies RefundIssuedEmailProps;
