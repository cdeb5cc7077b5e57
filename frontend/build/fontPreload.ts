import type { Plugin } from 'vite';

/**
 * Preloads the interface font's files that every page needs (IBM Plex Sans, Latin and Greek — the Greek letters of the
 * physics: α, ν, Γ, τ — in the three weights the theme uses), from index.html.
 *
 * Without it the browser discovers the fonts only when the first styled text is laid out, lays the page out in a
 * fallback font (`font-display: swap`) and lays all of it out again when each font arrives — on the map page a
 * 50–75 ms layout of the whole document at an arbitrary moment, often while the map computes. Preloaded, the files
 * arrive with the scripts and the first layout uses them.
 */
const PRELOADED = /ibm-plex-sans-(latin|greek)-(400|500|600)-normal-[\w-]+\.woff2$/;

export function fontPreload(): Plugin {
  return {
    name: 'fieldbound:font-preload',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(_html, ctx) {
        const files = Object.keys(ctx.bundle ?? {}).filter((name) => PRELOADED.test(name)).sort();
        return files.map((file) => ({
          tag: 'link',
          attrs: { rel: 'preload', href: `/${file}`, as: 'font', type: 'font/woff2', crossorigin: '' },
          injectTo: 'head' as const,
        }));
      },
    },
  };
}
