/**
 * The cautions shown where the work happens (coupon form, heat planner, colour sheets) and in
 * full on /safety. Short, practical, and always deferring to local codes and safety data sheets.
 */
export interface Caution {
  id: string;
  title: string;
  text: string;
}

export const cautions: Caution[] = [
  {
    id: 'titanium-fire',
    title: 'Titanium fines burn',
    text: 'Titanium swarf, grinding dust and fines burn fiercely, and water makes a titanium fire worse. Keep them swept up and away from sparks; have a class D extinguisher or dry sand at hand.',
  },
  {
    id: 'titanium-overheat',
    title: 'Overheated titanium',
    text: 'Overheated titanium can melt and react violently, and it melts far lower where it touches steel. Heavy oxidation makes it brittle. Stay within the temperatures you planned.',
  },
  {
    id: 'inert-gas',
    title: 'Argon displaces oxygen',
    text: 'Argon and other inert gases displace oxygen in closed or low spaces without warning. Purge in ventilated areas and never lean into a space that has been purged.',
  },
  {
    id: 'carbon-monoxide',
    title: 'Forges make carbon monoxide',
    text: 'Gas and solid-fuel forges make carbon monoxide. Ventilate, and use a carbon monoxide alarm in the shop.',
  },
  {
    id: 'coated-parts',
    title: 'Coated parts give toxic fumes',
    text: 'Never heat zinc-coated (galvanized) or cadmium-plated parts: their fumes are toxic. Strip coatings first and know what the metal is.',
  },
  {
    id: 'protection',
    title: 'Eyes and skin',
    text: 'Hot work needs eye protection suited to the process and burn protection. Hot metal looks the same as cold metal.',
  },
];

export const safetyDeferral =
  'These notes are reminders, not training. Follow your local codes, the safety data sheets for your materials and gases, and licensed practice.';

/** One line for forms and printed sheets, pointing to the full notes. */
export const shortCaution =
  'Hot work can hurt: titanium fines burn (class D extinguisher or dry sand, never water), argon displaces oxygen, forges make carbon monoxide, coated parts give toxic fumes. Wear eye and burn protection and follow local codes.';
