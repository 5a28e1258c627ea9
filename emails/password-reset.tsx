import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface PasswordResetEmailProps {
  url: string;
  minutes: number;
}

export default function PasswordResetEmail({ url, minutes }: PasswordResetEmailProps) {
  return (
    <EmailShell preview="Set a new password" heading="Set a new Layerwright password">
      <Text style={paragraph}>
        Someone asked to reset the password of this account. Use the button below to choose a new one. The link works once and
        expires in {minutes} minutes.
      </Text>
      <Button href={url} style={buttonStyle}>
        Choose a new password
      </Button>
      <Text style={{ ...paragraph, fontSize: "13px", color: "#6b7480" }}>
        If you did not ask for this, ignore this message: your password stays as it is.
      </Text>
    </EmailShell>
  );
}

PasswordResetEmail.PreviewProps = { url: "http://localhost:3000/reset/new?token=preview", minutes: 30 } satisfies PasswordResetEmailProps;
