import passport from 'passport';
import { getDataSource } from './data-source';
import { User } from '../entities/user';

// Credentials are checked in the sign-in route (with rate limits); passport keeps the session.
passport.serializeUser((user, done) => done(null, user.id));
passport.deserializeUser((id: string, done) => {
  getDataSource()
    .getRepository(User)
    .findOneBy({ id })
    .then((u) => done(null, u ? { id: u.id, email: u.email, name: u.name, lastStudioId: u.lastStudioId } : false))
    .catch((err) => done(err));
});

export { passport };
