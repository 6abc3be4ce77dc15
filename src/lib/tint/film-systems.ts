import { opticalConstants, type MaterialKey } from './data/optical-constants';
import { prepareStack, type FilmStack } from './thin-film';

/** An oxide film on a metal, with the optical constants chosen for each. */
export interface FilmSystem {
  id: FilmSystemId;
  film: MaterialKey;
  substrate: MaterialKey;
  /** Which constants were chosen and why, for the reader of a ladder. */
  note: string;
}

export type FilmSystemId = 'tio2-on-titanium' | 'iron-oxide-on-iron' | 'nb2o5-on-niobium' | 'zro2-on-zirconium';

export const filmSystems: Record<FilmSystemId, FilmSystem> = {
  'tio2-on-titanium': {
    id: 'tio2-on-titanium',
    film: 'anatase',
    substrate: 'titanium',
    // The film index is a stated choice. Heat-tint films below about 450 °C are anatase, anatase + rutile
    // above (Gemelli & Camargo, Matéria 12(3), 2007); anodic films are amorphous at low voltage and anatase
    // above about 5 V (Ohtsuka's review, "Structure of anodic oxide films on titanium", abstract; an acetate-
    // buffer film was "prevailing amorphous" by TEM, Fraunhofer-Publica N-74205). No dispersion of amorphous
    // anodic TiO2 is in the sources, so the anatase index of a thin ALD film (Jolivet et al. 2023: n ≈ 2.69 at
    // 425 nm to 2.44 at 720 nm) stands in for both: it is the published thin-film TiO2 closest in phase and density.
    // Rutile (Devore 1951: n_o ≈ 2.81 at 450 nm to 2.53 at 750 nm) would put every colour about 5 % earlier in thickness.
    note:
      'TiO2 film with the anatase index of a thin ALD film (Jolivet et al. 2023), standing in for both heat-tint films ' +
      '(anatase below about 450 °C, Gemelli & Camargo 2007) and anodic films (amorphous at low voltage, anatase above ' +
      'about 5 V; no amorphous dispersion is published in the sources); titanium n, k from Johnson & Christy (1974).',
  },
  'iron-oxide-on-iron': {
    id: 'iron-oxide-on-iron',
    film: 'magnetite',
    substrate: 'iron',
    note:
      'Iron-oxide film modelled with magnetite (Fe3O4, Querry 1985) on iron (Johnson & Christy 1974). Real temper ' +
      'films are a magnetite/haematite mix; the film constants are a fitted choice: magnetite reproduces the ' +
      'handbook colour order (straw, brown, purple, blue, pale blue, grey), haematite does not give the straws.',
  },
  'nb2o5-on-niobium': {
    id: 'nb2o5-on-niobium',
    film: 'niobiumPentoxide',
    substrate: 'niobium',
    note:
      'Nb2O5 with the index of a sputtered film (Gao, Lemarchand & Lequime 2012) on niobium (Weaver, Lynch & ' +
      'Olson 1973, read from a figure). An approximation: anodic Nb2O5 is amorphous and its index may differ.',
  },
  'zro2-on-zirconium': {
    id: 'zro2-on-zirconium',
    film: 'zirconia',
    substrate: 'zirconium',
    note:
      'ZrO2 with a Sellmeier index (Bodurov et al. 2016, published for 405–635 nm, extrapolated to 380–780 nm) ' +
      'on zirconium (Querry 1987). An approximation: oxide films on zirconium vary in phase and index.',
  },
};

const stacks = new Map<FilmSystemId, FilmStack>();

/** The prepared optical stack of a system (computed once, then reused). */
export function filmStack(id: FilmSystemId): FilmStack {
  let stack = stacks.get(id);
  if (!stack) {
    const system = filmSystems[id];
    stack = prepareStack(opticalConstants[system.film], opticalConstants[system.substrate]);
    stacks.set(id, stack);
  }
  return stack;
}
