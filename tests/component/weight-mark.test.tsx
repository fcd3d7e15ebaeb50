// The one weight mark every screen uses. Meaning must never rest on colour alone (WCAG 2.2 SC 1.4.1 Use of
// Color), so each weight has its own shape and its own word, and the word is the accessible name. Shapes
// are checked with plain geometry: a diamond is four points on the axes, equally far from the centre.
import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { FINDING_WEIGHTS, type FindingWeight } from '../../shared/domain/states';
import { WEIGHT_WORD, WeightMark, WeightShape } from '../../src/components/weight-mark';

const WORDS: Record<FindingWeight, string> = { federal: 'Federal', shop: 'Shop', note: 'Note' };

/** The shape's geometry with every colour taken out: what is left when colour cannot be seen. */
function outline(svg: SVGSVGElement): string {
  return [...svg.children]
    .map((el) => {
      const attrs = [...el.attributes]
        .filter((a) => !['fill', 'stroke'].includes(a.name) || a.value === 'none')
        .map((a) => `${a.name}=${a.value}`)
        .sort();
      return `${el.tagName}(${attrs.join(',')})`;
    })
    .join(';');
}

function shapeOf(weight: FindingWeight, word?: 'shown' | 'hidden') {
  const { container } = render(
    <button type="button">
      <WeightMark weight={weight} word={word} />
    </button>,
  );
  const mark = container.querySelector<HTMLElement>(`[data-weight="${weight}"]`)!;
  const svg = mark.querySelector('svg')!;
  return { mark, svg };
}

describe('WeightMark', () => {
  it('has a word for each weight', () => {
    expect(Object.keys(WEIGHT_WORD).sort()).toEqual([...FINDING_WEIGHTS].sort());
  });

  it('federal: a filled diamond, the word Federal, and that word as its accessible name', () => {
    const { mark, svg } = shapeOf('federal');
    const path = svg.querySelector('path')!;
    expect(svg.querySelector('circle')).toBeNull();
    expect(path.getAttribute('fill')).not.toBe('none');
    // Plain geometry: four vertices, one on each axis through the centre (10, 10), all equally far from it.
    const pts = [...path.getAttribute('d')!.matchAll(/(\d+(?:\.\d+)?)\s+(\d+(?:\.\d+)?)/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(pts).toHaveLength(4);
    const dist = pts.map(([x, y]) => Math.abs(x - 10) + Math.abs(y - 10));
    for (const [x, y] of pts) expect(x === 10 || y === 10).toBe(true);
    for (const d of dist) expect(d).toBeCloseTo(dist[0], 6);
    expect(mark).toHaveTextContent(/^Federal$/);
    expect(mark.className).toContain('text-federal');
    expect(screen.getByRole('button', { name: 'Federal' })).toBeInTheDocument();
  });

  it('shop: an unfilled ring, the word Shop, and that word as its accessible name', () => {
    const { mark, svg } = shapeOf('shop');
    const ring = svg.querySelector('circle')!;
    expect(svg.querySelector('path')).toBeNull();
    expect(ring.getAttribute('fill')).toBe('none');
    expect(Number(ring.getAttribute('stroke-width'))).toBeGreaterThan(0);
    expect(mark).toHaveTextContent(/^Shop$/);
    expect(mark.className).toContain('text-shop');
    expect(screen.getByRole('button', { name: 'Shop' })).toBeInTheDocument();
  });

  it('note: a filled dot smaller than the ring, the word Note, and that word as its accessible name', () => {
    const { mark, svg } = shapeOf('note');
    const dot = svg.querySelector('circle')!;
    expect(svg.querySelector('path')).toBeNull();
    expect(dot.getAttribute('fill')).not.toBe('none');
    const ring = render(<WeightShape weight="shop" />).container.querySelector('circle')!;
    expect(Number(dot.getAttribute('r'))).toBeLessThan(Number(ring.getAttribute('r')));
    expect(mark).toHaveTextContent(/^Note$/);
    expect(mark.className).toContain('text-note');
    expect(screen.getByRole('button', { name: 'Note' })).toBeInTheDocument();
  });

  it('tells the three weights apart with colour taken away (WCAG 2.2 SC 1.4.1)', () => {
    const outlines = FINDING_WEIGHTS.map((w) => outline(render(<WeightShape weight={w} />).container.querySelector('svg')!));
    expect(new Set(outlines).size).toBe(FINDING_WEIGHTS.length);
  });

  it('keeps the shape out of the accessible name, so a screen reader hears the word once', () => {
    for (const w of FINDING_WEIGHTS) {
      const { svg } = shapeOf(w);
      expect(svg).toHaveAttribute('aria-hidden', 'true');
    }
  });

  it('draws the shape at the size asked for', () => {
    const { container } = render(<WeightMark weight="shop" size={22} />);
    const svg = container.querySelector('svg')!;
    expect(svg).toHaveAttribute('width', '22');
    expect(svg).toHaveAttribute('height', '22');
  });

  it('with word="hidden" shows only the shape but keeps the word as the accessible name', () => {
    for (const w of FINDING_WEIGHTS) {
      const { mark } = shapeOf(w, 'hidden');
      const word = within(mark).getByText(WORDS[w]);
      expect(word).toHaveClass('sr-only');
      expect(screen.getByRole('button', { name: WORDS[w] })).toBeInTheDocument();
    }
  });
});
