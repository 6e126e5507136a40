import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EXAMPLES, seedIds } from '../../src/model';
import {
  LINK_FORMAT, MAX_LINK_CHARS, crc32, decodeSheetPayload, encodeSheetPayload, fromBase64Url, linkPayload, sheetLink, toBase64Url,
} from '../../src/model/link';
import type { Sheet } from '../../src/model/sheet';

const BASE = 'https://coilwright.example/app/';
const HOSTILE = '<script>alert(1)</script> & "q" ]]>';

async function roundTrip(sheet: Sheet): Promise<Sheet> {
  const link = await sheetLink(sheet, BASE);
  if (!link.ok) throw new Error(link.reason);
  return decodeSheetPayload(linkPayload(new URL(link.url).hash)!);
}

/** raw DEFLATE of bytes, through Node's own zlib (a second implementation beside CompressionStream) */
async function zlibDeflateRaw(bytes: Uint8Array): Promise<Uint8Array> {
  const { deflateRawSync } = await import('node:zlib');
  return new Uint8Array(deflateRawSync(bytes));
}

describe('base64url and CRC-32', () => {
  it('match the published test vectors', () => {
    // RFC 4648 §10 test vectors ("f" → "Zg", "fo" → "Zm8", "foobar" → "Zm9vYmFy"), padding dropped as §5 allows
    const enc = (s: string) => toBase64Url(new TextEncoder().encode(s));
    expect(['', 'f', 'fo', 'foo', 'foob', 'fooba', 'foobar'].map(enc)).toEqual(['', 'Zg', 'Zm8', 'Zm9v', 'Zm9vYg', 'Zm9vYmE', 'Zm9vYmFy']);
    // bytes 0xfb 0xff use the two URL-safe letters: "-_8" in base64url (RFC 4648 §5 table)
    expect(toBase64Url(new Uint8Array([0xfb, 0xff]))).toBe('-_8');
    expect([...fromBase64Url('-_8')!]).toEqual([0xfb, 0xff]);
    // CRC-32 of "123456789" is 0xCBF43926 (the standard check value of CRC-32/ISO-HDLC)
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });

  it('base64url round-trips any bytes (property, fast-check)', () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 300 }), (b) => {
      expect([...fromBase64Url(toBase64Url(b))!]).toEqual([...b]); // identity: decode ∘ encode
    }));
  });
});

describe('sheet → link → sheet', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.key}: comes back identical, in a link well under the limit`, async () => {
      seedIds(5);
      const sheet = ex.make();
      const link = await sheetLink(sheet, `${BASE}#old-hash`);
      expect(link.ok).toBe(true);
      if (!link.ok) return;
      expect(link.url.startsWith(`${BASE}#sheet=${LINK_FORMAT}.`)).toBe(true); // the page's hash is replaced, not appended to
      expect(link.url.length).toBeLessThan(MAX_LINK_CHARS / 4); // an example sheet is a few KB of JSON; DEFLATE packs it to well under 8 KB
      expect(await decodeSheetPayload(linkPayload(new URL(link.url).hash)!)).toEqual(sheet); // identity
    });
  }

  it('a hostile title and labels come back literally', async () => {
    seedIds(6);
    const sheet = EXAMPLES[0].make();
    sheet.title = HOSTILE;
    sheet.parts[0].ref = 'R<1>&';
    const back = await roundTrip(sheet);
    expect(back.title).toBe(HOSTILE); // identity
    expect(back).toEqual(sheet);
  });

  it('any title comes back identical (property, fast-check)', async () => {
    seedIds(7);
    const base = EXAMPLES[1].make();
    await fc.assert(fc.asyncProperty(fc.string({ unit: 'grapheme', maxLength: 80 }), async (title) => {
      const sheet = { ...base, title };
      expect(await roundTrip(sheet)).toEqual(sheet); // identity
    }), { numRuns: 40 });
  });

  it('reads a payload packed by another DEFLATE implementation (node:zlib)', async () => {
    seedIds(8);
    const sheet = EXAMPLES[2].make();
    const json = new TextEncoder().encode(JSON.stringify(sheet));
    const packed = await zlibDeflateRaw(json);
    const body = new Uint8Array(4 + packed.length);
    new DataView(body.buffer).setUint32(0, crc32(json));
    body.set(packed, 4);
    expect(await decodeSheetPayload(`${LINK_FORMAT}.${toBase64Url(body)}`)).toEqual(sheet); // RFC 1951 is one format: either packer's output reads back
  });

  it('a sheet too large for a link says so and names the size', async () => {
    seedIds(9);
    const sheet = EXAMPLES[0].make();
    // random-looking labels do not compress: about 60 KB of them cannot fit in 32 KB
    let x = 1;
    const noise = () => Array.from({ length: 60 }, () => ((x = (x * 48271) % 2147483647) % 36).toString(36)).join('');
    sheet.parts = [...sheet.parts, ...Array.from({ length: 1000 }, (_, i) => ({ ...sheet.parts[0], id: `part:big${i}`, ref: `R${100 + i}`, name: noise() }))];
    const link = await sheetLink(sheet, BASE);
    expect(link.ok).toBe(false);
    if (link.ok) return;
    expect(link.chars).toBeGreaterThan(MAX_LINK_CHARS);
    expect(link.reason).toMatch(/too large for a link \(\d+(\.\d)? KB; a link holds up to 32 KB\)\. Save it as a file/);
  });
});

