/**
 * Test helpers for tools outside Node (gcc/g++, chromium): find them, and decide whether a missing tool
 * skips the tests (locally) or fails them (CI=true: CI installs them, so a missing tool is a broken job).
 */
import { spawnSync } from 'node:child_process';

/** True when `command --version` runs. */
export function haveTool(command: string): boolean {
  try {
    return spawnSync(command, ['--version'], { stdio: 'ignore', timeout: 30_000 }).status === 0;
  } catch {
    return false;
  }
}

/** Under CI=true every tool must be present: the tests run (and fail) instead of skipping. */
export const IN_CI = process.env.CI === 'true';

/** The describe title: the subject, or why it is skipped. */
export function toolTitle(subject: string, tools: string[], present: boolean): string {
  return present || IN_CI ? subject : `${subject} (SKIPPED: ${tools.join('/')} not found; CI=true makes this a failure)`;
}
