import { PALETTE as P } from '~/lib/palette';

/**
 * The upload widget (Uppy's dashboard) in Lossline's palette instead of its own blue and greys:
 * paper behind, ink text, teal for the browse link, the primary button and the progress, copper-free
 * (copper means loss), alert red for an error, amber only as a mark. Written from src/lib/palette.ts
 * so the widget follows any change of the palette; the selectors are Uppy 5's own class names.
 */
export function uppyThemeCss(): string {
  return `
.uppy-Dashboard-inner { background-color: ${P.paper.deep}; border-color: ${P.paper.edge}; color: ${P.ink.DEFAULT}; font-family: inherit; }
.uppy-Dashboard-AddFiles { border-color: ${P.paper.edge}; }
.uppy-Dashboard-AddFiles-title, .uppy-Dashboard-Item-name, .uppy-StatusBar-status { color: ${P.ink.DEFAULT}; }
.uppy-Dashboard-note, .uppy-Dashboard-Item-statusSize, .uppy-StatusBar-statusSecondary { color: ${P.ink.faint}; }
.uppy-Dashboard-browse, .uppy-Dashboard-Item-reSelect, .uppy-StatusBar-actionBtn, .uppy-DashboardContent-back, .uppy-DashboardContent-addMore { color: ${P.teal.deep}; }
.uppy-Dashboard-browse:hover, .uppy-Dashboard-browse:focus { color: ${P.teal.deep}; border-bottom-color: ${P.teal.deep}; }
.uppy-c-btn-primary, .uppy-StatusBar.is-waiting .uppy-StatusBar-actionBtn--upload { background-color: ${P.teal.DEFAULT}; color: #ffffff; }
.uppy-c-btn-primary:not(:disabled):hover, .uppy-StatusBar.is-waiting .uppy-StatusBar-actionBtn--upload:hover { background-color: ${P.teal.deep}; }
.uppy-c-btn-primary:focus, .uppy-c-btn:focus { box-shadow: 0 0 0 3px ${P.teal.pale}; }
.uppy-StatusBar { background-color: ${P.paper.DEFAULT}; color: ${P.ink.DEFAULT}; }
.uppy-StatusBar-progress { background-color: ${P.teal.DEFAULT}; }
.uppy-StatusBar.is-complete .uppy-StatusBar-progress { background-color: ${P.teal.deep}; }
.uppy-StatusBar.is-complete .uppy-StatusBar-statusIndicator { color: ${P.teal.deep}; }
.uppy-StatusBar.is-postprocessing .uppy-StatusBar-progress { background-color: ${P.amber.DEFAULT}; }
.uppy-StatusBar.is-error .uppy-StatusBar-progress { background-color: ${P.alert.DEFAULT}; }
.uppy-StatusBar.is-error .uppy-StatusBar-statusIndicator { color: ${P.alert.DEFAULT}; }
.uppy-Dashboard-Item-progressIndicator, .uppy-Dashboard-Item-progressIcon--circle { color: ${P.teal.DEFAULT}; }
`;
}
