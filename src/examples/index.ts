// The built-in example drawings (our own invented circuits), in menu order. Each drawing shows
// the same circuit as the engine netlist of the same name under netlists/.

import type { DrawingDocument } from '../schematic/document';
import { emptyDocument } from '../schematic/document';
import { loadDrawing } from '../schematic/file';
import sensorCsMiller from './sensor-cs-miller.drawing.json';
import followerSamplingLoad from './follower-sampling-load.drawing.json';
import readoutCascodeSource from './readout-cascode-source.drawing.json';
import readoutCascodeRegulated from './readout-cascode-regulated.drawing.json';
import twoStageMillerUnity from './two-stage-miller-unity.drawing.json';

export interface ExampleDrawing {
  id: string;
  title: string;
  /** A fresh, validated copy of the drawing (a broken file gives an empty drawing naming why). */
  load(): DrawingDocument;
}

function entry(id: string, json: unknown): ExampleDrawing {
  const title = (json as { title?: string }).title ?? id;
  return {
    id,
    title,
    load() {
      const r = loadDrawing(structuredClone(json));
      return r.ok ? r.doc : emptyDocument(`${title} (could not be opened: ${r.reason})`);
    },
  };
}

export const EXAMPLE_DRAWINGS: readonly ExampleDrawing[] = [
  entry('sensor-cs-miller', sensorCsMiller),
  entry('follower-sampling-load', followerSamplingLoad),
  entry('readout-cascode-source', readoutCascodeSource),
  entry('readout-cascode-regulated', readoutCascodeRegulated),
  entry('two-stage-miller-unity', twoStageMillerUnity),
];
