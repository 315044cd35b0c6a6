import ExcelJS from 'exceljs';
import { deflateRawSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { inspectUpload } from './upload';
import { checkZipExpansion, MAX_EXPANDED_BYTES } from './zip-guard';

type Entry = { name: string; data: Uint8Array; declaredSize?: number; stored?: boolean };

/** A zip archive written field by field (no CRCs: the guard does not read them). */
function zip(entries: Entry[]): Uint8Array {
	const parts: Buffer[] = [];
	const directory: Buffer[] = [];
	let offset = 0;
	for (const entry of entries) {
		const name = Buffer.from(entry.name);
		const packed = entry.stored ? Buffer.from(entry.data) : deflateRawSync(entry.data);
		const size = entry.declaredSize ?? entry.data.length;
		const method = entry.stored ? 0 : 8;
		const local = Buffer.alloc(30);
		local.writeUInt32LE(0x04034b50, 0);
		local.writeUInt16LE(20, 4);
		local.writeUInt16LE(method, 8);
		local.writeUInt32LE(packed.length, 18);
		local.writeUInt32LE(size, 22);
		local.writeUInt16LE(name.length, 26);
		const listed = Buffer.alloc(46);
		listed.writeUInt32LE(0x02014b50, 0);
		listed.writeUInt16LE(20, 4);
		listed.writeUInt16LE(20, 6);
		listed.writeUInt16LE(method, 10);
		listed.writeUInt32LE(packed.length, 20);
		listed.writeUInt32LE(size, 24);
		listed.writeUInt16LE(name.length, 28);
		listed.writeUInt32LE(offset, 42);
		parts.push(local, name, packed);
		directory.push(listed, name);
		offset += local.length + name.length + packed.length;
	}
	const listing = Buffer.concat(directory);
	const end = Buffer.alloc(22);
	end.writeUInt32LE(0x06054b50, 0);
	end.writeUInt16LE(entries.length, 8);
	end.writeUInt16LE(entries.length, 10);
	end.writeUInt32LE(listing.length, 12);
	end.writeUInt32LE(offset, 16);
	return new Uint8Array(Buffer.concat([...parts, listing, end]));
}

const text = (value: string) => new TextEncoder().encode(value);

describe('checkZipExpansion', () => {
	it('passes a workbook as exceljs writes it', async () => {
		const workbook = new ExcelJS.Workbook();
		workbook.addWorksheet('Flows').addRows([
			['date', 'amount'],
			['2026-01-15', -1000]
		]);
		const bytes = new Uint8Array(await workbook.xlsx.writeBuffer());
		expect(checkZipExpansion(bytes)).toEqual({ ok: true });
	});

	it('passes entries that inflate to exactly their declared size, stored or deflated', () => {
		const bytes = zip([
			{ name: 'a.xml', data: text('<a/>'.repeat(500)) },
			{ name: 'b.xml', data: text('<b/>'), stored: true },
			{ name: 'empty/', data: new Uint8Array(0) }
		]);
		expect(checkZipExpansion(bytes, 2004)).toEqual({ ok: true });
	});

	it('refuses declared sizes that add up past the limit, naming the entry that crosses it', () => {
		const bytes = zip([
			{ name: 'a.xml', data: new Uint8Array(600) },
			{ name: 'b.xml', data: new Uint8Array(600) }
		]);
		expect(checkZipExpansion(bytes, 1000)).toEqual({
			ok: false,
			problem: 'too-large',
			entry: 'b.xml'
		});
		expect(checkZipExpansion(bytes, 1200)).toEqual({ ok: true });
	});

	it('catches an entry that inflates past the size it declares', () => {
		const bytes = zip([
			{ name: 'xl/sharedStrings.xml', data: new Uint8Array(1 << 20), declaredSize: 100 }
		]);
		expect(checkZipExpansion(bytes)).toEqual({
			ok: false,
			problem: 'too-large',
			entry: 'xl/sharedStrings.xml'
		});
	});

	it('calls a file without a readable directory damaged', () => {
		const whole = zip([{ name: 'a.xml', data: text('<a/>') }]);
		expect(checkZipExpansion(whole.subarray(0, whole.length - 10))).toEqual({
			ok: false,
			problem: 'damaged'
		});
		expect(checkZipExpansion(new Uint8Array(64).fill(0x20))).toEqual({
			ok: false,
			problem: 'damaged'
		});
	});
});

describe('inspectUpload: an xlsx that unpacks too far', () => {
	it('is refused with the limit, before the workbook reader inflates it', async () => {
		// About 100 kB on disk, past 100 MB unpacked.
		const bytes = zip([
			{ name: '[Content_Types].xml', data: text('<Types/>') },
			{ name: 'xl/worksheets/sheet1.xml', data: new Uint8Array(MAX_EXPANDED_BYTES + 1) }
		]);
		expect(bytes.length).toBeLessThan(200_000);
		const result = await inspectUpload('flows.xlsx', bytes);
		expect(result.ok).toBe(false);
		expect(result.ok ? [] : result.errors).toEqual([
			{
				message: expect.stringContaining(
					'unpacks to more than 100 MB (xl/worksheets/sheet1.xml alone goes past it)'
				)
			}
		]);
	});
});
