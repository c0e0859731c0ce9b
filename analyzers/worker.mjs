// The pool thread's entry, in plain JavaScript so a thread can start without a TypeScript loader.
// When the thread already has one (it inherited `--import tsx`) the .ts import just works;
// otherwise (vitest, plain node) tsx's scoped `tsImport` loads it. The failed first import is
// cached by URL, which is why the fallback goes through tsImport's own namespaced URL.
let loaded;

async function load() {
  try {
    return await import('./worker-task.ts');
  } catch (error) {
    if (error?.code !== 'ERR_UNKNOWN_FILE_EXTENSION') throw error;
    const { tsImport } = await import('tsx/esm/api');
    return await tsImport('./worker-task.ts', import.meta.url);
  }
}

export default async function analyze(task) {
  loaded ??= load();
  const module = await loaded;
  if (task.warm) return module.warmUp(task.warm);
  if (task.snippet) return module.runSnippetTask(task);
  return module.runTask(task);
}
