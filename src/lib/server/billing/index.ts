export { billingPath, openPortal, startCheckout } from './checkout';
export { billingOverview, type BillingOverview, type CheckoutOutcome } from './overview';
export { changeSeats, belowUseMessage, seatsInUse } from './seats';
export { readOnlyMessage, readOnlyReason, statusLabel, PAYING } from './status';
export { applyStripeEvent, receiveStripeWebhook, type WebhookOutcome } from './webhooks';
