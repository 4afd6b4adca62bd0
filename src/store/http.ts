// HTTP requests to a SPARQL server → responses, with Basic or Digest auth, timeouts and bounded retries (urllib
// adapter).
import { setTimeout as sleep } from 'node:timers/promises';
import { request, type RequestOptions } from 'urllib';
import { UserError, EXIT } from '../errors.js';
import { PASSWORD_VAR, USER_VAR, type Credentials } from './netrc.js';

/** Client settings; the defaults suit a store on the same network. */
export interface HttpOptions {
  credentials: Credentials | null;
  /** Per request, for connecting and for the answer. */
  timeoutMs: number;
  /** Extra attempts after a 5xx answer, a reset connection or a timeout (never after a 4xx). */
  retries: number;
  /** First wait between attempts; doubles each time. */
  backoffMs: number;
  /**
   * Send Basic credentials over plain http to a host other than this machine when a server asks for them (default
   * false: refused, the password would cross the network readable).
   */
  allowBasicOverHttp?: boolean;
}

/** The environment variable that allows Basic authentication over plain http (trusted networks). */
export const ALLOW_BASIC_VAR = 'CONCORDAT_STORE_ALLOW_BASIC_OVER_HTTP';

/**
 * Whether a URL's host is this machine's loopback interface (127.0.0.0/8, ::1, "localhost": RFC 6890 §2.2.2, RFC 4291
 * §2.5.3, RFC 6761 §6.3). Basic over plain http is allowed there: the password never leaves the machine, and reading
 * loopback traffic takes the same privileges as reading the process's memory or environment, where it already is.
 */
export function isLoopback(url: string): boolean {
  const host = new URL(url).hostname.replace(/^\[|\]$/g, '').toLowerCase();
  return host === 'localhost' || host.endsWith('.localhost') || host === '::1' || /^127(\.[0-9]{1,3}){3}$/.test(host);
}

/** Basic credentials may be sent to `url`: over https, to this machine, or where the user allowed plain http. */
const basicAllowed = (url: string, allowed: boolean): boolean =>
  new URL(url).protocol === 'https:' || isLoopback(url) || allowed;

/** What came back. */
export interface HttpAnswer {
  status: number;
  text: string;
  challenge: string;
}

/** One request: a body (with its media type) or form fields, and what to accept. */
export interface HttpRequest {
  body?: string;
  contentType?: string;
  form?: Record<string, string>;
  accept?: string;
}

// Connection-level faults worth another try (undici codes; common practice, no source).
const RETRYABLE = new Set([
  'ECONNRESET',
  'EPIPE',
  'UND_ERR_SOCKET',
  'UND_ERR_HEADERS_TIMEOUT',
  'UND_ERR_BODY_TIMEOUT',
  'UND_ERR_CONNECT_TIMEOUT',
  'ETIMEDOUT',
]);

const codeOf = (err: unknown): string => {
  const e = err as { code?: string; cause?: { code?: string }; name?: string };
  return e.code ?? e.cause?.code ?? e.name ?? 'error';
};

/** A URL without user info or query, for messages. */
export const shownUrl = (url: string): string => {
  const u = new URL(url);
  return `${u.protocol}//${u.host}${u.pathname}`;
};

/**
 * HTTP client for the remote store. Auth follows the server's challenge (RFC 7235 §4.1): Digest (RFC 7616) through
 * urllib's `digestAuth`, Basic (RFC 7617) once a challenge names it. Messages never contain the password.
 */
export class Http {
  private basic = false;
  constructor(private readonly opts: HttpOptions) {}

  /** Replaces the password wherever it might appear in a message. */
  redact(text: string): string {
    let t = text.replace(/\/\/[^/\s@]*@/g, '//***@'); // user info in any URL
    const c = this.opts.credentials;
    if (!c) return t;
    const secrets = [
      c.password,
      Buffer.from(`${c.user}:${c.password}`).toString('base64'),
      `username="${c.user}"`,
      `${c.user}:`,
    ];
    for (const secret of secrets) if (secret && secret !== ':') t = t.split(secret).join('***');
    return t;
  }

  private async once(method: 'GET' | 'POST' | 'DELETE', url: string, req: HttpRequest): Promise<HttpAnswer> {
    const headers: Record<string, string> = {};
    if (req.accept) headers.accept = req.accept;
    if (req.contentType) headers['content-type'] = req.contentType;
    const o: RequestOptions = {
      method,
      headers,
      timeout: this.opts.timeoutMs,
      dataType: 'text',
      retry: 0,
      socketErrorRetry: 0,
    };
    if (req.body !== undefined) o.content = req.body;
    if (req.form) o.data = req.form;
    const c = this.opts.credentials;
    if (c) {
      if (this.basic) o.auth = `${c.user}:${c.password}`;
      else o.digestAuth = `${c.user}:${c.password}`;
    }
    const res = await request(url, o);
    const raw = res.headers['www-authenticate'];
    const challenge = Array.isArray(raw) ? raw.join(', ') : (raw ?? '');
    if (res.status === 401 && c && !this.basic && /^\s*Basic\b/i.test(challenge)) {
      if (!basicAllowed(url, this.opts.allowBasicOverHttp ?? false))
        throw new UserError(
          {
            file: shownUrl(url),
            line: 0,
            field: '',
            message:
              'the store asks for Basic authentication over plain http, which would send the password readable across the network',
            hint: `use https, or set ${ALLOW_BASIC_VAR}=1 on a network you trust`,
          },
          EXIT.failure,
        );
      this.basic = true;
      return this.once(method, url, req);
    }
    return { status: res.status, text: String(res.data ?? ''), challenge };
  }

  /** Sends with retries; a 401 becomes a user error naming where the credentials came from. */
  async send(method: 'GET' | 'POST' | 'DELETE', url: string, req: HttpRequest = {}): Promise<HttpAnswer> {
    for (let attempt = 0; ; attempt++) {
      let answer: HttpAnswer | null = null;
      let fault: unknown = null;
      try {
        answer = await this.once(method, url, req);
      } catch (err) {
        if (err instanceof UserError) throw err; // a refusal of ours (Basic over http), not a fault of the network
        fault = err;
      }
      const retry = answer ? answer.status >= 500 : RETRYABLE.has(codeOf(fault));
      if (retry && attempt < this.opts.retries) {
        await sleep(this.opts.backoffMs * 2 ** attempt);
        continue;
      }
      if (!answer) {
        const code = codeOf(fault);
        throw new UserError(
          {
            file: shownUrl(url),
            line: 0,
            field: '',
            message: this.redact(`no answer (${code}) after ${attempt + 1} attempt(s)`),
            hint: code === 'ECONNREFUSED' ? 'is the store running at this address?' : 'check the URL and the network',
          },
          EXIT.failure,
        );
      }
      if (answer.status === 401) throw this.refused(url);
      return answer;
    }
  }

  private refused(url: string): UserError {
    const c = this.opts.credentials;
    const message = c
      ? `the store refused the credentials from ${c.from} (HTTP 401)`
      : 'the store asks for credentials (HTTP 401) and none were given';
    return new UserError(
      {
        file: shownUrl(url),
        line: 0,
        field: '',
        message,
        hint: `set ${USER_VAR} and ${PASSWORD_VAR}, or add a netrc entry for this host`,
      },
      EXIT.failure,
    );
  }
}
