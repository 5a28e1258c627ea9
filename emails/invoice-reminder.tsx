import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface InvoiceReminderEmailProps {
  reference: string;
  projectName: string;
  invoiceNumber: string | null;
  amount: string;
  dueDate: string;
  terms: string;
  poNumber: string;
  /** Past the due date (the second notice), or coming up (the reminder). */
  isOverdue: boolean;
  /** The bank transfer reference to quote, when a transfer is open for the invoice. */
  transferReference?: string | null;
  url: string;
}

export default function InvoiceReminderEmail(p: InvoiceReminderEmailProps) {
  const invoice = p.invoiceNumber ? `invoice ${p.invoiceNumber}` : "the invoice";
  return (
    <EmailShell preview={`${p.reference}: ${p.amount} ${p.isOverdue ? "is overdue" : `due ${p.dueDate}`}`} heading={p.isOverdue ? "Invoice overdue" : "Invoice due soon"}>
      <Text style={paragraph}>
        {p.isOverdue
          ? `${p.amount} on ${invoice} for ${p.reference} “${p.projectName}” (PO ${p.poNumber}) fell due on ${p.dueDate} (${p.terms}) and has not reached us yet.`
          : `${p.amount} on ${invoice} for ${p.reference} “${p.projectName}” (PO ${p.poNumber}) falls due on ${p.dueDate} (${p.terms}).`}
      </Text>
      <Text style={paragraph}>
        You can pay by card or bank transfer from the order page
        {p.transferReference ? `; for a bank transfer, quote the reference ${p.transferReference} so it is matched to this invoice` : ""}. If you have
        already paid, thank you: the payment may still be on its way.
      </Text>
      <Button href={p.url} style={buttonStyle}>
        Open the order
      </Button>
    </EmailShell>
  );
}

InvoiceReminderEmail.PreviewProps = {
  reference: "LW-2026-0042",
  projectName: "Wing rib layup tool",
  invoiceNumber: "INV-2026-00042",
  amount: "$19,105.00",
  dueDate: "31 Dec 2026",
  terms: "Net 30",
  poNumber: "KA-PO-7781",
  isOverdue: false,
  transferReference: "7YQ2KD4M9P",
  url: "http://localhost:3000/portal/requests/demo",
} satisfies InvoiceReminderEmailProps;
