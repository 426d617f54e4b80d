/** Controlled vocabularies: taxa, skeletal elements, portion zones and flat term lists. Pure. */
export * from './vocabulary';
export { Hierarchy, type HierarchyNode } from './hierarchy';
export { BUILT_IN_TAXA, TAXON_RANKS, SKELETON_GROUPS, type TaxonNode, type TaxonRank, type SkeletonGroup } from './taxa';
export { BUILT_IN_ELEMENTS, LONG_BONE, type ElementNode } from './elements';
export { SKELETON_COUNTS, type SkeletonCounts } from './skeleton-counts';
export { PORTION_ZONES, ZONE_PRESENCE_THRESHOLD, resolveZone, sortZones, meansComplete, zonesCovered, type PortionZone } from './portion-zones';
export { SIZE_CLASSES, parseSizeClass, type SizeClass } from './size-classes';
export { SIDE_TERMS, BREAK_AGE_TERMS, FUSION_TERMS, MODIFICATION_TERMS, type FlatTerm } from './terms';
export { termKey, editDistance, closestTerms } from './normalise';
