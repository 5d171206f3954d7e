import { Pipe, type PipeTransform } from '@angular/core';
import { formatReportDate } from '@gapwise/contracts';

/**
 * The one date format of the app, the reports' and PDFs' (`formatReportDate` in contracts):
 * "2026-12-02 14:05 UTC", or the day alone ("2026-12-02") with `'day'`. Every page shows time in
 * UTC so that a page, its PDF and a colleague in another time zone read the same moment.
 */
export function formatDay(iso: string): string {
  const text = formatReportDate(iso);
  return text === iso ? iso : text.slice(0, 10);
}

@Pipe({ name: 'gwDate' })
export class GwDatePipe implements PipeTransform {
  transform(iso: string | null | undefined, form: 'time' | 'day' = 'time'): string {
    if (!iso) return '—';
    return form === 'day' ? formatDay(iso) : formatReportDate(iso);
  }
}
