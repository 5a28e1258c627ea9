import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface ShipDateChangedEmailProps {
  reference: string;
  projectName: string;
  /** The ship date before and after, as the plant's calendar gives them. */
  fromDate: string;
  toDate: string;
  /** The reason the bureau's staff gave. */
  reason: string;
  isLater: boolean;
  url: string;
}

export default function ShipDateChangedEmail(p: ShipDateChangedEmailProps) {
  return (
    <EmailShell preview={`${p.reference}: planned ship date now ${p.toDate}`} heading={`${p.projectName}: new planned ship date`}>
      <Text style={paragraph}>
        The planned ship date of {p.reference} has moved {p.isLater ? "later" : "earlier"}: from {p.fromDate} to <strong>{p.toDate}</strong>.
      </Text>
      <Text style={paragraph}>Reason given by our production team: {p.reason}</Text>
      <Text style={paragraph}>
        {p.isLater
          ? "If the new date does not work for your programme, reply on the order page and we will look at what can be done."
          : "Your part may be ready sooner than planned; the order page shows each step as it happens."}
      </Text>
      <Button href={p.url} style={buttonStyle}>
        See the timeline
      </Button>
    </EmailShell>
  );
}

ShipDateChangedEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  fromDate: "2 February 2027",
  toDate: "5 February 2027",
  reason: "The job ahead on the Long Bed cell needed a second print after a layer fault.",
  isLater: true,
  url: "http://localhost:3000/portal/requests/demo",
} satisfies ShipDateChangedEmailProps;
