import type { MapSetup } from '../setup/mapSetup.js';
import { canonicalJson, setupFingerprint } from '../setup/fingerprint.js';
import type { PngTextEntry } from './pngTextChunks.js';
import { xmlEscape, xmlUnescape } from './xmlEscape.js';

/** The model caveat every exported figure and data file carries. */
export const MODEL_CAVEAT = 'model estimates; adiabatic single-orbital approximation; see methods note';

/** What a figure file records about its origin. */
export interface FigureMetadata {
  /** The setup as canonical JSON (object keys sorted), so equal setups give equal text. */
  setupJson: string;
  setupFingerprint: string;
  engineVersion: string;
  /** Creation date as given by the caller (ISO 8601 recommended); the engine has no clock. */
  date: string;
  title: string;
}

/**
 * The metadata of a figure of `setup` (pure: the date comes from the caller).
 *
 * @example
 * figureMetadata(setup, { engineVersion: '0.1.0', date: '2026-12-02T01:00:00Z', title: 'Cs, laboratory' }).setupFingerprint // '…16 hex digits…'
 */
export function figureMetadata(setup: MapSetup, p: { engineVersion: string; date: string; title: string }): FigureMetadata {
  return { setupJson: canonicalJson(setup), setupFingerprint: setupFingerprint(setup), engineVersion: p.engineVersion, date: p.date, title: p.title };
}

/** XML namespace of the figure record inside SVG `<metadata>` (a URN: it names, it does not resolve). */
export const FIGURE_XML_NAMESPACE = 'urn:fieldbound:figure:1';

/**
 * An SVG `<metadata>` element carrying the figure's origin: a `fb:figure` element in our own namespace
 * with the engine version, fingerprint, date and title as attributes and the setup's canonical JSON as
 * its text, XML-escaped. Insert it as the first child of the root `<svg>`.
 *
 * @example
 * svgMetadataElement(meta) // '<metadata><fb:figure xmlns:fb="urn:fieldbound:figure:1" engine-version="0.1.0" …>{&quot;alphaAxis&quot;…}</fb:figure></metadata>'
 */
export function svgMetadataElement(meta: FigureMetadata): string {
  const attr = (name: string, value: string) => ` ${name}="${xmlEscape(value)}"`;
  return (
    `<metadata><fb:figure xmlns:fb="${FIGURE_XML_NAMESPACE}"` +
    attr('engine-version', meta.engineVersion) +
    attr('setup-fingerprint', meta.setupFingerprint) +
    attr('date', meta.date) +
    attr('title', meta.title) +
    `><fb:setup>${xmlEscape(meta.setupJson)}</fb:setup></fb:figure></metadata>`
  );
}

/**
 * Reads back the record written by `svgMetadataElement` from SVG text (null when there is none).
 * A string reader for our own element only, not a general XML parser.
 */
export function readSvgFigureMetadata(svgText: string): FigureMetadata | null {
  const m = /<fb:figure\b([^>]*)>\s*<fb:setup>([\s\S]*?)<\/fb:setup>/.exec(svgText);
  if (!m) return null;
  const attrs = new Map<string, string>();
  for (const a of m[1].matchAll(/([\w:-]+)="([^"]*)"/g)) attrs.set(a[1], xmlUnescape(a[2]));
  return {
    setupJson: xmlUnescape(m[2]),
    setupFingerprint: attrs.get('setup-fingerprint') ?? '',
    engineVersion: attrs.get('engine-version') ?? '',
    date: attrs.get('date') ?? '',
    title: attrs.get('title') ?? '',
  };
}

/** PNG keywords of the figure record (the first four are predefined by the PNG specification). */
export const PNG_KEYWORDS = {
  title: 'Title',
  software: 'Software',
  creationTime: 'Creation Time',
  description: 'Description',
  setup: 'Fieldbound setup',
  fingerprint: 'Fieldbound setup fingerprint',
  engineVersion: 'Fieldbound engine version',
} as const;

/** The PNG text entries of a figure record (insert with `insertPngTextChunks`). */
export function pngFigureEntries(meta: FigureMetadata): PngTextEntry[] {
  return [
    { keyword: PNG_KEYWORDS.title, text: meta.title },
    { keyword: PNG_KEYWORDS.software, text: `Fieldbound engine ${meta.engineVersion}` },
    { keyword: PNG_KEYWORDS.creationTime, text: meta.date },
    { keyword: PNG_KEYWORDS.description, text: MODEL_CAVEAT },
    { keyword: PNG_KEYWORDS.engineVersion, text: meta.engineVersion },
    { keyword: PNG_KEYWORDS.fingerprint, text: meta.setupFingerprint },
    { keyword: PNG_KEYWORDS.setup, text: meta.setupJson },
  ];
}

/** Reads a figure record back from PNG text entries (null when the setup entry is missing). */
export function figureMetadataFromPngEntries(entries: readonly PngTextEntry[]): FigureMetadata | null {
  const get = (k: string) => entries.find((e) => e.keyword === k)?.text;
  const setupJson = get(PNG_KEYWORDS.setup);
  if (setupJson === undefined) return null;
  return {
    setupJson,
    setupFingerprint: get(PNG_KEYWORDS.fingerprint) ?? '',
    engineVersion: get(PNG_KEYWORDS.engineVersion) ?? '',
    date: get(PNG_KEYWORDS.creationTime) ?? '',
    title: get(PNG_KEYWORDS.title) ?? '',
  };
}
