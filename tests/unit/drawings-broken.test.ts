import { mkdtempSync, rmSync, writeFileSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { DrawingError, parseDrawing } from '../../shared/drawings/parse-drawing';
import type { DrawingFault } from '../../shared/drawings/parse-drawing';
import { DIAGRAMS_DIR, loadDrawingsFromDir } from '../../server/drawings/load';

const FILE = 'broken_unit.svg';

interface Parts {
  root?: string;
  views?: string;
  plan?: string;
  side?: string;
  end?: string;
}

/**
 * A small good drawing: 300 × 100 in, two axles, plan + −y side + long hood end. Each broken
 * case changes one thing in it, so the fault is the only difference.
 */
function drawing(p: Parts = {}): string {
  return `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 400 420" data-unit-type="broken_unit" data-name="Test unit, two axles"
     ${p.root ?? 'data-length="300" data-width="100" data-axles="2"'}
     data-views="${p.views ?? 'plan side_minus_y end_long_hood'}">
  <title>test</title>
  <style>.hair{stroke-width:.3}</style>
  <g data-view="plan" transform="translate(10,60)" data-axes="x,-y" data-bounds="0 -50 300 50">
    <rect class="heavy" x="0" y="-50" width="300" height="100"/>
    <rect id="pl-axle_1" data-part="axle" data-instance="axle_1" class="rubber" x="96" y="-27" width="8" height="54"/>
    <rect id="pl-axle_2" data-part="axle" data-instance="axle_2" x="196" y="-27" width="8" height="54"/>
    <rect id="pl-step" data-part="step" data-instance="step_lh_py" x="270" y="-50" width="16" height="8"/>
    ${p.plan ?? ''}
  </g>
  <g data-view="side_minus_y" transform="translate(10,300)" data-axes="x,-z" data-bounds="0 0 300 150">
    <path class="hair" d="M0 0 H300"/>
    <circle id="sm-axle_1" data-part="axle" data-instance="axle_1" cx="100" cy="-20" r="4"/>
    <circle id="sm-axle_2" data-part="axle" data-instance="axle_2" cx="200" cy="-20" r="4"/>
    ${p.side ?? ''}
  </g>
  <g data-view="end_long_hood" transform="translate(350,300)" data-axes="y,-z" data-bounds="-50 0 50 150">
    <text x="0" y="12" font-size="8" text-anchor="middle">LONG HOOD END</text>
    <rect id="el-step" data-part="step" data-instance="step_lh_py" x="42" y="-60" width="8" height="48"/>
    ${p.end ?? ''}
  </g>
</svg>`;
}

/** Parses and returns the DrawingError (fails the test if the drawing parses). */
function faultOf(svg: string, file = FILE): DrawingError {
  try {
    parseDrawing(svg, file);
  } catch (e) {
    if (e instanceof DrawingError) return e;
    throw e;
  }
  throw new Error('expected the drawing to be rejected');
}

/** The message must name the file, the element and the fault. */
function expectFault(svg: string, fault: DrawingFault, element: string, what: RegExp): void {
  const e = faultOf(svg);
  expect(e.fault).toBe(fault);
  expect(e.message).toContain(FILE);
  expect(e.message).toContain(element);
  expect(e.message).toMatch(what);
}

describe('the good test drawing', () => {
  it('parses, with sheet signs undone into body inches', () => {
    const d = parseDrawing(drawing(), FILE);
    expect(d.key).toBe('broken_unit');
    expect(d.lengthIn).toBe(300);
    expect(d.axleCount).toBe(2);
    const axle1 = d.instances.find((i) => i.instanceId === 'axle_1')!;
    // Plan x from u (x,-y), z from the side circle written at cy = −20 under "x,-z".
    expect(axle1.centre).toEqual({ x: 100, y: 0, z: 20 });
    const step = d.instances.find((i) => i.instanceId === 'step_lh_py')!;
    // Written at sheet y −50..−42 in a plan with v = −y: body y 42..50; the end view (y,−z) agrees.
    expect(step.centre).toEqual({ x: 278, y: 46, z: 36 });
    expect(step.views).toEqual(['plan', 'end_long_hood']);
    const plan = d.views.find((v) => v.key === 'plan')!;
    expect(plan.decor).toHaveLength(1);
    expect(plan.parts[0].shape.style).toEqual({ fill: 'rubber', line: 'normal' });
    const end = d.views.find((v) => v.key === 'end_long_hood')!;
    expect(end.decor[0]).toMatchObject({ kind: 'text', text: 'LONG HOOD END', x: 0, y: -12, anchor: 'middle' });
  });

  it('defaults the axis no view shows: z = 0 in plan only, y = ∓width/2 in one side only, x = length at the long hood end only', () => {
    const d = parseDrawing(
      drawing({
        plan: '<rect id="pl-fan" data-part="long_hood" data-instance="long_hood" x="150" y="-10" width="20" height="20"/>',
        side: '<rect id="sm-door" data-part="cab_door" data-instance="cab_door_my" x="40" y="-120" width="20" height="60"/>',
        end: '<circle id="el-lamp" data-part="headlight" data-instance="headlight_lh" cx="0" cy="-120" r="5"/>',
      }),
      FILE,
    );
    const c = (id: string) => d.instances.find((i) => i.instanceId === id)!.centre;
    expect(c('long_hood')).toEqual({ x: 160, y: 0, z: 0 });
    expect(c('cab_door_my')).toEqual({ x: 50, y: -50, z: 90 });
    expect(c('headlight_lh')).toEqual({ x: 300, y: 0, z: 120 });
  });
});

describe('broken drawings are rejected with the file, the element and the fault', () => {
  it('not XML', () => {
    expectFault(drawing().slice(0, 400), 'not_xml', 'document', /not well-formed XML/);
    expectFault('just some text', 'not_xml', 'document', /not well-formed XML/);
    expectFault('<!DOCTYPE svg [<!ENTITY a "x">]><svg/>', 'not_xml', 'document', /DOCTYPE/);
  });

  it('wrong root element', () => {
    expectFault('<html><body/></html>', 'wrong_root', 'html#1', /root element must be <svg>, found <html>/);
  });

  it('missing dimensions: length, width, axles', () => {
    for (const [dim, root] of [
      ['data-length', 'data-width="100" data-axles="2"'],
      ['data-width', 'data-length="300" data-axles="2"'],
      ['data-axles', 'data-length="300" data-width="100"'],
    ]) {
      expectFault(drawing({ root }), 'missing_dimension', 'svg#1', new RegExp(`missing ${dim}`));
    }
  });

  it('bad dimension values', () => {
    expectFault(drawing({ root: 'data-length="300ft" data-width="100" data-axles="2"' }), 'bad_attribute', 'svg#1', /data-length="300ft" is not a plain number/);
    expectFault(drawing({ root: 'data-length="300" data-width="-4" data-axles="2"' }), 'bad_attribute', 'svg#1', /data-width must be positive/);
    expectFault(drawing({ root: 'data-length="300" data-width="100" data-axles="2.5"' }), 'bad_attribute', 'svg#1', /data-axles must be a positive whole number/);
  });

  it('missing view: declared but not drawn, or no plan', () => {
    expectFault(drawing({ views: 'plan side_minus_y side_plus_y end_long_hood' }), 'missing_view', 'svg#1', /view side_plus_y is declared in data-views but not drawn/);
    expectFault(drawing({ views: 'side_minus_y end_long_hood' }), 'missing_view', 'svg#1', /plan view is required/);
  });

  it('a view drawn but not declared, or unknown', () => {
    expectFault(drawing({ views: 'plan side_minus_y' }), 'bad_attribute', 'g#3', /view end_long_hood is drawn but not declared/);
    expectFault(drawing({ views: 'plan side_minus_y end_long_hood top' }), 'bad_attribute', 'svg#1', /unknown view "top"/);
  });

  it('unknown part kind', () => {
    expectFault(
      drawing({ plan: '<rect id="pl-warp" data-part="warp_drive" data-instance="warp_1" x="10" y="0" width="5" height="5"/>' }),
      'unknown_kind',
      '"pl-warp"',
      /unknown part kind "warp_drive"/,
    );
    // Prototype keys are not kinds either.
    expectFault(
      drawing({ plan: '<rect id="pl-proto" data-part="constructor" data-instance="c_1" x="10" y="0" width="5" height="5"/>' }),
      'unknown_kind',
      '"pl-proto"',
      /unknown part kind "constructor"/,
    );
  });

  it('duplicate id', () => {
    expectFault(
      drawing({ side: '<rect id="pl-axle_1" x="10" y="-10" width="5" height="5"/>' }),
      'duplicate_id',
      '"pl-axle_1"',
      /duplicate id "pl-axle_1"/,
    );
  });

  it('part outside its view bounds', () => {
    expectFault(
      drawing({ plan: '<rect id="pl-over" data-part="coupler" data-instance="coupler_lh" x="290" y="-5" width="30" height="10"/>' }),
      'outside_bounds',
      '"pl-over"',
      /part lies outside view plan: spans u 290\.\.320/,
    );
    // Below the rail in a side elevation (z < 0).
    expectFault(
      drawing({ side: '<circle id="sm-low" data-part="wheel" data-instance="wheel_1_my" cx="100" cy="-15" r="20"/>' }),
      'outside_bounds',
      '"sm-low"',
      /outside view side_minus_y/,
    );
  });

  it('unsupported shapes', () => {
    expectFault(drawing({ plan: '<image href="x.png" width="5" height="5"/>' }), 'unsupported_shape', 'image#1', /<image> is not supported/);
    expectFault(
      drawing({ plan: '<path id="pl-curve" data-part="handrail" data-instance="handrail_1_py" d="M10 40 C20 40 30 40 40 40"/>' }),
      'unsupported_shape',
      '"pl-curve"',
      /path command "C" is not allowed/,
    );
    expectFault(
      drawing({ plan: '<path id="pl-two" data-part="handrail" data-instance="handrail_1_py" d="M10 -40 H40 M50 -40 H80"/>' }),
      'unsupported_shape',
      '"pl-two"',
      /one subpath, found 2/,
    );
    expectFault(drawing({ plan: '<g id="pl-grp" data-part="truck" data-instance="truck_1"><rect width="1" height="1"/></g>' }), 'unsupported_shape', '"pl-grp"', /data-part on <g>/);
    expectFault(drawing({ end: '<text x="0" y="0">A <tspan>B</tspan></text>' }), 'unsupported_shape', 'text#2', /plain text only/);
  });

  it('bad attribute values', () => {
    expectFault(drawing({ plan: '<rect id="pl-w" data-part="axle" data-instance="axle_3" x="10" y="0" width="abc" height="5"/>' }), 'bad_attribute', '"pl-w"', /width="abc" is not a plain number/);
    // Elements without an id are named by tag and document-order index.
    expectFault(drawing({ plan: '<circle cx="10" cy="0" r="-2"/>' }), 'bad_attribute', 'circle#1', /r must be zero or more/);
    expectFault(drawing({ plan: '<polygon points="0,0 10,0 10"/>' }), 'bad_attribute', 'polygon#1', /two or more x,y pairs/);
    expectFault(
      drawing({ plan: '<rect id="pl-rot" data-part="axle" data-instance="axle_3" transform="rotate(10)" x="10" y="0" width="5" height="5"/>' }),
      'bad_attribute',
      '"pl-rot"',
      /transform="rotate\(10\)" is not allowed here/,
    );
    expectFault(drawing({ plan: '<rect id="pl-noinst" data-part="axle" x="10" y="0" width="5" height="5"/>' }), 'bad_attribute', '"pl-noinst"', /needs data-instance/);
    expectFault(drawing({ plan: '<rect data-part="axle" data-instance="axle_3" x="10" y="0" width="5" height="5"/>' }), 'bad_attribute', 'rect#5', /a part needs an id/);
    expectFault(drawing({ plan: '<rect class="shiny" x="10" y="0" width="5" height="5"/>' }), 'bad_attribute', 'rect#5', /unknown class "shiny"/);
    const badAxes = drawing().replace('data-axes="x,-z"', 'data-axes="x,-y"');
    expectFault(badAxes, 'bad_attribute', 'g#2', /must use the axes x and z for view side_minus_y/);
    const rotatedView = drawing().replace('transform="translate(10,300)"', 'transform="rotate(90)"');
    expectFault(rotatedView, 'bad_attribute', 'g#2', /a view may only be moved with translate/);
  });

  it('a shape outside any view', () => {
    const svg = drawing().replace('<title>test</title>', '<rect id="loose" x="0" y="0" width="4" height="4"/>');
    expectFault(svg, 'outside_view', '"loose"', /outside any view/);
  });

  it('one physical part drawn inconsistently', () => {
    // The same instance at x = 100 in the plan but x = 120 in the side elevation.
    const moved = drawing().replace('cx="100" cy="-20"', 'cx="120" cy="-20"');
    expectFault(moved, 'inconsistent_instance', '"sm-axle_1"', /axle_1 is at x = 120 in side_minus_y but x = 100 in plan/);
    expectFault(
      drawing({ side: '<rect id="sm-wrong" data-part="wheel" data-instance="axle_2" x="190" y="-40" width="20" height="40"/>' }),
      'inconsistent_instance',
      '"sm-wrong"',
      /drawn twice in view side_minus_y/,
    );
    expectFault(
      drawing({ end: '<rect id="el-k" data-part="pilot" data-instance="axle_1" x="-5" y="-30" width="10" height="20"/>' }),
      'inconsistent_instance',
      '"el-k"',
      /instance axle_1 has kind pilot here but axle in "pl-axle_1"/,
    );
  });

  it('axle count that does not match the axles drawn', () => {
    expectFault(drawing({ root: 'data-length="300" data-width="100" data-axles="3"' }), 'count_mismatch', 'svg#1', /data-axles="3" but 2 axle instances are drawn/);
  });
});

describe('loadDrawingsFromDir', () => {
  let dir: string | undefined;
  afterEach(() => {
    if (dir) rmSync(dir, { recursive: true, force: true });
    dir = undefined;
  });

  it('throws on the first broken file, naming it', () => {
    dir = mkdtempSync(join(tmpdir(), 'hoodline-drawings-'));
    copyFileSync(join(DIAGRAMS_DIR, 'four_axle_road.svg'), join(dir, 'four_axle_road.svg'));
    writeFileSync(join(dir, 'zz_broken.svg'), '<svg');
    expect(() => loadDrawingsFromDir(dir)).toThrow(/zz_broken\.svg, element document: not well-formed XML/);
  });

  it('requires the unit type key to match the file name', () => {
    dir = mkdtempSync(join(tmpdir(), 'hoodline-drawings-'));
    copyFileSync(join(DIAGRAMS_DIR, 'four_axle_road.svg'), join(dir, 'road_copy.svg'));
    expect(() => loadDrawingsFromDir(dir)).toThrow(/road_copy\.svg, element svg#1: data-unit-type "four_axle_road" must match the file name "road_copy"/);
  });

  it('reads only *.svg files', () => {
    dir = mkdtempSync(join(tmpdir(), 'hoodline-drawings-'));
    copyFileSync(join(DIAGRAMS_DIR, 'four_axle_switcher.svg'), join(dir, 'four_axle_switcher.svg'));
    writeFileSync(join(dir, 'notes.md'), 'not a drawing');
    expect([...loadDrawingsFromDir(dir).keys()]).toEqual(['four_axle_switcher']);
  });
});
