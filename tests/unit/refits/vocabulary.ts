import { countingVocabulary } from '../../../core/host/counting/vocabulary';
import { builtInVocabulary } from '../../../core/vocab/index';

/** The built-in controlled vocabulary, as refits and counting read it. */
export const fixtureVocabulary = countingVocabulary(builtInVocabulary);
