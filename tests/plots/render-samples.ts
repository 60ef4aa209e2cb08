// Visual check (not a test; run by hand): npx tsx tests/plots/render-samples.ts
// Writes the plots of the example netlists as SVG into tests/artifacts/plots/ (git-ignored).
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { analyze, buildMna, type Netlist } from '../../src/engine/index';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { loopMargins } from '../../src/engine/feedback/margins';
import { rootLocus } from '../../src/engine/feedback/locus';
import { stepResponse } from '../../src/engine/feedback/step';
import { compareOff } from '../../src/engine/feedback/compare';
import { impedancesAtHz } from '../../src/engine/analyses/impedance';
import { bodeModel, impedanceModel, loopGainModel, splaneModel, stepModel, toSvg } from '../../src/plots/index';
import { bodeInputFrom, loopGainInputFrom, splaneInputFrom, stepInputFrom } from '../../src/plots/fromEngine';

const out = new URL('../artifacts/plots/', import.meta.url).pathname;
mkdirSync(out, { recursive: true });
const names = process.argv.slice(2).length ? process.argv.slice(2) : ['two-stage-miller-unity', 'readout-cascode-regulated', 'sensor-cs-miller'];
for (const name of names) {
  const netlist = JSON.parse(readFileSync(new URL(`../../src/examples/netlists/${name}.json`, import.meta.url), 'utf8')) as Netlist;
  const r = analyze(netlist);
  const sys = buildMna(netlist).system!;
  const write = (kind: string, svg: string) => writeFileSync(`${out}${name}-${kind}.svg`, svg);
  const bode = bodeInputFrom(r, netlist.title);
  if (bode) write('bode', toSvg(bodeModel(bode)));
  const grid = Array.from({ length: 61 }, (_, i) => 10 ** (2 + i / 6));
  const loops = discoverLoops(sys, { freqsHz: grid }).loops;
  const loop = loops[0];
  if (loop) {
    write('loop', toSvg(loopGainModel(loopGainInputFrom(loop, loopMargins(sys, loop.key)))));
    const locus = rootLocus(sys, loop.key);
    write('locus-log', toSvg(splaneModel(splaneInputFrom(r, locus), { view: 'signed-log' })));
    write('locus-lin', toSvg(splaneModel(splaneInputFrom(r, locus), { view: 'linear' })));
    write('compare', toSvg(splaneModel(splaneInputFrom(r, null, compareOff(sys, [loop]), ['as drawn', 'loop off']))));
  }
  const node = r.nodes.find((n) => n.name === 'out') ?? r.nodes[0];
  const idx = sys.nodeNames.indexOf(node.name);
  const hz = Array.from({ length: 181 }, (_, i) => 10 ** (i / 15));
  write('impedance', toSvg(impedanceModel({ node: node.name, hz, ohms: hz.map((f) => { const z = impedancesAtHz(sys, f).values[idx]; return z ? Math.hypot(z.re, z.im) : null; }) })));
  const st = stepResponse(sys);
  write('step', toSvg(stepModel(stepInputFrom(st, netlist.title))));
  write('step-log', toSvg(stepModel(stepInputFrom(st, netlist.title), { timeAxis: 'log' })));
  console.log(name, 'done', loops.length, 'loops');
}
