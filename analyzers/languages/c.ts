import { C_COMMENTS, C_IDENTIFIERS, C_LITERALS, cFunctionSpan } from './c-family';
import { treeSitterLanguage } from './tree-sitter';

/** C: function definitions (`.c`). Headers go to C++, whose grammar also reads C. */
export const c = treeSitterLanguage({
  id: 'c',
  extensions: ['.c'],
  wasm: 'tree-sitter-c.wasm',
  comments: C_COMMENTS,
  literals: C_LITERALS,
  identifiers: C_IDENTIFIERS,
  containers: {},
  functions: new Set(['function_definition']),
  span: (node) => cFunctionSpan(node, undefined),
});
