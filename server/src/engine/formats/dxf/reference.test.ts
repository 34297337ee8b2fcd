/**
 * Our DXF reading against independent npm libraries: every fixture and sample is also read by
 * `dxf-parser` (entity types and values must agree), and drawings written by `@tarikjabiri/dxf` and
 * `dxf-writer` read back with the figures the writers were given.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { DxfWriter, LWPolylineFlags, point3d, Units } from '@tarikjabiri/dxf';
import DxfParser from 'dxf-parser';
import Drawing from 'dxf-writer';
import { describe, expect, it } from 'vitest';
import { measureContour } from '../../geometry/measure';
import type { Arc } from '../../types';
import { parseDxfDocument, type DxfEntity } from './entities';
import { readDxf } from './readDxf';

const root = join(__dirname, '../../../../..');
function listDxf(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...listDxf(p));
    else if (name.endsWith('.dxf')) out.push(p);
  }
  return out.sort();
}
const files = [...listDxf(join(root, 'test/fixtures/dxf')), ...listDxf(join(root, 'samples'))];

interface ParsedEntity {
  type: string;
  [key: string]: unknown;
}

const deg = (rad: number) => (rad * 180) / Math.PI;

/** Compares one of our entity records with dxf-parser's object for the same entity. */
function expectSame(ours: DxfEntity, theirs: ParsedEntity, where: string): void {
  expect(theirs.type, where).toBe(ours.type);
  const t = theirs as Record<string, any>;
  switch (ours.kind) {
    case 'line':
      expect([t.vertices[0].x, t.vertices[0].y, t.vertices[1].x, t.vertices[1].y], where).toEqual([ours.x0, ours.y0, ours.x1, ours.y1]);
      break;
    case 'circle':
      expect([t.center.x, t.center.y, t.radius], where).toEqual([ours.cx, ours.cy, ours.r]);
      break;
    case 'arc':
      expect([t.center.x, t.center.y, t.radius], where).toEqual([ours.cx, ours.cy, ours.r]);
      // dxf-parser gives the angles in radians.
      expect(deg(t.startAngle), where).toBeCloseTo(ours.startDeg, 10);
      expect(deg(t.endAngle), where).toBeCloseTo(ours.endDeg, 10);
      break;
    case 'ellipse':
      expect([t.center.x, t.center.y, t.majorAxisEndPoint.x, t.majorAxisEndPoint.y, t.axisRatio, t.startAngle, t.endAngle], where)
        .toEqual([ours.cx, ours.cy, ours.mx, ours.my, ours.ratio, ours.t0, ours.t1]);
      break;
    case 'lwpolyline':
    case 'polyline':
      expect(t.vertices.map((v: any) => [v.x, v.y, v.bulge ?? 0]), where).toEqual(ours.vertices.map((v) => [v.x, v.y, v.bulge]));
      expect(!!t.shape, where).toBe((ours.flags & 1) !== 0);
      break;
    case 'spline':
      expect(t.degreeOfSplineCurve, where).toBe(ours.degree);
      expect(t.knotValues, where).toEqual(ours.knots);
      expect(t.controlPoints.map((p: any) => [p.x, p.y, p.z ?? 0]), where).toEqual(
        Array.from({ length: ours.ctrl.length / 3 }, (_, i) => [ours.ctrl[3 * i], ours.ctrl[3 * i + 1], ours.ctrl[3 * i + 2]]));
      break;
    case 'insert':
      expect([t.name, t.position.x, t.position.y, t.xScale ?? 1, t.yScale ?? 1, t.rotation ?? 0, t.columnCount ?? 1, t.rowCount ?? 1], where)
        .toEqual([ours.name, ours.x, ours.y, ours.sx, ours.sy, ours.rotationDeg, ours.columns, ours.rows]);
      break;
    case 'other':
      break;
  }
}

