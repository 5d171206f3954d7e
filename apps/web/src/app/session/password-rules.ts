import type { AbstractControl, ValidationErrors } from '@angular/forms';
import { PASSWORD_MAX_BYTES, passwordBytes } from '@gapwise/contracts';

/**
 * bcrypt reads only the first 72 bytes (UTF-8) of a password; the API refuses longer ones, and
 * the form says so before sending (accented letters and other scripts take 2–4 bytes each).
 */
export function passwordFitsBcrypt(control: AbstractControl<string>): ValidationErrors | null {
  const bytes = passwordBytes(control.value ?? '');
  return bytes > PASSWORD_MAX_BYTES
    ? {
        bcryptBytes: `Too long: ${bytes} bytes, at most ${PASSWORD_MAX_BYTES} (accented letters and other scripts count 2–4 bytes each).`,
      }
    : null;
}
