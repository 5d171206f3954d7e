import type { Type } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { computeNetwork, type NetworkOutputs } from '../cascade-compute';
import { LandscapeTree } from './landscape-tree';
import { PopulationPlot } from './population-plot';
import { StateEnergyDiagram, type DiagramState } from './state-energy-diagram';

const network = {
  states: [
    { id: 'S0', energy: 0, kind: 'ground' },
    { id: 'S1', energy: 2.1, kind: 'excited' },
    { id: 'CS1', energy: 1.8, kind: 'chargeSeparated' },
    { id: 'CS2', energy: 1.45, kind: 'chargeSeparated' },
  ],
  links: [
    { from: 'S1', to: 'S0', k: 3e8 },
    { from: 'S1', to: 'CS1', lambda: 0.55, coupling: { value: 30, unit: 'cm-1' } },
    { from: 'CS1', to: 'CS2', lambda: 0.6, coupling: { value: 25, unit: 'cm-1' } },
    { from: 'CS2', to: 'S0', lambda: 0.8, coupling: { value: 0.4, unit: 'cm-1' } },
  ],
};
const states: DiagramState[] = [
  { id: 'S0', label: 'Ground', kind: 'ground', energyEv: 0 },
  { id: 'S1', label: 'Singlet', kind: 'singlet', energyEv: 2.1 },
  { id: 'CS1', label: 'Bridge CS', kind: 'csIntermediate', energyEv: 1.8 },
  { id: 'CS2', label: 'Final CS', kind: 'csFinal', energyEv: 1.45 },
];

function outputs(): NetworkOutputs {
  const a = computeNetwork(network);
  if (!a.ok) throw new Error(a.errors[0].message);
  return a.outputs;
}

function render<T>(type: Type<T>) {
  const fixture = TestBed.createComponent(type);
  fixture.componentRef.setInput('states', states);
  fixture.componentRef.setInput('outputs', outputs());
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

describe('cascade pictures', () => {
  it('draws one level per state, ordered by energy, and an arrow per step with its rate', () => {
    const el = render(StateEnergyDiagram);
    const levels = [...el.querySelectorAll('g.level')];
    expect(levels.map((g) => g.getAttribute('data-state'))).toEqual(['S0', 'S1', 'CS1', 'CS2']);
    const y = (id: string) =>
      Number(el.querySelector(`g.level[data-state="${id}"] line`)!.getAttribute('y1'));
    // SVG y grows downwards: the singlet is highest, the ground state lowest.
    expect(y('S1')).toBeLessThan(y('CS1'));
    expect(y('CS1')).toBeLessThan(y('CS2'));
    expect(y('CS2')).toBeLessThan(y('S0'));
    const labels = [...el.querySelectorAll('g.step text')].map((t) => t.textContent);
    expect(labels.length).toBeGreaterThanOrEqual(4);
    expect(labels.every((t) => t?.includes('s⁻¹'))).toBe(true);
    expect(el.querySelector('button.export-svg')).not.toBeNull();
    expect(el.querySelector('button.export-png')).not.toBeNull();
  });

  it('draws the landscape tree with every minimum and lists the decay apart', () => {
    const el = render(LandscapeTree);
    expect(el.querySelectorAll('g.minimum').length).toBe(4);
    expect(el.querySelectorAll('line.edge').length).toBeGreaterThan(3);
    expect(el.querySelector('g.decays')?.textContent).toContain('Singlet → Ground');
  });

  it('draws one population curve per state over the decades of the time grid', () => {
    const el = render(PopulationPlot);
    const paths = [...el.querySelectorAll('svg.cascade-svg path')].filter((p) =>
      p.getAttribute('d')?.startsWith('M'),
    );
    expect(paths.length).toBe(4);
    expect(el.textContent).toContain('10⁻¹⁵');
  });
});