describe('damaged and foreign links are refused with a reason', () => {
  let payload = '';
  const good = async () => {
    if (!payload) {
      seedIds(10);
      payload = await encodeSheetPayload(EXAMPLES[0].make());
    }
    return payload;
  };

  it('is not a sheet link at all: no payload', () => {
    expect(linkPayload('#section-2')).toBeNull();
    expect(linkPayload('')).toBeNull();
    expect(linkPayload('#sheet=abc')).toBe('abc');
  });

  it('every truncation is refused', async () => {
    const p = await good();
    // cut anywhere after the format mark: every cut loses bytes the checksum or the inflater needs
    const cuts = [3, 4, 8, 12, p.length >> 2, p.length >> 1, p.length - 40, p.length - 3, p.length - 2, p.length - 1];
    for (const n of cuts) {
      await expect(decodeSheetPayload(p.slice(0, n)), `cut at ${n}`).rejects.toThrow(/cut short|damaged/);
    }
  });

  it('garbled characters are refused', async () => {
    const p = await good();
    await expect(decodeSheetPayload(p.slice(0, 20) + '!*' + p.slice(22))).rejects.toThrow('holds characters a sheet link never has');
    // a letter swapped for another letter of the alphabet: the data still decodes as base64 but not as this sheet
    for (const at of [10, 40, p.length >> 1, p.length - 5]) {
      const swapped = p.slice(0, at) + (p[at] === 'A' ? 'B' : 'A') + p.slice(at + 1);
      await expect(decodeSheetPayload(swapped), `swap at ${at}`).rejects.toThrow(/damaged|cut short|refused/);
    }
  });

  it('a link from a newer format, or of no known format, is refused', async () => {
    const p = await good();
    await expect(decodeSheetPayload(`z9${p.slice(2)}`)).rejects.toThrow('made by a newer Coilwright (format z9; this editor reads z1)');
    await expect(decodeSheetPayload('hello')).rejects.toThrow('not a Coilwright sheet link');
  });

  it('an oversized link is refused before any work is done', async () => {
    await expect(decodeSheetPayload(`z1.${'A'.repeat(MAX_LINK_CHARS)}`)).rejects.toThrow('too long (32.1 KB; a link holds up to 32 KB)'); // 32 768 + 3 characters, sizes rounded up to a tenth of a KB
  });

  it('a small link that would inflate without end is stopped', async () => {
    const zeros = new Uint8Array(6 * 1024 * 1024).fill(0x20); // 6 MB of spaces packs to a few KB
    const packed = await zlibDeflateRaw(zeros);
    const body = new Uint8Array(4 + packed.length);
    body.set(packed, 4);
    const p = `z1.${toBase64Url(body)}`;
    expect(p.length).toBeLessThan(MAX_LINK_CHARS);
    await expect(decodeSheetPayload(p)).rejects.toThrow('unpacks to more than 4 MB');
  });

  it('a well-packed link whose sheet is foreign or newer is refused by the sheet reader', async () => {
    const pack = async (obj: unknown) => {
      const json = new TextEncoder().encode(JSON.stringify(obj));
      const packed = await zlibDeflateRaw(json);
      const body = new Uint8Array(4 + packed.length);
      new DataView(body.buffer).setUint32(0, crc32(json));
      body.set(packed, 4);
      return `z1.${toBase64Url(body)}`;
    };
    await expect(decodeSheetPayload(await pack({ schema: 'coilwright.sheet/42', parts: [] }))).rejects.toThrow('Sheet version 42 is newer than this editor reads');
    await expect(decodeSheetPayload(await pack({ format: 'other', items: [] }))).rejects.toThrow('no "schema" field');
    await expect(decodeSheetPayload(await pack([1, 2, 3]))).rejects.toThrow('expected a JSON object');
  });
});
