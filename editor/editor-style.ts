// Page-level CSS of the editor's own elements (readout table, graphs, file status); tweakpane styles itself.

/** Style sheet text. */
export const editorCss = `
.rl-pane { --rl-accent: #f5b84c; }
/* Group tabs size to their names (never cut short) and wrap onto a second row when they do not fit. */
.rl-pane .tp-tabv_t { flex-wrap: wrap; row-gap: 2px; }
.rl-pane .tp-tbiv { flex: 1 0 auto; }
.rl-pane .tp-tbiv_b { padding-left: 6px; padding-right: 6px; }
.rl-pane .tp-tbiv_t { text-overflow: clip; white-space: nowrap; }
.rl-voices { width: 100%; border-collapse: collapse; font: 10px/1.35 ui-monospace, Menlo, Consolas, monospace; color: #d9dee8; }
.rl-voices th { font-weight: 600; text-align: right; color: #9aa6bd; padding: 1px 3px; }
.rl-voices th:first-child, .rl-voices td:first-child { text-align: left; }
.rl-voices td { text-align: right; padding: 1px 3px; white-space: nowrap; }
.rl-voices td i { display: inline-block; width: 7px; height: 7px; border-radius: 50%; margin-right: 4px; }
.rl-graph canvas, .rl-spectrum canvas { width: 100%; display: block; border-radius: 3px; }
.rl-legend { display: flex; flex-wrap: wrap; gap: 2px 8px; font: 10px sans-serif; color: #c9d0dc; margin: 2px 0 4px; }
.rl-legend span::before { content: ''; display: inline-block; width: 10px; height: 2px; margin-right: 3px; vertical-align: middle; background: var(--c); }
.rl-audio-error { font: 10px/1.35 ui-monospace, Menlo, Consolas, monospace; color: #9aa6bd; overflow-wrap: anywhere; padding: 2px 0; }
.rl-audio-error-on { color: #ff9b8a; }
.rl-file-status { font: 11px/1.4 sans-serif; color: #d9dee8; min-height: 14px; }
.rl-file-ok { color: #8fe3a5; }
.rl-file-bad { color: #ff9b8a; }
.rl-file-problems { margin: 3px 0 0; padding-left: 16px; color: #ffd0c7; }
.rl-file-problems code { color: #ffe08a; }
`;
