// The invented world of the demo: fictional journals, people and instruments. No real paper, journal
// or author is described here; DOIs use the test prefix 10.5555.

export const JOURNALS = [
  { name: "Marlow Review of Psychometrics", field: "psychology", issn: "5555-0101" },
  { name: "Eskdale Journal of Applied Measurement", field: "psychology", issn: "5555-0102" },
  { name: "Tarnwood Studies in Personality", field: "psychology", issn: "5555-0103" },
  { name: "Brennick Quarterly of Educational Assessment", field: "education", issn: "5555-0104" },
  { name: "Fennick Letters in Developmental Science", field: "education", issn: "5555-0105" },
  { name: "Ostvale Journal of Health Behaviour", field: "health", issn: "5555-0106" },
  { name: "Greyhaven Annals of Clinical Measurement", field: "health", issn: "5555-0107" },
  { name: "Calder Review of Organisational Research", field: "organisational", issn: "5555-0108" },
  { name: "Journal of the Whitmoor Survey Society", field: "sociology", issn: "5555-0109" },
  { name: "Pellham Consumer Attitudes Record", field: "marketing", issn: "5555-0110" },
] as const;

export const GIVEN_NAMES = [
  "Aino", "Bram", "Carys", "Dara", "Elif", "Farid", "Greta", "Hamid", "Ines", "Jonas", "Kalani", "Liesel",
  "Mateo", "Noor", "Oskar", "Priya", "Quentin", "Rasa", "Soren", "Tamsin", "Umar", "Vesna", "Wren", "Yusuf",
  "Zofia", "Émile", "Łucja", "Søren", "Chidi", "Mireille",
];

/** family names, some with particles and diacritics, to exercise citation formatting */
export const FAMILY_NAMES: { family: string; particle?: string }[] = [
  { family: "Abernathy" }, { family: "Brückner" }, { family: "Castellví" }, { family: "Dunmore" },
  { family: "Eskildsen" }, { family: "Fairweather" }, { family: "Galloway" }, { family: "Halvorsen" },
  { family: "Iwasaki" }, { family: "Jankowska" }, { family: "Kettleby" }, { family: "Lindqvist" },
  { family: "Mbeki-Orr" }, { family: "Nørgaard" }, { family: "Okonjo" }, { family: "Pemberton" },
  { family: "Quarrie" }, { family: "Rautio" }, { family: "Szabó" }, { family: "Thistlewood" },
  { family: "Uddin" }, { family: "Vance" }, { family: "Winterbourne" }, { family: "Yilmazer" },
  { family: "Berg", particle: "van den" }, { family: "Cruz", particle: "de la" }, { family: "Rossi", particle: "di" },
  { family: "Moor", particle: "ter" },
];

export const INSTRUMENTS = [
  { name: "Everyday Worry Inventory", construct: "worry", items: 9, factors: 3 },
  { name: "Classroom Engagement Scale", construct: "classroom engagement", items: 12, factors: 3 },
  { name: "Workplace Vitality Questionnaire", construct: "work vitality", items: 10, factors: 2 },
  { name: "Brief Sleep Habits Survey", construct: "sleep habits", items: 8, factors: 2 },
  { name: "Civic Trust Index", construct: "civic trust", items: 9, factors: 3 },
  { name: "Reading Motivation Profile", construct: "reading motivation", items: 12, factors: 4 },
  { name: "Caregiver Strain Checklist", construct: "caregiver strain", items: 10, factors: 2 },
  { name: "Team Climate Snapshot", construct: "team climate", items: 12, factors: 3 },
  { name: "Brand Attachment Ladder", construct: "brand attachment", items: 8, factors: 2 },
  { name: "Adolescent Self-Regard Scale", construct: "self-regard", items: 10, factors: 2 },
  { name: "Mathematics Anxiety Gauge", construct: "mathematics anxiety", items: 9, factors: 3 },
  { name: "Patient Activation Tally", construct: "patient activation", items: 13, factors: 3 },
];

export const POPULATIONS = [
  "secondary-school pupils", "first-year university students", "nurses in regional hospitals", "retail employees",
  "adults in a national panel", "primary-school teachers", "older adults living at home", "online shoppers",
  "parents of toddlers", "municipal employees",
];

export const GROUPINGS = [
  { label: "gender", groups: ["women", "men"] },
  { label: "language version", groups: ["English", "Finnish", "Turkish"] },
  { label: "school type", groups: ["urban", "rural"] },
  { label: "wave", groups: ["2019", "2021"] },
  { label: "country", groups: ["Northland", "Southmark", "Eastvale"] },
];
