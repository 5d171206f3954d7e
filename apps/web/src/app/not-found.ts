import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'gw-not-found',
  imports: [RouterLink],
  template: `
    <div class="gw-page">
      <h1 class="gw-title">Page not found</h1>
      <p>This address does not lead to a Gapwise page. <a routerLink="/">Go to your pairs</a>.</p>
    </div>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFound {}
