import { describe, expect, it } from 'vitest';
import { contentSecurityPolicy, scriptHashesIn } from '~/lib/security/content-security-policy';

// Hashes below are invented (any base64 of the right shape); CSP Level 3 §2.3.1 gives the hash-source grammar.
const H1 = 'sha256-AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA=';
const H2 = 'sha256-BBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBB=';

describe('the content security policy', () => {
  it('takes the script hashes from the policy Astro wrote, and nothing else', () => {
    expect(scriptHashesIn(`script-src 'self' '${H1}' '${H2}'; style-src 'self' 'sha256-CCCC'`)).toEqual([H1, H2]);
    expect(scriptHashesIn(null)).toEqual([]);
    expect(scriptHashesIn("script-src 'self' 'unsafe-inline' https://x.example")).toEqual([]);
  });

  it('allows the store and the payment page only where they are needed', () => {
    const policy = contentSecurityPolicy({ objectStoreOrigin: 'https://media.example', checkoutOrigin: 'https://pay.example', scriptHashes: [H1] });
    const d = new Map(policy.split('; ').map((p) => [p.split(' ')[0], p.split(' ').slice(1)]));
    expect(d.get('script-src')).toEqual(["'self'", `'${H1}'`, "'report-sample'"]);
    expect(d.get('media-src')).toEqual(["'self'", 'blob:', 'https://media.example']);
    expect(d.get('img-src')).toContain('https://media.example');
    expect(d.get('connect-src')).toEqual(["'self'", 'https://media.example']);
    expect(d.get('form-action')).toEqual(["'self'", 'https://pay.example']);
    expect(d.get('frame-ancestors')).toEqual(["'none'"]);
    expect(policy).not.toMatch(/unsafe-eval/);
    expect(d.get('script-src')).not.toContain("'unsafe-inline'");
  });
});
