/** Wrong arguments: the usage follows the message. */
export class UsageError extends Error {}

/** A file that cannot be used: one line naming the file and the reason, then exit 2. */
export class InputError extends Error {}

const fileErrors: Record<string, string> = {
  ENOENT: 'no such file',
  EACCES: 'permission denied',
  EISDIR: 'it is a directory',
  ENOTDIR: 'a part of the path is not a folder',
};

/** Whether `error` is one of the file system's own (no such file, no permission, ...). */
export function isFileError(error: unknown): boolean {
  const code = (error as { code?: string }).code;
  return code !== undefined && code in fileErrors;
}

/** The reason a file operation failed, in words. */
export function fileErrorReason(error: unknown): string {
  const code = (error as { code?: string }).code;
  return (code && fileErrors[code]) ?? (error as Error).message;
}
