import { AppError } from '../http/errors';

/** A numeric id from the path, or a 400 that says which id was wrong. */
export function idParam(value: string | string[] | undefined, what: string): number {
  const text = Array.isArray(value) ? value[0] : value;
  if (text === undefined || !/^[1-9]\d{0,15}$/.test(text)) {
    throw new AppError(400, 'invalid', `The ${what} id in the path must be a positive whole number (got '${text ?? ''}').`, 'id');
  }
  return Number(text);
}
