import type { LibraryEntry } from '../entry';

// Loads that need a clearance while a gap heals: rotation, extension, inversion, impact and
// high pressure. Part of the library: ../library.ts has the tagging rules.

export const OTHER_LOADS: readonly LibraryEntry[] = [
	// ── Loaded rotation ───────────────────────────────────────────────────────────────────
	{
		slug: 'seated-weighted-twist',
		name: 'Leaning-back twist with a weight',
		position: 'seated',
		difficulty: 3,
		categories: ['loaded_rotation', 'loaded_flexion'],
		why: 'loaded_rotation: a weight carried side to side; loaded_flexion: the trunk is held leaning back against gravity.',
		how: 'Sit with knees bent, lean back a little with a long spine, holding a light weight. Breathe out and turn the ribs to carry the weight to one side; breathe in to return. Alternate.',
		feel: 'The sides of the belly working hard.',
		cue: 'Sit taller if the belly domes.',
		alternatives: ['seated-unloaded-twist', 'side-lying-open-book']
	},
	{
		slug: 'standing-weighted-chop',
		name: 'Standing diagonal chop with a weight',
		position: 'standing',
		difficulty: 2,
		categories: ['loaded_rotation'],
		why: 'loaded_rotation: the trunk turns while moving a weight on a diagonal.',
		how: 'Stand with feet wide, holding a light weight in both hands by one shoulder. Breathe out and draw it diagonally across the body to the opposite hip, turning the trunk; breathe in to return.',
		feel: 'The sides of the waist working as you turn.',
		cue: 'Let the hips turn with the ribs.',
		alternatives: ['seated-unloaded-twist', 'standing-pelvic-tilt']
	},
	{
		slug: 'curl-up-bicycle',
		name: 'Bicycle curl-up',
		position: 'supine',
		difficulty: 3,
		categories: ['loaded_flexion', 'loaded_rotation', 'long_lever'],
		why: 'loaded_flexion: the head and shoulders stay curled; loaded_rotation: the trunk turns side to side while lifted; long_lever: one leg extends long off the floor.',
		how: 'Lie on your back, curl up and bring both knees over the hips. Breathe out and turn the ribs towards one knee as the other leg reaches long; breathe in through the centre and change sides.',
		feel: 'The front and sides of the belly working hard.',
		cue: 'Slow is harder and safer than fast.',
		alternatives: ['bent-knee-fall-outs', 'single-toe-taps']
	},
	// ── Loaded extension ──────────────────────────────────────────────────────────────────
	{
		slug: 'face-down-chest-lift',
		name: 'Face-down chest lift',
		position: 'prone',
		difficulty: 2,
		categories: ['loaded_extension'],
		why: 'loaded_extension: the spine arches up against gravity and the front of the belly is stretched.',
		how: 'Lie face down, hands under the forehead. Breathe out, draw the lower belly up off the floor and lift the head and chest a little; breathe in to lower.',
		feel: 'The muscles along the back working.',
		cue: 'Lengthen forward before you lift.',
		alternatives: ['face-down-heel-squeeze', 'four-point-opposite-reach']
	},
	{
		slug: 'face-down-swimming',
		name: 'Face-down arm and leg flutter',
		position: 'prone',
		difficulty: 3,
		categories: ['loaded_extension'],
		why: 'loaded_extension: arms, chest and legs held off the floor in an arch while they move.',
		how: 'Lie face down, arms long overhead. Breathe out and lift the arms, chest and legs a little; flutter opposite arm and leg with a steady breath, then lower.',
		feel: 'The whole back of the body working.',
		cue: 'Long before high.',
		alternatives: ['four-point-opposite-reach', 'face-down-heel-squeeze']
	},
	{
		slug: 'full-back-arch',
		name: 'Full back arch on hands and feet',
		position: 'supine',
		difficulty: 3,
		categories: ['loaded_extension', 'inversion'],
		why: 'loaded_extension: the whole front of the body is stretched under body weight; inversion: the head hangs below the hips.',
		how: 'Lie on your back, feet flat, hands by the ears. Breathe out and press up into a full arch; breathe steadily, then lower with control.',
		feel: 'A strong stretch across the front of the body.',
		cue: 'Only with a clinician’s clearance for extension.',
		alternatives: ['supported-bridge', 'back-lying-arm-reach']
	},
	// ── Inversion and rolling ─────────────────────────────────────────────────────────────
	{
		slug: 'rolling-back-balance',
		name: 'Rolling back from a tucked balance',
		position: 'seated',
		difficulty: 2,
		categories: ['inversion', 'loaded_flexion'],
		why: 'inversion: the roll takes the weight onto the shoulders with the hips overhead; loaded_flexion: the spine stays curled against gravity to roll up again.',
		how: 'Sit balanced behind the sitting bones, knees hugged in. Breathe in and roll back to the shoulder blades; breathe out and roll up to balance again.',
		feel: 'The belly working to keep the curl and bring you back up.',
		cue: 'Stay in a tight ball the whole way.',
		alternatives: ['seated-roll-back', 'seated-breath-deep-core']
	},
	{
		slug: 'legs-over-head-roll',
		name: 'Legs-over-head roll',
		position: 'supine',
		difficulty: 3,
		categories: ['inversion', 'loaded_flexion', 'long_lever'],
		why: 'inversion: the hips rise over the head; loaded_flexion: the spine peels off the floor under the legs’ weight; long_lever: the legs are long.',
		how: 'Lie on your back, legs long towards the ceiling. Breathe out and roll the hips up and the legs over the head, one bone at a time; breathe in, then breathe out to roll down slowly.',
		feel: 'The belly and back working to control the roll.',
		cue: 'Never roll onto the neck.',
		alternatives: ['supported-bridge', 'single-toe-taps']
	},
	// ── Impact ────────────────────────────────────────────────────────────────────────────
	{
		slug: 'jog-on-the-spot',
		name: 'Jogging on the spot',
		position: 'standing',
		difficulty: 2,
		categories: ['impact'],
		why: 'impact: both feet leave the ground and land repeatedly.',
		how: 'Stand tall. Jog lightly on the spot, landing softly, breathing steadily, for the time your instructor sets.',
		feel: 'The heart rate rising and the landings light.',
		cue: 'Land quietly.',
		alternatives: ['standing-march', 'single-leg-balance']
	},
	{
		slug: 'star-jumps',
		name: 'Star jumps',
		position: 'standing',
		difficulty: 2,
		categories: ['impact'],
		why: 'impact: jumping the feet apart and together, landing on both feet repeatedly.',
		how: 'Stand tall. Jump the feet apart while the arms lift out to the sides, then jump them back together, breathing steadily.',
		feel: 'The whole body working, the landings soft.',
		cue: 'Soft knees on every landing.',
		alternatives: ['standing-march', 'bodyweight-squat']
	},
	{
		slug: 'squat-jumps',
		name: 'Squat jumps',
		position: 'standing',
		difficulty: 3,
		categories: ['impact', 'high_pressure'],
		why: 'impact: a jump and a landing on every repeat; high_pressure: the explosive effort drives up the pressure in the belly.',
		how: 'Stand with feet hip-width apart. Breathe in and squat; breathe out as you jump up; land softly back into the squat.',
		feel: 'The thighs and buttocks working hard, the heart rate high.',
		cue: 'Breathe out on the jump, never hold it.',
		alternatives: ['bodyweight-squat', 'wall-sit']
	},
	{
		slug: 'single-leg-hops',
		name: 'Single-leg hops',
		position: 'standing',
		difficulty: 3,
		categories: ['impact'],
		why: 'impact: the whole body weight lands on one leg, the highest landing load for the pelvic floor.',
		how: 'Stand on one leg near a wall. Hop lightly on the spot ten times, breathing steadily, then change legs.',
		feel: 'The foot, calf and hip of the hopping leg working.',
		cue: 'Small hops, quiet landings.',
		alternatives: ['single-leg-balance', 'standing-march']
	},
	{
		slug: 'side-shuffle-drill',
		name: 'Side-to-side shuffle drill',
		position: 'standing',
		difficulty: 2,
		categories: ['impact'],
		why: 'impact: quick steps with repeated landings and changes of direction.',
		how: 'Stand with knees soft. Shuffle three quick steps to one side and three back, breathing steadily.',
		feel: 'The thighs and hips working, the heart rate rising.',
		cue: 'Stay light on the feet.',
		alternatives: ['reverse-lunge-bodyweight', 'standing-march']
	},
	// ── High-pressure effort ──────────────────────────────────────────────────────────────
	{
		slug: 'heavy-hip-hinge-lift',
		name: 'Heavy lift from the floor',
		position: 'standing',
		difficulty: 3,
		categories: ['high_pressure'],
		why: 'high_pressure: a heavy weight raises the pressure inside the belly and invites holding the breath.',
		how: 'Stand with the weight between the feet. Breathe in and hinge at the hips to hold it with a long spine; breathe out as you stand up, pushing the floor away. Choose a weight you can breathe through.',
		feel: 'The legs and buttocks doing the work, the back long.',
		cue: 'If you cannot breathe out through the lift, the weight is too heavy.',
		alternatives: ['hip-hinge-with-stick', 'bodyweight-squat']
	},
	{
		slug: 'heavy-front-squat',
		name: 'Squat holding a heavy weight',
		position: 'standing',
		difficulty: 3,
		categories: ['high_pressure'],
		why: 'high_pressure: a heavy weight held in front raises the pressure in the belly and invites holding the breath.',
		how: 'Hold a heavy weight at the chest. Breathe in and sit back into a squat; breathe out as you stand up.',
		feel: 'The thighs and buttocks working hard; the breath still flowing.',
		cue: 'Exhale on the way up, every time.',
		alternatives: ['bodyweight-squat', 'wall-sit']
	},
	{
		slug: 'heavy-overhead-press',
		name: 'Heavy press overhead',
		position: 'standing',
		difficulty: 3,
		categories: ['high_pressure', 'loaded_extension'],
		why: 'high_pressure: a heavy weight raised overhead invites holding the breath; loaded_extension: the ribs tend to flare and the front of the belly stretches as the arms go up.',
		how: 'Stand tall with weights at the shoulders. Breathe out and press them overhead, keeping the ribs down; breathe in to lower.',
		feel: 'The shoulders and arms working, the belly firm.',
		cue: 'Ribs down, breath out, press.',
		alternatives: ['wall-push', 'back-lying-arm-reach']
	}
];
