import { fieldText, treeSitterLanguage } from './tree-sitter';
import { C_COMMENTS, C_IDENTIFIERS, C_LITERALS, cFunctionSpan } from './c-family';

/**
 * C++: function definitions (free, in-class and `Class::method` out of class; a definition named
 * like its class is the constructor) and lambdas. `.h` files are read as C++: the C++ grammar
 * accepts nearly all C, the C grammar rejects classes and templates.
 */
export const cpp = treeSitterLanguage({
  id: 'cpp',
  extensions: ['.cc', '.cpp', '.cxx', '.c++', '.hpp', '.hh', '.hxx', '.h', '.ipp', '.inl'],
  wasm: 'tree-sitter-cpp.wasm',
  comments: C_COMMENTS,
  literals: C_LITERALS,
  identifiers: C_IDENTIFIERS,
  containers: {
    class_specifier: (node) => fieldText(node, 'name'),
    struct_specifier: (node) => fieldText(node, 'name'),
  },
  functions: new Set(['function_definition', 'lambda_expression']),
  span(node, owner) {
    if (node.type === 'lambda_expression') return { name: '<anonymous>', kind: 'lambda' };
    return cFunctionSpan(node, owner);
  },
});
