// The app's one way to talk to the server: JSON in, JSON out, errors in the server's one shape.

export interface ApiErrorBody {
  code: string;
  message: string;
  fields?: Record<string, string[]>;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.message);
  }
  get fields() {
    return this.body.fields ?? {};
  }
}

/** The request never reached the server (offline, server down): try again later, nothing is lost. */
export class OfflineError extends Error {
  constructor() {
    super("No connection to the server right now.");
  }
}

export async function apiFetch<T>(path: string, init: { method?: string; body?: unknown; signal?: AbortSignal } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method: init.method ?? (init.body === undefined ? "GET" : "POST"),
      headers: init.body === undefined ? { Accept: "application/json" } : { "Content-Type": "application/json", Accept: "application/json" },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
      credentials: "same-origin",
      signal: init.signal,
    });
  } catch (err) {
    // Cancelled by the caller: say so. A request that ran out of time (TimeoutError) is as good as offline.
    if ((err as Error).name === "AbortError") throw err;
    throw new OfflineError();
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  let json: unknown = undefined;
  try {
    json = text ? JSON.parse(text) : undefined;
  } catch {
    // A proxy's HTML error page, for example.
  }
  if (!res.ok) {
    const body = (json as { error?: ApiErrorBody } | undefined)?.error ?? { code: "http_" + res.status, message: `The server answered ${res.status}.` };
    if (res.status >= 502 && res.status <= 504 && !(json as { error?: unknown })?.error) throw new OfflineError();
    throw new ApiError(res.status, body);
  }
  return json as T;
}
