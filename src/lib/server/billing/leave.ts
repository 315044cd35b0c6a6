// Sending the browser on to a Stripe page after a form post. Our CSP allows forms to post only to
// ourselves (form-action 'self'), and browsers apply that to the redirect after a plain post too;
// an enhanced form gets the redirect as JSON and the page navigates itself, which is allowed.
import { redirect, type RequestEvent } from '@sveltejs/kit';
import { billingPath } from './checkout';

/** Whether the form was posted by SvelteKit's enhance (JSON answer) rather than natively. */
export function postedByScript(event: RequestEvent): boolean {
	return (event.request.headers.get('accept') ?? '').includes('application/json');
}

/** Off to a Checkout page; without JavaScript, via the billing page's "continue to payment" link. */
export function toCheckout(
	event: RequestEvent,
	checkout: { url: string; sessionId: string }
): never {
	if (postedByScript(event)) redirect(303, checkout.url);
	redirect(303, `${billingPath}?pay=${encodeURIComponent(checkout.sessionId)}`);
}
