import { Text } from "@react-email/components";

/** The line under a notice naming the PDFs sent with it, e.g. "Attached: Invoice INV-2026-00012 (PDF)". */
export function AttachedDocuments({ labels }: { labels?: string[] | null }) {
  if (!labels || labels.length === 0) return null;
  return (
    <Text style={{ fontSize: "14px", lineHeight: "20px", color: "#353d47" }}>
      Attached: {labels.map((l) => `${l} (PDF)`).join(", ")}. Every document of the order is also listed on its page.
    </Text>
  );
}
