/**
 * Where to go after sign-in: only a path on this site. One leading slash, and no second slash or
 * backslash that a browser would read as another host ("//evil.example", "/\evil.example").
 */
export function safeNextPath(next: string | undefined): string | undefined {
  if (!next || !/^\/(?![/\\])[^\\\s]*$/.test(next)) return undefined;
  return new URL(next, 'http://x.invalid').host === 'x.invalid' ? next : undefined;
}
