/*
 * An xlsx file is a zip archive, and a few megabytes of zip can expand to gigabytes. Before the
 * workbook reader inflates anything, the archive's directory is read here: the sizes it declares
 * must add up to at most MAX_EXPANDED_BYTES, and every entry is inflated with its output capped
 * at the size declared for it, so an entry that lies about its size is caught at that size.
 */
import { inflateRawSync } from 'node:zlib';

/** Most bytes an uploaded workbook may expand to (a 100,000-row sheet needs about a fifth). */
export const MAX_EXPANDED_BYTES = 100 * 1024 * 1024;

export type ZipCheck =
	| { ok: true }
	| { ok: false; problem: 'damaged' }
	| { ok: false; problem: 'too-large'; entry?: string };

const END_OF_DIRECTORY = 0x06054b50;
const DIRECTORY_ENTRY = 0x02014b50;
const LOCAL_HEADER = 0x04034b50;
const STORED = 0;
const DEFLATED = 8;

/** Checks how far `bytes`, a zip archive, expands; `limit` in bytes. */
export function checkZipExpansion(bytes: Uint8Array, limit = MAX_EXPANDED_BYTES): ZipCheck {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const damaged: ZipCheck = { ok: false, problem: 'damaged' };
	const fits = (offset: number, length: number) => offset >= 0 && offset + length <= bytes.length;
	// The end-of-directory record closes the file, followed by a comment of up to 65,535 bytes.
	let end = -1;
	for (let at = bytes.length - 22; at >= 0 && at >= bytes.length - 22 - 0xffff; at -= 1) {
		if (view.getUint32(at, true) === END_OF_DIRECTORY) {
			end = at;
			break;
		}
	}
	if (end < 0) return damaged;
	const entries = view.getUint16(end + 10, true);
	let at = view.getUint32(end + 16, true);
	// ZIP64 (over 65,535 entries or 4 GB) marks its fields 0xFFFF…; no workbook we accept needs it.
	if (entries === 0xffff || at === 0xffffffff) return { ok: false, problem: 'too-large' };
	let total = 0;
	for (let k = 0; k < entries; k += 1) {
		if (!fits(at, 46) || view.getUint32(at, true) !== DIRECTORY_ENTRY) return damaged;
		const method = view.getUint16(at + 10, true);
		const packed = view.getUint32(at + 20, true);
		const size = view.getUint32(at + 24, true);
		const nameLength = view.getUint16(at + 28, true);
		const localAt = view.getUint32(at + 42, true);
		const next =
			at + 46 + nameLength + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
		if (!fits(at + 46, nameLength)) return damaged;
		const entry = new TextDecoder().decode(bytes.subarray(at + 46, at + 46 + nameLength));
		total += size;
		if (size === 0xffffffff || total > limit) return { ok: false, problem: 'too-large', entry };
		if (!fits(localAt, 30) || view.getUint32(localAt, true) !== LOCAL_HEADER) return damaged;
		const dataAt =
			localAt + 30 + view.getUint16(localAt + 26, true) + view.getUint16(localAt + 28, true);
		if (!fits(dataAt, packed)) return damaged;
		if (method === STORED && packed > size) return { ok: false, problem: 'too-large', entry };
		if (method === DEFLATED) {
			try {
				inflateRawSync(bytes.subarray(dataAt, dataAt + packed), {
					maxOutputLength: Math.max(size, 1)
				});
			} catch (err) {
				if ((err as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') {
					return { ok: false, problem: 'too-large', entry };
				}
				return damaged;
			}
		}
		at = next;
	}
	return { ok: true };
}
