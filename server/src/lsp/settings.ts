/**
 * The `loopwise.*` settings: sanitised from whatever the client sends, fetched per resource through
 * `workspace/configuration` when the client supports it, otherwise taken from the last
 * `workspace/didChangeConfiguration` payload (or the defaults).
 */
import type { Connection } from 'vscode-languageserver';
import { DEFAULT_OPTIONS } from '../engine/index';
import type { AnalysisOptions, AssumedUnit, SeveritySetting } from '../engine/index';

/** The part of the analysis options a user controls. */
export type LoopwiseSettings = Pick<AnalysisOptions, 'nearClosedToleranceMm' | 'assumedUnit' | 'ignoredLayers' | 'severity'>;

export const SETTINGS_SECTION = 'loopwise';

export const DEFAULT_SETTINGS: LoopwiseSettings = {
  nearClosedToleranceMm: DEFAULT_OPTIONS.nearClosedToleranceMm,
  assumedUnit: DEFAULT_OPTIONS.assumedUnit,
  ignoredLayers: DEFAULT_OPTIONS.ignoredLayers,
  severity: DEFAULT_OPTIONS.severity,
};

const ASSUMED_UNITS: readonly AssumedUnit[] = ['auto', 'mm', 'cm', 'in', 'pt', 'px'];
const SEVERITY_SETTINGS: readonly SeveritySetting[] = ['off', 'info', 'warning', 'error'];

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * Turns the raw `loopwise` section into settings. Values of the wrong type or out of range fall back
 * to the default one by one, so a typo in one setting never disables the others.
 */
export function toSettings(raw: unknown): LoopwiseSettings {
  if (!isRecord(raw)) return DEFAULT_SETTINGS;
  const tolerance = raw.nearClosedToleranceMm;
  const unit = raw.assumedUnit;
  const severity: Record<string, SeveritySetting> = {};
  if (isRecord(raw.severity)) {
    for (const [checkId, value] of Object.entries(raw.severity)) {
      if (SEVERITY_SETTINGS.includes(value as SeveritySetting)) severity[checkId] = value as SeveritySetting;
    }
  }
  return {
    nearClosedToleranceMm:
      typeof tolerance === 'number' && Number.isFinite(tolerance) && tolerance >= 0
        ? tolerance
        : DEFAULT_SETTINGS.nearClosedToleranceMm,
    assumedUnit: ASSUMED_UNITS.includes(unit as AssumedUnit) ? (unit as AssumedUnit) : DEFAULT_SETTINGS.assumedUnit,
    // Layer names: non-empty strings; anything else in the list is dropped.
    ignoredLayers: Array.isArray(raw.ignoredLayers)
      ? raw.ignoredLayers.filter((name): name is string => typeof name === 'string' && name.trim() !== '')
      : DEFAULT_SETTINGS.ignoredLayers,
    severity,
  };
}

/** Settings per resource, cached until the configuration changes. */
export class SettingsStore {
  private readonly perResource = new Map<string, Promise<LoopwiseSettings>>();
  private global: LoopwiseSettings = DEFAULT_SETTINGS;

  constructor(
    private readonly connection: Connection,
    /** True when the client answers `workspace/configuration`. */
    private readonly canPull: () => boolean,
  ) {}

  /** The settings that apply to `uri`; defaults when the client cannot be asked or does not answer. */
  get(uri: string): Promise<LoopwiseSettings> {
    if (!this.canPull()) return Promise.resolve(this.global);
    let pending = this.perResource.get(uri);
    if (!pending) {
      pending = this.connection.workspace.getConfiguration({ scopeUri: uri, section: SETTINGS_SECTION }).then(
        (raw: unknown) => toSettings(raw),
        (error: unknown) => {
          this.connection.console.error(`Loopwise: reading settings for ${uri} failed: ${String(error)}`);
          this.perResource.delete(uri);
          return DEFAULT_SETTINGS;
        },
      );
      this.perResource.set(uri, pending);
    }
    return pending;
  }

  /**
   * Forgets cached settings. `pushed` is the `settings` field of `didChangeConfiguration`; clients
   * that cannot be asked per resource send the whole configuration there.
   */
  reset(pushed?: unknown): void {
    this.perResource.clear();
    if (isRecord(pushed) && SETTINGS_SECTION in pushed) this.global = toSettings(pushed[SETTINGS_SECTION]);
  }

  /** Forgets one document's settings (when it closes). */
  forget(uri: string): void {
    this.perResource.delete(uri);
  }
}
