/**
 * The Material Symbols (outlined, weight 400) the app shows, by their published names. Only these
 * are bundled: `npm run icons` writes their SVGs into app-icon-svgs.ts from the
 * `@material-symbols/svg-400` package, and test/lint/icons.spec.ts checks that every icon a
 * template names is listed here and that the SVG module is current. Adding an icon: add its name
 * here, run `npm run icons`, and use it as `<mat-icon svgIcon="name">`.
 */
export const APP_ICON_NAMES = [
  'account_circle',
  'add',
  'archive',
  'arrow_back',
  'autorenew',
  'block',
  'calculate',
  'call_split',
  'check',
  'check_circle',
  'close',
  'content_copy',
  'delete',
  'description',
  'devices',
  'download',
  'edit',
  'electric_bolt',
  'error',
  'folder',
  'functions',
  'history',
  'image',
  'info',
  'ink_selection',
  'keyboard_arrow_down',
  'link',
  'logout',
  'manage_accounts',
  'menu',
  'more_vert',
  'person_remove',
  'play_arrow',
  'post_add',
  'replay',
  'save',
  'schedule',
  'search',
  'stop_circle',
  'timeline',
  'upload_file',
  'visibility',
  'warning',
  'workspaces',
] as const;

export type AppIconName = (typeof APP_ICON_NAMES)[number];
