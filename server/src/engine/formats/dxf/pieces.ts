/**
 * DXF entities to pieces of outline in WCS millimetres: each piece is the segments of one entity
 * (or of one entity of one block instance), with the source positions its findings and fixes need,
 * written to a flat piece store (pieceStore.ts).
 * Formulas: REFERENCES.md §6.4 (entities, INSERT mapping), §6.5 (OCS), §6.7 (bulges).
 */
import { SPLINE_FIT_TOLERANCE_MM } from '../../geometry/tolerances';
import type { Arc, Segment, SourceSpan } from '../../types';
import type { BlockDef, DxfEntity, LayerInfo, LwVertex, PointGroups, PolyVertex, SimpleEntity } from './entities';
import { PieceStore, type PieceFacts, type PolylineFixInfo } from './pieceStore';
import { getSplineSegments } from './spline';
import { compose, getCosSinDeg, getMaxStretch, getOcsMap, IDENTITY, rotationDeg, scaling, translation, type Affine } from './transform';
import { getVectorLength } from '../../geometry/length';

/** Facts met while building pieces, reported by the reader. */
export interface PieceNotes {
  /** Entities not analysed, by type label: the spans (the INSERT's for block content). */
  readonly notAnalysed: Map<string, SourceSpan[]>;
  /** Entities skipped because their layer is frozen or off: layer name → count. */
  readonly hiddenLayers: Map<string, number>;
  /** Entities skipped because the settings ignore their layer: layer name → count and the first entity (or INSERT). */
  readonly ignoredLayers: Map<string, { count: number; span: SourceSpan }>;
  /** Paper-space entities skipped. */
  readonly paperSpace: SourceSpan[];
  /** Out-of-plane entities: span, type, detail. */
  readonly outOfPlane: { span: SourceSpan; entity: string; detail: string }[];
  /** Malformed entity data: span, detail (parse-error / dxf). */
  readonly malformed: { span: SourceSpan; detail: string }[];
}

/** The blocks a top-level entity is inside of: none. */
const NO_BLOCKS: readonly string[] = [];

/** True when all four numbers are finite (no array per test, on the path every LINE and ARC takes). */
function areFinite(a: number, b: number, c: number, d: number): boolean {
  return Number.isFinite(a) && Number.isFinite(b) && Number.isFinite(c) && Number.isFinite(d);
}

/** What a piece may tell beyond its entity: start and end spans (default: the entity's), fix facts. */
interface ExtraFacts {
  readonly startSpan?: SourceSpan;
  readonly endSpan?: SourceSpan;
  readonly startEdit?: PointGroups;
  readonly endEdit?: PointGroups;
  readonly polyline?: PolylineFixInfo;
  readonly unflaggedPolyline?: boolean;
}

/** The point groups of a LINE's ends; no facts beyond the defaults. */
const LINE_POINTS: ExtraFacts = { startEdit: 'first10', endEdit: 'first11' };
const NO_FACTS: ExtraFacts = {};

/** The facts of the piece being ended: one object, refilled for every piece. */
class Facts implements PieceFacts {
  closed = false;
  order = 0;
  spanStart = 0;
  spanEnd = 0;
  element = '';
  handleStart = -1;
  handleEnd = -1;
  layer = '';
  startSpanStart = 0;
  startSpanEnd = 0;
  endSpanStart = 0;
  endSpanEnd = 0;
  startEdit: PointGroups | undefined = undefined;
  endEdit: PointGroups | undefined = undefined;
  polyline: PolylineFixInfo | undefined = undefined;
  unflaggedPolyline = false;
}

/** Nesting limit of inserts (a block inserting itself is reported before this is reached). */
const MAX_INSERT_DEPTH = 32;
/** Largest number of block instances expanded for one file: guards row × column arrays of huge counts. */
const MAX_INSTANCES = 100_000;

export function isLayerHidden(layer: LayerInfo | undefined): boolean {
  return !!layer && ((layer.flags & 1) !== 0 || layer.colour < 0);
}

