import { expect } from 'chai';
import type { Modality } from '../../../../shared/images';
import { groupImages, type GroupableImage } from '../../../../src/app/archive/image-groups';

const image = (id: string, locationId: string | null, modality: Modality, uploadedAt: string, locationName: string | null = null): GroupableImage => ({
  id,
  locationId,
  locationName,
  modality,
  uploadedAt,
});

const locations = [
  { id: 'l1', name: 'interface 2, centre' },
  { id: 'l2', name: 'layer 3' },
  { id: 'l3', name: 'fracture surface' },
];
const order: Modality[] = ['lom_bright_field', 'sem_secondary', 'sem_backscattered', 'ebsd_orientation'];

describe('client: image groups', () => {
  it('groups by location in the specimen’s order, keeping locations without images', () => {
    const groups = groupImages([image('a', 'l2', 'sem_secondary', '2026-03-01T10:00:00Z'), image('b', 'l1', 'sem_secondary', '2026-03-01T10:00:00Z')], locations, order);

    expect(groups.map((g) => [g.name, g.count])).to.deep.equal([
      ['interface 2, centre', 1],
      ['layer 3', 1],
      ['fracture surface', 0],
    ]);
    expect(groups[2]!.modalities).to.deep.equal([]);
  });

  it('orders modalities within a location as asked, whatever order the images came in', () => {
    const groups = groupImages(
      [
        image('ebsd', 'l1', 'ebsd_orientation', '2026-03-01T10:00:00Z'),
        image('bse', 'l1', 'sem_backscattered', '2026-03-01T10:00:00Z'),
        image('lom', 'l1', 'lom_bright_field', '2026-03-01T10:00:00Z'),
      ],
      locations,
      order,
    );

    expect(groups[0]!.modalities.map((m) => m.modality)).to.deep.equal(['lom_bright_field', 'sem_backscattered', 'ebsd_orientation']);
  });

  it('puts modalities missing from the order after the listed ones', () => {
    const groups = groupImages([image('eds', 'l1', 'eds_element', '2026-03-01T10:00:00Z'), image('se', 'l1', 'sem_secondary', '2026-03-01T10:00:00Z')], locations, order);

    expect(groups[0]!.modalities.map((m) => m.modality)).to.deep.equal(['sem_secondary', 'eds_element']);
  });

  it('shows the newest image first within a modality', () => {
    const groups = groupImages(
      [
        image('old', 'l1', 'sem_secondary', '2026-03-01T09:00:00Z'),
        image('new', 'l1', 'sem_secondary', '2026-03-02T09:00:00Z'),
        image('mid', 'l1', 'sem_secondary', '2026-03-01T18:30:00Z'),
      ],
      locations,
      order,
    );

    expect(groups[0]!.modalities[0]!.images.map((i) => i.id)).to.deep.equal(['new', 'mid', 'old']);
  });

  it('puts images without a location last, under "No location given"', () => {
    const groups = groupImages([image('loose', null, 'lom_bright_field', '2026-03-01T10:00:00Z')], locations, order);

    expect(groups.at(-1)).to.deep.include({ locationId: null, name: 'No location given', count: 1 });
    expect(groups).to.have.length(4);
  });

  it('still shows images filed at a location the list does not know, under their own location name', () => {
    const groups = groupImages(
      [image('x', 'l9', 'lom_bright_field', '2026-03-01T10:00:00Z', 'interface 5'), image('y', null, 'lom_bright_field', '2026-03-01T10:00:00Z')],
      locations,
      order,
    );

    expect(groups.slice(3).map((g) => [g.locationId, g.name, g.count])).to.deep.equal([
      ['l9', 'interface 5', 1],
      [null, 'No location given', 1],
    ]);
  });

  it('names an unknown location without a name neutrally', () => {
    const groups = groupImages([image('x', 'l9', 'lom_bright_field', '2026-03-01T10:00:00Z')], [], order);

    expect(groups.map((g) => g.name)).to.deep.equal(['another location']);
  });

  it('keeps every image exactly once', () => {
    const images = [
      image('1', 'l1', 'sem_secondary', '2026-03-01T10:00:00Z'),
      image('2', 'l1', 'lom_bright_field', '2026-03-02T10:00:00Z'),
      image('3', 'l2', 'ebsd_phase', '2026-03-03T10:00:00Z'),
      image('4', null, 'sem_secondary', '2026-03-04T10:00:00Z'),
      image('5', 'l7', 'other', '2026-03-05T10:00:00Z', 'edge'),
    ];

    const ids = groupImages(images, locations, order).flatMap((g) => g.modalities.flatMap((m) => m.images.map((i) => i.id)));

    expect(ids.sort()).to.deep.equal(['1', '2', '3', '4', '5']);
  });
});
