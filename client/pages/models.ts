/**
 * "How estimates are made" (#/models): every estimation model in plain words, with
 * its formula, when it holds and what practitioners trip over, then the sweep, the
 * uncertainty and the caution. Static text with published sources; no user text.
 */
import { h } from '../ui/h';
import '../ui/estimate.css';
import { CAUTION } from '../../core/hazard/verdicts';
import { MODEL_LABEL } from '../ui/estimate-view';
import type { EstimateModel } from '../../core/schemas/estimate';

interface ModelDoc {
  id: EstimateModel;
  use: string;
  words: string;
  formula: string;
  validity: string;
  trips: string[];
}

const MODELS: ModelDoc[] = [
  {
    id: 'point', use: 'small objects read from well away: a scoop, a tool, a bottle',
    words: 'The charge is treated as a point. The field falls off with the square of the distance, so the charge grows with the square of the distance you held the meter at.',
    formula: 'E = k·Q / r²   →   Q = 4π·ε0·r²·E      (k = 1/(4π·ε0), r from the meter to the charge centre)',
    validity: 'Holds when the distance is large against the object. Close to a small object the grounded meter face acts as a mirror and can raise the reading up to 2× (the charge may be as low as half). A meter geometry factor f (1 small probe … 2 wide flat face) divides the estimate.',
    trips: ['A wrong distance: 2× the distance is 4× the charge.', 'Distances are measured from the surface, the model wants the charge centre: use a sweep to find the depth.'],
  },
  {
    id: 'sphere', use: 'round objects: a ball valve, a round container, a person\'s head as a crude model',
    words: 'Outside a charged sphere the field is exactly that of a point charge at its centre. The isolated sphere also has a capacitance, so a potential and a stored energy follow.',
    formula: 'r = a + g;  Q = 4π·ε0·r²·E;  C = 4π·ε0·a (111 pF per metre of radius);  V = Q/C;  W = Q²/(2C);  σ = Q/(4π·a²)',
    validity: 'Exact outside an isolated sphere; nearby grounds raise its capacitance and lower its potential.',
    trips: ['Give the gap g from the surface, not from the centre: the model adds the radius.'],
  },
  {
    id: 'dipole-axis', use: 'a +/− pair, or an item charged one way with the opposite charge induced close by',
    words: 'Two equal and opposite charges. Far away the field falls off with the cube of the distance, so distance errors count three times.',
    formula: 'on axis: E = k·q·[1/(r − d/2)² − 1/(r + d/2)²];  far field: E = 2k·p/r³ with p = q·d',
    validity: 'Without the separation d only the moment p is given (far-field form).',
    trips: ['A charged item lying on a grounded bench looks like a dipole (its image charge): it reads low from afar.'],
  },
  {
    id: 'dipole-broadside', use: 'the same pair read from the side (on the perpendicular bisector)',
    words: 'As the on-axis dipole, read from the side: half the on-axis field at the same distance in the far field.',
    formula: 'E = k·q·d / (r² + d²/4)^(3/2);  far field: E = k·p/r³',
    validity: 'As the dipole on axis.',
    trips: ['The side you read from matters by a factor of 2.'],
  },
  {
    id: 'image-charge', use: 'a charge at a known height over a grounded surface (a charged bag on a grounded floor plate)',
    words: 'The grounded surface acts as a mirror with an opposite charge below it. Close in it looks like a point, far away like a dipole.',
    formula: 'E = k·q·[1/r² − 1/(r + 2h)²]   (h: the charge\'s height above the ground, r from the meter to the charge)',
    validity: 'A flat, large grounded surface under the charge; meter on the normal through the charge.',
    trips: ['The nearer the ground, the lower the reading for the same charge.'],
  },
  {
    id: 'line', use: 'rolls, hoses, pipes, cylinders (read at mid-length, square to the axis)',
    words: 'The charge is spread along a line of length L (or over a cylinder of radius a). The field falls off roughly like 1/distance close in.',
    formula: 'ρ = a + g;  E = λ/(2π·ε0·ρ) · (L/2)/√(ρ² + (L/2)²);  Q = λ·L;  σ = λ/(2π·a)',
    validity: 'Read at mid-length on the perpendicular bisector. Uniform charge along the roll.',
    trips: ['A web measured over a roller or next to a frame reads low: "no charge" is wrong. Read the free span.', 'A roll charged unevenly (edges vs centre): read several places.'],
  },
  {
    id: 'disk', use: 'round flat faces: drum lids, round panels',
    words: 'A uniformly charged disk read on its axis. Close in it looks like a large sheet, far away like a point.',
    formula: 'E = σ/(2ε0) · (1 − z/√(z² + R²))',
    validity: 'On the axis through the centre.',
    trips: ['A small target reads below a large one at the same charge density: the meter must see only the target.'],
  },
  {
    id: 'rectangle', use: 'flat panels, bag faces, tote walls',
    words: 'A uniformly charged rectangle read on its central axis.',
    formula: 'E = σ/(π·ε0) · atan(a·b / (z·√(a² + b² + z²)))   (sides 2a × 2b)',
    validity: 'On the central axis; tends to σ/(2ε0) close in and to k·Q/z² far away.',
    trips: ['Reading near an edge or corner gives less than the centre.'],
  },
  {
    id: 'sheet', use: 'webs, films, liners read close in (distance much smaller than the sheet)',
    words: 'A large charged sheet. Alone in free space its field does not depend on distance. With the grounded meter face in front (gap a) and a ground behind (distance b), part of the field goes backwards.',
    formula: 'isolated: σ = 2ε0·E;  with a ground b behind (three planes): σ = ε0·E·(a + b)/b',
    validity: 'Distance small against the sheet. Without the ground behind, the value is 2ε0·E and the true one may be as low as ε0·E.',
    trips: ['A web on a roller or a sheet on a grounded mat (b much smaller than a) reads near zero although the charge is there.', 'A web charged + on one face and − on the other (a double layer: both faces charged, opposite signs) reads near zero yet can discharge: a low reading does not prove the web is safe.'],
  },
  {
    id: 'layer-on-ground', use: 'film on a grounded roller, coating on a grounded drum, liner in a metal container',
    words: 'A thin insulating layer on a grounded backing holds its charge close to the ground, so the meter sees little of it.',
    formula: 'σ = ε0·E·(1 + εr·d/t)   (t layer thickness, εr its permittivity, d the air gap to the meter)',
    validity: 'Layer thin against the gap and the width; grounded backing.',
    trips: ['A thin layer on ground reads low yet carries a large charge: the propagating-brush case (σ above 250 µC/m², NFPA 77).'],
  },
  {
    id: 'conductor', use: 'isolated metal: drums, carts, a person (capacitance known)',
    words: 'A conductor has one potential. With its capacitance the charge and the spark energy follow. chargewalk takes the meter\'s surface-voltage display as the potential.',
    formula: 'Q = C·V;  W = C·V²/2   (person about 200 pF, drum 10-100 pF: NFPA 77 Table A.3.1.5)',
    validity: 'The surface-voltage display equals the potential only for a large flat target with the meter as the nearest ground; a contact voltmeter gives the true potential.',
    trips: ['Reading the display as the object\'s voltage whatever the distance or object size.', 'Meter or operator not grounded, meter not zeroed.'],
  },
  {
    id: 'bulk-cylinder', use: 'charged powder or liquid in a cylindrical container (indicative only)',
    words: 'Space charge in the contents of a long cylinder. Larger containers hold less before breakdown, which is why big silos are worst.',
    formula: 'at the wall: E = ρ·R/(2ε0);  at a gap g outside: E = ρ·R²/(2ε0·(R + g));  in a sphere of radius R (variant): E = ρ·R/(3ε0) at the wall, ρ·R³/(3ε0·(R + g)²) at a gap g',
    validity: 'Indicative: uniform space charge, long cylinder (or sphere), no charge on the walls. The wall field grows with R at the same ρ, so a big silo reaches breakdown (3 MV/m) at a lower charge density than a small bin.',
    trips: ['The container wall, if conductive and grounded, hides the contents: read through an opening only with the process stopped and safe.'],
  },
];