function getFullArc(cx: number, cy: number, ux: number, uy: number, vx: number, vy: number, span: SourceSpan): Arc {
  return { kind: 'arc', x0: cx + ux, y0: cy + uy, x1: cx + ux, y1: cy + uy, cx, cy, ux, uy, vx, vy, theta0: 0, sweep: 2 * Math.PI, span };
}

/**
 * Segment from (x0, y0) to (x1, y1) with bulge b (REFERENCES.md §6.7): included angle 4·atan b
 * (signed, b > 0 counter-clockwise), radius c(1 + b²)/(4|b|); the centre lies c(1 − b²)/(4b) to the
 * left of the chord's midpoint (the same point as §6.7's P1 + r_s·(cos α, sin α)).
 */
export function getBulgeSegment(x0: number, y0: number, x1: number, y1: number, bulge: number, span: SourceSpan): Segment {
  const dx = x1 - x0, dy = y1 - y0;
  const c = getVectorLength(dx, dy);
  if (bulge === 0 || c === 0) return { kind: 'line', x0, y0, x1, y1, span };
  const h = (1 - bulge * bulge) / (4 * bulge); // offset per unit chord length
  const cx = (x0 + x1) / 2 - dy * h;
  const cy = (y0 + y1) / 2 + dx * h;
  const r = (c * (1 + bulge * bulge)) / (4 * Math.abs(bulge));
  return { kind: 'arc', x0, y0, x1, y1, cx, cy, ux: r, uy: 0, vx: 0, vy: r, theta0: Math.atan2(y0 - cy, x0 - cx), sweep: 4 * Math.atan(bulge), span };
}

interface Frame {
  /** Entity coordinates (after OCS) → WCS mm. */
  readonly m: Affine;
  /** The top-level span (entity or INSERT) and order. */
  readonly top: { readonly span: SourceSpan; readonly order: number; readonly type: string; readonly handleSpan?: SourceSpan };
  /** True for top-level entities whose file coordinates map to mm by the unit factor only. */
  readonly editable: boolean;
  readonly depth: number;
  readonly blocks: readonly string[];
}

export class PieceBuilder {
  readonly store = new PieceStore();
  readonly notes: PieceNotes = { notAnalysed: new Map(), hiddenLayers: new Map(), ignoredLayers: new Map(), paperSpace: [], outOfPlane: [], malformed: [] };
  private instances = 0;
  private instanceCapReported = false;
  /** File units → mm, the map of every top-level entity. */
  private readonly topMatrix: Affine;
  /** The map a top-level piece's segments go through (`getMap` of the top-level frame). */
  private readonly topMap: Affine | null;
  private readonly facts = new Facts();
  /** Ignored layer names, upper case (DXF layer names are case-insensitive). */
  private readonly ignored: ReadonlySet<string>;
  /** Per layer name as written: visible, hidden (frozen or off) or ignored. */
  private readonly layerState = new Map<string, 'visible' | 'hidden' | 'ignored'>();

  constructor(
    private readonly blocks: ReadonlyMap<string, BlockDef>,
    private readonly layers: ReadonlyMap<string, LayerInfo>,
    mmPerUnit: number,
    ignoredLayers: readonly string[] = [],
  ) {
    this.topMatrix = scaling(mmPerUnit, mmPerUnit);
    this.topMap = mmPerUnit === 1 ? null : this.topMatrix;
    this.ignored = new Set(ignoredLayers.map((name) => name.trim().toUpperCase()));
  }

  /** Drops the pieces and notes once they have been read (see EntityReader.release). */
  release(): void {
    this.store.release();
    const { notAnalysed, hiddenLayers, ignoredLayers, paperSpace, outOfPlane, malformed } = this.notes;
    notAnalysed.clear();
    hiddenLayers.clear();
    ignoredLayers.clear();
    paperSpace.length = outOfPlane.length = malformed.length = 0;
    this.layerState.clear();
  }

