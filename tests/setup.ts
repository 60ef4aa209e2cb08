// Test setup: jsdom tests (marked with `// @vitest-environment jsdom`) get a mocked canvas for Konva.
if (typeof window !== 'undefined') {
  await import('vitest-canvas-mock');
  const { cleanup } = await import('@testing-library/react');
  const { afterEach } = await import('vitest');
  afterEach(() => cleanup());
}
export {};
