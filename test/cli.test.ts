/**
 * The CLI on the samples: in-process through runCli (with the real file system) for the figures and
 * exit codes, and once as a real process through the package's bin, as a user runs it.
 * Expected figures are worked out from the drawings with the handbook formulas named beside them
 * (see also samples/README.md); none is copied from Loopwise's own output.
 */
import { execFile } from 'node:child_process';
import { readFile, readdir, stat } from 'node:fs/promises';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { runCli, type CliIo } from '../server/src/cli/run';

const root = fileURLToPath(new URL('..', import.meta.url));
const samples = join(root, 'samples');

interface Captured {
  code: number;
  stdout: string;
  stderr: string;
}

async function cli(...argv: string[]): Promise<Captured> {
  let stdout = '';
  let stderr = '';
  const io: CliIo = {
    stdout: (s) => (stdout += s),
    stderr: (s) => (stderr += s),
    listFiles: async (folder) =>
      (await readdir(folder, { recursive: true, withFileTypes: true })).filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name)),
    isFolder: async (p) => (await stat(p)).isDirectory(),
    readText: (p) => readFile(p, 'utf8'),
    version: 'test',
  };
  const code = await runCli(argv, io);
  return { code, stdout, stderr };
}

interface JsonContour {
  index: number;
  source: { line: number; column: number; element: string; id: string | null };
  closed: boolean;
  gapMm: number;
  lengthMm: number;
  perimeterMm: number | null;
  areaMm2: number | null;
  signedAreaMm2: number | null;
  orientation: 'cw' | 'ccw' | null;
  q: number | null;
  deficitMm2: number | null;
  bboxMm: [number, number, number, number];
  selfIntersections: { xMm: number; yMm: number; kind: 'crossing' | 'touch' }[];
  overlaps: { otherContour: number; lengthMm: number }[];
  parent: number | null;
  roundness: {
    inradiusMm: number | null;
    circumradiusMm: number | null;
    minZoneMm: number | null;
    bonnesenBoundMm: number | null;
    radiusGapMm: number | null;
    circumCentreMm: [number, number] | null;
    selfCrossing: boolean;
    windingSquaredAreaMm2: number | null;
  };
  hull: { areaMm2: number; perimeterMm: number; convexity: number | null };
}
interface JsonFile {
  path: string;
  format: string;
  units: { declared: boolean; mmPerUnit: number; assumed: string | null };
  contours: JsonContour[];
  summary: { contours: number; parts: number; pierces: number; cutLengthMm: number; netAreaMm2: number };
  parts: { outer: number; holes: number[]; netAreaMm2: number; holesTurnOpposite: boolean | null }[];
  problems: { id: string; severity: string; message: string; line: number; column: number; endLine: number; endColumn: number }[];
}

async function report(file: string, ...flags: string[]): Promise<JsonFile> {
  const { stdout } = await cli('check', '--json', ...flags, join(samples, file));
  const parsed = JSON.parse(stdout) as { files: JsonFile[] };
  expect(parsed.files).toHaveLength(1);
  return parsed.files[0]!;
}

const byId = (f: JsonFile, id: string): JsonContour => {
  const c = f.contours.find((x) => x.source.id === id);
  if (!c) throw new Error(`no contour with id ${id} in ${f.path}`);
  return c;
};

const PI = Math.PI;

