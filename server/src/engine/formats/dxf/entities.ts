/**
 * Turns the group stream of an ASCII DXF file into sections, header variables, layers, blocks and
 * entity records in file units, keeping the source positions needed for findings and quick fixes.
 * Group codes per entity: REFERENCES.md §6.4 (DXF Reference, ENTITIES section pages).
 *
 * Each entity's span runs from its `0` group's code line to the start of the next `0` group; a
 * POLYLINE's span runs through its VERTEX entities to the end of its SEQEND.
 */
import type { RawFinding, SourceSpan } from '../../types';
import { GroupScanner } from './groups';
import { keepShape } from '../../keepShape';

/** Value spans of the x and y groups of one point (for edits that move the point). */
export interface PointRef {
  readonly xs: number; readonly xe: number;
  readonly ys: number; readonly ye: number;
}

/**
 * Which point's groups in an entity's (or vertex's) text: the first 10/20 pair, the last one, or the
 * first 11/21 pair (a LINE's end). Pieces keep this instead of value spans, and a fix looks them up.
 */
export type PointGroups = 'first10' | 'last10' | 'first11';

/** The value spans of the point `which` names inside `span`, or undefined when its x or y group is missing. */
export function findPointRef(text: string, span: SourceSpan, which: PointGroups): PointRef | undefined {
  const xCode = which === 'first11' ? 11 : 10;
  const sc = new GroupScanner(text, span.start);
  let found: PointRef | undefined;
  let x: { s: number; e: number } | undefined;
  while (sc.offset < span.end && sc.next()) {
    if (sc.code === xCode) {
      x = { s: sc.valueStart, e: sc.valueEnd };
    } else if (sc.code === xCode + 10 && x) {
      found = { xs: x.s, xe: x.e, ys: sc.valueStart, ye: sc.valueEnd };
      x = undefined;
      if (which !== 'last10') return found;
    }
  }
  return found;
}

export interface EntityBase {
  /** Entity type as written (`LINE`, `LWPOLYLINE`, …). */
  readonly type: string;
  readonly span: SourceSpan;
  /** 0-based line of the entity's `0` group. */
  readonly line: number;
  readonly layer: string;
  /** Where the handle (group 5) is written: the handle is the trimmed text of this span. */
  readonly handleSpan?: SourceSpan;
  /** Group 67 = 1: the entity belongs to a paper-space layout. */
  readonly paperSpace: boolean;
  /** Extrusion direction (210/220/230), default (0, 0, 1). */
  readonly nx: number; readonly ny: number; readonly nz: number;
  /** Hash of the entity's groups except handles and owners, for exact-duplicate detection. */
  readonly hash: number;
}

export interface LwVertex {
  readonly x: number; readonly y: number; readonly bulge: number;
  /** From the vertex's 10 code line to the end of its last vertex group (40/41/42/91). */
  readonly span: SourceSpan;
}

export interface PolyVertex {
  readonly x: number; readonly y: number; readonly z: number; readonly bulge: number; readonly flags: number;
  /** The VERTEX entity. */
  readonly span: SourceSpan;
}

export type DxfEntity = EntityBase & (
  | { readonly kind: 'line'; readonly x0: number; readonly y0: number; readonly z0: number; readonly x1: number; readonly y1: number; readonly z1: number }
  | { readonly kind: 'circle'; readonly cx: number; readonly cy: number; readonly cz: number; readonly r: number }
  | { readonly kind: 'arc'; readonly cx: number; readonly cy: number; readonly cz: number; readonly r: number; readonly startDeg: number; readonly endDeg: number }
  | { readonly kind: 'ellipse'; readonly cx: number; readonly cy: number; readonly cz: number; readonly mx: number; readonly my: number; readonly mz: number; readonly ratio: number; readonly t0: number; readonly t1: number }
  | { readonly kind: 'lwpolyline'; readonly flags: number; readonly flagsSpan?: SourceSpan; readonly countSpan?: SourceSpan; readonly insertFlagsAt: number; readonly elevation: number; readonly vertices: readonly LwVertex[] }
  | { readonly kind: 'polyline'; readonly flags: number; readonly flagsSpan?: SourceSpan; readonly insertFlagsAt: number; readonly elevation: number; readonly vertices: readonly PolyVertex[] }
  | { readonly kind: 'spline'; readonly flags: number; readonly degree: number; readonly knots: readonly number[]; readonly weights: readonly number[]; readonly ctrl: readonly number[]; readonly fitCount: number }
  | { readonly kind: 'insert'; readonly name: string; readonly x: number; readonly y: number; readonly z: number; readonly sx: number; readonly sy: number; readonly sz: number; readonly rotationDeg: number; readonly columns: number; readonly rows: number; readonly columnSpacing: number; readonly rowSpacing: number }
  | { readonly kind: 'other' }
);

