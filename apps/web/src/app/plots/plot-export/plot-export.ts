import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/**
 * Serialises a drawn plot as a standalone SVG document (Inter named, white background): curves,
 * axes, labels and arrows as on the page, without the hover read-out.
 */
export function svgText(svg: SVGSVGElement): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.querySelectorAll('.hover').forEach((n) => n.remove());
  clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  const [, , w, h] = (clone.getAttribute('viewBox') ?? '0 0 600 360').split(/\s+/).map(Number);
  clone.setAttribute('width', String(w));
  clone.setAttribute('height', String(h));
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(clone)}`;
}

function download(blob: Blob, filename: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** Renders the SVG onto a canvas at `scale` × its size (the page's Inter is already loaded). */
export async function pngBlob(svg: SVGSVGElement, scale = 2): Promise<Blob> {
  const text = svgText(svg);
  const [, , w, h] = (svg.getAttribute('viewBox') ?? '0 0 600 360').split(/\s+/).map(Number);
  const img = new Image();
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml;charset=utf-8' }));
  try {
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('The plot could not be rendered as an image.'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = w * scale;
    canvas.height = h * scale;
    const ctx = canvas.getContext('2d')!;
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
    return await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob(
        (b) => (b ? resolve(b) : reject(new Error('PNG encoding failed.'))),
        'image/png',
      ),
    );
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** "SVG" and "PNG" download buttons for one plot. */
@Component({
  selector: 'gw-plot-export',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <button
      mat-button
      type="button"
      class="export-svg"
      (click)="exportSvg()"
      [attr.aria-label]="'Export ' + what() + ' as SVG'"
    >
      <mat-icon aria-hidden="true" svgIcon="download"></mat-icon> SVG
    </button>
    <button
      mat-button
      type="button"
      class="export-png"
      (click)="exportPng()"
      [attr.aria-label]="'Export ' + what() + ' as PNG'"
    >
      <mat-icon aria-hidden="true" svgIcon="image"></mat-icon> PNG
    </button>
  `,
  styles: ':host { display: inline-flex; gap: 4px; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlotExport {
  readonly svg = input.required<SVGSVGElement>();
  readonly filename = input.required<string>();
  readonly what = input('the plot');

  protected exportSvg(): void {
    download(
      new Blob([svgText(this.svg())], { type: 'image/svg+xml;charset=utf-8' }),
      `${this.filename()}.svg`,
    );
  }

  protected async exportPng(): Promise<void> {
    download(await pngBlob(this.svg()), `${this.filename()}.png`);
  }
}
