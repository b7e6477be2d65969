import { useQuery } from '@tanstack/react-query';
import { useId, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { FormAlert } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { cn } from '@/lib/cn';
import {
  ACCEPTED_FILE_TYPES,
  MAX_FILE_BYTES,
  accountAttachmentsQueryOptions,
  useDeleteAttachmentMutation,
  useUploadAttachmentMutation,
} from '../api/attachments';
import type { Attachment, AttachmentOwnerType } from '../api/types';
import { formatBytes, formatDateTime } from '../lib/labels';
import { ConfirmDeleteDialog } from './confirm-delete-dialog';

interface AttachmentsBlockProps {
  accountId: number;
  ownerType: AttachmentOwnerType;
  ownerId: number;
  /** Names the record in labels: "this planter", "Hesketh Farms". */
  ownerLabel: string;
  canEdit: boolean;
  /** Compact: a smaller heading and thumbnails, for an install inside the side panel. */
  compact?: boolean;
  headingLevel?: 'h2' | 'h3' | 'h4';
  /** The surrounding section already says "Photos and documents": show only the count and the button. */
  hideHeading?: boolean;
}

/**
 * The photos and documents of one record: thumbnails (the image itself at a small width; the
 * server keeps no scaled copies), a download link for each, and for staff an upload button and a
 * delete with confirmation. Growers see the same list, read-only.
 */
export function AttachmentsBlock({ accountId, ownerType, ownerId, ownerLabel, canEdit, compact = false, headingLevel = 'h3', hideHeading = false }: AttachmentsBlockProps) {
  const all = useQuery(accountAttachmentsQueryOptions(accountId));
  const upload = useUploadAttachmentMutation(accountId);
  const remove = useDeleteAttachmentMutation(accountId);
  const [problem, setProblem] = useState<string | null>(null);
  const [deleting, setDeleting] = useState<Attachment | null>(null);
  const inputId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const Heading = headingLevel;
  const items = (all.data ?? []).filter((a) => a.ownerType === ownerType && a.ownerId === ownerId);

  const send = (file: File | undefined) => {
    setProblem(null);
    if (!file) return;
    if (file.size > MAX_FILE_BYTES) {
      setProblem(`${file.name} is ${formatBytes(file.size)}: files may be at most 10 MB.`);
      return;
    }
    upload.mutate(
      { ownerType, ownerId, file },
      {
        onError: (error) => setProblem(error.message),
        onSettled: () => {
          if (inputRef.current) inputRef.current.value = '';
        },
      },
    );
  };

  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        {hideHeading ? (
          <p className="text-loam-800 tabular">{all.isSuccess ? `${items.length} ${items.length === 1 ? 'file' : 'files'}` : ''}</p>
        ) : (
          <Heading className={cn('font-bold text-ink-900', compact ? 'text-base' : 'text-lg')}>
            Photos and documents{items.length > 0 && <span className="ml-1 font-semibold text-loam-700 tabular">({items.length})</span>}
          </Heading>
        )}
        {canEdit && (
          <div>
            {/* A real file input under a visible label-button: keyboard, screen readers and drag-and-drop all work. */}
            <input
              ref={inputRef}
              id={inputId}
              type="file"
              accept={ACCEPTED_FILE_TYPES}
              className="peer sr-only"
              aria-label={`Attach a photo or document to ${ownerLabel}`}
              disabled={upload.isPending}
              onChange={(event) => send(event.target.files?.[0])}
            />
            <label
              htmlFor={inputId}
              className={cn(
                'inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border border-loam-500 bg-white px-4 py-2 font-semibold text-ink-900 hover:bg-loam-100',
                'peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-ink-600',
                upload.isPending && 'cursor-progress opacity-70',
              )}
            >
              <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
                <path d="M10 13V3M6 7l4-4 4 4M3.5 13.5v3h13v-3" />
              </svg>
              {upload.isPending ? 'Uploading…' : 'Attach a file'}
            </label>
          </div>
        )}
      </div>
      {canEdit && !compact && <p className="mb-3 text-sm text-loam-700">JPEG, PNG or WebP photos and PDF documents, up to 10 MB each.</p>}
      {problem && (
        <div className="mb-3">
          <FormAlert>{problem}</FormAlert>
        </div>
      )}
      {all.isPending && <LoadingBlock label="Loading files…" className="py-2" />}
      {all.isError && <p role="alert" className="font-semibold text-brick-700">Files could not be loaded: {all.error.message}</p>}
      {all.isSuccess && items.length === 0 && <p className="text-loam-700">No files attached yet.</p>}
      {items.length > 0 && (
        <ul className={cn('grid gap-3', compact ? 'grid-cols-[repeat(auto-fill,minmax(7rem,1fr))]' : 'grid-cols-[repeat(auto-fill,minmax(9.5rem,1fr))]')}>
          {items.map((a) => (
            <li key={a.id} className="flex flex-col rounded-lg border border-loam-200 bg-loam-50 p-2">
              <a href={a.fileUrl} className="block rounded" download={a.originalName}>
                {a.isImage && a.thumbUrl ? (
                  <img
                    src={a.thumbUrl}
                    width={compact ? 104 : 144}
                    height={compact ? 78 : 108}
                    alt={`Photo: ${a.originalName}`}
                    loading="lazy"
                    className="aspect-[4/3] w-full rounded bg-loam-200 object-cover"
                  />
                ) : (
                  <span className="flex aspect-[4/3] w-full items-center justify-center rounded bg-white text-loam-700">
                    <svg viewBox="0 0 24 24" className="size-10" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.5">
                      <path d="M6 3h8l4 4v14H6z" />
                      <path d="M14 3v4h4M9 12h6M9 15.5h6M9 19h4" />
                    </svg>
                    <span className="sr-only">Document</span>
                  </span>
                )}
                <span className="mt-1 block truncate text-sm font-semibold text-ink-800 underline underline-offset-2" title={a.originalName}>
                  {a.originalName}
                </span>
              </a>
              <span className="text-xs text-loam-700">
                {formatBytes(a.sizeBytes)} · {formatDateTime(a.createdAt)}
                {a.uploadedByName ? ` · ${a.uploadedByName}` : ''}
              </span>
              {canEdit && (
                <Button variant="ghost" className="mt-1 min-h-9 self-start px-2 py-1 text-sm" onClick={() => setDeleting(a)}>
                  Delete<span className="sr-only"> {a.originalName}</span>
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      <ConfirmDeleteDialog
        what={deleting ? deleting.originalName : null}
        title="Delete this file?"
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        onClose={() => setDeleting(null)}
      >
        {deleting ? `${deleting.originalName} will be deleted for everyone who can see ${ownerLabel}. It cannot be undone.` : null}
      </ConfirmDeleteDialog>
    </div>
  );
}
