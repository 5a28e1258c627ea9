import { Button, Text } from "@react-email/components";
import { AttachedDocuments } from "./_components/attached";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface ShippedEmailProps {
  reference: string;
  projectName: string;
  carrier: string | null;
  trackingNumber: string | null;
  massText: string | null;
  /** Labels of the PDFs sent with the notice. */
  attached?: string[] | null;
  url: string;
}

export default function ShippedEmail(p: ShippedEmailProps) {
  return (
    <EmailShell preview={`${p.reference} has shipped`} heading={`${p.projectName} is on its way`}>
      <Text style={paragraph}>
        {p.reference} left our plant{p.carrier ? ` with ${p.carrier}` : ""}.
        {p.trackingNumber ? ` Tracking number: ${p.trackingNumber}.` : ""}
      </Text>
      <Text style={paragraph}>
        Caution: {p.massText ? `the crate holds a part of about ${p.massText}. ` : ""}Large tools are heavy: unload and lift
        with suitable equipment and trained people, following your site&rsquo;s lifting procedures and local codes.
      </Text>
      <AttachedDocuments labels={p.attached} />
      <Button href={p.url} style={buttonStyle}>
        Open the order
      </Button>
    </EmailShell>
  );
}

ShippedEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  carrier: "Harbourline Freight",
  trackingNumber: "HF-88213-04",
  massText: "340 kg",
  url: "http://localhost:3000/portal/requests/demo",
} satisfies ShippedEmailProps;
