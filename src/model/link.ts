/**
 * A sheet carried in a link: `…#sheet=z1.<payload>`, where the payload is
 * base64url (RFC 4648 §5, no padding) of a 4-byte CRC-32 of the sheet's JSON
 * (big-endian) followed by the JSON compressed with raw DEFLATE (RFC 1951,
 * `CompressionStream('deflate-raw')`). The checksum catches a link that was
 * cut short or altered in a way that still decompresses. Reading a link
 * refuses with one line that names what is wrong; it never returns a partial
 * sheet.
 */
import { parseSheetJson } from './parseSheet';
import type { Sheet } from './sheet';

/** The hash key that marks a sheet link. */
export const LINK_KEY = 'sheet';
/** The payload format written by this version: raw DEFLATE with a CRC-32, version 1. */
export const LINK_FORMAT = 'z1';
/** The longest link we make or read, in characters: browsers, chat tools and mail clients pass 32 KB URLs reliably (common practice). */
export const MAX_LINK_CHARS = 32 * 1024;
/** The most JSON a link may unpack to: a guard against a small link that inflates without end. */
export const MAX_LINK_JSON_BYTES = 4 * 1024 * 1024;

export class LinkError extends Error {}

// ---- base64url ----

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
const DECODE = new Int16Array(128).fill(-1);
for (let i = 0; i < ALPHABET.length; i++) DECODE[ALPHABET.charCodeAt(i)] = i;

export function toBase64Url(bytes: Uint8Array): string {
  let out = '';
  let i = 0;
  for (; i + 2 < bytes.length; i += 3) {
    const n = (bytes[i] << 16) | (bytes[i + 1] << 8) | bytes[i + 2];
    out += ALPHABET[n >> 18] + ALPHABET[(n >> 12) & 63] + ALPHABET[(n >> 6) & 63] + ALPHABET[n & 63];
  }
  const rest = bytes.length - i;
  if (rest === 1) {
    const n = bytes[i] << 16;
    out += ALPHABET[n >> 18] + ALPHABET[(n >> 12) & 63];
  } else if (rest === 2) {
    const n = (bytes[i] << 16) | (bytes[i + 1] << 8);
    out += ALPHABET[n >> 18] + ALPHABET[(n >> 12) & 63] + ALPHABET[(n >> 6) & 63];
  }
  return out;
}

/** Bytes of base64url text; null when it holds a character outside the alphabet or has an impossible length. */
export function fromBase64Url(text: string): Uint8Array | null {
  if (text.length % 4 === 1) return null;
  const out = new Uint8Array(Math.floor((text.length * 3) / 4));
  let o = 0, acc = 0, bits = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    const v = c < 128 ? DECODE[c] : -1;
    if (v < 0) return null;
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[o++] = (acc >> bits) & 255;
    }
  }
  return out.subarray(0, o);
}

// ---- CRC-32 (IEEE 802.3, reflected polynomial 0xEDB88320) ----

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (let i = 0; i < bytes.length; i++) c = CRC_TABLE[(c ^ bytes[i]) & 255] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

// ---- compression through the platform's streams ----

async function deflateRaw(bytes: Uint8Array): Promise<Uint8Array> {
  const stream = new Blob([bytes as Uint8Array<ArrayBuffer>]).stream().pipeThrough(new CompressionStream('deflate-raw'));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}