  /** Builds the pieces of one top-level entity of the ENTITIES section. */
  addTopLevel(e: DxfEntity, order: number): void {
    if (e.paperSpace) {
      this.notes.paperSpace.push(e.span);
      return;
    }
    if (this.skipLayer(e.layer, e.span)) return;
    this.addEntity(e, e.layer, {
      m: this.topMatrix,
      top: { span: e.span, order, type: e.type, handleSpan: e.handleSpan },
      editable: true,
      depth: 0,
      blocks: NO_BLOCKS,
    });
  }

  /**
   * Builds the piece of a top-level LINE, ARC or CIRCLE from its numbers when it is drawn as read (model
   * space, a visible layer, finite values, in the drawing plane); otherwise from its record, which
   * reports what is wrong or skipped. The pieces are those `addTopLevel` makes of the record.
   */
  addSimple(e: SimpleEntity, order: number): void {
    if (e.paperSpace || this.getLayerState(e.layer) !== 'visible' || !this.addSimplePiece(e, order)) this.addTopLevel(e.toEntity(), order);
  }

  /** The piece of a LINE, ARC or CIRCLE drawn as read; false, adding nothing, for any other. */
  private addSimplePiece(e: SimpleEntity, order: number): boolean {
    const v = e.values;
    const m = this.topMap;
    let closed = false;
    let extra = NO_FACTS;
    if (e.kind === 'line') {
      if (!areFinite(v[0], v[1], v[3], v[4]) || v[2] !== v[5]) return false;
      this.store.addLine(m, v[0], v[1], v[3], v[4], e.start, e.end);
      extra = LINE_POINTS;
    } else {
      const cx = v[0], cy = v[1], r = v[3];
      if (!areFinite(cx, cy, r, 0) || !(r > 0) || getOcsMap(e.nx, e.ny, e.nz) !== IDENTITY) return false;
      if (e.kind === 'circle') {
        this.addCircle(m, cx, cy, r, e.start, e.end);
        closed = true;
      } else {
        if (!areFinite(v[4], v[5], 0, 0)) return false;
        this.addArc(m, cx, cy, r, v[4], v[5], e.start, e.end);
      }
    }
    const facts = this.facts;
    facts.spanStart = facts.startSpanStart = facts.endSpanStart = e.start;
    facts.spanEnd = facts.startSpanEnd = facts.endSpanEnd = e.end;
    this.writePiece(order, e.type, e.handleStart, e.handleEnd, e.layer, closed, extra.startEdit, extra.endEdit, undefined, false);
    return true;
  }

  /** A CIRCLE: the full arc from angle 0 (as `getFullArc` with u = (r, 0), v = (0, r)). */
  private addCircle(m: Affine | null, cx: number, cy: number, r: number, spanStart: number, spanEnd: number): void {
    this.store.addArc(m, cx + r, cy + 0, cx + r, cy + 0, cx, cy, r, 0, 0, r, 0, 2 * Math.PI, spanStart, spanEnd);
  }

  /** An ARC: counter-clockwise about the extrusion axis from start to end; sweep in (0°, 360°] (§6.4). */
  private addArc(m: Affine | null, cx: number, cy: number, r: number, startDeg: number, endDeg: number, spanStart: number, spanEnd: number): void {
    let sweepDeg = (endDeg - startDeg) % 360;
    if (sweepDeg <= 0) sweepDeg += 360;
    const [c0, s0] = getCosSinDeg(startDeg);
    const [c1, s1] = getCosSinDeg(endDeg);
    this.store.addArc(m, cx + r * c0, cy + r * s0, cx + r * c1, cy + r * s1, cx, cy, r, 0, 0, r,
      (startDeg * Math.PI) / 180, (sweepDeg * Math.PI) / 180, spanStart, spanEnd);
  }

  /** Visible, hidden (frozen or off) or ignored, once per layer name. */
  private getLayerState(layer: string): 'visible' | 'hidden' | 'ignored' {
    let state = this.layerState.get(layer);
    if (state === undefined) {
      state = this.ignored.has(layer.toUpperCase()) ? 'ignored' : isLayerHidden(this.layers.get(layer)) ? 'hidden' : 'visible';
      this.layerState.set(layer, state);
    }
    return state;
  }

