// The pool thread's entry, in plain JavaScript so a thread can start without a TypeScript loader.
// Under `node --import tsx` the thread inherits the loader and the .ts import just works; under
// vitest (or plain node) it does not, so tsx's loader is registered in this thread on first use.
let loaded;

async function load() {
  try {
    return await import('./worker-task.ts');
  } catch (error) {
    if (error?.code !== 'ERR_UNKNOWN_FILE_EXTENSION' && error?.code !== 'ERR_MODULE_NOT_FOUND') throw error;
    const { register } = await import('tsx/esm/api');
    register();
    return await import('./worker-task.ts');
  }
}

export default async function analyze(task) {
  loaded ??= load();
  const module = await loaded;
  if (task.warm) return module.warmUp();
  return module.runTask(task);
}
