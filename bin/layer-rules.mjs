// The module-boundary rules of the contributor guide (DEVELOPERS.md, "Layout"), as a pure function:
// `layerViolations({ file, source })` parses one file's imports and returns what breaks the rules.
// bin/check-layers.mjs runs it over the repository; test/bin/check-layers.test.ts plants violations.
import { builtinModules } from 'node:module';
import ts from 'typescript';

const NODE_BUILTINS = new Set(builtinModules.filter((m) => !m.startsWith('_')));
/** Packages that bring a UI, a store, worker wiring or the DOM. */
const UI_PACKAGES = ['react', 'react-dom', 'zustand', 'comlink', 'd3', 'd3-selection', 'd3-transition', 'd3-zoom', 'd3-drag', 'd3-brush'];

/**
 * The EDF/BDF reader's modules. The CLI opens recordings only through src/cli/recording-files.ts, over the
 * workbench's loader (src/core/formats/recording-loader.ts), so both read a file the same way (issue 13).
 */
const CLI_FORBIDDEN_READERS = new Set(['src/core/formats/edf.ts', 'src/core/formats/edf-header.ts', 'src/core/formats/edf-samples.ts']);

/** Data any layer may read (the version number in package.json). */
const SHARED_DATA = new Set(['package.json']);

/**
 * @typedef {{ specifier: string, typeOnly: boolean, kind: 'import' | 'export' | 'dynamic' | 'url', line: number }} ImportRef
 * @typedef {{ file: string, line: number, specifier: string, message: string }} Violation
 */

/**
 * Repository-relative POSIX path → layer name, or undefined when no rule applies.
 * @param {string} path
 * @returns {string | undefined}
 */
export function layerOf(path) {
  if (path.startsWith('src/core/')) return 'core';
  if (path.startsWith('workers/')) return 'workers';
  if (path.startsWith('src/bridge/')) return 'bridge';
  if (path.startsWith('src/state/')) return 'state';
  if (path.startsWith('src/ui/')) return 'ui';
  if (path.startsWith('src/cli/')) return 'cli';
  if (path === 'src/main.tsx') return 'main';
  return undefined;
}

/**
 * Every module reference in a TypeScript/TSX source, with whether it is erased at run time.
 * @param {string} file
 * @param {string} source
 * @returns {ImportRef[]}
 */