  /** True (and noted) when entities on `layer` are skipped; `span` is the top-level entity or INSERT. */
  private skipLayer(layer: string, span: SourceSpan): boolean {
    const state = this.getLayerState(layer);
    if (state === 'visible') return false;
    if (state === 'hidden') {
      this.notes.hiddenLayers.set(layer, (this.notes.hiddenLayers.get(layer) ?? 0) + 1);
    } else {
      const seen = this.notes.ignoredLayers.get(layer);
      if (seen) seen.count++;
      else this.notes.ignoredLayers.set(layer, { count: 1, span });
    }
    return true;
  }

  private noteOther(label: string, f: Frame, e: DxfEntity): void {
    const span = f.depth === 0 ? e.span : f.top.span;
    let list = this.notes.notAnalysed.get(label);
    if (!list) this.notes.notAnalysed.set(label, (list = []));
    list.push(span);
  }

  private malformed(f: Frame, e: DxfEntity, detail: string): void {
    this.notes.malformed.push({ span: f.depth === 0 ? e.span : f.top.span, detail: f.depth === 0 ? detail : `${detail} (in block ${f.blocks[f.blocks.length - 1]})` });
  }

  private outOfPlane(f: Frame, e: DxfEntity, detail: string): void {
    this.notes.outOfPlane.push({ span: f.depth === 0 ? e.span : f.top.span, entity: e.type, detail });
  }

  /** The OCS map of the entity composed into the frame, or null (reported) when it is out of plane. */
  private getOcsFrame(f: Frame, e: DxfEntity): Frame | null {
    const ocs = getOcsMap(e.nx, e.ny, e.nz);
    if (!ocs) {
      this.outOfPlane(f, e, `extrusion direction (${e.nx}, ${e.ny}, ${e.nz}) is not perpendicular to the drawing plane`);
      return null;
    }
    if (ocs === IDENTITY) return f;
    return { ...f, m: compose(f.m, ocs), editable: false };
  }

  /** The map a piece's segments go through: null for a top-level entity already in mm (kept as they are). */
  private getMap(f: Frame): Affine | null {
    const m = f.m;
    return f.depth === 0 && m.a === 1 && m.b === 0 && m.c === 0 && m.d === 1 && m.e === 0 && m.f === 0 ? null : m;
  }

  private push(f: Frame, e: DxfEntity, layer: string, segments: Segment[], closed: boolean, extra: ExtraFacts = NO_FACTS): void {
    const m = this.getMap(f);
    for (const s of segments) {
      const span = f.depth > 0 ? f.top.span : s.span;
      this.store.addSegment(m, s, span.start, span.end);
    }
    this.finishPiece(f, e, layer, closed, extra);
  }

  /** Ends the piece whose segments went to the store. */
  private finishPiece(f: Frame, e: DxfEntity, layer: string, closed: boolean, extra: ExtraFacts): void {
    const inBlock = f.depth > 0;
    const top = f.top;
    const startSpan = inBlock ? top.span : (extra.startSpan ?? e.span);
    const endSpan = inBlock ? top.span : (extra.endSpan ?? e.span);
    const facts = this.facts;
    facts.spanStart = top.span.start;
    facts.spanEnd = top.span.end;
    facts.startSpanStart = startSpan.start;
    facts.startSpanEnd = startSpan.end;
    facts.endSpanStart = endSpan.start;
    facts.endSpanEnd = endSpan.end;
    this.writePiece(
      top.order, inBlock ? top.type : e.type, top.handleSpan?.start ?? -1, top.handleSpan?.end ?? -1, layer, closed,
      f.editable ? extra.startEdit : undefined, f.editable ? extra.endEdit : undefined, f.editable ? extra.polyline : undefined,
      extra.unflaggedPolyline ?? false,
    );
  }

