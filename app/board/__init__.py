"""The board: a plan view of the site with the bodies, their tugs and their balance."""
