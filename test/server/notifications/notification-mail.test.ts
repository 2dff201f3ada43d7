import { expect } from 'chai';
import { composeDigest, composeSingle, type MailableNotification } from '../../../server/notifications/notification-mail';

const item = (n: number, projectCode = 'KV-LAM-24'): MailableNotification => ({
  kind: 'review_requested',
  projectId: 'p1',
  imageId: `image-${n}`,
  figureId: null,
  threadId: null,
  facts: { projectCode, imageName: `ARB-${n}-P1-L_050x.tif`, actorName: 'Joaquim Veldterra' },
});

describe('notifications: mail wording', () => {
  it('when a public address ends in a slash, then links do not double it', () => {
    const mail = composeSingle({ ...item(1), kind: 'mention', threadId: 't9', facts: { ...item(1).facts, excerpt: 'See the crack.' } }, 'Maren', 'https://lab.example.test/');
    expect(mail.subject).to.equal('[KV-LAM-24] Joaquim Veldterra mentioned you on ARB-1-P1-L_050x.tif');
    expect(mail.text).to.contain('Open it: https://lab.example.test/projects/p1/images/image-1?thread=t9\n');
    expect(mail.text).to.contain('“See the crack.”');
  });

  it('when a digest gathers items of two projects, then they are grouped under each project code', () => {
    const mail = composeDigest([item(1), item(2, 'KV-OXI-25'), item(3)], 'Sefa', 'https://lab.example.test');
    expect(mail.subject).to.equal('Etchfile daily digest: 3 notifications');
    expect(mail.text.indexOf('KV-LAM-24\n- Joaquim Veldterra submitted ARB-1')).to.be.lessThan(mail.text.indexOf('- Joaquim Veldterra submitted ARB-3'));
    expect(mail.text).to.contain('KV-OXI-25\n- Joaquim Veldterra submitted ARB-2-P1-L_050x.tif for review\n  https://lab.example.test/projects/p1/images/image-2');
  });

  it('when a digest holds more than 100 items, then it lists 100 and counts the rest', () => {
    const mail = composeDigest(Array.from({ length: 105 }, (_, i) => item(i)), 'Sefa', 'https://lab.example.test');
    expect(mail.subject).to.equal('Etchfile daily digest: 105 notifications');
    expect(mail.text.match(/^- /gm)).to.have.length(100);
    expect(mail.text).to.contain('…and 5 more; open Etchfile to see them all.');
  });

  it('when a notification is about a figure, then it names the figure by its title and links to the figure page (and its thread)', () => {
    const figure = (kind: MailableNotification['kind'], threadId: string | null): MailableNotification => ({
      kind,
      projectId: 'p1',
      imageId: null,
      figureId: 'f7',
      threadId,
      facts: { projectCode: 'KV-LAM-24', figureTitle: 'Plate 2, bond lines', actorName: 'Dr. Sefa Orunmade', note: 'changed the annotations of ARB-1.tif, shown in a panel' },
    });
    const mention = composeSingle(figure('mention', 't3'), 'Joaquim', 'https://lab.example.test');
    expect(mention.subject).to.equal('[KV-LAM-24] Dr. Sefa Orunmade mentioned you on the figure “Plate 2, bond lines”');
    expect(mention.text).to.contain('Open it: https://lab.example.test/projects/p1/figures/f7?thread=t3\n');
    const back = composeSingle(figure('returned_to_draft', null), 'Maren', 'https://lab.example.test');
    expect(back.subject).to.equal('[KV-LAM-24] The figure “Plate 2, bond lines” is back to draft');
    expect(back.text).to.contain('Dr. Sefa Orunmade changed the annotations of ARB-1.tif, shown in a panel, so it needs a new review');
    expect(back.text).to.contain('Open it: https://lab.example.test/projects/p1/figures/f7\n');
    const cleared = composeSingle(figure('cleared', null), 'Joaquim', 'https://lab.example.test');
    expect(cleared.text).to.contain('PNG and TIFF');
  });
});
