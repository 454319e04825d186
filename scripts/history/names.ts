// First names for the cup: an invented list, common enough to be read at the pass.
export const FIRST_NAMES = [
  'Ada', 'Alma', 'Amir', 'Anika', 'Arlo', 'Asha', 'Beatrix', 'Bram', 'Cal', 'Carmen', 'Cleo', 'Dara',
  'Dev', 'Edie', 'Elias', 'Elsa', 'Emeka', 'Farah', 'Felix', 'Gus', 'Hana', 'Harriet', 'Idris',
  'Isla', 'Jack', 'Jonas', 'Juno', 'Kai', 'Kenji', 'Kit', 'Lars', 'Leila', 'Lena', 'Luca', 'Mabel',
  'Malik', 'Marisol', 'Mateo', 'Maya', 'Milo', 'Nadia', 'Nell', 'Nico', 'Nora', 'Obi', 'Odette', 'Omar',
  'Otis', 'Paz', 'Pia', 'Quinn', 'Rafa', 'Remy', 'Rhea', 'Rosa', 'Rui', 'Sade', 'Sami', 'Sanne', 'Silas',
  'Sol', 'Tavi', 'Tess', 'Uma', 'Vera', 'Wen', 'Wren', 'Xavi', 'Yara', 'Yusuf', 'Zadie', 'Zeke',
] as const;
