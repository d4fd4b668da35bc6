import { describe, expect, it } from 'vitest';
import { didYouMean, editDistance, nearestName } from '../../src/spec/nearest-name.ts';

describe('editDistance (optimal string alignment Damerau–Levenshtein)', () => {
  it.each([
    // Levenshtein's textbook example: kitten -> sitting is 3 edits (2 substitutions, 1 insertion);
    // e.g. Jurafsky & Martin, Speech and Language Processing, ch. 2 (minimum edit distance), from memory.
    ['kitten', 'sitting', 3],
    ['', 'abc', 3],
    ['abc', '', 3],
    ['same', 'same', 0],
    // One transposition of adjacent characters costs 1 (Damerau 1964), where plain Levenshtein counts 2.
    ['trail', 'trial', 1],
    ['ab', 'ba', 1],
    // The optimal-string-alignment variant does not edit a substring twice: CA -> ABC is 3
    // (the unrestricted Damerau–Levenshtein distance is 2); the standard example of the difference, from memory.
    ['CA', 'ABC', 3],
    ['potental', 'potential', 1],
    ['omga', 'omega', 1],
  ])('%s -> %s is %i', (a, b, d) => {
    expect(editDistance(a, b)).toBe(d);
    expect(editDistance(b, a)).toBe(d);
  });
});

describe('nearestName', () => {
  const fields = ['id', 'caption', 'units', 'space', 'box', 'mass', 'constants', 'potential', 'trial', 'basis', 'states', 'parameters'];
  it('suggests the closest valid name for a slip', () => {
    expect(nearestName('potental', fields)).toBe('potential');
    expect(nearestName('trail', fields)).toBe('trial');
    expect(nearestName('paramters', fields)).toBe('parameters');
    expect(nearestName('Mass', fields)).toBe('mass');
  });
  it('suggests nothing for a word that is not a slip of any name', () => {
    expect(nearestName('colour', fields)).toBeNull();
    expect(nearestName('zz', fields)).toBeNull();
    // Single letters are names of their own, not slips of each other.
    expect(nearestName('b', ['a', 'x'])).toBeNull();
    expect(nearestName('X', ['a', 'x'])).toBe('x');
    expect(didYouMean('zz', fields)).toBe('');
  });
  it('phrases the suggestion', () => {
    expect(didYouMean('omga', ['x', 'omega'])).toBe(': did you mean omega?');
  });
});
