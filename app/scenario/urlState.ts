import { ModelError } from '../../solver/index';
import { setupToScenario } from './scenario';
import { readScenario, scenarioJson, type LoadedScenario } from './scenarioFile';
import type { Pin } from '../store/probeSlice';
import { withPins } from './scenarioPins';
import type { Setup } from './setup';

/** The hash parameter that holds the scenario: `#s=<base64url of the compact JSON>`. */
export const SCENARIO_HASH_KEY = 's';

/** UTF-8 text as unpadded base64url (RFC 4648 section 5). */
export function encodeBase64Url(text: string): string {
  let binary = '';
  for (const byte of new TextEncoder().encode(text)) binary += String.fromCharCode(byte);
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/** The UTF-8 text of unpadded (or padded) base64url; throws ModelError when it is not that. */
export function decodeBase64Url(code: string, field: string): string {
  const body = code.replace(/=+$/, '');
  if (!/^[A-Za-z0-9_-]*$/.test(body) || body.length % 4 === 1) {
    throw new ModelError(`${field}: not valid base64url (the link may be cut short or mistyped)`);
  }
  const binary = atob(body.replace(/-/g, '+').replace(/_/g, '/'));
  const bytes = Uint8Array.from(binary, (c) => c.charCodeAt(0));
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new ModelError(`${field}: the decoded text is not UTF-8 (the link may be cut short)`);
  }
}

function hashParams(hash: string): URLSearchParams {
  return new URLSearchParams(hash.startsWith('#') ? hash.slice(1) : hash);
}

/**
 * The location hash that carries the setup, keeping any other parameters of `currentHash`.
 * The scenario document is written as compact JSON (no spaces) and base64url-encoded.
 */
export function scenarioHash(setup: Setup, currentHash = '', pins: readonly Pin[] = []): string {
  const params = hashParams(currentHash);
  const document = withPins(setupToScenario(setup), pins);
  params.set(SCENARIO_HASH_KEY, encodeBase64Url(JSON.stringify(document)));
  return `#${params.toString()}`;
}

const LINK = `link (#${SCENARIO_HASH_KEY}=)`;

/**
 * The setup a location hash carries, or null when it carries none. A malformed one throws
 * ModelError with one line that starts with "link" and names the problem: bad base64url, bad
 * JSON, or the scenario field that fails validation.
 */
export function readScenarioHash(hash: string): Setup | null {
  return readScenarioLink(hash)?.setup ?? null;
}

/**
 * The scenario of a location hash as the app takes it in (`readScenario`: the setup fitted to
 * the browser, the Probe pins, a note), or null when the hash holds none.
 */
export function readScenarioLink(hash: string): LoadedScenario | null {
  const code = hashParams(hash).get(SCENARIO_HASH_KEY);
  if (code === null) return null;
  if (code === '') throw new ModelError(`${LINK}: empty; the link holds no scenario`);
  const text = decodeBase64Url(code, LINK);
  return readScenario(scenarioJson(text, LINK), LINK);
}
