/**
 * The web app ships only the icons it shows: every icon a template names is in the bundled list
 * (app/icons/app-icons.ts), every listed icon is used, the generated SVG module is current, no
 * `<mat-icon>` still relies on a font ligature, and nothing loads the 4 MB symbol font.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { APP_ICON_NAMES } from '../../apps/web/src/app/icons/app-icons';
import { APP_ICON_SVGS } from '../../apps/web/src/app/icons/app-icon-svgs';
import { ICON_SVGS_FILE, iconSvgsModule } from '../../apps/web/tools/generate-icons';

const webSrc = join(process.cwd(), 'apps/web/src');
const iconDir = join(webSrc, 'app/icons');

function sources(dir: string, out: string[] = []): string[] {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) {
      if (path !== iconDir) sources(path, out);
    } else if (/\.(html|ts|scss)$/.test(entry.name) && !entry.name.endsWith('.spec.ts')) {
      out.push(path);
    }
  }
  return out;
}

const files = sources(webSrc).map((path) => ({
  path: relative(process.cwd(), path),
  text: readFileSync(path, 'utf8'),
}));

describe('bundled icons', () => {
  it('registers every icon a template names, statically or as a literal in a binding', () => {
    const named = new Set<string>();
    for (const { path, text } of files) {
      for (const m of text.matchAll(/\bsvgIcon="([^"]+)"/g)) named.add(`${m[1]} (${path})`);
      for (const m of text.matchAll(/\[svgIcon\]="([^"]+)"/g)) {
        for (const lit of m[1]!.matchAll(/'([^']+)'/g)) named.add(`${lit[1]} (${path})`);
      }
    }
    expect(named.size).toBeGreaterThan(30);
    const missing = [...named].filter(
      (entry) => !(APP_ICON_NAMES as readonly string[]).includes(entry.split(' ')[0]!),
    );
    expect(missing).toEqual([]);
  });

  it('lists no icon the app does not use (each appears quoted in a template or source)', () => {
    const unused = APP_ICON_NAMES.filter(
      (name) =>
        !files.some(({ text }) => text.includes(`svgIcon="${name}"`) || text.includes(`'${name}'`)),
    );
    expect(unused).toEqual([]);
  });

  it('leaves no mat-icon drawn from a font ligature (text content instead of svgIcon)', () => {
    const ligatures = files.flatMap(({ path, text }) =>
      [...text.matchAll(/<mat-icon\b[^>]*>([^<]*)<\/mat-icon>/g)]
        .filter((m) => m[1]!.trim() !== '' || !/svgIcon/.test(m[0]))
        .map((m) => `${path}: ${m[0]}`),
    );
    expect(ligatures).toEqual([]);
  });

  it('bundles the SVG of every listed icon, as npm run icons writes it now', async () => {
    expect(Object.keys(APP_ICON_SVGS).sort()).toEqual([...APP_ICON_NAMES].sort());
    for (const svg of Object.values(APP_ICON_SVGS)) expect(svg).toMatch(/^<svg [^>]*viewBox=/);
    expect(readFileSync(ICON_SVGS_FILE, 'utf8')).toBe(await iconSvgsModule());
  });

  it('loads no symbol font: not in the styles, the build config or the dependencies', () => {
    const styleAndConfig = [
      ...files.filter(({ path }) => path.endsWith('.scss')),
      { path: 'angular.json', text: readFileSync('angular.json', 'utf8') },
    ];
    expect(
      styleAndConfig.filter(({ text }) => /material-symbols|material-icons/i.test(text)),
    ).toEqual([]);
    expect(files.filter(({ text }) => /fontSet|material-symbols-outlined/.test(text))).toEqual([]);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as {
      dependencies: Record<string, string>;
    };
    expect(Object.keys(pkg.dependencies)).not.toContain('material-symbols');
  });
});
