import { Body, Container, Head, Heading, Hr, Html, Preview, Section, Text } from "@react-email/components";

/** The frame every Layerwright e-mail shares. */
export function EmailShell({ preview, heading, children }: { preview: string; heading: string; children: React.ReactNode }) {
  return (
    <Html lang="en">
      <Head />
      <Preview>{preview}</Preview>
      <Body style={{ backgroundColor: "#f4f1ea", fontFamily: "Helvetica, Arial, sans-serif", color: "#181d23" }}>
        <Container style={{ backgroundColor: "#ffffff", margin: "24px auto", padding: "28px", maxWidth: "560px", borderTop: "6px solid #d9692a" }}>
          <Text style={{ fontSize: "13px", color: "#6b7480", margin: 0 }}>Layerwright · Ostrevane Additive Works</Text>
          <Heading as="h1" style={{ fontSize: "22px", margin: "12px 0 16px" }}>
            {heading}
          </Heading>
          <Section>{children}</Section>
          <Hr style={{ borderColor: "#e8e3d7", margin: "24px 0 12px" }} />
          <Text style={{ fontSize: "12px", color: "#6b7480" }}>
            You receive this because you have an account with Ostrevane Additive Works. Figures marked estimate are automatic;
            only a quote issued by our sales engineers is an offer.
          </Text>
        </Container>
      </Body>
    </Html>
  );
}

export const buttonStyle = {
  backgroundColor: "#b9531d",
  color: "#ffffff",
  padding: "12px 20px",
  borderRadius: "4px",
  textDecoration: "none",
  fontWeight: 600,
  display: "inline-block",
} as const;

export const paragraph = { fontSize: "15px", lineHeight: "22px" } as const;
