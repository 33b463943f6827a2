/** The selection stage: preferred values (IEC 60063 E-series) for a realised circuit. */
export * from './selected-part';
export { selectParts } from './select-parts';
export { searchParts, neighbouringValues, SEARCH_CAPACITOR_NEIGHBOURS, type SearchCandidate, type SearchResult } from './search';
