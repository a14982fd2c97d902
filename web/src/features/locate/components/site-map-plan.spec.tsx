import { FluentProvider, webLightTheme } from '@fluentui/react-components';
import { render, screen } from '@testing-library/react';
import { markingMeaning, REFERENCE_INK, RUN_ORANGE } from '@drawings/marking-palette';
import { describe, expect, it } from 'vitest';

import { buildSiteMap } from '../testing-fixtures';

import { SiteMapPlan } from './site-map-plan';

/*
 * Stroke colours by role on the locate / portal map. Source of the colour meanings: APWA Uniform Color
 * Code, as published in the CGA Best Practices (Appendix B): orange is communication and signal cable;
 * red power, yellow gas, green sewer, blue potable water, purple reclaimed water are other utilities'.
 */
const OTHER_UTILITIES = ['power', 'gas', 'sewer', 'water', 'reclaimed'];

function mapWithEveryRunKind() {
  const map = buildSiteMap();
  const base = map.runs[0]!;
  const kinds = [
    { method: 'conduit' as const },
    { method: 'under_hardscape_sleeve' as const },
    { method: 'indoor' as const },
    { method: 'direct_burial' as const, isSpare: true },
    { method: 'direct_burial' as const, isAbandoned: true },
    { method: 'direct_burial' as const, isRouteDrawn: false },
  ];
  map.runs = [base, ...kinds.map((k, i) => ({ ...base, id: `run-${i + 2}`, label: `Run ${i + 2}`, route: base.route!.map((p) => ({ x: p.x, y: p.y + i + 1 })), ...k }))];
  return map;
}

describe('SiteMapPlan marking colours', () => {
  it('should draw every run orange, reference points black, and no other utility colour anywhere', () => {
    const { container } = render(
      <FluentProvider theme={webLightTheme}>
        <SiteMapPlan map={mapWithEveryRunKind()} units="imperial" />
      </FluentProvider>,
    );
    const runStrokes = Array.from(container.querySelectorAll('[data-run-id] [data-role="run-stroke"]'));
    expect(runStrokes.length).toBe(7);
    for (const el of runStrokes) expect(el.getAttribute('stroke')).toBe(RUN_ORANGE);
    // Kinds are told apart by weight and dash, never by colour.
    const looks = new Set(runStrokes.map((el) => `${el.getAttribute('stroke-width')}|${el.getAttribute('stroke-dasharray') ?? ''}`));
    expect(looks.size).toBe(7);
    const refs = Array.from(container.querySelectorAll('[aria-label^="Reference point"] [stroke]'));
    expect(refs.length).toBeGreaterThan(0);
    for (const el of refs) expect(el.getAttribute('stroke')).toBe(REFERENCE_INK);
    for (const el of Array.from(container.querySelectorAll('svg [stroke], svg [fill]'))) {
      for (const attr of ['stroke', 'fill']) {
        const value = el.getAttribute(attr);
        if (value === null || value.startsWith('var(')) continue;
        expect(OTHER_UTILITIES, `${el.tagName} ${attr}=${value}`).not.toContain(markingMeaning(value));
      }
    }
    // Landmarks in muted grey, drawn first (under the runs), named.
    const features = container.querySelector('[data-layer="features"]')!;
    expect(features.querySelectorAll('[data-feature-id]').length).toBe(2);
    expect(features.compareDocumentPosition(container.querySelector('[data-run-id]')!) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
    for (const el of Array.from(features.querySelectorAll('polygon, polyline'))) expect(markingMeaning(el.getAttribute('stroke')!)).toBe('neutral');
    expect(screen.getByText('East fence')).toBeInTheDocument();
    // The legend names the colour and the white of a dig area, in the words of the printed legend.
    expect(screen.getByText(/Orange: buried speaker and signal cable/)).toBeInTheDocument();
    expect(screen.getByText('Cable in conduit (heavy)')).toBeInTheDocument();
    expect(screen.getByText('Abandoned run, still buried (crosses)')).toBeInTheDocument();
  });
});
