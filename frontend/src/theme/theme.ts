import type { ThemeConfig } from 'antd';
import { palette } from './palette';

export const fontFamily = "'IBM Plex Sans', system-ui, sans-serif";

export const lightTheme: ThemeConfig = {
  token: {
    colorPrimary: palette.bound,
    colorInfo: palette.bound,
    colorLink: palette.bound,
    colorTextBase: palette.ink,
    colorBgLayout: palette.paper,
    fontFamily,
    borderRadius: 4,
  },
  components: {
    Layout: { headerBg: '#ffffff', headerHeight: 48, headerPadding: '0 16px', bodyBg: palette.paper },
  },
};
