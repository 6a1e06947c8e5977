/*
 * The two invented productions of the demo and a dozen shots each. Shot codes follow
 * SHOW_SEQ_SHOT (3-digit sequence, 4-digit shot; common practice). Frame ranges start at
 * 1001, the usual head-handle convention (common practice, no published source).
 */

type DemoShotState = "waiting" | "in_prep" | "cleaned" | "on_hold";
type DemoShot = {
  code: string;
  sequence: string;
  description: string;
  frameStart: number;
  frameEnd: number;
  state: DemoShotState;
};
type DemoShow = { code: string; name: string; kind: "feature" | "series"; shots: DemoShot[] };

export const DEMO_SHOWS: readonly DemoShow[] = [
  {
    code: "SLM",
    name: "Saltmarsh",
    kind: "feature",
    shots: [
      {
        code: "SLM_010_0010",
        sequence: "010",
        description: "Opening drift low over the marsh channels at first light; overcast sky, a survey pole and its guy wire on the far bank.",
        frameStart: 1001,
        frameEnd: 1288,
        state: "cleaned",
      },
      {
        code: "SLM_010_0040",
        sequence: "010",
        description: "Wide of the tide mill from the causeway; crew van parked behind the sea wall, sign on the mill door to lose.",
        frameStart: 1001,
        frameEnd: 1142,
        state: "in_prep",
      },
      {
        code: "SLM_040_0120",
        sequence: "040",
        description: "Marsh reeds against blue screen with a wind machine; pink tape crosses on the screen behind the reeds.",
        frameStart: 1001,
        frameEnd: 1096,
        state: "cleaned",
      },
      {
        code: "SLM_040_0130",
        sequence: "040",
        description: "Reverse on Nell wading through reeds, blue screen beyond; yellow dots on the screen, screen darker camera left.",
        frameStart: 1001,
        frameEnd: 1074,
        state: "cleaned",
      },
      {
        code: "SLM_040_0150",
        sequence: "040",
        description: "Handheld follow through the reed bed, blue screen; markers drift behind wet hair in the last forty frames.",
        frameStart: 1001,
        frameEnd: 1163,
        state: "in_prep",
      },
      {
        code: "SLM_070_0010",
        sequence: "070",
        description: "Mill rooftop at dusk, green screen beyond the parapet; stunt double on a safety wire, tape crosses on the screen.",
        frameStart: 1001,
        frameEnd: 1210,
        state: "cleaned",
      },
      {
        code: "SLM_070_0030",
        sequence: "070",
        description: "Close on the double's hands on the parapet, green screen; wire crosses the sleeve for twelve frames.",
        frameStart: 1001,
        frameEnd: 1058,
        state: "in_prep",
      },
      {
        code: "SLM_070_0060",
        sequence: "070",
        description: "Rooftop wide, green screen lit by two banks that do not meet; hot spot top right, falloff toward the floor.",
        frameStart: 1001,
        frameEnd: 1120,
        state: "waiting",
      },
      {
        code: "SLM_110_0200",
        sequence: "110",
        description: "Night exterior at the boathouse; the boom's shadow crosses the weatherboard wall behind Amos for thirty frames.",
        frameStart: 1001,
        frameEnd: 1185,
        state: "cleaned",
      },
      {
        code: "SLM_110_0210",
        sequence: "110",
        description: "Night exterior, boathouse window; the camera and a work light are reflected in the glass as the door swings.",
        frameStart: 1001,
        frameEnd: 1092,
        state: "in_prep",
      },
      {
        code: "SLM_140_0050",
        sequence: "140",
        description: "Flooded lane at low sun; reflections of the lighting crane in the standing water.",
        frameStart: 1001,
        frameEnd: 1137,
        state: "waiting",
      },
      {
        code: "SLM_140_0080",
        sequence: "140",
        description: "Shop front on the quay; a hardware chain's sign and a poster need removing for clearance.",
        frameStart: 1001,
        frameEnd: 1066,
        state: "on_hold",
      },
    ],
  },
  {
    code: "LTH",
    name: "The Long Thaw",
    kind: "series",
    shots: [
      {
        code: "LTH_101_0010",
        sequence: "101",
        description: "Frozen harbour at night from the breakwater; snow falling, sodium lights, heavy noise in the blacks.",
        frameStart: 1001,
        frameEnd: 1240,
        state: "cleaned",
      },
      {
        code: "LTH_101_0020",
        sequence: "101",
        description: "Truck cab on the ice road, green screen in the windows; tape crosses on the screen and a creased screen at the back window.",
        frameStart: 1001,
        frameEnd: 1132,
        state: "cleaned",
      },
      {
        code: "LTH_101_0040",
        sequence: "101",
        description: "Night exterior on the pier from the second camera; a stuck red pixel and two hot pixels in the same place every frame.",
        frameStart: 1001,
        frameEnd: 1088,
        state: "cleaned",
      },
      {
        code: "LTH_101_0050",
        sequence: "101",
        description: "Same camera, slow push on Ruth at the bollard; the stuck pixel sits on the dark water behind her.",
        frameStart: 1001,
        frameEnd: 1154,
        state: "cleaned",
      },
      {
        code: "LTH_102_0030",
        sequence: "102",
        description: "Ice fishing hut interior, blue screen through the door; markers on the screen and the grip's reflection in the lantern glass.",
        frameStart: 1001,
        frameEnd: 1110,
        state: "in_prep",
      },
      {
        code: "LTH_102_0060",
        sequence: "102",
        description: "Close-up on Ruth's face by lamplight; a tracking dot stuck on her cheek for the cold-burn effect.",
        frameStart: 1001,
        frameEnd: 1079,
        state: "waiting",
      },
      {
        code: "LTH_104_0010",
        sequence: "104",
        description: "Snowfield against a large blue screen; the screen falls off badly toward both edges and the floor.",
        frameStart: 1001,
        frameEnd: 1196,
        state: "cleaned",
      },
      {
        code: "LTH_104_0030",
        sequence: "104",
        description: "Skier crosses blue screen in a pink jacket; pink tape crosses on the screen behind her.",
        frameStart: 1001,
        frameEnd: 1101,
        state: "in_prep",
      },
      {
        code: "LTH_104_0040",
        sequence: "104",
        description: "Low angle of the ice crack opening, grey sky; a rig arm and its shadow visible at frame left.",
        frameStart: 1001,
        frameEnd: 1063,
        state: "waiting",
      },
      {
        code: "LTH_203_0010",
        sequence: "203",
        description: "Flashback shot on small-gauge film, winter market; scanned with dust, hairs and a running scratch.",
        frameStart: 1001,
        frameEnd: 1144,
        state: "cleaned",
      },
      {
        code: "LTH_203_0020",
        sequence: "203",
        description: "Flashback on film, children on the frozen lake in falling snow; dust on the scan among real snowflakes.",
        frameStart: 1001,
        frameEnd: 1118,
        state: "in_prep",
      },
      {
        code: "LTH_205_0070",
        sequence: "205",
        description: "Night exterior, the thaw: meltwater across the harbour road; the boom operator is reflected in a puddle.",
        frameStart: 1001,
        frameEnd: 1171,
        state: "on_hold",
      },
    ],
  },
];
