/** Small choices the tablet remembers between rounds (not records: those live in IndexedDB). */
const PREFIX = 'chargewalk.';

function read(key: string): string | null {
  try { return localStorage.getItem(PREFIX + key); } catch { return null; }
}
function write(key: string, value: string | null): void {
  try {
    if (value === null) localStorage.removeItem(PREFIX + key);
    else localStorage.setItem(PREFIX + key, value);
  } catch { /* private mode or full: the choice is simply not remembered */ }
}

export const prefs = {
  get siteId(): string | null { return read('siteId'); },
  set siteId(v: string | null) { write('siteId', v); },
  get surveyor(): string | null { return read('surveyor'); },
  set surveyor(v: string | null) { write('surveyor', v); },
  /** Names of surveyors used on this tablet, most recent first. */
  get surveyors(): string[] {
    try { const v = JSON.parse(read('surveyors') ?? '[]'); return Array.isArray(v) ? v.filter((x) => typeof x === 'string') : []; } catch { return []; }
  },
  rememberSurveyor(name: string): void {
    const list = [name, ...this.surveyors.filter((s) => s !== name)].slice(0, 12);
    write('surveyors', JSON.stringify(list));
    this.surveyor = name;
  },
  meterFor(siteId: string): string | null { return read(`meter.${siteId}`); },
  setMeterFor(siteId: string, meterId: string): void { write(`meter.${siteId}`, meterId); },
};