  /** Ends a piece with the facts given and the spans already in `this.facts`. */
  private writePiece(
    order: number, element: string, handleStart: number, handleEnd: number, layer: string, closed: boolean,
    startEdit: PointGroups | undefined, endEdit: PointGroups | undefined, polyline: PolylineFixInfo | undefined, unflaggedPolyline: boolean,
  ): void {
    const facts = this.facts;
    facts.order = order;
    facts.element = element;
    facts.handleStart = handleStart;
    facts.handleEnd = handleEnd;
    facts.layer = layer;
    facts.closed = closed;
    facts.startEdit = startEdit;
    facts.endEdit = endEdit;
    facts.polyline = polyline;
    facts.unflaggedPolyline = unflaggedPolyline;
    this.store.addPiece(facts);
  }

  private addEntity(e: DxfEntity, layer: string, f: Frame): void {
    switch (e.kind) {
      case 'line': {
        if (!areFinite(e.x0, e.y0, e.x1, e.y1)) return this.malformed(f, e, 'LINE has a coordinate that is not a number');
        if (e.z0 !== e.z1) return this.outOfPlane(f, e, `its ends lie at different heights (z ${e.z0} and ${e.z1})`);
        // LINE points are WCS (§6.4): the extrusion does not move them.
        const span = f.depth > 0 ? f.top.span : e.span;
        this.store.addLine(this.getMap(f), e.x0, e.y0, e.x1, e.y1, span.start, span.end);
        return this.finishPiece(f, e, layer, false, LINE_POINTS);
      }
      case 'circle':
      case 'arc': {
        if (!areFinite(e.cx, e.cy, e.r, 0) || (e.kind === 'arc' && !areFinite(e.startDeg, e.endDeg, 0, 0))) {
          return this.malformed(f, e, `${e.type} has a value that is not a number`);
        }
        if (!(e.r > 0)) return this.malformed(f, e, `${e.type} radius ${e.r} is not positive`);
        const g = this.getOcsFrame(f, e);
        if (!g) return;
        const span = g.depth > 0 ? g.top.span : e.span;
        if (e.kind === 'circle') this.addCircle(this.getMap(g), e.cx, e.cy, e.r, span.start, span.end);
        else this.addArc(this.getMap(g), e.cx, e.cy, e.r, e.startDeg, e.endDeg, span.start, span.end);
        return this.finishPiece(g, e, layer, e.kind === 'circle', NO_FACTS);
      }
      case 'ellipse': {
        if (![e.cx, e.cy, e.mx, e.my, e.ratio, e.t0, e.t1].every(Number.isFinite)) return this.malformed(f, e, 'ELLIPSE has a value that is not a number');
        if (!(e.ratio > 0 && e.ratio <= 1) || (e.mx === 0 && e.my === 0)) return this.malformed(f, e, 'ELLIPSE needs a non-zero major axis and a ratio in (0, 1]');
        if (e.mz !== 0) return this.outOfPlane(f, e, 'its major axis leaves the drawing plane');
        const len = Math.hypot(e.nx, e.ny, e.nz);
        if (!getOcsMap(e.nx, e.ny, e.nz)) return this.outOfPlane(f, e, `normal (${e.nx}, ${e.ny}, ${e.nz}) is not perpendicular to the drawing plane`);
        // Point(t) = C + cos t·M + sin t·ratio·(N × M), N = ±Z (§6.4); centre and axis are WCS.
        const nz = e.nz / len;
        const vx = -nz * e.my * e.ratio, vy = nz * e.mx * e.ratio;
        let sweep = (e.t1 - e.t0) % (2 * Math.PI);
        if (sweep <= 0) sweep += 2 * Math.PI;
        const full = Math.abs(sweep - 2 * Math.PI) <= 1e-12 || sweep <= 1e-12;
        if (full) return this.push(f, e, layer, [getFullArc(e.cx, e.cy, e.mx, e.my, vx, vy, e.span)], true);
        const p0 = [e.cx + e.mx * Math.cos(e.t0) + vx * Math.sin(e.t0), e.cy + e.my * Math.cos(e.t0) + vy * Math.sin(e.t0)];
        const t1 = e.t0 + sweep;
        const p1 = [e.cx + e.mx * Math.cos(t1) + vx * Math.sin(t1), e.cy + e.my * Math.cos(t1) + vy * Math.sin(t1)];
        return this.push(f, e, layer, [{
          kind: 'arc', x0: p0[0], y0: p0[1], x1: p1[0], y1: p1[1], cx: e.cx, cy: e.cy, ux: e.mx, uy: e.my, vx, vy,
          theta0: e.t0, sweep, span: e.span,
        }], false);
      }
      case 'lwpolyline':
        return this.addPolyline(e, layer, f, e.vertices, (e.flags & 1) !== 0, {
          kind: 'lwpolyline', flags: e.flags, flagsSpan: e.flagsSpan, countSpan: e.countSpan, insertFlagsAt: e.insertFlagsAt,
          vertexCount: e.vertices.length, lastVertexSpan: e.vertices[e.vertices.length - 1]?.span ?? e.span,
        });
      case 'polyline': {
        if ((e.flags & (16 | 64)) !== 0) return this.noteOther('POLYLINE (mesh)', f, e);
        // Spline frame control points (vertex flag 16) are not on the drawn curve (§6.4).
        const vertices = e.vertices.filter((v) => (v.flags & 16) === 0);
        if ((e.flags & 8) !== 0) {
          const z0 = vertices[0]?.z ?? 0;
          if (vertices.some((v) => v.z !== z0)) return this.outOfPlane(f, e, '3D polyline whose vertices lie at different heights');
          // A flat 3D polyline: vertices are WCS and have no bulges.
          return this.addPolyline({ ...e, nx: 0, ny: 0, nz: 1 }, layer, f, vertices.map((v) => ({ ...v, bulge: 0 })), (e.flags & 1) !== 0, undefined);
        }
        return this.addPolyline(e, layer, f, vertices, (e.flags & 1) !== 0, vertices.length === e.vertices.length ? {
          kind: 'polyline', flags: e.flags, flagsSpan: e.flagsSpan, insertFlagsAt: e.insertFlagsAt,
          vertexCount: vertices.length, lastVertexSpan: vertices[vertices.length - 1]?.span ?? e.span,
        } : undefined);
      }
      case 'spline': {
        const n = e.ctrl.length / 3;
        if (n === 0) {
          return this.malformed(f, e, e.fitCount > 0 ? 'SPLINE given by fit points only is not read (it has no control points)' : 'SPLINE has no control points');
        }
        const z0 = e.ctrl[2];
        for (let i = 1; i < n; i++) {
          if (e.ctrl[3 * i + 2] !== z0) return this.outOfPlane(f, e, 'control points lie at different heights');
        }
        const tolerance = SPLINE_FIT_TOLERANCE_MM / getMaxStretch(f.m);
        const r = getSplineSegments(e, tolerance, e.span);
        if (!r.ok) return this.malformed(f, e, r.detail);
        if (r.capped) this.malformed(f, e, `SPLINE could not be approximated within ${SPLINE_FIT_TOLERANCE_MM} mm; its figures are less accurate`);
        const closed = (e.flags & 1) !== 0 && samePoint(r.segments[0], r.segments[r.segments.length - 1]);
        // A clamped spline starts and ends at its first and last control points, so those can be moved.
        return this.push(f, e, layer, r.segments, closed, r.clamped ? { startEdit: 'first10', endEdit: 'last10' } : {});
      }
      case 'insert':
        return this.addInsert(e, layer, f);
      case 'other':
        return this.noteOther(e.type, f, e);
    }
  }