export interface LayerInfo {
  readonly name: string;
  readonly flags: number;
  readonly colour: number;
  /** The LAYER table entry. */
  readonly span: SourceSpan;
}

export interface BlockDef {
  readonly name: string;
  readonly baseX: number; readonly baseY: number;
  readonly span: SourceSpan;
  readonly entities: readonly DxfEntity[];
}

/** What is known of a document when its first ENTITIES entity is read (all of it, in a file in section order). */
export type DocumentSoFar = Pick<DxfDocument, 'insunits' | 'headerSpan' | 'layers' | 'blocks'>;

/**
 * Receives each entity of the ENTITIES section as soon as it is read, instead of collecting them:
 * LINE, ARC and CIRCLE as numbers in one reused `SimpleEntity` (no object per entity), the others as
 * records, which then die young. A million-entity file's memory and garbage collection stay low.
 */
export interface EntitySink {
  entity(e: DxfEntity, doc: DocumentSoFar): void;
  /** A LINE, ARC or CIRCLE; `e` is overwritten by the next entity, so only numbers and names may be kept. */
  simple(e: SimpleEntity, doc: DocumentSoFar): void;
}

export interface DxfDocument {
  /** $INSUNITS value and the span of its header variable, when present. */
  readonly insunits?: { readonly value: number; readonly span: SourceSpan };
  /** The HEADER section's `0 SECTION` line pair, when present. */
  readonly headerSpan?: SourceSpan;
  readonly layers: ReadonlyMap<string, LayerInfo>;
  readonly blocks: ReadonlyMap<string, BlockDef>;
  /** Entities of the ENTITIES section, in file order (empty when they went to an EntitySink). */
  readonly entities: readonly DxfEntity[];
  /**
   * A HEADER, TABLES or BLOCKS section came after the ENTITIES section (against the DXF section
   * order): entities passed to a sink were read before all units, layers or blocks were known.
   */
  readonly lateSections: boolean;
  readonly problems: readonly RawFinding[];
  /** Line end used by the file. */
  readonly eol: string;
}

/** Group codes left out of the duplicate hash: handle, owner and reactor/dictionary references. */
function isIdentityCode(code: number): boolean {
  return code === 5 || code === 330 || code === 360 || code === 102;
}

/** The groups of one entity, as parallel arrays (reused between entities). */
class GroupBuffer {
  codes: number[] = [];
  nums: number[] = [];
  vs: number[] = [];
  ve: number[] = [];
  cs: number[] = [];
  /** End of each pair (after the value line's line end). */
  pe: number[] = [];
  length = 0;

  reset(): void {
    this.length = 0;
  }

  /** Drops the groups read (the arrays keep their element kinds). */
  release(): void {
    this.length = this.codes.length = this.nums.length = this.vs.length = this.ve.length = this.cs.length = this.pe.length = 0;
  }

  push(sc: GroupScanner): void {
    const i = this.length++;
    this.codes[i] = sc.code;
    this.nums[i] = sc.number;
    this.vs[i] = sc.valueStart;
    this.ve[i] = sc.valueEnd;
    this.cs[i] = sc.codeStart;
    this.pe[i] = sc.pairEnd;
  }
}

/**
 * The entity record: base fields written out, then the kind's fields. (Spreading `base` into each
 * literal made V8 build slow objects: 10× slower reading in the benchmark.)
 */
function withBase<const T extends object>(b: EntityBase, extra: T): EntityBase & T {
  const o: EntityBase = {
    type: b.type, span: b.span, line: b.line, layer: b.layer, handleSpan: b.handleSpan, paperSpace: b.paperSpace,
    nx: b.nx, ny: b.ny, nz: b.nz, hash: b.hash,
  };
  return Object.assign(o, extra);
}

/** Bit view of one double, for hashing converted numbers. */
const NUMBER_BITS = new Float64Array(1);
const NUMBER_WORDS = new Int32Array(NUMBER_BITS.buffer);

