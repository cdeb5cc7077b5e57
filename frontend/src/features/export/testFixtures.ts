import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { inflateSync } from 'node:zlib';

const require = createRequire(import.meta.url);
const fontDir = dirname(require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff'));

/** Test font loader: maps the bundler's font URL to the file in node_modules. */
export const loadFontFromDisk = async (url: string): Promise<Uint8Array> => new Uint8Array(readFileSync(join(fontDir, url.split('/').pop()!.split('?')[0])));
export const inflateNode = async (z: Uint8Array): Promise<Uint8Array> => new Uint8Array(inflateSync(z));

const SVG_NS = 'http://www.w3.org/2000/svg';

/** A small stand-in for the map view's SVG: a plot, axis label, species, a pin layer, a crosshair and the overlay. */
export function mapViewSvg(): SVGSVGElement {
  const host = document.createElement('div');
  host.innerHTML = `<svg xmlns="${SVG_NS}" width="400" height="300" style="display:block"><defs><clipPath id="plot-1"><rect width="300" height="220"/></clipPath></defs>
<g transform="translate(70,20)"><rect width="300" height="220" fill="#f6f5f1"/><g clip-path="url(#plot-1)"><path class="region region-bound" d="M0,0L300,0L300,100Z" fill="#1F6F78"/>
<g class="species"><g class="species-marker"><line x1="50" x2="50" y1="0" y2="220" stroke="#B23A48"/><text x="57" y="14" font-size="11">Cs</text></g></g>
<g class="pins" data-export-layer="pins"><circle cx="120" cy="80" r="5" fill="#6A4C93"/></g>
<g class="probe-marker"><circle r="7"/></g></g>
<g class="crosshair"><line x1="10" x2="10" y1="0" y2="220"/></g><rect class="map-overlay" width="300" height="220" fill="transparent"/>
<g class="tick" font-family="sans-serif" font-size="10"><text y="232">10⁻⁶</text></g>
<text x="150" y="258" font-size="13">Polarizability α (a₀³) at 10⁻⁹</text></g></svg>`;
  document.body.appendChild(host);
  return host.querySelector('svg')!;
}
