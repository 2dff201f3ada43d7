import { expect } from 'chai';
import { CommandStack, invert, type ShapeCommand, type ShapeState } from '../../../../src/app/viewer/command-stack';

const shape = (label: string): ShapeState => ({ classId: 'c-oxide', kind: 'polygon', points: [[0, 0], [10, 0], [10, 10]], label });

/** Shapes by key, changed the way the viewer applies a command. */
function apply(shapes: Map<string, ShapeState>, c: ShapeCommand): void {
  if (c.type === 'delete') shapes.delete(c.key);
  else shapes.set(c.key, c.type === 'create' ? c.shape : c.after);
}

describe('client: viewer undo, inverse commands', () => {
  it('undoes a creation by a deletion and a deletion by a creation', () => {
    expect(invert({ type: 'create', key: 'k1', shape: shape('a') })).to.deep.equal({ type: 'delete', key: 'k1', shape: shape('a') });
    expect(invert({ type: 'delete', key: 'k1', shape: shape('a') })).to.deep.equal({ type: 'create', key: 'k1', shape: shape('a') });
  });

  it('undoes an edit by swapping before and after', () => {
    expect(invert({ type: 'update', key: 'k1', before: shape('old'), after: shape('new') })).to.deep.equal({ type: 'update', key: 'k1', before: shape('new'), after: shape('old') });
  });

  it('brings the shapes back to where they were when each command is undone in turn', () => {
    const shapes = new Map<string, ShapeState>([['k0', shape('kept')]]);
    const before = structuredClone([...shapes]);
    const stack = new CommandStack<ShapeCommand>();
    const commands: ShapeCommand[] = [
      { type: 'create', key: 'k1', shape: shape('crack') },
      { type: 'update', key: 'k1', before: shape('crack'), after: shape('crack tip') },
      { type: 'delete', key: 'k0', shape: shape('kept') },
    ];
    for (const c of commands) {
      apply(shapes, c);
      stack.push(c);
    }

    for (let c = stack.undo(); c !== null; c = stack.undo()) apply(shapes, invert(c));

    expect([...shapes]).to.deep.equal(before);
  });

  it('redoes what was undone, ending where the edits ended', () => {
    const shapes = new Map<string, ShapeState>();
    const stack = new CommandStack<ShapeCommand>();
    for (const c of [{ type: 'create', key: 'k1', shape: shape('a') }, { type: 'update', key: 'k1', before: shape('a'), after: shape('b') }] as ShapeCommand[]) {
      apply(shapes, c);
      stack.push(c);
    }
    apply(shapes, invert(stack.undo()!));
    apply(shapes, invert(stack.undo()!));

    apply(shapes, stack.redo()!);
    apply(shapes, stack.redo()!);

    expect(shapes.get('k1')!.label).to.equal('b');
    expect(stack.redo()).to.equal(null);
  });
});

describe('client: viewer undo, history', () => {
  it('has nothing to undo or redo at first', () => {
    const stack = new CommandStack<string>();

    expect([stack.canUndo, stack.canRedo]).to.deep.equal([false, false]);
    expect(stack.undo()).to.equal(null);
    expect(stack.redo()).to.equal(null);
  });

  it('undoes the newest command first and offers it for redo', () => {
    const stack = new CommandStack<string>();
    stack.push('draw');
    stack.push('move');

    expect(stack.undo()).to.equal('move');
    expect([stack.canUndo, stack.canRedo]).to.deep.equal([true, true]);
    expect(stack.redo()).to.equal('move');
    expect(stack.canRedo).to.equal(false);
  });

  it('forgets the redo branch once something new is done', () => {
    const stack = new CommandStack<string>();
    stack.push('draw');
    stack.undo();

    stack.push('label');

    expect(stack.canRedo).to.equal(false);
    expect(stack.undo()).to.equal('label');
    expect(stack.undo()).to.equal(null);
  });

  it('keeps only the newest commands past its limit', () => {
    const stack = new CommandStack<number>(3);
    for (let i = 1; i <= 5; i++) stack.push(i);

    const undone = [stack.undo(), stack.undo(), stack.undo(), stack.undo()];

    expect(undone).to.deep.equal([5, 4, 3, null]);
  });

  it('keeps 200 commands by default', () => {
    const stack = new CommandStack<number>();
    for (let i = 1; i <= 201; i++) stack.push(i);
    let count = 0;
    let last: number | null = null;
    for (let c = stack.undo(); c !== null; c = stack.undo()) [count, last] = [count + 1, c];

    expect([count, last]).to.deep.equal([200, 2]);
  });

  it('drops commands about a shape that changed elsewhere, from both undo and redo', () => {
    const stack = new CommandStack<{ key: string; n: number }>();
    stack.push({ key: 'a', n: 1 });
    stack.push({ key: 'b', n: 2 });
    stack.push({ key: 'a', n: 3 });
    stack.undo();

    stack.dropWhere((c) => c.key === 'a');

    expect(stack.canRedo).to.equal(false);
    expect(stack.undo()).to.deep.equal({ key: 'b', n: 2 });
    expect(stack.undo()).to.equal(null);
  });

  it('forgets everything when cleared', () => {
    const stack = new CommandStack<string>();
    stack.push('a');
    stack.push('b');
    stack.undo();

    stack.clear();

    expect([stack.canUndo, stack.canRedo]).to.deep.equal([false, false]);
  });
});
