import fs from 'node:fs/promises';
import type { Request, Response } from 'express';
import multer from 'multer';
import { loadConfig } from '../config';
import { ValidationError } from '../errors';
import { IngestError, incomingDir } from '../ingest';

/** The text fields an upload may carry besides its file, and their size: a label is short. */
const FIELD_LIMITS = { fields: 4, fieldSize: 1024, fieldNameSize: 100, files: 1, parts: 6 } as const;

/**
 * Streams a multipart/form-data request's `archive` file to a temporary file under the upload
 * folder (never into memory), refusing it past the archive size limit, and leaves the text fields
 * in `req.body`. Returns the temporary file's path (the caller deletes or keeps it), or undefined
 * when the request carried no file. Multer deletes a partly written file itself when it refuses.
 */
export async function receiveArchive(req: Request, res: Response): Promise<string | undefined> {
  const { maxArchiveBytes } = loadConfig().ingest;
  const receive = multer({
    storage: multer.diskStorage({ destination: await incomingDir() }),
    limits: { ...FIELD_LIMITS, fileSize: maxArchiveBytes },
  }).single('archive');
  try {
    await new Promise<void>((resolve, reject) => receive(req, res, (error: unknown) => (error ? reject(error) : resolve())));
  } catch (error) {
    if (req.file?.path) await fs.rm(req.file.path, { force: true });
    throw refusal(error, maxArchiveBytes);
  }
  return req.file?.path;
}

function refusal(error: unknown, maxArchiveBytes: number): Error {
  if (!(error instanceof multer.MulterError)) {
    // busboy's own: a cut-off or malformed body
    return new ValidationError(`The upload could not be read as multipart/form-data: ${error instanceof Error ? error.message : String(error)}.`, 'archive');
  }
  switch (error.code) {
    case 'LIMIT_FILE_SIZE':
      return new IngestError('archive_too_large', `The archive is over the limit of ${maxArchiveBytes} bytes.`);
    case 'LIMIT_UNEXPECTED_FILE':
      return new ValidationError(`Send one file, in the field "archive" (got ${JSON.stringify(String(error.field ?? '').slice(0, 100))}).`, 'archive');
    case 'LIMIT_FILE_COUNT':
      return new ValidationError('Send one file, in the field "archive".', 'archive');
    default:
      return new ValidationError(`The upload has too many or too large fields: send "label" and "archive" only (${error.message}).`, error.field ?? undefined);
  }
}
