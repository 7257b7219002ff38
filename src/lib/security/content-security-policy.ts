/**
 * The Content-Security-Policy of every answer (W3C Content Security Policy Level 3). Pure: the
 * origins it allows besides the app's own are worked out by the server and passed in.
 */
export interface PolicySources {
  /** Where presigned media, posters and peaks come from (the object store, or a CDN in front of it). */
  objectStoreOrigin: string | null;
  /** The payment provider's hosted payment page: the membership form is answered with a redirect there. */
  checkoutOrigin: string | null;
  /** The provider's onboarding page for a studio's payment account: "Connect payments" is answered with a redirect there. */
  onboardingOrigin?: string | null;
  /** `'sha256-…'` of each inline script the page carries (Astro's island bootstrap and directives). */
  scriptHashes: readonly string[];
}

const q = (origin: string | null) => (origin ? [origin] : []);

export function contentSecurityPolicy({ objectStoreOrigin, checkoutOrigin, onboardingOrigin = null, scriptHashes }: PolicySources): string {
  const store = q(objectStoreOrigin);
  const directives: [string, ...string[]][] = [
    ['default-src', "'self'"],
    // Our bundles only, plus Astro's inline island scripts by hash; never 'unsafe-inline' or 'unsafe-eval'.
    // 'report-sample' puts the first 40 characters of a refused inline script into the report (CSP Level 3 §2.3.1).
    ['script-src', "'self'", ...scriptHashes.map((h) => `'${h}'`), "'report-sample'"],
    // 'unsafe-inline' for styles only: React writes style attributes (progress bars, clock ring) and
    // wavesurfer puts a <style> in its shadow root. Styles cannot run code; scripts stay strict.
    ['style-src', "'self'", "'unsafe-inline'"],
    // Posters and thumbnails are presigned store URLs; the upload widget previews files as blob: URLs.
    ['img-src', "'self'", 'data:', 'blob:', ...store],
    // hls.js feeds the <video> through Media Source Extensions, whose source is a blob: URL.
    ['media-src', "'self'", 'blob:', ...store],
    // hls.js fetches playlists and segments, the editor its peaks, the upload widget sends parts: all to the store.
    ['connect-src', "'self'", ...store],
    // hls.js runs its demuxer in a worker made from a blob: URL.
    ['worker-src', "'self'", 'blob:'],
    ['font-src', "'self'"],
    ['object-src', "'none'"],
    ['base-uri', "'self'"],
    ['form-action', "'self'", ...new Set([...q(checkoutOrigin), ...q(onboardingOrigin)])],
    ['frame-ancestors', "'none'"],
  ];
  return directives.map((d) => d.join(' ')).join('; ');
}

/** The script hashes of a policy Astro wrote (its `script-src` sources that are hashes), without quotes. */
export function scriptHashesIn(policy: string | null): string[] {
  const scriptSrc = policy?.split(';').map((d) => d.trim().split(/\s+/)).find(([name]) => name === 'script-src');
  return (scriptSrc ?? []).slice(1).filter((s) => /^'sha(256|384|512)-[A-Za-z0-9+/=]+'$/.test(s)).map((s) => s.slice(1, -1));
}
