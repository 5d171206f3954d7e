import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { Session } from '../session/session';
import { WorkspaceContext } from '../workspaces/workspace-context';
import { Shell } from './shell';

describe('Shell', () => {
  it('renders the product name, the workspace, its sections and the user', async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        {
          provide: Session,
          useValue: {
            user: signal({ id: 'u1', email: 'editor@gapwise.test', displayName: 'Ada Editor' }),
          },
        },
        {
          provide: WorkspaceContext,
          useValue: {
            workspaceId: signal('w1'),
            workspaces: signal([
              { workspaceId: 'w1', workspaceName: 'Photoredox Lab', role: 'editor' },
            ]),
            current: signal({ workspaceId: 'w1', workspaceName: 'Photoredox Lab', role: 'editor' }),
            role: signal('editor'),
          },
        },
      ],
    });
    const fixture = TestBed.createComponent(Shell);
    fixture.detectChanges();
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    expect(el.querySelector('.brand')?.textContent).toContain('Gapwise');
    expect(el.querySelector('.workspace-name')?.textContent).toContain('Photoredox Lab');
    const nav = Array.from(el.querySelectorAll('nav.sections a')).map((a) => [
      a.textContent?.trim(),
      a.getAttribute('href'),
    ]);
    expect(nav).toContainEqual(['Pairs', '/w/w1/pairs']);
    expect(nav).toContainEqual(['Cascades', '/w/w1/cascades']);
    expect(nav).toContainEqual(['Members', '/w/w1/members']);
    expect(el.querySelector('.user-name')?.textContent).toContain('Ada Editor');
    expect(el.querySelector('main#gw-main')).not.toBeNull();
  });

  it('folds the sections behind a menu button that opens, closes on Escape and takes focus back', async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        { provide: Session, useValue: { user: signal(null) } },
        {
          provide: WorkspaceContext,
          useValue: {
            workspaceId: signal('w1'),
            workspaces: signal([]),
            current: signal(null),
            role: signal(null),
          },
        },
      ],
    });
    const fixture = TestBed.createComponent(Shell);
    fixture.detectChanges();
    document.body.appendChild(fixture.nativeElement);
    const el: HTMLElement = fixture.nativeElement;
    const button = el.querySelector<HTMLButtonElement>('button.nav-button')!;
    const nav = el.querySelector<HTMLElement>('nav#gw-sections')!;
    expect(button.getAttribute('aria-controls')).toBe('gw-sections');
    expect(button.getAttribute('aria-expanded')).toBe('false');
    expect(nav.classList).not.toContain('open');

    button.click();
    fixture.detectChanges();
    expect(button.getAttribute('aria-expanded')).toBe('true');
    expect(button.getAttribute('aria-label')).toBe('Close the navigation');
    expect(nav.classList).toContain('open');

    nav.querySelector('a')!.focus();
    nav.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true }));
    fixture.detectChanges();
    expect(nav.classList).not.toContain('open');
    expect(document.activeElement).toBe(button);
    fixture.nativeElement.remove();
  });
});
