import { z } from 'zod'

const lines = z.array(z.string().max(500, 'Keep each line under 500 characters.')).max(30)
const contact = z.object({ name: z.string().max(200), phone: z.string().max(60).optional(), note: z.string().max(500).optional() })

/**
 * The personal safety plan (the `safetyPlan` field of the one entry of kind 'safetyPlan'). The sections follow the
 * Safety Planning Intervention (Stanley & Brown 2012); the labels on screen are Rungs' own words. It never asks for
 * method details.
 */
export const safetyPlanSchema = z.object({
  warningSigns: lines,
  onMyOwn: lines,
  peopleAndPlaces: lines,
  askForHelp: z.array(contact).max(20),
  professionals: z.array(contact).max(20),
  saferSurroundings: lines,
  reasonToKeepGoing: z.string().max(2000),
})
export type SafetyPlan = z.infer<typeof safetyPlanSchema>

export const emptySafetyPlan = (): SafetyPlan => ({
  warningSigns: [],
  onMyOwn: [],
  peopleAndPlaces: [],
  askForHelp: [],
  professionals: [],
  saferSurroundings: [],
  reasonToKeepGoing: '',
})
