import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { calculate, findMethod, fromCanonical } from '@gapwise/calc';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatSignificant, parseStrictNumber } from '../../units/number-format';
import { unitLabel } from '../../units/units';
import type { DerivationResult } from '../derivation/derivation-dialog';

export interface NormalModesDialogData {
  /** The pair's temperature (K), to flag modes with ħω < 4 k_BT; null when not set. */
  readonly temperatureK: number | null;
}

/** Which second column the modes carry: Huang–Rhys factors S_j or displacements Δ_j (S = Δ²/2). */
export type ModeWeight = 'huangRhys' | 'displacement';

interface ModeRow {
  readonly hbarOmega: string;
  readonly weight: string;
}

export const MODE_UNITS = ['cm-1', 'meV', 'eV'] as const;

/**
 * λ_v, the λ-weighted effective ħω and the total Huang–Rhys factor from a list of normal modes
 * (`reorg.normalModes`), so the Marcus–Levich–Jortner inputs can come from a frequency
 * calculation. "Use these values" fills λᵢ and ħω, recorded as derived with the modes as typed.
 */
@Component({
  selector: 'gw-normal-modes-dialog',
  imports: [
    MatDialogModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatIconModule,
    RichText,
  ],
  templateUrl: './normal-modes-dialog.html',
  styleUrl: './normal-modes-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NormalModesDialog {
  protected readonly data = inject<NormalModesDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<NormalModesDialog, DerivationResult>>(MatDialogRef);

  protected readonly method = findMethod('reorg.normalModes');
  protected readonly units = MODE_UNITS;
  protected readonly unitLabel = unitLabel;
  protected readonly unit = signal<string>('cm-1');
  protected readonly weight = signal<ModeWeight>('huangRhys');
  protected readonly rows = signal<ModeRow[]>([
    { hbarOmega: '', weight: '' },
    { hbarOmega: '', weight: '' },
  ]);

  /** The request's modes as typed (empty rows left out; bad text sent for the core to name). */
  private readonly modes = computed(() =>
    this.rows()
      .filter((r) => r.hbarOmega.trim() !== '' || r.weight.trim() !== '')
      .map((r) => ({
        hbarOmega: {
          value: parseStrictNumber(r.hbarOmega) ?? r.hbarOmega.trim(),
          unit: this.unit(),
        },
        [this.weight()]: parseStrictNumber(r.weight) ?? r.weight.trim(),
      })),
  );

  private readonly inputs = computed(() => {
    const t = this.data.temperatureK;
    return { modes: this.modes(), ...(t && t > 0 ? { temperature: t } : {}) };
  });

  protected readonly answer = computed(() =>
    this.modes().length === 0
      ? null
      : calculate({ method: 'reorg.normalModes', inputs: this.inputs() }),
  );

  protected readonly summary = computed(() => {
    const a = this.answer();
    if (!a?.ok) return null;
    const o = a.outputs;
    const inUnit = (ev: number) => fromCanonical(ev, this.unit(), 'energy');
    return {
      lambdaVib: o.lambdaVib,
      hbarOmega: o.effectiveHbarOmega,
      text: {
        lambdaVib: `${formatSignificant(o.lambdaVib, 4)} eV`,
        hbarOmega: `${formatSignificant(o.effectiveHbarOmega, 4)} eV (${formatSignificant(inUnit(o.effectiveHbarOmega), 4)} ${unitLabel(this.unit())})`,
        huangRhysTotal: formatSignificant(o.huangRhysTotal, 4),
        huangRhysEffective: formatSignificant(o.huangRhysEffective, 4),
      },
    };
  });

  /** The core's refusals, with "modes[1].hbarOmega" said as the user sees it: "Mode 2, ħω". */
  protected readonly errors = computed(() => {
    const a = this.answer();
    if (!a || a.ok) return [];
    return a.errors.map((e) => this.readable(`${e.message}`, e.field));
  });

  protected readonly warnings = computed(() => {
    const a = this.answer();
    return a?.ok ? a.warnings.map((w) => this.readable(w.message)) : [];
  });

  private readable(message: string, field?: string): string {
    const say = (text: string) =>
      text.replace(/modes\[(\d+)\](?:\.(\w+))?/g, (_, i: string, f?: string) => {
        const name =
          f === 'hbarOmega' ? 'ħω' : f === 'huangRhys' ? 'S' : f === 'displacement' ? 'Δ' : '';
        return `mode ${Number(i) + 1}${name ? `, ${name}` : ''}`;
      });
    const where = field ? say(field) : '';
    const body = say(message).replace(/^Field /, '');
    return where && !body.toLowerCase().includes(where.toLowerCase())
      ? `${where.charAt(0).toUpperCase()}${where.slice(1)}: ${body}`
      : body.charAt(0).toUpperCase() + body.slice(1);
  }

  protected setCell(index: number, key: keyof ModeRow, text: string): void {
    this.rows.update((rows) => rows.map((r, i) => (i === index ? { ...r, [key]: text } : r)));
  }

  protected addMode(): void {
    this.rows.update((rows) => [...rows, { hbarOmega: '', weight: '' }]);
  }

  protected removeMode(index: number): void {
    this.rows.update((rows) => rows.filter((_, i) => i !== index));
  }

  protected use(): void {
    const s = this.summary();
    if (!s) return;
    this.ref.close({
      methodId: 'reorg.normalModes',
      methodInputs: this.inputs(),
      values: [
        { kind: 'lambdaInner', value: s.lambdaVib },
        { kind: 'hbarOmega', value: s.hbarOmega },
      ],
    });
  }
}
