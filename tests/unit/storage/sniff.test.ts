// Upload sniffing of pictures: the type comes from the bytes, and the header must parse.
// PNG layout from the PNG specification (W3C, 2nd ed. = ISO/IEC 15948): an 8-byte signature,
// then the IHDR chunk first — length 13, "IHDR", width and height as 4-byte big-endian
// integers, bit depth, colour type, compression, filter, interlace, then a CRC-32 of name and data.
import { crc32 } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { PICTURE_MAX_SIDE_PX, sniff } from '$lib/server/storage/sniff';

const SIGNATURE = Buffer.from('89504e470d0a1a0a', 'hex');

function chunk(name: string, data: Buffer): Buffer {
	const len = Buffer.alloc(4);
	len.writeUInt32BE(data.length);
	const body = Buffer.concat([Buffer.from(name, 'latin1'), data]);
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(body));
	return Buffer.concat([len, body, crc]);
}

/** A PNG header of any size (IHDR only, then IEND): enough for every header reader. */
function png(width: number, height: number): Buffer {
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr.set([8, 6, 0, 0, 0], 8); // 8-bit RGBA, deflate, no filter, no interlace
	return Buffer.concat([SIGNATURE, chunk('IHDR', ihdr), chunk('IEND', Buffer.alloc(0))]);
}

describe('sniff: unit pictures', () => {
	it('takes a PNG whose header parses, whatever it is called', async () => {
		expect(await sniff(png(64, 48), 'unit-picture')).toEqual({ ok: true, contentType: 'image/png' });
	});

	it('refuses a PNG signature and IHDR chunk name followed by junk (file-type alone takes it as PNG)', async () => {
		const start = png(1, 1).subarray(0, 16); // signature, IHDR length and name
		const junk = Buffer.concat([start, Buffer.from('not really an image')]);
		const r = await sniff(junk, 'unit-picture');
		expect(r).toEqual({ ok: false, message: 'The picture is damaged: its header cannot be read' });
	});

	it(`refuses a picture over ${PICTURE_MAX_SIDE_PX} px a side, and one of 0 px`, async () => {
		const wide = await sniff(png(PICTURE_MAX_SIDE_PX + 1, 10), 'unit-picture');
		expect(wide).toMatchObject({ ok: false });
		expect(wide.ok ? '' : wide.message).toContain(`${PICTURE_MAX_SIDE_PX + 1} × 10 px`);
		expect(await sniff(png(PICTURE_MAX_SIDE_PX, PICTURE_MAX_SIDE_PX), 'unit-picture')).toMatchObject({ ok: true });
		expect(await sniff(png(0, 10), 'unit-picture')).toMatchObject({ ok: false });
	});

	it('refuses a JPEG start-of-image marker followed by junk', async () => {
		const jpegJunk = Buffer.concat([Buffer.from('ffd8ffe0', 'hex'), Buffer.alloc(64, 0x41)]);
		expect(await sniff(jpegJunk, 'unit-picture')).toMatchObject({ ok: false });
	});
});
