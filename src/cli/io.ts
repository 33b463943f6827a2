/** Where the CLI's text goes: stdout for results, stderr for messages. Injectable for tests. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
}
