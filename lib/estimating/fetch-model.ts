/**
 * Fetch a model's bytes from storage inside the estimate worker, bounded in size and time, so
 * that the web server's request thread never reads or copies them.
 */
export class ModelFetchError extends Error {
  constructor(
    message: string,
    readonly status: number | null,
  ) {
    super(message);
    this.name = "ModelFetchError";
  }
}

export async function fetchModelBytes(url: string, opts: { maxBytes: number; timeoutMs?: number }): Promise<Uint8Array> {
  const signal = AbortSignal.timeout(opts.timeoutMs ?? 60_000);
  // A kept-alive connection the storage closed meanwhile fails at once; a GET is safe to repeat,
  // so one network failure (not a timeout) is retried on a fresh connection.
  const res = await fetch(url, { signal })
    .catch((e: unknown) => {
      if (signal.aborted) throw e;
      return fetch(url, { signal });
    })
    .catch((e: unknown) => {
      throw new ModelFetchError(`File storage unreachable: ${(e as Error).message}`, null);
    });
  if (res.status === 404) throw new ModelFetchError("The stored file was not found.", 404);
  if (!res.ok || !res.body) throw new ModelFetchError(`File storage answered ${res.status}.`, res.status);
  const declared = Number(res.headers.get("content-length") ?? "0");
  if (declared > opts.maxBytes) throw new ModelFetchError(`The stored file is larger than ${opts.maxBytes} bytes.`, 413);
  // A compressed body's length says nothing of the bytes fetch hands over once decoded.
  const encoded = (res.headers.get("content-encoding") ?? "identity") !== "identity";
  if (declared > 0 && !encoded) {
    // Known length: one buffer, filled in place.
    const out = new Uint8Array(declared);
    let size = 0;
    for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
      if (size + chunk.length > declared) throw new ModelFetchError("File storage sent more bytes than it announced.", null);
      out.set(chunk, size);
      size += chunk.length;
    }
    if (size !== declared) throw new ModelFetchError("The stored file arrived incomplete; try again.", null);
    return out;
  }
  const chunks: Uint8Array[] = [];
  let size = 0;
  for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
    size += chunk.length;
    if (size > opts.maxBytes) throw new ModelFetchError(`The stored file is larger than ${opts.maxBytes} bytes.`, 413);
    chunks.push(chunk);
  }
  const joined = new Uint8Array(size);
  let at = 0;
  for (const c of chunks) {
    joined.set(c, at);
    at += c.length;
  }
  return joined;
}