  private addPolyline(
    e: DxfEntity, layer: string, f: Frame, vertices: readonly (LwVertex | PolyVertex)[], closed: boolean, fix: PolylineFixInfo | undefined,
  ): void {
    const n = vertices.length;
    if (n < 2) return this.malformed(f, e, `${e.type} has ${n} vertex${n === 1 ? '' : 'es'}; at least 2 are needed`);
    if (!vertices.every((v) => Number.isFinite(v.x) && Number.isFinite(v.y) && Number.isFinite(v.bulge))) {
      return this.malformed(f, e, `${e.type} has a vertex value that is not a number`);
    }
    const g = this.getOcsFrame(f, e);
    if (!g) return;
    const segments: Segment[] = [];
    const count = closed ? n : n - 1;
    for (let i = 0; i < count; i++) {
      const a = vertices[i], b = vertices[(i + 1) % n];
      const span = i + 1 < n ? { start: a.span.start, end: b.span.end } : a.span;
      segments.push(getBulgeSegment(a.x, a.y, b.x, b.y, a.bulge, span));
    }
    this.push(g, e, layer, segments, closed, {
      startSpan: vertices[0].span,
      endSpan: vertices[n - 1].span,
      startEdit: 'first10',
      endEdit: 'first10',
      polyline: closed ? undefined : fix,
      unflaggedPolyline: !closed,
    });
  }

