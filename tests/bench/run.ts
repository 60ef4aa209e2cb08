// `npm run bench` entry. Each bench module registers one entry here; run all with no argument,
// or name some: `npm run bench -- eig`. Benchmarks print medians and ratios; they never assert.
import { runEigBench } from './eig-bench';
import { runFeedbackBench } from './feedback-bench';

const benches: Record<string, () => unknown> = {
  eig: () => runEigBench(),
  analysis: async () => (await import('./analysis-bench')).runAnalysisBench(),
  feedback: () => runFeedbackBench(),
  scaling: async () => (await import('./scaling-bench')).runScalingBench(),
};

const wanted = process.argv.slice(2);
const unknown = wanted.filter((w) => !(w in benches));
if (unknown.length > 0) {
  console.error(`unknown bench ${unknown.join(', ')}; known: ${Object.keys(benches).join(', ')}`);
  process.exitCode = 1;
} else {
  for (const name of wanted.length > 0 ? wanted : Object.keys(benches)) {
    console.log(`\n== ${name} ==`);
    await benches[name]();
  }
}
