import type { LibraryEntry } from '../entry';

// Loads that need a clearance while a gap heals: flexion, long levers and front-loaded
// planks. Part of the library: ../library.ts has the tagging rules.

export const TRUNK_LOADS: readonly LibraryEntry[] = [
	// ── Loaded spinal flexion ──────────────────────────────────────────────────────────────
	{
		slug: 'curl-up',
		name: 'Curl-up (head and shoulder lift)',
		position: 'supine',
		difficulty: 2,
		categories: ['loaded_flexion'],
		why: 'loaded_flexion: lifting the head and shoulders against gravity is repeated forward load on the abdominal wall.',
		how: 'Lie on your back, knees bent, hands behind the head. Breathe in; breathe out, engage the deep core first and curl the head and shoulders up until the shoulder blades just leave the floor; breathe in to lower.',
		feel: 'The front of the belly working, staying flat rather than doming.',
		cue: 'Draw in before you curl; if the midline domes, stop there.',
		alternatives: ['back-lying-breath-deep-core', 'heel-slides']
	},
	{
		slug: 'oblique-curl-up',
		name: 'Curl-up with a reach across',
		position: 'supine',
		difficulty: 2,
		categories: ['loaded_flexion', 'loaded_rotation'],
		why: 'loaded_flexion: a curl against gravity; loaded_rotation: the trunk turns while lifted.',
		how: 'Lie on your back, knees bent. Breathe out, engage the deep core and curl up, reaching one hand past the opposite knee; breathe in to lower. Alternate.',
		feel: 'The side and front of the belly working together.',
		cue: 'Turn from the ribs, not the neck.',
		alternatives: ['bent-knee-fall-outs', 'side-lying-open-book']
	},
	{
		slug: 'reverse-curl',
		name: 'Knee-to-chest hip curl',
		position: 'supine',
		difficulty: 2,
		categories: ['loaded_flexion'],
		why: 'loaded_flexion: the pelvis curls off the floor towards the ribs, flexing the spine under the legs’ weight.',
		how: 'Lie on your back with both knees over the hips. Breathe out and curl the pelvis a little off the floor, drawing the knees towards the chest; breathe in to lower slowly.',
		feel: 'The lower belly working to lift the pelvis.',
		cue: 'Small lift, slow lower.',
		alternatives: ['single-toe-taps', 'supported-bridge']
	},
	{
		slug: 'curl-up-single-leg-reach',
		name: 'Curl-up with single-leg reach',
		position: 'supine',
		difficulty: 3,
		categories: ['loaded_flexion', 'long_lever'],
		why: 'loaded_flexion: the head and shoulders stay curled up; long_lever: one leg reaches long off the floor.',
		how: 'Lie on your back, curl the head and shoulders up and bring both knees over the hips. Breathe out and reach one leg long at a diagonal while the other knee draws in; breathe in and change legs.',
		feel: 'The whole front of the trunk working hard to stay still.',
		cue: 'Reach the leg higher if the back arches or the belly domes.',
		alternatives: ['single-toe-taps', 'heel-slides']
	},
	{
		slug: 'roll-up',
		name: 'Roll-up from lying to sitting',
		position: 'supine',
		difficulty: 3,
		categories: ['loaded_flexion', 'long_lever'],
		why: 'loaded_flexion: the whole spine curls up against gravity; long_lever: the legs are long and the arms reach overhead.',
		how: 'Lie on your back, legs long, arms reaching up. Breathe out and curl the head, shoulders and spine off the floor one bone at a time to sit up and reach forward; breathe in, then breathe out to roll back down the same way.',
		feel: 'The belly working through the whole roll, staying flat.',
		cue: 'Peel off the mat like a sticker.',
		alternatives: ['seated-roll-back', 'back-lying-breath-deep-core']
	},
	{
		slug: 'seated-roll-back',
		name: 'Seated half roll-back',
		position: 'seated',
		difficulty: 2,
		categories: ['loaded_flexion'],
		why: 'loaded_flexion: the trunk curls back and holds against gravity from sitting.',
		how: 'Sit tall, knees bent, hands lightly behind the thighs. Breathe out and curl the pelvis under, rolling back halfway; breathe in to hold, breathe out to return tall.',
		feel: 'The belly working to control the roll, staying flat.',
		cue: 'Roll back only as far as the belly stays flat.',
		alternatives: ['seated-breath-deep-core', 'seated-march']
	},
	// ── Long-lever abdominal load ─────────────────────────────────────────────────────────
	{
		slug: 'double-tabletop-hold',
		name: 'Both legs in tabletop',
		position: 'supine',
		difficulty: 2,
		categories: ['long_lever'],
		why: 'long_lever: both legs off the floor at once, so the abdominal wall carries both legs with no foot on the floor.',
		how: 'Lie on your back. Breathe out and bring one knee over the hip, then the other, knees bent; hold for a few breaths, breathing out on each effort, then lower one foot at a time.',
		feel: 'The lower belly working to keep the back from arching.',
		cue: 'One leg up, one leg down — never both together.',
		alternatives: ['single-toe-taps', 'heel-slides']
	},
	{
		slug: 'double-leg-lower',
		name: 'Double-leg lowers',
		position: 'supine',
		difficulty: 3,
		categories: ['long_lever'],
		why: 'long_lever: both straight legs lower towards the floor, the longest lever the belly can hold.',
		how: 'Lie on your back, legs pointing to the ceiling, hands under the pelvis if needed. Breathe in and lower both legs only as far as the back stays still; breathe out and bring them up.',
		feel: 'The lower belly working hard; the back stays on the floor.',
		cue: 'Lower less if the back lifts or the midline domes.',
		alternatives: ['single-toe-taps', 'leg-slides']
	},
	{
		slug: 'long-leg-hold',
		name: 'Long-leg hover hold',
		position: 'supine',
		difficulty: 3,
		categories: ['long_lever'],
		why: 'long_lever: both legs held long just off the floor, a sustained long-lever load.',
		how: 'Lie on your back, legs long. Breathe out and float both legs a little off the floor, arms by your sides; hold for a few breaths, breathing out on each effort, then lower.',
		feel: 'The whole front of the belly working.',
		cue: 'Lift the legs higher to make it easier.',
		alternatives: ['double-tabletop-hold', 'single-toe-taps']
	},
	{
		slug: 'full-side-support',
		name: 'Side support on the feet',
		position: 'side_lying',
		difficulty: 3,
		categories: ['long_lever'],
		why: 'long_lever: the body is held straight from the feet, a long lever through the trunk.',
		how: 'Lie on your side propped on the forearm, legs long and stacked. Breathe out and lift the hips so the body forms a straight line; hold a few breaths, breathing out on each effort, then lower.',
		feel: 'The side of the waist working hard.',
		cue: 'Drop to the knees when the breath tightens.',
		alternatives: ['side-support-on-knees', 'side-lying-leg-lift']
	},
	// ── Front-loaded plank and four-point weight bearing ──────────────────────────────────
	{
		slug: 'four-point-knee-hover',
		name: 'Four-point knee hover',
		position: 'four_point',
		difficulty: 2,
		categories: ['front_loaded'],
		why: 'front_loaded: knees lift off the floor, so the belly holds the trunk facing the floor.',
		how: 'Kneel on hands and knees, toes tucked under. Breathe out, lift the belly and hover the knees a few centimetres off the floor; hold a few breaths, breathing out on each effort, then lower.',
		feel: 'The whole belly and the shoulders working; the back staying flat.',
		cue: 'Lift the belly first, then the knees.',
		alternatives: ['four-point-breath', 'four-point-arm-reach']
	},
	{
		slug: 'forearm-plank',
		name: 'Forearm plank',
		position: 'four_point',
		difficulty: 3,
		categories: ['front_loaded'],
		why: 'front_loaded: weight on forearms and toes with the trunk facing the floor, a full forward load.',
		how: 'Lie face down on the forearms. Tuck the toes, breathe out and lift the body into a straight line from head to heels; hold a few breaths, breathing out on each effort, then lower.',
		feel: 'The belly, shoulders and thighs working together.',
		cue: 'Lower the knees if the belly sags or domes.',
		alternatives: ['four-point-knee-hover', 'four-point-breath']
	},
	{
		slug: 'high-plank',
		name: 'Hands-and-toes plank',
		position: 'four_point',
		difficulty: 2,
		categories: ['front_loaded'],
		why: 'front_loaded: hands and toes with the trunk facing the floor.',
		how: 'From hands and knees, step the feet back one at a time onto the toes so the body makes a straight line. Hold a few breaths, breathing out on each effort, then lower the knees.',
		feel: 'The belly and shoulders working to keep the body straight.',
		cue: 'Push the floor away.',
		alternatives: ['four-point-knee-hover', 'four-point-arm-reach']
	},
	{
		slug: 'knee-push-up',
		name: 'Push-up from the knees',
		position: 'four_point',
		difficulty: 2,
		categories: ['front_loaded'],
		why: 'front_loaded: the knees are down but the body is in a plank line from the knees, so the belly holds the trunk facing the floor.',
		how: 'From hands and knees, walk the hands forward until the body is straight from knees to head. Breathe in to bend the elbows; breathe out to push up.',
		feel: 'The chest and arms working, the belly holding the line.',
		cue: 'Move as one piece from the knees.',
		alternatives: ['wall-push', 'four-point-arm-reach']
	},
	{
		slug: 'push-up',
		name: 'Push-up from the toes',
		position: 'four_point',
		difficulty: 3,
		categories: ['front_loaded'],
		why: 'front_loaded: a full plank on hands and toes while the arms work.',
		how: 'From a hands-and-toes plank, breathe in to bend the elbows and lower the chest; breathe out to push back up.',
		feel: 'The chest, arms and the whole trunk working.',
		cue: 'Keep the belly lifted as you lower.',
		alternatives: ['wall-push', 'knee-push-up']
	},
	{
		slug: 'plank-knee-drives',
		name: 'Plank with quick knee drives',
		position: 'four_point',
		difficulty: 3,
		categories: ['front_loaded', 'impact'],
		why: 'front_loaded: a hands-and-toes plank; impact: the feet land quickly as the knees drive in.',
		how: 'From a hands-and-toes plank, breathe steadily and drive one knee towards the chest then the other, at a quick, even pace.',
		feel: 'The belly and shoulders working, the heart rate rising.',
		cue: 'Hips level, breath flowing.',
		alternatives: ['standing-march', 'four-point-arm-reach']
	},
	{
		slug: 'hips-high-v',
		name: 'Hips-high inverted V',
		position: 'four_point',
		difficulty: 2,
		categories: ['front_loaded', 'inversion'],
		why: 'front_loaded: weight through the hands with the trunk facing the floor; inversion: the head hangs below the hips.',
		how: 'From hands and knees, tuck the toes, breathe out and lift the hips up and back so the body makes an upside-down V. Breathe a few breaths, then lower the knees.',
		feel: 'A stretch down the backs of the legs and the shoulders working.',
		cue: 'Bend the knees to keep the back long.',
		alternatives: ['four-point-spine-curl', 'four-point-breath']
	}
];