export function parseImports(file, source) {
  const sf = ts.createSourceFile(file, source, ts.ScriptTarget.ES2022, true, file.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  /** @type {ImportRef[]} */
  const refs = [];
  /** @param {ts.Node} node */
  const lineOf = (node) => sf.getLineAndCharacterOfPosition(node.getStart(sf)).line + 1;
  /** @param {ts.Node} node */
  const visit = (node) => {
    if (ts.isImportDeclaration(node) && ts.isStringLiteral(node.moduleSpecifier)) {
      const clause = node.importClause;
      let typeOnly = false;
      if (clause) {
        const named = clause.namedBindings;
        typeOnly =
          clause.isTypeOnly ||
          (!clause.name && named !== undefined && ts.isNamedImports(named) && named.elements.length > 0 && named.elements.every((e) => e.isTypeOnly));
      }
      refs.push({ specifier: node.moduleSpecifier.text, typeOnly, kind: 'import', line: lineOf(node) });
    } else if (ts.isExportDeclaration(node) && node.moduleSpecifier && ts.isStringLiteral(node.moduleSpecifier)) {
      const named = node.exportClause;
      const typeOnly =
        node.isTypeOnly || (named !== undefined && ts.isNamedExports(named) && named.elements.length > 0 && named.elements.every((e) => e.isTypeOnly));
      refs.push({ specifier: node.moduleSpecifier.text, typeOnly, kind: 'export', line: lineOf(node) });
    } else if (ts.isImportEqualsDeclaration(node) && ts.isExternalModuleReference(node.moduleReference) && ts.isStringLiteral(node.moduleReference.expression)) {
      refs.push({ specifier: node.moduleReference.expression.text, typeOnly: node.isTypeOnly, kind: 'import', line: lineOf(node) });
    } else if (ts.isCallExpression(node) && node.expression.kind === ts.SyntaxKind.ImportKeyword) {
      const arg = node.arguments[0];
      if (arg && ts.isStringLiteralLike(arg)) refs.push({ specifier: arg.text, typeOnly: false, kind: 'dynamic', line: lineOf(node) });
    } else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument) && ts.isStringLiteral(node.argument.literal)) {
      refs.push({ specifier: node.argument.literal.text, typeOnly: true, kind: 'import', line: lineOf(node) });
    } else if (ts.isNewExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === 'URL' && node.arguments && node.arguments.length >= 2) {
      const [target, base] = node.arguments;
      if (ts.isStringLiteralLike(target) && base.getText(sf).replace(/\s/g, '') === 'import.meta.url') {
        refs.push({ specifier: target.text, typeOnly: false, kind: 'url', line: lineOf(node) });
      }
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
  return refs;
}

/**
 * Resolves a relative specifier against the importing file (both repository-relative POSIX paths).
 * @param {string} file
 * @param {string} specifier
 */
function resolveRelative(file, specifier) {
  const parts = file.split('/').slice(0, -1);
  for (const seg of specifier.split('/')) {
    if (seg === '..') parts.pop();
    else if (seg !== '.' && seg !== '') parts.push(seg);
  }
  return parts.join('/');
}

/**
 * `@scope/name/sub` → `@scope/name`, `name/sub` → `name`, `node:fs` → `node:fs`.
 * @param {string} specifier
 */
function packageName(specifier) {
  const parts = specifier.split('/');
  return specifier.startsWith('@') ? parts.slice(0, 2).join('/') : parts[0];
}

/** @param {string} specifier */
function isNodeBuiltin(specifier) {
  return specifier.startsWith('node:') || NODE_BUILTINS.has(packageName(specifier));
}

/**
 * The rules, by importing layer. Each returns a message when the reference is not allowed.
 * `target` is the resolved repository path (relative specifiers) or undefined (packages).
 * @type {Record<string, (ref: ImportRef, target: string | undefined, targetLayer: string | undefined) => string | undefined>}
 */
const RULES = {
  core(ref, target, targetLayer) {
    if (target !== undefined) return targetLayer === 'core' ? undefined : `src/core imports only src/core, not ${target}`;
    if (isNodeBuiltin(ref.specifier)) return `src/core may not import node built-ins (${ref.specifier})`;
    if (UI_PACKAGES.includes(packageName(ref.specifier))) return `src/core may not import ${packageName(ref.specifier)} (UI, store, worker wiring or DOM)`;
    return undefined;
  },
  workers(ref, target, targetLayer) {
    // The built WebAssembly kernels, fetched by URL (a Vite `?url` asset) and handed to src/core/kernels.
    if (target !== undefined && /^build\/wasm\/[\w-]+\.wasm\?url$/.test(target)) return undefined;
    if (target !== undefined) return targetLayer === 'core' || targetLayer === 'workers' ? undefined : `workers/ import only src/core, not ${target}`;
    return packageName(ref.specifier) === 'comlink' ? undefined : `workers/ import only src/core and comlink, not ${ref.specifier}`;
  },
  bridge(ref, target, targetLayer) {
    if (target !== undefined) {
      if (targetLayer === 'core' || targetLayer === 'bridge') return undefined;
      if (targetLayer === 'workers') {
        if (ref.typeOnly || ref.kind === 'url') return undefined;
        return `src/bridge imports workers only with \`import type\` (and starts them with new URL(..., import.meta.url)): ${target}`;
      }
      return `src/bridge imports only comlink, src/core and types from workers/, not ${target}`;
    }
    return packageName(ref.specifier) === 'comlink' ? undefined : `src/bridge imports only comlink, src/core and types from workers/, not ${ref.specifier}`;
  },
  state(ref, target, targetLayer) {
    if (target !== undefined) {
      return targetLayer === 'core' || targetLayer === 'bridge' || targetLayer === 'state' ? undefined : `src/state imports only src/core and src/bridge, not ${target}`;
    }
    if (isNodeBuiltin(ref.specifier)) return `src/state may not import node built-ins (${ref.specifier})`;
    const pkg = packageName(ref.specifier);
    if (pkg === 'react' || pkg === 'react-dom' || pkg === 'comlink') return `src/state may not import ${pkg}`;
    return undefined;
  },
  ui(ref, target, targetLayer) {
    if (target !== undefined) {
      if (targetLayer === 'workers' && !ref.typeOnly) return `src/ui may not load workers at run time (go through src/bridge): ${target}`;
      if (targetLayer === 'cli') return `src/ui may not import the CLI: ${target}`;
      return undefined;
    }
    if (isNodeBuiltin(ref.specifier)) return `src/ui may not import node built-ins (${ref.specifier})`;
    if (packageName(ref.specifier) === 'comlink') return 'src/ui may not import comlink (go through src/bridge)';
    return undefined;
  },
  cli(ref, target, targetLayer) {
    if (target !== undefined) {
      if (CLI_FORBIDDEN_READERS.has(target))
        return `src/cli opens recordings through src/cli/recording-files.ts (the workbench's loader, src/core/formats/recording-loader.ts), not the EDF reader directly: ${target}`;
      return targetLayer === 'core' || targetLayer === 'cli' ? undefined : `src/cli imports only src/core and node, not ${target}`;
    }
    const pkg = packageName(ref.specifier);
    if (UI_PACKAGES.includes(pkg)) return `src/cli may not import ${pkg}`;
    return undefined;
  },
  main(ref, target, targetLayer) {
    if (target !== undefined && targetLayer === 'workers' && !ref.typeOnly) return `src/main.tsx may not load workers at run time (go through src/bridge): ${target}`;
    return undefined;
  },
};

/**
 * The layering violations of one file.
 * @param {{ file: string, source: string }} input  `file` is the repository-relative path (POSIX separators)
 * @returns {Violation[]}
 */
export function layerViolations({ file, source }) {
  const path = file.replace(/\\/g, '/').replace(/^\.\//, '');
  const layer = layerOf(path);
  if (!layer) return [];
  const rule = RULES[layer];
  /** @type {Violation[]} */
  const out = [];
  for (const ref of parseImports(path, source)) {
    const relative = ref.specifier.startsWith('./') || ref.specifier.startsWith('../');
    const target = relative ? resolveRelative(path, ref.specifier) : undefined;
    if (target !== undefined && SHARED_DATA.has(target)) continue;
    const message = rule(ref, target, target === undefined ? undefined : layerOf(target) ?? (target.startsWith('src/') || target === 'src' ? 'src' : undefined));
    if (message) out.push({ file: path, line: ref.line, specifier: ref.specifier, message });
  }
  return out;
}
