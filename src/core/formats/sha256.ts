/**
 * SHA-256 (FIPS 180-4) of a byte buffer as lower-case hex, through Web Crypto's `crypto.subtle.digest`
 * (present in browsers and in Node ≥ 20 as globalThis.crypto). For files too large to hold in memory, callers
 * hash incrementally in their own way (e.g. node:crypto in the CLI).
 */
export async function sha256Hex(data: Uint8Array | ArrayBuffer): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', data as BufferSource);
  const bytes = new Uint8Array(digest);
  let hex = '';
  for (let i = 0; i < bytes.length; i++) hex += bytes[i].toString(16).padStart(2, '0');
  return hex;
}
