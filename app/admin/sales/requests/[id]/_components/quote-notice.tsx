"use client";

import { createContext, useContext, useState, type ReactNode } from "react";

export type QuoteMessage = { tone: "ok" | "error"; text: string } | null;

const QuoteNoticeContext = createContext<{ last: QuoteMessage; keep: (m: QuoteMessage) => void }>({ last: null, keep: () => {} });

/**
 * Holds the quote editor's last answer across the editor's remount: issuing a version gives the
 * page a new editor (it starts from the version just issued), and that editor opens with the
 * answer its predecessor received instead of losing it.
 */
export function QuoteNoticeProvider({ children }: { children: ReactNode }) {
  const [last, keep] = useState<QuoteMessage>(null);
  return <QuoteNoticeContext.Provider value={{ last, keep }}>{children}</QuoteNoticeContext.Provider>;
}

export const useQuoteNotice = () => useContext(QuoteNoticeContext);
