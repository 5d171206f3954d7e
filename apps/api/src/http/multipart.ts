import multer from 'multer';
import { AppError, validationFailed } from './app-error';

/**
 * Messages busboy (multer's parser) gives a body that is not well-formed multipart: a missing
 * boundary, an unterminated form, a broken part header. Errors of our own storage engines
 * (AppError, database errors) do not match and keep their own answer.
 */
const MALFORMED =
  /^(Multipart: Boundary not found|Unexpected end of (form|file)|Malformed part header|Malformed urlencoded form|Unsupported content type)/i;

/**
 * Turns an error of a multer upload into the API's answer: limits become 413 naming the limit,
 * other multer refusals and malformed bodies a 400 naming the field, anything else passes on.
 */
export function multipartError(error: unknown, field: string, fileSizeLimit: string): unknown {
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE')
      return new AppError(413, 'payload-too-large', `The file may be at most ${fileSizeLimit}.`);
    return validationFailed([
      {
        field: error.field ?? field,
        message: `Upload refused (${error.code}): send one file in the field '${field}'.`,
      },
    ]);
  }
  if (error instanceof Error && !(error instanceof AppError) && MALFORMED.test(error.message)) {
    return new AppError(
      400,
      'malformed-multipart',
      `The upload is not well-formed multipart/form-data (${error.message}); send the file in the field '${field}'.`,
      { fields: [{ field, message: `is not well-formed multipart/form-data (${error.message})` }] },
    );
  }
  return error;
}

/** A byte count as people read limits: "512 MiB", "1.5 GiB", "100 kB"-style binary units. */
export function formatBytes(bytes: number): string {
  const units = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return `${Number(value.toPrecision(4))} ${units[unit]}`;
}
