import { Worker } from 'node:worker_threads';

/**
 * Runs the float64 reference's dated IRR in a worker with a time limit: its Newton iteration has
 * no iteration cap, so on a case without a root it may never return.
 */
export function datedReferenceWithTimeout(
	values: number[],
	dates: string[],
	limitMs: number
): Promise<number | string> {
	const source = `
		const { parentPort, workerData } = require('node:worker_threads');
		import('@formulajs/formulajs').then((f) => {
			const dates = workerData.dates.map((d) => new Date(d + 'T00:00:00Z'));
			const answer = f.XIRR(workerData.values, dates);
			parentPort.postMessage(typeof answer === 'number' ? answer : String(answer));
		});
	`;
	return new Promise((resolve) => {
		const worker = new Worker(source, { eval: true, workerData: { values, dates } });
		const timer = setTimeout(() => {
			void worker.terminate();
			resolve(`no answer within ${limitMs} ms`);
		}, limitMs);
		worker.once('message', (answer: number | string) => {
			clearTimeout(timer);
			void worker.terminate();
			resolve(answer);
		});
		worker.once('error', (error) => {
			clearTimeout(timer);
			resolve(`error: ${error.message}`);
		});
	});
}
