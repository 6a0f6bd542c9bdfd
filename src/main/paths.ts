// Where the built main process finds the preload script and the renderer page, relative to its
// own folder (out/main). test/build-output.test.ts checks that both exist after a build.
export const PRELOAD_FROM_MAIN = '../preload/index.cjs';
export const RENDERER_FROM_MAIN = '../renderer/index.html';
