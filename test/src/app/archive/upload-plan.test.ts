import { expect } from 'chai';
import {
  effectiveModality,
  fileProgress,
  NO_LOCATION,
  NO_OVERRIDES,
  overallProgress,
  uploadFailure,
  uploadFields,
  uploadStateLabel,
  uploadSummary,
  type BatchFields,
  type ProgressItem,
  type UploadState,
} from '../../../../src/app/archive/upload-plan';

const batch: BatchFields = {
  specimenId: 'sp1',
  locationId: 'l1',
  modality: 'sem_backscattered',
  element: '',
  magnification: 2000,
  pixelSizeUm: 0.0488,
  instrument: ' Zeiss Gemini ',
  acquiredAt: '2026-03-14',
  tags: ' interface, oxide ',
  notes: '',
};

describe('client: upload plan, fields per file', () => {
  it('sends the batch values with text trimmed and blanks left out', () => {
    expect(uploadFields(batch, NO_OVERRIDES)).to.deep.equal({
      specimenId: 'sp1',
      locationId: 'l1',
      modality: 'sem_backscattered',
      magnification: '2000',
      pixelSizeUm: '0.0488',
      instrument: 'Zeiss Gemini',
      acquiredAt: '2026-03-14',
      tags: 'interface, oxide',
    });
  });

  it('lets a file override the location and modality of the batch', () => {
    const fields = uploadFields(batch, { locationId: 'l2', modality: 'sem_secondary', element: '' });

    expect(fields).to.include({ locationId: 'l2', modality: 'sem_secondary' });
    expect(effectiveModality(batch, { ...NO_OVERRIDES, modality: 'lom_dic' })).to.equal('lom_dic');
    expect(effectiveModality(batch, NO_OVERRIDES)).to.equal('sem_backscattered');
  });

  it('files an image on the specimen itself when the file says "no location"', () => {
    const fields = uploadFields(batch, { ...NO_OVERRIDES, locationId: NO_LOCATION });

    expect(fields).not.to.have.property('locationId');
    expect(fields).to.include({ specimenId: 'sp1' });
  });

  it('sends an element only with an EDS element map, the file’s own first', () => {
    const eds = { ...batch, modality: 'eds_element' as const, element: 'Mn' };

    expect(uploadFields(eds, NO_OVERRIDES)).to.include({ element: 'Mn' });
    expect(uploadFields(eds, { ...NO_OVERRIDES, element: ' Cr ' })).to.include({ element: 'Cr' });
    expect(uploadFields({ ...batch, element: 'Mn' }, NO_OVERRIDES)).not.to.have.property('element');
    expect(uploadFields(batch, { ...NO_OVERRIDES, modality: 'eds_element', element: 'Ni' })).to.include({ modality: 'eds_element', element: 'Ni' });
  });

  it('leaves out a modality, magnification and pixel size that were not given', () => {
    const fields = uploadFields({ ...batch, modality: '', magnification: null, pixelSizeUm: null }, NO_OVERRIDES);

    expect(fields).not.to.have.any.keys('modality', 'magnification', 'pixelSizeUm');
  });

  it('sends a magnification of 0 as given, for the server to judge', () => {
    expect(uploadFields({ ...batch, magnification: 0 }, NO_OVERRIDES)).to.include({ magnification: '0' });
  });
});

describe('client: upload plan, progress', () => {
  const item = (state: UploadState, size: number, loaded = 0): ProgressItem => ({ state, size, loaded });

  it('counts an uploading file by the bytes sent', () => {
    // 3 of 8 bytes = 37.5 % → 38 (hand-computed).
    expect(fileProgress(item('uploading', 8, 3))).to.equal(38);
  });

  it('counts finished files in full and files not started as nothing', () => {
    for (const state of ['done', 'duplicate', 'failed'] as const) expect(fileProgress(item(state, 10)), state).to.equal(100);
    for (const state of ['waiting', 'queued', 'cancelled'] as const) expect(fileProgress(item(state, 10, 10)), state).to.equal(0);
  });

  it('never passes 100 % when a server reports more bytes than the file has', () => {
    expect(fileProgress(item('uploading', 10, 12))).to.equal(100);
    expect(fileProgress(item('uploading', 0, 0))).to.equal(0);
  });

  it('weighs the batch by bytes', () => {
    // 30 bytes stored + 10 half sent + 60 waiting: (30 + 5) / 100 = 35 % (hand-computed).
    expect(overallProgress([item('done', 30), item('uploading', 10, 5), item('waiting', 60)])).to.equal(35);
  });

  it('leaves cancelled files out of the batch', () => {
    // Only the 10 stored bytes count: 10 / 10 = 100 % (hand-computed).
    expect(overallProgress([item('done', 10), item('cancelled', 90)])).to.equal(100);
    expect(overallProgress([item('cancelled', 90)])).to.equal(0);
    expect(overallProgress([])).to.equal(0);
  });

  it('counts an empty file like a one-byte file, so it still moves the bar', () => {
    expect(overallProgress([item('done', 0), item('waiting', 0)])).to.equal(50);
  });
});

describe('client: upload plan, states and summary', () => {
  it('calls a refused file "refused" and a stored one "stored"', () => {
    expect(uploadStateLabel('failed')).to.equal('refused');
    expect(uploadStateLabel('done')).to.equal('stored');
  });

  it('summarises the batch, leaving out states nobody is in', () => {
    const states: UploadState[] = ['done', 'done', 'done', 'duplicate', 'failed', 'waiting', 'uploading'];

    expect(uploadSummary(states.map((state) => ({ state })))).to.equal('3 stored, 1 duplicate, 1 refused, 2 to go');
  });

  it('uses the plural for duplicates and counts cancelled files', () => {
    expect(uploadSummary([{ state: 'duplicate' }, { state: 'duplicate' }, { state: 'cancelled' }])).to.equal('2 duplicates, 1 cancelled');
    expect(uploadSummary([])).to.equal('');
  });

  it('reads a duplicate refusal as a duplicate, with the server’s sentence', () => {
    const error = { error: { status: 409, code: 'duplicate_image', message: 'The same file is already filed as SEM-0042.' } };

    expect(uploadFailure({ status: 409, error })).to.deep.equal({ state: 'duplicate', message: 'The same file is already filed as SEM-0042.' });
  });

  it('reads any other refusal as failed, adding field problems the sentence lacks', () => {
    const error = {
      error: {
        status: 400,
        code: 'validation_failed',
        message: 'Check the fields.',
        details: [
          { field: 'body.pixelSizeUm', message: 'A pixel size must be above 0.' },
          { field: 'body.modality', message: 'Check the fields.' },
        ],
      },
    };

    expect(uploadFailure({ status: 400, error })).to.deep.equal({ state: 'failed', message: 'Check the fields. A pixel size must be above 0.' });
  });

  it('explains a lost connection', () => {
    const failure = uploadFailure({ status: 0, error: new Error('network') });

    expect(failure.state).to.equal('failed');
    expect(failure.message).to.contain('cannot be reached');
  });
});
