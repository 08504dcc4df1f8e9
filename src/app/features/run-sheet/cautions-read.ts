// Which cautions a person has read today on this device. The cautions are shown open the first time
// a job of an operation comes up on a day, and folded after that, so the buttons of the first job
// fit on a phone screen without scrolling. Kept in localStorage (per device, per person and day):
// nothing of it goes to the server, and a browser that refuses storage just shows them open.
import { Injectable } from '@angular/core';

const PREFIX = 'furlong.cautions-read';

const keyOf = (personId: number, day: string): string => `${PREFIX}.${personId}.${day}`;

@Injectable({ providedIn: 'root' })
export class CautionsRead {
  /** The operations whose cautions the person has read on that day. */
  read(personId: number, day: string): string[] {
    try {
      const raw = localStorage.getItem(keyOf(personId, day));
      const parsed: unknown = raw ? JSON.parse(raw) : [];
      return Array.isArray(parsed) ? parsed.filter((v): v is string => typeof v === 'string') : [];
    } catch {
      return [];
    }
  }

  has(personId: number, day: string, operation: string): boolean {
    return this.read(personId, day).includes(operation);
  }

  /** Records a read; the person's entries of other days go, so the storage stays small. */
  mark(personId: number, day: string, operation: string): void {
    try {
      const ops = this.read(personId, day);
      if (!ops.includes(operation)) ops.push(operation);
      const own = `${PREFIX}.${personId}.`;
      for (let i = localStorage.length - 1; i >= 0; i--) {
        const key = localStorage.key(i);
        if (key?.startsWith(own) && key !== keyOf(personId, day)) localStorage.removeItem(key);
      }
      localStorage.setItem(keyOf(personId, day), JSON.stringify(ops));
    } catch {
      // Storage full or refused: the cautions show open again next time, which is the safe side.
    }
  }
}
