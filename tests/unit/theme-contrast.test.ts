/**
 * Every text/background colour pair the theme's class lists use meets WCAG 2.2 SC 1.4.3
 * (contrast minimum, AA): 4.5:1 for normal text. Contrast is computed by the `color` npm package
 * (`Color#contrast`), which follows WCAG's relative-luminance definition, and checked here first
 * against the worked values in shared/check-values.md.
 *
 * How pairs are found (our own reading of the source, so it is stated here):
 * - colours come from the `@theme` block of src/styles/global.css (the only palette);
 * - every class list in src (class="…", className="…", and quoted class strings) is read; a
 *   `text-*` colour and a `bg-*` colour in the same list, with the same state prefix (none,
 *   `hover:`, `aria-pressed:`, …), form a pair; a state without its own colour inherits the base one;
 * - a translucent background (`bg-ink/90`) is composited over both page surfaces (paper, chalk);
 * - a text colour whose element sets no background is checked against the surfaces it is used
 *   on: light text (more contrast against ink than against paper) against ink, dark text
 *   against paper and chalk;
 * - `disabled:` styles are left out: WCAG 1.4.3 exempts inactive controls.
 * The browser tests (axe-core's color-contrast rule on every page) check the rendered result too.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import Color from 'color';
import { describe, expect, it } from 'vitest';

const css = readFileSync('src/styles/global.css', 'utf8');
const theme = css.slice(css.indexOf('@theme'), css.indexOf('}', css.indexOf('@theme')));
const palette: Record<string, string> = Object.fromEntries([...theme.matchAll(/--color-([a-z-]+):\s*(#[0-9a-fA-F]{6})/g)].map((m) => [m[1]!, m[2]!]));
palette.white = '#ffffff';
palette.black = '#000000';

const files = (dir: string): string[] =>
  readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? files(p) : /\.(astro|tsx)$/.test(f) ? [p] : [];
  });

/** Class lists in a source file: attribute values and quoted strings that look like Tailwind lists. */
function classLists(source: string): string[] {
  const lists = [...source.matchAll(/class(?:Name)?=(?:"([^"]*)"|\{`([^`]*)`\})/g)].map((m) => m[1] ?? m[2] ?? '');
  const quoted = [...source.matchAll(/'([^'\n]*\b(?:text|bg)-[a-z]+[^'\n]*)'/g)].map((m) => m[1]!);
  return [...lists, ...quoted];
}

type Token = { state: string; colour: string; alpha: number };
function tokens(list: string, kind: 'text' | 'bg'): Token[] {
  const out: Token[] = [];
  for (const cls of list.split(/\s+/)) {
    const m = new RegExp(`^((?:[a-z-]+:)*)${kind}-([a-z]+(?:-[a-z]+)?)(?:/(\\d+))?$`).exec(cls);
    if (!m || !(m[2]! in palette)) continue;
    out.push({ state: m[1]!, colour: palette[m[2]!]!, alpha: m[3] ? Number(m[3]) / 100 : 1 });
  }
  return out;
}

const SURFACES = [palette.paper!, palette.chalk!];
function flatten(bg: Token, surface: string): string {
  // Alpha compositing: result = alpha × colour + (1 − alpha) × surface.
  const c = Color(bg.colour).rgb().array();
  const s = Color(surface).rgb().array();
  return Color.rgb(c.map((v, i) => bg.alpha * v + (1 - bg.alpha) * s[i]!)).hex();
}

interface Pair { file: string; text: string; background: string; state: string }
function pairsIn(file: string): Pair[] {
  const pairs: Pair[] = [];
  for (const list of classLists(readFileSync(file, 'utf8'))) {
    const texts = tokens(list, 'text').filter((t) => !t.state.includes('disabled:'));
    const bgs = tokens(list, 'bg').filter((t) => !t.state.includes('disabled:'));
    const states = new Set([...texts, ...bgs].map((t) => t.state));
    for (const state of states) {
      const text = texts.find((t) => t.state === state) ?? texts.find((t) => t.state === '');
      if (!text) continue;
      const bg = bgs.find((b) => b.state === state) ?? bgs.find((b) => b.state === '');
      const backgrounds = bg
        ? SURFACES.map((s) => flatten(bg, s))
        : Color(text.colour).contrast(Color(palette.ink!)) > Color(text.colour).contrast(Color(palette.paper!))
          ? [palette.ink!]
          : SURFACES;
      for (const background of backgrounds) pairs.push({ file, text: Color(text.colour).hex(), background, state: state || 'base' });
    }
  }
  return pairs;
}

describe('contrast of the theme’s text/background pairs (WCAG 2.2 SC 1.4.3, AA)', () => {
  it('computes the worked values of shared/check-values.md (white on ember 3.68:1, on ember-deep 5.71:1)', () => {
    expect(Color('#ffffff').contrast(Color('#E4572E'))).toBeCloseTo(3.68, 2);
    expect(Color('#ffffff').contrast(Color('#B93A17'))).toBeCloseTo(5.71, 2);
    expect(palette['ember-deep']!.toUpperCase()).toBe('#B93A17'); // design.md
  });

  const all = files('src').flatMap(pairsIn);
  const unique = [...new Map(all.map((p) => [`${p.text}|${p.background}`, p])).values()];

  it('finds the pairs the pages use (a scan that finds nothing would prove nothing)', () => {
    expect(unique.length).toBeGreaterThan(10);
    expect(unique.some((p) => p.text === '#FFFFFF' && p.background === '#B93A17')).toBe(true);
  });

  it.each(unique.map((p) => [`${p.text} on ${p.background}`, p] as const))('%s reaches 4.5:1', (_name, p) => {
    const ratio = Color(p.text).contrast(Color(p.background));
    expect(ratio, `${p.state} in ${p.file}: ${ratio.toFixed(2)}:1`).toBeGreaterThanOrEqual(4.5);
  });
});
