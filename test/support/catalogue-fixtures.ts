import { randomBytes } from 'node:crypto';
import type { User } from '../../server/auth/user.entity';
import { unique } from './fixtures';
import { runningServer } from './test-server';

/**
 * A material, sample, specimen and one image row straight in the database, for tests of
 * features that hang on images (annotations, measurements) without going through the upload pipeline.
 */
export async function makeImageRow(projectId: string, uploader: User, size = { width: 4000, height: 3000 }, pixelSizeUm: number | null = 0.5): Promise<string> {
  const ds = runningServer().ctx.dataSource;
  const tag = unique();
  const [material] = await ds.query(`INSERT INTO materials (project_id, designation) VALUES ($1, $2) RETURNING id`, [projectId, `M-${tag}`]);
  const [sample] = await ds.query(`INSERT INTO samples (project_id, code, name) VALUES ($1, $2, 'fixture') RETURNING id`, [projectId, `S-${tag}`]);
  await ds.query(`INSERT INTO sample_layers (sample_id, position, material_id, thickness_mm) VALUES ($1, 0, $2, 1)`, [sample.id, material.id]);
  const [specimen] = await ds.query(
    `INSERT INTO specimens (project_id, sample_id, code, section_plane) VALUES ($1, $2, $3, 'longitudinal') RETURNING id`,
    [projectId, sample.id, `SP-${tag}`],
  );
  const [image] = await ds.query(
    `INSERT INTO images (project_id, specimen_id, uploader_id, modality, original_name, sha256, byte_size, format, width, height, bit_depth, channels,
                         original_key, pixel_size_um, pixel_size_source, state, pyramid_levels)
     VALUES ($1, $2, $3, 'lom_bright_field', 'fixture.tif', $4, 1000, 'tiff', $5, $6, 8, 1, 'fixture', $7, $8, 'ready', 13) RETURNING id`,
    [projectId, specimen.id, uploader.id, randomBytes(32).toString('hex'), size.width, size.height, pixelSizeUm, pixelSizeUm ? 'user' : 'none'],
  );
  return image.id as string;
}
