import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import type { ScreenScoreKind } from '@gapwise/contracts';
import { map } from 'rxjs';
import { apiErrorOf } from '../../session/api-errors';
import { RichText } from '../../shared/rich-text/rich-text';
import { ScreensApi } from '../screens-api';
import { badRowReportOf, type BadRowReport } from './bad-row-report';

type Source = 'file' | 'paste';

/**
 * Upload a screen from a file or a paste. A file with bad rows comes back with their line
 * numbers, and the user decides: fix the file (recorded when it is sent again) or run the good
 * rows (recorded on the screen).
 */
@Component({
  selector: 'gw-new-screen',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RichText,
  ],
  templateUrl: './new-screen.html',
  styleUrls: ['../screens.scss', './new-screen.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewScreen {
  protected readonly api = inject(ScreensApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly options = toSignal(this.api.options());
  protected readonly form = this.fb.group({
    name: this.fb.control('', [Validators.required, Validators.maxLength(200)]),
    score: this.fb.control<ScreenScoreKind>('cs-fast-cr-inverted'),
    floorEv: this.fb.control(0.1, [Validators.min(0), Validators.max(5)]),
    // 0.186 eV = 1500 cm⁻¹, the API's default; bounds 100–4000 cm⁻¹ as the API checks.
    assumedHbarOmegaEv: this.fb.control(0.186, [
      Validators.required,
      Validators.min(0.0124),
      Validators.max(0.496),
    ]),
    source: this.fb.control<Source>('file'),
    paste: this.fb.control(''),
  });
  protected readonly file = signal<File | null>(null);
  protected readonly sending = signal(false);
  protected readonly report = signal<BadRowReport | null>(null);
  /** Set when the user chose to fix the file after a report; sent with the next upload. */
  protected readonly fixing = signal(false);
  protected readonly problem = signal<string | null>(null);

  protected pickFile(event: Event): void {
    const input = event.target as HTMLInputElement;
    const f = input.files?.[0] ?? null;
    this.file.set(f);
    if (f && !this.form.controls.name.value.trim()) {
      this.form.controls.name.setValue(f.name.replace(/\.(csv|txt)$/i, ''));
    }
  }

  protected canSend(): boolean {
    const v = this.form.getRawValue();
    const hasSource = v.source === 'file' ? this.file() !== null : v.paste.trim() !== '';
    return this.form.valid && hasSource && !this.sending();
  }

  protected send(runGoodRows = false): void {
    const v = this.form.getRawValue();
    const source = v.source === 'file' ? this.file() : v.paste;
    if (!source || this.sending()) return;
    this.sending.set(true);
    this.problem.set(null);
    this.api
      .upload(this.wid(), source, {
        name: v.name.trim(),
        score: v.score,
        floorEv: v.score === 'fastest-forward-above-floor' ? v.floorEv : null,
        assumedHbarOmegaEv: v.assumedHbarOmegaEv,
        runGoodRows,
        badRowChoice: this.fixing() ? 'fixed' : undefined,
      })
      .subscribe({
        next: (screen) => void this.router.navigate(['/w', this.wid(), 'screens', screen.id]),
        error: (err: unknown) => {
          this.sending.set(false);
          const error = apiErrorOf(err);
          const report = badRowReportOf(error);
          this.report.set(report);
          if (!report) this.problem.set(error.message);
        },
      });
  }

  /** "Fix the file": drop the report; the next upload is recorded as fixed. */
  protected chooseFix(): void {
    this.fixing.set(true);
    this.report.set(null);
    this.file.set(null);
  }

  protected chooseRunGood(): void {
    this.send(true);
  }
}