/** Inflate, stopping (and refusing) as soon as the output passes `limit` bytes. */
async function inflateRaw(bytes: Uint8Array, limit: number): Promise<Uint8Array> {
  const reader = new Blob([bytes as Uint8Array<ArrayBuffer>]).stream().pipeThrough(new DecompressionStream('deflate-raw')).getReader();
  const parts: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    let chunk: ReadableStreamReadResult<Uint8Array>;
    try {
      chunk = await reader.read();
    } catch {
      throw new LinkError('The link is damaged or cut short: its sheet data does not unpack');
    }
    if (chunk.done) break;
    total += chunk.value.length;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      throw new LinkError(`The link unpacks to more than ${Math.round(limit / 1024 / 1024)} MB, more than any sheet needs; it was not opened`);
    }
    parts.push(chunk.value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

// ---- links ----

export type EncodedLink = { ok: true; url: string; chars: number } | { ok: false; chars: number; reason: string };

/** The payload (what follows `#sheet=`) for a sheet. */
export async function encodeSheetPayload(sheet: Sheet): Promise<string> {
  const json = new TextEncoder().encode(JSON.stringify(sheet));
  const packed = await deflateRaw(json);
  const body = new Uint8Array(4 + packed.length);
  new DataView(body.buffer).setUint32(0, crc32(json));
  body.set(packed, 4);
  return `${LINK_FORMAT}.${toBase64Url(body)}`;
}

/** A link to `base` (the page's address without its hash) that opens the sheet; refused when longer than `limit` characters. */
export async function sheetLink(sheet: Sheet, base: string, limit = MAX_LINK_CHARS): Promise<EncodedLink> {
  const url = `${base.replace(/#.*$/, '')}#${LINK_KEY}=${await encodeSheetPayload(sheet)}`;
  if (url.length > limit) {
    return {
      ok: false,
      chars: url.length,
      reason: `This sheet is too large for a link (${kb(url.length)} KB; a link holds up to ${kb(limit)} KB). Save it as a file and send the file instead.`,
    };
  }
  return { ok: true, url, chars: url.length };
}

const kb = (n: number) => (Math.ceil((n / 1024) * 10) / 10).toString();

/** The payload of a hash (`#sheet=…`, with or without `#`); null when the hash is not a sheet link at all. */
export function linkPayload(hash: string): string | null {
  const h = hash.startsWith('#') ? hash.slice(1) : hash;
  const prefix = `${LINK_KEY}=`;
  return h.startsWith(prefix) ? h.slice(prefix.length) : null;
}

/** The sheet a link's payload carries; throws a LinkError with a one-line message naming what is wrong. */
export async function decodeSheetPayload(payload: string, limit = MAX_LINK_CHARS): Promise<Sheet> {
  if (payload.length > limit) {
    throw new LinkError(`The link is too long (${kb(payload.length)} KB; a link holds up to ${kb(limit)} KB); it was not opened`);
  }
  const dot = payload.indexOf('.');
  const format = dot < 0 ? '' : payload.slice(0, dot);
  if (!/^z\d+$/.test(format)) throw new LinkError('The link is not a Coilwright sheet link: its format mark is missing or unknown');
  if (format !== LINK_FORMAT) throw new LinkError(`The link was made by a newer Coilwright (format ${format.slice(0, 8)}; this editor reads ${LINK_FORMAT}); update Coilwright`);
  let text = payload.slice(dot + 1);
  // some mail and chat tools percent-encode or wrap a long link
  try {
    text = decodeURIComponent(text).replace(/\s+/g, '');
  } catch {
    throw new LinkError('The link is damaged: it holds a broken %-escape');
  }
  const body = fromBase64Url(text);
  if (!body) throw new LinkError('The link is damaged: it holds characters a sheet link never has');
  if (body.length < 6) throw new LinkError('The link is cut short: it carries no sheet');
  const expected = new DataView(body.buffer, body.byteOffset, 4).getUint32(0);
  const json = await inflateRaw(body.subarray(4), MAX_LINK_JSON_BYTES);
  if (crc32(json) !== expected) throw new LinkError('The link is damaged or cut short: its checksum does not match the sheet it carries');
  let parsed: unknown;
  try {
    parsed = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(json));
  } catch {
    throw new LinkError('The link is damaged: the sheet it carries is not valid JSON');
  }
  try {
    return parseSheetJson(parsed);
  } catch (e) {
    throw new LinkError(`The link's sheet was refused: ${(e as Error).message}`);
  }
}