/**
 * Continues hash `h` with the 64 bits of a number (equal values, equal hashes) by two murmur3 block
 * steps: the rotations carry the high bits (all that small integers set) into the low ones.
 */
function hashNumber(h: number, v: number): number {
  NUMBER_BITS[0] = v;
  for (let w = 0; w < 2; w++) {
    let k = Math.imul(NUMBER_WORDS[w], 0xcc9e2d51);
    k = Math.imul((k << 15) | (k >>> 17), 0x1b873593);
    h ^= k;
    h = (Math.imul((h << 13) | (h >>> 19), 5) + 0xe6546b64) | 0;
  }
  return h >>> 0;
}

/** murmur3's finaliser: every input bit reaches the low bits that a power-of-two table keeps. */
function mixHash(h: number): number {
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

/** 32-bit FNV-1a over a string range, continuing from `h`. */
function hashRange(h: number, text: string, start: number, end: number): number {
  for (let i = start; i < end; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** Entity types read into numbers (`SimpleEntity`) rather than into a group buffer. */
export type SimpleKind = 'line' | 'arc' | 'circle';

/**
 * The entity being read, in numbers and names: the base fields of every entity, gathered group by
 * group, and for a LINE, ARC or CIRCLE its values too. One object serves every entity in turn: the
 * sink's fast path reads it without a record per entity; `toEntity` makes the record when one is kept.
 */
export class SimpleEntity {
  kind: SimpleKind = 'line';
  type = '';
  /** The entity's span. */
  start = 0;
  end = 0;
  /** 0-based line of the entity's `0` group. */
  line = 0;
  layer = '0';
  /** Where the handle is written, −1 for none: the handle is the trimmed text of [handleStart, handleEnd). */
  handleStart = -1;
  handleEnd = -1;
  paperSpace = false;
  nx = 0;
  ny = 0;
  nz = 1;
  hash = 0;
  /** LINE: x0, y0, z0, x1, y1, z1; ARC and CIRCLE: cx, cy, cz, r, start and end angle (degrees). */
  readonly values = new Float64Array(6);

  getSpan(): SourceSpan {
    return { start: this.start, end: this.end };
  }

  /** The entity's record, as `parseDxfDocument` lists it (a LINE, ARC or CIRCLE). */
  toEntity(): DxfEntity {
    const v = this.values;
    const base: EntityBase = {
      type: this.type, span: this.getSpan(), line: this.line, layer: this.layer,
      handleSpan: this.handleStart >= 0 ? { start: this.handleStart, end: this.handleEnd } : undefined,
      paperSpace: this.paperSpace, nx: this.nx, ny: this.ny, nz: this.nz, hash: this.hash,
    };
    if (this.kind === 'line') return withBase(base, { kind: 'line', x0: v[0], y0: v[1], z0: v[2], x1: v[3], y1: v[4], z1: v[5] });
    if (this.kind === 'circle') return withBase(base, { kind: 'circle', cx: v[0], cy: v[1], cz: v[2], r: v[3] });
    return withBase(base, { kind: 'arc', cx: v[0], cy: v[1], cz: v[2], r: v[3], startDeg: v[4], endDeg: v[5] });
  }
}

/** `v`, or `fallback` when it is NaN (a value that was not a number, already reported). */
function orElse(v: number, fallback: number): number {
  return Number.isNaN(v) ? fallback : v;
}

class DocumentBuilder {
  readonly text: string;
  readonly sc: GroupScanner;
  readonly buf = new GroupBuffer();
  readonly layers = new Map<string, LayerInfo>();
  readonly blocks = new Map<string, BlockDef>();
  readonly entities: DxfEntity[] = [];
  insunits?: { value: number; span: SourceSpan };
  headerSpan?: SourceSpan;
  lateSections = false;
  private entitiesSeen = false;
  /** Where entities go: the ENTITIES list or the block being defined. */
  private target: DxfEntity[] | null = null;
  private block: { name: string; baseX: number; baseY: number; start: number; entities: DxfEntity[] } | null = null;
  private polyline: { header: DxfEntity & { kind: 'other' }; flags: number; flagsSpan?: SourceSpan; insertFlagsAt: number; elevation: number; vertices: PolyVertex[]; hash: number } | null = null;
  /** The entity being read, if any; its kind's values go to `current.values` (simple) or to `buf`. */
  private readonly current: SimpleEntity = new SimpleEntity();
  private inEntity = false;
  private simple = false;
  /** The running hash of the entity's groups (finished into `current.hash`). */
  private hash = 0;
  /** Scanner problems before the entity began: more at its end means it is malformed. */
  private problemsBefore = 0;

  constructor(text: string, private readonly sink?: EntitySink) {
    this.text = text;
    this.sc = new GroupScanner(text);
    keepShape(this);
  }

  /** Adds an entity to the current target: the sink when streaming the ENTITIES section. */
  private emit(e: DxfEntity): void {
    if (this.sink && this.target === this.entities) this.sink.entity(e, this);
    else this.target?.push(e);
  }

  report(span: SourceSpan, detail: string): void {
    this.sc.report(span, detail);
  }

  run(): void {
    const sc = this.sc;
    let section: string | null = null;
    let headerVar: { name: string; start: number } | null = null;
    let layer: { start: number; name: string; flags: number; colour: number } | null = null;
    const finishLayer = (end: number) => {
      if (layer && layer.name !== '') this.layers.set(layer.name, { name: layer.name, flags: layer.flags, colour: layer.colour, span: { start: layer.start, end } });
      layer = null;
    };
    let expectSectionName = false;
    while (sc.next()) {
      if (sc.code === 0) {
        if (this.inEntity) this.finishEntity(sc.codeStart);
        finishLayer(sc.codeStart);
        const name = sc.name;
        if (name === 'SECTION') {
          expectSectionName = true;
          section = null;
          this.target = null;
          if (this.polyline) this.flushPolyline(sc.codeStart, true);
          continue;
        }
        if (name === 'ENDSEC') {
          if (this.polyline) this.flushPolyline(sc.codeStart, true);
          section = null;
          this.target = null;
          continue;
        }
        if (name === 'EOF') break;
        if (section === 'ENTITIES' || section === 'BLOCKS') {
          this.startEntity(name);
        } else if (section === 'TABLES' && name === 'LAYER') {
          layer = { start: sc.codeStart, name: '', flags: 0, colour: 7 };
        }
        continue;
      }
      if (expectSectionName) {
        expectSectionName = false;
        if (sc.code === 2) {
          section = sc.name;
          if (this.entitiesSeen && (section === 'HEADER' || section === 'TABLES' || section === 'BLOCKS')) this.lateSections = true;
          if (section === 'ENTITIES') {
            this.target = this.entities;
            this.entitiesSeen = true;
          }
          if (section === 'HEADER') this.headerSpan = { start: sc.codeStart, end: sc.valueEnd };
          continue;
        }
      }
      if (this.inEntity) {
        this.addGroup();
      } else if (layer) {
        if (sc.code === 2) layer.name = sc.name;
        else if (sc.code === 70 && Number.isFinite(sc.number)) layer.flags = sc.number;
        else if (sc.code === 62 && Number.isFinite(sc.number)) layer.colour = sc.number;
      } else if (section === 'HEADER') {
        if (sc.code === 9) headerVar = { name: sc.name, start: sc.codeStart };
        else if (headerVar?.name === '$INSUNITS' && sc.code === 70) {
          this.insunits = { value: sc.number, span: { start: headerVar.start, end: sc.valueEnd } };
        }
      }
    }
    const end = this.text.length;
    if (this.inEntity) this.finishEntity(end);
    finishLayer(end);
    if (this.polyline) this.flushPolyline(end, true);
  }

  /** Begins an entity of `type` at the scanner's `0` group. */
  private startEntity(type: string): void {
    const e = this.current;
    e.type = type;
    e.start = this.sc.codeStart;
    e.line = this.sc.codeLine;
    e.layer = '0';
    e.handleStart = -1;
    e.handleEnd = -1;
    e.paperSpace = false;
    e.nx = 0;
    e.ny = 0;
    e.nz = 1;
    this.inEntity = true;
    this.problemsBefore = this.sc.problems.length;
    this.hash = hashRange(0x811c9dc5, type, 0, type.length);
    this.simple = type === 'LINE' || type === 'ARC' || type === 'CIRCLE';
    if (this.simple) {
      e.kind = type === 'LINE' ? 'line' : type === 'ARC' ? 'arc' : 'circle';
      // Defaults of absent groups: 0 for coordinates and radius, an ARC from 0° to 360°.
      e.values.fill(0);
      if (e.kind !== 'line') e.values[5] = 360;
    } else {
      this.buf.reset();
    }
  }

  /** Takes the scanner's group into the entity being read. */
  private addGroup(): void {
    const sc = this.sc;
    const e = this.current;
    const c = sc.code;
    const v = sc.number;
    if (c === 8) e.layer = this.getLayerName();
    else if (c === 5) {
      e.handleStart = sc.valueStart;
      e.handleEnd = sc.valueEnd;
    } else if (c === 67) e.paperSpace = v === 1;
    else if (c === 210) e.nx = orElse(v, 0);
    else if (c === 220) e.ny = orElse(v, 0);
    else if (c === 230) e.nz = orElse(v, 1);
    if (!isIdentityCode(c)) {
      const h = Math.imul(this.hash ^ c, 0x01000193) >>> 0;
      // Numbers hash by value (equal text gives equal values); the exact text is compared on a hit.
      this.hash = Number.isNaN(v) ? hashRange(h, this.text, sc.valueStart, sc.valueEnd) : hashNumber(h, v);
    }
    if (!this.simple) {
      this.buf.push(sc);
      return;
    }
    // A value that is not a number: NaN for a coordinate, radius or angle (reported), 0 for a z.
    const values = e.values;
    if (e.kind === 'line') {
      switch (c) {
        case 10: values[0] = v; break;
        case 20: values[1] = v; break;
        case 30: values[2] = orElse(v, 0); break;
        case 11: values[3] = v; break;
        case 21: values[4] = v; break;
        case 31: values[5] = orElse(v, 0); break;
      }
    } else {
      switch (c) {
        case 10: values[0] = v; break;
        case 20: values[1] = v; break;
        case 30: values[2] = orElse(v, 0); break;
        case 40: values[3] = v; break;
        case 50: values[4] = v; break;
        case 51: values[5] = v; break;
      }
    }
  }

  private num(i: number, fallback: number): number {
    const v = this.buf.nums[i];
    return v === undefined || Number.isNaN(v) ? fallback : v;
  }

  /** The last layer name read: entities mostly come in runs on one layer, so its string is reused. */
  private lastLayer = '0';

  /** The scanner's value as a layer name. */
  private getLayerName(): string {
    const text = this.text;
    let vs = this.sc.valueStart;
    const ve = this.sc.valueEnd;
    while (vs < ve && (text.charCodeAt(vs) === 32 || text.charCodeAt(vs) === 9)) vs++;
    const last = this.lastLayer;
    if (ve - vs !== last.length || !text.startsWith(last, vs)) this.lastLayer = text.slice(vs, ve);
    return this.lastLayer;
  }

  private str(i: number): string {
    return this.text.slice(this.buf.vs[i], this.buf.ve[i]).trim();
  }

  private finishEntity(end: number): void {
    this.inEntity = false;
    const e = this.current;
    const { type, start } = e;
    // An entity with a malformed group (already reported at its line) is left out: its values are unreliable.
    if (this.sc.problems.length > this.problemsBefore && type !== 'SEQEND' && type !== 'ENDBLK') return;
    e.end = end;
    const hash = mixHash(this.hash);
    e.hash = hash;
    if (this.simple) {
      if (this.polyline) this.flushPolyline(start, true);
      if (!this.target) return;
      if (this.sink && this.target === this.entities) this.sink.simple(e, this);
      else this.target.push(e.toEntity());
      return;
    }
    const b = this.buf;
    const span = { start, end };
    const base: EntityBase = {
      type, span, line: e.line, layer: e.layer, handleSpan: e.handleStart >= 0 ? { start: e.handleStart, end: e.handleEnd } : undefined,
      paperSpace: e.paperSpace, nx: e.nx, ny: e.ny, nz: e.nz, hash,
    };

    // Block definitions and the POLYLINE … VERTEX … SEQEND sequence.
    if (type === 'BLOCK') {
      if (this.polyline) this.flushPolyline(start, true);
      let name = '';
      let bx = 0, by = 0;
      for (let i = 0; i < b.length; i++) {
        if (b.codes[i] === 2) name = this.str(i);
        else if (b.codes[i] === 10) bx = this.num(i, 0);
        else if (b.codes[i] === 20) by = this.num(i, 0);
      }
      this.block = { name, baseX: bx, baseY: by, start, entities: [] };
      this.target = this.block.entities;
      return;
    }
    if (type === 'ENDBLK') {
      if (this.polyline) this.flushPolyline(start, true);
      if (this.block) {
        const bl = this.block;
        this.blocks.set(bl.name, { name: bl.name, baseX: bl.baseX, baseY: bl.baseY, span: { start: bl.start, end }, entities: bl.entities });
      }
      this.block = null;
      this.target = null;
      return;
    }
    if (type === 'VERTEX' && this.polyline) {
      const p = this.polyline;
      let x = 0, y = 0, z = 0, bulge = 0, flags = 0;
      for (let i = 0; i < b.length; i++) {
        const c = b.codes[i];
        if (c === 10) x = this.num(i, Number.NaN);
        else if (c === 20) y = this.num(i, Number.NaN);
        else if (c === 30) z = this.num(i, 0);
        else if (c === 42) bulge = this.num(i, 0);
        else if (c === 70) flags = this.num(i, 0);
      }
      p.vertices.push({ x, y, z, bulge, flags, span });
      p.hash = Math.imul(p.hash ^ hash, 0x01000193) >>> 0;
      return;
    }
    if (type === 'SEQEND' && this.polyline) {
      this.flushPolyline(end, false);
      return;
    }
    if (this.polyline) this.flushPolyline(start, true);
    if (!this.target) return;

    const entity = this.buildEntity(base, type);
    if (entity === 'polyline') return;
    this.emit(entity);
  }

  /** Ends the open POLYLINE at `end`; `missingSeqend` reports a sequence cut short. */
  private flushPolyline(end: number, missingSeqend: boolean): void {
    const p = this.polyline;
    if (!p) return;
    this.polyline = null;
    if (missingSeqend) this.report({ start: p.header.span.start, end: p.header.span.end }, 'POLYLINE has no SEQEND after its vertices');
    const span = { start: p.header.span.start, end };
    this.emit(withBase({ ...p.header, span, hash: p.hash }, {
      kind: 'polyline', flags: p.flags, flagsSpan: p.flagsSpan, insertFlagsAt: p.insertFlagsAt, elevation: p.elevation, vertices: p.vertices,
    }));
  }

  private buildEntity(base: Omit<EntityBase, never>, type: string): DxfEntity | 'polyline' {
    const b = this.buf;
    const n = b.length;
    switch (type) {
      case 'ELLIPSE': {
        let cx = 0, cy = 0, cz = 0, mx = 0, my = 0, mz = 0, ratio = 1, t0 = 0, t1 = 2 * Math.PI;
        for (let i = 0; i < n; i++) {
          switch (b.codes[i]) {
            case 10: cx = this.num(i, Number.NaN); break;
            case 20: cy = this.num(i, Number.NaN); break;
            case 30: cz = this.num(i, 0); break;
            case 11: mx = this.num(i, Number.NaN); break;
            case 21: my = this.num(i, Number.NaN); break;
            case 31: mz = this.num(i, 0); break;
            case 40: ratio = this.num(i, Number.NaN); break;
            case 41: t0 = this.num(i, Number.NaN); break;
            case 42: t1 = this.num(i, Number.NaN); break;
          }
        }
        return withBase(base, { kind: 'ellipse', cx, cy, cz, mx, my, mz, ratio, t0, t1 });
      }
      case 'LWPOLYLINE': {
        let flags = 0, elevation = 0;
        let flagsSpan: SourceSpan | undefined;
        let countSpan: SourceSpan | undefined;
        let insertFlagsAt = -1;
        const vertices: LwVertex[] = [];
        let v: { x: number; y: number; bulge: number; start: number; end: number } | null = null;
        const pushVertex = () => {
          if (v) vertices.push({ x: v.x, y: v.y, bulge: v.bulge, span: { start: v.start, end: v.end } });
          v = null;
        };
        for (let i = 0; i < n; i++) {
          const c = b.codes[i];
          if (c === 10) {
            pushVertex();
            if (insertFlagsAt < 0) insertFlagsAt = b.cs[i];
            v = { x: this.num(i, Number.NaN), y: Number.NaN, bulge: 0, start: b.cs[i], end: b.pe[i] };
          } else if (v && (c === 20 || c === 40 || c === 41 || c === 42 || c === 91)) {
            if (c === 20) v.y = this.num(i, Number.NaN);
            else if (c === 42) v.bulge = this.num(i, 0);
            v.end = b.pe[i];
          } else {
            pushVertex();
            if (c === 70) { flags = this.num(i, 0); flagsSpan = { start: b.vs[i], end: b.ve[i] }; }
            else if (c === 90) countSpan = { start: b.vs[i], end: b.ve[i] };
            else if (c === 38) elevation = this.num(i, 0);
          }
        }
        pushVertex();
        if (insertFlagsAt < 0) insertFlagsAt = base.span.end;
        return withBase(base, { kind: 'lwpolyline', flags, flagsSpan, countSpan, insertFlagsAt, elevation, vertices });
      }
      case 'POLYLINE': {
        let flags = 0, elevation = 0;
        let flagsSpan: SourceSpan | undefined;
        for (let i = 0; i < n; i++) {
          if (b.codes[i] === 70) { flags = this.num(i, 0); flagsSpan = { start: b.vs[i], end: b.ve[i] }; }
          else if (b.codes[i] === 30) elevation = this.num(i, 0);
        }
        this.polyline = {
          header: withBase(base, { kind: 'other' }), flags, flagsSpan, insertFlagsAt: base.span.end, elevation, vertices: [], hash: base.hash,
        };
        return 'polyline';
      }
      case 'SPLINE': {
        let flags = 0, degree = 3, fitCount = 0;
        const knots: number[] = [];
        const weights: number[] = [];
        const ctrl: number[] = [];
        for (let i = 0; i < n; i++) {
          switch (b.codes[i]) {
            case 70: flags = this.num(i, 0); break;
            case 71: degree = this.num(i, Number.NaN); break;
            case 74: fitCount = this.num(i, 0); break;
            case 40: knots.push(this.num(i, Number.NaN)); break;
            case 41: weights.push(this.num(i, Number.NaN)); break;
            case 10:
              ctrl.push(this.num(i, Number.NaN), 0, 0);
              break;
            case 20:
              if (ctrl.length > 0) ctrl[ctrl.length - 2] = this.num(i, Number.NaN);
              break;
            case 30:
              if (ctrl.length > 0) ctrl[ctrl.length - 1] = this.num(i, 0);
              break;
          }
        }
        return withBase(base, { kind: 'spline', flags, degree, knots, weights, ctrl, fitCount });
      }
      case 'INSERT': {
        let name = '', x = 0, y = 0, z = 0, sx = 1, sy = 1, sz = 1, rot = 0, columns = 1, rows = 1, colSp = 0, rowSp = 0;
        for (let i = 0; i < n; i++) {
          switch (b.codes[i]) {
            case 2: name = this.str(i); break;
            case 10: x = this.num(i, Number.NaN); break;
            case 20: y = this.num(i, Number.NaN); break;
            case 30: z = this.num(i, 0); break;
            case 41: sx = this.num(i, Number.NaN); break;
            case 42: sy = this.num(i, Number.NaN); break;
            case 43: sz = this.num(i, Number.NaN); break;
            case 50: rot = this.num(i, Number.NaN); break;
            case 70: columns = this.num(i, 1); break;
            case 71: rows = this.num(i, 1); break;
            case 44: colSp = this.num(i, 0); break;
            case 45: rowSp = this.num(i, 0); break;
          }
        }
        return withBase(base, { kind: 'insert', name, x, y, z, sx, sy, sz, rotationDeg: rot, columns, rows, columnSpacing: colSp, rowSpacing: rowSp });
      }
      default:
        return withBase(base, { kind: 'other' });
    }
  }
}

/**
 * Empties what a document holds (layers, blocks, entities, problems) once its reader is done with it:
 * the latest document builder, whose containers these are, is kept for its layout (keepShape.ts), not
 * for the file's data.
 */
export function releaseDxfDocument(doc: DxfDocument): void {
  (doc.layers as Map<string, LayerInfo>).clear();
  (doc.blocks as Map<string, BlockDef>).clear();
  (doc.entities as DxfEntity[]).length = 0;
  (doc.problems as RawFinding[]).length = 0;
}

/**
 * Reads the sections, header, layers, blocks and entities of an ASCII DXF text. Never throws. With a
 * sink, ENTITIES-section entities go to it as they are read instead of into `entities`.
 */
export function parseDxfDocument(text: string, sink?: EntitySink): DxfDocument {
  const d = new DocumentBuilder(text, sink);
  d.run();
  d.buf.release();
  return {
    insunits: d.insunits,
    headerSpan: d.headerSpan,
    layers: d.layers,
    blocks: d.blocks,
    entities: d.entities,
    lateSections: d.lateSections,
    problems: d.sc.problems,
    eol: d.sc.eol,
  };
}
