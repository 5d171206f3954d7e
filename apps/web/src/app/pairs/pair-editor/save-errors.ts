import type { AbstractControl } from '@angular/forms';
import type { PairInput } from '@gapwise/contracts';
import type { ApiError } from '../../session/api-errors';
import type { PairForm } from '../pair-form/pair-form';

/**
 * Puts the API's `error.fields` on the editor's controls. Field names follow the request body
 * (`name`, `temperature`, `parameters[2].value`, `parameters.2.provenance.citation`, or a kind
 * name); returns the messages that fit no control.
 */
export function applySaveErrors(form: PairForm, body: PairInput, error: ApiError): string[] {
  const rest: string[] = [];
  for (const f of error.fields ?? []) {
    const control = controlFor(form, body, f.field);
    if (control) {
      control.setErrors({ ...(control.errors ?? {}), api: f.message });
      control.markAsTouched();
      control.markAsDirty();
    } else {
      rest.push(`${f.field}: ${f.message}`);
    }
  }
  return rest;
}

function controlFor(form: PairForm, body: PairInput, field: string): AbstractControl | null {
  const top = form.controls as Record<string, AbstractControl>;
  if (field === 'temperature') return form.controls.temperature.controls.text;
  if (top[field] && field !== 'parameters') return top[field];
  const m = /^parameters(?:\[(\d+)\]|\.(\d+)|\.([A-Za-z0-9]+))(?:\.(.+))?$/.exec(field);
  if (!m) return null;
  const kind = m[3] ?? body.parameters[Number(m[1] ?? m[2])]?.kind;
  const group = kind
    ? (
        form.controls.parameters.controls as Record<
          string,
          PairForm['controls']['parameters']['controls']['deltaG0']
        >
      )[kind]
    : undefined;
  if (!group) return null;
  const rest = m[4] ?? 'value';
  if (rest.startsWith('provenance.citation')) return group.controls.provenance.controls.citation;
  if (rest.startsWith('provenance')) return group.controls.provenance.controls.note;
  if (rest.startsWith('uncertainty')) return group.controls.uncertaintyText;
  return group.controls.text;
}
