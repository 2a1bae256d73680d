/**
 * Names of the failed tests, read from the runners' JSON reports, so the summary at the very end
 * of `npm test` says which files failed — CI shows only the tail of a long log, and the layer that
 * failed may have printed its details thousands of lines earlier.
 */
import fs from "node:fs";
import path from "node:path";
import { projectRoot } from "./settings";

const firstLine = (text: string | undefined) =>
  (text ?? "")
    .replace(/\u001b\[[0-9;]*m/g, "")
    .trim()
    .split("\n")[0]
    .slice(0, 240);
const relative = (file: string) => path.relative(projectRoot, file) || file;

type VitestReport = {
  testResults?: { name: string; status: string; message?: string; assertionResults?: { fullName: string; status: string; failureMessages?: string[] }[] }[];
};

/** Vitest's JSON reporter (the Jest-compatible shape): one line per failed test, or per file that failed outside a test. */
export function vitestFailures(reportFile: string): string[] {
  const report = readJson<VitestReport>(reportFile);
  if (!report) return [`(no report at ${reportFile})`];
  const lines: string[] = [];
  for (const file of report.testResults ?? []) {
    const failed = (file.assertionResults ?? []).filter((test) => test.status === "failed");
    for (const test of failed) lines.push(`${relative(file.name)} › ${test.fullName}: ${firstLine(test.failureMessages?.[0])}`);
    if (file.status === "failed" && failed.length === 0) lines.push(`${relative(file.name)}: ${firstLine(file.message) || "failed outside its tests"}`);
  }
  return lines;
}

type PlaywrightSuite = {
  title?: string;
  file?: string;
  specs?: { title: string; file: string; line: number; tests: { status: string; results: { error?: { message?: string } }[] }[] }[];
  suites?: PlaywrightSuite[];
};

/** Playwright's JSON reporter: one line per test whose outcome was not the expected one. */
export function playwrightFailures(reportFile: string): string[] {
  const report = readJson<{ suites?: PlaywrightSuite[]; errors?: { message?: string }[] }>(reportFile);
  if (!report) return [`(no report at ${reportFile})`];
  const lines: string[] = (report.errors ?? []).map((error) => `error outside a test: ${firstLine(error.message)}`);
  const walk = (suite: PlaywrightSuite) => {
    for (const spec of suite.specs ?? []) {
      for (const test of spec.tests) {
        if (test.status !== "unexpected" && test.status !== "flaky") continue;
        const error = test.results.find((result) => result.error)?.error?.message;
        lines.push(`${spec.file}:${spec.line} › ${spec.title}${test.status === "flaky" ? " (flaky)" : ""}: ${firstLine(error)}`);
      }
    }
    suite.suites?.forEach(walk);
  };
  report.suites?.forEach(walk);
  return lines;
}

function readJson<T>(file: string): T | null {
  try {
    return JSON.parse(fs.readFileSync(file, "utf8")) as T;
  } catch {
    return null;
  }
}
