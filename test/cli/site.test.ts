// Option parsing of `strobe site`; the build itself is exercised end to end in
// test/site/site.browser.test.ts.
import { describe, expect, it } from 'vitest';
import { parseSiteOptions } from '../../src/cli/commands/site.ts';

describe('strobe site options', () => {
  it('defaults to 127.0.0.1:4321 without serving, and passes other options to the check', () => {
    expect(parseSiteOptions(['--strict', 'models'])).toEqual({ serve: false, port: 4321, host: '127.0.0.1', skipCheck: false, checkArgs: ['--strict', 'models'] });
  });

  it('reads --serve, --port, --host and --skip-check', () => {
    expect(parseSiteOptions(['--serve', '--port', '0', '--host', '::1', '--skip-check'])).toEqual({ serve: true, port: 0, host: '::1', skipCheck: true, checkArgs: [] });
  });

  it('rejects a port that is not a whole number from 0 to 65535, or a missing value', () => {
    expect(parseSiteOptions(['--port', '70000'])).toBe('--port takes a whole number from 0 to 65535, got "70000"');
    expect(parseSiteOptions(['--port', 'x'])).toMatch(/^--port takes a whole number/);
    expect(parseSiteOptions(['--host'])).toBe('--host needs a value');
  });
});
