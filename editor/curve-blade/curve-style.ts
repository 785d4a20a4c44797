// CSS of the curve blade, injected once by Pane.registerPlugin under the bundle id.

/** Style sheet text; colours follow tweakpane's theme variables with our own accents. */
export const curveBladeCss = `
.tp-rlcurvev { display: flex; flex-direction: column; gap: 4px; padding: 2px 0; }
.tp-rlcurvev_t { font-size: 11px; color: var(--lbl-fg); opacity: 0.9; }
.tp-rlcurvev_g { width: 100%; display: block; background: var(--in-bg); border-radius: var(--bld-br); outline: none; cursor: crosshair; touch-action: none; }
.tp-rlcurvev_g:focus { box-shadow: 0 0 0 1px var(--in-fg-f, #79b8ff) inset; }
.tp-rlcurvev_gl { stroke: var(--grv-fg, rgba(255,255,255,0.1)); stroke-width: 1; opacity: 0.45; }
.tp-rlcurvev_gl-one { opacity: 0.9; stroke-dasharray: 3 3; }
.tp-rlcurvev_tx { fill: var(--lbl-fg); font-size: 9px; opacity: 0.7; font-family: var(--bs-ff, sans-serif); }
.tp-rlcurvev_knee { fill: rgba(255, 224, 138, 0.06); }
.tp-rlcurvev_kneetx { fill: #ffe08a; opacity: 0.8; }
.tp-rlcurvev_path { fill: none; stroke: #f5b84c; stroke-width: 2; }
.tp-rlcurvev_key { fill: var(--in-bg); stroke: #f5b84c; stroke-width: 1.5; cursor: grab; }
.tp-rlcurvev_key-sel { fill: #f5b84c; stroke: #fff; }
.tp-rlcurvev_mk { stroke: #5fd3c7; stroke-width: 1.5; }
.tp-rlcurvev_mkd { fill: #5fd3c7; }
.tp-rlcurvev_row { display: flex; gap: 4px; align-items: center; }
.tp-rlcurvev_sel, .tp-rlcurvev_num, .tp-rlcurvev_btn { background: var(--in-bg); color: var(--in-fg); border: 0; border-radius: var(--bld-br); height: var(--cnt-usz, 20px); font: inherit; font-size: 11px; }
.tp-rlcurvev_sel { flex: 1 1 auto; min-width: 0; }
.tp-rlcurvev_fl { display: flex; align-items: center; gap: 2px; font-size: 10px; color: var(--lbl-fg); }
.tp-rlcurvev_num { width: 46px; padding: 0 4px; }
.tp-rlcurvev_btn { width: 22px; cursor: pointer; }
.tp-rlcurvev_btn:disabled, .tp-rlcurvev_num:disabled { opacity: 0.4; cursor: default; }
.tp-rlcurvev-disabled { opacity: 0.5; pointer-events: none; }
`;
