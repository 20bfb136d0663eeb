import type { MovementCategory } from '../movement';

/**
 * The exercise library Seamwell ships. The category tags decide what the plan check allows, so
 * this table is written to be read and reviewed in one place — by a pelvic-health
 * physiotherapist, ideally. Every entry carries one line (`why`) saying why each tag applies.
 *
 * Tagging rules kept throughout:
 * - `deep_stability` only for the stabilisation base: breath with deep-core engagement and
 *   movements done with a steady trunk and a supported spine. Four-point kneeling with the
 *   knees down is `deep_stability`; knees hovering, or hands and toes, is `front_loaded`.
 * - Every other tag names a load that needs a clearance while a gap heals.
 * - No description teaches holding the breath under load: effort is on the exhale.
 * - Alternatives are listed safest-first and never add a load the exercise does not have.
 *
 * Slugs are stable public ids: never rename one; retire an entry by adding a new one.
 */

export const POSITIONS = [
	'supine',
	'side_lying',
	'prone',
	'four_point',
	'seated',
	'standing'
] as const;
export type Position = (typeof POSITIONS)[number];

export const POSITION_LABELS: Record<Position, string> = {
	supine: 'Lying on the back',
	side_lying: 'Lying on the side',
	prone: 'Lying face down',
	four_point: 'On hands and knees (or hands and toes)',
	seated: 'Sitting',
	standing: 'Standing'
};

export type Difficulty = 1 | 2 | 3;

export interface LibraryEntry {
	slug: string;
	name: string;
	position: Position;
	difficulty: Difficulty;
	categories: MovementCategory[];
	/** One line: why each tag applies (and why none other does, where that is not obvious). */
	why: string;
	/** How to do it. */
	how: string;
	/** What she should feel. */
	feel: string;
	/** One cue. */
	cue: string;
	/** 1–3 safer slugs, best first. */
	alternatives: string[];
}

/** Shown on every card, whatever the exercise. */
export const STOP_SIGNS = [
	'pain',
	'leaking',
	'heaviness or dragging in the pelvis',
	'doming or bulging along the midline',
	'bleeding'
] as const;

export const STOP_SIGNS_TEXT = `Stop and tell your instructor if you feel ${STOP_SIGNS.slice(0, -1).join(', ')} or ${STOP_SIGNS[STOP_SIGNS.length - 1]}.`;

