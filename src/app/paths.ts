// Every client path in one place.
export const paths = {
  home: '/',
  signIn: '/sign-in',
  resetRequest: '/reset',
  resetConfirm: (token = ':token') => `/reset/${token}`,
  invite: (token = ':token') => `/invite/${token}`,
  planner: '/planner',
  plan: (planId = ':planId') => `/plans/${planId}`,
  planPrint: (planId = ':planId') => `/plans/${planId}/print`,
  sessions: '/sessions',
  session: (sessionId = ':sessionId') => `/sessions/${sessionId}`,
  stack: (sessionId = ':sessionId', stackId = ':stackId') => `/sessions/${sessionId}/stacks/${stackId}`,
  kit: '/kit',
  studio: '/studio',
  handoffs: '/handoffs',
  share: (token = ':token') => `/share/${token}`,
} as const;
