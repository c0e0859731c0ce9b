/**
 * What the jobs, routes and `doublet push` call to turn an upload, a git tag or a local folder
 * into the analyzers' file list (paths relative, `/`-separated, sorted, with skipped entries and
 * their reasons), safely and under the limits in server/config.ts. Nothing here touches the
 * database.
 */
export { readFolder } from './folder';
export { readArchive, readUploadedArchive, type ArchiveContents, type ArchiveReadOptions } from './archive';
export { detectArchiveFormat, type ArchiveFormat } from './detect';
export { IngestError, type IngestErrorCode } from './errors';
export { ingestLimits, type IngestLimits } from './limits';
export { fetchTags, listTags, mirrorPath, parseGitRemote, readTag, redactCredentials, GitRemote, type GitTag, type GitOptions, type TagContents, type TagReadOptions } from './git';
export { packFolder, type PackOptions, type PackResult } from './pack';
export type { FileList } from './file-list';
export { deleteStoredArchive, incomingDir, keepArchive, storedArchivePath, uploadDir } from './stored-archives';
