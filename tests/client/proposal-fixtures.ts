// A proposal document as the server builds it for a demo quote (invented company and homeowner), for the client tests.
import type { ProposalDocDto } from "@shared/schemas/proposal";

export const proposalDoc: ProposalDocDto = {
  "company": {
    "name": "Quarry Slope Steelworks",
    "legalName": "Quarry Slope Steelworks LLC",
    "licenceNumber": "RC-204518",
    "addressLines": [
      "118 Tinplate Road",
      "Harrow Falls, OR 97099"
    ],
    "phone": "(555) 013-2288",
    "email": "office@quarryslope.example.com",
    "website": "https://quarryslope.example.com",
    "logoDataUrl": null
  },
  "proposalNumber": "QSS-1042",
  "revisionNo": 2,
  "date": "2026-03-05",
  "validUntil": "2026-04-04",
  "homeowner": {
    "name": "Marisol Vantongeren",
    "email": "homeowner@example.com",
    "phone": "(555) 014-7730",
    "addressLines": [
      "42 Larkspur Bend",
      "Harrow Falls, OR 97099"
    ]
  },
  "siteAddressLines": [
    "42 Larkspur Bend",
    "Harrow Falls, OR 97099"
  ],
  "introduction": "Thank you for asking Quarry Slope Steelworks to look at your roof. This proposal describes the new metal roof we would install at 42 Larkspur Bend, what each layer does, and the 3 options we have priced for you. When you are ready, choose an option and accept online through the link at the end.",
  "scope": {
    "preparation": [
      "We remove the existing roofing (2 layers) down to the deck, protect your plants, walls and windows, and haul the debris away.",
      "At the end of each day the roof is left watertight, and at the end of the job we sweep the site for nails and metal scraps with a magnet."
    ],
    "areas": [
      {
        "stackId": "upper",
        "title": "Main roof",
        "planes": [
          {
            "id": "m-main-s",
            "number": 1,
            "name": "Main south slope",
            "pitch": 8,
            "squares": 6.201548193798062
          },
          {
            "id": "m-main-n",
            "number": 2,
            "name": "Main north slope",
            "pitch": 8,
            "squares": 7.403398618952725
          },
          {
            "id": "m-wing-w",
            "number": 3,
            "name": "Wing west slope",
            "pitch": 8,
            "squares": 2.2835158077938598
          },
          {
            "id": "m-wing-e",
            "number": 4,
            "name": "Wing east slope",
            "pitch": 8,
            "squares": 2.2835158077938598
          }
        ],
        "squares": 18.171978428338505,
        "layers": [
          {
            "title": "Roof deck",
            "sentences": [
              "We check the roof deck (the wood sheathing under your roofing), re-nail loose sheets and replace damaged ones.",
              "The price allows for replacing about 10% of the deck; if more turns out to be damaged, we show you and agree the cost before going on."
            ]
          },
          {
            "title": "Ice barrier",
            "sentences": [
              "Along the eaves, a self-sealing rubberised membrane goes on first, about 4 feet up the roof.",
              "It seals around every nail and keeps out the water that backs up behind ice dams in winter."
            ]
          },
          {
            "title": "Underlayment",
            "sentences": [
              "A synthetic underlayment covers the whole deck: a tough woven sheet that sheds water and is the roof's second line of defence under the metal.",
              "It is rated for the high temperatures that build up under metal roofing."
            ]
          },
          {
            "title": "Reflective foil",
            "sentences": [
              "A reflective foil sheet lies over the underlayment with its shiny side facing up, toward the air gap under the panels.",
              "Why it faces the gap: metal panels in the sun radiate heat downward. A shiny face next to open air reflects most of that heat and gives off very little of its own, so less heat reaches the deck and the rooms below.",
              "Pressed against a solid layer the foil would simply pass the heat through by contact, which is why it always faces the air space."
            ]
          },
          {
            "title": "Spacer and air gap",
            "sentences": [
              "Counter-battens (1x4) are fastened up the slope every 24 inches, then battens (1x4) across them every 24 inches; the panels are fastened to the battens, about 1-1/2 inches above the deck.",
              "Why the air gap: the metal does not sit on the underlayment, so moisture that forms under the panels can dry out instead of being trapped against the deck.",
              "Because the gap runs unbroken from the eaves to the ridge, is at least 3/4 inch deep and is open at both ends, warm air rises through it and leaves at the top, carrying off the sun's heat before it reaches the deck."
            ]
          },
          {
            "title": "Vent openings",
            "sentences": [
              "At the eaves and at the ridge, the gap is left open behind vented closures with insect screen, so air enters low and leaves high while insects and wind-driven rain stay out."
            ]
          },
          {
            "title": "Metal panels",
            "sentences": [
              "Standing-seam steel panels, 16 inches wide, 24 gauge, run in one piece from the eave toward the ridge wherever the length allows.",
              "They lock together at raised seams and are held down by hidden clips, so no screws pass through the panels.",
              "Near the edges and corners, where wind pulls hardest, the clips are set closer together.",
              "The finish reflects about 34% of the sun's energy when new."
            ]
          },
          {
            "title": "Trim and flashing",
            "sentences": [
              "Matching metal trim finishes the eaves, rakes and ridges, with foam closures that seal the panel ribs.",
              "Valleys get a metal valley pan over a strip of self-sealing membrane."
            ]
          }
        ]
      },
      {
        "stackId": "porch",
        "title": "Porch roof",
        "planes": [
          {
            "id": "porch-s",
            "number": 5,
            "name": "South slope",
            "pitch": 3,
            "squares": 0.5334267903142849
          },
          {
            "id": "porch-n",
            "number": 6,
            "name": "North slope",
            "pitch": 3,
            "squares": 0.5334267903142849
          },
          {
            "id": "porch-w",
            "number": 7,
            "name": "West end",
            "pitch": 3,
            "squares": 0.20873222229689406
          },
          {
            "id": "porch-e",
            "number": 8,
            "name": "East end",
            "pitch": 3,
            "squares": 0.20873222229689406
          }
        ],
        "squares": 1.484318025222358,
        "layers": [
          {
            "title": "Roof deck",
            "sentences": [
              "We keep the existing roof deck (the wood sheathing under your roofing), check it and re-nail any loose sheets.",
              "If we find damaged wood, we show you and agree the cost before replacing it."
            ]
          },
          {
            "title": "Ice barrier",
            "sentences": [
              "Along the eaves, a self-sealing rubberised membrane goes on first, about 4 feet up the roof.",
              "It seals around every nail and keeps out the water that backs up behind ice dams in winter."
            ]
          },
          {
            "title": "Underlayment",
            "sentences": [
              "A self-adhered membrane covers the whole deck: it bonds to the wood and seals around fasteners, a fully waterproof second layer under the metal.",
              "It is rated for the high temperatures that build up under metal roofing."
            ]
          },
          {
            "title": "Spacer and air gap",
            "sentences": [
              "A 3D plastic mesh mat about 0.3 inch thick is rolled out over the whole roof, and the panels rest on it.",
              "Why the air gap: the metal does not sit on the underlayment, so moisture that forms under the panels can dry out instead of being trapped against the deck.",
              "At under 3/4 inch the gap is too thin to count as roof ventilation, but it still lets moisture escape and keeps the metal off the deck."
            ]
          },
          {
            "title": "Metal panels",
            "sentences": [
              "Standing-seam steel panels, 16 inches wide, 24 gauge, run in one piece from the eave toward the ridge wherever the length allows.",
              "They lock together at raised seams and are held down by hidden clips, so no screws pass through the panels.",
              "Near the edges and corners, where wind pulls hardest, the clips are set closer together (every 12 inches at the corners instead of every 24 inches).",
              "The finish reflects about 34% of the sun's energy when new."
            ]
          },
          {
            "title": "Trim and flashing",
            "sentences": [
              "Matching metal trim finishes the eaves, ridges and hips, with foam closures that seal the panel ribs."
            ]
          }
        ]
      }
    ],
    "totalSquares": 19.656296453560863
  },
  "plan": {
    "planes": [
      {
        "id": "m-main-s",
        "number": 1,
        "name": "Main south slope",
        "pitch": 8,
        "outline": [
          [
            0,
            0
          ],
          [
            12,
            0
          ],
          [
            22,
            10
          ],
          [
            32,
            0
          ],
          [
            44,
            0
          ],
          [
            44,
            14
          ],
          [
            0,
            14
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "m-main-n",
        "number": 2,
        "name": "Main north slope",
        "pitch": 8,
        "outline": [
          [
            44,
            28
          ],
          [
            0,
            28
          ],
          [
            0,
            14
          ],
          [
            44,
            14
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "m-wing-w",
        "number": 3,
        "name": "Wing west slope",
        "pitch": 8,
        "outline": [
          [
            12,
            -14
          ],
          [
            12,
            0
          ],
          [
            22,
            10
          ],
          [
            22,
            -14
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "m-wing-e",
        "number": 4,
        "name": "Wing east slope",
        "pitch": 8,
        "outline": [
          [
            32,
            0
          ],
          [
            32,
            -14
          ],
          [
            22,
            -14
          ],
          [
            22,
            10
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "porch-s",
        "number": 5,
        "name": "South slope",
        "pitch": 3,
        "outline": [
          [
            35,
            -11
          ],
          [
            51,
            -11
          ],
          [
            46.5,
            -6.5
          ],
          [
            39.5,
            -6.5
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "porch-n",
        "number": 6,
        "name": "North slope",
        "pitch": 3,
        "outline": [
          [
            51,
            -2
          ],
          [
            35,
            -2
          ],
          [
            39.5,
            -6.5
          ],
          [
            46.5,
            -6.5
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "porch-w",
        "number": 7,
        "name": "West end",
        "pitch": 3,
        "outline": [
          [
            35,
            -2
          ],
          [
            35,
            -11
          ],
          [
            39.5,
            -6.5
          ]
        ],
        "eaveEdge": 0
      },
      {
        "id": "porch-e",
        "number": 8,
        "name": "East end",
        "pitch": 3,
        "outline": [
          [
            51,
            -11
          ],
          [
            51,
            -2
          ],
          [
            46.5,
            -6.5
          ]
        ],
        "eaveEdge": 0
      }
    ]
  },
  "options": [
    {
      "id": "101",
      "label": "As designed: battens and foil",
      "differences": [
        "The roof as described in the scope of work.",
        "Main roof: Wood battens over counter-battens (an open air channel from eave to ridge), with reflective foil.",
        "Porch roof: A 3D plastic mesh mat."
      ],
      "priceCents": 3903450,
      "taxCents": 283000,
      "totalCents": 4186450,
      "depositCents": 1255900
    },
    {
      "id": "102",
      "label": "Mesh mat with foil",
      "differences": [
        "Main roof: A 3D plastic mesh mat instead of wood battens over counter-battens (an open air channel from eave to ridge).",
        "Porch roof: Adds a reflective foil layer, shiny side toward the air gap.",
        "The air gap does not carry air from the eaves to the ridge.",
        "-$2,743.75 compared with As designed: battens and foil."
      ],
      "priceCents": 3647622,
      "taxCents": 264453,
      "totalCents": 3912075,
      "depositCents": 1173600
    },
    {
      "id": "103",
      "label": "No spacer, no foil",
      "differences": [
        "Main roof: No spacer (the panels lie on the underlayment, with no air gap) instead of wood battens over counter-battens (an open air channel from eave to ridge).",
        "Main roof: Leaves out the reflective foil layer.",
        "Porch roof: No spacer (the panels lie on the underlayment, with no air gap) instead of a 3D plastic mesh mat.",
        "The air gap does not carry air from the eaves to the ridge.",
        "-$7,314.40 compared with As designed: battens and foil."
      ],
      "priceCents": 3221455,
      "taxCents": 233555,
      "totalCents": 3455010,
      "depositCents": 1036500
    }
  ],
  "depositPct": 30,
  "paymentTerms": [
    "A deposit of 30% of the total of the option you choose is due when you accept; it reserves your place in our schedule and orders your materials.",
    "The balance is due on completion, after we walk the finished roof with you.",
    "You can pay the deposit by card through the secure link below; the balance by card, bank transfer or check.",
    "Prices hold until April 4, 2026. After that date we may need to update material prices before starting."
  ],
  "exclusions": [
    "Repairs to rafters, fascia, soffits or other framing found damaged once the old roofing is off (shown to you and priced before the work goes on).",
    "Deck replacement beyond the allowance described in the scope of work.",
    "Gutters and downspouts, solar panels, satellite dishes and antennas, unless listed in the scope.",
    "Interior repairs, painting, insulation and attic work.",
    "Electrical work, and moving or covering overhead lines (arranged with the utility).",
    "Testing for or removing asbestos or other hazardous materials."
  ],
  "warranty": [
    "Workmanship: for 10 years from completion we repair, at no charge, leaks caused by our installation.",
    "Materials: the panel and finish maker's own warranties pass to you; we register them in your name and give you the documents at completion.",
    "Not covered: damage from storms beyond the roof's rated wind speed, falling trees or debris, foot traffic, and work on the roof by others."
  ],
  "cautions": {
    "items": [
      {
        "title": "Falls",
        "text": "Parts of this roof are steep (up to 8/12). Our crews work with fall protection (anchors, harnesses, guardrails or other systems as the slope and the law require). Please keep everyone off the roof and away from the eaves below the work."
      },
      {
        "title": "Power lines",
        "text": "Overhead power and service lines near the roof are dangerous to ladders and long metal panels. Tell us about any line near the house; we keep a safe distance and, where needed, ask the utility to cover or disconnect it."
      },
      {
        "title": "Hot metal",
        "text": "Metal panels in the sun get hot enough to burn skin. Do not touch or walk on the panels; children and pets should stay clear."
      },
      {
        "title": "Sharp edges",
        "text": "Cut panel edges, offcuts and screws are sharp. Keep children and pets away from the work area and the scrap bin until we have cleaned up."
      }
    ],
    "governs": "Local building codes, the panel maker's tested installation details and licensed professionals govern. Where they require more than this document describes, they prevail, and we agree any change in price with you before doing the work."
  },
  "acceptUrl": "http://localhost/p/tok_Xb3kQ9vT2mW7rY4pL8sN1cF6hJ0dG5aZ",
  "status": "sent",
  "acceptance": null
}
;
