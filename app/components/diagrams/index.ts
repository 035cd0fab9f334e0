/**
 * Sternpost's SVG diagrams: pure components (props in, SVG out) shared by the calculators, the
 * checklists and the PDF record, which renders the same markup with renderToStaticMarkup.
 */
export { RunoutDiagram } from "./runout-diagram";
export type { RunoutDiagramProps } from "./runout-diagram";
export { CouplingFaceDiagram } from "./coupling-face-diagram";
export type { CouplingFaceDiagramProps } from "./coupling-face-diagram";
export { MountMovesDiagram } from "./mount-moves-diagram";
export type { MountMovesDiagramProps } from "./mount-moves-diagram";
export { StraighteningDiagram } from "./straightening-diagram";
export type { StraighteningDiagramProps } from "./straightening-diagram";
export { SeaTrialDiagram } from "./sea-trial-diagram";
export type { SeaTrialDiagramProps, SeaTrialPoint } from "./sea-trial-diagram";
export { diagramFor } from "./for-calc";
export type { DiagramOptions } from "./for-calc";
export { formatLength, type LengthUnit } from "./svg-kit";
export { StraighteningFromReadings, straighteningFromReadings } from "./straightening-from-readings";
export type { RunoutAttempt } from "./straightening-from-readings";
