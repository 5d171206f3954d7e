import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { RichText } from './rich-text';

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

const subs = (el: HTMLElement) => Array.from(el.querySelectorAll('sub'), (s) => s.textContent);

describe('RichText', () => {
  it('renders the coupling label with a <sub> and no stray spaces or underscores', () => {
    const p = render('Electronic coupling |H_AB|');
    expect(subs(p)).toEqual(['AB']);
    expect(p.textContent).toBe('Electronic coupling |HAB|');
    expect(p.textContent).not.toContain('_');
  });

  it('renders braces-style subscripts in equations and only the B of k_BT', () => {
    const p = render('ΔG‡ = (ΔG° + λ)²/(4λ) and τ_L at k_{B}T, |H_AB| below k_BT');
    expect(subs(p)).toEqual(['L', 'B', 'AB', 'B']);
    expect(p.textContent).toBe('ΔG‡ = (ΔG° + λ)²/(4λ) and τL at kBT, |HAB| below kBT');
  });

  it('leaves typed names with underscores alone', () => {
    const p = render("unknown solvent 'my_solvent'");
    expect(subs(p)).toEqual([]);
    expect(p.textContent).toBe("unknown solvent 'my_solvent'");
  });
});
