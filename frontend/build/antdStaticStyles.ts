import type { Plugin } from 'vite';

/**
 * antd's styles for the map page, generated once at build time instead of in the browser.
 *
 * antd writes each component's CSS at run time the first time the component renders (CSS-in-JS). On a first visit of
 * the map page that is ~340 kB of CSS generated and inserted as `<style>` elements inside the page's first renders:
 * tens of milliseconds of main-thread work in tasks that are already long (the first-visit figures in
 * docs/benchmarks.md). This plugin renders, on the build machine, the antd components that the shell and the map
 * page show when they open, with the app's theme (`@ant-design/static-style-extract`), and serves their CSS as the
 * module `virtual:antd-styles.css`, imported by the entry. The CSS ends with antd's cache-path rule, from which the
 * runtime learns which styles a stylesheet already holds and skips generating and inserting them. Anything not
 * rendered here (other pages, dialogs and popups when they open) still gets its styles at run time, as before: the
 * list is kept to what a first visit of the map page needs, because a bigger stylesheet costs its own parse time.
 */
export const ANTD_STYLES_ID = 'virtual:antd-styles.css';

export function antdStaticStyles(): Plugin {
  let css: string | null = null;
  return {
    name: 'fieldbound:antd-static-styles',
    resolveId(id) {
      return id === ANTD_STYLES_ID ? ANTD_STYLES_ID : null;
    },
    async load(id) {
      if (id !== ANTD_STYLES_ID) return null;
      // Loaded only when the entry is built or served (never in unit tests): React's server renderer and antd's
      // CommonJS build are heavy.
      css ??= await extractMapPageStyles();
      return css;
    },
  };
}

async function extractMapPageStyles(): Promise<string> {
  const [{ extractStyle }, React, antd, { lightTheme }] = await Promise.all([
    import('@ant-design/static-style-extract'),
    import('react'),
    import('antd'),
    import('../src/theme/theme'),
  ]);
  const h = React.createElement;
  const { App, Badge, Button, Col, ConfigProvider, Divider, Drawer, Dropdown, Form, Input, InputNumber, Layout, Row, Segmented, Select, Space, Spin, Tooltip, Typography } = antd;
  // What the shell and the map page render when they open (the first antd class of each `<style>` the runtime
  // inserted on a first visit without this stylesheet, see e2e/bench/first-visit-compare.ts FIELDBOUND_COMPARE_STYLES).
  const firstVisit = h(
    App,
    null,
    h(Layout, null, h(Layout.Header, null), h(Layout.Content, null)),
    h(Button, null),
    h(Button, { type: 'primary' }),
    h(Badge, { count: 1 }),
    h(Typography.Text, null, 'text'),
    h(Typography.Title, { level: 5 }, 'title'),
    h(Space, null, h(Space.Compact, null, h(Button, null))),
    h(Spin, null),
    h(Tooltip, { title: 'tip' }, h('span', null)),
    h(Dropdown, { menu: { items: [] } }, h('span', null)),
    h(Select, null),
    h(Row, null, h(Col, null)),
    h(Divider, null),
    h(Segmented, { options: ['a'] }),
    h(Input, null),
    h(InputNumber, null),
    h(Drawer, null),
    h(Form, null, h(Form.Item, { label: 'label' }, h(Input, null))),
  );
  return extractStyle({ includes: [], customTheme: () => h(ConfigProvider, { theme: lightTheme }, firstVisit) });
}
