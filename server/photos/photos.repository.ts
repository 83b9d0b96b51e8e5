import { photoSchema, type EntityData } from '../../shared/sync/protocol';
import { tableRecordStore, type RecordStore } from '../sync/record-store';
import { Photo } from './photo.model';

/** How sync reads and writes photo records (the bytes go through the photo routes). */
export const photoRecordStore: RecordStore<'photo'> = tableRecordStore({
  entity: 'photo',
  model: Photo,
  fields: Object.keys(photoSchema.shape) as (keyof EntityData['photo'] & string)[],
  dateFields: ['takenAt'],
  parentOf: (photo) => ({ entity: photo.ownerEntity, id: photo.ownerId, field: 'ownerId' }),
  extraOnCreate: { storedSizes: [] },
});
