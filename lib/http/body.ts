import { InvalidInputError, PayloadTooLargeError } from '@/lib/errors';

/** Largest JSON body a route accepts (forms are a few kilobytes). */
export const JSON_BODY_MAX_BYTES = 64 * 1024;

function mib(bytes: number): string {
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}

/**
 * Throws PayloadTooLargeError (413) when the declared Content-Length is above
 * `maxBytes`, before anything is read.
 */
export function assertDeclaredLength(request: Request, maxBytes: number): void {
  const declared = request.headers.get('content-length');
  if (declared && /^\d+$/.test(declared) && Number(declared) > maxBytes) {
    throw new PayloadTooLargeError(`That is larger than ${mib(maxBytes)}.`);
  }
}

/**
 * Reads a body stream into memory, stopping (and cancelling the stream) as
 * soon as more than `maxBytes` have arrived, so a huge body is never buffered.
 * Throws PayloadTooLargeError (413) then.
 */
export async function readLimited(stream: ReadableStream<Uint8Array> | null, maxBytes: number): Promise<Buffer> {
  if (!stream) return Buffer.alloc(0);
  const reader = stream.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => {});
      throw new PayloadTooLargeError(`That is larger than ${mib(maxBytes)}.`);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks, total);
}

/**
 * Reads a JSON request body of at most `maxBytes`. Throws PayloadTooLargeError
 * (413) above the limit and InvalidInputError (400) when it is not JSON.
 */
export async function readJson(request: Request, maxBytes = JSON_BODY_MAX_BYTES): Promise<unknown> {
  assertDeclaredLength(request, maxBytes);
  const raw = await readLimited(request.body, maxBytes);
  if (!raw.length) return {};
  try {
    return JSON.parse(raw.toString('utf8'));
  } catch {
    throw new InvalidInputError('The request body must be JSON.', { _form: ['The request body must be JSON.'] });
  }
}
