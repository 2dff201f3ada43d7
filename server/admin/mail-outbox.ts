import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import type { KeptMail } from '../../shared/admin';
import { outboxDir } from '../mail/fake-smtp';

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? v.name));
}

/** Messages the local fake SMTP server kept, newest first. */
export async function readOutbox(storageDir: string, limit = 200): Promise<KeptMail[]> {
  const dir = outboxDir(storageDir);
  const names = await readdir(dir).catch(() => [] as string[]);
  const newest = names.filter((n) => n.endsWith('.eml')).sort().reverse().slice(0, limit);
  return Promise.all(
    newest.map(async (name) => {
      const parsed = await simpleParser(await readFile(path.join(dir, name)));
      return {
        id: name.replace(/\.eml$/, ''),
        receivedAt: (parsed.date ?? new Date()).toISOString(),
        from: addresses(parsed.from)[0] ?? '',
        to: addresses(parsed.to),
        subject: parsed.subject ?? '',
        text: parsed.text ?? '',
      };
    }),
  );
}
