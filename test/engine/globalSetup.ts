/**
 * Jest global setup: compiles the Node engine's worker entries (src/engine/nodeWorker.ts and
 * the tests' own test/engine/testWorker.ts) and every project file they import into
 * build/engine-test/, because worker_threads runs JavaScript, not ts-jest's in-memory output.
 *
 * Transpile-only, file by file (ts.transpileModule with tsconfig.json's options: commonjs,
 * ES2020): type errors are `npm run typecheck`'s business, and a half-done edit elsewhere in
 * src/core must not stop the engine tests from compiling. A file is transpiled again only when
 * its source is newer than its output, so a run after a one-file edit costs a few
 * milliseconds more than an idle one (a full program emit took ~5 s on the 2-core machine).
 * Each output is written under a temporary name and renamed, so a jest run in parallel never
 * loads half a file.
 */
import * as fs from "fs";
import * as path from "path";
import * as ts from "typescript";
import { ENGINE_TEST_BUILD, REPO_ROOT, WORKER_ENTRIES } from "./paths";

export interface BuildSummary {
  /** Project files reachable from the entries. */
  files: number;
  /** Of those, transpiled this time. */
  transpiled: number;
  ms: number;
}

function compilerOptions(): ts.CompilerOptions {
  const configPath = path.join(REPO_ROOT, "tsconfig.json");
  const config = ts.readConfigFile(configPath, ts.sys.readFile);
  if (config.error) throw new Error(ts.flattenDiagnosticMessageText(config.error.messageText, "\n"));
  const parsed = ts.parseJsonConfigFileContent(config.config, ts.sys, REPO_ROOT);
  return { ...parsed.options, outDir: ENGINE_TEST_BUILD, rootDir: REPO_ROOT, noEmit: false, sourceMap: false, declaration: false, incremental: false };
}

function outputOf(source: string): string {
  return path.join(ENGINE_TEST_BUILD, path.relative(REPO_ROOT, source)).replace(/\.ts$/, ".js");
}

function writeAtomically(file: string, text: string): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.tmp`;
  fs.writeFileSync(tmp, text);
  fs.renameSync(tmp, file);
}

export function compileEngineWorkers(): BuildSummary {
  const t0 = Date.now();
  const options = compilerOptions();
  const seen = new Set<string>();
  const stack = [...WORKER_ENTRIES];
  let transpiled = 0;
  while (stack.length > 0) {
    const file = stack.pop() as string;
    if (seen.has(file)) continue;
    seen.add(file);
    const text = fs.readFileSync(file, "utf8");
    for (const imported of ts.preProcessFile(text, true, true).importedFiles) {
      const resolved = ts.resolveModuleName(imported.fileName, file, options, ts.sys).resolvedModule;
      // Project sources only: node_modules is required at run time as it is.
      if (resolved && !resolved.isExternalLibraryImport && resolved.extension === ts.Extension.Ts) stack.push(resolved.resolvedFileName);
    }
    const out = outputOf(file);
    if (fs.existsSync(out) && fs.statSync(out).mtimeMs >= fs.statSync(file).mtimeMs) continue;
    const result = ts.transpileModule(text, { compilerOptions: options, fileName: file });
    writeAtomically(out, result.outputText);
    transpiled++;
  }
  return { files: seen.size, transpiled, ms: Date.now() - t0 };
}

export default function globalSetup(): void {
  compileEngineWorkers();
}
