/** Where a module's file lies in a repository of each language, and its printed text. */
import type { Entity } from './domain';
import type { Module } from './ir';
import { javaClassName, printJava, printJavaModel } from './print/java';
import { snake } from './print/common';
import { printPython, printPythonModel } from './print/python';
import { printTypeScript, printTypeScriptModel } from './print/typescript';

export type Language = 'typescript' | 'python' | 'java';

/** A repository's language and where its sources start. */
export interface Layout {
  language: Language;
  /** TypeScript: the source folder; Python: the package; Java: the base package */
  root: string;
}

export interface GeneratedFile {
  path: string;
  text: string;
}

const javaFolder = (layout: Layout) => `src/main/java/${layout.root.replace(/\./g, '/')}`;

/** The path of a module's file. */
export function modulePath(layout: Layout, moduleName: string): string {
  const slash = moduleName.lastIndexOf('/');
  const folder = moduleName.slice(0, slash);
  const base = moduleName.slice(slash + 1);
  switch (layout.language) {
    case 'typescript':
      return `${layout.root}/${moduleName}.ts`;
    case 'python':
      return `${layout.root}/${folder}/${snake(base.replace(/-/g, '_'))}.py`;
    case 'java':
      return `${javaFolder(layout)}/${folder}/${javaClassName(moduleName)}.java`;
  }
}

export function printModule(layout: Layout, module: Module): GeneratedFile {
  const path = modulePath(layout, module.name);
  const depth = module.name.split('/').length - 1;
  switch (layout.language) {
    case 'typescript':
      return { path, text: printTypeScript(module, depth === 0 ? './model' : `${'../'.repeat(depth)}model`) };
    case 'python':
      return { path, text: printPython(module, `${layout.root}.model`) };
    case 'java': {
      const folder = module.name.slice(0, module.name.lastIndexOf('/')).replace(/\//g, '.');
      return { path, text: printJava(module, `${layout.root}.${folder}`, `${layout.root}.model`) };
    }
  }
}

const TYPESCRIPT_LOG = `/** The one log of the service: structured lines on standard error. */
export const log = {
  info: (message: string, ...values: unknown[]) => console.error(JSON.stringify({ level: 'info', message, values })),
  warn: (message: string, ...values: unknown[]) => console.error(JSON.stringify({ level: 'warn', message, values })),
};
`;

/** The files that declare the repository's records (no functions in them). */
export function printModel(layout: Layout, entities: Entity[]): GeneratedFile[] {
  switch (layout.language) {
    case 'typescript':
      return [
        { path: `${layout.root}/model.ts`, text: printTypeScriptModel(entities) },
        { path: `${layout.root}/log.ts`, text: TYPESCRIPT_LOG },
      ];
    case 'python':
      return [{ path: `${layout.root}/model.py`, text: printPythonModel(entities) }];
    case 'java':
      return entities.map((x) => ({ path: `${javaFolder(layout)}/model/${x.name}.java`, text: printJavaModel(x, `${layout.root}.model`) }));
  }
}
