import { useState, type FormEvent } from 'react';
import { uploadSnapshotSchema } from '@shared/api/snapshots';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { validate, type FieldErrors } from '@/lib/form';
import { useUploadSnapshot } from '@/features/uploads/api/upload-snapshot';

/** What the file picker offers (the server tells archives apart by content, not by name). */
const ARCHIVE_TYPES = '.zip,.tar,.tgz,.tar.gz,.gz,application/zip,application/x-tar,application/gzip';

/**
 * "Upload a release": a label and an archive of the release's code. On success the parent is told
 * the new (or, for the same archive sent again, the existing) snapshot to follow.
 */
export function UploadForm({ repositoryId, onQueued }: { repositoryId: number; onQueued: (snapshotId: number) => void }) {
  const upload = useUploadSnapshot();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = new FormData(formElement);
    const result = validate(uploadSnapshotSchema, { label: form.get('label') ?? '' });
    const archive = form.get('archive');
    const fieldErrors: FieldErrors = result.ok ? {} : result.errors;
    if (!(archive instanceof File) || archive.size === 0) fieldErrors.archive = 'Choose the archive of the release (.zip, .tar, .tar.gz).';
    if (!result.ok || fieldErrors.archive) return setErrors(fieldErrors);
    setErrors({});
    upload.mutate(
      { repositoryId, label: result.data.label, archive: archive as File },
      {
        onSuccess: ({ snapshot }) => {
          formElement.reset();
          onQueued(snapshot.id);
        },
        onError: (error) => {
          if (error instanceof ApiError && error.field) setErrors({ [error.field]: error.message });
        },
      },
    );
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Upload a release">
      {upload.isError && !(upload.error instanceof ApiError && upload.error.field) ? <Notice tone="error">{errorMessage(upload.error)}</Notice> : null}
      <TextField label="Release label" name="label" autoComplete="off" placeholder="2026.10" className="font-mono" error={errors.label} />
      <TextField
        label="Archive"
        name="archive"
        type="file"
        accept={ARCHIVE_TYPES}
        error={errors.archive}
        hint="A .zip, .tar, .tar.gz or .tgz of the release's code; a single top folder is dropped."
      />
      <Button type="submit" disabled={upload.isPending}>
        {upload.isPending ? 'Uploading…' : 'Upload'}
      </Button>
    </form>
  );
}
