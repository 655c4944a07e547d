import { expect } from "vitest";
import { StorageError, type StorageErrorCode } from "../../../server/storage";

/** Awaits `p`, expects it to fail with a StorageError of `code`, and returns that error. */
export async function storageError(p: Promise<unknown>, code: StorageErrorCode): Promise<StorageError> {
  const err = await p.then(
    () => undefined,
    (e) => e,
  );
  expect(err).toBeInstanceOf(StorageError);
  expect((err as StorageError).code).toBe(code);
  return err as StorageError;
}
