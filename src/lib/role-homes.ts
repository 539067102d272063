/** What each role does in Swardkeep: the text of the role home pages (pure data). */
import type { Role } from './auth/roles';

export type RoleHome = { title: string; intro: string; duties: string[]; links: { href: string; label: string }[] };

export const ROLE_HOMES: Record<Role, RoleHome> = {
  planner: {
    title: 'Planning desk',
    intro: 'You bring parcels and proposals into the register.',
    duties: [
      'Upload parcel boundaries (zipped shapefile or GeoJSON), map their columns and confirm the coordinate system.',
      'Record each parcel’s current land use and its dated history of tillage and reseeding.',
      'File proposals: which parcels, the new land use and management, the start year and supporting documents.',
    ],
    links: [
      { href: '/proposals/new', label: 'File a proposal' },
      { href: '/proposals', label: 'Proposals and their state' },
      { href: '/parcels/upload', label: 'Upload parcels' },
      { href: '/map', label: 'Map of parcels and reference layers' },
      { href: '/screening', label: 'Screening map: where converting grassland would meet the rules' },
      { href: '/calculator', label: 'Try an estimate in the carbon calculator' },
    ],
  },
  assessor: {
    title: 'Assessment desk',
    intro: 'You estimate what each proposal does to soil carbon and grade its risk.',
    duties: [
      'Run the IPCC Tier 1 estimate against a pinned factor set: soil carbon, biomass and N2O, in CO2-equivalent.',
      'Compare alternatives: keep as grassland, reduced or no tillage, higher inputs, part conversion, restoration elsewhere.',
      'Write findings and sign the assessment off for the board.',
    ],
    links: [
      { href: '/proposals?state=submitted&sort=deadline&dir=asc', label: 'Submitted proposals waiting for assessment' },
      { href: '/proposals?state=in-assessment&sort=deadline&dir=asc', label: 'Proposals being assessed' },
      { href: '/screening', label: 'Screening map of permanent grassland' },
      { href: '/calculator', label: 'Carbon calculator' },
      { href: '/admin/factor-sets', label: 'Factor sets and their sources' },
    ],
  },
  board: {
    title: 'Board room',
    intro: 'You read assessed proposals and vote on them.',
    duties: [
      'Read the board pack for each agenda item: map, figures, risk reasons and alternatives.',
      'Vote, and see the register of earlier decisions.',
    ],
    links: [
      { href: '/board', label: 'Board meetings and their packs' },
      { href: '/proposals?state=assessed', label: 'Assessed proposals' },
      { href: '/calculator', label: 'Carbon calculator' },
    ],
  },
  chair: {
    title: 'Chair’s desk',
    intro: 'You lead the board and record its decisions.',
    duties: [
      'Record decisions with reasons, conditions, monitoring dates and the appeal window.',
      'Keep cumulative grassland loss and committed emissions within the authority’s limits.',
    ],
    links: [
      { href: '/board', label: 'Build a meeting and record decisions' },
      { href: '/proposals?state=assessed', label: 'Assessed proposals' },
      { href: '/proposals?sort=deadline&dir=asc', label: 'Proposals by decision date' },
      { href: '/calculator', label: 'Carbon calculator' },
    ],
  },
  admin: {
    title: 'Administration',
    intro: 'You keep the system and its reference data in order.',
    duties: [
      'Invite users and manage their roles.',
      'Maintain factor sets, reference map layers and the authority’s rules.',
      'Read the audit log and the outgoing mail.',
    ],
    links: [
      { href: '/admin/users', label: 'Users' },
      { href: '/proposals', label: 'Proposals' },
      { href: '/board', label: 'Board meetings (as clerk)' },
      { href: '/admin/reference-layers', label: 'Reference layers' },
      { href: '/admin/factor-sets', label: 'Factor sets' },
      { href: '/admin/mail', label: 'Mail box' },
      { href: '/admin/audit', label: 'Audit log' },
    ],
  },
};