  private addInsert(e: DxfEntity & { kind: 'insert' }, layer: string, f: Frame): void {
    const values = [e.x, e.y, e.sx, e.sy, e.rotationDeg, e.columns, e.rows, e.columnSpacing, e.rowSpacing];
    if (!values.every(Number.isFinite)) return this.malformed(f, e, 'INSERT has a value that is not a number');
    const block = this.blocks.get(e.name);
    if (!block) return this.malformed(f, e, `INSERT refers to block "${e.name}", which is not defined`);
    if (f.blocks.includes(e.name) || f.depth >= MAX_INSERT_DEPTH) {
      return this.malformed(f, e, `block "${e.name}" inserts itself (directly or through other blocks)`);
    }
    const ocs = getOcsMap(e.nx, e.ny, e.nz);
    if (!ocs) return this.outOfPlane(f, e, `extrusion direction (${e.nx}, ${e.ny}, ${e.nz}) is not perpendicular to the drawing plane`);
    const columns = Math.max(1, Math.trunc(e.columns));
    const rows = Math.max(1, Math.trunc(e.rows));
    // Block point p → (p − base) → scale → rotate → + insertion point + rotated grid offset → OCS → WCS (§6.4).
    const rot = rotationDeg(e.rotationDeg);
    const local = compose(rot, compose(scaling(e.sx, e.sy), translation(-block.baseX, -block.baseY)));
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < columns; c++) {
        if (++this.instances > MAX_INSTANCES) {
          if (!this.instanceCapReported) this.malformed(f, e, `more than ${MAX_INSTANCES} block instances; the rest are not analysed`);
          this.instanceCapReported = true;
          return;
        }
        const offsetX = c * e.columnSpacing, offsetY = r * e.rowSpacing;
        const tx = e.x + rot.a * offsetX + rot.c * offsetY;
        const ty = e.y + rot.b * offsetX + rot.d * offsetY;
        const m = compose(f.m, compose(ocs, compose(translation(tx, ty), local)));
        const frame: Frame = {
          m, top: f.top, editable: false, depth: f.depth + 1, blocks: [...f.blocks, e.name],
        };
        for (const be of block.entities) {
          // Entities on layer 0 inside a block take the layer of the INSERT.
          const beLayer = be.layer === '0' ? layer : be.layer;
          if (be.paperSpace || this.skipLayer(beLayer, f.top.span)) continue;
          this.addEntity(be, beLayer, frame);
        }
      }
    }
  }
}

function samePoint(first: Segment, last: Segment): boolean {
  const [ex, ey] = getEnd(last);
  return first.x0 === ex && first.y0 === ey;
}

/** End point of a segment. */
function getEnd(s: Segment): [number, number] {
  switch (s.kind) {
    case 'line':
    case 'arc':
      return [s.x1, s.y1];
    case 'quad':
      return [s.x2, s.y2];
    case 'cubic':
      return [s.x3, s.y3];
  }
}
