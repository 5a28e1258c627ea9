"use client";

import { useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect } from "react";
import { Alert } from "@/components/ui/alert";
import { fetchJson } from "@/components/portal/query-provider";
import type { RequestStatus } from "@/lib/contracts/portal";

/**
 * Shown after the payment page sends the client back. On success it waits for the webhook to
 * record the payment (polling the request) and then refreshes the page.
 */
export function CheckoutReturn({ requestId, outcome, stage }: { requestId: string; outcome: "success" | "cancelled"; stage: string }) {
  const router = useRouter();
  const waiting = outcome === "success" && (stage === "accepted" || stage === "shipped");
  const q = useQuery({
    queryKey: ["request-stage", requestId],
    queryFn: () => fetchJson<RequestStatus>(`/api/portal/requests/${requestId}`),
    enabled: waiting,
    refetchInterval: 1000,
  });
  useEffect(() => {
    if (waiting && q.data && q.data.stage !== stage) router.refresh();
  }, [q.data, stage, waiting, router]);
  if (outcome === "cancelled") {
    return (
      <Alert tone="warn" title="The payment was not completed">
        <p>Nothing was charged. The order stays payable: use the pay button below when you are ready.</p>
      </Alert>
    );
  }
  if (waiting) {
    return (
      <Alert tone="info" title="Payment received by the card processor — confirming…">
        <p role="status">This page updates as soon as the payment is recorded.</p>
      </Alert>
    );
  }
  return <Alert tone="info" title="Thank you: your payment is recorded." />;
}
