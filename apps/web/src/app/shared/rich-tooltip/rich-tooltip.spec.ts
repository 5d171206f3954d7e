import { OverlayContainer } from '@angular/cdk/overlay';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { RichTooltip } from './rich-tooltip';

@Component({
  imports: [RichTooltip],
  template: `<span
    tabindex="0"
    [gwRichTooltip]="['|H_AB| above k_BT (nonadiabatic formula doubtful)', '2|H_AB| ≥ λ']"
    aria-label="2 warnings"
    >⚠ 2</span
  >`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {}

describe('RichTooltip', () => {
  it('shows its lines with true subscripts on hover and focus, and hides them again', () => {
    const fixture = TestBed.createComponent(Host);
    fixture.detectChanges();
    const container = TestBed.inject(OverlayContainer).getContainerElement();
    const host = fixture.nativeElement.querySelector('span') as HTMLElement;

    host.dispatchEvent(new MouseEvent('mouseenter'));
    fixture.detectChanges();
    const panel = container.querySelector('gw-rich-tooltip-panel')!;
    expect(panel.getAttribute('role')).toBe('tooltip');
    expect(Array.from(panel.querySelectorAll('.line'), (l) => l.textContent)).toEqual([
      '|HAB| above kBT (nonadiabatic formula doubtful)',
      '2|HAB| ≥ λ',
    ]);
    expect(Array.from(panel.querySelectorAll('sub'), (s) => s.textContent)).toEqual([
      'AB',
      'B',
      'AB',
    ]);

    host.dispatchEvent(new MouseEvent('mouseleave'));
    expect(container.querySelector('gw-rich-tooltip-panel')).toBeNull();

    host.dispatchEvent(new FocusEvent('focus'));
    fixture.detectChanges();
    expect(container.querySelector('gw-rich-tooltip-panel')).not.toBeNull();
    host.dispatchEvent(new FocusEvent('blur'));
    expect(container.querySelector('gw-rich-tooltip-panel')).toBeNull();
  });
});
