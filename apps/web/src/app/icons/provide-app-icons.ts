import { inject, provideAppInitializer, type EnvironmentProviders } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';
import { APP_ICON_SVGS } from './app-icon-svgs';

/**
 * Registers the bundled icon SVGs with Angular Material's icon registry, so
 * `<mat-icon svgIcon="name">` draws them inline with no request. The markup is our own build's
 * (app-icon-svgs.ts, generated from an npm package), hence trusted.
 */
export function provideAppIcons(): EnvironmentProviders {
  return provideAppInitializer(() => {
    const registry = inject(MatIconRegistry);
    const sanitizer = inject(DomSanitizer);
    for (const [name, svg] of Object.entries(APP_ICON_SVGS)) {
      registry.addSvgIconLiteral(name, sanitizer.bypassSecurityTrustHtml(svg));
    }
  });
}
