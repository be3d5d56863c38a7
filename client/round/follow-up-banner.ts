/**
 * The round screen's follow-up banner: when the surveyor reaches a spot with an
 * open follow-up it says so ('Open follow-up: <action> (due …)'); right after an
 * OK reading it offers to close the follow-up with that reading. Works offline:
 * the open follow-ups come from the tablet's cache, the close goes through the
 * outbox behind the reading.
 */
import { h, replace } from '../ui/h';
import { toast } from '../ui/sheet';
import { closeFollowUpSheet, findingChip, followUpLine } from '../ui/follow-up';
import { closeFollowUp, loadOpenFollowUps } from '../follow-ups';
import type { FollowUp } from '../review-api';
import type { SetupBundle } from '../../core/schemas';
import type { LocalReading } from '../offline/types';

export interface FollowUpBanner {
  el: HTMLElement;
  show(spotId: string): void;
  afterSave(r: LocalReading): void;
}

export function followUpBanner(bundle: SetupBundle, readingsOf: (spotId: string) => LocalReading[]): FollowUpBanner {
  const siteId = bundle.site.id;
  const el = h('div', { class: 'fu-banner-slot', dataset: { testid: 'fu-banner-slot' } });
  let open: FollowUp[] = [];
  let spotId: string | null = null;
  let justSaved: LocalReading | null = null;

  const render = () => {
    const mine = open.filter((f) => f.spotId === spotId);
    if (!mine.length) { replace(el); return; }
    replace(el, mine.map((f) => h('div', { class: 'banner banner-fu', role: 'status', dataset: { testid: 'fu-banner', followUpId: f.id } },
      h('div', { class: 'fu-banner-text' }, findingChip(f.findingClass), h('span', null, ` ${followUpLine(f)} · ${f.assignee}`)),
      h('div', { class: 'row gap wrap' },
        justSaved && justSaved.spotId === f.spotId && justSaved.verdict.level === 'ok'
          ? h('button', {
            type: 'button', class: 'btn btn-primary', dataset: { testid: 'fu-close-with-this' },
            onclick: async () => {
              const r = justSaved!;
              try {
                await closeFollowUp(siteId, f, { verifyingReadingId: r.id });
                open = open.filter((x) => x.id !== f.id);
                justSaved = null;
                render();
                toast('Follow-up closed with this reading (saved on this tablet)');
              } catch (e) { toast(`Not closed: ${(e as Error).message}`, 'error'); }
            },
          }, 'Close follow-up with this reading') : null,
        h('button', {
          type: 'button', class: 'btn btn-small', dataset: { testid: 'fu-banner-close' },
          onclick: async () => {
            if (await closeFollowUpSheet(siteId, f, readingsOf(f.spotId))) {
              open = open.filter((x) => x.id !== f.id);
              render();
              toast('Follow-up closed (saved on this tablet)');
            }
          },
        }, 'Close…')))));
  };

  void loadOpenFollowUps(siteId, { preferCache: true, bundle }).then((r) => { open = r.list; render(); }).catch(() => undefined);
  // Then the server's current list (the cached one may be old).
  setTimeout(() => { void loadOpenFollowUps(siteId, { bundle }).then((r) => { if (!r.fromCache) { open = r.list; render(); } }).catch(() => undefined); }, 300);

  return {
    el,
    show(id) { if (id !== spotId) justSaved = null; spotId = id; render(); },
    afterSave(r) { justSaved = r; render(); },
  };
}
