// Shoot Plans: a learner's plan for a shoot (Light Plan, settings, safety checklist) that a mentor approves before uploads open.
export { checklistFor, latestPlan, listWaitingPlans, loadPlanForMentor, planGateMessage } from './read';
export { fileShootPlan, type FileResult } from './file';
export { decideShootPlan, type DecideResult } from './decide';
