import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';

/**
 * What the app exposes, read from the source tree (not from a hand-kept list):
 * every route handler (`route.ts` under app/, each exported HTTP method) and
 * every server action (each export of a file named `actions.ts` under app/).
 * The authorization matrix test fails when one of these has no row.
 */

const ROOT = process.cwd();
const HTTP_METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'];

function walk(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return e.name === 'node_modules' || e.name.startsWith('.') ? [] : walk(p);
    return [p];
  });
}

/** Names a module exports (functions, consts, `export { a as B }`), read with the TypeScript parser. */
export function exportedNames(file: string): string[] {
  const src = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, true, ts.ScriptKind.TSX);
  const names: string[] = [];
  const isExported = (n: ts.Node) => ts.canHaveModifiers(n) && !!ts.getModifiers(n)?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
  for (const stmt of src.statements) {
    if (ts.isFunctionDeclaration(stmt) && isExported(stmt) && stmt.name) names.push(stmt.name.text);
    else if (ts.isVariableStatement(stmt) && isExported(stmt)) {
      for (const d of stmt.declarationList.declarations) {
        if (ts.isIdentifier(d.name)) names.push(d.name.text);
        else if (ts.isObjectBindingPattern(d.name)) for (const el of d.name.elements) if (ts.isIdentifier(el.name)) names.push(el.name.text);
      }
    } else if (ts.isExportDeclaration(stmt) && !stmt.isTypeOnly && stmt.exportClause && ts.isNamedExports(stmt.exportClause)) {
      for (const el of stmt.exportClause.elements) if (!el.isTypeOnly) names.push(el.name.text);
    }
  }
  return names;
}

/** The URL pattern of a route file: app/api/admin/users/[id]/route.ts → /api/admin/users/[id] (route groups dropped). */
function routePattern(file: string): string {
  const rel = path.relative(path.join(ROOT, 'app'), path.dirname(file)).split(path.sep).filter((s) => s && !/^\(.*\)$/.test(s));
  return `/${rel.join('/')}`;
}

/** Every route handler as "METHOD /pattern", e.g. "PATCH /api/admin/users/[id]". */
export function listRouteHandlers(): string[] {
  return walk(path.join(ROOT, 'app'))
    .filter((f) => /[\\/]route\.(ts|tsx|js|mjs)$/.test(f))
    .flatMap((f) => exportedNames(f).filter((n) => HTTP_METHODS.includes(n)).map((m) => `${m} ${routePattern(f)}`))
    .sort();
}

/** Every server action as "app/…/actions.ts#exportName". */
export function listServerActions(): string[] {
  return walk(path.join(ROOT, 'app'))
    .filter((f) => path.basename(f) === 'actions.ts')
    .flatMap((f) => exportedNames(f).map((n) => `${path.relative(ROOT, f).split(path.sep).join('/')}#${n}`))
    .sort();
}

/**
 * Source files outside the convention that declare server functions ('use
 * server' anywhere but an app/**\/actions.ts file). They would escape the matrix.
 */
export function listStrayServerFunctions(): string[] {
  return ['app', 'components', 'lib']
    .flatMap((d) => walk(path.join(ROOT, d)))
    .filter((f) => /\.(ts|tsx|js|jsx|mjs)$/.test(f))
    .filter((f) => !(path.basename(f) === 'actions.ts' && f.startsWith(path.join(ROOT, 'app') + path.sep)))
    .filter((f) => /(['"])use server\1/.test(readFileSync(f, 'utf8')))
    .map((f) => path.relative(ROOT, f));
}
