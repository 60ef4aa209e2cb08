// The live analysis on the sheet, as components that subscribe to the analysis store themselves:
// a new result (or a busy flag) re-renders these and not the app around them. LiveSheetMarks is
// the HTML part (badges, read-out, faults, legend and busy indicator), LiveWireMarks the Konva
// group of coloured wires (drawn in the wire layer, see PartsLayer's wireMarks). Both read the same derived data (live/liveView.ts).
import { memo } from 'react';
import type { HitTarget } from '../editor/types';
import type { DrawingDocument, ItemId } from '../schematic/document';
import type { LiveStore } from '../live/types';
import { useAnalysis } from '../live/useAnalysis';
import { useLiveOverlay } from '../live/useEditorAnalysis';
import { liveView } from '../live/liveView';
import type { Camera, Point } from './camera';
import { AnalysisOverlay } from './AnalysisOverlay';
import { AnalysisHud } from './AnalysisHud';
import { AnalysisWireMarks } from './AnalysisWireLayer';

interface MarksProps {
  store: LiveStore;
  camera: Camera;
  /** World position of the pointer, null when off the sheet. */
  pointer: Point | null;
  hover: HitTarget;
  selection: ReadonlySet<ItemId>;
}

export const LiveSheetMarks = memo(function LiveSheetMarks({ store, camera, pointer, hover, selection }: MarksProps) {
  const live = useLiveOverlay(store, hover, selection, true);
  return (
    <>
      <AnalysisOverlay state={live.state} ann={live.ann} camera={camera} lit={live.lit} pointer={pointer} pointerNet={live.pointerNet} />
      <AnalysisHud state={live.state} actions={live.actions} ann={live.ann} />
    </>
  );
});

export const LiveWireMarks = memo(function LiveWireMarks({ store, doc, scale }: { store: LiveStore; doc: DrawingDocument; scale: number }) {
  const { state } = useAnalysis(store);
  const view = liveView(state);
  return <AnalysisWireMarks doc={doc} ann={view.ann} netOfWire={view.netOfWire} lit={view.lit} scale={scale} />;
});
