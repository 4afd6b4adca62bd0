// Environment and netrc file → store credentials for one host (never from arguments, never printed).
import { readFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import { UserError, EXIT } from '../errors.js';

/** A user name and password, with where they came from (named in messages; the password never is). */
export interface Credentials {
  user: string;
  password: string;
  from: string;
}

export const USER_VAR = 'CONCORDAT_STORE_USER';
export const PASSWORD_VAR = 'CONCORDAT_STORE_PASSWORD';

/**
 * Finds the entry for `host` in netrc text: `machine <host> login <u> password <p>` or a `default` entry
 * (the format of inetutils ftp(1) "The .netrc file"; `macdef` bodies are skipped up to the next blank line).
 */
export function netrcEntry(text: string, host: string): { login?: string; password?: string } | null {
  const cleaned = text.replace(/^macdef[^\n]*\n(?:[^\n]+\n)*/gm, '');
  const tokens = cleaned.split(/\s+/).filter(Boolean);
  let current: { login?: string; password?: string } | null = null;
  let matched: { login?: string; password?: string } | null = null;
  let fallback: { login?: string; password?: string } | null = null;
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i];
    if (t === 'machine') {
      current = {};
      if (tokens[++i] === host && !matched) matched = current;
    } else if (t === 'default') {
      current = {};
      if (!fallback) fallback = current;
    } else if (current && (t === 'login' || t === 'password' || t === 'account')) {
      const v = tokens[++i];
      if (t === 'login') current.login = v;
      if (t === 'password') current.password = v;
    }
  }
  return matched ?? fallback;
}

/**
 * Credentials for a URL: both environment variables, else a netrc entry ($NETRC or ~/.netrc) for its host, else none.
 */
export function credentialsFor(url: string, env: NodeJS.ProcessEnv = process.env): Credentials | null {
  const user = env[USER_VAR];
  const password = env[PASSWORD_VAR];
  if (user !== undefined || password !== undefined) {
    if (!user || password === undefined)
      throw new UserError(
        {
          file: 'environment',
          line: 0,
          field: user ? PASSWORD_VAR : USER_VAR,
          message: 'is not set, but the other store credential is',
          hint: `set both ${USER_VAR} and ${PASSWORD_VAR}, or neither`,
        },
        EXIT.badInput,
      );
    return { user, password, from: `${USER_VAR}/${PASSWORD_VAR}` };
  }
  const path = env.NETRC || join(homedir(), '.netrc');
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    return null;
  }
  const entry = netrcEntry(text, new URL(url).hostname);
  if (!entry?.login || entry.password === undefined) return null;
  return { user: entry.login, password: entry.password, from: path };
}
