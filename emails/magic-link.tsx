import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface MagicLinkEmailProps {
  url: string;
  minutes: number;
}

export default function MagicLinkEmail({ url, minutes }: MagicLinkEmailProps) {
  return (
    <EmailShell preview="Your sign-in link" heading="Sign in to Layerwright">
      <Text style={paragraph}>Use the button below to sign in. The link works once and expires in {minutes} minutes.</Text>
      <Button href={url} style={buttonStyle}>
        Sign in
      </Button>
      <Text style={{ ...paragraph, fontSize: "13px", color: "#6b7480" }}>
        If you did not ask for this, ignore this message; nobody can sign in without the link.
      </Text>
    </EmailShell>
  );
}

MagicLinkEmail.PreviewProps = { url: "http://localhost:3000/api/auth/callback/email?token=preview", minutes: 15 } satisfies MagicLinkEmailProps;
