// Writes the bundled demo data in kb-samples/: the invented archive of "The Harrowmouth Gazette &
// Shipping List" (a fictional river port, 1890-1930). Deterministic: a seeded PRNG drives every
// choice, so re-running gives byte-identical files.
//
// Usage: node scripts/make-samples.mjs [--out DIR] [--quiet]
//   --out DIR  folder to write into (default: kb-samples/ beside this script's parent folder)
//   --quiet    do not print the summary (default: print it to stdout)
//
// Everything here is invented: towns, rivers, firms, people, vessels and wharves.

import { mkdirSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

// ---------------------------------------------------------------------------------------------
// Settings
// ---------------------------------------------------------------------------------------------

/** PRNG seed; any fixed number works, this one is the gazette's first "issue date". */
const SEED = 18900104;
/** Number of articles; ~7 mentions each gives comfortably more than the 520 required. */
const DOC_COUNT = 126;
/** First and last year of the archive. */
const FIRST_YEAR = 1890;
const LAST_YEAR = 1930;
/** Age from which a person can appear in the news in their own right. */
const ADULT_AGE = 20;
/** Chance that an ordinary actor slot is filled by someone the table lacks; tuned for ~20% NIL. */
const NIL_CHANCE = 0.29;
/** Chance that OCR damage hits a mention's surface (on top of the chosen form). */
const OCR_CHANCE = 0.22;
/** OCR chance for a clean non-person name: places, firms and vessels have fewer written variants. */
const CLEAN_OCR_CHANCE = 0.4;
/** Chance that a first mention uses the canonical name unchanged (the rest are variants). */
const CLEAN_FIRST_CHANCE = 0.35;
/** Chance that a person's honorific is written outside the mention span ("Mr. " + "Pell"). */
const HONORIFIC_OUTSIDE_CHANCE = 0.12;
/** Chance that a name with diacritics loses them (type-setting without accented sorts). */
const STRIP_DIACRITICS_CHANCE = 0.6;
/** Minimums the task sets; the generator refuses to write less. */
const MIN_ENTITIES = 320;
const MIN_DOCUMENTS = 120;
const MIN_MENTIONS = 520;
/** Acceptable NIL share of mentions. */
const NIL_SHARE_RANGE = [0.17, 0.23];

const argv = process.argv.slice(2);
const outIndex = argv.indexOf("--out");
const OUT =
  outIndex >= 0 && argv[outIndex + 1]
    ? resolve(argv[outIndex + 1])
    : join(dirname(fileURLToPath(import.meta.url)), "..", "kb-samples");
const QUIET = argv.includes("--quiet");

// ---------------------------------------------------------------------------------------------
// Seeded randomness
// ---------------------------------------------------------------------------------------------

/** mulberry32: a small 32-bit PRNG, good enough for demo data and fully reproducible. */
function mulberry32(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rand = mulberry32(SEED);
const int = (lo, hi) => lo + Math.floor(rand() * (hi - lo + 1));
const chance = (p) => rand() < p;
const pick = (items) => items[Math.floor(rand() * items.length)];
/** Pick from [value, weight] pairs; zero weights are skipped. */
function weighted(pairs) {
  const total = pairs.reduce((sum, [, w]) => sum + w, 0);
  let r = rand() * total;
  for (const [value, w] of pairs) {
    r -= w;
    if (r < 0 && w > 0) return value;
  }
  return pairs.filter(([, w]) => w > 0).at(-1)[0];
}
function shuffle(items) {
  const out = [...items];
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}
/** Log-uniform integer: priors spread over orders of magnitude. */
const logUniform = (lo, hi) => Math.round(Math.exp(Math.log(lo) + rand() * (Math.log(hi) - Math.log(lo))));

// ---------------------------------------------------------------------------------------------
// Vocabulary of the invented world
// ---------------------------------------------------------------------------------------------

const COUNTIES = ["Wendshire", "Carrowshire", "Stenholt", "Ambry Vale"];

/** Trades: the core of a descriptive firm name, what it handles, and a few context words. */
const TRADES = [
  { core: "Rope Works", goods: "rope, cordage and twine", words: "ropewalk and hemp stores" },
  { core: "Tallow", goods: "tallow, hides and candles", words: "melting house and hide sheds" },
  { core: "Corn and Seed", goods: "wheat, barley and oats", words: "granary and seed warehouse" },
  { core: "Timber", goods: "deals, battens and pit props", words: "timber ponds and saw mill" },
  { core: "Coal", goods: "coal and coke", words: "coal staithes and barges" },
  { core: "Brewery", goods: "ale, stout and malt", words: "maltings and brewhouse" },
  { core: "Salt Works", goods: "salt", words: "salt pans and boiling houses" },
  { core: "Ice", goods: "ice and fresh fish", words: "ice house and fish market stalls" },
  {
    core: "Lighterage",
    goods: "lighterage of cargoes",
    words: "lighters and dumb barges",
    cargo: "general cargo",
  },
  { core: "Towing", goods: "towage", words: "steam tugs", cargo: "general cargo" },
  { core: "Ship Chandlery", goods: "ship's stores, paint and canvas", words: "chandler's store on the quay" },
  { core: "Sailcloth Mills", goods: "sailcloth and canvas", words: "looms and bleaching greens" },
  { core: "Flour Mills", goods: "flour and bran", words: "roller mills and granary" },
  { core: "Brick and Tile", goods: "bricks, tiles and drainpipes", words: "clay pits and kilns" },
  {
    core: "Marine Insurance",
    goods: "hull and cargo insurance",
    words: "underwriting room",
    cargo: "general cargo",
  },
  { core: "Foundry", goods: "castings, anchors and chain", words: "cupola furnace and chain shop" },
  {
    core: "Dredging",
    goods: "dredging of the fairway",
    words: "bucket dredgers and hopper barges",
    cargo: "ballast",
  },
  { core: "Wine", goods: "wine and brandy", words: "bonded cellars" },
  { core: "Fish Curing", goods: "herring and kippers", words: "smoke houses and curing sheds" },
  { core: "Oil Cake", goods: "linseed and oil cake", words: "crushing mill" },
];
/** What a vessel carries for a firm of this trade. */
const cargoOf = (trade) => trade.cargo ?? trade.goods;
/** Trade cores that are already a place noun and so take "Ltd." rather than "Company". */
const WORKS_CORES = new Set([
  "Rope Works",
  "Brewery",
  "Salt Works",
  "Sailcloth Mills",
  "Flour Mills",
  "Foundry",
]);

// biome-ignore format: compact data table
const MALE_FIRST = [
  "John", "William", "Charles", "Thomas", "George", "James", "Robert", "Joseph", "Benjamin", "Samuel",
  "Henry", "Edward", "Frederick", "Josiah", "Jabez", "Ezra", "Silas", "Amos", "Reuben", "Obadiah",
  "Septimus", "Walter", "Arthur", "Albert", "Herbert", "Matthias", "Nathaniel", "Abel", "Enoch",
  "Ebenezer", "Harold", "Ernest", "Alfred", "Isaac", "Jonas", "Lemuel", "Tobias", "Ambrose", "Barnabas",
];
/** Weight of the names clerks abbreviate, so "Jno." and "Wm." turn up often enough. */
const ABBREVIATED_NAME_WEIGHT = 5;
const FEMALE_FIRST = [
  "Mary",
  "Eliza",
  "Hannah",
  "Martha",
  "Sarah",
  "Harriet",
  "Louisa",
  "Ada",
  "Clara",
  "Emily",
];
/** Clerks' abbreviations of first names (common practice in 19th-century registers, from memory). */
// biome-ignore format: compact data table
const FIRST_ABBREV = {
  John: "Jno.", William: "Wm.", Charles: "Chas.", Thomas: "Thos.", George: "Geo.", James: "Jas.",
  Robert: "Robt.", Joseph: "Jos.", Benjamin: "Benj.", Samuel: "Saml.", Henry: "Hy.", Edward: "Edwd.",
  Frederick: "Fredk.",
};
const MIDDLE = ["Henry", "James", "Thomas", "Edward", "Augustus", "Albert", "Harcourt", "Marsh", "Oliver"];

/** Surnames of people in the table (each used once by the generated part). */
// biome-ignore format: compact data table
const TABLE_SURNAMES = [
  "Harland", "Crake", "Marrable", "Quint", "Tollivant", "Vessey", "Brannock", "Ormsby", "Fettle", "Gaskarth",
  "Hebblethwaite", "Inchbald", "Jowsey", "Kettleby", "Lumb", "Mardle", "Nettlecombe", "Oddie", "Pickersgill",
  "Rudd", "Sowerby", "Threlfall", "Uttley", "Varley", "Wadsworth", "Yeadon", "Ackroyd", "Birtwhistle",
  "Calvert", "Dimmock", "Entwistle", "Fairclough", "Greenhalgh", "Horsfall", "Illingworth", "Jagger",
  "Kershaw", "Lister", "Metcalfe", "Naylor", "Oldroyd", "Pilling", "Quarmby", "Ramsden", "Schofield",
  "Tattersall", "Unsworth", "Verity", "Whiteoak", "Yarwood", "Armitage", "Brearley", "Crowther",
  "Dransfield", "Eastwood", "Firth", "Gledhill", "Haigh", "Hinchliffe", "Ingham", "Kitson", "Lockwood",
  "Mellor", "Ogden", "Priestley", "Royd", "Sugden", "Thewlis", "Wimpenny", "Bottomley", "Clegg", "Dobson",
  "Exley", "Fawthrop", "Garside", "Holroyd", "Iredale", "Jubb", "Knowles", "Laycock", "Marsden", "Nuttall",
  "Oxley", "Pogson", "Senior", "Tordoff", "Vevers", "Walsham", "Brigg", "Cawthorne", "Dearden", "Emmott",
  "Feather", "Goodall", "Ibbotson", "Jolley", "Kellett", "Leadbeater", "Moorhouse", "Nowell", "Outhwaite",
  "Parkin", "Redfearn", "Thackray", "Wrathall", "Barraclough", "Cockroft", "Earnshaw", "Fearnley",
  "Gawthorpe", "Heaton", "Midgley", "Normington", "Rushworth", "Shillito", "Townend", "Wormald",
];
/** Surnames of people the table lacks (NIL persons). */
// biome-ignore format: compact data table
const NIL_SURNAMES = [
  "Grindrod", "Hoyle", "Blamire", "Copley", "Drabble", "Fozzard", "Gomersal", "Jowitt", "Kenworthy",
  "Longbottom", "Mitchinson", "Nettleton", "Ramsbottom", "Stansfield", "Whitehead", "Wilby", "Broadbent",
  "Cudworth", "Dewhirst", "Firkin", "Gawkrodger", "Hebden", "Lumley", "Pashby", "Scatcherd",
];

/** Roles of persons: weight, honorific, and a description with distinctive context words. */
const ROLES = {
  merchant: {
    weight: 18,
    hon: "Mr.",
    desc: (p) =>
      `Merchant of ${p.town} dealing in ${cargoOf(p.trade)}; buys off the river barges and keeps a warehouse on the quay.`,
  },
  "ship owner": {
    weight: 12,
    hon: "Mr.",
    desc: (p) =>
      `Ship owner of ${p.town} whose schooners and steamers carry ${cargoOf(p.trade)} down the ${p.river}.`,
  },
  "master mariner": {
    weight: 14,
    hon: "Capt.",
    desc: (p) =>
      `Master mariner of ${p.town}, long in command of coasting schooners in the ${cargoOf(p.trade)} trade.`,
  },
  "harbour master": {
    weight: 3,
    hon: "Capt.",
    desc: (p) =>
      `Harbour master of ${p.town}; keeps the mooring register, the pilotage rota and the dock dues of the port.`,
  },
  "customs collector": {
    weight: 3,
    hon: "Mr.",
    desc: (p) =>
      `Collector of customs at ${p.town}; signs bonded-warehouse permits and prosecutes smuggling and excise cases.`,
  },
  magistrate: {
    weight: 7,
    hon: "Hon.",
    desc: (p) =>
      `Justice of the peace on the ${p.town} bench; hears licensing, assault and harbour bylaw cases at the police court.`,
  },
  clerk: {
    weight: 7,
    hon: "Mr.",
    desc: (p) =>
      `Clerk at ${p.town}; keeps the minutes, ledgers and correspondence of a board and gives evidence from its books.`,
  },
  auctioneer: {
    weight: 5,
    hon: "Mr.",
    desc: (p) =>
      `Auctioneer and valuer at ${p.town}; sells ships, cargoes and warehouse stock by auction at his salerooms.`,
  },
  shipbuilder: {
    weight: 4,
    hon: "Mr.",
    desc: (p) => `Shipbuilder with a slipway at ${p.town}; launches sailing barges, ketches and steam tugs.`,
  },
  "river pilot": {
    weight: 5,
    hon: "Mr.",
    desc: (p) =>
      `Licensed river pilot at ${p.town}; brings vessels over the bar and up the ${p.river} channel.`,
  },
  alderman: {
    weight: 5,
    hon: "Hon.",
    desc: (p) => `Alderman of the ${p.town} corporation and chairman of its watch and harbour committees.`,
  },
  clergyman: {
    weight: 4,
    hon: "Rev.",
    desc: (p) => `Vicar of the parish church at ${p.town} and chaplain to the seamen's mission.`,
  },
  physician: {
    weight: 4,
    hon: "Dr.",
    desc: (p) =>
      `Surgeon at ${p.town} and medical officer to the port sanitary authority; attends the infirmary.`,
  },
  innkeeper: {
    weight: 4,
    hon: "Mr.",
    desc: (p) => `Licensee of an inn at ${p.town} used by bargemen, drovers and carriers.`,
  },
};
/** Roles a woman of the period is given in the table (as the archive records them). */
const FEMALE_ROLES = ["ship owner", "innkeeper", "merchant"];

// ---------------------------------------------------------------------------------------------
// Small text helpers
// ---------------------------------------------------------------------------------------------

function capitalize(s) {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
const initial = (name) => name.charAt(0) + ".";
function stripDiacritics(s) {
  return s.normalize("NFD").replace(/\p{M}/gu, "").normalize("NFC");
}
const hasDiacritics = (s) => stripDiacritics(s) !== s;
/** End a sentence with one period, also after a name that ends in an abbreviation ("Bros."). */
const endSentence = (s) => (s.endsWith(".") ? s : s + ".");

/** OCR confusions of worn 1890s type (common practice in OCR post-correction work). */
// biome-ignore format: compact data table
const OCR_RULES = [
  ["rn", "m"], ["m", "rn"], ["cl", "d"], ["d", "cl"], ["l", "1"], ["o", "0"], ["O", "0"],
  ["s", "5"], ["S", "5"], ["e", "c"], ["c", "e"], ["h", "b"], ["n", "u"], ["i", "l"],
];
/** Share of OCR damage that drops a letter rather than confusing one. */
const DROP_SHARE = 0.3;
/** Shortest word OCR damage is applied to: shorter words become unrecognizable. */
const OCR_MIN_WORD = 4;
/** Words that are never damaged (abbreviations and honorifics carry the form, not the name). */
const OCR_SKIP = /^(?:[A-Za-z]{1,5}\.|(?:[A-Za-z]\.)+|&|and|the|of|on|Sons|Bros\.?|Company|Ltd\.?|Limited)$/;

/** Damage one letter group in one word of `text`; returns the text unchanged when nothing applies. */
function ocrDamage(text) {
  const words = [...text.matchAll(/[\p{L}\p{N}]+\.?/gu)].filter(
    (m) => m[0].replace(/[^\p{L}]/gu, "").length >= OCR_MIN_WORD && !OCR_SKIP.test(m[0]),
  );
  if (words.length === 0) return text;
  const word = pick(words);
  const options = [];
  const letters = word[0].replace(/\.$/, "").length;
  for (const [from, to] of OCR_RULES) {
    let at = word[0].indexOf(from, 1);
    while (at > 0 && at + from.length <= letters) {
      options.push({ at, from, to });
      at = word[0].indexOf(from, at + 1);
    }
  }
  // A dropped letter inside the word is the other common damage.
  const drops = [];
  for (let at = 1; at < letters - 1; at++) {
    if (/\p{Ll}/u.test(word[0][at])) drops.push({ at, from: word[0][at], to: "" });
  }
  const pool = options.length > 0 && (drops.length === 0 || !chance(DROP_SHARE)) ? options : drops;
  if (pool.length === 0) return text;
  const { at, from, to } = pick(pool);
  const damaged = word[0].slice(0, at) + to + word[0].slice(at + from.length);
  return text.slice(0, word.index) + damaged + text.slice(word.index + word[0].length);
}

// ---------------------------------------------------------------------------------------------
// Entities
// ---------------------------------------------------------------------------------------------

/** Columns of the knowledge table, in order. */
// biome-ignore format: compact data table
const COLUMNS = [
  "id", "name", "type", "aliases", "description", "prior",
  "born", "died", "founded", "river", "county", "owner", "tonnage", "role", "town",
];

const entities = [];
const nils = [];
const counters = {};
function nextId(letter) {
  counters[letter] = (counters[letter] ?? 0) + 1;
  return letter + String(counters[letter]).padStart(4, "0");
}
const ID_LETTER = { person: "P", firm: "F", town: "T", vessel: "V", wharf: "W", institution: "I" };

/** Register an entity; `inTable` false makes it a NIL (mentioned in articles, absent from the table). */
function register(e, inTable = true) {
  e.aliases ??= [];
  e.attrs ??= {};
  if (inTable) {
    e.id = nextId(ID_LETTER[e.type]);
    entities.push(e);
  } else {
    e.id = null;
    nils.push(e);
  }
  return e;
}

// --- Towns -----------------------------------------------------------------------------------

/** [name, short form or "", river] — hand-written so the look-alikes are deliberate. */
// biome-ignore format: compact data table
const TOWN_LIST = [
  ["Harrowmouth", "", "Wend"], ["Stenmouth", "", "Sten"], ["Stenmoor", "", "Sten"], ["Carrowby", "", "Carrow"],
  ["St. Aldric's", "", "Wend"], ["Port Wendle", "", "Wend"], ["Mount Carrick", "", "Carrow"],
  ["Fort Ambry", "", "Ossel"], ["Quaybridge", "", "Wend"], ["Hollinsford", "", "Harrow"],
  ["Great Ashcombe", "Ashcombe", "Mirrin"], ["Little Ashcombe", "", "Mirrin"], ["Market Dunholt", "Dunholt", "Harrow"],
  ["Stenby-on-Wend", "Stenby", "Wend"], ["Kellowgate", "", "Ossel"], ["Brackwater", "", "Wend"],
  ["Ossel Ferry", "", "Ossel"], ["Tallis Point", "", "Wend"], ["Whinmere", "", "Mirrin"],
  ["Gaddenby Staithe", "Gaddenby", "Carrow"], ["Rookhaven", "", "Wend"], ["Pennockbridge", "", "Harrow"],
  ["Salter's End", "", "Sten"], ["Cray's Landing", "", "Tolland"], ["Ebbingham", "", "Wend"],
  ["Farrowdale", "", "Carrow"], ["Gullsea", "", "Wend"], ["Harnby Wick", "Harnby", "Tolland"],
  ["Jessop's Reach", "", "Wend"], ["Kinlowe", "", "Mirrin"], ["Merrowick", "", "Ossel"], ["Nantlow", "", "Tolland"],
  ["Orrisford", "", "Harrow"], ["Pellham Quay", "Pellham", "Wend"], ["Rawcombe", "", "Mirrin"],
  ["Skelby", "", "Sten"], ["Tarrow Bridge", "Tarrow", "Tolland"], ["Upwend", "", "Wend"],
  ["Vellacott", "", "Carrow"], ["Wyndle Cross", "", "Harrow"], ["St. Osric's", "", "Sten"],
  ["St. Ilver's", "", "Ossel"], ["Port Carrow", "", "Carrow"], ["Port Ossel", "", "Ossel"],
  ["Mount Pellor", "", "Mirrin"], ["Mount Wray", "", "Tolland"], ["Fort Gannet", "", "Wend"],
  ["Fort Tolland", "", "Tolland"], ["Marlcross", "", "Harrow"], ["Thornwick Tey", "Thornwick", "Mirrin"],
  ["Cobble Hythe", "", "Wend"], ["Denholm Ferry", "", "Carrow"], ["Eskerby", "", "Sten"],
  ["Flaxmere", "", "Mirrin"], ["Greywend", "", "Wend"], ["Hobb's Marsh", "", "Wend"], ["Iverholt", "", "Ossel"],
  ["Lanterby", "", "Tolland"], ["Mossingham", "", "Harrow"], ["Netherwend", "", "Wend"], ["Upper Carrow", "", "Carrow"],
];
/** Towns the table lacks, several of them close to table towns on purpose. */
// biome-ignore format: compact data table
const NIL_TOWN_LIST = [
  ["Stenford", "", "Sten"], ["Port Ambry", "", "Ossel"], ["Mount Carrow", "", "Carrow"],
  ["Little Quaybridge", "", "Wend"], ["Carrowmouth", "", "Carrow"], ["Harrowby Marsh", "Harrowby", "Harrow"],
  ["Saint Aldwyn's", "", "Wend"], ["Brackwell", "", "Wend"], ["Tollmere", "", "Tolland"], ["Kestleby", "", "Sten"],
  ["Marrowby", "", "Mirrin"], ["Dunsettle", "", "Harrow"], ["Quillan's Cross", "", "Ossel"], ["Yarrowick", "", "Wend"],
  ["Elvering", "", "Carrow"],
];
const TOWN_FEATURES = [
  "known for its hide market and tallow chandlers",
  "ships barley and malt downriver by sailing barge",
  "has a tide mill and a chain ferry",
  "quarries building stone loaded at its own staithe",
  "holds a hiring fair each Martinmas",
  "cures herring in smoke houses along the strand",
  "builds barges on two slipways below the church",
  "has brick kilns and clay pits beside the marsh",
  "sends oysters and mussels to the Harrowmouth fish market",
  "is the coaling station for the upper river steamers",
  "grows flax for the Carrowby ropewalks",
  "has a lock and toll house on the navigation",
];
/** Hand-written descriptions and populations of the towns the stories turn on. */
const TOWN_SPECIAL = {
  Harrowmouth: {
    pop: 48210,
    desc: "Chief port of the Wend estuary and seat of the Harbour Board; docks, bonded warehouses, corn exchange and shipyards.",
  },
  Stenmouth: {
    pop: 6240,
    desc: "Fishing and ferry town at the mouth of the Sten; herring curing, oyster beds and a lifeboat station.",
  },
  Stenmoor: {
    pop: 910,
    desc: "Moorland market village on the upper Sten; sheep fairs, peat cutting and a wool market.",
  },
  Carrowby: {
    pop: 9420,
    desc: "Mill town on the Carrow; ropewalks and hemp spinning, the seat of the rope trade.",
  },
};

function townKind(name) {
  if (name.startsWith("Port ")) return "River port";
  if (name.startsWith("Fort ")) return "Old garrison town";
  if (name.startsWith("Mount ")) return "Hill village";
  if (name.startsWith("St. ")) return "Parish town";
  if (/mouth|haven|sea|Hythe|Point/.test(name)) return "Harbour village";
  if (/Ferry|bridge|Bridge|ford|Landing|Staithe|Quay/.test(name)) return "Riverside village";
  return pick(["Market town", "Mill village", "Farming parish", "Fishing village", "Coal village"]);
}

function makeTown([name, short, river], inTable) {
  const special = TOWN_SPECIAL[name];
  const county = river === "Carrow" ? "Carrowshire" : river === "Ossel" ? "Ambry Vale" : pick(COUNTIES);
  const description =
    special?.desc ?? `${townKind(name)} on the ${river}, ${county}; ${pick(TOWN_FEATURES)}.`;
  const aliases = [];
  if (name.startsWith("St. ")) aliases.push(name.replace("St. ", "Saint "));
  return register(
    {
      type: "town",
      name,
      short,
      aliases,
      description,
      prior: special?.pop ?? logUniform(150, 15000),
      attrs: { river, county },
      river,
    },
    inTable,
  );
}

for (const row of TOWN_LIST) makeTown(row, true);
for (const row of NIL_TOWN_LIST) makeTown(row, false);
const townByName = new Map(entities.filter((e) => e.type === "town").map((e) => [e.name, e]));
const HARROWMOUTH = townByName.get("Harrowmouth");
const tableTowns = entities.filter((e) => e.type === "town");
/** Town of residence: the port itself is the most likely. */
const PORT_TOWN_WEIGHT = 6;
const homeTown = () => weighted([[HARROWMOUTH, PORT_TOWN_WEIGHT], ...tableTowns.map((t) => [t, 1])]);

// --- Persons ---------------------------------------------------------------------------------

function makePerson(spec, inTable) {
  const { first, middle = "", last, suffix = "", female = false, role } = spec;
  const town = spec.town ?? homeTown();
  const name = [first, middle, last].filter(Boolean).join(" ") + (suffix ? " " + suffix : "");
  const born = spec.born ?? int(1815, 1880);
  const diedGuess = born + int(48, 86);
  const died =
    spec.died !== undefined ? spec.died : diedGuess <= LAST_YEAR && diedGuess >= FIRST_YEAR ? diedGuess : "";
  const p = {
    type: "person",
    name,
    first,
    middle,
    last,
    suffix,
    female,
    role,
    hon: female ? pick(["Mrs.", "Miss"]) : ROLES[role].hon,
    born,
    died,
    town: town.name,
    townEntity: town,
    river: town.river,
    trade: spec.trade ?? pick(TRADES),
    aliases: spec.aliases ?? [],
    prior: spec.prior ?? logUniform(1, 400),
  };
  p.description = spec.desc ?? ROLES[role].desc(p);
  p.attrs = { born: String(born), died: String(died), role, town: town.name };
  return register(p, inTable);
}

const firstName = () => weighted(MALE_FIRST.map((n) => [n, FIRST_ABBREV[n] ? ABBREVIATED_NAME_WEIGHT : 1]));
const role = () => weighted(Object.entries(ROLES).map(([k, r]) => [k, r.weight]));

// The deliberate look-alikes first.
const ALDOUS_HM = makePerson(
  {
    first: "Jabez",
    middle: "Harcourt",
    last: "Aldous",
    role: "harbour master",
    town: HARROWMOUTH,
    born: 1841,
    died: 1913,
    aliases: ["J. H. Aldous"],
    prior: 310,
    desc: "Harbour master of Harrowmouth from 1879; keeps the mooring register, pilotage rota and dock dues, and reports silting of the fairway to the Harbour Board.",
  },
  true,
);
const ALDOUS_CUSTOMS = makePerson(
  {
    first: "Cornelius",
    last: "Aldous",
    role: "customs collector",
    town: HARROWMOUTH,
    born: 1849,
    died: 1921,
    prior: 145,
    desc: "Collector of customs at the Harrowmouth Custom House; seizes contraband spirits and tobacco and prosecutes excise cases before the magistrates.",
  },
  true,
);
const PELL_SR = makePerson(
  {
    first: "Josiah",
    last: "Pell",
    suffix: "Sr.",
    role: "ship owner",
    town: HARROWMOUTH,
    born: 1818,
    died: 1899,
    trade: TRADES[4],
    aliases: ["Old Josiah Pell"],
    prior: 220,
    desc: "Founder of the Pell fleet of coal schooners and of Pell & Sons; alderman and elder of the Harrowmouth shipping interest.",
  },
  true,
);
const PELL_JR = makePerson(
  {
    first: "Josiah",
    last: "Pell",
    suffix: "Jr.",
    role: "ship owner",
    town: HARROWMOUTH,
    born: 1852,
    died: 1927,
    trade: TRADES[4],
    prior: 180,
    desc: "Son of the founder; managing partner of Pell & Sons, moved the firm from sail to steam colliers and sat on the Harbour Board.",
  },
  true,
);
// Names with diacritics, so "missing diacritics" noise has something to work on.
const DIACRITIC_PEOPLE = [
  { first: "Aurèle", last: "Vautrin", role: "merchant", trade: TRADES[17] },
  { first: "Søren", last: "Haldt", role: "merchant", trade: TRADES[3] },
  { first: "Anselm", last: "Grüber", role: "merchant", trade: TRADES[5] },
  { first: "Renée", last: "Castellan", role: "innkeeper", female: true },
  { first: "Ignác", last: "Szabelny", role: "physician" },
];
for (const spec of DIACRITIC_PEOPLE) makePerson(spec, true);

/** Number of generated persons: with the hand-written ones the table reaches ~120. */
const GENERATED_PERSONS = 111;
for (const last of shuffle(TABLE_SURNAMES).slice(0, GENERATED_PERSONS)) {
  const female = chance(0.12);
  makePerson(
    {
      first: female ? pick(FEMALE_FIRST) : firstName(),
      middle: !female && chance(0.35) ? pick(MIDDLE) : "",
      last,
      female,
      role: female ? pick(FEMALE_ROLES) : role(),
    },
    true,
  );
}
const tablePersons = entities.filter((e) => e.type === "person");
// Some people are also known by their initials, as directories print them.
for (const p of tablePersons) {
  if (p.aliases.length === 0 && p.middle && chance(0.5))
    p.aliases.push(`${initial(p.first)} ${initial(p.middle)} ${p.last}`);
}

// NIL persons: a third Aldous, another Pell, look-alike surnames and strangers.
const NIL_PERSON_SPECS = [
  { first: "Felix", last: "Aldous", role: "innkeeper" },
  { first: "Ezra", last: "Pell", role: "master mariner" },
  { first: "Walter", last: "Harland", role: "clerk" },
  { first: "Amos", last: "Crake", role: "river pilot" },
];
for (const spec of NIL_PERSON_SPECS) makePerson({ ...spec, born: int(1840, 1875), died: "" }, false);
/** NIL people drawn from strangers' surnames, plus a few table surnames with other first names. */
const NIL_GENERATED_PERSONS = 40;
for (let i = 0; i < NIL_GENERATED_PERSONS; i++) {
  const female = chance(0.15);
  const last = chance(0.25) ? pick(tablePersons).last : pick(NIL_SURNAMES);
  makePerson(
    {
      first: female ? pick(FEMALE_FIRST) : firstName(),
      middle: !female && chance(0.3) ? pick(MIDDLE) : "",
      last,
      female,
      role: female ? pick(FEMALE_ROLES) : role(),
      born: int(1835, 1880),
      died: "",
    },
    false,
  );
}

// --- Wharves and institutions ----------------------------------------------------------------

const WHARF_LIST = [
  ["Tallow Wharf", "Hide and tallow wharf below the Harrowmouth fish market."],
  ["Pell's Wharf", "Coal wharf of the Pell fleet, with steam cranes and coal drops."],
  ["Old Custom House Quay", "Quay before the Custom House where dutiable cargoes are landed and gauged."],
  ["Brackwater Basin", "Tidal basin for sailing barges and lighters, with a timber pond."],
  ["Ferry Steps", "Landing stage of the passenger ferry and the river steamers."],
  ["Coal Staithes", "Staithes and chutes where collier barges load from the railway."],
  ["Ropewalk Quay", "Quay of the rope and sailcloth trade, beside the ropewalks."],
  ["Bonded Quay", "Quay of the bonded warehouses for wine, spirits and tobacco."],
];
for (const [name, desc] of WHARF_LIST) {
  register({
    type: "wharf",
    name,
    description: desc,
    prior: logUniform(5, 90),
    attrs: { town: "Harrowmouth", river: "Wend" },
  });
}
const NIL_WHARVES = ["Gas Works Jetty", "Salt Quay", "Pell's Dock"];
for (const name of NIL_WHARVES) {
  register({ type: "wharf", name, description: "", prior: 0, attrs: {} }, false);
}

/** [name, acronym or "", short form or "", description] */
const INSTITUTION_LIST = [
  [
    "Harrowmouth Harbour Board",
    "H.H.B.",
    "Harbour Board",
    "Board of the port: moorings, dock dues, dredging, pilotage and the harbour master's department.",
  ],
  [
    "Harrowmouth Custom House",
    "",
    "Custom House",
    "Office of the collector of customs: bonded warehouses, duties, seizures of contraband.",
  ],
  [
    "Harrowmouth Police Court",
    "",
    "Police Court",
    "Court of the borough magistrates: drunkenness, assault, licensing and harbour bylaw cases.",
  ],
  [
    "Wendshire Quarter Sessions",
    "",
    "Quarter Sessions",
    "County court of the justices, sitting four times a year for felonies and appeals.",
  ],
  [
    "Mariners' Benevolent Society",
    "M.B.S.",
    "",
    "Friendly society paying pensions to the widows and orphans of drowned seamen.",
  ],
  [
    "Wend Conservancy Commissioners",
    "",
    "Conservancy",
    "Commissioners of the river navigation: locks, tolls, buoys and the dredging of the Wend.",
  ],
  [
    "Harrowmouth Chamber of Commerce",
    "",
    "Chamber of Commerce",
    "Association of the port's merchants, ship owners and bankers.",
  ],
  [
    "Seamen's Mission of St. Aldric's",
    "",
    "Seamen's Mission",
    "Mission hall and reading room for sailors, run by the parish of St. Aldric's.",
  ],
];
const institutions = {};
for (const [name, acronym, short, desc] of INSTITUTION_LIST) {
  institutions[name] = register({
    type: "institution",
    name,
    acronym,
    short,
    aliases: acronym ? [acronym] : [],
    description: desc,
    prior: logUniform(40, 600),
    attrs: { town: "Harrowmouth", founded: String(int(1780, 1885)) },
  });
}

// --- Firms -----------------------------------------------------------------------------------

const tableFirms = () => entities.filter((e) => e.type === "firm");
/** How the gazette varies each legal form ("Pell & Sons" / "Pell and Sons Ltd"). */
const LEGAL_VARIANTS = {
  "& Sons": ["and Sons", "& Sons, Ltd.", "and Sons Ltd", "& Son"],
  "Bros.": ["Brothers", "Bros", "Bros., Ltd."],
  "& Co.": ["and Co.", "& Company", "and Company", "& Co., Ltd."],
  "Ltd.": ["Limited", "Ltd", ""],
  Company: ["Co.", "Coy.", "Company, Ltd."],
};
/** Variants of a form-less name, by firm style: partnerships gain a form, descriptive firms "Ltd.". */
const BARE_VARIANTS = { pair: ["Ltd.", "& Co."], desc: ["Ltd.", "Limited"], surname: [], acronym: [] };
/** A varied full name of a firm: legal form changed, or "Company" written "Co.". */
function firmVariant(f) {
  const forms = f.form ? LEGAL_VARIANTS[f.form] : BARE_VARIANTS[f.style];
  const stemVariant = f.stem.endsWith(" Company")
    ? f.stem.replace(/ Company$/, pick([" Co.", " Coy."]))
    : null;
  if (stemVariant && chance(0.5)) return joinForm(stemVariant, f.form);
  if (forms.length === 0) return f.name;
  return joinForm(f.stem, pick(forms));
}
const joinForm = (stem, form) => (form ? (form.startsWith(",") ? stem + form : stem + " " + form) : stem);

function makeFirm(spec, inTable) {
  const town = spec.town ?? homeTown();
  const trade = spec.trade ?? pick(TRADES);
  const founded = spec.founded ?? int(1790, 1925);
  const f = {
    type: "firm",
    name: joinForm(spec.stem, spec.form),
    stem: spec.stem,
    form: spec.form,
    style: spec.style,
    acronym: spec.acronym ?? "",
    trade,
    town: town.name,
    founded,
    aliases: spec.acronym ? [spec.acronym] : [],
    prior: spec.prior ?? logUniform(2, 900),
  };
  const owner = spec.owner ?? "";
  f.description =
    spec.desc ??
    `Firm of ${town.name} in the ${trade.core.toLowerCase()} trade, dealing in ${trade.goods}; has its ${trade.words} by the river.`;
  f.attrs = { founded: String(founded), town: town.name, owner };
  return register(f, inTable);
}

const PELL_SONS = makeFirm(
  {
    stem: "Pell",
    form: "& Sons",
    style: "surname",
    town: HARROWMOUTH,
    trade: TRADES[4],
    founded: 1846,
    owner: "Josiah Pell Sr.",
    prior: 640,
    desc: "Coal and shipping firm of Harrowmouth founded by Josiah Pell; runs collier schooners and later steam colliers from Pell's Wharf.",
  },
  true,
);
const CARROWBY_ROPE = makeFirm(
  {
    stem: "Carrowby Rope Works",
    form: "Ltd.",
    style: "desc",
    town: townByName.get("Carrowby"),
    trade: TRADES[0],
    founded: 1868,
    prior: 310,
    desc: "Ropewalk company at Carrowby spinning hemp into cables, cordage and twine for the shipping of the Wend.",
  },
  true,
);
const SGE = makeFirm(
  {
    stem: "Stenning Grain Exchange",
    form: "",
    style: "acronym",
    acronym: "S.G.E.",
    town: HARROWMOUTH,
    trade: TRADES[2],
    founded: 1861,
    prior: 880,
    desc: "Corn exchange of Harrowmouth where wheat, barley, oats and malt are sold by sample; publishes the weekly grain prices.",
  },
  true,
);
const WVSN = makeFirm(
  {
    stem: "Wend Valley Steam Navigation",
    form: "Company",
    style: "acronym",
    acronym: "W.V.S.N. Co.",
    town: HARROWMOUTH,
    trade: {
      core: "Steam Navigation",
      goods: "passengers, parcels and market produce",
      words: "river steamers",
      cargo: "parcels",
    },
    founded: 1872,
    prior: 520,
    desc: "Runs the passenger and parcel steamers up the Wend between Harrowmouth, Stenby and Port Wendle.",
  },
  true,
);
const HD_BANK = makeFirm(
  {
    stem: "Harrowmouth and District Bank",
    form: "",
    style: "acronym",
    acronym: "H. & D. Bank",
    town: HARROWMOUTH,
    trade: {
      core: "Bank",
      goods: "deposits, loans and bills of exchange",
      words: "banking hall",
      cargo: "specie",
    },
    founded: 1838,
    prior: 410,
    desc: "Country bank of Harrowmouth with branches up the river; discounts bills of the corn and coal trades.",
  },
  true,
);
const CMIC = makeFirm(
  {
    stem: "Carrowshire Marine Insurance",
    form: "Company",
    style: "acronym",
    acronym: "C.M.I.C.",
    trade: TRADES[14],
    founded: 1855,
    prior: 95,
    desc: "Mutual insurer of hulls and cargoes for Carrowshire ship owners; pays salvage and general average claims.",
  },
  true,
);
// The brothers whose name the NIL "Harland & Sons" imitates.
makeFirm(
  { stem: "Harland", form: "Bros.", style: "surname", trade: TRADES[3], owner: "", founded: 1871 },
  true,
);

/** Surname-based firms from table people (so owners exist), then descriptive ones from towns. */
const SURNAME_FIRMS = 44;
const ownerPool = shuffle(
  tablePersons.filter(
    (p) => ["merchant", "ship owner", "shipbuilder", "auctioneer"].includes(p.role) && !p.female,
  ),
);
const usedStems = new Set(["Pell", "Harland"]);
let madeSurname = 0;
for (const owner of ownerPool) {
  if (madeSurname >= SURNAME_FIRMS) break;
  if (usedStems.has(owner.last)) continue;
  usedStems.add(owner.last);
  const kind = weighted([
    ["& Sons", 4],
    ["Bros.", 3],
    ["& Co.", 4],
    ["pair", 2],
    ["pair-co", 2],
  ]);
  let stem = owner.last;
  let form = kind;
  if (kind === "pair" || kind === "pair-co") {
    const partner = pick(tablePersons.filter((p) => p.last !== owner.last && !usedStems.has(p.last))).last;
    usedStems.add(partner);
    stem = kind === "pair" ? `${owner.last} & ${partner}` : `${owner.last}, ${partner}`;
    form = kind === "pair" ? "" : "& Co.";
  }
  makeFirm(
    {
      stem,
      form,
      style: kind === "pair" ? "pair" : "surname",
      trade: owner.trade,
      town: owner.townEntity,
      founded: Math.max(owner.born + ADULT_AGE + int(0, 15), 1800),
      owner: owner.name,
    },
    true,
  );
  madeSurname++;
}
const descTowns = shuffle(tableTowns);
/** Total firms in the table: ~90 as the brief asks. */
const FIRM_TARGET = 90;
for (let i = 0; tableFirms().length < FIRM_TARGET && i < 500; i++) {
  const town = descTowns[i % descTowns.length];
  const trade = pick(TRADES);
  const works = WORKS_CORES.has(trade.core);
  const stem = works ? `${town.name} ${trade.core}` : `${town.name} ${trade.core} Company`;
  if (entities.some((e) => e.type === "firm" && e.stem === stem)) continue;
  const form = pick(["Ltd.", ""]);
  makeFirm({ stem, form, style: "desc", trade, town }, true);
}
// NIL firms, several look-alikes of table firms.
const NIL_FIRM_SPECS = [
  { stem: "Harland", form: "& Sons", style: "surname" },
  { stem: "Carrowby Tannery Company", form: "", style: "desc" },
  { stem: "Stenford Brick Company", form: "Ltd.", style: "desc" },
  { stem: "Port Ambry Ice Company", form: "", style: "desc" },
  { stem: "Stenmouth Coal Company", form: "Ltd.", style: "desc" },
  { stem: "Aldous", form: "& Co.", style: "surname" },
];
for (const spec of NIL_FIRM_SPECS) makeFirm(spec, false);
for (const last of NIL_SURNAMES.slice(0, 14)) {
  makeFirm({ stem: last, form: pick(["& Sons", "Bros.", "& Co."]), style: "surname" }, false);
}

// --- Vessels ---------------------------------------------------------------------------------

/** [bare name, kind] — kinds: steamer, schooner, barge, ketch, tug. */
// biome-ignore format: compact data table
const VESSEL_LIST = [
  ["Carrowby", "steamer"], ["Wendle Belle", "steamer"], ["Stenmoor Lass", "steamer"], ["Ossel Queen", "steamer"],
  ["Merrowick", "steamer"], ["Pennant", "steamer"], ["Fleetwing", "steamer"], ["Tarrow", "steamer"],
  ["Cormorant", "steamer"], ["Lady Vessey", "steamer"], ["Harrow Star", "steamer"], ["Aldric", "steamer"],
  ["Greywend", "steamer"], ["Moorhen", "steamer"], ["Quaybridge", "steamer"],
  ["Kittiwake", "schooner"], ["Josiah Pell", "schooner"], ["Mary Harland", "schooner"], ["Good Intent", "schooner"],
  ["Three Sisters", "schooner"], ["Emily Quint", "schooner"], ["Speedwell", "schooner"], ["Ranger", "schooner"],
  ["Curlew", "schooner"], ["Ebb Tide", "schooner"], ["Willing Mind", "schooner"], ["Sea Pink", "schooner"],
  ["Thrift", "barge"], ["Patience", "barge"], ["Wend Lily", "barge"], ["Providence", "barge"], ["Industry", "barge"],
  ["Brothers", "barge"], ["Eliza Jowsey", "barge"], ["Gleaner", "barge"], ["Little Ada", "barge"], ["Dawn", "barge"],
  ["Gannet", "ketch"], ["Peewit", "ketch"], ["Bonny Lass", "ketch"], ["Mistletoe", "ketch"],
  ["Brisk", "tug"], ["Vigilant", "tug"], ["Sturdy", "tug"], ["Samson", "tug"], ["Tempest", "tug"], ["Busy Bee", "tug"],
  ["Hector", "tug"], ["Resolute", "tug"], ["Snipe", "tug"],
];
// biome-ignore format: compact data table
const NIL_VESSEL_LIST = [
  ["Stenmoor", "steamer"], ["Harrowmouth", "steamer"], ["Fort Ambry", "steamer"], ["Hopewell", "schooner"],
  ["Sarah Aldous", "schooner"], ["Lively", "ketch"], ["Whimbrel", "schooner"], ["Trusty", "tug"],
  ["Amity", "barge"], ["Bountiful", "barge"], ["Kittiwake II", "schooner"], ["Endurance Pell", "barge"],
];
const VESSEL_KIND = {
  steamer: { word: "steamer", role: "screw steamer", tons: [180, 1400], hull: "Iron screw steamer" },
  schooner: { word: "schooner", role: "schooner", tons: [60, 240], hull: "Wooden topsail schooner" },
  barge: { word: "barge", role: "sailing barge", tons: [30, 90], hull: "Spritsail barge" },
  ketch: { word: "ketch", role: "ketch", tons: [40, 110], hull: "Trading ketch" },
  tug: { word: "tug", role: "steam tug", tons: [40, 160], hull: "Paddle tug" },
};

function makeVessel([bare, kind], inTable) {
  const k = VESSEL_KIND[kind];
  const town = homeTown();
  const owner = pick([...tableFirms(), ...tablePersons.filter((p) => p.role === "ship owner")]);
  const tonnage = int(k.tons[0], k.tons[1]);
  const built = int(1860, 1915);
  const trade = owner.trade ?? pick(TRADES);
  const other = pick(tableTowns);
  const v = {
    type: "vessel",
    name: kind === "steamer" ? `S.S. ${bare}` : bare,
    bare,
    kind,
    built,
    trade,
    aliases: kind === "steamer" ? [`Steamship ${bare}`] : [],
    description: endSentence(
      kind === "tug"
        ? `${k.hull} of ${tonnage} tons stationed at ${town.name}, towing barges and colliers over the ${town.river} bar; owned by ${owner.name}`
        : `${k.hull} of ${tonnage} tons registered at ${town.name}, in the ${cargoOf(trade)} trade to ${other.name}; owned by ${owner.name}`,
    ),
    prior: logUniform(1, 150),
    attrs: {
      founded: String(built),
      owner: owner.name,
      tonnage: String(tonnage),
      role: k.role,
      town: town.name,
    },
  };
  return register(v, inTable);
}
for (const row of VESSEL_LIST) makeVessel(row, true);
for (const row of NIL_VESSEL_LIST) makeVessel(row, false);
// The schooner named after the founder belongs to his firm.
const josiahPellSchooner = entities.find((e) => e.type === "vessel" && e.bare === "Josiah Pell");
josiahPellSchooner.attrs.owner = PELL_SONS.name;
josiahPellSchooner.description = `Collier schooner of ${josiahPellSchooner.attrs.tonnage} tons named after the founder of Pell & Sons; carries coal from the Coal Staithes to Stenmouth.`;

// ---------------------------------------------------------------------------------------------
// Surface forms (how the gazette writes a name)
// ---------------------------------------------------------------------------------------------

/** Abbreviations whose period belongs to the word (tokenizer and mention rules share this list). */
// biome-ignore format: compact data table
const ABBREVIATIONS = new Set([
  "mr", "mrs", "messrs", "capt", "rev", "dr", "hon", "st", "pt", "mt", "ft", "co", "coy", "ltd", "bros",
  "jno", "wm", "chas", "thos", "geo", "jas", "robt", "jos", "benj", "saml", "hy", "edwd", "fredk", "sr", "jr",
  "no", "esq",
]);
const isAbbreviation = (word) =>
  /^\p{Lu}/u.test(word) && (ABBREVIATIONS.has(word.toLowerCase()) || /^\p{Lu}$/u.test(word));

const PLACE_VARIANTS = [
  [/^St\. /, ["Saint ", "St "]],
  [/^Port /, ["Pt. "]],
  [/^Mount /, ["Mt. "]],
  [/^Fort /, ["Ft. "]],
  [/-on-/, [" on "]],
];
function placeVariant(name) {
  for (const [re, replacements] of PLACE_VARIANTS)
    if (re.test(name)) return name.replace(re, pick(replacements));
  return null;
}

/** Person forms. `state` is the document state (for surname clashes). */
function personSurface(p, form, state) {
  const suffix = p.suffix ? " " + p.suffix : "";
  const mid = p.middle ? initial(p.middle) + " " : "";
  const abbrev = FIRST_ABBREV[p.first];
  const clash = state.surnameCount.get(p.last) > 1;
  if (form === "caps") {
    const base = chance(0.5) ? `${p.hon} ${p.name}` : p.name;
    return { text: base.toUpperCase() };
  }
  if (form === "short" && !clash) {
    const text = weighted([
      [`${p.hon} ${p.last}${suffix}`, 45],
      [`${p.last}${suffix}`, 35],
      [p.name, 10],
    ]);
    return { text };
  }
  if (chance(CLEAN_FIRST_CHANCE)) return { text: p.name };
  const text = weighted([
    [`${p.hon} ${p.name}`, 10],
    [`${initial(p.first)} ${mid}${p.last}${suffix}`, 12],
    [`${abbrev ?? initial(p.first)} ${mid}${p.last}${suffix}`, abbrev ? 14 : 0],
    [`${p.last}, ${p.first}${p.middle ? " " + initial(p.middle) : ""}${p.suffix ? ", " + p.suffix : ""}`, 7],
    [`${p.last}, ${initial(p.first)} ${mid.trim()}`.trim(), 5],
    [`${p.hon} ${initial(p.first)} ${mid}${p.last}${suffix}`, 7],
  ]);
  return { text };
}

function firmSurface(f, form) {
  if (form === "caps") return { text: f.name.toUpperCase() };
  const messrs = f.style === "surname" || f.style === "pair";
  if (form === "short") {
    if (f.style === "acronym" && f.acronym) return { pre: "the ", text: f.acronym };
    if (messrs) return { pre: "Messrs. ", text: f.stem };
    // "the Tallow Company" for "the Stenmouth Tallow Company Ltd.": the town dropped.
    const core = f.stem.endsWith(" Company") ? f.trade.core + " Company" : null;
    if (core && chance(0.35)) return { pre: "the ", text: core };
    return { pre: "the ", text: f.stem };
  }
  const pre = messrs ? (chance(0.4) ? "Messrs. " : "") : "the ";
  if (chance(CLEAN_FIRST_CHANCE)) return { pre, text: f.name };
  return { pre, text: firmVariant(f) };
}

function townSurface(t, form) {
  if (form === "caps") return { text: t.name.toUpperCase() };
  if (form === "short" && t.short && chance(0.7)) return { text: t.short };
  if (form === "short" || chance(CLEAN_FIRST_CHANCE)) return { text: t.name };
  return { text: placeVariant(t.name) ?? t.name };
}

function vesselSurface(v, form) {
  const word = VESSEL_KIND[v.kind].word;
  if (form === "caps") return { pre: `the ${word} `, text: v.bare.toUpperCase() };
  if (v.kind === "steamer") {
    if (form === "short") return chance(0.65) ? { pre: "the ", text: v.bare } : { pre: "the ", text: v.name };
    const variant = weighted([
      ["S.S.", 50],
      ["s.s.", 10],
      ["SS", 10],
      ["S. S.", 8],
      ["steamer", 16],
    ]);
    if (variant === "steamer") return { pre: "the steamer ", text: v.bare };
    return { pre: "the ", text: `${variant} ${v.bare}` };
  }
  if (form === "short") return { pre: "the ", text: v.bare };
  if (chance(0.08)) return { pre: `the ${word} `, text: v.bare.toUpperCase() };
  return { pre: `the ${word} `, text: v.bare };
}

function wharfSurface(w) {
  if (w.name.includes("'s ") && chance(0.2)) return { text: w.name.replace("'s ", "s ") };
  return { text: w.name };
}

function institutionSurface(i, form) {
  if (form === "caps") return { text: i.name.toUpperCase() };
  if (form === "short") {
    if (i.acronym && chance(0.7)) return { pre: "the ", text: i.acronym };
    if (i.short) return { pre: "the ", text: i.short };
  }
  return { pre: "the ", text: i.name };
}

/** Surface of a mention: {pre, text}; `pre` is literal text written before the span. */
function surface(e, form, state) {
  let s;
  if (e.type === "person") s = personSurface(e, form, state);
  else if (e.type === "firm") s = firmSurface(e, form);
  else if (e.type === "town") s = townSurface(e, form);
  else if (e.type === "vessel") s = vesselSurface(e, form);
  else if (e.type === "wharf") s = wharfSurface(e);
  else s = institutionSurface(e, form);
  let text = s.text;
  let pre = s.pre ?? "";
  if (e.type === "person" && form !== "caps" && !/^[\p{L}]+\. /u.test(text) && !text.includes(",")) {
    if (chance(HONORIFIC_OUTSIDE_CHANCE)) pre = e.hon + " ";
  }
  if (hasDiacritics(text) && chance(STRIP_DIACRITICS_CHANCE)) text = stripDiacritics(text);
  const clean = text === e.name || e.aliases.includes(text);
  const damage = clean && e.type !== "person" ? CLEAN_OCR_CHANCE : OCR_CHANCE;
  if (form !== "caps" && chance(damage)) text = ocrDamage(text);
  return { pre, text };
}

// ---------------------------------------------------------------------------------------------
// Documents
// ---------------------------------------------------------------------------------------------

const LABEL = { person: "PER", firm: "ORG", institution: "ORG", town: "LOC", wharf: "LOC", vessel: "MISC" };
// biome-ignore format: compact data table
const MONTHS = [
  "January", "February", "March", "April", "May", "June",
  "July", "August", "September", "October", "November", "December",
];
const WEEKDAYS = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"];

/** A mention slot in a sentence template: `M(entity)` or `M(entity, "caps")`. */
const M = (entity, form) => ({ entity, form });

class DocBuilder {
  constructor(date) {
    this.date = date;
    this.year = Number(date.slice(0, 4));
    this.sentences = [];
    this.seen = new Set();
    this.used = new Set();
    this.surnameCount = new Map();
  }

  /** Choose an actor of `type` matching `filter`; NIL with probability `nil` (or when no table entity fits). */
  pick(type, { filter = () => true, nil = NIL_CHANCE } = {}) {
    const alive = (e) => this.fits(e) && filter(e) && !this.used.has(e);
    let fromTable = entities.filter((e) => e.type === type && alive(e));
    let fromNil = nils.filter((e) => e.type === type && alive(e));
    if (fromTable.length === 0 && fromNil.length === 0) {
      // Nobody in that role at this date: anyone of the type will do.
      const free = (e) => this.fits(e) && !this.used.has(e);
      fromTable = entities.filter((e) => e.type === type && free(e));
      fromNil = nils.filter((e) => e.type === type && free(e));
    }
    const useNil = fromTable.length === 0 || (fromNil.length > 0 && chance(nil));
    const pool = useNil ? fromNil : fromTable;
    if (pool.length === 0) throw new Error(`no ${type} available in ${this.date}`);
    return this.use(pick(pool));
  }

  /** Mark an entity as an actor of this document. */
  use(e) {
    this.used.add(e);
    if (e.type === "person") this.surnameCount.set(e.last, (this.surnameCount.get(e.last) ?? 0) + 1);
    return e;
  }

  /** Whether an entity can appear at this document's date (alive, founded, built). */
  fits(e) {
    if (e.type === "person") return e.born + ADULT_AGE <= this.year && (e.died === "" || e.died >= this.year);
    if (e.type === "firm") return e.founded <= this.year;
    if (e.type === "vessel") return e.built <= this.year;
    return true;
  }

  /** Append a sentence made of literal strings and mention slots. */
  s(...parts) {
    const pieces = [];
    for (const part of parts) {
      if (typeof part === "string") {
        pieces.push({ text: part });
        continue;
      }
      const e = part.entity;
      const form = part.form ?? (this.seen.has(e) ? "short" : "full");
      const { pre, text } = surface(e, form, this);
      if (pre) pieces.push({ text: pieces.length === 0 ? capitalize(pre) : pre });
      pieces.push({ text, entity: e });
      const acronym = e.acronym;
      if (acronym && form === "full" && text !== acronym && !this.seen.has(e)) {
        pieces.push({ text: " (" }, { text: acronym, entity: e }, { text: ")" });
      }
      this.seen.add(e);
    }
    if (pieces[0] && !pieces[0].entity) pieces[0].text = capitalize(pieces[0].text);
    // A span that ends in an abbreviation also ends the sentence: one period, inside the span.
    for (let i = 0; i + 1 < pieces.length; i++) {
      const here = pieces[i];
      const next = pieces[i + 1];
      if (!here.entity || next.entity || !next.text.startsWith(".")) continue;
      const lastWord = here.text.match(/[\p{L}\p{N}]+\.?$/u)?.[0] ?? "";
      if (!here.text.endsWith(".") && isAbbreviation(lastWord)) here.text += ".";
      if (here.text.endsWith(".")) next.text = next.text.slice(1);
    }
    this.sentences.push(pieces);
  }
}

// --- Phrase pools for the templates ----------------------------------------------------------

const WEATHER = [
  "a strong south-westerly gale",
  "thick fog",
  "heavy seas",
  "light and variable winds",
  "a snow squall",
  "a fresh easterly breeze",
];
const SAILED_WITH = [
  "in ballast",
  "with coal",
  "with general cargo",
  "with bricks and tiles",
  "with salt",
  "with barley",
];
const OFFENCES = [
  "being drunk and disorderly on the quay",
  "assaulting a watchman of the dock company",
  "stealing two coils of rope",
  "mooring in the fairway contrary to the bylaws",
  "selling ale after hours",
  "refusing to pay dock dues",
];
const CONTRABAND = [
  "forty pounds of tobacco",
  "two kegs of brandy",
  "a case of Hollands gin",
  "undeclared cigars",
];
const EXCUSES = [
  "he had been paid off that morning and met old shipmates",
  "the rope had been left lying and he thought it abandoned",
  "the tide had turned before he could shift his berth",
  "he had never been told of the new bylaw",
];
const FINES = [
  "five shillings and costs",
  "ten shillings or seven days",
  "twenty shillings",
  "forty shillings and costs",
];
const COMMODITIES = ["English wheat", "Grinding barley", "Malting barley", "White oats", "Beans", "Linseed"];
const PRICES = [
  "32s. 6d. per quarter",
  "28s. per quarter",
  "19s. 6d. per quarter",
  "41s. per quarter",
  "24s. 3d. per quarter",
];
const HM_TASKS = [
  "warn the owners of",
  "report on the moorings used by",
  "remove from the fairway",
  "levy double dues on",
];

/** Format a date for the text ("March 14"). */
const monthDay = (date) => `${MONTHS[Number(date.slice(5, 7)) - 1]} ${Number(date.slice(8, 10))}`;
const weekday = (date) => WEEKDAYS[new Date(`${date}T12:00:00Z`).getUTCDay()];

// --- Genres ----------------------------------------------------------------------------------

const hasRole =
  (...roles) =>
  (e) =>
    roles.includes(e.role);

function shipping(d) {
  const port = d.use(chance(0.75) ? HARROWMOUTH : pick(tableTowns));
  const v1 = d.pick("vessel", { filter: (v) => v.kind !== "tug" });
  const master = d.pick("person", { filter: (p) => !p.female && hasRole("master mariner", "ship owner")(p) });
  const from = d.pick("town");
  const firm = d.pick("firm");
  const cargo = cargoOf(firm.trade);
  if (chance(0.5)) {
    d.s(
      M(port, "caps"),
      `, ${monthDay(d.date)}. — Arrived, `,
      M(v1),
      ", ",
      M(master),
      ", from ",
      M(from),
      `, with ${cargo} for `,
      M(firm),
      ".",
    );
  } else {
    d.s(
      "Arrived at ",
      M(port),
      ", ",
      M(v1),
      ", ",
      M(master),
      ", master, from ",
      M(from),
      `, with ${cargo} for `,
      M(firm),
      ".",
    );
  }
  if (chance(0.7)) {
    const v2 = d.pick("vessel");
    const to = d.pick("town");
    d.s("Sailed, ", M(v2), ", for ", M(to), `, ${pick(SAILED_WITH)}.`);
  }
  if (chance(0.6))
    d.s(M(master), ` reports ${pick(WEATHER)} off `, M(chance(0.5) ? from : d.pick("town")), ".");
  if (chance(0.6)) {
    const wharf = d.pick("wharf", { nil: 0.1 });
    d.s(
      "The cargo is discharging at ",
      M(wharf),
      ", where ",
      M(firm),
      ` have ${pick(["taken the whole of it", "warehoused part of it under bond", "engaged extra hands"])}.`,
    );
  }
  if (chance(0.35)) {
    const pilot = d.pick("person", { filter: hasRole("river pilot") });
    d.s("She was brought over the bar by ", M(pilot), ", pilot, on the morning tide.");
  }
  if (chance(0.25) && d.fits(WVSN)) {
    d.use(WVSN);
    const steamer = d.pick("vessel", { filter: (v) => v.kind === "steamer" });
    const t = d.pick("town");
    d.s(
      M(WVSN),
      " announce that ",
      M(steamer),
      ` will resume the passenger service to `,
      M(t),
      ` on ${weekday(d.date)}.`,
    );
    if (chance(0.5)) d.s("Tickets may be had at the office of ", M(WVSN), " on the quay.");
  }
  return pick(["Shipping Intelligence", "Arrivals and Sailings", "Port of Harrowmouth", "The River"]);
}

function court(d) {
  const bench = d.use(
    chance(0.7) ? institutions["Harrowmouth Police Court"] : institutions["Wendshire Quarter Sessions"],
  );
  const mag = d.pick("person", { filter: hasRole("magistrate", "alderman"), nil: 0.05 });
  const def = d.pick("person", {
    filter: (p) => !p.female && !["magistrate", "alderman", "clergyman", "physician"].includes(p.role),
    nil: 0.6,
  });
  const town = d.pick("town");
  d.s(
    "At ",
    M(bench),
    ` on ${weekday(d.date)}, before `,
    M(mag),
    " and other justices, ",
    M(def),
    ", of ",
    M(town),
    `, was charged with ${pick(OFFENCES)}.`,
  );
  if (chance(0.45)) {
    const collector = d.pick("person", { filter: hasRole("customs collector"), nil: 0.05 });
    const vessel = d.pick("vessel");
    d.s(
      M(collector),
      `, collector of customs, proved the finding of ${pick(CONTRABAND)} aboard `,
      M(vessel),
      ".",
    );
  } else {
    const firm = d.pick("firm");
    const clerk = d.pick("person", { filter: hasRole("clerk") });
    d.s(
      "The prosecution was conducted on behalf of ",
      M(firm),
      ", whose clerk, ",
      M(clerk),
      ", produced the books.",
    );
  }
  d.s(M(def), ` pleaded that ${pick(EXCUSES)}.`);
  d.s(M(mag), ` fined the defendant ${pick(FINES)}, and said the bench would protect the trade of the port.`);
  if (chance(0.3)) d.s("The next sitting of ", M(bench), " is fixed for the first Monday of the month.");
  return pick(["Police Court", "Borough Police Court", "The Magistrates", "Quarter Sessions"]);
}

function market(d) {
  const ex = d.use(d.fits(SGE) && chance(0.75) ? SGE : institutions["Harrowmouth Chamber of Commerce"]);
  const t1 = d.pick("town");
  const t2 = d.pick("town");
  const f1 = d.pick("firm");
  d.s(
    "At ",
    M(ex),
    ` on ${weekday(d.date)} there was a ${pick(["fair", "thin", "large"])} attendance of buyers from `,
    M(t1),
    " and ",
    M(t2),
    ".",
  );
  const v = d.pick("vessel", { filter: (x) => x.kind !== "tug" });
  d.s(
    `${pick(COMMODITIES)} was quoted ${pick(["firm", "easier", "dull"])} at ${pick(PRICES)}, `,
    M(f1),
    " reporting heavy arrivals by ",
    M(v),
    ".",
  );
  if (chance(0.7)) {
    const f2 = d.pick("firm");
    const t3 = d.pick("town");
    d.s(M(f2), ` offered ${pick(COMMODITIES).toLowerCase()} from `, M(t3), " but found few takers.");
  }
  d.s(
    "Dealings on ",
    M(ex),
    ` ${pick(["closed quietly", "were brisk until noon", "were hindered by the fog"])}.`,
  );
  if (chance(0.6)) d.s(M(f1), " expect further supplies from ", M(t1), " before the month is out.");
  if (chance(0.3) && d.fits(HD_BANK)) {
    d.use(HD_BANK);
    d.s(
      "Bills on ",
      M(HD_BANK),
      " were taken at the usual discount, and ",
      M(HD_BANK),
      " reports money easy.",
    );
  }
  return pick(["Corn Market", "Markets", "Grain and Produce", "Trade of the Port"]);
}

function obituary(d, p) {
  const pron = p.female ? "her" : "his";
  const town = d.use(p.townEntity);
  d.s("DEATH OF ", M(p, "caps"), ".");
  d.s(
    `We regret to record the death, at ${pron} residence in `,
    M(town),
    ", of ",
    M(p, "full"),
    `, for many years a ${p.role} of the district.`,
  );
  const firm = d.pick("firm", { filter: (f) => f.founded <= p.born + ADULT_AGE });
  const birthplace = d.pick("town");
  d.s(
    `Born at `,
    M(birthplace),
    ` in ${p.born}, `,
    M(p),
    " entered the service of ",
    M(firm),
    ` as a youth and rose to a partnership.`,
  );
  let son = null;
  if (p === PELL_SR) son = d.use(PELL_JR);
  else if (chance(0.5)) {
    son = makePerson({ first: firstName(), last: p.last, role: "clerk", born: p.born + 28, died: "" }, false);
    d.use(son);
  }
  if (son)
    d.s(
      `${capitalize(pron)} son, `,
      M(son),
      `, ${pick(["carries on the business", "is well known on the quay", "is master of one of the firm's vessels"])}.`,
    );
  const clergy = d.pick("person", { filter: hasRole("clergyman"), nil: 0.1 });
  const church = d.pick("town");
  d.s("The funeral takes place at ", M(church), ` on ${weekday(d.date)}, with `, M(clergy), " officiating.");
  if (chance(0.4)) {
    const mbs = d.use(institutions["Mariners' Benevolent Society"]);
    d.s("Members of ", M(mbs), " will attend, and ", M(mbs), " has opened a subscription for the family.");
  }
  return `Obituary: ${p.female ? "Mrs." : "Mr."} ${p.last}`;
}

function harbourBoard(d) {
  const hhb = d.use(institutions["Harrowmouth Harbour Board"]);
  const chair = d.pick("person", {
    filter: (p) => !p.female && hasRole("alderman", "merchant", "ship owner")(p),
    nil: 0.05,
  });
  const hm = d.pick("person", { filter: hasRole("harbour master"), nil: 0.05 });
  const wharf = d.pick("wharf", { nil: 0.1 });
  d.s(
    "At the monthly meeting of ",
    M(hhb),
    ", ",
    M(chair),
    " presiding, ",
    M(hm),
    `, harbour master, reported ${int(40, 260)} arrivals and complained of silting at `,
    M(wharf),
    ".",
  );
  if (chance(0.6)) {
    const coll = d.pick("person", { filter: hasRole("customs collector"), nil: 0.05 });
    d.s(
      M(coll),
      `, collector of customs, asked that the ${pick(["bonded sheds be lit at night", "Custom House boat be repaired", "landing of spirits be confined to the Bonded Quay"])}.`,
    );
  }
  const firm = d.pick("firm");
  d.s("A letter was read from ", M(firm), ` asking for a reduction of dues on ${firm.trade.goods}.`);
  const vessel = d.pick("vessel");
  d.s(M(hm), ` was instructed to ${pick(HM_TASKS)} `, M(vessel), ".");
  d.s(
    M(hhb),
    ` ${pick(["resolved to borrow for a new dredger", "adjourned until the next spring tide", "agreed to light the bar buoy"])}.`,
  );
  return pick(["Harbour Board", "Harbour Board Meeting", "The Port and its Dues"]);
}

function auction(d) {
  const auct = d.pick("person", { filter: hasRole("auctioneer"), nil: 0.1 });
  const v = d.pick("vessel", { filter: (x) => x.kind !== "steamer" });
  const wharf = d.pick("wharf", { nil: 0.1 });
  const town = d.pick("town");
  const owner = chance(0.5)
    ? d.pick("firm")
    : d.pick("person", { filter: hasRole("ship owner", "master mariner", "merchant") });
  d.s(
    M(auct),
    " will sell by auction at ",
    M(wharf),
    ", ",
    M(town),
    `, on ${weekday(d.date)} next, `,
    M(v),
    `, ${v.attrs.tonnage} tons register, lately the property of `,
    M(owner),
    ".",
  );
  d.s(
    M(v),
    ` lies ${pick(["afloat", "on the hard", "in the basin"])} and may be viewed on application to `,
    M(auct),
    ".",
  );
  if (chance(0.6)) {
    const f2 = d.pick("firm");
    d.s(
      `Also ${pick(["the stock in trade", "two warehouses and a crane", "forty tons of seasoned oak"])} of `,
      M(f2),
      `, ${pick(["declining business", "on the expiry of the lease", "by order of the trustees"])}.`,
    );
  }
  if (chance(0.5)) {
    const clerk = d.pick("person", { filter: hasRole("clerk") });
    d.s("Particulars from ", M(auct), " or from ", M(clerk), ", of ", M(town), ".");
  }
  return pick(["Sales by Auction", "Auction Notices", "For Sale"]);
}

function casualty(d) {
  const v = d.pick("vessel", { filter: (x) => x.kind !== "tug" });
  const master = d.pick("person", { filter: (p) => !p.female && hasRole("master mariner")(p) });
  const t1 = d.pick("town");
  d.s(
    M(v),
    " went ashore on the bar off ",
    M(t1),
    ` during ${pick(WEATHER)} on ${weekday(d.date)}, `,
    M(master),
    " being in command.",
  );
  const tug = d.pick("vessel", { filter: (x) => x.kind === "tug" });
  const tugOwner = d.pick("firm");
  d.s("She was got off on the next tide by ", M(tug), ", belonging to ", M(tugOwner), ".");
  if (chance(0.7)) d.s(M(master), " blames the want of a light at ", M(t1), ".");
  if (chance(0.7)) {
    const f2 = d.pick("firm");
    const cargo = cargoOf(v.trade);
    d.s(`Her ${cargo === "general cargo" ? cargo : "cargo of " + cargo} for `, M(f2), " is little damaged.");
  }
  if (chance(0.35) && d.fits(CMIC)) {
    d.use(CMIC);
    d.s(
      "The hull is insured with ",
      M(CMIC),
      ", whose surveyor has gone down; ",
      M(CMIC),
      " expects a small claim.",
    );
  }
  return pick(["Casualties", "Marine Casualties", "Wrecks and Casualties"]);
}

function localNotes(d) {
  const items = shuffle([
    () => {
      const p = d.pick("person");
      const t1 = d.pick("town");
      const t2 = d.pick("town");
      d.s(
        M(p),
        " of ",
        M(t1),
        ` has returned from ${pick(["a visit", "business", "the wool fair"])} at `,
        M(t2),
        ".",
      );
      if (chance(0.5))
        d.s(
          M(p),
          ` ${pick(["is much improved in health", "brings news of a new railway survey", "reports trade brisk upriver"])}.`,
        );
    },
    () => {
      const f = d.pick("firm");
      const where = chance(0.5) ? d.pick("wharf", { nil: 0.1 }) : d.pick("town");
      d.s(
        M(f),
        " have opened new premises at ",
        M(where),
        `, where they will carry on the ${f.trade.core.toLowerCase()} trade.`,
      );
    },
    () => {
      const p = d.pick("person", { filter: (x) => !x.female });
      const inst = d.use(pick(Object.values(institutions).filter((i) => !d.used.has(i))));
      d.s(
        M(p),
        ` has been appointed ${pick(["secretary", "treasurer", "a member", "surveyor"])} of `,
        M(inst),
        ".",
      );
    },
    () => {
      if (!d.fits(HD_BANK) || d.used.has(HD_BANK)) return;
      d.use(HD_BANK);
      const t = d.pick("town");
      const p = d.pick("person", { filter: (x) => !x.female });
      d.s(M(HD_BANK), " has opened a branch at ", M(t), ", with ", M(p), " as manager.");
      if (chance(0.6))
        d.s(
          "The branch of ",
          M(HD_BANK),
          ` will be open on ${pick(["market days", "Tuesdays and Fridays"])}.`,
        );
    },
    () => {
      const builder = d.pick("person", { filter: hasRole("shipbuilder") });
      const v = d.pick("vessel");
      const t = d.pick("town");
      const owner = d.pick("firm");
      d.s(M(builder), " launched ", M(v), " from the yard at ", M(t), " for ", M(owner), ".");
    },
  ]);
  const count = int(2, 4);
  for (const item of items.slice(0, count)) item();
  return pick(["Local and District", "Notes of the Week", "Up and Down the River"]);
}

/** [genre, weight] — shipping news dominates a shipping list. */
const GENRES = [
  [shipping, 30],
  [court, 18],
  [market, 17],
  [harbourBoard, 14],
  [auction, 12],
  [casualty, 12],
  [localNotes, 12],
];
/** Share of documents that are obituaries (they need a person who died in the archive's span). */
const OBITUARY_COUNT = 14;

/** A date in `year`, never a Sunday (the gazette did not print on Sundays, nor sat the courts). */
function randomDate(year) {
  const month = int(1, 12);
  let day = int(1, 28);
  const iso = (dd) => `${year}-${String(month).padStart(2, "0")}-${String(dd).padStart(2, "0")}`;
  if (weekday(iso(day)) === "Sunday") day++;
  return iso(day);
}

// Obituaries: Josiah Pell Sr. first, then others who die within the archive's years.
const deceased = [
  PELL_SR,
  ...shuffle(tablePersons.filter((p) => p !== PELL_SR && p.died !== "" && p.died >= FIRST_YEAR)).slice(
    0,
    OBITUARY_COUNT - 1,
  ),
];
const plans = [];
for (const p of deceased) plans.push({ date: randomDate(p.died), run: (d) => obituary(d, p) });
while (plans.length < DOC_COUNT) {
  const genre = weighted(GENRES);
  plans.push({ date: randomDate(int(FIRST_YEAR, LAST_YEAR)), run: genre });
}
const byName = (name, list = entities) => list.find((e) => e.name === name);
// A harbour board meeting where both Aldous officials speak, to make the look-alike explicit.
plans.push({
  date: "1897-03-14",
  run: (d) => {
    const hhb = d.use(institutions["Harrowmouth Harbour Board"]);
    d.use(ALDOUS_HM);
    d.use(ALDOUS_CUSTOMS);
    d.s(
      "At the monthly meeting of ",
      M(hhb),
      ", ",
      M(ALDOUS_HM),
      ", harbour master, reported the moorings at ",
      M(d.use(byName("Pell's Wharf"))),
      " silted to half depth.",
    );
    d.s(
      M(ALDOUS_CUSTOMS),
      ", collector of customs, asked for a watchman on the Bonded Quay after the seizure of brandy aboard ",
      M(d.use(byName("Kittiwake"))),
      ".",
    );
    const third = d.use(byName("Felix Aldous", nils));
    d.s("It was stated that ", M(third), ", licensee of the Anchor inn, was no relation of either officer.");
    d.s(
      M(ALDOUS_HM),
      " and ",
      M(ALDOUS_CUSTOMS),
      " were thanked for their reports, and ",
      M(hhb),
      " adjourned.",
    );
    return "Harbour Board: The Two Aldouses";
  },
});
// The Pell family, their firm and the schooner named after the founder.
plans.push({
  date: "1904-06-09",
  run: (d) => {
    const [jr, firm, schooner, wharf, ezra] = [
      PELL_JR,
      PELL_SONS,
      josiahPellSchooner,
      byName("Pell's Wharf"),
      byName("Ezra Pell", nils),
    ];
    for (const e of [jr, firm, schooner, wharf, ezra]) d.use(e);
    const stenmouth = d.use(byName("Stenmouth"));
    d.s(
      M(schooner),
      ", ",
      M(ezra),
      ", master, came up to ",
      M(wharf),
      " on Tuesday with coal from ",
      M(stenmouth),
      " for ",
      M(firm),
      ".",
    );
    d.s(
      M(jr),
      " tells us that ",
      M(firm),
      " will sell the last of their sailing colliers this summer, and that ",
      M(schooner),
      " is to be the first to go.",
    );
    d.s("The schooner was named after the late ", M(PELL_SR), ", who founded ", M(firm), " in 1846.");
    d.s(M(ezra), ", who has sailed her for eleven years, is no kin of ", M(jr), ".");
    return "The Pell Colliers";
  },
});
// Carrowby the town, its rope works, and the steamer named after it; Stenmouth, Stenmoor and Stenford.
plans.push({
  date: "1908-10-02",
  run: (d) => {
    const [carrowby, works, steamer, stenmouth, stenmoor, stenford] = [
      byName("Carrowby"),
      CARROWBY_ROPE,
      byName("S.S. Carrowby"),
      byName("Stenmouth"),
      byName("Stenmoor"),
      byName("Stenford", nils),
    ];
    for (const e of [carrowby, works, steamer, stenmouth, stenmoor, stenford]) d.use(e);
    d.s(
      M(carrowby, "caps"),
      ", October 2. — ",
      M(steamer),
      " loaded two hundred coils of cable at the wharf of ",
      M(works),
      " for ",
      M(stenmouth),
      ".",
    );
    d.s("Trade at ", M(carrowby), " is brisk, and ", M(works), " have taken on forty hands at the ropewalk.");
    d.s(
      M(steamer),
      " will call at ",
      M(stenmoor),
      " landing on her return, and at ",
      M(stenford),
      " if there is water enough over the sill.",
    );
    d.s("Shippers are reminded that ", M(stenford), " is not ", M(stenmouth), ".");
    return "Carrowby Notes";
  },
});
plans.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));

const documents = [];
const spans = [];
/** Sentence boundaries per document: [start, end) character ranges. */
const sentenceRanges = new Map();
for (const [index, plan] of plans.entries()) {
  const id = "D" + String(index + 1).padStart(3, "0");
  const d = new DocBuilder(plan.date);
  const title = plan.run(d);
  let text = "";
  const ranges = [];
  for (const pieces of d.sentences) {
    if (text) text += " ";
    const start = text.length;
    for (const piece of pieces) {
      if (piece.entity) {
        spans.push({
          doc: id,
          start: text.length,
          end: text.length + piece.text.length,
          entity: piece.entity,
          text: piece.text,
        });
      }
      text += piece.text;
    }
    ranges.push([start, text.length]);
  }
  sentenceRanges.set(id, ranges);
  documents.push({ id, date: plan.date, title, text });
}

// ---------------------------------------------------------------------------------------------
// Tokenizer (for the CoNLL file): words, dotted acronyms, abbreviations with their period,
// clitic "'s", and single punctuation marks.
// ---------------------------------------------------------------------------------------------

const TOKEN_RE = /(?:\p{L}\.){2,}|'[sS](?!\p{L})|[\p{L}\p{N}]+(?:-[\p{L}\p{N}]+)*|\S/gu;
function tokenize(text) {
  const tokens = [];
  for (const m of text.matchAll(TOKEN_RE)) {
    let end = m.index + m[0].length;
    if (text[end] === "." && /^[\p{L}]+$/u.test(m[0]) && isAbbreviation(m[0])) end++;
    const last = tokens.at(-1);
    if (last && m.index < last.end) continue; // the period was glued to the previous token
    tokens.push({ start: m.index, end, text: text.slice(m.index, end) });
  }
  return tokens;
}

/** Detokenization rule of the project's CoNLL reader: no space before these, none after brackets. */
const ATTACH_LEFT = new Set([".", ",", ";", ":", "!", "?", ")", "]", "}", "%", "...", "'s", "'S", "’s", "'"]);
const ATTACH_RIGHT = new Set(["(", "[", "{"]);
function joinTokens(tokens) {
  let out = "";
  let previous;
  for (const t of tokens) {
    if (previous !== undefined && !ATTACH_LEFT.has(t) && !ATTACH_RIGHT.has(previous)) out += " ";
    out += t;
    previous = t;
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Checks and output
// ---------------------------------------------------------------------------------------------

function assert(ok, message) {
  if (!ok) throw new Error(`make-samples: ${message}`);
}

const docById = new Map(documents.map((d) => [d.id, d]));
const mentions = spans.map((s, i) => ({ ...s, id: "M" + String(i + 1).padStart(4, "0") }));

const conllLines = [];
for (const doc of documents) {
  const tokens = tokenize(doc.text);
  // Tokens joined by the original whitespace rebuild the text.
  let cursor = 0;
  for (const t of tokens) {
    assert(
      /^\s*$/.test(doc.text.slice(cursor, t.start)),
      `${doc.id}: text between tokens at ${cursor} is not whitespace`,
    );
    cursor = t.end;
  }
  assert(/^\s*$/.test(doc.text.slice(cursor)), `${doc.id}: trailing text not tokenized`);
  const tags = tokens.map(() => "O");
  const starts = new Map(tokens.map((t, i) => [t.start, i]));
  const ends = new Map(tokens.map((t, i) => [t.end, i]));
  for (const m of mentions.filter((x) => x.doc === doc.id)) {
    assert(doc.text.slice(m.start, m.end) === m.text, `${m.id}: span text differs from the document slice`);
    const first = starts.get(m.start);
    const last = ends.get(m.end);
    assert(
      first !== undefined && last !== undefined,
      `${m.id} "${m.text}" in ${doc.id}: span boundary inside a token`,
    );
    const label = LABEL[m.entity.type];
    for (let i = first; i <= last; i++) {
      assert(tags[i] === "O", `${m.id}: overlapping spans`);
      tags[i] = (i === first ? "B-" : "I-") + label;
    }
    const rebuilt = joinTokens(tokens.slice(first, last + 1).map((t) => t.text));
    assert(rebuilt === m.text, `${m.id}: tokens rejoin as "${rebuilt}", not "${m.text}"`);
  }
  conllLines.push(`-DOCSTART- ${doc.id}`, "");
  const ranges = sentenceRanges.get(doc.id);
  for (const [start, end] of ranges) {
    const inSentence = tokens.map((t, i) => [t, i]).filter(([t]) => t.start >= start && t.end <= end);
    for (const [t, i] of inSentence) conllLines.push(`${t.text}\t${tags[i]}`);
    conllLines.push("");
  }
  const covered = ranges.reduce(
    (n, [s, e]) => n + tokens.filter((t) => t.start >= s && t.end <= e).length,
    0,
  );
  assert(covered === tokens.length, `${doc.id}: a token crosses a sentence boundary`);
}

function contextOf(m) {
  const ranges = sentenceRanges.get(m.doc);
  const text = docById.get(m.doc).text;
  const index = ranges.findIndex(([s, e]) => m.start >= s && m.end <= e);
  assert(index >= 0, `${m.id}: not inside one sentence`);
  const from = ranges[Math.max(0, index - 1)][0];
  return text.slice(from, ranges[index][1]);
}

const tableIds = new Set(entities.map((e) => e.id));
const goldRows = mentions.map((m) => ({
  id: m.id,
  text: m.text,
  type: LABEL[m.entity.type],
  context: contextOf(m),
  doc: m.doc,
  start: m.start,
  end: m.end,
  gold: m.entity.id,
}));
for (const g of goldRows)
  assert(g.gold === null || tableIds.has(g.gold), `${g.id}: gold ${g.gold} not in the table`);
assert(new Set(entities.map((e) => e.id)).size === entities.length, "duplicate entity ids");

const nilShare = goldRows.filter((g) => g.gold === null).length / goldRows.length;

// --- Summary ---------------------------------------------------------------------------------

if (!QUIET) {
  const byType = {};
  for (const e of entities) byType[e.type] = (byType[e.type] ?? 0) + 1;
  const byLabel = {};
  for (const g of goldRows) byLabel[g.type] = (byLabel[g.type] ?? 0) + 1;
  const clean = mentions.filter((m) => m.text === m.entity.name || m.entity.aliases.includes(m.text)).length;
  const linked = new Set(goldRows.map((g) => g.gold).filter(Boolean)).size;
  console.log(`entities: ${entities.length} ${JSON.stringify(byType)}`);
  console.log(`documents: ${documents.length}`);
  console.log(`mentions: ${mentions.length} ${JSON.stringify(byLabel)}`);
  console.log(`NIL share: ${(nilShare * 100).toFixed(1)}%`);
  console.log(`clean (canonical name or alias): ${((clean / mentions.length) * 100).toFixed(1)}%`);
  console.log(`distinct table entities mentioned: ${linked}`);
  for (const label of Object.keys(byLabel)) {
    const rows = mentions.filter((m) => LABEL[m.entity.type] === label);
    const c = rows.filter((m) => m.text === m.entity.name || m.entity.aliases.includes(m.text)).length;
    console.log(`  clean ${label}: ${((c / rows.length) * 100).toFixed(1)}%`);
  }
  console.log(`written to ${OUT}`);
}

assert(entities.length >= MIN_ENTITIES, `only ${entities.length} entities`);
assert(documents.length >= MIN_DOCUMENTS, `only ${documents.length} documents`);
assert(mentions.length >= MIN_MENTIONS, `only ${mentions.length} mentions`);
assert(
  nilShare >= NIL_SHARE_RANGE[0] && nilShare <= NIL_SHARE_RANGE[1],
  `NIL share ${nilShare.toFixed(3)} out of range`,
);

// --- Writers ---------------------------------------------------------------------------------

/** RFC 4180 field: quoted when it holds a comma, quote or line break; quotes doubled. */
function csvField(value) {
  const s = value === null || value === undefined ? "" : String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
const csvLine = (values) => values.map(csvField).join(",");
const jsonl = (rows) => rows.map((r) => JSON.stringify(r)).join("\n") + "\n";

const tableLines = [csvLine(COLUMNS)];
for (const e of entities) {
  const row = {
    id: e.id,
    name: e.name,
    type: e.type,
    aliases: e.aliases.join("|"),
    description: e.description,
    prior: e.prior,
    ...e.attrs,
  };
  tableLines.push(csvLine(COLUMNS.map((c) => row[c] ?? "")));
}

const mentionRows = goldRows.map(({ gold, ...rest }) => rest);
const MENTION_CSV_COLUMNS = ["id", "text", "type", "context", "doc", "start", "end"];

mkdirSync(join(OUT, "articles"), { recursive: true });
writeFileSync(join(OUT, "gazette-entities.csv"), tableLines.join("\n") + "\n");
writeFileSync(join(OUT, "articles", "documents.jsonl"), jsonl(documents));
writeFileSync(
  join(OUT, "articles", "spans.jsonl"),
  jsonl(
    mentions.map((m) => ({
      id: m.id,
      doc: m.doc,
      start: m.start,
      end: m.end,
      label: LABEL[m.entity.type],
      text: m.text,
    })),
  ),
);
writeFileSync(join(OUT, "gazette-gold.jsonl"), jsonl(goldRows));
writeFileSync(join(OUT, "gazette-mentions.jsonl"), jsonl(mentionRows));
writeFileSync(
  join(OUT, "gazette-mentions.csv"),
  [
    csvLine(MENTION_CSV_COLUMNS),
    ...mentionRows.map((r) => csvLine(MENTION_CSV_COLUMNS.map((c) => r[c]))),
  ].join("\n") + "\n",
);
writeFileSync(join(OUT, "articles", "gazette.conll"), conllLines.join("\n") + "\n");
