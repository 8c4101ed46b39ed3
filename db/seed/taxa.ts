/**
 * Ecotone demo seed: species list for the demo survey event at the fictional
 * Harrowmere Vale reserve (grassland meadow, alder woodland edge, millpond wetland
 * margin, beech woodland) somewhere in temperate Europe.
 *
 * This is the demo's INVENTED survey content: the species are real and common in
 * temperate Europe, but their presence at the fictional reserve, their habitat
 * assignment there and their abundance scores are invented for the demo.
 *
 * Scientific and common names (en / es / fr) were written FROM MEMORY, not checked
 * against a checklist or taxonomic backbone. Where a language has no well-established
 * vernacular name, a careful descriptive name was used (marked `// descriptive`).
 * Note: some recent bird checklists place the goshawk in Astur (Astur gentilis);
 * Accipiter gentilis is kept here as the widely used name.
 */

import type { Sensitivity, TaxonGroup, TaxonRank } from "@/lib/domain";

export type HabitatAffinity = "grassland" | "woodland" | "wetland" | "any";
export type SeedTaxon = {
  scientificName: string;
  rank: TaxonRank;
  group: TaxonGroup;
  sensitivity: Sensitivity;
  names: { en: string; es: string; fr: string }; // accepted common names in English, Spanish and French
  habitat: HabitatAffinity; // where in the reserve it is most likely found
  abundance: 1 | 2 | 3 | 4 | 5; // 5 = very common, 1 = rare (drives the demo's invented counts)
};

function sp(
  group: TaxonGroup,
  scientificName: string,
  en: string,
  es: string,
  fr: string,
  habitat: HabitatAffinity,
  abundance: SeedTaxon["abundance"],
  sensitivity: Sensitivity = "open",
): SeedTaxon {
  return { scientificName, rank: "species", group, sensitivity, names: { en, es, fr }, habitat, abundance };
}

