/**
 * The invented people of the demo firm, as the stand-in identity provider knows them. Groups map
 * to Ingotrace roles through SAML_ROLE_MAP. Every name and address is invented (.example is a
 * reserved domain). Passwords are for the local stand-in only.
 */
export interface DemoPerson {
  subject: string;
  name: string;
  email: string;
  password: string;
  groups: string[];
  /** Shown on the sign-in page; Ingotrace itself refuses this person (deactivated in the seed). */
  note?: string;
}

export const demoPeople: DemoPerson[] = [
  {
    subject: 'kiw-0101',
    name: 'Maren Østby',
    email: 'maren.ostby@kestrelmoor.example',
    password: 'maren-demo',
    groups: ['ingotrace-manufacturing-engineers'],
  },
  {
    subject: 'kiw-0102',
    name: 'Tobiasz Wierzchlas',
    email: 'tobiasz.wierzchlas@kestrelmoor.example',
    password: 'tobiasz-demo',
    groups: ['ingotrace-manufacturing-engineers'],
  },
  {
    subject: 'kiw-0201',
    name: 'Aisling Ní Bhriain',
    email: 'aisling.nibhriain@kestrelmoor.example',
    password: 'aisling-demo',
    groups: ['ingotrace-qa-reviewers'],
  },
  {
    subject: 'kiw-0301',
    name: 'Joaquín Ferreira',
    email: 'joaquin.ferreira@kestrelmoor.example',
    password: 'joaquin-demo',
    groups: ['ingotrace-qa-approvers'],
  },
  {
    subject: 'kiw-0401',
    name: 'Priya Raghunathan',
    email: 'priya.raghunathan@kestrelmoor.example',
    password: 'priya-demo',
    groups: ['ingotrace-auditors'],
  },
  {
    subject: 'kiw-0501',
    name: 'Oluwaseun Adeyemi',
    email: 'oluwaseun.adeyemi@kestrelmoor.example',
    password: 'oluwaseun-demo',
    groups: ['ingotrace-recall-coordinators'],
  },
  {
    subject: 'kiw-0601',
    name: 'Helmer Dalvang',
    email: 'helmer.dalvang@kestrelmoor.example',
    password: 'helmer-demo',
    groups: ['ingotrace-administrators'],
  },
  // A second administrator: a change of a signing role takes effect only once another administrator confirms it.
  {
    subject: 'kiw-0602',
    name: 'Mirela Vasilescu',
    email: 'mirela.vasilescu@kestrelmoor.example',
    password: 'mirela-demo',
    groups: ['ingotrace-administrators'],
  },
  {
    subject: 'kiw-0701',
    name: 'Chiara Bellandi',
    email: 'chiara.bellandi@kestrelmoor.example',
    password: 'chiara-demo',
    groups: ['ingotrace-qa-reviewers', 'ingotrace-recall-coordinators'],
  },
  {
    subject: 'kiw-0901',
    name: 'Dieter Kranz',
    email: 'dieter.kranz@kestrelmoor.example',
    password: 'dieter-demo',
    groups: ['ingotrace-manufacturing-engineers'],
    note: 'deactivated in Ingotrace: signing in is refused',
  },
];

export function findDemoPerson(subject: string): DemoPerson | undefined {
  return demoPeople.find((person) => person.subject === subject);
}
