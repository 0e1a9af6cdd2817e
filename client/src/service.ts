/**
 * The connection to one tropodelay service: base URL, key, and one `request` that every command goes
 * through. Node 20's fetch; no other HTTP library. A 4xx/5xx answer becomes a ServiceError carrying the
 * RFC 9457 problem the service sent (title, detail, and the fields it names), so a caller sees the
 * service's own words ("lower options.elevation_cutoff_deg") rather than a bare status.
 */

export interface ServiceOptions {
  /** e.g. `http://127.0.0.1:8080` (a trailing slash is dropped). */
  baseUrl: string;
  /** The secret of an API key, sent as `Authorization: Bearer <key>`; reads of an open archive need none. */
  key?: string;
  /**
   * How often a request is repeated after a network error or a 502/503/504 (a replica restarting behind a
   * load balancer). Only idempotent requests are repeated: PUT, GET, and the met upload (a re-sent record
   * is counted `unchanged`). Default 2.
   */
  retries?: number;
  /** Wait before the first repeat [ms], doubled at each further one. Default 500. */
  retryDelayMs?: number;
  /** A fetch to use instead of the global one (tests). */
  fetch?: typeof fetch;
}

/** One field the service named in a problem answer. */
export interface ProblemField {
  field: string;
  message: string;
}

/** An answer of status ≥ 400, with the problem+json body when the service sent one. */
export class ServiceError extends Error {
  constructor(
    readonly status: number,
    readonly method: string,
    readonly path: string,
    readonly title: string,
    readonly detail: string | undefined,
    readonly fields: ProblemField[],
  ) {
    const where = fields.length ? ` (${fields.map((f) => `${f.field}: ${f.message}`).join('; ')})` : '';
    super(`${method} ${path}: ${status} ${title}${detail ? `: ${detail}` : ''}${where}`);
    this.name = 'ServiceError';
  }

  /** True for answers that the same request may not get again: the service or a proxy was unavailable. */
  get transient(): boolean {
    return this.status === 502 || this.status === 503 || this.status === 504;
  }
}

export type QueryValue = string | number | boolean | undefined;

export interface RequestOptions {
  query?: Record<string, QueryValue>;
  /** A JSON value (sent as application/json) or text/bytes with `contentType`. */
  json?: unknown;
  body?: string | Uint8Array;
  contentType?: string;
  accept?: string;
  /** Repeat after a transient failure (see ServiceOptions.retries). Default: true for GET and PUT. */
  idempotent?: boolean;
}

const TRANSIENT_NETWORK_CODES = new Set(['ECONNRESET', 'ECONNREFUSED', 'EPIPE', 'ETIMEDOUT', 'UND_ERR_SOCKET']);

export class Service {
  readonly baseUrl: string;
  private readonly key: string | undefined;
  private readonly retries: number;
  private readonly retryDelayMs: number;
  private readonly fetchImpl: typeof fetch;

  constructor(options: ServiceOptions) {
    let url: URL;
    try {
      url = new URL(options.baseUrl);
    } catch {
      throw new TypeError(
        `the service URL must be an absolute http(s) URL such as http://127.0.0.1:8080, got ${JSON.stringify(options.baseUrl)}`,
      );
    }
    if (url.protocol !== 'http:' && url.protocol !== 'https:')
      throw new TypeError(`the service URL must start with http:// or https://, got ${JSON.stringify(options.baseUrl)}`);
    this.baseUrl = url.href.replace(/\/+$/, '');
    this.key = options.key;
    this.retries = options.retries ?? 2;
    this.retryDelayMs = options.retryDelayMs ?? 500;
    this.fetchImpl = options.fetch ?? fetch;
  }

  /** Sends one request; resolves with the Response of a 2xx answer, throws ServiceError otherwise. */
  async request(method: string, path: string, options: RequestOptions = {}): Promise<Response> {
    const idempotent = options.idempotent ?? (method === 'GET' || method === 'PUT');
    for (let attempt = 0; ; attempt++) {
      try {
        return await this.requestOnce(method, path, options);
      } catch (err) {
        if (!idempotent || attempt >= this.retries || !isTransient(err)) throw err;
        await new Promise((resolve) => setTimeout(resolve, this.retryDelayMs * 2 ** attempt));
      }
    }
  }

  /** `request` and the answer's JSON body. */
  async json<T>(method: string, path: string, options: RequestOptions = {}): Promise<T> {
    const response = await this.request(method, path, { accept: 'application/json', ...options });
    return (await response.json()) as T;
  }

  private async requestOnce(method: string, path: string, options: RequestOptions): Promise<Response> {
    const headers: Record<string, string> = {};
    if (this.key) headers.authorization = `Bearer ${this.key}`;
    if (options.accept) headers.accept = options.accept;
    let body: string | Uint8Array | undefined = options.body;
    if (options.json !== undefined) {
      body = JSON.stringify(options.json);
      headers['content-type'] = 'application/json';
    } else if (body !== undefined) {
      headers['content-type'] = options.contentType ?? 'application/octet-stream';
    }
    const response = await this.fetchImpl(this.url(path, options.query), { method, headers, body: body as RequestInit['body'] });
    if (response.ok) return response;
    throw await problemOf(response, method, path);
  }

  private url(path: string, query: Record<string, QueryValue> = {}): string {
    const params = new URLSearchParams();
    for (const [name, value] of Object.entries(query)) if (value !== undefined) params.set(name, String(value));
    const search = params.toString();
    return `${this.baseUrl}${path}${search ? `?${search}` : ''}`;
  }
}

/** The path segment of an id (station, campaign, day), escaped. */
export function segment(id: string): string {
  return encodeURIComponent(id);
}

async function problemOf(response: Response, method: string, path: string): Promise<ServiceError> {
  const text = await response.text();
  let problem: { title?: unknown; detail?: unknown; errors?: unknown } = {};
  try {
    problem = JSON.parse(text) as typeof problem;
  } catch {
    // not JSON (a proxy's HTML page): the status says enough
  }
  const fields = Array.isArray(problem.errors)
    ? (problem.errors as Array<Partial<ProblemField>>).map((e) => ({ field: String(e.field ?? ''), message: String(e.message ?? '') }))
    : [];
  return new ServiceError(
    response.status,
    method,
    path,
    typeof problem.title === 'string' ? problem.title : response.statusText || 'error',
    typeof problem.detail === 'string' ? problem.detail : undefined,
    fields,
  );
}

function isTransient(err: unknown): boolean {
  if (err instanceof ServiceError) return err.transient;
  // fetch rejects with a TypeError('fetch failed') whose cause is the socket error
  const cause = (err as { cause?: { code?: unknown } } | null)?.cause;
  return err instanceof TypeError && typeof cause?.code === 'string' && TRANSIENT_NETWORK_CODES.has(cause.code);
}
