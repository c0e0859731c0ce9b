import { fieldText, treeSitterLanguage } from './tree-sitter';

/**
 * Python. Methods are functions directly inside a class body (`__init__` is the constructor).
 * A decorated function's fragment starts at its first decorator: the decorators are part of what
 * gets copied with it (Java annotations and C# attributes are inside the method node anyway).
 * A lambda takes the name of the variable it is assigned to.
 */
export const python = treeSitterLanguage({
  id: 'python',
  extensions: ['.py', '.pyw'],
  wasm: 'tree-sitter-python.wasm',
  comments: new Set(['comment']),
  literals: { string: 'string', integer: 'number', float: 'number', true: 'boolean', false: 'boolean' },
  identifiers: new Set(['identifier']),
  containers: { class_definition: (node) => fieldText(node, 'name') },
  functions: new Set(['function_definition', 'lambda']),
  span(node, owner) {
    if (node.type === 'lambda') {
      const parent = node.parent;
      const name = parent?.type === 'assignment' && parent.childForFieldName('right')?.id === node.id
        ? fieldText(parent, 'left')
        : undefined;
      return { name: name ?? '<anonymous>', kind: 'lambda' };
    }
    const name = fieldText(node, 'name') ?? '<anonymous>';
    const decorated = node.parent?.type === 'decorated_definition' ? node.parent.startIndex : undefined;
    if (owner) {
      return { name: `${owner}.${name}`, kind: name === '__init__' ? 'constructor' : 'method', start: decorated };
    }
    return { name, kind: 'function', start: decorated };
  },
});
