// Local Stripe: answers the official `stripe` SDK (pointed here with host/port/protocol), serves
// the hosted checkout and billing portal pages, and sends signed webhooks to the app. Switching
// to the real service is configuration only.
//   PINCER_STRIPE_PORT (default 12111)      PINCER_STRIPE_WEBHOOK_URL (unset: events are held)
//   STRIPE_WEBHOOK_SECRET (signs webhooks)  PINCER_STRIPE_PRICE_ID / _PRICE_AMOUNT / _CURRENCY
//   PINCER_STRIPE_PUBLIC_URL, PINCER_STRIPE_WEBHOOK_ATTEMPTS, PINCER_STRIPE_WEBHOOK_BACKOFF_MS,
//   PINCER_STRIPE_API_VERSION (all optional)
import { createServer } from 'node:http';
import { handleApi } from './api.ts';
import { config } from './config.ts';
import { handleControls } from './controls.ts';
import { handleHosted } from './hosted.ts';
import { sendHtml, sendJson } from './http.ts';
import { renderMissing } from './pages.ts';

const server = createServer((req, res) => {
	const url = new URL(req.url ?? '/', 'http://127.0.0.1');
	const work = url.pathname.startsWith('/v1/')
		? handleApi(req, res, url)
		: url.pathname === '/_fake' || url.pathname.startsWith('/_fake/')
			? handleControls(req, res, url)
			: handleHosted(req, res, url).then((handled) => {
					if (!handled) sendHtml(res, 404, renderMissing(`Nothing at ${url.pathname}.`));
				});
	work.catch((err: unknown) => {
		console.error(err);
		if (!res.headersSent)
			sendJson(res, 500, { error: { type: 'api_error', message: String(err) } });
		else res.end();
	});
});

server.on('error', (err) => {
	console.error(`stripe fake: ${err.message}`);
	process.exit(1);
});

server.listen(config.port, '127.0.0.1', () => {
	const address = server.address();
	const port = typeof address === 'object' && address ? address.port : config.port;
	if (!config.publicUrl) config.publicUrl = `http://127.0.0.1:${port}`;
	const hooks = config.webhookUrl ?? 'held until PINCER_STRIPE_WEBHOOK_URL is set';
	console.log(`stripe fake ready: http://127.0.0.1:${port} (webhooks → ${hooks})`);
});

function shutdown() {
	server.close(() => process.exit(0));
	server.closeAllConnections();
	setTimeout(() => process.exit(0), 2000).unref();
}
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
