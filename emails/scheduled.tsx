import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface ScheduledEmailProps {
  reference: string;
  projectName: string;
  cellName: string | null;
  printStart: string | null;
  shipDate: string | null;
  url: string;
}

export default function ScheduledEmail(p: ScheduledEmailProps) {
  return (
    <EmailShell preview={`${p.reference} is on the calendar`} heading={`${p.projectName} is scheduled`}>
      <Text style={paragraph}>
        {p.reference} is booked{p.cellName ? ` on the ${p.cellName} cell` : ""}.
        {p.printStart ? ` Printing starts ${p.printStart}.` : ""}
        {p.shipDate ? ` Planned ship date: ${p.shipDate}.` : ""}
      </Text>
      <Text style={paragraph}>Planned dates can move with the queue ahead; the order page always shows the latest.</Text>
      <Button href={p.url} style={buttonStyle}>
        See the timeline
      </Button>
    </EmailShell>
  );
}

ScheduledEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  cellName: "Long Bed",
  printStart: "12 January 2027",
  shipDate: "2 February 2027",
  url: "http://localhost:3000/portal/requests/demo",
} satisfies ScheduledEmailProps;
