import { AppError } from '../../http/errors';

/** A dump file Brimwatch cannot read: always a 400 that says where and how to fix it. */
export function badDump(message: string): AppError {
  return new AppError(400, 'bad_dump', message, 'file');
}

/** How a byte offset or line is named in messages: zero-based offsets, one-based lines, as editors and hex viewers show them. */
export const atByte = (offset: number) => `byte offset ${offset}`;
