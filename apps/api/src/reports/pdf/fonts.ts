/**
 * The report's fonts: Inter from the `@expo-google-fonts/inter` package, full TrueType files
 * (Inter 4.001) that carry the Greek letters, sub- and superscripts, U+2212 minus and the double
 * dagger (‡) the report prints. The web's `@fontsource/inter` files are subsets (latin: no λ, no
 * subscripts) and its .woff2 files crash fontkit, so they are not used here.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

export const FONT_REGULAR = 'Inter-Regular';
export const FONT_SEMIBOLD = 'Inter-SemiBold';

export interface ReportFonts {
  readonly regular: Buffer;
  readonly semibold: Buffer;
}

let cached: ReportFonts | null = null;

/** Reads the two TTF files once per process. */
export function reportFonts(): ReportFonts {
  if (cached) return cached;
  const require = createRequire(import.meta.url);
  const root = dirname(require.resolve('@expo-google-fonts/inter/package.json'));
  cached = {
    regular: readFileSync(join(root, '400Regular', 'Inter_400Regular.ttf')),
    semibold: readFileSync(join(root, '600SemiBold', 'Inter_600SemiBold.ttf')),
  };
  return cached;
}
