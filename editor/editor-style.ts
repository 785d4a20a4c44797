// Page-level CSS of the editor: the dock, the panel's colours (tweakpane's CSS variables), and the editor's own
// elements (notices, group strip, meters, readout table, graphs, diff and file status). A plain dark look of our own.

/** Style sheet text. */
export const editorCss = `
.rl-dock { position: fixed; top: 0; right: 0; bottom: 0; z-index: 20; display: flex; background: #10151f; border-left: 1px solid #263049;
  font-family: system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; color: #e6e9f0; box-sizing: border-box; }
.rl-dock-grip { position: absolute; left: -4px; top: 0; bottom: 0; width: 8px; cursor: ew-resize; z-index: 2; }
.rl-dock-grip:hover, .rl-dock-resizing .rl-dock-grip { background: rgba(95, 211, 199, 0.35); }
.rl-dock-fold { position: absolute; left: 4px; top: 3px; z-index: 3; width: 20px; height: 20px; border: 1px solid #334066; border-radius: 4px;
  background: #182036; color: #cfd6e4; cursor: pointer; font: 14px/1 sans-serif; padding: 0; }
.rl-dock-body { flex: 1; overflow-y: auto; overflow-x: hidden; }
.rl-dock-folded .rl-dock-body, .rl-dock-folded .rl-dock-grip { display: none; }
.rl-dock.rl-dropping, .rl-dropping { outline: 2px dashed #5fd3c7; outline-offset: -2px; }
.rl-pane { --tp-base-background-color: #161d2b; --tp-base-shadow-color: rgba(0, 0, 0, 0.3);
  --tp-container-background-color: rgba(110, 140, 200, 0.08); --tp-container-background-color-hover: rgba(110, 140, 200, 0.14);
  --tp-container-background-color-focus: rgba(110, 140, 200, 0.18); --tp-container-background-color-active: rgba(110, 140, 200, 0.22);
  --tp-container-foreground-color: #e6e9f0;
  --tp-button-background-color: #5fd3c7; --tp-button-background-color-hover: #7fe0d6; --tp-button-background-color-focus: #7fe0d6;
  --tp-button-background-color-active: #a0ebe3; --tp-button-foreground-color: #0b1a18;
  --tp-input-background-color: rgba(110, 140, 200, 0.12); --tp-input-background-color-hover: rgba(110, 140, 200, 0.18);
  --tp-input-background-color-focus: rgba(110, 140, 200, 0.24); --tp-input-background-color-active: rgba(110, 140, 200, 0.28);
  --tp-input-foreground-color: #e6e9f0; --tp-label-foreground-color: #aeb8cc;
  --tp-monitor-background-color: rgba(0, 0, 0, 0.25); --tp-monitor-foreground-color: #5fd3c7;
  --tp-groove-foreground-color: rgba(110, 140, 200, 0.18); --tp-blade-value-width: 58%; border-radius: 0; }
.rl-pane .tp-lblv_l { white-space: nowrap; overflow: hidden; text-overflow: ellipsis; }
.rl-notice { font: 11px/1.4 sans-serif; min-height: 15px; padding: 2px 4px; color: #aeb8cc; }
.rl-notice[data-kind="warn"] { color: #ffc27a; }
.rl-groups { display: flex; gap: 3px; overflow-x: auto; overflow-y: hidden; padding: 2px 0 5px; scrollbar-width: thin; }
.rl-group-tab { flex: 0 0 auto; font: 11px sans-serif; padding: 3px 8px; border-radius: 10px; border: 1px solid #334066; background: transparent;
  color: #cfd6e4; cursor: pointer; white-space: nowrap; }
.rl-group-tab[aria-selected="true"] { background: #5fd3c7; border-color: #5fd3c7; color: #0b1a18; font-weight: 600; }
.rl-bus { display: flex; align-items: center; gap: 4px; padding: 2px 0; }
.rl-bus button { font: 10px sans-serif; padding: 2px 6px; border-radius: 3px; border: 1px solid #334066; background: transparent; color: #cfd6e4; cursor: pointer; }
.rl-bus button[aria-pressed="true"] { background: #ffc27a; color: #1a1405; border-color: #ffc27a; }
.rl-bus button:disabled { opacity: 0.45; cursor: not-allowed; }
.rl-bus .rl-meter { flex: 1; }
.rl-meter { display: flex; align-items: center; gap: 5px; font: 10px ui-monospace, Menlo, Consolas, monospace; color: #cfd6e4; padding: 2px 0; min-width: 0; }
.rl-meter-name { flex: 0 0 auto; color: #9aa6bd; max-width: 64px; overflow: hidden; text-overflow: ellipsis; }
.rl-meter-track { position: relative; flex: 1; height: 7px; background: rgba(110, 140, 200, 0.15); border-radius: 2px; min-width: 40px; }
.rl-meter-bar { position: absolute; left: 0; top: 0; bottom: 0; background: #5fd3c7; border-radius: 2px; }
.rl-meter-bar.rl-meter-over { background: #ff7f6e; }
.rl-meter-hold { position: absolute; top: -1px; bottom: -1px; width: 2px; background: #ffe08a; }
.rl-meter-text { flex: 0 0 auto; white-space: nowrap; }
.rl-meter-off .rl-meter-track { opacity: 0.3; }
.rl-path-line { font: 10px/1.35 sans-serif; color: #9aa6bd; padding: 2px 0; }
.rl-path-line[data-path="builtin"] { color: #ffc27a; }
.rl-elblade:has(> .rl-voices) { overflow-x: auto; }
.rl-voices { width: 100%; border-collapse: collapse; font: 10px/1.35 ui-monospace, Menlo, Consolas, monospace; color: #d9dee8; }
.rl-voices th { font-weight: 600; text-align: right; color: #9aa6bd; padding: 1px 3px; }
.rl-voices th:first-child, .rl-voices td:first-child { text-align: left; max-width: 110px; overflow: hidden; text-overflow: ellipsis; }
.rl-voices td { text-align: right; padding: 1px 3px; white-space: nowrap; }
.rl-voices td i { display: inline-block; width: 7px; height: 7px; border-radius: 50%; margin-right: 4px; }
.rl-graph canvas, .rl-spectrum canvas { width: 100%; display: block; border-radius: 3px; }
.rl-legend { display: flex; flex-wrap: wrap; gap: 2px 8px; font: 10px sans-serif; color: #c9d0dc; margin: 2px 0 4px; }
.rl-legend span::before { content: ''; display: inline-block; width: 10px; height: 2px; margin-right: 3px; vertical-align: middle; background: var(--c); }
.rl-audio-error { font: 10px/1.35 ui-monospace, Menlo, Consolas, monospace; color: #9aa6bd; overflow-wrap: anywhere; padding: 2px 0; }
.rl-audio-error-on { color: #ff9b8a; }
.rl-diff { font: 10px/1.4 ui-monospace, Menlo, Consolas, monospace; color: #d9dee8; max-height: 160px; overflow-y: auto; overflow-wrap: anywhere; }
.rl-diff-head { font: 11px sans-serif; color: #aeb8cc; margin-bottom: 2px; }
.rl-diff code { color: #ffe08a; }
.rl-file-status { font: 11px/1.4 sans-serif; color: #d9dee8; min-height: 14px; }
.rl-file-ok { color: #8fe3a5; }
.rl-file-bad { color: #ff9b8a; }
.rl-file-problems { margin: 3px 0 0; padding-left: 16px; color: #ffd0c7; }
.rl-file-problems code { color: #ffe08a; }
`;
