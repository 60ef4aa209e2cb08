// Reference LAPACK (CLAPACK compiled to WebAssembly, npm package `emlapack`) for tests and
// benchmarks only; never imported by src/.
//
// The package's wasm build is an early Emscripten module that, when required, fetches its .wasm
// asynchronously and reads the caller's `Module` global. To get a synchronous, side-effect-free
// load we evaluate its glue code with our own `Module` object whose `instantiateWasm` hook
// compiles the binary synchronously, and a stand-in `process` so the glue does not install
// process-wide handlers. Matrices passed in are row-major (project convention); LAPACK wants
// column-major, so every call transposes on the way in and out.
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

const require = createRequire(import.meta.url);

interface EmModule {
  _malloc(bytes: number): number;
  _free(ptr: number): void;
  HEAPF64: Float64Array;
  HEAP32: Int32Array;
  HEAPU8: Uint8Array;
  [fn: string]: unknown;
}

let cached: EmModule | null = null;

/** Load (once) and return the LAPACK module. */
export function lapack(): EmModule {
  if (cached) return cached;
  const dir = dirname(require.resolve('emlapack/package.json'));
  const glue = readFileSync(join(dir, 'wasm.js'), 'utf8');
  const bytes = readFileSync(join(dir, 'emlapack.wasm'));
  let ready = false;
  const mod: Record<string, unknown> = {
    print: () => {},
    printErr: () => {},
    instantiateWasm(info: WebAssembly.Imports, receive: (inst: WebAssembly.Instance) => void) {
      const inst = new WebAssembly.Instance(new WebAssembly.Module(bytes), info);
      receive(inst);
      return inst.exports;
    },
    onRuntimeInitialized() { ready = true; },
  };
  const standInProcess = {
    argv: ['node', 'emlapack'],
    platform: process.platform,
    hrtime: process.hrtime,
    on() {},
    exit(code: number) { throw new Error(`emlapack exited with status ${code}`); },
    get stdin() { return process.stdin; },
  };
  const fakeModule = { exports: {} };
  // eslint-disable-next-line @typescript-eslint/no-implied-eval
  new Function('Module', 'require', 'module', 'process', '__dirname', glue)(mod, require, fakeModule, standInProcess, dir);
  if (!ready) throw new Error('emlapack: runtime did not initialise synchronously');
  cached = mod as unknown as EmModule;
  return cached;
}

/** Scratch allocator: every pointer handed out is freed by `release()`. */
class Scratch {
  private ptrs: number[] = [];
  constructor(private m: EmModule) {}
  f64(values: ArrayLike<number> | number): number {
    const len = typeof values === 'number' ? values : values.length;
    const p = this.m._malloc(Math.max(1, len) * 8);
    this.ptrs.push(p);
    if (typeof values !== 'number') this.m.HEAPF64.set(values, p >> 3);
    else this.m.HEAPF64.fill(0, p >> 3, (p >> 3) + len);
    return p;
  }
  i32(value: number): number {
    const p = this.m._malloc(4);
    this.ptrs.push(p);
    this.m.HEAP32[p >> 2] = value;
    return p;
  }
  char(c: string): number {
    const p = this.m._malloc(4);
    this.ptrs.push(p);
    this.m.HEAPU8[p] = c.charCodeAt(0);
    return p;
  }
  read(p: number, len: number): Float64Array {
    return Float64Array.from(this.m.HEAPF64.subarray(p >> 3, (p >> 3) + len));
  }
  release() { for (const p of this.ptrs) this.m._free(p); this.ptrs = []; }
}

/** Row-major n×n → column-major copy (and back: the transpose is its own inverse). */
export function transposeSquare(M: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[j * n + i] = M[i * n + j];
  return out;
}

export interface DggevResult {
  alphaRe: Float64Array;
  alphaIm: Float64Array;
  beta: Float64Array;
  /** LAPACK INFO: 0 = success, 1..n = QZ failed, > n other failure. */
  info: number;
  /** Right eigenvectors, only when asked for: column-major n×n in LAPACK's packed real form
   *  (a complex pair j, j+1 is stored as Re in column j and Im in column j+1). */
  vr?: Float64Array;
  vl?: Float64Array;
}

/** Generalized eigenvalues of the pencil (A, B): A·x = λ·B·x, λ = alpha/beta (LAPACK dggev).
 *  A and B are row-major n×n and are not modified. */
export function dggev(A: Float64Array, B: Float64Array, n: number, opts: { vectors?: boolean } = {}): DggevResult {
  const m = lapack();
  const fn = m._dggev_ as (...args: number[]) => void;
  const s = new Scratch(m);
  try {
    const job = opts.vectors ? 'V' : 'N';
    const lwork = Math.max(1, 8 * n + 16) * 2;
    const pa = s.f64(transposeSquare(A, n));
    const pb = s.f64(transposeSquare(B, n));
    const par = s.f64(n), pai = s.f64(n), pbe = s.f64(n);
    const ldv = opts.vectors ? n : 1;
    const pvl = s.f64(ldv * n), pvr = s.f64(ldv * n);
    const pwork = s.f64(lwork);
    const pinfo = s.i32(0);
    fn(s.char(job), s.char(job), s.i32(n), pa, s.i32(n), pb, s.i32(n), par, pai, pbe,
      pvl, s.i32(ldv), pvr, s.i32(ldv), pwork, s.i32(lwork), pinfo);
    const res: DggevResult = {
      alphaRe: s.read(par, n), alphaIm: s.read(pai, n), beta: s.read(pbe, n), info: m.HEAP32[pinfo >> 2],
    };
    if (opts.vectors) { res.vl = s.read(pvl, n * n); res.vr = s.read(pvr, n * n); }
    return res;
  } finally {
    s.release();
  }
}

/** Classify dggev output with an independent, simple rule (common practice): an eigenvalue is
 *  infinite when |beta|·‖A‖ ≤ tol·|alpha|·‖B‖. Finite ones are returned sorted by |λ|. */
export function splitFinite(r: { alphaRe: Float64Array; alphaIm: Float64Array; beta: Float64Array },
  normA: number, normB: number, tol = 1e-11): { finite: { re: number; im: number }[]; infinite: number } {
  const finite: { re: number; im: number }[] = [];
  let infinite = 0;
  for (let k = 0; k < r.beta.length; k++) {
    const a = Math.hypot(r.alphaRe[k], r.alphaIm[k]);
    if (Math.abs(r.beta[k]) * normA <= tol * a * normB || r.beta[k] === 0) { infinite++; continue; }
    finite.push({ re: r.alphaRe[k] / r.beta[k], im: r.alphaIm[k] / r.beta[k] });
  }
  finite.sort((p, q) => Math.hypot(p.re, p.im) - Math.hypot(q.re, q.im) || q.im - p.im);
  return { finite, infinite };
}
