/** The last step of the wizard: what the save did, where to see it, and a way to start again. */
import { countOf } from '~/lib/gis/issue-words';
import type { Saved } from './types';

export function SavedStep({ saved, noun, onAgain }: { saved: Saved; noun: string; onAgain: () => void }) {
  return (
    <>
      <p className="notice" role="status">
        <span aria-hidden="true">✓ </span>Saved {countOf(saved.saved, noun.replace(/s$/, ''), noun)}
        {saved.rejected ? `; ${countOf(saved.rejected, 'rejected one was', 'rejected ones were')} left out` : ''}. The
        original file is kept with the batch.
      </p>
      {saved.referenceVersion ? (
        <p>
          Version {saved.referenceVersion.version} of this layer is a draft.{' '}
          <a href="/admin/reference-layers">Publish it on the reference layers page</a>.
        </p>
      ) : (
        <p>
          <a href={`/map?upload=${saved.batchId}`}>See the saved parcels on the map, outlined and listed</a>
        </p>
      )}
      <button className="btn btn-quiet self-start" onClick={onAgain}>
        Upload another file
      </button>
    </>
  );
}
