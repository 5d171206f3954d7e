import { ComponentPortal } from '@angular/cdk/portal';
import {
  createFlexibleConnectedPositionStrategy,
  createOverlayRef,
  createRepositionScrollStrategy,
  type OverlayRef,
} from '@angular/cdk/overlay';
import {
  ChangeDetectionStrategy,
  Component,
  Directive,
  ElementRef,
  Injector,
  inject,
  input,
  type OnDestroy,
} from '@angular/core';
import { RichText } from '../rich-text/rich-text';

/** The floating panel of `gwRichTooltip`: one line of scientific text per entry. */
@Component({
  selector: 'gw-rich-tooltip-panel',
  imports: [RichText],
  template: `@for (line of lines(); track $index) {
    <div class="line"><gw-rich-text [text]="line" /></div>
  }`,
  styles: `
    :host {
      display: block;
      max-width: 320px;
      padding: 6px 8px;
      border-radius: 4px;
      background: #2f3a3a;
      color: #ffffff;
      font-size: 12px;
      line-height: 1.45;
      pointer-events: none;
    }
  `,
  host: { role: 'tooltip' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RichTooltipPanel {
  readonly lines = input<readonly string[]>([]);
}

/**
 * A hover and focus tooltip whose lines may carry subscript markup (`|H_AB| above k_BT`), which
 * `matTooltip` would print raw. The host keeps its own aria-label (in plain text) for assistive
 * technology; the panel is for the eye.
 */
@Directive({
  selector: '[gwRichTooltip]',
  host: {
    '(mouseenter)': 'show()',
    '(mouseleave)': 'hide()',
    '(focus)': 'show()',
    '(blur)': 'hide()',
    '(keydown.escape)': 'hide()',
  },
})
export class RichTooltip implements OnDestroy {
  readonly lines = input.required<readonly string[]>({ alias: 'gwRichTooltip' });

  private readonly injector = inject(Injector);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private overlay: OverlayRef | null = null;

  show(): void {
    if (this.overlay || this.lines().length === 0) return;
    const position = createFlexibleConnectedPositionStrategy(this.injector, this.host)
      .withPositions([
        { originX: 'center', originY: 'bottom', overlayX: 'center', overlayY: 'top', offsetY: 6 },
        { originX: 'center', originY: 'top', overlayX: 'center', overlayY: 'bottom', offsetY: -6 },
      ])
      .withFlexibleDimensions(false)
      .withPush(true);
    this.overlay = createOverlayRef(this.injector, {
      positionStrategy: position,
      // As matTooltip: follows its host on scroll, and closes once the host scrolls out of view.
      scrollStrategy: createRepositionScrollStrategy(this.injector, {
        scrollThrottle: 20,
        autoClose: true,
      }),
    });
    const panel = this.overlay.attach(new ComponentPortal(RichTooltipPanel));
    panel.setInput('lines', this.lines());
  }

  hide(): void {
    this.overlay?.dispose();
    this.overlay = null;
  }

  ngOnDestroy(): void {
    this.hide();
  }
}