export const EXERCISE_LIBRARY: readonly LibraryEntry[] = [
	// ── Stabilisation base, lying on the back ─────────────────────────────────────────────
	{
		slug: 'back-lying-breath-deep-core',
		name: 'Back-lying breath with deep-core engagement',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: breath and a gentle draw-in of the lowest belly and pelvic floor, no load.',
		how: 'Lie on your back, knees bent, feet hip-width apart. Breathe in wide into the ribs and back; as you breathe out, gently lift the pelvic floor and draw the lowest part of the belly in towards the spine.',
		feel: 'A light tightening low in the belly and a lift inside the pelvis, with the ribs softening down.',
		cue: 'Think of zipping up a pair of trousers from the pubic bone to the navel as you breathe out.',
		alternatives: ['seated-breath-deep-core', 'side-lying-rib-breath']
	},
	{
		slug: 'heel-slides',
		name: 'Heel slides',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: the foot stays on the floor, so the trunk only has to stay still while one leg moves.',
		how: 'Lie on your back, knees bent. Breathe out, engage the deep core and slide one heel along the floor until the leg is long; breathe in and slide it back. Alternate sides.',
		feel: 'The pelvis staying level and the lower belly staying flat while the leg moves.',
		cue: 'Imagine a cup of water balanced on each hip bone.',
		alternatives: ['back-lying-breath-deep-core', 'bent-knee-fall-outs']
	},
	{
		slug: 'single-toe-taps',
		name: 'Single-leg toe taps from tabletop',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: one bent leg at a time, the other foot on the floor: a short lever with a supported trunk.',
		how: 'Lie on your back with one foot on the floor and the other knee over the hip, knee bent. Breathe out and lower that foot to tap the floor; breathe in to lift it back. Change legs after a set.',
		feel: 'The deep belly holding the pelvis steady; the back does not arch.',
		cue: 'Move from the hip, keep the knee angle the same.',
		alternatives: ['heel-slides', 'bent-knee-fall-outs']
	},
	{
		slug: 'bent-knee-fall-outs',
		name: 'Bent-knee fall-outs',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: the leg opens to the side with the foot down; the task is a still pelvis.',
		how: 'Lie on your back, knees bent. Breathe out and let one knee open slowly to the side while the other stays upright; breathe in and bring it back. Alternate.',
		feel: 'The opposite side of the waist working to keep the pelvis from rolling.',
		cue: 'Open only as far as the pelvis can stay level.',
		alternatives: ['heel-slides', 'back-lying-breath-deep-core']
	},
	{
		slug: 'leg-slides',
		name: 'Straight-leg slides',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: the heel stays in contact with the floor, so the leg’s weight is supported.',
		how: 'Lie on your back with one knee bent and the other leg long. Breathe out and slide the long leg out to the side along the floor; breathe in and slide it back to centre.',
		feel: 'The inner thigh and the side of the trunk working gently, the pelvis staying put.',
		cue: 'Let the heel glide as if on ice.',
		alternatives: ['heel-slides', 'bent-knee-fall-outs']
	},
	{
		slug: 'supported-bridge',
		name: 'Supported bridge',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: hips lift from the glutes with both feet down; the front of the trunk is not stretched or loaded.',
		how: 'Lie on your back, knees bent, feet flat. Breathe out, engage the deep core and lift the hips until knees, hips and shoulders line up; breathe in at the top, breathe out to lower.',
		feel: 'The buttocks and backs of the thighs doing the lifting, not the low back.',
		cue: 'Press the feet into the floor and lift no higher than a straight line.',
		alternatives: ['back-lying-breath-deep-core', 'heel-slides']
	},
	{
		slug: 'single-leg-bridge',
		name: 'Single-leg bridge',
		position: 'supine',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: a supported bridge on one foot; harder for the hip, still no forward or long-lever load on the belly.',
		how: 'From a supported bridge position, lift one foot a little off the floor with the knee bent. Breathe out to lift the hips on the standing leg, breathe in to lower. Change sides.',
		feel: 'The buttock of the standing leg working; the pelvis staying level.',
		cue: 'Keep both hip bones pointing to the ceiling.',
		alternatives: ['supported-bridge', 'heel-slides']
	},
	{
		slug: 'single-leg-circles-stable-trunk',
		name: 'Single-leg circles with a stable trunk',
		position: 'supine',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: one leg circles with the other foot down and the circle kept small; the trunk only stays still.',
		how: 'Lie on your back, one foot on the floor, the other leg raised towards the ceiling (bend the knee if the back of the thigh is tight). Breathe out and draw small circles with the raised leg, five each way.',
		feel: 'The deep belly holding the pelvis still while the leg moves in the hip socket.',
		cue: 'Draw a circle no bigger than a dinner plate.',
		alternatives: ['leg-slides', 'single-toe-taps']
	},
	{
		slug: 'back-lying-arm-reach',
		name: 'Back-lying arm reach overhead',
		position: 'supine',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: only the arms move; the task is keeping the ribs from flaring.',
		how: 'Lie on your back, knees bent, arms pointing at the ceiling. Breathe in to reach both arms back towards the floor overhead, as far as the ribs stay down; breathe out to bring them back.',
		feel: 'The front of the ribs staying soft and heavy on the way back.',
		cue: 'Keep the back of the ribs on the mat.',
		alternatives: ['back-lying-breath-deep-core']
	},
	// ── Stabilisation base, side-lying and face down ───────────────────────────────────────
	{
		slug: 'side-lying-rib-breath',
		name: 'Side-lying rib breathing',
		position: 'side_lying',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: breath and deep-core engagement in a position that also suits late pregnancy.',
		how: 'Lie on your side, head on a cushion, knees bent. Breathe in into the top side of the ribs; breathe out, gently lift the pelvic floor and draw the lowest belly in.',
		feel: 'The top ribs widening on the in-breath and the lower belly lightly firming on the out-breath.',
		cue: 'Let the out-breath be longer than the in-breath.',
		alternatives: ['seated-breath-deep-core']
	},
	{
		slug: 'side-lying-clams',
		name: 'Side-lying clams',
		position: 'side_lying',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: a small hip movement with the trunk resting on the floor.',
		how: 'Lie on your side, knees bent, heels together. Breathe out and open the top knee like a shell without rolling the pelvis back; breathe in and close.',
		feel: 'The side of the buttock working.',
		cue: 'Stack the hips as if your back were against a wall.',
		alternatives: ['side-lying-rib-breath']
	},
	{
		slug: 'side-lying-leg-lift',
		name: 'Side-lying leg lift',
		position: 'side_lying',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: the lower leg stays bent and the trunk rests on the floor; a short, supported effort.',
		how: 'Lie on your side, the lower knee bent, the top leg long in line with the body. Breathe out and lift the top leg to hip height; breathe in and lower with control.',
		feel: 'The outer hip of the top leg, with the waist on the floor side lifting slightly away from the mat.',
		cue: 'Reach the heel away rather than up.',
		alternatives: ['side-lying-clams']
	},
	{
		slug: 'side-lying-leg-circles',
		name: 'Side-lying leg circles',
		position: 'side_lying',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: small circles of the top leg with the trunk supported; the task is a still waist.',
		how: 'Lie on your side, the top leg lifted to hip height. Breathe steadily and draw small circles with the top leg, five each way.',
		feel: 'The outer hip working and the waist staying long and still.',
		cue: 'Circles the size of a grapefruit.',
		alternatives: ['side-lying-leg-lift', 'side-lying-clams']
	},
	{
		slug: 'side-lying-open-book',
		name: 'Side-lying open book',
		position: 'side_lying',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: a gentle rotation of the upper back with no load and the knees resting together; not loaded rotation.',
		how: 'Lie on your side, knees bent together, arms long in front. Breathe in; breathe out and open the top arm across to the other side, letting the chest turn while the knees stay stacked. Breathe in and return.',
		feel: 'A stretch across the chest and a turn through the upper back.',
		cue: 'Follow the moving hand with your eyes.',
		alternatives: ['side-lying-rib-breath']
	},
	{
		slug: 'side-support-on-knees',
		name: 'Side support on the knees',
		position: 'side_lying',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: a short side support from knee and forearm; the load runs along the side, not forward onto the midline.',
		how: 'Lie on your side, propped on the forearm, knees bent behind you. Breathe out and lift the hips so that shoulder, hip and knee line up; hold for a few breaths, breathing out on each effort, then lower.',
		feel: 'The waist on the floor side lifting and working.',
		cue: 'Keep breathing: if the breath stops, lower down.',
		alternatives: ['side-lying-leg-lift', 'side-lying-clams']
	},
	{
		slug: 'face-down-heel-squeeze',
		name: 'Face-down heel squeeze',
		position: 'prone',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: the trunk rests on the floor and the spine stays neutral; no extension.',
		how: 'Lie face down, forehead on the hands, knees bent a little apart and heels touching. Breathe out and press the heels together; breathe in and release.',
		feel: 'The buttocks and deep hip muscles working, the low back relaxed.',
		cue: 'Keep the pubic bone heavy on the mat.',
		alternatives: ['side-lying-clams']
	},
	// ── Stabilisation base, four-point kneeling with the knees down ────────────────────────
	{
		slug: 'four-point-breath',
		name: 'Four-point kneeling breath',
		position: 'four_point',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: hands and knees with the knees down; breath draws the belly up against gravity without load.',
		how: 'Kneel on hands and knees, hands under shoulders, knees under hips, spine long. Breathe in and let the belly soften; breathe out, lift the pelvic floor and draw the belly up towards the spine without moving the back.',
		feel: 'The lowest belly lifting away from the floor on the out-breath.',
		cue: 'Hug the baby (or the belly) up towards the spine.',
		alternatives: ['back-lying-breath-deep-core', 'seated-breath-deep-core']
	},
	{
		slug: 'four-point-arm-reach',
		name: 'Four-point arm reach',
		position: 'four_point',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: knees down; lifting one hand asks the trunk to stay still, a short lever.',
		how: 'Kneel on hands and knees. Breathe out, engage the deep core and slide one hand forward and lift it to shoulder height; breathe in and return. Alternate.',
		feel: 'The trunk staying still, no shift of weight to one side.',
		cue: 'Keep the belly lifted as the hand leaves the floor.',
		alternatives: ['four-point-breath']
	},
	{
		slug: 'four-point-opposite-reach',
		name: 'Four-point opposite arm and leg reach',
		position: 'four_point',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: knees down (one knee stays on the floor); the trunk holds still against a diagonal reach.',
		how: 'Kneel on hands and knees. Breathe out and slide one leg back and the opposite arm forward, lifting both to no higher than the back; breathe in and return. Alternate.',
		feel: 'The back staying flat and level, the belly lifted.',
		cue: 'Imagine a tray of drinks on your lower back.',
		alternatives: ['four-point-arm-reach', 'four-point-breath']
	},
	{
		slug: 'four-point-spine-curl',
		name: 'Four-point spine curl and lengthen',
		position: 'four_point',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: knees down, unloaded spinal mobility; the lengthening phase stops at a long spine, so the belly is never hung from.',
		how: 'Kneel on hands and knees. Breathe out and round the back from the tailbone up, drawing the belly in; breathe in and return to a long, flat spine.',
		feel: 'The back gently stretching and the belly drawing in on the out-breath.',
		cue: 'Come back to flat, not to a sagging belly.',
		alternatives: ['four-point-breath']
	},
	// ── Stabilisation base, sitting and standing ───────────────────────────────────────────
	{
		slug: 'seated-breath-deep-core',
		name: 'Seated breath with deep-core engagement',
		position: 'seated',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: breath with deep-core engagement, sitting tall; no load.',
		how: 'Sit tall on a chair or ball, feet flat. Breathe in wide into the ribs; breathe out, lift the pelvic floor and draw the lowest belly in.',
		feel: 'A lift off the seat inside the pelvis and a gentle firming low in the belly.',
		cue: 'Sit on your sitting bones, not on the tailbone.',
		alternatives: ['side-lying-rib-breath']
	},
	{
		slug: 'seated-march',
		name: 'Seated marching',
		position: 'seated',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: one foot lifts a little while sitting tall; the trunk only stays upright.',
		how: 'Sit tall. Breathe out, engage the deep core and lift one foot a few centimetres; breathe in and lower. Alternate.',
		feel: 'The trunk staying tall and still as each foot lifts.',
		cue: 'Grow taller as the foot lifts.',
		alternatives: ['seated-breath-deep-core']
	},
	{
		slug: 'seated-unloaded-twist',
		name: 'Seated twist without load',
		position: 'seated',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: rotation sitting tall, hands on the chest, no weight: unloaded rotation.',
		how: 'Sit tall, hands crossed on the chest. Breathe out and turn the ribs to one side, keeping the knees facing forward; breathe in to return. Alternate.',
		feel: 'A turn through the upper back and the waist lengthening.',
		cue: 'Turn around a tall spine, as if up a spiral staircase.',
		alternatives: ['side-lying-open-book']
	},
	{
		slug: 'standing-pelvic-tilt',
		name: 'Standing pelvic tilts',
		position: 'standing',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: small unloaded pelvic movement in standing with breath.',
		how: 'Stand with soft knees, hands on the hips. Breathe out and tuck the tailbone slightly under, drawing the lower belly in; breathe in and return to neutral.',
		feel: 'The lower belly and buttocks working lightly together.',
		cue: 'Small movement, led by the breath.',
		alternatives: ['seated-breath-deep-core']
	},
	{
		slug: 'standing-march',
		name: 'Standing march with breath',
		position: 'standing',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: slow marching on the spot without impact; a balance task for the trunk.',
		how: 'Stand tall near a wall for balance. Breathe out and lift one knee to hip height; breathe in and place the foot down. Alternate slowly.',
		feel: 'The standing hip and the deep belly keeping you level.',
		cue: 'Place the foot, do not drop it.',
		alternatives: ['seated-march']
	},
	{
		slug: 'single-leg-balance',
		name: 'Single-leg balance',
		position: 'standing',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: standing on one leg with steady breathing; no load on the abdominal wall.',
		how: 'Stand near a wall. Shift your weight onto one foot and lift the other a little, breathing steadily for up to thirty seconds. Change sides.',
		feel: 'The foot, ankle and outer hip of the standing leg working.',
		cue: 'Keep the breath moving while you balance.',
		alternatives: ['standing-march']
	},
	{
		slug: 'wall-push',
		name: 'Wall push',
		position: 'standing',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: upright with the weight mostly through the feet, so the belly carries no forward load.',
		how: 'Stand an arm’s length from a wall, hands on it at shoulder height. Breathe in to bend the elbows and bring the chest towards the wall; breathe out, engage the deep core and push back.',
		feel: 'The chest and the backs of the arms working, the body moving as one piece.',
		cue: 'Push the wall away on the out-breath.',
		alternatives: ['seated-breath-deep-core']
	},
	{
		slug: 'bodyweight-squat',
		name: 'Bodyweight squat',
		position: 'standing',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: a squat with no external weight, exhaling on the way up; low pressure.',
		how: 'Stand with feet hip-width apart. Breathe in and sit back as if to a chair; breathe out, engage the deep core and stand up.',
		feel: 'The thighs and buttocks working; the belly gently firm as you rise.',
		cue: 'Blow out as you stand, as if through a straw.',
		alternatives: ['wall-sit', 'standing-pelvic-tilt']
	},
	{
		slug: 'wall-sit',
		name: 'Wall sit with breath',
		position: 'standing',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: the back rests on the wall; a thigh effort held while breathing, with no weight.',
		how: 'Lean your back on a wall and walk the feet forward, bending the knees until you sit halfway down. Stay for a few slow breaths, breathing out through each one, then slide back up.',
		feel: 'The thighs working, the back supported, the breath steady.',
		cue: 'If the breath stops, come up.',
		alternatives: ['bodyweight-squat']
	},
	{
		slug: 'hip-hinge-with-stick',
		name: 'Hip hinge with a stick',
		position: 'standing',
		difficulty: 1,
		categories: ['deep_stability'],
		why: 'deep_stability: a bending pattern with a light stick for alignment only; no load.',
		how: 'Stand holding a stick along the back, touching the head, upper back and tailbone. Breathe in and push the hips back, bending forward from the hips with a long spine; breathe out and stand up.',
		feel: 'The backs of the thighs lengthening and the buttocks working to stand.',
		cue: 'Keep all three points on the stick.',
		alternatives: ['standing-pelvic-tilt']
	},
	{
		slug: 'reverse-lunge-bodyweight',
		name: 'Reverse lunge without weight',
		position: 'standing',
		difficulty: 2,
		categories: ['deep_stability'],
		why: 'deep_stability: a step back with no weight and no jump; the trunk stays upright and steady.',
		how: 'Stand tall near a wall. Breathe in and step one foot back, bending both knees; breathe out and push through the front foot to return. Alternate.',
		feel: 'The front thigh and buttock working; the trunk staying tall.',
		cue: 'Step back as if onto a line, not a tightrope.',
		alternatives: ['bodyweight-squat', 'standing-march']
	},
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
	},
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
