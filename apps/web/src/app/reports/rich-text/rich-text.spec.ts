import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { RichText, textRuns } from './rich-text';

@Component({
  imports: [RichText],
  template: `<p><gw-rich-text [text]="text()" /></p>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly text = signal('Electronic coupling |H_AB|');
}

function render(text: string): HTMLElement {
  const fixture = TestBed.createComponent(Host);
  fixture.componentInstance.text.set(text);
  fixture.detectChanges();
  return fixture.nativeElement.querySelector('p') as HTMLElement;
}

describe('RichText', () => {
  it('splits _X and _{…} into subscripts, as the PDF does', () => {
    expect(textRuns('|H_AB|')).toEqual([
      { text: '|H', sub: false },
      { text: 'AB', sub: true },
      { text: '|', sub: false },
    ]);
    expect(textRuns('√(4πλ_s k_{B}T)')).toEqual([
      { text: '√(4πλ', sub: false },
      { text: 's', sub: true },
      { text: ' k', sub: false },
      { text: 'B', sub: true },
      { text: 'T)', sub: false },
    ]);
    expect(textRuns('no subscripts: ΔG° = −0.3 eV')).toEqual([
      { text: 'no subscripts: ΔG° = −0.3 eV', sub: false },
    ]);
    expect(textRuns('')).toEqual([]);
  });

  it('renders the coupling label with a <sub> and no stray spaces or underscores', () => {
    const p = render('Electronic coupling |H_AB|');
    expect(p.querySelector('sub')?.textContent).toBe('AB');
    expect(p.textContent).toBe('Electronic coupling |HAB|');
    expect(p.textContent).not.toContain('_');
  });

  it('renders braces-style subscripts in equations', () => {
    const p = render('ΔG‡ = (ΔG° + λ)²/(4λ) and τ_L at k_{B}T');
    expect(Array.from(p.querySelectorAll('sub'), (s) => s.textContent)).toEqual(['L', 'B']);
    expect(p.textContent).toBe('ΔG‡ = (ΔG° + λ)²/(4λ) and τL at kBT');
  });
});