export function modelsPage(root: HTMLElement): void {
  root.append(h('div', { class: 'page models-page' },
    h('div', { class: 'row between wrap' }, h('h1', { dataset: { testid: 'models-title' } }, 'How estimates are made'),
      h('button', { type: 'button', class: 'btn no-print', onclick: () => history.back() }, '◀ Back')),
    h('p', { class: 'est-caution' }, CAUTION),
    h('section', { class: 'card' },
      h('h2', null, 'What an estimate is'),
      h('p', null, 'A field meter reads the electric field at its face. chargewalk turns that reading, the distance you held it at and the shape of the object into an equivalent charge (and, where the shape defines them, surface charge density, potential and stored energy) with a published electrostatic model. It is the charge an idealised object would need to give that reading, not a measured charge: the meter face, your body and nearby grounds change the field.'),
      h('p', null, 'Every number is shown with the model, its inputs and its validity warnings. Pick the model per spot under Set-up → Spots; a sweep helps you choose.'),
      h('h3', null, 'What everyone trips over'),
      h('ul', { class: 'trips' },
        h('li', null, h('strong', null, 'Distance. '), 'It is the largest multiplier: a point charge goes with the distance squared, a dipole with its cube. Measure it; do not guess.'),
        h('li', null, h('strong', null, 'The meter\'s own image. '), 'A grounded meter close to a small object raises the reading up to 2×.'),
        h('li', null, h('strong', null, 'A web over a roller reads low. '), 'The roller (a ground close behind) takes the field: read the free span.'),
        h('li', null, h('strong', null, 'A thin layer on ground carries a large charge. '), 'It reads low; it is the propagating-brush case.'),
        h('li', null, h('strong', null, 'A small target reads low. '), 'At the same charge density a small object gives less field than a large one: the target must fill the meter\'s view.'),
        h('li', null, h('strong', null, 'One reading on a non-uniform insulator. '), 'Read several places (NFPA 77 (2000) 5.4.2-5.4.3).'),
        h('li', null, h('strong', null, 'Humidity. '), 'The same process reads very differently in dry winter air; note the RH.'))),
    h('nav', { class: 'toc no-print', 'aria-label': 'Models' }, MODELS.map((m) => h('a', { class: 'btn btn-small', href: `#/models`, onclick: (e: Event) => { e.preventDefault(); document.getElementById(`model-${m.id}`)?.scrollIntoView({ block: 'start' }); } }, MODEL_LABEL[m.id]))),
    MODELS.map((m) => h('section', { class: 'card model-card', id: `model-${m.id}`, dataset: { model: m.id } },
      h('h2', null, MODEL_LABEL[m.id][0]!.toUpperCase() + MODEL_LABEL[m.id].slice(1)),
      h('p', { class: 'muted' }, `For ${m.use}.`),
      h('p', null, m.words),
      h('p', { class: 'formula' }, m.formula),
      h('p', null, h('strong', null, 'Holds when: '), m.validity),
      h('ul', { class: 'trips' }, m.trips.map((t) => h('li', null, t))))),
    h('section', { class: 'card' },
      h('h2', null, 'Sweep: reading at several distances'),
      h('p', null, 'Read the object at three or more distances. The slope on log-log axes is the fall-off exponent m (|E| ~ 1/dᵐ): about 0 for a large sheet, 1 for a long line, 2 for a point, 3 for a dipole. Because distances are measured from the surface, not from the charge centre, a point charge a few centimetres deep looks like a line at short range; the fit therefore allows an unknown depth.'),
      h('p', null, 'Each candidate model is fitted on log |E| (a meter\'s errors are multiplicative) and the models are ranked by AICc (Burnham and Anderson). Differences below 2 mean the data cannot tell them apart; a large scatter means no model fits. The chosen model\'s charge comes with a 95 % interval from the fit.')),
    h('section', { class: 'card', dataset: { testid: 'models-web-current' } },
      h('h2', null, 'Moving web: the charge a line carries off'),
      h('p', null, 'A charged web that moves carries its charge away as a current: I = σ·w·v (σ its surface charge density, w its width, v the line speed). For example 5 µC/m² on a 1.5 m web at 4 m/s is 30 µA. A neutraliser (static bar) must deliver that current with the opposite sign, and the current makes lines running at different speeds comparable.'),
      h('p', { class: 'formula' }, 'I = σ·w·v      (5 µC/m² × 1.5 m × 4 m/s = 30 µA)'),
      h('p', null, 'chargewalk shows this current beside the sheet and layer estimates of a web spot when the spot has a width and the reading a line speed.'),
      h('ul', { class: 'trips' },
        h('li', null, 'A web charged + on one face and − on the other (a double layer) reads near zero on a field meter, yet each face can discharge: its current is not what the meter sees.'))),
    h('section', { class: 'card', dataset: { testid: 'models-plausibility' } },
      h('h2', null, 'Plausibility: numbers that cannot be right'),
      h('ul', null,
        h('li', null, h('strong', null, 'Surface charge density above about 26.6 µC/m². '), 'Air breaks down near 3 MV/m, so one charged surface in air cannot hold much more than ε0 × 3 MV/m ≈ 26.6 µC/m² (the AIChE CCPS Process Safety Glossary, "Surface Charge Density", quotes 26.5 µC/m²). An estimate above it means the model or the distance is wrong, discharges are happening, or it is a double layer (a thin layer on a conductor, which can hold far more: the propagating-brush case). chargewalk warns.'),
        h('li', null, h('strong', null, 'A field above about 3 MV/m at the meter. '), 'That is above the breakdown of air: the reading is not credible; check the unit (kV/m against V/m, V/inch against V/cm) and the meter range. chargewalk warns.'))),
    h('section', { class: 'card' },
      h('h2', null, 'Uncertainty'),
      h('p', null, 'The interval beside every number propagates the meter\'s stated accuracy (default 5 %) and the distance uncertainty (per reading, else the spot\'s, else the larger of 5 mm and 10 % of the distance) through the model, to first order in log space (GUM, JCGM 100:2008), with a coverage factor of 2 (about 95 %). The model\'s own error (the real shape, the meter\'s image) is not in the interval: it is in the warnings.'),
      h('h2', null, 'Hazard checks'),
      h('p', null, 'The estimate is judged against the thresholds of the area: the ESD programme limits (ANSI/ESD S20.20) in an EPA; spark energy against the MIE of the atmosphere, surface charge density against brush and propagating-brush thresholds, and charge against the minimum ignition charge and transferred-charge limits in a hazardous zone; shocks to people everywhere. Each check shows the numbers compared, the source of the threshold (or "from memory" where no published copy was seen) and what it assumed.'),
      h('p', { class: 'est-caution' }, CAUTION)),
  ));
}
