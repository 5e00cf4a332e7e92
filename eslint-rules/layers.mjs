// Emfolio's layer rules as one small ESLint plugin. Import specifiers are resolved to a path
// relative to the repository root ("@/x" and relative paths alike), so "../client", "./client" and
// "@/db/client" are one and the same module.
import path from "node:path";

const ROOT = path.resolve(import.meta.dirname, "..");

/** The file being linted, relative to the repository root, with forward slashes. */
function fileOf(context) {
  return path.relative(ROOT, context.physicalFilename ?? context.filename).split(path.sep).join("/");
}

/** Where an import points inside the repository ("db/client"), or null for a package. */
function targetOf(context, specifier) {
  let absolute;
  if (specifier.startsWith("@/")) absolute = path.join(ROOT, specifier.slice(2));
  else if (specifier.startsWith(".")) absolute = path.resolve(path.dirname(context.physicalFilename ?? context.filename), specifier);
  else return null;
  return path.relative(ROOT, absolute).split(path.sep).join("/").replace(/\.(ts|tsx|mjs|js)$/, "").replace(/\/index$/, "");
}

/** Calls `check(node, specifier, typeOnly)` for every static import, re-export, dynamic import and require. */
function eachImport(check) {
  return {
    ImportDeclaration(node) {
      const typeOnly = node.importKind === "type" || (node.specifiers.length > 0 && node.specifiers.every((s) => s.importKind === "type"));
      check(node.source, node.source.value, typeOnly);
    },
    ExportNamedDeclaration(node) {
      if (node.source) check(node.source, node.source.value, node.exportKind === "type");
    },
    ExportAllDeclaration(node) {
      check(node.source, node.source.value, node.exportKind === "type");
    },
    ImportExpression(node) {
      if (node.source.type === "Literal" && typeof node.source.value === "string") check(node.source, node.source.value, false);
    },
    CallExpression(node) {
      const arg = node.arguments[0];
      if (node.callee.type === "Identifier" && node.callee.name === "require" && arg?.type === "Literal" && typeof arg.value === "string") {
        check(arg, arg.value, false);
      }
    },
  };
}

const dbClientOnlyInQueries = {
  meta: {
    type: "problem",
    docs: { description: "Only db/queries/* may import db/client (the one pool)." },
    messages: { outside: "Only db/queries/* (and tests) may import db/client; call a query (db/queries/connection closes the pool)." },
    schema: [],
  },
  create(context) {
    const file = fileOf(context);
    // Integration tests read and backdate rows directly to set up the states they check.
    if (file.startsWith("db/queries/") || file.startsWith("tests/")) return {};
    return eachImport((node, specifier) => {
      if (targetOf(context, specifier) === "db/client") context.report({ node, messageId: "outside" });
    });
  },
};

const noDbInUi = {
  meta: {
    type: "problem",
    docs: { description: "app/ and components/ never import db/; row types may be imported type-only from db/schema." },
    messages: { ui: "app/ and components/ never import db/ ({{target}}): go through lib/dal. Only `import type` from db/schema is allowed." },
    schema: [],
  },
  create(context) {
    const file = fileOf(context);
    if (!file.startsWith("app/") && !file.startsWith("components/")) return {};
    return eachImport((node, specifier, typeOnly) => {
      const target = targetOf(context, specifier);
      if (target === null || !(target === "db" || target.startsWith("db/"))) return;
      if (typeOnly && target === "db/schema") return;
      context.report({ node, messageId: "ui", data: { target } });
    });
  },
};

const plugin = { meta: { name: "emfolio-layers" }, rules: { "db-client-only-in-queries": dbClientOnlyInQueries, "no-db-in-ui": noDbInUi } };
export default plugin;
