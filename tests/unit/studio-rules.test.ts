import { describe, expect, it } from 'vitest';
import Color from 'color';
import { accentVerdict, RESERVED_SLUGS, slugProblem } from '~/lib/studios/studio-rules';
import { startStudioInput, slugField, accentColourField } from '~/lib/api/studio-schemas';

describe('studio address (slug)', () => {
  it.each(['larchmere', 'fernhill-movement', 'abc', 'studio-42', 'a'.repeat(40), '9lives'])('%s is fine', (slug) => {
    expect(slugProblem(slug)).toBeNull();
  });

  it.each([
    ['ab', 'too short'],
    ['a'.repeat(41), 'too long'],
    ['-larch', 'starts with a dash'],
    ['larch-', 'ends with a dash'],
    ['larch--mere', 'two dashes in a row'],
    ['Larchmere', 'upper case (the schema lower-cases first)'],
    ['larch mere', 'a space'],
    ['larch_mere', 'an underscore'],
    ['lärchmere', 'a letter outside a–z'],
    ['larch/mere', 'a slash'],
    ['larch%2fmere', 'an escaped slash'],
  ])('%s is refused (%s)', (slug) => {
    expect(slugProblem(slug)).toBe('shape');
  });

  it.each(['api', 'studio', 'sign-in', 'library', 'admin', 'www', 'start', 'join'])('%s is reserved', (slug) => {
    expect(slugProblem(slug)).toBe('reserved');
  });

  it('every reserved word would otherwise be a valid address (so the list is what refuses it)', () => {
    for (const slug of RESERVED_SLUGS) expect(slug.length < 3 || /^[a-z0-9-]+$/.test(slug)).toBe(true);
  });

  it('the schema trims and lower-cases what was typed, then checks it', () => {
    expect(slugField.parse('  Larchmere-Pilates ')).toBe('larchmere-pilates');
    const refused = slugField.safeParse('API');
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0]?.message).toBe('That address is reserved. Choose another one.');
  });
});

// WCAG 2.2 SC 1.4.3 (contrast minimum, AA): 4.5:1 for normal text; ratio (L1 + 0.05) / (L2 + 0.05)
// with relative luminance from sRGB (WCAG 2.2 definitions). Figures from /work/shared/check-values.md
// ("computed here"): white on #E4572E = 3.68:1, white on #B93A17 = 5.71:1.
describe('accent colour contrast (WCAG 2.2 AA 4.5:1)', () => {
  it('ember-deep #B93A17 takes white text at 5.71:1', () => {
    const v = accentVerdict('#B93A17');
    expect(v).toMatchObject({ text: 'white', ok: true });
    expect(v.ratio).toBeCloseTo(5.71, 2);
  });

  it('ember #E4572E is refused: white text 3.68:1 and ink text 4.42:1 are both below 4.5:1', () => {
    expect(Color('#E4572E').contrast(Color('#FFFFFF'))).toBeCloseTo(3.68, 2);
    const v = accentVerdict('#E4572E');
    expect(v).toMatchObject({ text: 'ink', ok: false });
    expect(v.ratio).toBeCloseTo(4.42, 2);
  });

  it('sun #F2A541 is allowed with ink text', () => {
    const v = accentVerdict('#F2A541');
    expect(v).toMatchObject({ text: 'ink', ok: true });
    expect(v.ratio).toBeGreaterThan(4.5);
  });

  it('a mid grey where neither white nor ink reaches 4.5:1 is refused', () => {
    // #6F7A89 (invented): white ≈ 4.3:1, ink ≈ 3.9:1 by the WCAG formula.
    const v = accentVerdict('#6F7A89');
    expect(v.ok).toBe(false);
    expect(v.ratio).toBeLessThan(4.5);
    expect(Color('#6F7A89').contrast(Color('#FFFFFF'))).toBeLessThan(4.5);
    expect(Color('#6F7A89').contrast(Color('#172033'))).toBeLessThan(4.5);
  });

  it('white and ink are about 16.9:1 apart, so no colour gives both 4.5:1 (one readable text colour is the rule)', () => {
    expect(Color('#FFFFFF').contrast(Color('#172033'))).toBeLessThan(4.5 * 4.5);
  });

  it('the schema names the ratio and the standard in its refusal, and accepts #rrggbb only', () => {
    const refused = accentColourField.safeParse('#6F7A89');
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0]?.message).toMatch(/WCAG 2\.2 AA asks for 4\.5:1/);
    expect(accentColourField.safeParse('red').success).toBe(false);
    expect(accentColourField.safeParse('#abc').success).toBe(false);
    expect(accentColourField.parse('#b93a17')).toBe('#B93A17');
  });

  it('refuses text that names no colour with the pattern message instead of throwing (found by the API fuzz test)', () => {
    for (const text of ['NaN', 'not a colour', '#GGGGGG']) {
      const refused = accentColourField.safeParse(text);
      expect(refused.success, text).toBe(false);
      expect(refused.error?.issues.map((i) => i.message), text).toEqual(['Choose a colour like #B93A17.']);
    }
  });
});

describe('start-a-studio input', () => {
  const good = { name: 'Larchmere Pilates Studio', slug: 'larchmere', timeZone: 'Europe/London', currency: 'gbp', monthlyPriceMinor: 1500, trialDays: 7, accentColour: '#2E5E4E' };
  it('accepts a complete studio', () => {
    expect(startStudioInput.parse(good)).toMatchObject({ slug: 'larchmere', accentColour: '#2E5E4E' });
  });
  it.each([
    ['slug', { slug: 'sign-up' }],
    ['timeZone', { timeZone: 'Europe/Nowhere' }],
    ['currency', { currency: 'xyz' }],
    ['monthlyPriceMinor', { monthlyPriceMinor: 5 }],
    ['trialDays', { trialDays: 365 }],
    ['accentColour', { accentColour: '#6F7A89' }],
    ['name', { name: ' ' }],
  ])('names the field %s when it is wrong', (field, change) => {
    const r = startStudioInput.safeParse({ ...good, ...change });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path[0])).toEqual([field]);
  });
});
