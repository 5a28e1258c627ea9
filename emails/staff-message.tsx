import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface StaffMessageEmailProps {
  reference: string;
  projectName: string;
  authorName: string;
  /** The message as written; null for a controlled request, whose messages never go into e-mail. */
  body: string | null;
  /** The body was cut for e-mail; the whole message is on the request page. */
  isTruncated: boolean;
  isControlled: boolean;
  url: string;
}

const quoteStyle = { ...paragraph, whiteSpace: "pre-wrap", borderLeft: "3px solid #e8e3d7", paddingLeft: "12px", color: "#2f3640" } as const;

export default function StaffMessageEmail(p: StaffMessageEmailProps) {
  if (p.isControlled || p.body === null) {
    return (
      <EmailShell preview={`New message on ${p.reference}`} heading={`New message on ${p.reference}`}>
        <Text style={paragraph}>{p.authorName} at Ostrevane Additive Works has posted a new message on your request {p.reference}.</Text>
        <Text style={paragraph}>
          The request is flagged controlled, so its messages are not copied into e-mail. Sign in to read it.
        </Text>
        <Button href={p.url} style={buttonStyle}>
          Read the message
        </Button>
      </EmailShell>
    );
  }
  return (
    <EmailShell preview={`${p.authorName}: ${p.body.slice(0, 90)}`} heading={`New message on ${p.reference}`}>
      <Text style={paragraph}>
        {p.authorName} at Ostrevane Additive Works wrote about “{p.projectName}”:
      </Text>
      <Text style={quoteStyle}>
        {p.body}
        {p.isTruncated ? "…" : ""}
      </Text>
      {p.isTruncated ? <Text style={paragraph}>The message is longer; read all of it on the request page.</Text> : null}
      <Text style={paragraph}>Reply on the request page, so the whole thread stays with the order.</Text>
      <Button href={p.url} style={buttonStyle}>
        Open the conversation
      </Button>
    </EmailShell>
  );
}

StaffMessageEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  authorName: "Wren Halloway",
  body: "Thanks for the revised file. The flange now fits the Long Bed with 140 mm to spare.\n\nCould you confirm the 3 mm finish allowance on the sealing face before we re-quote?",
  isTruncated: false,
  isControlled: false,
  url: "http://localhost:3000/portal/requests/demo",
} satisfies StaffMessageEmailProps;
