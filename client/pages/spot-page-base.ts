/**
 * The start every per-spot page shares: a page element with a loading line, the
 * site set-up (from the tablet's cache first) and the spot, or a plain message
 * and a way home when this tablet does not know the spot.
 */
import { h, replace } from '../ui/h';
import { currentSetup } from '../app';
import type { SetupBundle, Spot } from '../../core/schemas';

export async function openSpotPage(root: HTMLElement, spotId: string, pageClass: string):
  Promise<{ body: HTMLElement; bundle: SetupBundle; spot: Spot } | { body: HTMLElement; bundle: null; spot: null }> {
  const body = h('div', { class: `page ${pageClass}` }, h('p', { class: 'muted' }, 'Loading…'));
  root.append(body);
  const setup = await currentSetup({ preferCache: true });
  const bundle = setup?.data;
  const spot = bundle?.spots.find((s) => s.id === spotId);
  if (!bundle || !spot) {
    replace(body, h('p', { class: 'error-box' }, 'This spot is not in the set-up on this tablet.'), h('a', { class: 'btn', href: '#/' }, 'Home'));
    return { body, bundle: null, spot: null };
  }
  return { body, bundle, spot };
}
