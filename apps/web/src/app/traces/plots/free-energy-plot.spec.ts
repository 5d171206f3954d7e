import { TestBed } from '@angular/core/testing';
import type { GapOutputs } from '../gap-outputs';
import { FreeEnergyPlot } from './free-energy-plot';

/** Parabolic curves G_R = (x − 0.11)²/0.6 and G_P = G_R + x on a grid, with a merged curve. */
function outputs(withMerged: boolean): GapOutputs {
  const x = Array.from({ length: 21 }, (_, i) => -0.4 + 0.04 * i);
  const gR = x.map((v) => (v - 0.11) ** 2 / 0.6);
  return {
    freeEnergyCurves: {
      x,
      reactant: gR.map((g, i) => (i < 5 ? null : g)),
      product: gR.map((g, i) => (i > 15 ? null : g + x[i])),
    },
    mergedCurve: withMerged
      ? {
          x,
          reactant: gR,
          product: gR.map((g, i) => g + x[i]),
          overlapBins: 11,
          shiftEv: -0.0512,
          shiftStandardError: 0.001,
        }
      : undefined,
    activationFreeEnergy: 0.0167,
  } as unknown as GapOutputs;
}

async function render(o: GapOutputs): Promise<HTMLElement> {
  const fixture = TestBed.createComponent(FreeEnergyPlot);
  fixture.componentRef.setInput('outputs', o);
  fixture.detectChanges();
  await fixture.whenStable();
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

function pointsOf(d: string): Array<[number, number]> {
  return [...d.matchAll(/[ML]([-\d.e]+),([-\d.e]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

describe('FreeEnergyPlot', () => {
  it('draws the merged G_R as its own solid line through every merged bin, with a legend entry', async () => {
    const el = await render(outputs(true));
    const path = el.querySelector('path.merged')!;
    expect(path).not.toBeNull();
    expect(path.getAttribute('stroke-dasharray')).toBeNull();
    const pts = pointsOf(path.getAttribute('d')!);
    expect(pts.length).toBe(21);
    // Same pixel x as the reactant dots where both exist; the minimum (x = 0.12) is lowest on screen.
    const dots = [...el.querySelectorAll('g.points.reactant circle')];
    expect(Number(dots[0].getAttribute('cx'))).toBeCloseTo(pts[5][0], 2);
    expect(Number(dots[0].getAttribute('cy'))).toBeCloseTo(pts[5][1], 2);
    const lowest = pts.reduce((best, p, i) => (p[1] > pts[best][1] ? i : best), 0);
    expect(lowest).toBe(13);
    const legend = el.querySelector('.legend .merged')!.textContent!;
    expect(legend).toContain('merged from both states');
    expect(legend).toContain('-0.051 eV');
    expect(legend).toContain('11 shared bins');
  });

  it('draws no merged line nor legend entry when the analysis has none', async () => {
    const el = await render(outputs(false));
    expect(el.querySelector('path.merged')).toBeNull();
    expect(el.querySelector('.legend .merged')).toBeNull();
    expect(el.querySelectorAll('g.points.reactant circle').length).toBe(16);
  });
});
