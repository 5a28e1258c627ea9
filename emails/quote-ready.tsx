import { Button, Text } from "@react-email/components";
import { AttachedDocuments } from "./_components/attached";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface QuoteReadyEmailProps {
  reference: string;
  projectName: string;
  version: number;
  total: string;
  deposit: string;
  validUntil: string;
  shipDate: string | null;
  /** Labels of the PDFs sent with the notice. */
  attached?: string[] | null;
  url: string;
}

export default function QuoteReadyEmail(p: QuoteReadyEmailProps) {
  return (
    <EmailShell preview={`Quote ${p.version} for ${p.reference} is ready`} heading={`Your quote for ${p.projectName}`}>
      <Text style={paragraph}>
        Quote version {p.version} for request {p.reference} has been issued by our sales engineers. It totals {p.total}, with
        a deposit of {p.deposit} due on acceptance.
      </Text>
      <Text style={paragraph}>
        Valid until {p.validUntil}.{p.shipDate ? ` Earliest ship date: ${p.shipDate}.` : ""}
      </Text>
      <AttachedDocuments labels={p.attached} />
      <Button href={p.url} style={buttonStyle}>
        Review and accept
      </Button>
    </EmailShell>
  );
}

QuoteReadyEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  version: 2,
  total: "$19,105.00",
  deposit: "$9,552.50",
  validUntil: "15 January 2027",
  shipDate: "2 February 2027",
  url: "http://localhost:3000/portal/requests/demo",
} satisfies QuoteReadyEmailProps;
