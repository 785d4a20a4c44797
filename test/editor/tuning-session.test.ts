// The designer's session without a page: unsaved edits, A/B texts, and an autosave that keeps only tunings that ran.
import { describe, expect, it } from 'vitest';
import { TuningSession } from '../../editor/tuning-session';
import { AUTOSAVE_VERSIONS_KEY, readAutosaveVersions } from '../../editor/autosave-versions';
import { AUTOSAVE_KEY } from '../../editor/tuning-store';

class MemoryStorage {
  private readonly m = new Map<string, string>();
  getItem(k: string): string | null {
    return this.m.get(k) ?? null;
  }
  setItem(k: string, v: string): void {
    this.m.set(k, v);
  }
  removeItem(k: string): void {
    this.m.delete(k);
  }
}

function session(surviveFrames = 3) {
  const storage = new MemoryStorage() as unknown as Storage;
  let clock = 1000;
  const s = new TuningSession({ initialText: 'start', storage, now: () => clock++, surviveFrames });
  return { s, storage };
}

describe('TuningSession', () => {
  it('autosaves a change only after it has run for the survival frames without a new audio error', () => {
    const { s, storage } = session(3);
    s.commit('one', 'edit');
    expect(s.frame(0)).toBe(false);
    expect(s.frame(0)).toBe(false);
    expect(storage.getItem(AUTOSAVE_KEY)).toBeNull();
    expect(s.frame(0)).toBe(true);
    expect(storage.getItem(AUTOSAVE_KEY)).toBe('one');
    expect(s.autosavePending).toBe(false);
  });

  it('never autosaves a change after which the audio thread reported an error, or the page threw', () => {
    const { s, storage } = session(3);
    s.commit('breaks audio', 'edit');
    s.frame(4);
    s.frame(5);
    s.frame(5);
    expect(storage.getItem(AUTOSAVE_KEY)).toBeNull();
    expect(s.lastAutosave).toContain('not autosaved');
    s.commit('stops the page', 'edit');
    s.frame(5);
    s.cancelAutosave('the page threw an error after this change');
    for (let i = 0; i < 5; i++) s.frame(5);
    expect(storage.getItem(AUTOSAVE_KEY)).toBeNull();
  });

  it('keeps the last five versions, newest first', () => {
    const { s, storage } = session(1);
    for (const t of ['a', 'b', 'c', 'd', 'e', 'f', 'g']) {
      s.commit(t, 'edit');
      s.frame(0);
    }
    expect(readAutosaveVersions(storage).map((v) => v.text)).toEqual(['g', 'f', 'e', 'd', 'c']);
    expect(JSON.parse(storage.getItem(AUTOSAVE_VERSIONS_KEY)!)).toHaveLength(5);
  });

  it('is dirty after an edit and clean after a save; A follows saves until a file is loaded into A', () => {
    const { s } = session();
    expect(s.dirty).toBe(false);
    s.commit('edited', 'edit');
    expect(s.dirty).toBe(true);
    expect(s.a.text).toBe('start');
    s.side = 'A';
    expect(s.playing).toBe('start');
    s.side = 'B';
    expect(s.playing).toBe('edited');
    s.markSaved('edited');
    expect(s.dirty).toBe(false);
    expect(s.a.text).toBe('edited');
    s.setA('other file', 'other.json');
    s.markSaved('edited');
    expect(s.a).toEqual({ text: 'other file', name: 'other.json', fromFile: true });
  });

  it('undo and redo re-arm the autosave for the tuning they bring back', () => {
    const { s, storage } = session(1);
    s.commit('one', 'edit');
    s.frame(0);
    s.undo();
    s.frame(0);
    expect(storage.getItem(AUTOSAVE_KEY)).toBe('start');
    s.redo();
    s.frame(0);
    expect(storage.getItem(AUTOSAVE_KEY)).toBe('one');
  });
});
