import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface RequestReceivedEmailProps {
  reference: string;
  projectName: string;
  firmName: string;
  partCount: number;
  /** The automatic estimate's total, formatted, when the analysis finished. */
  estimateTotal: string | null;
  isControlled: boolean;
  url: string;
  /** The copy sent to the bureau's sales inbox reads differently. */
  forSales: boolean;
}

export default function RequestReceivedEmail(p: RequestReceivedEmailProps) {
  return (
    <EmailShell
      preview={`${p.reference} received: ${p.projectName}`}
      heading={p.forSales ? `New request ${p.reference} from ${p.firmName}` : `We have your request ${p.reference}`}
    >
      <Text style={paragraph}>
        {p.forSales
          ? `${p.firmName} submitted “${p.projectName}” with ${p.partCount} part${p.partCount === 1 ? "" : "s"}. Review the automatic analysis and issue a quote.`
          : `Thank you. “${p.projectName}” with ${p.partCount} part${p.partCount === 1 ? "" : "s"} is with our sales engineers, who review every automatic analysis before issuing a quote.`}
      </Text>
      {p.estimateTotal ? <Text style={paragraph}>Automatic estimate (not an offer): {p.estimateTotal}</Text> : null}
      {p.isControlled ? <Text style={paragraph}>This request is flagged controlled: its files open only for cleared staff.</Text> : null}
      <Button href={p.url} style={buttonStyle}>
        {p.forSales ? "Open the request" : "Follow your request"}
      </Button>
    </EmailShell>
  );
}

RequestReceivedEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  firmName: "Caldrith Aerostructures",
  partCount: 2,
  estimateTotal: "$18,420.00",
  isControlled: false,
  url: "http://localhost:3000/portal/requests/demo",
  forSales: false,
} satisfies RequestReceivedEmailProps;
