/**
 * Lampwright's own palette and type scale, applied through naive-ui theme overrides.
 * Ink blue-grey for structure, a warm lamp amber for the one thing to look at.
 */
import type { GlobalThemeOverrides } from 'naive-ui'

export const palette = {
  ink: '#1f3b4d',
  inkSoft: '#2f5568',
  amber: '#c98a12',
  amberBright: '#f2b441',
  paper: '#f6f7f4',
  line: '#d9ded8',
  ok: '#2e7d4f',
  warn: '#b46a00',
  danger: '#b3261e',
}

const font = "'Source Sans 3', 'Source Sans Pro', system-ui, sans-serif"

const common = {
  fontFamily: font,
  fontSize: '15px',
  fontSizeMedium: '15px',
  fontSizeLarge: '16px',
  borderRadius: '6px',
  successColor: palette.ok,
  warningColor: palette.warn,
  errorColor: palette.danger,
}

export const lightOverrides: GlobalThemeOverrides = {
  common: {
    ...common,
    primaryColor: palette.ink,
    primaryColorHover: palette.inkSoft,
    primaryColorPressed: '#163040',
    primaryColorSuppl: palette.inkSoft,
    infoColor: '#2a6f97',
    bodyColor: palette.paper,
  },
  Layout: { siderColor: '#ffffff', headerColor: '#ffffff', color: palette.paper },
  // Darker secondary text than the library default, for 4.5:1 contrast on white and on paper.
  Menu: { groupTextColor: '#4d5b66' },
  Form: { feedbackTextColor: '#4d5b66', labelTextColor: '#1b2a33' },
  // The empty-table words at 4.5:1 on white, like other muted text.
  Empty: { textColor: '#4d5b66' },
  Tag: { textColor: '#1b2a33', textColorSuccess: '#1f5c33', textColorWarning: '#6e4300', textColorError: '#8f1d16', textColorInfo: '#1d4f73' },
}

export const darkOverrides: GlobalThemeOverrides = {
  common: {
    ...common,
    primaryColor: palette.amberBright,
    primaryColorHover: '#f5c566',
    primaryColorPressed: palette.amber,
    primaryColorSuppl: '#f5c566',
    infoColor: '#6fb3d9',
    successColor: '#5cbf85',
    warningColor: '#e5a23a',
    errorColor: '#ef6b61',
  },
  Menu: { groupTextColor: '#b9c4cc' },
  Form: { feedbackTextColor: '#c3ccd3' },
  Empty: { textColor: '#b9c4cc' },
}
