/** The client e-mails of the order's life, one module per part of it (see ./shared.ts). */
export { MESSAGE_EXCERPT_CHARS, notifyQuoteReady, notifyRequestReceived, notifyStaffMessage } from "./request";
export { notifyScheduled, notifyShipDateChanged, notifyShipped } from "./order";
export { notifyBalanceDue, notifyDepositReceived, notifyInvoiceReminder, notifyRefund } from "./payments";
