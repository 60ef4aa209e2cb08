// Colours and line weights of the drawing surface (kept in step with src/app.css).
export const INK = '#1e2a32';
export const INK_SOFT = '#56636c';
export const SELECTED = '#1f6f78';
export const HOVER = '#3f8f99';
export const GHOST = '#1f6f78';
export const WIRE = '#27343c';
export const ERROR = '#b3261e';
export const WARN = '#a05a00';
export const BAND_FILL = 'rgba(31, 111, 120, 0.08)';
export const BAND_STROKE = '#1f6f78';
export const WIRE_WIDTH = 1.5;
export const JUNCTION_RADIUS = 2.6;
/** Line weight of symbol bodies (world units). */
export const SYMBOL_STROKE = 1.5;
