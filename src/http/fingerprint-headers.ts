/**
 * The `x-model-fingerprints` header of the CSV answers of the archive reads. A range that mixes many
 * model sets would make it as long as the answer allows, and common HTTP clients and proxies refuse
 * header blocks above 8–16 kB (Node's default limit is 16 kB), so the list is capped: it holds the
 * fingerprints that fit in MAX_FINGERPRINT_HEADER_BYTES, `x-model-fingerprint-count` always gives how
 * many there are, and `x-model-fingerprints-complete: false` says the list was cut. The full list is
 * in the body (the model_fingerprint of every record; the JSON answer's summary).
 */

/** Longest value of x-model-fingerprints [bytes]: well under every common header limit. */
export const MAX_FINGERPRINT_HEADER_BYTES = 1024;

export function modelFingerprintHeaders(fingerprints: readonly string[]): Record<string, string> {
  let value = '';
  let listed = 0;
  for (const f of fingerprints) {
    const next = listed === 0 ? f : `${value},${f}`;
    if (next.length > MAX_FINGERPRINT_HEADER_BYTES) break;
    value = next;
    listed++;
  }
  return {
    'x-model-fingerprints': value,
    'x-model-fingerprint-count': String(fingerprints.length),
    ...(listed < fingerprints.length ? { 'x-model-fingerprints-complete': 'false' } : {}),
  };
}