describe('loopwise check on samples/lamp-panel.svg (mm drawing, clean)', () => {
  it('reports no problems and exits 0', async () => {
    const { code } = await cli('check', join(samples, 'lamp-panel.svg'));
    const f = await report('lamp-panel.svg');
    expect(f.problems).toEqual([]);
    expect(code).toBe(0);
    expect(f.units).toEqual({ declared: true, mmPerUnit: 1, assumed: null });
  });

  it('measures the rounded-rectangle edge by the rounded-rectangle formulas (REFERENCES §2.9)', async () => {
    const edge = byId(await report('lamp-panel.svg'), 'panel-edge');
    // L = 2(w − 2r) + 2(h − 2r) + 2πr, A = wh − (4 − π)r² with w = 150, h = 90, r = 6.
    expect(edge.perimeterMm).toBeCloseTo(2 * 138 + 2 * 78 + 2 * PI * 6, 9);
    expect(edge.areaMm2).toBeCloseTo(150 * 90 - (4 - PI) * 36, 9);
    expect(edge.bboxMm).toEqual([5, 5, 155, 95]);
    expect(edge.closed).toBe(true);
  });

  it('gives the round window Q = 1 and zero deficit (circle, REFERENCES §2.1)', async () => {
    const w = byId(await report('lamp-panel.svg'), 'window');
    expect(w.perimeterMm).toBeCloseTo(2 * PI * 20, 9);
    expect(w.areaMm2).toBeCloseTo(PI * 400, 9);
    expect(w.q).toBeCloseTo(1, 12);
    expect(Math.abs(w.deficitMm2!)).toBeLessThan(1e-8);
  });

  it('measures the hexagonal vents as regular hexagons (REFERENCES §2.2, n = 6, R = 6; vertices rounded to 1e-6)', async () => {
    const v = byId(await report('lamp-panel.svg'), 'vent-left');
    expect(v.perimeterMm).toBeCloseTo(36, 5);
    expect(v.areaMm2).toBeCloseTo(2.598076211353316 * 36, 4);
    expect(v.q).toBeCloseTo(0.9068996821171089, 6);
  });

  it('measures the crescent as the difference of two circular segments (REFERENCES §4.3: (r²/2)(θ − sin θ))', async () => {
    const moon = byId(await report('lamp-panel.svg'), 'moon');
    const t9 = 2 * PI - 2 * Math.asin(8 / 9); // major arc of r = 9 over the 16 mm chord
    const t11 = 2 * PI - 2 * Math.asin(8 / 11);
    const segment = (r: number, t: number) => ((r * r) / 2) * (t - Math.sin(t));
    expect(moon.perimeterMm).toBeCloseTo(9 * t9 + 11 * t11, 9);
    expect(moon.areaMm2).toBeCloseTo(segment(11, t11) - segment(9, t9), 9);
  });

  it('sums the file: 9 contours, 1 part with 8 holes, 9 pierces, cut length Σ L, net area edge − holes (REFERENCES §2.1, §2.2, §2.9, §4.3)', async () => {
    const { summary } = await report('lamp-panel.svg');
    const edgeL = 2 * 138 + 2 * 78 + 2 * PI * 6, edgeA = 150 * 90 - (4 - PI) * 36; // rounded rectangle §2.9
    const hexL = 36, hexA = ((3 * Math.sqrt(3)) / 2) * 36; // regular hexagon R = 6: L = 6R, A = (3√3/2)R² (§2.2)
    const t9 = 2 * PI - 2 * Math.asin(8 / 9), t11 = 2 * PI - 2 * Math.asin(8 / 11);
    const segment = (r: number, t: number) => ((r * r) / 2) * (t - Math.sin(t)); // §4.3
    const moonL = 9 * t9 + 11 * t11, moonA = segment(11, t11) - segment(9, t9);
    expect(summary).toMatchObject({ contours: 9, parts: 1, pierces: 9 });
    // Holes: four M4 circles r 2.2, the window r 20 (§2.1), two vents, the crescent.
    expect(summary.cutLengthMm).toBeCloseTo(edgeL + 4 * 2 * PI * 2.2 + 2 * PI * 20 + 2 * hexL + moonL, 4);
    expect(summary.netAreaMm2).toBeCloseTo(edgeA - 4 * PI * 2.2 ** 2 - PI * 400 - 2 * hexA - moonA, 4);
  });

  it('lists the one part: the edge with its 8 holes, net area edge − holes, holes not turning against it (rect and circle run clockwise by SVG 2\'s equivalent paths, REFERENCES §5.6; §2.1, §2.2, §2.9, §4.3)', async () => {
    const { parts } = await report('lamp-panel.svg');
    const edgeA = 150 * 90 - (4 - PI) * 36, hexA = ((3 * Math.sqrt(3)) / 2) * 36;
    const t9 = 2 * PI - 2 * Math.asin(8 / 9), t11 = 2 * PI - 2 * Math.asin(8 / 11);
    const segment = (r: number, t: number) => ((r * r) / 2) * (t - Math.sin(t));
    expect(parts).toHaveLength(1);
    expect(parts[0]).toMatchObject({ outer: 0, holes: [1, 2, 3, 4, 5, 6, 7, 8], holesTurnOpposite: false });
    expect(parts[0]!.netAreaMm2).toBeCloseTo(edgeA - 4 * PI * 2.2 ** 2 - PI * 400 - 2 * hexA - (segment(11, t11) - segment(9, t9)), 4);
  });

  it('nests every hole in the panel edge and finds no crossing, touch or double cut', async () => {
    const f = await report('lamp-panel.svg');
    expect(f.contours.map((c) => c.parent)).toEqual([null, 0, 0, 0, 0, 0, 0, 0, 0]);
    for (const c of f.contours) expect([c.selfIntersections, c.overlaps]).toEqual([[], []]);
  });

  it('gives the hexagonal vent R = 6, ρ = R cos(π/6), zone R(1 − cos(π/6)) and R − ρ within Bonnesen (REFERENCES §2.2, §3.4, §1.3)', async () => {
    const v = byId(await report('lamp-panel.svg'), 'vent-left');
    const rho = 6 * Math.cos(PI / 6);
    expect(v.roundness.circumradiusMm).toBeCloseTo(6, 5); // vertices rounded to 1e-6
    expect(v.roundness.inradiusMm).toBeCloseTo(rho, 5);
    expect(v.roundness.minZoneMm).toBeCloseTo(6 - rho, 5);
    expect(v.roundness.circumCentreMm![0]).toBeCloseTo(30, 5);
    expect(v.roundness.circumCentreMm![1]).toBeCloseTo(50, 5);
    // √D/π with L = 36, A = (3√3/2)·36: √(1296 − 4π·93.5307)/π = 3.4963
    expect(v.roundness.bonnesenBoundMm).toBeCloseTo(Math.sqrt(36 ** 2 - 4 * PI * ((3 * Math.sqrt(3)) / 2) * 36) / PI, 5);
    expect(v.roundness.radiusGapMm!).toBeLessThanOrEqual(v.roundness.bonnesenBoundMm!);
    expect(v.roundness.selfCrossing).toBe(false);
    expect(v.hull.areaMm2).toBeCloseTo(((3 * Math.sqrt(3)) / 2) * 36, 4); // convex: its own hull
    expect(v.hull.perimeterMm).toBeCloseTo(36, 5);
    expect(v.hull.convexity).toBeCloseTo(1, 9);
  });

  it('gives the panel edge R = half-diagonal of the corner centres + r, ρ = h/2 and the Bonnesen bound √D/π (REFERENCES §2.9, §1.3)', async () => {
    const e = byId(await report('lamp-panel.svg'), 'panel-edge');
    const L = 2 * 138 + 2 * 78 + 2 * PI * 6, A = 150 * 90 - (4 - PI) * 36;
    const R = Math.hypot(69, 39) + 6; // corner-arc centres at (80 ± 69, 50 ± 39), radius 6
    // Curves are flattened within 1e-5 of the bbox diagonal for these figures (README "Figures and units").
    const delta = 1e-5 * Math.hypot(150, 90);
    expect(Math.abs(e.roundness.circumradiusMm! - R)).toBeLessThanOrEqual(delta);
    expect(Math.abs(e.roundness.inradiusMm! - 45)).toBeLessThanOrEqual(delta); // half the 90 mm height
    expect(e.roundness.bonnesenBoundMm).toBeCloseTo(Math.sqrt(L * L - 4 * PI * A) / PI, 6);
    expect(Math.abs(e.roundness.radiusGapMm! - (R - 45))).toBeLessThanOrEqual(2 * delta);
    expect(e.roundness.windingSquaredAreaMm2).toBeNull(); // simple contour
  });

  it('prints the file summary and a roundness table in the text report', async () => {
    const { stdout } = await cli('check', join(samples, 'lamp-panel.svg'));
    expect(stdout).toContain('  9 contours, 1 part, 9 pierces, cut length 810.695 mm, net area 11821.347 mm²');
    expect(stdout).toMatch(/ {2}roundness\n {2}# +ρ mm +R mm +zone mm +R−ρ mm +√D\/π mm +convexity +inside/);
    // Vent: ρ = 6 cos(π/6) = 5.196, R = 6, zone = R − ρ = 0.804, √D/π = 3.496 (§2.2, §1.3), inside contour #0.
    expect(stdout).toMatch(/\n {2}6 +5\.196 +6 +0\.804 +0\.804 +3\.496 +1 +#0\n/);
  });
});

describe('loopwise check on samples/lamp-panel-draft.svg (problems)', () => {
  it('finds the near-closed vent, the open leaf and the doubled point, and exits 1', async () => {
    const f = await report('lamp-panel-draft.svg');
    expect(f.problems.map((p) => p.id).sort()).toEqual(['near-closed', 'open-contour', 'zero-length-segment']);
    expect((await cli('check', join(samples, 'lamp-panel-draft.svg'))).code).toBe(1);
  });

  it('measures the vent gap as 0.04 mm (36 − 35.96) and the leaf gap as √(18² + 12²) mm', async () => {
    const f = await report('lamp-panel-draft.svg');
    expect(byId(f, 'vent-left').gapMm).toBeCloseTo(0.04, 12);
    expect(byId(f, 'leaf').gapMm).toBeCloseTo(Math.hypot(18, 12), 12);
    expect(byId(f, 'leaf').areaMm2).toBeNull();
    expect(byId(f, 'leaf').q).toBeNull();
  });

  it('points the near-closed problem at the last command of the vent, on its line', async () => {
    const f = await report('lamp-panel-draft.svg');
    const text = await readFile(join(samples, 'lamp-panel-draft.svg'), 'utf8');
    const p = f.problems.find((x) => x.id === 'near-closed')!;
    const line = text.split('\n')[p.line - 1]!;
    expect(line.slice(p.column - 1, p.endColumn - 1)).toBe('L 35.96 50');
  });

  it('turns near-closed into open-contour when the tolerance is narrowed below the gap', async () => {
    const f = await report('lamp-panel-draft.svg', '--near-closed-tolerance', '0.01');
    expect(f.problems.filter((p) => p.id === 'open-contour')).toHaveLength(2);
    expect(f.problems.some((p) => p.id === 'near-closed')).toBe(false);
  });

  it('exits 0 when the user lowers open-contour to a warning', async () => {
    const { code } = await cli('check', '--severity', 'open-contour=warning', join(samples, 'lamp-panel-draft.svg'));
    expect(code).toBe(0);
  });
});

describe('loopwise check on samples/gasket-plate.svg (inch drawing, transforms, use)', () => {
  const mm = 0.254; // 4 in over 400 units: 25.4 mm per inch / 100 units per inch (CSS Values: 1in = 25.4mm)

  it('converts inches to mm through width and viewBox', async () => {
    const f = await report('gasket-plate.svg');
    expect(f.units.declared).toBe(true);
    expect(f.units.mmPerUnit).toBeCloseTo(mm, 15);
    expect(f.problems).toEqual([]);
  });

  it('measures the stadium edge: L = 2a + 2πr, A = 2ar + πr² (REFERENCES §2.5, a = r = 120 units)', async () => {
    const edge = byId(await report('gasket-plate.svg'), 'gasket-edge');
    expect(edge.perimeterMm).toBeCloseTo((2 * 120 + 2 * PI * 120) * mm, 9);
    expect(edge.areaMm2).toBeCloseTo((2 * 120 * 120 + PI * 120 * 120) * mm * mm, 8);
  });

  it('measures the port ellipse: A = πab and the perimeter by Ramanujan II within its error (REFERENCES §2.4)', async () => {
    const port = byId(await report('gasket-plate.svg'), 'port');
    const a = 60 * mm;
    const b = 35 * mm;
    expect(port.areaMm2).toBeCloseTo(PI * a * b, 9);
    const h = ((a - b) / (a + b)) ** 2;
    const ramanujan2 = PI * (a + b) * (1 + (3 * h) / (10 + Math.sqrt(4 - 3 * h)));
    // Ramanujan II underestimates by about 2.3e-5·h⁵·π(a+b); h ≈ 0.0977 here, so < 1e-9 relative.
    expect(Math.abs(port.perimeterMm! - ramanujan2) / ramanujan2).toBeLessThan(1e-8);
  });

  it('places six bolt holes of r = 12.5 units on a 95-unit bolt circle, and skips the hidden line and the defs', async () => {
    const f = await report('gasket-plate.svg');
    const holes = f.contours.filter((c) => c.source.element === 'circle');
    expect(holes).toHaveLength(6);
    expect(f.contours).toHaveLength(8);
    for (const [k, h] of holes.entries()) {
      expect(h.perimeterMm).toBeCloseTo(2 * PI * 12.5 * mm, 9);
      const cx = (h.bboxMm[0] + h.bboxMm[2]) / 2;
      const cy = (h.bboxMm[1] + h.bboxMm[3]) / 2;
      // SVG 2 Struct, "The use element": x/y are a translate after the use's own transform.
      const angle = (k * 60 * PI) / 180;
      expect(cx).toBeCloseTo((200 + 95 * Math.cos(angle)) * mm, 9);
      expect(cy).toBeCloseTo((150 + 95 * Math.sin(angle)) * mm, 9);
    }
  });
});

describe('loopwise check on the other samples', () => {
  it('assumes CSS px for the coaster without a physical size (CSS Values: 1px = 25.4/96 mm)', async () => {
    const f = await report('coaster-no-size.svg');
    const px = 25.4 / 96;
    expect(f.units).toEqual({ declared: false, mmPerUnit: px, assumed: 'px' });
    expect(f.problems.map((p) => p.id)).toEqual(['units-assumed']);
    // REFERENCES §2.8: 5-point star, outer radius 1, inner 0.4: L = 7.160910588047, A = 1.175570504585;
    // here outer radius 50 units, vertices rounded to 1e-6.
    const star = byId(f, 'star');
    expect(star.perimeterMm).toBeCloseTo(7.160910588047 * 50 * px, 4);
    expect(star.areaMm2).toBeCloseTo(1.175570504585 * 2500 * px * px, 3);
  });

  it('reports the damaged path data at the letter O and still measures what came before and after', async () => {
    const f = await report('bracket-damaged.svg');
    const text = await readFile(join(samples, 'bracket-damaged.svg'), 'utf8');
    const parse = f.problems.find((p) => p.id === 'parse-error')!;
    expect(text.split('\n')[parse.line - 1]![parse.column - 1]).toBe('O');
    // SVG 2 "Error handling in path data": drawn up to L 20,70; open, gap from (20,70) to (10,10).
    const bracket = byId(f, 'bracket');
    expect(bracket.closed).toBe(false);
    expect(bracket.lengthMm).toBeCloseTo(60 + 10 + 45 + Math.hypot(5, 50), 9);
    expect(bracket.gapMm).toBeCloseTo(Math.hypot(10, 60), 9);
    expect(byId(f, 'hanging-hole').perimeterMm).toBeCloseTo(2 * PI * 2, 9);
  });

  it('reports the truncated export as malformed XML and measures the contours written before the break', async () => {
    const f = await report('truncated-export.svg');
    expect(f.problems.some((p) => p.id === 'parse-error')).toBe(true);
    const outline = byId(f, 'tag-outline');
    expect(outline.perimeterMm).toBeCloseTo(2 * 34 + 2 * 19 + 2 * PI * 3, 9);
    expect(outline.areaMm2).toBeCloseTo(40 * 25 - (4 - PI) * 9, 9);
    expect(byId(f, 'tag-hole').areaMm2).toBeCloseTo(PI * 2.5 * 2.5, 9);
  });
});

describe('loopwise check on samples/fernhollow-lamp-panel-loose.dxf (DXF, layers)', () => {
  it('lists the TEXT on layer ENGRAVE as not analysed by default', async () => {
    const f = await report('fernhollow-lamp-panel-loose.dxf');
    expect(f.problems.filter((p) => p.id === 'not-analysed').map((p) => p.message)).toEqual(['Not analysed: TEXT (1 entity; not cutting outlines).']);
  });

  it('skips a layer named by --ignore-layer, in any case, and lists the layer instead', async () => {
    const f = await report('fernhollow-lamp-panel-loose.dxf', '--ignore-layer', 'engrave');
    expect(f.problems.filter((p) => p.id === 'not-analysed').map((p) => p.message)).toEqual([
      'Layer ENGRAVE is ignored by the settings: 1 entity not analysed.',
    ]);
    expect(f.contours).toHaveLength(2); // the chained edge and the window, as without the flag
  });

  it('takes --ignore-layer more than once', async () => {
    const f = await report('fernhollow-lamp-panel-loose.dxf', '--ignore-layer', 'ENGRAVE', '--ignore-layer', 'cut');
    expect(f.contours).toEqual([]);
    expect(f.problems.filter((p) => p.id === 'not-analysed')).toHaveLength(2);
  });
});

describe('loopwise usage and exit codes', () => {
  it('exits 2 with the usage text for a missing command', async () => {
    const r = await cli();
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('Usage: loopwise check');
  });

  it('exits 2 for an unreadable path and still reports the readable ones', async () => {
    const r = await cli('check', '--json', join(samples, 'lamp-panel.svg'), join(samples, 'does-not-exist.svg'));
    expect(r.code).toBe(2);
    const files = (JSON.parse(r.stdout) as { files: { path: string; error?: string }[] }).files;
    expect(files).toHaveLength(2);
    expect(files.find((x) => x.path.endsWith('does-not-exist.svg'))!.error).toMatch(/ENOENT/);
  });

  it('exits 2 for a bad option value', async () => {
    expect((await cli('check', '--near-closed-tolerance', 'wide', samples)).code).toBe(2);
    expect((await cli('check', '--severity', 'no-such-check=off', samples)).code).toBe(2);
    expect((await cli('check', '--assume-unit', 'furlong', samples)).code).toBe(2);
    expect((await cli('check', '--ignore-layer', ' ', samples)).code).toBe(2);
  });

  it('prints every problem as file:line:column in the text report', async () => {
    const r = await cli('check', join(samples, 'lamp-panel-draft.svg'));
    expect(r.stdout).toMatch(/lamp-panel-draft\.svg:\d+:\d+ {2}warning {2}near-closed {2}Contour #\d+ is not closed/);
  });
});

describe('the installed command', () => {
  it('runs through the package bin on the samples folder, as in the README', async () => {
    const run = promisify(execFile);
    const result = await run(process.execPath, [join(root, 'bin/loopwise.js'), 'check', '--json', relative(root, samples)], { cwd: root }).catch(
      (e: { code: number; stdout: string }) => e,
    );
    expect('code' in result ? result.code : 0).toBe(1);
    const files = (JSON.parse(result.stdout) as { files: { path: string }[] }).files.map((f) => f.path);
    expect(files).toEqual([
      'samples/bracket-damaged.svg',
      'samples/coaster-no-size.svg',
      'samples/fernhollow-gasket-blocks.dxf',
      'samples/fernhollow-lamp-panel-loose.dxf',
      'samples/fernhollow-spline-knob.dxf',
      'samples/gasket-plate.svg',
      'samples/lamp-panel-draft.svg',
      'samples/lamp-panel.svg',
      'samples/truncated-export.svg',
    ]);
  });
});

describe('the README', () => {
  it('shows what the CLI really prints for the draft lamp panel', async () => {
    const readme = await readFile(join(root, 'README.md'), 'utf8');
    const block = readme.slice(readme.indexOf('samples/lamp-panel-draft.svg  (SVG'), readme.indexOf('…\n', readme.indexOf('samples/lamp-panel-draft.svg  (SVG')));
    const r = await cli('check', 'samples/lamp-panel-draft.svg');
    expect(block.length).toBeGreaterThan(200);
    expect(r.stdout.replaceAll(samples, 'samples')).toContain(block);
  });
});

describe('the contour table', () => {
  it('places each use instance at its own use tag, not at the shared shape in defs', async () => {
    const r = await cli('check', join(samples, 'gasket-plate.svg'));
    const text = await readFile(join(samples, 'gasket-plate.svg'), 'utf8');
    // Line numbers of the six <use> tags, counted independently of the CLI.
    const useLines = text.split('\n').flatMap((l, i) => (l.includes('<use ') ? [`${i + 1}:5`] : []));
    expect(useLines).toHaveLength(6);
    const holeRows = r.stdout.split('\n').filter((l) => /^\s+\d+\s+circle#bolt-hole\s/.test(l));
    expect(holeRows.map((l) => l.trim().split(/\s+/)[2])).toEqual(useLines);
  });
});
