/**
 * Custom messages between the Loopwise client and server, typed once here. The client imports this
 * module through the bundler (esbuild resolves it into dist/client.js), so both ends share one
 * definition of each method name and payload.
 */
import { RequestType } from 'vscode-languageserver-protocol';

/** Parameters of `loopwise/reanalyze`: no options yet; an object so fields can be added without breaking clients. */
export type ReanalyzeParams = Record<string, never>;

/** What `loopwise/reanalyze` reports once every open file has been analysed again. */
export interface ReanalyzeResult {
  /** Open documents Loopwise reads (SVG, DXF) that were analysed again. */
  readonly documents: number;
  /** Problems found in them, after the user's severity settings. */
  readonly findings: number;
}

/** Drops cached models and settings, re-reads the settings and analyses every open document again. */
export const ReanalyzeRequest = new RequestType<ReanalyzeParams, ReanalyzeResult, void>('loopwise/reanalyze');
