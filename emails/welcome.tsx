import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface WelcomeEmailProps {
  name: string;
  firmName: string;
  portalUrl: string;
}

export default function WelcomeEmail({ name, firmName, portalUrl }: WelcomeEmailProps) {
  return (
    <EmailShell preview={`Welcome to Layerwright, ${name}`} heading={`Welcome, ${name}`}>
      <Text style={paragraph}>
        Your firm {firmName} now has a Layerwright account with Ostrevane Additive Works. Upload a mesh export of a mold,
        plug or fixture, and you will see at once which of our printing cells it fits, its near-net volume, the print and
        machining hours, an estimated price and an earliest ship date.
      </Text>
      <Button href={portalUrl} style={buttonStyle}>
        Start a request
      </Button>
      <Text style={paragraph}>As the first member of your firm you can invite colleagues and set the billing contact.</Text>
    </EmailShell>
  );
}

WelcomeEmail.PreviewProps = {
  name: "Avery",
  firmName: "Caldrith Aerostructures",
  portalUrl: "http://localhost:3000/portal",
} satisfies WelcomeEmailProps;
