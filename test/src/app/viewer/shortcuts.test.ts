import { expect } from 'chai';
import { actionForKey, mayPickTool, TOOL_KEYS } from '../../../../src/app/viewer/shortcuts';

const key = (k: string, mods: Partial<{ ctrlKey: boolean; shiftKey: boolean; altKey: boolean }> = {}) => ({ key: k, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });
const everything = { annotate: true, calibrate: true, comment: true };

describe('client: viewer keys and which tools may be picked', () => {
  it('maps each tool letter to its tool, and leaves letters with Alt or Ctrl alone', () => {
    expect(actionForKey(key('c'))).to.deep.equal({ type: 'tool', tool: 'pin' });
    expect(actionForKey(key('K'))).to.deep.equal({ type: 'tool', tool: 'calibrate' });
    expect(actionForKey(key('c', { altKey: true }))).to.equal(null);
    expect(actionForKey(key('z', { ctrlKey: true }))).to.deep.equal({ type: 'undo' });
    // One letter per tool: no two letters pick the same tool.
    expect(new Set(Object.values(TOOL_KEYS)).size).to.equal(Object.keys(TOOL_KEYS).length);
  });

  it('lets a reviewer select and pin comments, but neither draw nor calibrate', () => {
    const reviewer = { annotate: false, calibrate: false, comment: true };

    expect(mayPickTool('select', reviewer, ['polyline'])).to.equal(true);
    expect(mayPickTool('pin', reviewer, ['polyline'])).to.equal(true);
    expect(mayPickTool('polyline', reviewer, ['polyline'])).to.equal(false);
    expect(mayPickTool('calibrate', reviewer, ['polyline'])).to.equal(false);
  });

  it('lets a guest only select', () => {
    const guest = { annotate: false, calibrate: false, comment: false };

    expect(['select', 'pin', 'point', 'calibrate'].map((t) => mayPickTool(t as 'select', guest, ['point']))).to.deep.equal([true, false, false, false]);
  });

  it('offers a drawing tool only when the chosen class takes its shape', () => {
    // A line class (bond interface) takes polylines, rulers and angles, not outlines (shared/annotations KINDS_FOR_SHAPE).
    const lineKinds = ['polyline', 'ruler', 'angle'] as const;

    expect(mayPickTool('polyline', everything, lineKinds)).to.equal(true);
    expect(mayPickTool('freehand', everything, lineKinds)).to.equal(false);
    expect(mayPickTool('rectangle', everything, lineKinds)).to.equal(false);
    expect(mayPickTool('ruler', everything, lineKinds)).to.equal(true);
  });
});