describe('DXF fixtures and samples agree with dxf-parser (independent reader)', () => {
  for (const file of files) {
    const text = readFileSync(file, 'utf8');
    const ours = parseDxfDocument(text);
    if (ours.problems.length > 0) continue; // malformed on purpose: dxf-parser has no recovery to compare with
    it(`reads the same entities and values in ${file.slice(root.length + 1)}`, () => {
      const parsed = new DxfParser().parseSync(text) as unknown as { entities: ParsedEntity[]; blocks?: Record<string, { entities?: ParsedEntity[] }> };
      expect(parsed.entities.map((e) => e.type)).toEqual(ours.entities.map((e) => e.type));
      ours.entities.forEach((e, i) => expectSame(e, parsed.entities[i], `${e.type} #${i}`));
      for (const [name, block] of ours.blocks) {
        const theirs = parsed.blocks?.[name]?.entities ?? [];
        expect(theirs.map((e) => e.type)).toEqual(block.entities.map((e) => e.type));
        block.entities.forEach((e, i) => expectSame(e, theirs[i], `${name}/${e.type} #${i}`));
      }
    });
  }
});

describe('DXF written by independent writers reads back with the figures they were given', () => {
  it('@tarikjabiri/dxf: inch units, a bulged closed LWPOLYLINE, an arc, a circle and a block insert', () => {
    const w = new DxfWriter();
    w.setUnits(Units.Inches);
    // The §6.8 polyline: (0,0)[b=0.5], (10,0), (10,10), (0,10), closed → A = 117.47246945318797783 in².
    w.addLWPolyline([{ point: { x: 0, y: 0 }, bulge: 0.5 }, { point: { x: 10, y: 0 } }, { point: { x: 10, y: 10 } }, { point: { x: 0, y: 10 } }], { flags: LWPolylineFlags.Closed });
    w.addCircle(point3d(30, 0, 0), 2);
    const block = w.addBlock('pin');
    block.addCircle(point3d(0, 0, 0), 1);
    w.addInsert('pin', point3d(50, 0, 0), { scaleFactor: { x: 3, y: 3, z: 3 } });
    const r = readDxf(w.stringify(), { assumedUnit: 'auto' });
    expect(r.units).toMatchObject({ declared: true, mmPerUnit: 25.4 });
    expect(r.problems.filter((p) => p.checkId !== 'not-analysed')).toEqual([]);
    const areas = r.contours.map((c) => measureContour(c, 'up').areaMm2.value!);
    // §6.3 (1 in = 25.4 mm, areas × 25.4²), §6.8, πr² (handbook).
    expect(areas[0]).toBeCloseTo(117.47246945318797783 * 25.4 ** 2, 6);
    expect(areas[1]).toBeCloseTo(Math.PI * 4 * 25.4 ** 2, 6);
    expect(areas[2]).toBeCloseTo(Math.PI * 9 * 25.4 ** 2, 6);
    const pin = r.contours[2].segments[0] as Arc;
    expect(pin.cx).toBeCloseTo(50 * 25.4, 9);
  });

  it('dxf-writer: millimetres, loose lines and an arc chained into the slot they draw, and a circle', () => {
    const d = new Drawing();
    d.setUnits('Millimeters');
    // A 30 × 10 outline with a rounded right end: lines y = 0 and y = 10 and x = 0, the right end a half-circle ARC.
    d.drawLine(0, 0, 30, 0);
    d.drawArc(30, 5, 5, 270, 90);
    d.drawLine(30, 10, 0, 10);
    d.drawLine(0, 10, 0, 0);
    d.drawCircle(15, 5, 2);
    const r = readDxf(d.toDxfString(), { assumedUnit: 'auto' });
    expect(r.units).toMatchObject({ declared: true, mmPerUnit: 1 });
    expect(r.problems).toEqual([]);
    expect(r.contours).toHaveLength(2);
    const slot = measureContour(r.contours[0], 'up');
    expect(r.contours[0].closed).toBe(true);
    // Rectangle 30 × 10 plus a half disc of radius 5 (handbook): A = 300 + 12.5π, L = 30 + 30 + 10 + 5π.
    expect(slot.areaMm2.value).toBeCloseTo(300 + 12.5 * Math.PI, 9);
    expect(slot.lengthMm).toBeCloseTo(70 + 5 * Math.PI, 9);
    expect(measureContour(r.contours[1], 'up').areaMm2.value).toBeCloseTo(4 * Math.PI, 9);
  });
});