export const SEED_TAXA: readonly SeedTaxon[] = [
  // ── Birds (45) ────────────────────────────────────────────────────────────
  sp("birds", "Erithacus rubecula", "European robin", "Petirrojo europeo", "Rougegorge familier", "woodland", 5),
  sp("birds", "Turdus merula", "Common blackbird", "Mirlo común", "Merle noir", "any", 5),
  sp("birds", "Turdus philomelos", "Song thrush", "Zorzal común", "Grive musicienne", "woodland", 3),
  sp("birds", "Fringilla coelebs", "Common chaffinch", "Pinzón vulgar", "Pinson des arbres", "woodland", 5),
  sp("birds", "Parus major", "Great tit", "Carbonero común", "Mésange charbonnière", "woodland", 5),
  sp("birds", "Cyanistes caeruleus", "Eurasian blue tit", "Herrerillo común", "Mésange bleue", "woodland", 5),
  sp("birds", "Sitta europaea", "Eurasian nuthatch", "Trepador azul", "Sittelle torchepot", "woodland", 3),
  sp(
    "birds",
    "Certhia brachydactyla",
    "Short-toed treecreeper",
    "Agateador europeo",
    "Grimpereau des jardins",
    "woodland",
    2,
  ),
  sp("birds", "Troglodytes troglodytes", "Eurasian wren", "Chochín común", "Troglodyte mignon", "any", 4),
  sp("birds", "Prunella modularis", "Dunnock", "Acentor común", "Accenteur mouchet", "any", 3),
  sp("birds", "Sylvia atricapilla", "Eurasian blackcap", "Curruca capirotada", "Fauvette à tête noire", "woodland", 4),
  sp("birds", "Phylloscopus collybita", "Common chiffchaff", "Mosquitero común", "Pouillot véloce", "woodland", 4),
  sp("birds", "Regulus regulus", "Goldcrest", "Reyezuelo sencillo", "Roitelet huppé", "woodland", 3),
  sp("birds", "Aegithalos caudatus", "Long-tailed tit", "Mito común", "Mésange à longue queue", "woodland", 3),
  sp("birds", "Dendrocopos major", "Great spotted woodpecker", "Pico picapinos", "Pic épeiche", "woodland", 3),
  sp("birds", "Picus viridis", "European green woodpecker", "Pito real europeo", "Pic vert", "grassland", 2),
  sp("birds", "Columba palumbus", "Common wood pigeon", "Paloma torcaz", "Pigeon ramier", "any", 5),
  sp("birds", "Strix aluco", "Tawny owl", "Cárabo común", "Chouette hulotte", "woodland", 2),
  sp("birds", "Cuculus canorus", "Common cuckoo", "Cuco común", "Coucou gris", "grassland", 2),
  sp("birds", "Garrulus glandarius", "Eurasian jay", "Arrendajo euroasiático", "Geai des chênes", "woodland", 3),
  sp("birds", "Pica pica", "Eurasian magpie", "Urraca común", "Pie bavarde", "grassland", 4),
  sp("birds", "Corvus corone", "Carrion crow", "Corneja negra", "Corneille noire", "any", 4),
  sp("birds", "Corvus frugilegus", "Rook", "Graja", "Corbeau freux", "grassland", 3),
  sp("birds", "Sturnus vulgaris", "Common starling", "Estornino pinto", "Étourneau sansonnet", "grassland", 4),
  sp("birds", "Passer domesticus", "House sparrow", "Gorrión común", "Moineau domestique", "any", 3),
  sp("birds", "Carduelis carduelis", "European goldfinch", "Jilguero europeo", "Chardonneret élégant", "grassland", 3),
  sp("birds", "Chloris chloris", "European greenfinch", "Verderón común", "Verdier d'Europe", "any", 3),
  sp("birds", "Pyrrhula pyrrhula", "Eurasian bullfinch", "Camachuelo común", "Bouvreuil pivoine", "woodland", 2),
  sp("birds", "Emberiza citrinella", "Yellowhammer", "Escribano cerillo", "Bruant jaune", "grassland", 3),
  sp("birds", "Alauda arvensis", "Eurasian skylark", "Alondra común", "Alouette des champs", "grassland", 3),
  sp("birds", "Anthus pratensis", "Meadow pipit", "Bisbita pratense", "Pipit farlouse", "grassland", 2),
  sp("birds", "Saxicola rubicola", "European stonechat", "Tarabilla europea", "Tarier pâtre", "grassland", 2),
  sp("birds", "Motacilla alba", "White wagtail", "Lavandera blanca", "Bergeronnette grise", "wetland", 3),
  sp("birds", "Hirundo rustica", "Barn swallow", "Golondrina común", "Hirondelle rustique", "grassland", 4),
  sp("birds", "Apus apus", "Common swift", "Vencejo común", "Martinet noir", "any", 3),
  sp("birds", "Buteo buteo", "Common buzzard", "Busardo ratonero", "Buse variable", "grassland", 3),
  sp("birds", "Falco tinnunculus", "Common kestrel", "Cernícalo vulgar", "Faucon crécerelle", "grassland", 2),
  sp(
    "birds",
    "Accipiter gentilis",
    "Northern goshawk",
    "Azor común",
    "Autour des palombes",
    "woodland",
    1,
    "restricted",
  ),
  sp("birds", "Ardea cinerea", "Grey heron", "Garza real", "Héron cendré", "wetland", 3),
  sp("birds", "Anas platyrhynchos", "Mallard", "Ánade azulón", "Canard colvert", "wetland", 4),
  sp("birds", "Gallinula chloropus", "Common moorhen", "Gallineta común", "Gallinule poule-d'eau", "wetland", 3),
  sp("birds", "Fulica atra", "Eurasian coot", "Focha común", "Foulque macroule", "wetland", 3),
  sp("birds", "Alcedo atthis", "Common kingfisher", "Martín pescador común", "Martin-pêcheur d'Europe", "wetland", 2),
  sp("birds", "Cygnus olor", "Mute swan", "Cisne vulgar", "Cygne tuberculé", "wetland", 2),
  sp(
    "birds",
    "Acrocephalus scirpaceus",
    "Common reed warbler",
    "Carricero común",
    "Rousserolle effarvatte",
    "wetland",
    3,
  ),

  // ── Vascular plants (40) ──────────────────────────────────────────────────
  sp("vascular_plants", "Urtica dioica", "Common nettle", "Ortiga mayor", "Grande ortie", "any", 5),
  sp(
    "vascular_plants",
    "Cypripedium calceolus",
    "Lady's-slipper orchid",
    "Zapatito de dama",
    "Sabot de Vénus",
    "woodland",
    1,
    "restricted",
  ),
  sp("vascular_plants", "Ranunculus acris", "Meadow buttercup", "Hierba belida", "Renoncule âcre", "grassland", 5),
  sp("vascular_plants", "Bellis perennis", "Common daisy", "Margarita común", "Pâquerette", "grassland", 5),
  sp("vascular_plants", "Trifolium pratense", "Red clover", "Trébol rojo", "Trèfle des prés", "grassland", 5),
  sp("vascular_plants", "Trifolium repens", "White clover", "Trébol blanco", "Trèfle blanc", "grassland", 4),
  sp(
    "vascular_plants",
    "Plantago lanceolata",
    "Ribwort plantain",
    "Llantén menor",
    "Plantain lancéolé",
    "grassland",
    5,
  ),
  sp("vascular_plants", "Achillea millefolium", "Yarrow", "Milenrama", "Achillée millefeuille", "grassland", 4),
  sp("vascular_plants", "Leucanthemum vulgare", "Oxeye daisy", "Margarita mayor", "Marguerite commune", "grassland", 4),
  sp(
    "vascular_plants",
    "Knautia arvensis",
    "Field scabious",
    "Escabiosa de campo",
    "Knautie des champs",
    "grassland",
    3,
  ),
  sp("vascular_plants", "Dactylis glomerata", "Cock's-foot", "Dáctilo", "Dactyle aggloméré", "grassland", 5),
  sp("vascular_plants", "Holcus lanatus", "Yorkshire fog", "Heno blanco", "Houlque laineuse", "grassland", 4),
  sp(
    "vascular_plants",
    "Lotus corniculatus",
    "Common bird's-foot trefoil",
    "Cuernecillo",
    "Lotier corniculé",
    "grassland",
    4,
  ),
  sp("vascular_plants", "Prunella vulgaris", "Selfheal", "Hierba de las heridas", "Brunelle commune", "grassland", 3),
  sp("vascular_plants", "Rumex acetosa", "Common sorrel", "Acedera", "Grande oseille", "grassland", 4),
  sp("vascular_plants", "Quercus robur", "Pedunculate oak", "Roble carballo", "Chêne pédonculé", "woodland", 4),
  sp("vascular_plants", "Fagus sylvatica", "European beech", "Haya", "Hêtre commun", "woodland", 5),
  sp("vascular_plants", "Alnus glutinosa", "Black alder", "Aliso común", "Aulne glutineux", "woodland", 5),
  sp("vascular_plants", "Fraxinus excelsior", "European ash", "Fresno de hoja ancha", "Frêne élevé", "woodland", 3),
  sp("vascular_plants", "Corylus avellana", "Common hazel", "Avellano", "Noisetier commun", "woodland", 4),
  sp("vascular_plants", "Crataegus monogyna", "Common hawthorn", "Majuelo", "Aubépine monogyne", "grassland", 4),
  sp("vascular_plants", "Sambucus nigra", "Elder", "Saúco", "Sureau noir", "woodland", 3),
  sp("vascular_plants", "Hedera helix", "Common ivy", "Hiedra", "Lierre grimpant", "woodland", 5),
  sp("vascular_plants", "Anemone nemorosa", "Wood anemone", "Anémona de bosque", "Anémone des bois", "woodland", 4),
  sp(
    "vascular_plants",
    "Hyacinthoides non-scripta",
    "Common bluebell",
    "Jacinto de los bosques",
    "Jacinthe des bois",
    "woodland",
    3,
  ),
  sp("vascular_plants", "Oxalis acetosella", "Wood sorrel", "Aleluya", "Oxalide petite-oseille", "woodland", 3),
  sp("vascular_plants", "Galium odoratum", "Sweet woodruff", "Asperilla olorosa", "Aspérule odorante", "woodland", 3),
  sp(
    "vascular_plants",
    "Geranium robertianum",
    "Herb-Robert",
    "Hierba de San Roberto",
    "Géranium herbe-à-Robert",
    "woodland",
    3,
  ),
  sp(
    "vascular_plants",
    "Ficaria verna",
    "Lesser celandine",
    "Celidonia menor",
    "Ficaire fausse-renoncule",
    "woodland",
    4,
  ),
  sp("vascular_plants", "Dryopteris filix-mas", "Male fern", "Helecho macho", "Fougère mâle", "woodland", 3),
  sp("vascular_plants", "Allium ursinum", "Wild garlic", "Ajo de oso", "Ail des ours", "woodland", 4),
  sp("vascular_plants", "Phragmites australis", "Common reed", "Carrizo", "Roseau commun", "wetland", 5),
  sp("vascular_plants", "Typha latifolia", "Common bulrush", "Espadaña", "Massette à larges feuilles", "wetland", 4),
  sp("vascular_plants", "Iris pseudacorus", "Yellow flag iris", "Lirio amarillo", "Iris des marais", "wetland", 3),
  sp("vascular_plants", "Caltha palustris", "Marsh marigold", "Hierba centella", "Populage des marais", "wetland", 3),
  sp("vascular_plants", "Lythrum salicaria", "Purple loosestrife", "Salicaria", "Salicaire commune", "wetland", 3),
  sp("vascular_plants", "Filipendula ulmaria", "Meadowsweet", "Reina de los prados", "Reine-des-prés", "wetland", 4),
  sp("vascular_plants", "Mentha aquatica", "Water mint", "Menta acuática", "Menthe aquatique", "wetland", 3),
  sp("vascular_plants", "Lemna minor", "Common duckweed", "Lenteja de agua", "Petite lentille d'eau", "wetland", 4),
  sp("vascular_plants", "Nymphaea alba", "White water lily", "Nenúfar blanco", "Nymphéa blanc", "wetland", 2),

  // ── Insects (30) ──────────────────────────────────────────────────────────
  sp("insects", "Aglais io", "European peacock", "Pavo real", "Paon-du-jour", "grassland", 4),
  sp("insects", "Aglais urticae", "Small tortoiseshell", "Ortiguera", "Petite tortue", "grassland", 3),
  sp("insects", "Vanessa atalanta", "Red admiral", "Almirante rojo", "Vulcain", "grassland", 3),
  sp("insects", "Pieris rapae", "Small white", "Blanquita de la col", "Piéride de la rave", "grassland", 5),
  sp("insects", "Pieris brassicae", "Large white", "Mariposa de la col", "Piéride du chou", "grassland", 3),
  sp("insects", "Anthocharis cardamines", "Orange-tip", "Aurora", "Aurore", "wetland", 3),
  sp("insects", "Gonepteryx rhamni", "Common brimstone", "Limonera", "Citron", "woodland", 3),
  sp("insects", "Maniola jurtina", "Meadow brown", "Loba", "Myrtil", "grassland", 5),
  sp("insects", "Pararge aegeria", "Speckled wood", "Maculada", "Tircis", "woodland", 4),
  sp("insects", "Polyommatus icarus", "Common blue", "Ícaro", "Azuré de la bugrane", "grassland", 4),
  sp("insects", "Coenonympha pamphilus", "Small heath", "Níspola", "Fadet commun", "grassland", 4),
  sp("insects", "Tyria jacobaeae", "Cinnabar moth", "Polilla cinabrio", "Goutte-de-sang", "grassland", 3),
  sp("insects", "Apis mellifera", "Western honey bee", "Abeja melífera", "Abeille domestique", "any", 5),
  sp("insects", "Bombus terrestris", "Buff-tailed bumblebee", "Abejorro común", "Bourdon terrestre", "any", 5),
  sp("insects", "Bombus pascuorum", "Common carder bee", "Abejorro pardo", "Bourdon des champs", "grassland", 4), // descriptive es
  sp(
    "insects",
    "Bombus lapidarius",
    "Red-tailed bumblebee",
    "Abejorro de cola roja",
    "Bourdon des pierres",
    "grassland",
    3,
  ), // descriptive es
  sp("insects", "Episyrphus balteatus", "Marmalade hoverfly", "Sírfido balteado", "Syrphe ceinturé", "any", 4), // descriptive es
  sp("insects", "Anax imperator", "Emperor dragonfly", "Emperador", "Anax empereur", "wetland", 3),
  sp(
    "insects",
    "Calopteryx splendens",
    "Banded demoiselle",
    "Caballito del diablo de bandas",
    "Caloptéryx éclatant",
    "wetland",
    3,
  ), // descriptive es
  sp("insects", "Libellula depressa", "Broad-bodied chaser", "Libélula deprimida", "Libellule déprimée", "wetland", 3),
  sp(
    "insects",
    "Ischnura elegans",
    "Blue-tailed damselfly",
    "Caballito del diablo de cola azul",
    "Agrion élégant",
    "wetland",
    4,
  ), // descriptive es
  sp(
    "insects",
    "Coccinella septempunctata",
    "Seven-spot ladybird",
    "Mariquita de siete puntos",
    "Coccinelle à sept points",
    "grassland",
    5,
  ),
  sp("insects", "Lucanus cervus", "European stag beetle", "Ciervo volante", "Lucane cerf-volant", "woodland", 2),
  sp("insects", "Carabus violaceus", "Violet ground beetle", "Carábido violeta", "Carabe violet", "woodland", 3), // descriptive es
  sp(
    "insects",
    "Rhagonycha fulva",
    "Common red soldier beetle",
    "Escarabajo soldado rojo",
    "Téléphore fauve",
    "grassland",
    4,
  ), // descriptive es
  sp("insects", "Oedemera nobilis", "Swollen-thighed beetle", "Edemérido verde", "Œdémère noble", "grassland", 3), // descriptive es
  sp("insects", "Chorthippus brunneus", "Field grasshopper", "Saltamontes pardo", "Criquet duettiste", "grassland", 4), // descriptive es
  sp(
    "insects",
    "Pholidoptera griseoaptera",
    "Dark bush-cricket",
    "Saltamontes de matorral oscuro",
    "Decticelle cendrée",
    "woodland",
    3,
  ), // descriptive es
  sp("insects", "Pyrrhocoris apterus", "Firebug", "Chinche roja", "Gendarme", "any", 3),
  sp("insects", "Panorpa communis", "Common scorpionfly", "Mosca escorpión", "Panorpe commune", "woodland", 3),

  // ── Fungi (10) ────────────────────────────────────────────────────────────
  sp("fungi", "Amanita muscaria", "Fly agaric", "Falsa oronja", "Amanite tue-mouches", "woodland", 3),
  sp("fungi", "Boletus edulis", "Penny bun", "Boleto comestible", "Cèpe de Bordeaux", "woodland", 3),
  sp("fungi", "Cantharellus cibarius", "Golden chanterelle", "Rebozuelo", "Girolle", "woodland", 2),
  sp("fungi", "Fomes fomentarius", "Tinder fungus", "Yesquero", "Amadouvier", "woodland", 3),
  sp("fungi", "Trametes versicolor", "Turkey tail", "Cola de pavo", "Tramète versicolore", "woodland", 5),
  sp("fungi", "Auricularia auricula-judae", "Jelly ear", "Oreja de Judas", "Oreille-de-Judas", "woodland", 4),
  sp(
    "fungi",
    "Armillaria mellea",
    "Honey fungus",
    "Armilaria color de miel",
    "Armillaire couleur de miel",
    "woodland",
    3,
  ),
  sp("fungi", "Laccaria amethystina", "Amethyst deceiver", "Lacaria amatista", "Laccaire améthyste", "woodland", 3),
  sp("fungi", "Coprinus comatus", "Shaggy ink cap", "Barbuda", "Coprin chevelu", "grassland", 3),
  sp("fungi", "Marasmius oreades", "Fairy ring champignon", "Senderuela", "Marasme des Oréades", "grassland", 4),

  // ── Mammals (10) ──────────────────────────────────────────────────────────
  sp("mammals", "Capreolus capreolus", "European roe deer", "Corzo", "Chevreuil européen", "woodland", 3),
  sp("mammals", "Vulpes vulpes", "Red fox", "Zorro rojo", "Renard roux", "any", 3),
  sp("mammals", "Meles meles", "European badger", "Tejón europeo", "Blaireau européen", "woodland", 2, "generalised"), // sett locations generalised
  sp("mammals", "Sciurus vulgaris", "Eurasian red squirrel", "Ardilla roja", "Écureuil roux", "woodland", 3),
  sp("mammals", "Erinaceus europaeus", "European hedgehog", "Erizo europeo", "Hérisson d'Europe", "grassland", 2),
  sp("mammals", "Talpa europaea", "European mole", "Topo europeo", "Taupe d'Europe", "grassland", 3),
  sp("mammals", "Lepus europaeus", "European hare", "Liebre europea", "Lièvre d'Europe", "grassland", 2),
  sp("mammals", "Apodemus sylvaticus", "Wood mouse", "Ratón de campo", "Mulot sylvestre", "woodland", 4),
  sp("mammals", "Pipistrellus pipistrellus", "Common pipistrelle", "Murciélago enano", "Pipistrelle commune", "any", 4),
  sp("mammals", "Myotis daubentonii", "Daubenton's bat", "Murciélago ribereño", "Murin de Daubenton", "wetland", 2),

  // ── Amphibians and reptiles (7) ───────────────────────────────────────────
  sp("amphibians_reptiles", "Bufo bufo", "Common toad", "Sapo común", "Crapaud commun", "wetland", 3),
  sp("amphibians_reptiles", "Rana temporaria", "Common frog", "Rana bermeja", "Grenouille rousse", "wetland", 4),
  sp("amphibians_reptiles", "Lissotriton vulgaris", "Smooth newt", "Tritón común", "Triton ponctué", "wetland", 3),
  sp("amphibians_reptiles", "Ichthyosaura alpestris", "Alpine newt", "Tritón alpino", "Triton alpestre", "wetland", 2),
  sp("amphibians_reptiles", "Anguis fragilis", "Slow worm", "Lución", "Orvet fragile", "grassland", 2),
  sp(
    "amphibians_reptiles",
    "Zootoca vivipara",
    "Viviparous lizard",
    "Lagartija de turbera",
    "Lézard vivipare",
    "grassland",
    3,
  ),
  sp("amphibians_reptiles", "Natrix natrix", "Grass snake", "Culebra de collar", "Couleuvre à collier", "wetland", 2),

  // ── Molluscs (5) ──────────────────────────────────────────────────────────
  sp("molluscs", "Cepaea nemoralis", "Grove snail", "Caracol de bosque", "Escargot des haies", "grassland", 4), // descriptive es
  sp("molluscs", "Cornu aspersum", "Garden snail", "Caracol común", "Escargot petit-gris", "any", 3),
  sp("molluscs", "Helix pomatia", "Roman snail", "Caracol de Borgoña", "Escargot de Bourgogne", "woodland", 2),
  sp("molluscs", "Limax maximus", "Leopard slug", "Babosa leopardo", "Limace léopard", "woodland", 3),
  sp("molluscs", "Lymnaea stagnalis", "Great pond snail", "Limnea de estanque", "Grande limnée", "wetland", 3), // descriptive es

  // ── Other (3) ─────────────────────────────────────────────────────────────
  sp("other", "Araneus diadematus", "European garden spider", "Araña de jardín", "Épeire diadème", "any", 4),
  sp("other", "Oniscus asellus", "Common shiny woodlouse", "Cochinilla de humedad", "Cloporte des murs", "woodland", 4),
  sp("other", "Lumbricus terrestris", "Common earthworm", "Lombriz de tierra", "Lombric terrestre", "grassland", 5),
];
