/**
 * Terminal emphasis: whether colour is allowed, and a few painters that fall back to
 * plain text when it is not.
 *
 * Colour is off when the `NO_COLOR` variable is present with any value (the no-color.org
 * convention), when `TERM` is `dumb`, or when the stream is not a TTY (a pipe or a file
 * must receive plain text). Only SGR escapes are used; `textTable.displayWidth` ignores
 * them, so painted cells still line up.
 *
 * Tier colours are our own choice: critical bold magenta, moderate cyan, negligible dim.
 */
import type { Tier } from '../core/sensitivity/tierTypes.js';

export function colourEnabled(stream: { isTTY?: boolean }, env: NodeJS.ProcessEnv): boolean {
  if (env.NO_COLOR !== undefined) return false;
  if (env.TERM === 'dumb') return false;
  return stream.isTTY === true;
}

export interface Painter {
  readonly enabled: boolean;
  bold(text: string): string;
  dim(text: string): string;
  /** For warnings and refusals. */
  warn(text: string): string;
  tier(tier: Tier, text?: string): string;
}

const TIER_STYLE: Record<Tier, string> = {
  critical: '1;35',
  moderate: '36',
  negligible: '2',
};

function sgr(code: string, text: string): string {
  return `\u001b[${code}m${text}\u001b[0m`;
}

/** Painters that colour when `enabled` and return the text unchanged otherwise. */
export function painter(enabled: boolean): Painter {
  const wrap = (code: string) => (text: string) => (enabled && text !== '' ? sgr(code, text) : text);
  const bold = wrap('1');
  const dim = wrap('2');
  const warn = wrap('1;33');
  return {
    enabled,
    bold,
    dim,
    warn,
    tier: (tier, text) => (enabled ? sgr(TIER_STYLE[tier], text ?? tier) : (text ?? tier)),
  };
}

/** Convenience: a painter for `stream` under `env`. */
export function painterFor(stream: { isTTY?: boolean }, env: NodeJS.ProcessEnv): Painter {
  return painter(colourEnabled(stream, env));
}
