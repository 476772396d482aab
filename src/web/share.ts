/**
 * The design in the page address: `#d=` + base64url of the deflate-compressed JSON text, so a
 * link reproduces the design exactly (its text, not a re-serialization).
 */

const PREFIX = 'd=';

async function pump(data: Uint8Array<ArrayBuffer>, stream: CompressionStream | DecompressionStream): Promise<Uint8Array<ArrayBuffer>> {
  const out = new Response(new Blob([data]).stream().pipeThrough(stream));
  return new Uint8Array(await out.arrayBuffer());
}

function toBase64Url(bytes: Uint8Array): string {
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): Uint8Array<ArrayBuffer> {
  const b64 = text.replace(/-/g, '+').replace(/_/g, '/');
  const bin = atob(b64 + '='.repeat((4 - (b64.length % 4)) % 4));
  const bytes = new Uint8Array(new ArrayBuffer(bin.length));
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}

/** The hash fragment (with '#') that carries this design text. */
export async function designToHash(text: string): Promise<string> {
  const packed = await pump(new TextEncoder().encode(text), new CompressionStream('deflate-raw'));
  return `#${PREFIX}${toBase64Url(packed)}`;
}

/**
 * The design text carried by a hash fragment, or null when the hash carries none.
 * @throws {Error} when the hash claims a design but does not decode (a cut-off link)
 */
export async function hashToDesign(hash: string): Promise<string | null> {
  const h = hash.replace(/^#/, '');
  if (!h.startsWith(PREFIX)) return null;
  try {
    const bytes = await pump(fromBase64Url(h.slice(PREFIX.length)), new DecompressionStream('deflate-raw'));
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new Error('the design in this link does not decode (was the link cut off?)');
  }
}
