/**
 * Whether to colour what goes to a stream, the way Node's own `hasColors()` decides: FORCE_COLOR
 * first (0 or false turns colour off, any other value on), then NO_COLOR, NODE_DISABLE_COLORS
 * and TERM=dumb turn it off. A stream that is not a terminal gets colour only when forced.
 */
export interface MaybeTerminal {
  isTTY?: boolean;
  hasColors?: () => boolean;
}

export function wantsColor(stream: MaybeTerminal, env: NodeJS.ProcessEnv = process.env): boolean {
  if (stream.isTTY === true && typeof stream.hasColors === 'function') return stream.hasColors();
  const force = env.FORCE_COLOR;
  return force !== undefined && force !== '0' && force !== 'false';
}
