/** For options that may be given several times (`--only a --only b`): commander calls this once per use. */
export function collectOption(value: string, previous: readonly string[] = []): string[] {
  return [...previous, value];
}
